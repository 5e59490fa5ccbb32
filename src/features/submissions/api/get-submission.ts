import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ComparisonResult, MeasurementPosition, QualityFlag, Side } from '@shared/analysis/types';
import type { ModelKind } from '@shared/schemas/catalogue';
import type { SubmissionStatus, Surface } from '@shared/schemas/submission';
import { api } from '@/lib/api-client';

export interface SubmissionRecording {
  side: Side;
  position: MeasurementPosition;
  makerName: string;
  modelName: string;
  modelSlug: string;
  modelKind: ModelKind;
  firmwareVersion: string;
  recordingDeviceName: string;
  recordingDeviceFirmware: string;
  recordingMode: 'every_second' | 'change_only';
  zeroOffset: 'yes' | 'no' | 'unsure';
  otherMetersOn: boolean;
  deviceInfo?: unknown;
}

export interface Submission {
  id: number;
  status: SubmissionStatus;
  indoor: boolean;
  surface: Surface;
  notes: string;
  result: ComparisonResult | null;
  flags: QualityFlag[];
  errorCode: string | null;
  errorMessage: string | null;
  createdAt: string;
  analysedAt: string | null;
  rider: { handle: string | null; name: string };
  isOwn: boolean;
  recordings: SubmissionRecording[];
}

/** Statuses during which the background job is still working on the files. */
export const IN_PROGRESS_STATUSES: readonly SubmissionStatus[] = ['received', 'analysing'];

export function getSubmission(id: number): Promise<Submission> {
  return api.get<Submission>(`/api/submissions/${id}`);
}

export function getSubmissionQueryOptions(id: number) {
  return queryOptions({
    queryKey: ['submissions', id],
    queryFn: () => getSubmission(id),
    // Ask again every 1.5 s while the analysis job runs; stop once it has an answer.
    refetchInterval: (query) => (query.state.data && IN_PROGRESS_STATUSES.includes(query.state.data.status) ? 1500 : false),
    staleTime: 0,
  });
}

export function useSubmission(id: number) {
  return useQuery(getSubmissionQueryOptions(id));
}
