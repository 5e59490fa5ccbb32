import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ObjectStoreSize } from '@shared/schemas/object-store';
import { api } from '@/lib/api-client';

export function getObjectStore(): Promise<ObjectStoreSize> {
  return api.get<ObjectStoreSize>('/api/admin/object-store');
}

export function getObjectStoreQueryOptions() {
  return queryOptions({ queryKey: ['admin', 'object-store'], queryFn: getObjectStore });
}

export function useObjectStore() {
  return useQuery(getObjectStoreQueryOptions());
}
