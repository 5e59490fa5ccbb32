import type { CreatePostInput } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function replyToThread(threadId: number, input: CreatePostInput): Promise<{ id: number; url: string }> {
  return api.post(`/api/threads/${threadId}/posts`, input);
}

export function useReplyToThread(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, (input: CreatePostInput) => replyToThread(threadId, input));
}
