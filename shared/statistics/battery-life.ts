import type {
  BatteryComparison,
  BatteryLifeFigure,
  FirmwareBatteryLife,
  PreviousBatteryEnding,
  TemperatureBandFigure,
} from '../schemas/battery';
import { createRandom } from '../simulator/random';
import { studentTQuantile } from './distributions';
import { holmAdjust } from './multiple-comparisons';
import { clusteredLogRankTest, kaplanMeier, logRankTest, type ClusteredObservation } from './survival';
import { comparisonVerdict } from './verdict';

/** Below these, battery life is "not enough batteries yet": one rider's habits are not a model's. */
export const MIN_BATTERIES = 5;
export const MIN_BATTERY_RIDERS = 3;
/** A temperature band's pooled bias needs this many riders with rides in the band. */
export const MIN_TEMPERATURE_RIDERS = 3;
const RESAMPLES = 1000;

/** One battery of one rider's meter, followed from the day it went in. */
export interface BatterySpan {
  riderId: number;
  firmwareId: number;
  hours: number;
  /** It ran flat or warned (an observed end); false: still running or changed early (censored). */
  ended: boolean;
}

export interface BatteryEventRecord {
  occurredOn: string;
  previousEnded: PreviousBatteryEnding;
  firmwareId: number;
}

/** One battery's days: from its event to the next one (or, still running, to `today`). */
export interface BatteryPeriod {
  fromDay: string;
  /** Exclusive end day; null while still running. */
  toDay: string | null;
  firmwareId: number;
  ended: boolean;
}

/** A meter's events, in any order, as the batteries they delimit. */
export function batteryPeriods(events: BatteryEventRecord[]): BatteryPeriod[] {
  const sorted = [...events].sort((x, y) => x.occurredOn.localeCompare(y.occurredOn));
  return sorted.map((event, i) => {
    const next = sorted[i + 1];
    return {
      fromDay: event.occurredOn,
      toDay: next?.occurredOn ?? null,
      firmwareId: event.firmwareId,
      ended: next !== undefined && (next.previousEnded === 'ran_flat' || next.previousEnded === 'low_warning'),
    };
  });
}

/** True when a day (YYYY-MM-DD) falls in a battery's period. */
export function inPeriod(day: string, period: BatteryPeriod): boolean {
  return day >= period.fromDay && (period.toDay === null || day < period.toDay);
}

function observations(spans: BatterySpan[]): ClusteredObservation[] {
  // A battery followed for no riding at all says nothing; one that died at once still counts.
  return spans.filter((s) => s.hours > 0 || s.ended).map((s) => ({ time: s.hours, event: s.ended, cluster: s.riderId }));
}

/**
 * Median hours per battery from the Kaplan–Meier curve (batteries still running or
 * changed early are censored), with a 95 % interval on the log scale whose standard
 * error comes from resampling riders with replacement (cluster bootstrap; Efron &
 * Tibshirani 1993, ch. 13), so that one rider's many batteries count as one rider's
 * evidence. With few riders the bootstrap's spread is too small: it is scaled by
 * √(G / (G − 1)) and read against Student's t on G − 1 degrees of freedom (G riders).
 * When more than 2.5 % of the resamples never reach one half, the upper limit is null.
 * `npm run validate:battery` prints the coverage this gives on simulated crowds.
 */
export function batteryLife(spans: BatterySpan[], seed = 1): BatteryLifeFigure {
  const counted = observations(spans);
  const riders = new Set(counted.map((o) => o.cluster)).size;
  const ranFlat = counted.filter((o) => o.event).length;
  const longestFollowedHours = counted.reduce((max, o) => Math.max(max, o.time), 0);
  const enough = counted.length >= MIN_BATTERIES && riders >= MIN_BATTERY_RIDERS;
  const base = { enough, batteries: counted.length, riders, ranFlat, longestFollowedHours };
  if (!enough) return { ...base, medianHours: null, lowerHours: null, upperHours: null };
  const medianHours = kaplanMeier(counted).median.estimate;
  const byRider = groupsOf(counted, (o) => o.cluster);
  const random = createRandom(seed);
  const logMedians: number[] = [];
  let unbounded = 0;
  for (let r = 0; r < RESAMPLES; r++) {
    const sample = Array.from({ length: byRider.length }, () => byRider[random.integer(0, byRider.length - 1)]!).flat();
    const median = kaplanMeier(sample).median.estimate;
    if (median === null || median <= 0) unbounded++;
    else logMedians.push(Math.log(median));
  }
  if (medianHours === null || medianHours <= 0 || logMedians.length < 2)
    return { ...base, medianHours, lowerHours: null, upperHours: null };
  const mean = logMedians.reduce((s, v) => s + v, 0) / logMedians.length;
  const sd = Math.sqrt(logMedians.reduce((s, v) => s + (v - mean) ** 2, 0) / (logMedians.length - 1));
  const half = studentTQuantile(0.975, riders - 1) * sd * Math.sqrt(riders / (riders - 1));
  return {
    ...base,
    medianHours,
    lowerHours: Math.exp(Math.log(medianHours) - half),
    upperHours: unbounded > 0.025 * RESAMPLES ? null : Math.exp(Math.log(medianHours) + half),
  };
}

/**
 * Battery life per firmware (oldest first), each version against its predecessor by the
 * rider-clustered log-rank test (or the classic one, whichever is less sure), Holm-adjusted
 * over the model's steps, with its verdict in words.
 */
export function batteryLifeByFirmware(spans: BatterySpan[], firmware: { id: number; version: string }[]): FirmwareBatteryLife[] {
  const lives = firmware
    .map((f) => ({ f, spans: spans.filter((s) => s.firmwareId === f.id) }))
    .map(({ f, spans: own }) => ({ f, own, life: batteryLife(own, f.id) }));
  const tests = lives.map((current, i) => {
    const previous = lives[i - 1];
    if (!previous?.life.enough || !current.life.enough) return null;
    const older = observations(previous.own);
    const newer = observations(current.own);
    const clustered = clusteredLogRankTest(older, newer);
    // Never more sure than the classic log-rank: with one battery per rider the robust variance alone is too small.
    return { score: clustered.score, pValue: Math.max(clustered.smallSamplePValue, logRankTest(older, newer).pValue) };
  });
  const adjusted = holmAdjust(tests.map((t) => t?.pValue ?? null));
  return lives.map((current, i) => {
    const previous = lives[i - 1];
    if (!previous) return { version: current.f.version, life: current.life, againstPredecessor: null };
    const test = tests[i];
    // The newer version's score O − E > 0: its batteries run flat sooner than the older's.
    const verdict = comparisonVerdict({
      enough: test !== null,
      adjustedPValue: adjusted[i] ?? null,
      newerIsBetter: (test?.score ?? 0) < 0,
    });
    const againstPredecessor: BatteryComparison = {
      from: previous.f.version,
      verdict,
      words: batteryVerdictWords(verdict, previous.f.version),
      pValue: test?.pValue ?? null,
      adjustedPValue: adjusted[i] ?? null,
    };
    return { version: current.f.version, life: current.life, againstPredecessor };
  });
}

export function batteryVerdictWords(verdict: BatteryComparison['verdict'], from: string): string {
  switch (verdict) {
    case 'better':
      return `Batteries last longer than on ${from}.`;
    case 'worse':
      return `Batteries run flat sooner than on ${from}.`;
    case 'no_clear_difference':
      return `No clear difference in battery life from ${from}.`;
    case 'not_enough':
      return `Not enough batteries yet to compare with ${from}.`;
  }
}

/** One accepted ride's bias in one temperature band, as the model's meter read it. */
export interface TemperatureBandRide {
  riderId: number;
  band: string;
  seconds: number;
  /** The model's meter against its partner in this band, in %. */
  percent: number;
}

/**
 * Bias per temperature band with the rider as the unit: each rider's rides in the band
 * are averaged first, then the riders' means give the band's mean and its t interval
 * (riders differ more than rides of one rider; a ride-level interval would be too narrow).
 */
export function biasByTemperature(rides: TemperatureBandRide[], bands: readonly string[]): TemperatureBandFigure[] {
  return bands.map((band) => {
    const inBand = rides.filter((r) => r.band === band);
    const riderMeans = groupsOf(inBand, (r) => r.riderId).map((own) => own.reduce((s, r) => s + r.percent, 0) / own.length);
    const n = riderMeans.length;
    const base = { band, rides: inBand.length, riders: n, hours: inBand.reduce((s, r) => s + r.seconds, 0) / 3600 };
    if (n < MIN_TEMPERATURE_RIDERS) return { ...base, meanPercent: null, lowerPercent: null, upperPercent: null };
    const mean = riderMeans.reduce((s, v) => s + v, 0) / n;
    const sd = Math.sqrt(riderMeans.reduce((s, v) => s + (v - mean) ** 2, 0) / (n - 1));
    const half = studentTQuantile(0.975, n - 1) * (sd / Math.sqrt(n));
    return { ...base, meanPercent: mean, lowerPercent: mean - half, upperPercent: mean + half };
  });
}

/** Items grouped by a key, in first-seen order (Map.groupBy needs Node 21). */
function groupsOf<T, K>(items: T[], key: (item: T) => K): T[][] {
  const groups = new Map<K, T[]>();
  for (const item of items) {
    const k = key(item);
    const group = groups.get(k);
    if (group) group.push(item);
    else groups.set(k, [item]);
  }
  return [...groups.values()];
}
