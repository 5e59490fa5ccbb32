// A simulated crowd of riders logging batteries, for checking battery-life intervals
// and verdicts against a known truth: each rider has their own usage (a rider effect
// on every battery's life), lives are Weibull around the true median, and some
// batteries are still running: followed for a time of their own, independent of
// their life (the rider's riding since the cell went in), censored if that ends first.
import type { BatterySpan } from '../statistics/battery-life';
import { createRandom } from './random';

export interface BatteryCrowdOptions {
  riders: number;
  batteriesPerRider: number;
  /** The true median hours per battery (for a rider with no rider effect). */
  medianHours: number;
  firmwareId: number;
  /** SD of the rider effect on the log of battery life. */
  riderSd?: number;
  /** Weibull shape of battery lives: 1 is exponential, 4 is a fairly consistent cell. */
  shape?: number;
  /** Share of batteries still in a meter when the figures are read: each is followed for a uniform time up to twice the rider's median. */
  stillRunningShare?: number;
}

export function simulateBatteryCrowd(seed: number, options: BatteryCrowdOptions): BatterySpan[] {
  const { riders, batteriesPerRider, medianHours, firmwareId, riderSd = 0.3, shape = 1, stillRunningShare = 0.2 } = options;
  const random = createRandom(seed);
  const spans: BatterySpan[] = [];
  for (let r = 0; r < riders; r++) {
    const riderFactor = Math.exp(riderSd * random.normal());
    for (let b = 0; b < batteriesPerRider; b++) {
      // Weibull with median m: m × (−ln U / ln 2)^(1/k).
      const life = medianHours * riderFactor * (-Math.log(1 - random.next()) / Math.LN2) ** (1 / shape);
      const followed = random.chance(stillRunningShare) ? random.uniform(0, 2 * medianHours * riderFactor) : Number.POSITIVE_INFINITY;
      spans.push({ riderId: seed * 1000 + r, firmwareId, hours: Math.min(life, followed), ended: life <= followed });
    }
  }
  return spans;
}

/**
 * The true median of the crowd's battery lives (rider effect included), by drawing many
 * uncensored lives: with a rider effect it is not exactly `medianHours`.
 */
export function trueCrowdMedian(options: BatteryCrowdOptions, draws = 200_000): number {
  const lives = simulateBatteryCrowd(987_654, { ...options, riders: draws, batteriesPerRider: 1, stillRunningShare: 0 }).map(
    (s) => s.hours,
  );
  lives.sort((x, y) => x - y);
  return lives[Math.floor(draws / 2)]!;
}
