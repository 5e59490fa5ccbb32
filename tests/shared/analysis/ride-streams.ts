// Builds RideStreams straight from per-second arrays, for tests of the method
// steps that do not need FIT bytes.
import { recordingStatistics } from '@shared/analysis/decode-fit';
import type { RideStream } from '@shared/analysis/types';

export const RIDE_START = 1_750_000_000; // 2025-06-15, an arbitrary Unix second

export interface StreamSpec {
  power: ArrayLike<number>;
  cadence?: ArrayLike<number>;
  rightBalance?: ArrayLike<number>;
  /** Unix seconds of the first record. */
  start?: number;
  /** Indexes to leave out, as a head unit that skipped records would. */
  skip?: (index: number) => boolean;
}

export function rideStream(spec: StreamSpec): RideStream {
  const start = spec.start ?? RIDE_START;
  const indexes = Array.from({ length: spec.power.length }, (_, i) => i).filter((i) => !spec.skip?.(i));
  const pick = (values: ArrayLike<number> | undefined) => Float32Array.from(indexes, (i) => (values === undefined ? NaN : values[i]));
  const timestamps = Float64Array.from(indexes, (i) => start + i);
  return {
    timestamps,
    powerWatts: pick(spec.power),
    cadenceRpm: pick(spec.cadence),
    rightBalancePercent: pick(spec.rightBalance),
    device: { creator: { manufacturerId: 255, productId: 1, serialNumber: 1, softwareVersion: 1 }, powerMeter: null },
    recording: recordingStatistics(timestamps),
  };
}

/**
 * A deterministic, ride-like effort: blocks of changing intensity with second-to-second
 * wobble, some coasting, and a few sprints, so correlations have something to lock onto.
 */
export function effort(seconds: number, seed = 1): { power: Float64Array; cadence: Float64Array } {
  let state = seed;
  const random = () => {
    state = (state * 1_103_515_245 + 12_345) % 2 ** 31;
    return state / 2 ** 31;
  };
  const power = new Float64Array(seconds);
  const cadence = new Float64Array(seconds);
  let target = 200;
  let targetCadence = 88;
  for (let i = 0; i < seconds; i++) {
    if (i % 45 === 0) {
      target = random() < 0.1 ? 0 : 120 + 260 * random();
      targetCadence = target === 0 ? 0 : 70 + 35 * random();
    }
    const sprint = i % 900 >= 600 && i % 900 < 610;
    power[i] = sprint ? 900 + 100 * random() : target === 0 ? 0 : Math.max(1, target + 40 * (random() - 0.5));
    cadence[i] = sprint ? 115 : targetCadence === 0 ? 0 : targetCadence + 4 * (random() - 0.5);
  }
  return { power, cadence };
}

export function scaled(values: ArrayLike<number>, factor: number): Float64Array {
  return Float64Array.from(values, (value) => value * factor);
}
