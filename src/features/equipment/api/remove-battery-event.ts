import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getMyMetersQueryOptions } from './get-my-meters';

export function removeBatteryEvent({ meterId, eventId }: { meterId: number; eventId: number }): Promise<void> {
  return api.delete<void>(`/api/me/meters/${meterId}/battery-events/${eventId}`);
}

export function useRemoveBatteryEvent() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeBatteryEvent,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMyMetersQueryOptions().queryKey }),
  });
}
