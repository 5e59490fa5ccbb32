import { api } from '@/lib/api-client';
import { useThreadMutation } from './thread-mutation';

export function setFollowing(threadId: number, following: boolean): Promise<{ following: boolean }> {
  return following ? api.put(`/api/threads/${threadId}/follow`) : api.delete(`/api/threads/${threadId}/follow`);
}

export function useSetFollowing(threadId: number, modelSlug: string) {
  return useThreadMutation(threadId, modelSlug, (following: boolean) => setFollowing(threadId, following));
}
