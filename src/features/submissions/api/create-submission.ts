import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatedSubmission, CreateSubmissionInput } from '@shared/schemas/submission';
import { api } from '@/lib/api-client';
import { getMySubmissionsQueryOptions } from './get-my-submissions';

export interface CreateSubmissionRequest {
  fileA: File;
  fileB: File;
  meta: CreateSubmissionInput;
}

export function createSubmission({ fileA, fileB, meta }: CreateSubmissionRequest): Promise<CreatedSubmission> {
  const form = new FormData();
  // The fields come first so the server can read them before the files stream in.
  form.append('meta', JSON.stringify(meta));
  form.append('fileA', fileA, fileA.name);
  form.append('fileB', fileB, fileB.name);
  return api.post<CreatedSubmission>('/api/submissions', form);
}

export function useCreateSubmission() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSubmission,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMySubmissionsQueryOptions().queryKey }),
  });
}
