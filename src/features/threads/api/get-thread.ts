import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ThreadDetail } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';

export function getThread(id: number): Promise<ThreadDetail> {
  return api.get(`/api/threads/${id}`);
}

export function getThreadQueryOptions(id: number) {
  return queryOptions({ queryKey: ['threads', id], queryFn: () => getThread(id) });
}

export function useThread(id: number) {
  return useQuery(getThreadQueryOptions(id));
}
