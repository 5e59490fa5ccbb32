// A simulated crowd of riders comparing one model against a perfect partner, for
// checking the pooled bias and dropout-rate figures against a known truth. Each rider
// owns one unit: a rider effect on the bias (rider-to-rider SD) on top of the ride's
// own scatter (ride-to-ride SD), and a dropout rate of their own, gamma-distributed
// around the model's rate (overdispersion: installations differ), with Poisson
// dropouts in each ride. Riders ride 1 to `maxRidesPerRider` times.
import { createRandom, type Random } from './random';

export interface StatisticsCrowdOptions {
  /** Rides in the group (the last rider's rides are cut to fit). */
  rides: number;
  /** The true mean bias over riders' units, percent. */
  biasPercent: number;
  riderSdPercent: number;
  rideSdPercent: number;
  maxRidesPerRider: number;
  /** The true mean dropout rate over riders' units, per pedalling hour. */
  dropoutsPerHour: number;
  /** Gamma shape of the riders' dropout rates (variance rate²/shape); Infinity: every rider has the model's rate. */
  dropoutShape: number;
  /** Share of rides that are mixed comparisons (one leg against a total meter), which read `mixedExtraPercent` more. */
  mixedShare?: number;
  mixedExtraPercent?: number;
  /** First rider id, so that crowds of one model's firmware do not share riders. */
  firstRiderId?: number;
}

export interface SimulatedRide {
  riderId: number;
  biasPercent: number;
  pedallingHours: number;
  powerDropouts: number;
  mixed: boolean;
}

export function simulateStatisticsCrowd(seed: number, options: StatisticsCrowdOptions): SimulatedRide[] {
  const {
    rides,
    biasPercent,
    riderSdPercent,
    rideSdPercent,
    maxRidesPerRider,
    dropoutsPerHour,
    dropoutShape,
    mixedShare = 0,
    mixedExtraPercent = 0,
    firstRiderId = 1,
  } = options;
  const random = createRandom(seed);
  const out: SimulatedRide[] = [];
  for (let riderId = firstRiderId; out.length < rides; riderId++) {
    const riderBias = biasPercent + riderSdPercent * random.normal();
    const riderRate = Number.isFinite(dropoutShape)
      ? gammaDeviate(random, dropoutShape) * (dropoutsPerHour / dropoutShape)
      : dropoutsPerHour;
    const count = Math.min(random.integer(1, maxRidesPerRider), rides - out.length);
    for (let i = 0; i < count; i++) {
      const pedallingHours = random.uniform(0.5, 3);
      const mixed = random.chance(mixedShare);
      out.push({
        riderId,
        biasPercent: riderBias + rideSdPercent * random.normal() + (mixed ? mixedExtraPercent : 0),
        pedallingHours,
        powerDropouts: random.poisson(riderRate * pedallingHours),
        mixed,
      });
    }
  }
  return out;
}

/**
 * Gamma(shape, 1) deviate by Marsaglia & Tsang (ACM TOMS 2000;26:363–372), with the
 * usual U^(1/shape) boost for shapes below 1.
 */
function gammaDeviate(random: Random, shape: number): number {
  if (shape < 1) return gammaDeviate(random, shape + 1) * (1 - random.next()) ** (1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    const x = random.normal();
    const v = (1 + c * x) ** 3;
    if (v <= 0) continue;
    const u = 1 - random.next();
    if (Math.log(u) < 0.5 * x * x + d - d * v + d * Math.log(v)) return d * v;
  }
}
