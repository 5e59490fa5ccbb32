import type { CompareOptions, DeviceInfo, QualityFlag, Side } from '@shared/analysis/types';

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
  /** What each file says about its devices: the form pre-fills and checks the tags with it. */
  devices: { a: DeviceInfo; b: DeviceInfo };
}

export type PairPreviewAnswer =
  | { ok: true; preview: PairPreview }
  | { ok: false; error: { code: string; message: string; side: Side | null } };
