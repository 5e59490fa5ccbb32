import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Catalogue } from '@shared/schemas/catalogue';
import { api } from '@/lib/api-client';

/** The approved makers, for the scoreboard's maker filter. */
export async function getMakers(): Promise<{ slug: string; name: string }[]> {
  const catalogue = await api.get<Catalogue>('/api/catalogue');
  return catalogue.makers
    .filter((maker) => maker.status === 'approved')
    .map((maker) => ({ slug: maker.slug, name: maker.name }))
    .sort((a, b) => a.name.localeCompare(b.name));
}

export function getMakersQueryOptions() {
  return queryOptions({ queryKey: ['scoreboard', 'makers'], queryFn: getMakers, staleTime: 5 * 60_000 });
}

export function useMakers() {
  return useQuery(getMakersQueryOptions());
}
