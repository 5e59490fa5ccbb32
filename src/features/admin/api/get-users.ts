import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AdminUserList } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export interface UsersQuery {
  q?: string;
  page?: number;
}

export function getUsers({ q, page = 1 }: UsersQuery): Promise<AdminUserList> {
  const params = new URLSearchParams({ page: String(page) });
  if (q) params.set('q', q);
  return api.get<AdminUserList>(`/api/admin/users?${params}`);
}

export function getUsersQueryOptions(query: UsersQuery = {}) {
  return queryOptions({ queryKey: ['admin', 'users', query], queryFn: () => getUsers(query), placeholderData: keepPreviousData });
}

/** Every users list, whatever the search: what a change to someone's roles makes stale. */
export const allUsersListsKey = getUsersQueryOptions().queryKey.slice(0, 2);

export function useUsers(query: UsersQuery) {
  return useQuery(getUsersQueryOptions(query));
}
