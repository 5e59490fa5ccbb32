import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReanalysisOverview } from '@shared/schemas/reanalysis';
import { api } from '@/lib/api-client';

/** While a run is running, its progress is read again this often. */
export const REANALYSIS_POLL_MS = 2000;

export function getReanalysis(): Promise<ReanalysisOverview> {
  return api.get<ReanalysisOverview>('/api/admin/reanalysis');
}

export function getReanalysisQueryOptions() {
  return queryOptions({
    queryKey: ['admin', 'reanalysis'],
    queryFn: getReanalysis,
    staleTime: 0,
    refetchInterval: (query) => (query.state.data?.runs[0]?.status === 'running' ? REANALYSIS_POLL_MS : false),
  });
}

export function useReanalysis() {
  return useQuery(getReanalysisQueryOptions());
}
