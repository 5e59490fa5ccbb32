import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ThreadListResponse } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';

export interface ThreadFilters {
  open?: boolean;
  makerResponded?: boolean;
  firmwareId?: number;
}

export function getModelThreads(slug: string, filters: ThreadFilters): Promise<ThreadListResponse> {
  const params = new URLSearchParams();
  if (filters.open !== undefined) params.set('open', String(filters.open));
  if (filters.makerResponded !== undefined) params.set('makerResponded', String(filters.makerResponded));
  if (filters.firmwareId) params.set('firmwareId', String(filters.firmwareId));
  const query = params.toString();
  return api.get(`/api/models/${encodeURIComponent(slug)}/threads${query ? `?${query}` : ''}`);
}

export function getModelThreadsQueryOptions(slug: string, filters: ThreadFilters = {}) {
  return queryOptions({ queryKey: ['models', slug, 'threads', filters], queryFn: () => getModelThreads(slug, filters) });
}

export function useModelThreads(slug: string, filters: ThreadFilters) {
  return useQuery({ ...getModelThreadsQueryOptions(slug, filters), placeholderData: keepPreviousData });
}
