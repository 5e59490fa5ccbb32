import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DecisionView, RejectReason } from '@shared/schemas/moderation';
import { api } from '@/lib/api-client';

export interface ReviewFlag {
  code: string;
  severity: 'info' | 'warning' | 'severe';
  message: string;
  check: string | null;
  likelyReason: RejectReason | null;
}

export interface Review<S = unknown> {
  submission: S & { id: number; status: string; version: number };
  decision: DecisionView | null;
  flags: ReviewFlag[];
  riderHistory: { accepted: number; rejected: number; sentBack: number; withdrawn: number; other: number };
  duplicates: Array<{
    id: number;
    status: string;
    riderHandle: string | null;
    createdAt: string;
    overlapSeconds: number;
    overlapShare: number;
    sameStreamShare: number;
    nearIdentical: boolean;
  }>;
  deviceChecks: Array<{ side: 'a' | 'b'; what: string; tagged: string; inFile: string | null; agrees: boolean | null; message: string }>;
  originals: Array<{ side: 'a' | 'b'; kept: boolean; decoderVersion: number | null }>;
  history: Array<{ id: number; action: string; reason: string | null; actorHandle: string | null; createdAt: string }>;
}

export function getReview(id: number): Promise<Review> {
  return api.get<Review>(`/api/moderation/submissions/${id}`);
}

export function getReviewQueryOptions(id: number) {
  return queryOptions({ queryKey: ['moderation', 'review', id], queryFn: () => getReview(id), staleTime: 0 });
}

export function useReview(id: number) {
  return useQuery(getReviewQueryOptions(id));
}
