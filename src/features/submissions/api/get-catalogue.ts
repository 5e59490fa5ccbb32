import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Catalogue } from '@shared/schemas/catalogue';
import { api } from '@/lib/api-client';

export function getCatalogue(): Promise<Catalogue> {
  return api.get<Catalogue>('/api/catalogue');
}

export function getCatalogueQueryOptions() {
  return queryOptions({ queryKey: ['catalogue'], queryFn: getCatalogue, staleTime: 5 * 60_000 });
}

export function useCatalogue() {
  return useQuery(getCatalogueQueryOptions());
}
