import type { VerdictKind } from '../schemas/battery';

/** A firmware step is called better or worse only when its (Holm-adjusted) p-value is below this. */
export const VERDICT_SIGNIFICANCE = 0.05;

/**
 * The verdict in words for one firmware against its predecessor, the same rule for every
 * measure: not enough evidence, no clear difference, or better/worse when the adjusted
 * p-value is below 5 %.
 */
export function comparisonVerdict({
  enough,
  adjustedPValue,
  newerIsBetter,
}: {
  enough: boolean;
  adjustedPValue: number | null;
  newerIsBetter: boolean;
}): VerdictKind {
  if (!enough || adjustedPValue === null) return 'not_enough';
  if (adjustedPValue >= VERDICT_SIGNIFICANCE) return 'no_clear_difference';
  return newerIsBetter ? 'better' : 'worse';
}
