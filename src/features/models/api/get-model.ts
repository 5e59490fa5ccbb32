import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelPage } from '@shared/schemas/statistics';
import { api } from '@/lib/api-client';

export function getModel(slug: string): Promise<ModelPage> {
  return api.get<ModelPage>(`/api/models/${encodeURIComponent(slug)}`);
}

export function getModelQueryOptions(slug: string) {
  return queryOptions({ queryKey: ['models', slug], queryFn: () => getModel(slug) });
}

export function useModel(slug: string) {
  return useQuery(getModelQueryOptions(slug));
}
