import type { ThreadDetail } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function setThreadLocked(threadId: number, locked: boolean): Promise<ThreadDetail> {
  return api.put(`/api/threads/${threadId}/lock`, { locked });
}

export function useSetThreadLocked(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, (locked: boolean) => setThreadLocked(threadId, locked));
}
