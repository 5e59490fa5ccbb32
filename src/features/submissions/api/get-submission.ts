import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SubmissionStatus } from '@shared/schemas/submission';
import type { SubmissionRecordingView, SubmissionView } from '@shared/schemas/submission-view';
import { api } from '@/lib/api-client';

export type Submission = SubmissionView;
export type SubmissionRecording = SubmissionRecordingView;

/** Statuses during which the background job is still working on the files. */
export const IN_PROGRESS_STATUSES: readonly SubmissionStatus[] = ['received', 'analysing'];

export function getSubmission(id: number): Promise<Submission> {
  return api.get<Submission>(`/api/submissions/${id}`);
}

export function getSubmissionQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['submissions', id],
    queryFn: () => getSubmission(id),
    // Ask again every 1.5 s while the analysis job runs; stop once it has an answer.
    refetchInterval: (query) => (query.state.data && IN_PROGRESS_STATUSES.includes(query.state.data.status) ? 1500 : false),
    staleTime: 0,
  });
}

export function useSubmission(id: number) {
  return useQuery(getSubmissionQueryOptions(id));
}
