import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DecideSubmissionInput } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';
import { reviewQueueKey } from './get-review-queue';
import { getReviewQueryOptions } from './get-review';
import { getSubmissionDecisionQueryOptions } from './get-submission-decision';

export function decideSubmission({ id, ...input }: DecideSubmissionInput & { id: number }) {
  return api.post<{ id: number; status: string; version: number }>(`/api/moderation/submissions/${id}/decision`, input);
}

export function useDecideSubmission(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: DecideSubmissionInput) => decideSubmission({ id, ...input }),
    onSettled: () => {
      // A conflict means someone else decided: the fresh review shows what.
      void queryClient.invalidateQueries({ queryKey: getReviewQueryOptions(id).queryKey });
      void queryClient.invalidateQueries({ queryKey: getSubmissionDecisionQueryOptions(id).queryKey });
      void queryClient.invalidateQueries({ queryKey: reviewQueueKey });
    },
  });
}
