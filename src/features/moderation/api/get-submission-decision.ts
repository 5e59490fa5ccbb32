import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SubmissionDecisionResponse } from '@shared/schemas/moderation';
import type { SubmissionStatus } from '@shared/schemas/submission';
import { api } from '@/lib/api-client';

export type SubmissionDecision = SubmissionDecisionResponse;

export function getSubmissionDecision(id: number): Promise<SubmissionDecision> {
  return api.get<SubmissionDecision>(`/api/submissions/${id}/decision`);
}

export function getSubmissionDecisionQueryOptions(id: number) {
  return queryOptions({ queryKey: ['submissions', id, 'decision'], queryFn: () => getSubmissionDecision(id), staleTime: 0 });
}

export function useSubmissionDecision(id: number, status: SubmissionStatus) {
  // The status is part of the key's freshness: when the page sees a new status, ask again.
  return useQuery({ ...getSubmissionDecisionQueryOptions(id), queryKey: [...getSubmissionDecisionQueryOptions(id).queryKey, status] });
}
