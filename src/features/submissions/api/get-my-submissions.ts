import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MySubmissionsResponse } from '@shared/schemas/submission-view';
import { api } from '@/lib/api-client';

export function getMySubmissions(): Promise<MySubmissionsResponse> {
  return api.get<MySubmissionsResponse>('/api/me/submissions');
}

export function getMySubmissionsQueryOptions() {
  return queryOptions({ queryKey: ['submissions', 'mine'], queryFn: getMySubmissions, staleTime: 0 });
}

export function useMySubmissions() {
  return useQuery(getMySubmissionsQueryOptions());
}
