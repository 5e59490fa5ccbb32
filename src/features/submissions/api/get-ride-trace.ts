import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RideTraceResponse } from '@shared/schemas/ride-trace';
import { api } from '@/lib/api-client';

export function getRideTrace(id: number): Promise<RideTraceResponse> {
  return api.get<RideTraceResponse>(`/api/submissions/${id}/trace`);
}

export function getRideTraceQueryOptions(id: number) {
  // A stored ride's trace does not change: fetch it once per visit.
  return queryOptions({ queryKey: ['submissions', id, 'trace'], queryFn: () => getRideTrace(id), staleTime: Infinity });
}

export function useRideTrace(id: number, enabled: boolean) {
  return useQuery({ ...getRideTraceQueryOptions(id), enabled });
}
