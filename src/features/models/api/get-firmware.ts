import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FirmwarePage } from '@shared/schemas/statistics';
import { api } from '@/lib/api-client';

export function getFirmware(slug: string, version: string): Promise<FirmwarePage> {
  return api.get<FirmwarePage>(`/api/models/${encodeURIComponent(slug)}/firmware/${encodeURIComponent(version)}`);
}

export function getFirmwareQueryOptions(slug: string, version: string) {
  return queryOptions({ queryKey: ['models', slug, 'firmware', version], queryFn: () => getFirmware(slug, version) });
}

export function useFirmware(slug: string, version: string) {
  return useQuery(getFirmwareQueryOptions(slug, version));
}
