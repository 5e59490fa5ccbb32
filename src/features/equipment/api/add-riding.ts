import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddRidingInput } from '@shared/schemas/battery';
import { api } from '@/lib/api-client';
import { getMyMetersQueryOptions } from './get-my-meters';

export function addRiding({ meterId, ...input }: AddRidingInput & { meterId: number }): Promise<{ id: number }> {
  return api.post<{ id: number }>(`/api/me/meters/${meterId}/riding`, input);
}

export function useAddRiding() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addRiding,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMyMetersQueryOptions().queryKey }),
  });
}
