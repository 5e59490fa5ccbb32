import type { ThreadDetail } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

/** Marks a staff reply as the maker's official response; null withdraws it. */
export function markOfficialResponse(threadId: number, postId: number | null): Promise<ThreadDetail> {
  return postId === null
    ? api.delete(`/api/threads/${threadId}/official-response`)
    : api.put(`/api/threads/${threadId}/official-response`, { postId });
}

export function useMarkOfficialResponse(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, (postId: number | null) => markOfficialResponse(threadId, postId));
}
