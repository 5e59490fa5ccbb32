import { MAX_RECORDING_SPAN_SECONDS } from './decode-fit';
import { AnalysisError } from './errors';
import { MAX_CARRY_SECONDS } from './method';
import type { RideStream } from './types';

/** One device's recording on a 1 Hz grid; NaN marks seconds with no data. */
export interface SecondGrid {
  /** UTC second of index 0, on the device's own clock. */
  start: number;
  length: number;
  power: Float64Array;
  cadence: Float64Array;
  rightBalance: Float64Array;
  /** Record temperature in °C where the file records it. */
  temperature?: Float64Array;
}

export function toSecondGrid(stream: RideStream): SecondGrid {
  const start = Math.floor(stream.recording.startTime);
  const length = stream.timestamps.length === 0 ? 0 : Math.floor(stream.recording.endTime) - start + 1;
  // The decoder refuses such recordings; this guards every other way a stream arrives.
  if (!(length <= MAX_RECORDING_SPAN_SECONDS + 1)) {
    throw new AnalysisError(
      'implausible_timestamps',
      `This recording spans more than ${MAX_RECORDING_SPAN_SECONDS / 3600} h, which no ride does; some of its records carry a wrong time.`,
    );
  }
  return {
    start,
    length,
    power: resample(stream.timestamps, stream.powerWatts, start, length),
    cadence: resample(stream.timestamps, stream.cadenceRpm, start, length),
    rightBalance: resample(stream.timestamps, stream.rightBalancePercent, start, length),
    ...(stream.temperatureCelsius && { temperature: resample(stream.timestamps, stream.temperatureCelsius, start, length) }),
  };
}

/**
 * Mean of the samples within each second, then each value carried across a gap of
 * up to MAX_CARRY_SECONDS to the device's next sample of that field (change-only
 * recording is normal); longer gaps stay NaN. Work is one pass over the records
 * (sorted by time, as the decoder leaves them) plus filling the grid; samples
 * outside [start, start + length) are ignored.
 */
export function resample(times: Float64Array, values: Float32Array | Float64Array, start: number, length: number): Float64Array {
  const grid = new Float64Array(length).fill(NaN);
  let second = -1;
  let sum = 0;
  let count = 0;
  let last = -1;
  const flush = () => {
    if (count === 0) return;
    if (last >= 0 && second - last > 1 && second - last <= MAX_CARRY_SECONDS) grid.fill(grid[last], last + 1, second);
    grid[second] = sum / count;
    last = second;
  };
  for (let i = 0; i < times.length; i++) {
    const value = values[i];
    if (Number.isNaN(value)) continue;
    const s = Math.floor(times[i]) - start;
    if (!(s >= 0 && s < length)) continue;
    if (s < second) return resampleUnsorted(times, values, start, length);
    if (s !== second) {
      flush();
      second = s;
      sum = 0;
      count = 0;
    }
    sum += value;
    count++;
  }
  flush();
  return grid;
}

/** The same for records out of time order: per-second sums over the grid. */
function resampleUnsorted(times: Float64Array, values: Float32Array | Float64Array, start: number, length: number): Float64Array {
  const sums = new Float64Array(length);
  const counts = new Uint32Array(length);
  for (let i = 0; i < times.length; i++) {
    const value = values[i];
    const second = Math.floor(times[i]) - start;
    if (Number.isNaN(value) || !(second >= 0 && second < length)) continue;
    sums[second] += value;
    counts[second]++;
  }
  const grid = new Float64Array(length);
  let last = -1;
  for (let s = 0; s < length; s++) {
    if (counts[s] === 0) {
      grid[s] = NaN;
      continue;
    }
    grid[s] = sums[s] / counts[s];
    if (last >= 0 && s - last > 1 && s - last <= MAX_CARRY_SECONDS) grid.fill(grid[last], last + 1, s);
    last = s;
  }
  return grid;
}

/** Both devices on one shared span of B's clock; index i is the same moment for both. */
export interface SharedTimeline {
  /** UTC second, on B's clock, of index 0. */
  start: number;
  length: number;
  aPower: Float64Array;
  bPower: Float64Array;
  aCadence: Float64Array;
  bCadence: Float64Array;
  aRightBalance: Float64Array;
  bRightBalance: Float64Array;
  /** The air around the ride in °C: A's head unit's reading, else B's; null when neither records it. */
  temperature: Float64Array | null;
}

/** A's second tA is B's second tA − offset (offset: how far A's clock runs ahead). */
export function sharedTimeline(a: SecondGrid, b: SecondGrid, clockOffsetSeconds: number): SharedTimeline {
  const aStartOnB = a.start - clockOffsetSeconds;
  const start = Math.max(aStartOnB, b.start);
  const end = Math.min(aStartOnB + a.length, b.start + b.length);
  const length = Math.max(0, end - start);
  const aFrom = start - aStartOnB;
  const bFrom = start - b.start;
  return {
    start,
    length,
    aPower: a.power.subarray(aFrom, aFrom + length),
    bPower: b.power.subarray(bFrom, bFrom + length),
    aCadence: a.cadence.subarray(aFrom, aFrom + length),
    bCadence: b.cadence.subarray(bFrom, bFrom + length),
    aRightBalance: a.rightBalance.subarray(aFrom, aFrom + length),
    bRightBalance: b.rightBalance.subarray(bFrom, bFrom + length),
    temperature: sharedTemperature(a.temperature?.subarray(aFrom, aFrom + length), b.temperature?.subarray(bFrom, bFrom + length), length),
  };
}

function sharedTemperature(a: Float64Array | undefined, b: Float64Array | undefined, length: number): Float64Array | null {
  if (!a && !b) return null;
  const out = new Float64Array(length);
  for (let i = 0; i < length; i++) {
    const fromA = a ? a[i] : Number.NaN;
    out[i] = fromA === fromA ? fromA : b ? b[i] : Number.NaN;
  }
  return out;
}
