import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UndeliveredMailList } from '@shared/schemas/mail';
import { api } from '@/lib/api-client';

export function getUndeliveredMail(): Promise<UndeliveredMailList> {
  return api.get<UndeliveredMailList>('/api/mail/undelivered');
}

export function getUndeliveredMailQueryOptions() {
  return queryOptions({ queryKey: ['outbox', 'undelivered'], queryFn: getUndeliveredMail, staleTime: 0, refetchInterval: 5_000 });
}

export function useUndeliveredMail() {
  return useQuery(getUndeliveredMailQueryOptions());
}
