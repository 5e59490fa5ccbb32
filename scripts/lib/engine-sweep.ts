// The recovery sweep of issue 14: simulated pairs across bias, clock offset,
// cadence lag, dropouts, noise, recording mode, partner smoothing, duration and
// ride profile, each compared through its FIT files, with the error of every
// estimate against the simulator's truth.
import { compareFitFiles } from '@shared/analysis/compare-recordings';
import { MAX_CLOCK_OFFSET_SECONDS } from '@shared/analysis/method';
import type { ComparisonResult } from '@shared/analysis/types';
import type { RecordingMode } from '@shared/simulator/meter';
import { simulatePair, type PairTruth } from '@shared/simulator/pair';
import { createRandom, deriveSeed } from '@shared/simulator/random';
import type { RideProfile } from '@shared/simulator/ride';

export const SWEEP_BASE_SEED = 140_000;
const PROFILES: RideProfile[] = ['endurance', 'intervals', 'race', 'indoor'];
export const PARTNER_SMOOTHING_SECONDS = [1, 3, 5, 10] as const;
export const RECORDING_MODES: RecordingMode[] = ['every-second', 'change-only'];
/** One pair in ten has a clock offset beyond the search window. */
const OUT_OF_WINDOW_SHARE = 0.1;

export interface SweepCase {
  index: number;
  seed: number;
  profile: RideProfile;
  durationSeconds: number;
  scale: number;
  clockOffsetSeconds: number;
  cadenceLagSeconds: number;
  partnerSmoothingSeconds: number;
  recordingMode: RecordingMode;
  /** Injected events per side and kind over the ride (0 for the pairs that test false events). */
  dropouts: { aPower: number; aCadence: number; bPower: number; bCadence: number };
  noiseWatts: number;
  noisePercent: number;
  outOfWindow: boolean;
}

export function sweepCase(index: number): SweepCase {
  const seed = SWEEP_BASE_SEED + index;
  const random = createRandom(deriveSeed(seed, 'sweep-case'));
  const outOfWindow = random.chance(OUT_OF_WINDOW_SHARE);
  const offsetMagnitude = outOfWindow ? random.integer(MAX_CLOCK_OFFSET_SECONDS + 5, 200) : random.integer(0, MAX_CLOCK_OFFSET_SECONDS);
  const withDropouts = index % 2 === 1;
  const count = () => (withDropouts ? random.integer(0, 10) : 0);
  return {
    index,
    seed,
    profile: PROFILES[index % PROFILES.length],
    durationSeconds: Math.round(random.uniform(0.5, 3) * 3600),
    scale: 1 + random.uniform(-0.05, 0.05),
    clockOffsetSeconds: random.chance(0.5) ? offsetMagnitude : -offsetMagnitude,
    cadenceLagSeconds: random.integer(0, 5),
    partnerSmoothingSeconds: PARTNER_SMOOTHING_SECONDS[Math.floor(index / 4) % PARTNER_SMOOTHING_SECONDS.length],
    recordingMode: RECORDING_MODES[Math.floor(index / 16) % RECORDING_MODES.length],
    dropouts: { aPower: count(), aCadence: count(), bPower: count(), bCadence: count() },
    noiseWatts: random.uniform(1, 4),
    noisePercent: random.uniform(0.5, 2),
    outOfWindow,
  };
}

export interface SweepOutcome {
  case: SweepCase;
  truth: PairTruth;
  result: ComparisonResult | null;
  error: string | null;
  biasError: number | null;
  offsetError: number | null;
  cadenceLagError: number | null;
  /** Detected minus injected events. */
  dropoutErrors: { aPower: number; aCadence: number; bPower: number; bCadence: number } | null;
  boundFlagged: boolean;
}

export function runSweepCase(c: SweepCase): SweepOutcome {
  const hours = c.durationSeconds / 3600;
  const { a, b, truth } = simulatePair({
    seed: c.seed,
    durationSeconds: c.durationSeconds,
    profile: c.profile,
    a: {
      position: 'total',
      scale: c.scale,
      clockOffsetSeconds: c.clockOffsetSeconds,
      cadenceLagSeconds: c.cadenceLagSeconds,
      recordingMode: c.recordingMode,
      noiseWatts: c.noiseWatts,
      noisePercent: c.noisePercent,
      powerDropoutsPerHour: c.dropouts.aPower / hours,
      cadenceDropoutsPerHour: c.dropouts.aCadence / hours,
    },
    b: {
      position: 'total',
      smoothingSeconds: c.partnerSmoothingSeconds,
      recordingMode: c.recordingMode,
      noiseWatts: c.noiseWatts,
      noisePercent: c.noisePercent,
      powerDropoutsPerHour: c.dropouts.bPower / hours,
      cadenceDropoutsPerHour: c.dropouts.bCadence / hours,
    },
  });
  let result: ComparisonResult;
  try {
    result = compareFitFiles(a, b, { aPosition: 'total', bPosition: 'total' });
  } catch (err) {
    return {
      case: c,
      truth,
      result: null,
      error: String((err as Error).message),
      biasError: null,
      offsetError: null,
      cadenceLagError: null,
      dropoutErrors: null,
      boundFlagged: false,
    };
  }
  const d = result.dropouts;
  return {
    case: c,
    truth,
    result,
    error: null,
    biasError: result.bias.percent === null ? null : result.bias.percent - truth.biasPercent,
    offsetError: result.alignment.clockOffsetSeconds - truth.clockOffsetSeconds,
    cadenceLagError: result.cadenceLagSeconds === null ? null : result.cadenceLagSeconds - truth.cadenceLagSeconds,
    dropoutErrors: {
      aPower: d.a.power.count - truth.dropouts.a.power,
      aCadence: d.a.cadence.count - truth.dropouts.a.cadence,
      bPower: d.b.power.count - truth.dropouts.b.power,
      bCadence: d.b.cadence.count - truth.dropouts.b.cadence,
    },
    boundFlagged: result.flags.some((flag) => flag.code === 'estimate_on_bound'),
  };
}

export interface Distribution {
  n: number;
  mean: number;
  sd: number;
  p1: number;
  p99: number;
  worst: number;
}

export function distribution(values: number[]): Distribution | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((x, y) => x - y);
  const n = sorted.length;
  const mean = sorted.reduce((s, v) => s + v, 0) / n;
  const sd = n > 1 ? Math.sqrt(sorted.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1)) : 0;
  const at = (p: number) => sorted[Math.min(n - 1, Math.max(0, Math.round(p * (n - 1))))];
  const worst = sorted.reduce((w, v) => (Math.abs(v) > Math.abs(w) ? v : w), 0);
  return { n, mean, sd, p1: at(0.01), p99: at(0.99), worst };
}
