import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { allUsersListsKey } from './get-users';

/** makerId null removes the person from their maker's staff. */
export function changeMakerStaff({ userId, makerId }: { userId: number; makerId: number | null }): Promise<void> {
  return makerId === null
    ? api.delete<void>(`/api/admin/users/${userId}/maker-staff`)
    : api.put<void>(`/api/admin/users/${userId}/maker-staff`, { makerId });
}

export function useChangeMakerStaff() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changeMakerStaff,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: allUsersListsKey }),
  });
}
