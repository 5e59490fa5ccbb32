import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CurrentUser } from '@shared/schemas/auth';
import { ApiError, api } from '@/lib/api-client';

/** The signed-in person, or null for a visitor. */
export async function getMe(): Promise<CurrentUser | null> {
  try {
    return await api.get<CurrentUser>('/api/me');
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export function getMeQueryOptions() {
  return queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });
}

export function useMe() {
  return useQuery(getMeQueryOptions());
}
