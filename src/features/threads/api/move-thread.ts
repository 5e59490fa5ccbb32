import type { ThreadDetail } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function moveThread(threadId: number, input: { modelSlug: string; reason: string }): Promise<ThreadDetail> {
  return api.post(`/api/threads/${threadId}/move`, input);
}

export function useMoveThread(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, (input: { modelSlug: string; reason: string }) => moveThread(threadId, input));
}
