import { useMutation, useQueryClient } from '@tanstack/react-query';
import { getThreadQueryOptions } from './get-thread';

/**
 * The shape every change to one thread shares: run it, then refresh the thread
 * and the lists and summary of its model (status and activity show there).
 */
export function useThreadMutation<Input, Result>(threadId: number, modelSlug: string, mutationFn: (input: Input) => Promise<Result>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => {
      queryClient.invalidateQueries({ queryKey: getThreadQueryOptions(threadId).queryKey });
      queryClient.invalidateQueries({ queryKey: ['models', modelSlug] });
    },
  });
}
