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
    check:
      'A difference this large usually means one meter skipped its zero offset or a position is tagged wrongly. Check the zero-offset answers and the positions.',
    likelyReason: 'not_calibrated',
  },
  identical_streams: {
    check: 'Both files carry the same power values: one recording was uploaded as both sides.',
    likelyReason: 'damaged_data',
  },
  implausible_power: {
    check: 'Look for spikes in the difference chart; a damaged file or a radio glitch produces them.',
    likelyReason: 'damaged_data',
  },
  implausible_cadence: { check: 'A cadence this high is a sensor glitch; it matters only if it is frequent.' },
  many_gaps: {
    check: 'Many gaps make dropout figures unreliable; check the device info and the recording mode.',
    likelyReason: 'damaged_data',
  },
  mixed_comparison: {
    check:
      'A one-leg meter against a meter that does not measure that leg alone mixes leg imbalance into the bias; acceptable only with balance data.',
    likelyReason: 'mixed_comparison',
  },
  smoothing_mismatch: { check: 'One head unit averages power; peaks are blurred but the bias still counts.' },
  short_overlap: { check: 'Short rides give loose figures; accept if nothing else is wrong.' },
  drivetrain_loss: { check: 'Expected for hubs and trainers; the bias is reported as measured.' },
  estimate_on_bound: {
    check:
      'An estimate sits on the edge of what the comparison searches. For the clock offset, the two recordings are probably not lined up: compare the power traces and the start times, and reject unless the efforts visibly match. For the cadence lag, only the cadence figures are affected.',
    likelyReason: 'not_same_ride',
  },
  firmware_tag_mismatch: {
    check:
      "The file's own device data names another firmware than the tag. Correct the tag to the file's version when the catalogue lists it (the ride then counts for that version); otherwise send it back to the rider.",
    likelyReason: 'wrong_tag',
  },
  device_tag_mismatch: {
    check:
      'The file was written by another recording device (or device firmware) than the tag says. Correct the tag; it matters for smoothing and dropout figures, not for the bias.',
    likelyReason: 'wrong_tag',
  },
};
