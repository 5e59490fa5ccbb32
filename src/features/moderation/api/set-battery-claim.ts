import { type QueryKey, useMutation, useQueryClient } from '@tanstack/react-query';
import type { BatteryClaimInput } from '@shared/schemas/battery';
import { api } from '@/lib/api-client';

/** The maker's battery claim for a model with its source; `hours: null` clears it. */
export function setBatteryClaim({ modelId, ...claim }: BatteryClaimInput & { modelId: number }): Promise<BatteryClaimInput> {
  return api.put<BatteryClaimInput>(`/api/moderation/models/${modelId}/battery-claim`, claim);
}

/** `affects`: the model page's battery figures, as their own query key. */
export function useSetBatteryClaim(affects: QueryKey[]) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: setBatteryClaim,
    onSuccess: () => affects.forEach((queryKey) => void queryClient.invalidateQueries({ queryKey })),
  });
}
