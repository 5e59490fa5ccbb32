import type { SetThreadStatusInput, ThreadDetail } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function setThreadStatus(threadId: number, input: SetThreadStatusInput): Promise<ThreadDetail> {
  return api.put(`/api/threads/${threadId}/status`, input);
}

export function useSetThreadStatus(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, (input: SetThreadStatusInput) => setThreadStatus(threadId, input));
}
