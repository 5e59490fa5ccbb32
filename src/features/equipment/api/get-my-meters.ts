import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RiderMeterView } from '@shared/schemas/battery';
import { api } from '@/lib/api-client';

export function getMyMeters(): Promise<{ meters: RiderMeterView[] }> {
  return api.get<{ meters: RiderMeterView[] }>('/api/me/meters');
}

export function getMyMetersQueryOptions() {
  return queryOptions({ queryKey: ['me', 'meters'], queryFn: getMyMeters });
}

export function useMyMeters() {
  return useQuery(getMyMetersQueryOptions());
}
