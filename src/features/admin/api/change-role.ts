import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { GrantableRole, Role } from '@shared/roles';
import { api } from '@/lib/api-client';
import { getMeQueryOptions } from '@/features/auth/api/get-me';
import { allUsersListsKey } from './get-users';

export interface RoleChange {
  userId: number;
  role: GrantableRole;
  grant: boolean;
}

export function changeRole({ userId, role, grant }: RoleChange): Promise<{ roles: Role[] }> {
  return grant
    ? api.post<{ roles: Role[] }>(`/api/admin/users/${userId}/roles`, { role })
    : api.delete<{ roles: Role[] }>(`/api/admin/users/${userId}/roles/${role}`);
}

export function useChangeRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeRole,
    onSuccess: () => {
      void queryClient.invalidateQueries({ queryKey: allUsersListsKey });
      // An admin may have changed their own roles.
      void queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey });
    },
  });
}
