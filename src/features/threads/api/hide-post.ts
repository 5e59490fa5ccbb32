import type { PostVisibilityInput } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function setPostVisibility(postId: number, input: PostVisibilityInput): Promise<{ id: number; hidden: boolean }> {
  return api.put(`/api/posts/${postId}/visibility`, input);
}

export function useSetPostVisibility(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, ({ postId, ...input }: PostVisibilityInput & { postId: number }) =>
    setPostVisibility(postId, input),
  );
}
