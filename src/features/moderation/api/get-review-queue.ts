import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewQueue, ReviewQueueQuery } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';

export type QueueFilters = Partial<Omit<ReviewQueueQuery, 'page'>> & { page?: number };

export function getReviewQueue(filters: QueueFilters): Promise<ReviewQueue> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== '') params.set(key, String(value));
  return api.get<ReviewQueue>(`/api/moderation/queue?${params}`);
}

export const reviewQueueKey = ['moderation', 'queue'] as const;

export function getReviewQueueQueryOptions(filters: QueueFilters) {
  return queryOptions({
    queryKey: [...reviewQueueKey, filters],
    queryFn: () => getReviewQueue(filters),
    placeholderData: keepPreviousData,
    staleTime: 0,
  });
}

export function useReviewQueue(filters: QueueFilters) {
  return useQuery(getReviewQueueQueryOptions(filters));
}
