import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RecordingTagsInput } from '@shared/schemas/submission';
import { api } from '@/lib/api-client';
import { getSubmissionDecisionQueryOptions } from './get-submission-decision';

export interface ResubmitTags {
  a?: Partial<RecordingTagsInput>;
  b?: Partial<RecordingTagsInput>;
  expectedVersion: number;
}

export function resubmitTags(id: number, input: ResubmitTags) {
  return api.patch<{ id: number; status: string; version: number }>(`/api/submissions/${id}/tags`, input);
}

/** The rider's correction after a moderator sent the submission back; it then returns to the queue. */
export function useResubmitTags(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ResubmitTags) => resubmitTags(id, input),
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: getSubmissionDecisionQueryOptions(id).queryKey });
      void queryClient.invalidateQueries({ queryKey: ['submissions', id] });
    },
  });
}
