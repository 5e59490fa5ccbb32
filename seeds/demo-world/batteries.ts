// The battery logs of the demo's riders: each owner of a model with a battery story
// logs every change (and why the one before came out) and their riding by the
// fortnight, through the battery service as a rider would on "My meters"; a
// moderator enters the maker's claim. Battery lives are drawn around each firmware's
// true median, so the model page has a story to tell: see world.ts.
import type { Knex } from 'knex';
import { addRidingInput, createBatteryEventInput, type PreviousBatteryEnding } from '@shared/schemas/battery';
import { createRandom, deriveSeed } from '@shared/simulator/random';
import { addBatteryEvent, addMeter, addRiding, setBatteryClaim } from '@server/features/battery/battery.service';
import type { SessionUser } from '@server/features/users/users.service';
import { MODELS, RIDERS, type WorldModel } from './world';

const DAY_SECONDS = 86_400;
const FORTNIGHT = 14;
/** The logs begin with the first release of the last year and a half (the site is that old). */
const FIRST_LOGGED_DAYS_AGO = 540;
/** Coin cells of one model differ little: Weibull shape 4 gives a spread of about ±28 % (from memory, typical of cell datasheets). */
const WEIBULL_SHAPE = 4;

export interface PlannedBatteryLog {
  rider: string;
  model: string;
  events: { daysAgo: number; previousEnded: PreviousBatteryEnding; firmware: string }[];
  riding: { daysAgo: number; hours: number }[];
}

function firmwareOn(model: WorldModel, daysAgo: number): string {
  const released = model.firmware.filter((f) => f.releasedDaysAgo >= daysAgo && !f.beta);
  return (released.at(-1) ?? model.firmware[0]!).version;
}

/** One owner's battery history: changes when the riding since the last one reaches that battery's life. */
export function planBatteryLogs(seed = 2026): PlannedBatteryLog[] {
  const logs: PlannedBatteryLog[] = [];
  for (const model of MODELS.filter((m) => m.battery)) {
    const owners = RIDERS.filter((r) => r.meters.includes(model.name));
    owners.forEach((rider, index) => {
      const random = createRandom(deriveSeed(seed, `battery:${model.name}:${rider.handle}`));
      const hoursPerDay = random.uniform(2.4, 3.4);
      const riderFactor = Math.exp(0.08 * random.normal());
      // Owners started logging around the first release they ran, within a month of it.
      const startDaysAgo =
        (model.firmware.find((f) => f.releasedDaysAgo < FIRST_LOGGED_DAYS_AGO)?.releasedDaysAgo ?? FIRST_LOGGED_DAYS_AGO) -
        random.integer(0, 30);
      const log: PlannedBatteryLog = { rider: rider.handle, model: model.name, events: [], riding: [] };
      let daysAgo = startDaysAgo;
      let previousEnded: PreviousBatteryEnding = 'first_battery';
      while (daysAgo > 0) {
        const firmware = firmwareOn(model, daysAgo);
        log.events.push({ daysAgo, previousEnded, firmware });
        const median = model.battery!.medianHoursByFirmware[firmware]!;
        // Weibull with the given median: median × (−ln U / ln 2)^(1/k).
        const life = median * riderFactor * (-Math.log(1 - random.next()) / Math.LN2) ** (1 / WEIBULL_SHAPE);
        let early = random.chance(0.12);
        const lastsDays = ((early ? 0.7 : 1) * life) / hoursPerDay;
        let endDaysAgo = Math.round(daysAgo - lastsDays);
        // The story's owners fit a fresh cell when they update the firmware (its release notes ask for one).
        const update = model.firmware.find(
          (f) => !f.beta && f.releasedDaysAgo < daysAgo && f.releasedDaysAgo > endDaysAgo && f.releasedDaysAgo > 0,
        );
        if (update) {
          endDaysAgo = update.releasedDaysAgo;
          early = true;
        }
        // Riding by the fortnight until the change (or today), dated at each fortnight's end.
        for (let from = daysAgo; from > Math.max(endDaysAgo, 0); from -= FORTNIGHT) {
          const to = Math.max(from - FORTNIGHT, endDaysAgo, 0);
          if (from - to > 0)
            log.riding.push({ daysAgo: to + (to === endDaysAgo ? 1 : 0), hours: Math.round((from - to) * hoursPerDay * 10) / 10 });
        }
        previousEnded = early ? 'replaced_early' : index % 3 === 0 ? 'low_warning' : 'ran_flat';
        daysAgo = endDaysAgo;
      }
      logs.push(log);
    });
  }
  return logs;
}

const dayOf = (now: number, daysAgo: number) => new Date((now - daysAgo * DAY_SECONDS) * 1000).toISOString().slice(0, 10);

/** Carries out the battery plan through the battery service; returns the number of batteries logged. */
export async function seedBatteryLogs(
  db: Knex,
  options: {
    now: number;
    people: Map<string, SessionUser>;
    modelIds: Map<string, number>;
    firmwareIds: Map<string, number>;
    moderator: SessionUser;
    seed?: number;
  },
): Promise<number> {
  let batteries = 0;
  for (const model of MODELS.filter((m) => m.battery)) {
    await setBatteryClaim(db, options.moderator.id, options.modelIds.get(model.name)!, {
      hours: model.battery!.claimHours,
      source: model.battery!.claimSource,
    });
  }
  for (const log of planBatteryLogs(options.seed)) {
    const model = MODELS.find((m) => m.name === log.model)!;
    const riderId = options.people.get(log.rider)!.id;
    const meterId = await addMeter(db, riderId, {
      modelId: options.modelIds.get(model.name)!,
      position: model.position,
      nickname: `${model.name} (main bike)`,
      batteryType: model.battery!.type,
    });
    for (const event of log.events) {
      const input = createBatteryEventInput.parse({
        occurredOn: dayOf(options.now, event.daysAgo),
        kind: 'changed',
        previousEnded: event.previousEnded,
        firmwareId: options.firmwareIds.get(`${model.name}@${event.firmware}`),
      });
      await addBatteryEvent(db, riderId, meterId, input);
      batteries += 1;
    }
    for (const entry of log.riding)
      await addRiding(db, riderId, meterId, addRidingInput.parse({ riddenOn: dayOf(options.now, entry.daysAgo), hours: entry.hours }));
  }
  return batteries;
}
