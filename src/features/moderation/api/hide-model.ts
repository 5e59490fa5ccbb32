import { type QueryKey, useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Leaves a model off the scoreboard with a reason everyone sees; `reason: null` shows it again. */
export function hideModel({
  modelId,
  reason,
}: {
  modelId: number;
  reason: string | null;
}): Promise<{ id: number; hiddenReason: string | null }> {
  const path = `/api/moderation/catalogue/model/${modelId}/hidden`;
  return reason === null ? api.delete(path) : api.put(path, { reason });
}

/** `affects`: the model page and the scoreboard, as their own query keys. */
export function useHideModel(affects: QueryKey[]) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: hideModel,
    onSuccess: () => affects.forEach((queryKey) => void queryClient.invalidateQueries({ queryKey })),
  });
}
