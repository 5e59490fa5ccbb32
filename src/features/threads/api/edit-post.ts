import type { EditPostInput } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function editPost(postId: number, input: EditPostInput): Promise<{ id: number }> {
  return api.patch(`/api/posts/${postId}`, input);
}

export function useEditPost(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, ({ postId, ...input }: EditPostInput & { postId: number }) => editPost(postId, input));
}
