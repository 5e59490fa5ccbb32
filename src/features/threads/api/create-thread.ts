import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateThreadInput } from '@shared/schemas/threads';
import { api } from '@/lib/api-client';

export function createThread(slug: string, input: CreateThreadInput): Promise<{ id: number; url: string }> {
  return api.post(`/api/models/${encodeURIComponent(slug)}/threads`, input);
}

export function useCreateThread(slug: string, { onSuccess }: { onSuccess?: (created: { id: number; url: string }) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateThreadInput) => createThread(slug, input),
    onSuccess: (created) => {
      // Every list of this model (any filter) and its summary.
      queryClient.invalidateQueries({ queryKey: ['models', slug] });
      onSuccess?.(created);
    },
  });
}
