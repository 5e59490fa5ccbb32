import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, forgetCsrfToken } from '@/lib/api-client';
import { getMeQueryOptions } from './get-me';

export function signOut(): Promise<void> {
  return api.post<void>('/auth/logout');
}

export function useSignOut({ onSuccess }: { onSuccess?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      // The session is gone: its CSRF token and everything fetched as this person too.
      forgetCsrfToken();
      queryClient.setQueryData(getMeQueryOptions().queryKey, null);
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== getMeQueryOptions().queryKey[0] });
      onSuccess?.();
    },
  });
}
