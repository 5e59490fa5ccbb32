import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelThreadSummary } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';

export function getModelThreadSummary(slug: string): Promise<ModelThreadSummary> {
  return api.get(`/api/models/${encodeURIComponent(slug)}/thread-summary`);
}

export function getModelThreadSummaryQueryOptions(slug: string) {
  return queryOptions({ queryKey: ['models', slug, 'thread-summary'], queryFn: () => getModelThreadSummary(slug) });
}

export function useModelThreadSummary(slug: string) {
  return useQuery(getModelThreadSummaryQueryOptions(slug));
}
