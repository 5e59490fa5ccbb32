import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { QualityFlag } from '@shared/analysis/types';
import type { ReviewQueueQuery } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';

export interface QueueRecording {
  side: 'a' | 'b';
  makerId: number;
  makerName: string;
  modelId: number;
  modelName: string;
  firmwareVersion: string;
  position: string;
  recordingDeviceName: string;
}

export interface QueueRow {
  id: number;
  version: number;
  createdAt: string;
  flags: QualityFlag[];
  flagSeverity: number;
  biasPercent: number | null;
  loaLowerPercent: number | null;
  loaUpperPercent: number | null;
  matchedSeconds: number | null;
  correlation: number | null;
  likeForLikeMode: string | null;
  aPowerDropouts: number | null;
  bPowerDropouts: number | null;
  riderHandle: string | null;
  recordings: QueueRecording[];
}

export interface ReviewQueue {
  total: number;
  pageSize: number;
  submissions: QueueRow[];
  flagCounts: Array<{ code: string; count: number }>;
}

export type QueueFilters = Partial<Omit<ReviewQueueQuery, 'page'>> & { page?: number };

export function getReviewQueue(filters: QueueFilters): Promise<ReviewQueue> {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== '') params.set(key, String(value));
  return api.get<ReviewQueue>(`/api/moderation/queue?${params}`);
}

export const reviewQueueKey = ['moderation', 'queue'] as const;

export function getReviewQueueQueryOptions(filters: QueueFilters) {
  return queryOptions({ queryKey: [...reviewQueueKey, filters], queryFn: () => getReviewQueue(filters), placeholderData: keepPreviousData, staleTime: 0 });
}

export function useReviewQueue(filters: QueueFilters) {
  return useQuery(getReviewQueueQueryOptions(filters));
}
