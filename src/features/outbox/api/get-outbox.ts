import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Outbox } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';

export function getOutbox(page: number): Promise<Outbox> {
  return api.get<Outbox>(`/api/mail/outbox?page=${page}`);
}

export function getOutboxQueryOptions(page = 1) {
  return queryOptions({
    queryKey: ['outbox', page],
    queryFn: () => getOutbox(page),
    placeholderData: keepPreviousData,
    staleTime: 0,
    refetchInterval: 5_000,
  });
}

export function useOutbox(page: number) {
  return useQuery(getOutboxQueryOptions(page));
}
