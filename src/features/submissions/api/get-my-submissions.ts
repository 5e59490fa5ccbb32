import { queryOptions, useQuery } from '@tanstack/react-query';
import type { QualityFlag, Side } from '@shared/analysis/types';
import type { SubmissionStatus } from '@shared/schemas/submission';
import { api } from '@/lib/api-client';

export interface MySubmission {
  id: number;
  status: SubmissionStatus;
  createdAt: string;
  biasPercent: number | null;
  flags: QualityFlag[] | null;
  recordings: Array<{ side: Side; model: string; firmware: string }> | null;
}

export function getMySubmissions(): Promise<{ submissions: MySubmission[] }> {
  return api.get<{ submissions: MySubmission[] }>('/api/me/submissions');
}

export function getMySubmissionsQueryOptions() {
  return queryOptions({ queryKey: ['submissions', 'mine'], queryFn: getMySubmissions, staleTime: 0 });
}

export function useMySubmissions() {
  return useQuery(getMySubmissionsQueryOptions());
}
