import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Catalogue } from '@shared/schemas/catalogue';
import { api } from '@/lib/api-client';

/** The approved catalogue with entry numbers: what a moderator can rename or merge into. */
export async function getCurationCatalogue(): Promise<Catalogue> {
  const catalogue = await api.get<Catalogue>('/api/catalogue');
  const approved = <T extends { status: string }>(entries: T[]) => entries.filter((entry) => entry.status === 'approved');
  return {
    makers: approved(catalogue.makers),
    models: approved(catalogue.models),
    firmware: approved(catalogue.firmware),
    recordingDevices: approved(catalogue.recordingDevices),
  };
}

export function getCurationCatalogueQueryOptions() {
  return queryOptions({ queryKey: ['moderation', 'catalogue', 'approved'], queryFn: getCurationCatalogue, staleTime: 0 });
}

export function useCurationCatalogue() {
  return useQuery(getCurationCatalogueQueryOptions());
}
