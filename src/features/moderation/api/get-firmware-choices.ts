import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Catalogue } from '@shared/schemas/catalogue';
import { api } from '@/lib/api-client';

/** The firmware versions a rider may tag, per model (their own proposals included). */
export async function getFirmwareChoices(): Promise<Catalogue['firmware']> {
  return (await api.get<Catalogue>('/api/catalogue')).firmware;
}

export function getFirmwareChoicesQueryOptions() {
  return queryOptions({ queryKey: ['moderation', 'firmware-choices'], queryFn: getFirmwareChoices, staleTime: 60_000 });
}

export function useFirmwareChoices(enabled: boolean) {
  return useQuery({ ...getFirmwareChoicesQueryOptions(), enabled });
}
