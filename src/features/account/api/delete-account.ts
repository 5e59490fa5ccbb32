import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DeleteAccountInput } from '@shared/schemas/auth';
import { api, forgetCsrfToken } from '@/lib/api-client';
import { getMeQueryOptions } from '@/features/auth/api/get-me';

export function deleteAccount(input: DeleteAccountInput): Promise<void> {
  return api.post<void>('/api/account/deletion', input);
}

export function useDeleteAccount({ onSuccess }: { onSuccess?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteAccount,
    onSuccess: () => {
      forgetCsrfToken();
      queryClient.setQueryData(getMeQueryOptions().queryKey, null);
      onSuccess?.();
    },
  });
}
