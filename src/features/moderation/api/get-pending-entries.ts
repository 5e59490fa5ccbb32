import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PendingEntries } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';

export function getPendingEntries(): Promise<PendingEntries> {
  return api.get<PendingEntries>('/api/moderation/catalogue/pending');
}

export function getPendingEntriesQueryOptions() {
  return queryOptions({ queryKey: ['moderation', 'catalogue', 'pending'], queryFn: getPendingEntries, staleTime: 0 });
}

export function usePendingEntries() {
  return useQuery(getPendingEntriesQueryOptions());
}
