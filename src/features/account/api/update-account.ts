import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CurrentUser, UpdateAccountInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { getMeQueryOptions } from '@/features/auth/api/get-me';

export function updateAccount(input: UpdateAccountInput): Promise<CurrentUser> {
  return api.patch<CurrentUser>('/api/account', input);
}

export function useUpdateAccount() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateAccount,
    onSuccess: (me) => queryClient.setQueryData(getMeQueryOptions().queryKey, me),
  });
}
