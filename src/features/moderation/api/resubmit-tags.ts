import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ResubmitTagsInput, TagChangeResult } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';
import { getSubmissionDecisionQueryOptions } from './get-submission-decision';

export function resubmitTags(id: number, input: ResubmitTagsInput) {
  return api.patch<TagChangeResult>(`/api/submissions/${id}/tags`, input);
}

/** The rider's correction after a moderator sent the submission back; it then returns to the queue. */
export function useResubmitTags(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ResubmitTagsInput) => resubmitTags(id, input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: getSubmissionDecisionQueryOptions(id).queryKey });
      void queryClient.invalidateQueries({ queryKey: ['submissions', id] });
    },
  });
}
