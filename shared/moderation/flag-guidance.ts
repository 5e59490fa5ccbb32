import type { RejectReason } from '../schemas/moderation';

/**
 * What a moderator should look at for each quality flag of the analysis engine
 * (shared/analysis/flags.ts), and the reject reason it most often leads to.
 */
export const FLAG_GUIDANCE: Record<string, { check: string; likelyReason?: RejectReason }> = {
  low_correlation: {
    check: 'Compare the two power traces: if their efforts do not line up, the files come from different rides or different bikes.',
    likelyReason: 'not_same_ride',
  },
  large_bias: {
    check: 'A difference this large usually means one meter skipped its zero offset or a position is tagged wrongly. Check the zero-offset answers and the positions.',
    likelyReason: 'not_calibrated',
  },
  identical_streams: {
    check: 'Both files carry the same power values: one recording was uploaded as both sides.',
    likelyReason: 'damaged_data',
  },
  implausible_power: { check: 'Look for spikes in the difference chart; a damaged file or a radio glitch produces them.', likelyReason: 'damaged_data' },
  implausible_cadence: { check: 'A cadence this high is a sensor glitch; it matters only if it is frequent.' },
  many_gaps: { check: 'Many gaps make dropout figures unreliable; check the device info and the recording mode.', likelyReason: 'damaged_data' },
  mixed_comparison: {
    check: 'A one-leg meter against a meter that does not measure that leg alone mixes leg imbalance into the bias; acceptable only with balance data.',
    likelyReason: 'mixed_comparison',
  },
  smoothing_mismatch: { check: 'One head unit averages power; peaks are blurred but the bias still counts.' },
  short_overlap: { check: 'Short rides give loose figures; accept if nothing else is wrong.' },
  drivetrain_loss: { check: 'Expected for hubs and trainers; the bias is reported as measured.' },
};
