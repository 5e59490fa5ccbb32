import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Review } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';

export function getReview(id: number): Promise<Review> {
  return api.get<Review>(`/api/moderation/submissions/${id}`);
}

export function getReviewQueryOptions(id: number) {
  return queryOptions({ queryKey: ['moderation', 'review', id], queryFn: () => getReview(id), staleTime: 0 });
}

export function useReview(id: number) {
  return useQuery(getReviewQueryOptions(id));
}
