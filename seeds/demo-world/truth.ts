// The truth the demo world injects, per model + firmware, for the known-truth
// validation tests: what the scoreboard's aggregates of accepted submissions
// should recover within their intervals.
import { AFTER_DRIVETRAIN_KINDS } from '@shared/schemas/catalogue';
import { DRIVETRAIN_LOSS_PERCENT } from '@shared/simulator/meter';
import { isLikeForLike, worldModel, type PlannedSide, type PlannedSubmission } from './plan';
import { MODELS } from './world';

export interface CombinationTruth {
  maker: string;
  model: string;
  firmware: string;
  /** The meter's scale error against true crank power, in %. */
  biasPercent: number;
  /** What it reads against true crank power, drivetrain loss included for hubs and trainers. */
  measuredBiasPercent: number;
  /**
   * Expected mean of its like-for-like accepted comparisons, in % of the partner,
   * seen from this meter's side (ΣA/ΣB − 1 with this meter as A), weighted by ride time.
   */
  biasAgainstPartnersPercent: number | null;
  /**
   * Offset from the crowd consensus, in % (100 × (e^x − 1) of the log gain minus
   * the ride-time-weighted mean log gain over all accepted like-for-like comparisons).
   */
  crowdOffsetPercent: number | null;
  /** Expected events per pedalling hour over its accepted rides (surface, radio and head unit included). */
  powerDropoutsPerHour: number | null;
  cadenceDropoutsPerHour: number | null;
  acceptedSubmissions: number;
  acceptedHours: number;
}

const key = (model: string, firmware: string) => `${model}@${firmware}`;

/** Per model + firmware of the world, what its accepted submissions in `plan` should show. */
export function injectedTruth(plan: PlannedSubmission[]): CombinationTruth[] {
  const evidence = new Map<
    string,
    { hours: number; count: number; power: number; cadence: number; bias: number; biasHours: number; logGain: number }
  >();
  let logGainSum = 0;
  let logGainHours = 0;
  for (const submission of plan) {
    if (submission.outcome.decision !== 'accept' || submission.flaw) continue;
    const hours = submission.simulation.durationSeconds / 3600;
    const likeForLike = isLikeForLike(worldModel(submission.a.model), worldModel(submission.b.model));
    const sides: Array<[PlannedSide, PlannedSide]> = [
      [submission.a, submission.b],
      [submission.b, submission.a],
    ];
    for (const [self, partner] of sides) {
      const k = key(self.model, self.firmware);
      const entry = evidence.get(k) ?? { hours: 0, count: 0, power: 0, cadence: 0, bias: 0, biasHours: 0, logGain: 0 };
      entry.hours += hours;
      entry.count += 1;
      entry.power += self.powerDropoutsPerHour * hours;
      entry.cadence += self.cadenceDropoutsPerHour * hours;
      if (likeForLike) {
        entry.bias += 100 * (self.gain / partner.gain - 1) * hours;
        entry.biasHours += hours;
        logGainSum += Math.log(self.gain) * hours;
        logGainHours += hours;
      }
      evidence.set(k, entry);
    }
  }
  const crowdLogGain = logGainHours > 0 ? logGainSum / logGainHours : 0;
  return MODELS.flatMap((model) =>
    model.firmware.map((firmware) => {
      const entry = evidence.get(key(model.name, firmware.version));
      const loss = AFTER_DRIVETRAIN_KINDS.includes(model.kind) ? DRIVETRAIN_LOSS_PERCENT / 100 : 0;
      const measuredGain = (1 + firmware.biasPercent / 100) * (1 - loss);
      return {
        maker: model.maker,
        model: model.name,
        firmware: firmware.version,
        biasPercent: firmware.biasPercent,
        measuredBiasPercent: 100 * (measuredGain - 1),
        biasAgainstPartnersPercent: entry && entry.biasHours > 0 ? entry.bias / entry.biasHours : null,
        crowdOffsetPercent: entry && entry.biasHours > 0 ? 100 * (Math.exp(Math.log(measuredGain) - crowdLogGain) - 1) : null,
        powerDropoutsPerHour: entry ? entry.power / entry.hours : null,
        cadenceDropoutsPerHour: entry ? entry.cadence / entry.hours : null,
        acceptedSubmissions: entry?.count ?? 0,
        acceptedHours: entry?.hours ?? 0,
      };
    }),
  );
}
