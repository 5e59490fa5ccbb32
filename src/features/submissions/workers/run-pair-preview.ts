import { compareFitFiles } from '@shared/analysis/compare-recordings';
import { AnalysisError } from '@shared/analysis/errors';
import type { PairPreviewAnswer, PairPreviewRequest } from './pair-preview';

// The same engine the server runs, on the rider's own machine, before anything is uploaded.
export function runPairPreview({ aBytes, bBytes, options }: PairPreviewRequest): PairPreviewAnswer {
  try {
    const result = compareFitFiles(aBytes, bBytes, options);
    return {
      ok: true,
      preview: {
        overlapSeconds: result.alignment.overlapSeconds,
        clockOffsetSeconds: result.alignment.clockOffsetSeconds,
        correlation: result.alignment.correlation,
        biasPercent: result.likeForLike.percent,
        lowerLimitPercent: result.agreement.lowerLimitPercent,
        upperLimitPercent: result.agreement.upperLimitPercent,
        flags: result.flags,
        devices: result.devices,
      },
    };
  } catch (error) {
    if (error instanceof AnalysisError) return { ok: false, error: { code: error.code, message: error.message, side: error.side } };
    return { ok: false, error: { code: 'preview_failed', message: 'These files could not be read in the browser.', side: null } };
  }
}
