// Parameters of the comparison method, version 1. Changing any of them changes
// results, so it changes METHOD_VERSION too.
export const METHOD_VERSION = 1;

/** A gap in a recording up to this long carries the last value (change-only recording is normal). */
export const MAX_CARRY_SECONDS = 5;
export const MAX_CLOCK_OFFSET_SECONDS = 120;
export const ALIGNMENT_SMOOTHING_SECONDS = 5;
export const MIN_OVERLAP_SECONDS = 600;
export const MAX_CADENCE_LAG_SECONDS = 10;
export const BLOCK_SECONDS = 30;
/** Limits of agreement: mean ± 1.96 SD (Bland & Altman 1986). */
export const LIMITS_OF_AGREEMENT_Z = 1.96;
