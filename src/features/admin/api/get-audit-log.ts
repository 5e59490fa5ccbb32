import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditLog } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export function getAuditLog(page: number): Promise<AuditLog> {
  return api.get<AuditLog>(`/api/admin/audit-log?page=${page}`);
}

export function getAuditLogQueryOptions(page = 1) {
  return queryOptions({
    queryKey: ['admin', 'audit-log', page],
    queryFn: () => getAuditLog(page),
    placeholderData: keepPreviousData,
    staleTime: 0,
  });
}

export function useAuditLog(page: number) {
  return useQuery(getAuditLogQueryOptions(page));
}
