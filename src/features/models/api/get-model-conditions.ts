import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ModelConditions } from '@shared/schemas/battery';
import { api } from '@/lib/api-client';

export function getModelConditions(slug: string): Promise<ModelConditions> {
  return api.get<ModelConditions>(`/api/models/${encodeURIComponent(slug)}/conditions`);
}

export function getModelConditionsQueryOptions(slug: string) {
  return queryOptions({ queryKey: ['models', slug, 'conditions'], queryFn: () => getModelConditions(slug) });
}

export function useModelConditions(slug: string) {
  return useQuery(getModelConditionsQueryOptions(slug));
}
