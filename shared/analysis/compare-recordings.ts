import { agreementOf, matchedBlocks } from './agreement';
import { findClockOffset } from './alignment';
import { cadenceBands, powerBands } from './bands';
import { biasOverMatched, energySeconds, matchedSeconds } from './bias';
import { alignCadences, findCadenceLag } from './cadence-lag';
import { assertRecordingUsable, decodeFit } from './decode-fit';
import { differenceSeries } from './difference-series';
import { biasByTemperatureBand, differenceDrift, driftBlocks } from './drift';
import { analyseDropouts } from './dropouts';
import { AnalysisError, attributeToSide, formatDuration } from './errors';
import { qualityFlags } from './flags';
import { comparablePower } from './like-for-like';
import { METHOD_VERSION, MIN_OVERLAP_SECONDS } from './method';
import { analysePeaks } from './peaks';
import { smoothingSignature } from './smoothing';
import { findSteadySegments } from './steady-segments';
import { sharedTimeline, toSecondGrid } from './timeline';
import type { BatteryReading, CompareOptions, ComparisonResult, RideStream, RideTemperature, Side } from './types';

export { METHOD_VERSION };

/** A is the device being judged, B its partner on the same ride. */
export function compareRecordings(a: RideStream, b: RideStream, options: CompareOptions): ComparisonResult {
  forEachSide({ a, b }, (stream) => assertRecordingUsable(stream));
  const grids = { a: toSecondGrid(a), b: toSecondGrid(b) };

  const { clockOffsetSeconds, correlation, smoothingWindowSeconds, outsideWindow } = findClockOffset(grids.a, grids.b);
  const timeline = sharedTimeline(grids.a, grids.b, clockOffsetSeconds);
  const overlapSeconds = countBothReporting(timeline.aPower, timeline.bPower);
  if (overlapSeconds === 0) {
    throw new AnalysisError('no_overlap', 'These recordings do not overlap in time. Were they recorded on the same ride?');
  }
  if (overlapSeconds < MIN_OVERLAP_SECONDS) {
    throw new AnalysisError(
      'short_overlap',
      `These recordings overlap for only ${formatDuration(overlapSeconds)}; a comparison needs at least ${formatDuration(MIN_OVERLAP_SECONDS)} of riding recorded by both.`,
    );
  }
  const alignment = {
    clockOffsetSeconds,
    outsideWindow,
    overlapSeconds,
    correlation,
    startTime: timeline.start,
    endTime: timeline.start + timeline.length,
  };

  const cadenceLag = findCadenceLag(timeline);
  // A lag the search could not pin down is not removed: shifting by a bound would invent events.
  const cadence = alignCadences(timeline, cadenceLag && !cadenceLag.outsideWindow ? cadenceLag.lagSeconds : 0);
  const { dropouts, aPowerDropout, bPowerDropout } = analyseDropouts(timeline, { cadence, smoothingWindowSeconds });
  const comparable = comparablePower(timeline, options);
  const matched = matchedSeconds(comparable.a, comparable.b, aPowerDropout, bPowerDropout);
  const usable = energySeconds(comparable.a, comparable.b, aPowerDropout, bPowerDropout);
  const { sumA, sumB, ...bias } = biasOverMatched(comparable.a, comparable.b, usable);
  const drift = differenceDrift(driftBlocks(comparable.a, comparable.b, usable));
  const naive = biasOverMatched(
    timeline.aPower,
    timeline.bPower,
    energySeconds(timeline.aPower, timeline.bPower, aPowerDropout, bPowerDropout),
  );
  const likeForLike = {
    mode: comparable.mode,
    percent: bias.percent,
    naivePercent: naive.percent,
    leg: comparable.leg,
    expectedDrivetrainPercent: comparable.expectedDrivetrainPercent,
  };
  const smoothing = { ...smoothingSignature(comparable.a, comparable.b, matched), windowSeconds: smoothingWindowSeconds };

  return {
    methodVersion: METHOD_VERSION,
    positions: { a: options.aPosition, b: options.bPosition },
    devices: { a: a.device, b: b.device },
    recordings: { a: a.recording, b: b.recording },
    alignment,
    bias,
    sums: { a: sumA, b: sumB },
    pedallingSeconds: dropouts.pedallingSeconds,
    agreement: agreementOf(matchedBlocks(comparable.a, comparable.b, matched)),
    dropouts,
    cadenceLagSeconds: cadenceLag?.lagSeconds ?? null,
    cadenceLagCorrelation: cadenceLag?.correlation ?? null,
    cadenceLagOutsideWindow: cadenceLag?.outsideWindow ?? false,
    peaks: analysePeaks(comparable.a, comparable.b),
    powerBands: powerBands(comparable.a, comparable.b, matched),
    cadenceBands: cadenceBands(comparable.a, comparable.b, matched, timeline.aCadence, timeline.bCadence),
    steadySegments: findSteadySegments(comparable.a, comparable.b, matched),
    likeForLike,
    smoothing,
    flags: qualityFlags({
      alignment,
      cadenceLag,
      bias,
      likeForLike,
      smoothing,
      grids,
      gaps: {
        a: { ...a.recording, durationSeconds: a.recording.endTime - a.recording.startTime },
        b: { ...b.recording, durationSeconds: b.recording.endTime - b.recording.startTime },
      },
      identicalStreams: sameOnMatchedSeconds(comparable.a, comparable.b, matched),
      drift,
    }),
    series: differenceSeries(comparable.a, comparable.b, matched),
    drift,
    temperature: timeline.temperature && rideTemperature(comparable.a, comparable.b, usable, timeline.temperature),
    battery: {
      a: batteryReadings(a, timeline.start + clockOffsetSeconds),
      b: batteryReadings(b, timeline.start),
    },
  };
}

function rideTemperature(a: Float64Array, b: Float64Array, usable: Uint8Array, celsius: Float64Array): RideTemperature | null {
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  let sum = 0;
  let count = 0;
  for (const value of celsius) {
    if (!Number.isFinite(value)) continue;
    min = Math.min(min, value);
    max = Math.max(max, value);
    sum += value;
    count++;
  }
  if (count === 0) return null;
  const bands = biasByTemperatureBand(a, b, usable, celsius).map(({ band, seconds, percent }) => ({ band, seconds, percent }));
  return { minCelsius: min, maxCelsius: max, meanCelsius: sum / count, bands };
}

/** Each change of the reported battery state, on seconds from the alignment start (`zero` on the device's own clock). */
function batteryReadings(stream: RideStream, zero: number): BatteryReading[] {
  const readings: BatteryReading[] = [];
  for (const report of stream.powerMeterReports ?? []) {
    if (report.time === null || (report.batteryStatus === null && report.batteryVolts === null)) continue;
    const last = readings.at(-1);
    if (last && last.status === report.batteryStatus && last.volts === report.batteryVolts) continue;
    readings.push({ atSeconds: Math.round(report.time - zero), status: report.batteryStatus, volts: report.batteryVolts });
  }
  return readings;
}

/** Decodes both files and compares them; errors name the file they concern. */
export function compareFitFiles(
  aBytes: Uint8Array | ArrayBuffer,
  bBytes: Uint8Array | ArrayBuffer,
  options: CompareOptions,
): ComparisonResult {
  const streams = forEachSide({ a: aBytes, b: bBytes }, (bytes) => decodeFit(bytes));
  const result = compareRecordings(streams.a, streams.b, options);
  if (!sameBytes(aBytes, bBytes)) return result;
  const flags = result.flags.filter((flag) => flag.code !== 'identical_streams');
  flags.unshift({
    code: 'identical_files',
    severity: 'severe',
    message: 'Both uploads are the same file: a meter cannot be compared with itself.',
  });
  return { ...result, flags };
}

function sameBytes(a: Uint8Array | ArrayBuffer, b: Uint8Array | ArrayBuffer): boolean {
  const x = a instanceof Uint8Array ? a : new Uint8Array(a);
  const y = b instanceof Uint8Array ? b : new Uint8Array(b);
  if (x.length !== y.length) return false;
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return false;
  return true;
}

function forEachSide<T, R>(inputs: Record<Side, T>, work: (input: T) => R): Record<Side, R> {
  const run = (side: Side): R => {
    try {
      return work(inputs[side]);
    } catch (error) {
      throw attributeToSide(error, side);
    }
  };
  return { a: run('a'), b: run('b') };
}

function countBothReporting(a: Float64Array, b: Float64Array): number {
  let count = 0;
  for (let i = 0; i < a.length; i++) if (a[i] === a[i] && b[i] === b[i]) count++;
  return count;
}

function sameOnMatchedSeconds(a: Float64Array, b: Float64Array, matched: Uint8Array): boolean {
  let compared = 0;
  for (let i = 0; i < a.length; i++) {
    if (matched[i] === 0) continue;
    if (a[i] !== b[i]) return false;
    compared++;
  }
  return compared > 0;
}
