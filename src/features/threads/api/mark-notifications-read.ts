import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MarkNotificationsReadInput } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { getNotificationsQueryOptions } from './get-notifications';

export function markNotificationsRead(input: MarkNotificationsReadInput): Promise<{ unreadCount: number }> {
  return api.post('/api/notifications/read', input);
}

export function useMarkNotificationsRead() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: markNotificationsRead,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getNotificationsQueryOptions().queryKey }),
  });
}
