import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateRiderMeterInput } from '@shared/schemas/battery';
import { api } from '@/lib/api-client';
import { getMyMetersQueryOptions } from './get-my-meters';

export function addMeter(input: CreateRiderMeterInput): Promise<{ id: number }> {
  return api.post<{ id: number }>('/api/me/meters', input);
}

export function useAddMeter() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addMeter,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMyMetersQueryOptions().queryKey }),
  });
}
