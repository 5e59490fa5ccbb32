// Parameters of the comparison method. Changing any of them changes results, so it
// changes METHOD_VERSION too. Version 2 (issue 14): power dropouts need the
// partner's own pedalling, cadence dropouts are looked for after the cadence lag is
// removed, the bias is the ratio of energies over every second neither side is in
// a dropout, candidate dropouts are masked while aligning, the alignment models
// head-unit smoothing so the cadence lag comes from cadence alone, and any estimate
// on its search bound is flagged.
export const METHOD_VERSION = 2;

/** A gap in a recording up to this long carries the last value (change-only recording is normal). */
export const MAX_CARRY_SECONDS = 5;
export const MAX_CLOCK_OFFSET_SECONDS = 120;
/** The offset and lag searches look this far past their windows, so an estimate beyond a window is seen, not clipped. */
export const SEARCH_MARGIN_SECONDS = 5;
export const ALIGNMENT_SMOOTHING_SECONDS = 5;
/** Longest trailing power average of a head unit the alignment models (1 = none). */
export const MAX_HEAD_UNIT_SMOOTHING_SECONDS = 12;
export const MIN_OVERLAP_SECONDS = 600;
export const MAX_CADENCE_LAG_SECONDS = 10;
export const BLOCK_SECONDS = 30;
/** Limits of agreement: mean ± 1.96 SD (Bland & Altman 1986). */
export const LIMITS_OF_AGREEMENT_Z = 1.96;
