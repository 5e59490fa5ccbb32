import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface PendingEntry {
  id: number;
  name: string;
  slug?: string;
  makerName?: string;
  modelName?: string;
  proposedBy: string | null;
  createdAt: string;
}

export interface PendingEntries {
  makers: PendingEntry[];
  models: PendingEntry[];
  firmware: PendingEntry[];
  recordingDevices: PendingEntry[];
}

export function getPendingEntries(): Promise<PendingEntries> {
  return api.get<PendingEntries>('/api/moderation/catalogue/pending');
}

export function getPendingEntriesQueryOptions() {
  return queryOptions({ queryKey: ['moderation', 'catalogue', 'pending'], queryFn: getPendingEntries, staleTime: 0 });
}

export function usePendingEntries() {
  return useQuery(getPendingEntriesQueryOptions());
}
