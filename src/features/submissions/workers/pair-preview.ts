import type { CompareOptions, QualityFlag, Side } from '@shared/analysis/types';

export interface PairPreviewRequest {
  aBytes: ArrayBuffer;
  bBytes: ArrayBuffer;
  options: CompareOptions;
}

/** The few figures a rider needs to notice a wrong pairing before uploading. */
export interface PairPreview {
  overlapSeconds: number;
  clockOffsetSeconds: number;
  correlation: number;
  biasPercent: number | null;
  lowerLimitPercent: number | null;
  upperLimitPercent: number | null;
  flags: QualityFlag[];
}

export type PairPreviewAnswer =
  | { ok: true; preview: PairPreview }
  | { ok: false; error: { code: string; message: string; side: Side | null } };
