// Where a meter loses power or cadence for a few seconds. Events are placed only
// where the partner device would clearly see them, so that the injected count is
// the count the analysis should find (issue 3, method step 3: a dropout is a run of
// ≥ 3 s of no/zero power while the other device reads ≥ 50 W, or no/zero cadence
// while the other reads ≥ 30 rpm; runs < 2 s apart merge).
import type { Random } from './random';
import type { TrueRide } from './ride';

export type DropoutKind = 'power' | 'cadence';

export interface DropoutWindow {
  kind: DropoutKind;
  /** Seconds from the ride's start (true time, not any device's clock). */
  startSecond: number;
  durationSeconds: number;
}

export interface DropoutRates {
  powerDropoutsPerHour?: number;
  cadenceDropoutsPerHour?: number;
  /** Shortest and longest event in s; the shortest is at least 3 s. */
  dropoutSeconds?: readonly [number, number];
}

export const DEFAULT_DROPOUT_SECONDS: readonly [number, number] = [3, 12];

// Margins leave room for the partner's smoothing window (≤ 10 s) and cadence lag
// (≤ 10 s) so that the partner still reads well above the thresholds throughout.
const POWER_FLOOR_WATTS = 100;
const CADENCE_FLOOR_RPM = 45;
const MARGIN_BEFORE_SECONDS = 12;
const MARGIN_AFTER_SECONDS = 3;
/** Keeps events further apart than the analysis's 2 s merging distance. */
const SEPARATION_SECONDS = 5;
const PLACEMENT_ATTEMPTS = 200;

/**
 * Plans dropout events inside [firstSecond, lastSecond] with a Poisson count per
 * pedalling hour. `occupied` (one byte per ride second) is shared between the two
 * meters of a pair so their events never overlap; it is updated in place.
 */
export function planDropouts(
  ride: TrueRide,
  rates: DropoutRates,
  firstSecond: number,
  lastSecond: number,
  random: Random,
  occupied: Uint8Array = new Uint8Array(ride.power.length),
): DropoutWindow[] {
  let pedallingSeconds = 0;
  for (let t = firstSecond; t <= lastSecond; t += 1) if (ride.power[t] > 0) pedallingSeconds += 1;
  const hours = pedallingSeconds / 3600;
  const [shortest, longest] = rates.dropoutSeconds ?? DEFAULT_DROPOUT_SECONDS;
  const minSeconds = Math.max(3, Math.round(shortest));
  const maxSeconds = Math.max(minSeconds, Math.round(longest));

  const planned: DropoutWindow[] = [];
  const requests: Array<[DropoutKind, number]> = [
    ['power', random.poisson((rates.powerDropoutsPerHour ?? 0) * hours)],
    ['cadence', random.poisson((rates.cadenceDropoutsPerHour ?? 0) * hours)],
  ];
  for (const [kind, count] of requests) {
    const series = kind === 'power' ? ride.power : ride.cadence;
    const floor = kind === 'power' ? POWER_FLOOR_WATTS : CADENCE_FLOOR_RPM;
    for (let i = 0; i < count; i += 1) {
      const durationSeconds = random.integer(minSeconds, maxSeconds);
      const earliest = firstSecond + MARGIN_BEFORE_SECONDS;
      const latest = lastSecond - durationSeconds - MARGIN_AFTER_SECONDS;
      if (latest < earliest) break;
      for (let attempt = 0; attempt < PLACEMENT_ATTEMPTS; attempt += 1) {
        const startSecond = random.integer(earliest, latest);
        if (!isClear(series, floor, occupied, startSecond, durationSeconds)) continue;
        occupied.fill(1, startSecond - SEPARATION_SECONDS, startSecond + durationSeconds + SEPARATION_SECONDS);
        planned.push({ kind, startSecond, durationSeconds });
        break;
      }
    }
  }
  return planned.sort((x, y) => x.startSecond - y.startSecond);
}

function isClear(series: Float32Array, floor: number, occupied: Uint8Array, start: number, duration: number): boolean {
  for (let t = start - MARGIN_BEFORE_SECONDS; t < start + duration + MARGIN_AFTER_SECONDS; t += 1) {
    if (series[t] < floor) return false;
  }
  for (let t = start - SEPARATION_SECONDS; t < start + duration + SEPARATION_SECONDS; t += 1) {
    if (occupied[t]) return false;
  }
  return true;
}
