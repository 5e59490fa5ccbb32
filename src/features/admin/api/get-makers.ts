import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MakerSummary } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export function getMakers(): Promise<{ makers: MakerSummary[] }> {
  return api.get<{ makers: MakerSummary[] }>('/api/admin/makers');
}

export function getMakersQueryOptions() {
  return queryOptions({ queryKey: ['admin', 'makers'], queryFn: getMakers });
}

export function useMakers() {
  return useQuery(getMakersQueryOptions());
}
