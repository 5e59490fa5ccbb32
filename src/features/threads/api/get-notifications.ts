import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationList } from '@shared/schemas/threads';
import { ApiError, api } from '@/lib/api-client';

/** The signed-in person's notifications; null for a visitor. */
export async function getNotifications(): Promise<NotificationList | null> {
  try {
    return await api.get<NotificationList>('/api/notifications');
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export function getNotificationsQueryOptions() {
  return queryOptions({ queryKey: ['notifications'], queryFn: getNotifications, refetchInterval: 60_000 });
}

export function useNotifications() {
  return useQuery(getNotificationsQueryOptions());
}
