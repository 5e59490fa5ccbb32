import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getMyMetersQueryOptions } from './get-my-meters';

export function removeMeter(meterId: number): Promise<void> {
  return api.delete<void>(`/api/me/meters/${meterId}`);
}

export function useRemoveMeter() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeMeter,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMyMetersQueryOptions().queryKey }),
  });
}
