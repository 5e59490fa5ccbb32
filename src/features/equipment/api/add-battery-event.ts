import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateBatteryEventInput } from '@shared/schemas/battery';
import { api } from '@/lib/api-client';
import { getMyMetersQueryOptions } from './get-my-meters';

export function addBatteryEvent({ meterId, ...input }: CreateBatteryEventInput & { meterId: number }): Promise<{ id: number }> {
  return api.post<{ id: number }>(`/api/me/meters/${meterId}/battery-events`, input);
}

export function useAddBatteryEvent() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: addBatteryEvent,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMyMetersQueryOptions().queryKey }),
  });
}
