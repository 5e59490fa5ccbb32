// A deterministic plan of the demo's submissions: who rode when, with which two
// meters and firmware, how each meter saw the ride (the simulator's options,
// derived from the world's truth and the rider's habits), and what a moderator
// will decide. Nothing here touches the database; seed-demo.ts carries it out.
import type { RideProfile } from '@shared/simulator/ride';
import { coldGain, DRIVETRAIN_LOSS_PERCENT, type AmbientTemperature } from '@shared/simulator/meter';
import type { MeterSpec, PairOptions } from '@shared/simulator/pair';
import { createRandom, deriveSeed, type Random } from '@shared/simulator/random';
import { AFTER_DRIVETRAIN_KINDS } from '@shared/schemas/catalogue';
import type { Surface } from '@shared/schemas/submission';
import {
  MODELS,
  OTHER_METERS_ON_POWER_FACTOR,
  RECORDING_DEVICES,
  RIDERS,
  STAFF,
  SURFACE_DROPOUT_FACTOR,
  THIN_EVIDENCE_MODELS,
  type FirmwareTruth,
  type WorldModel,
  type WorldRecordingDevice,
  type WorldRider,
} from './world';

/** What is wrong with a submission on purpose, so the moderation queue has work. */
export type Flaw =
  | 'other_ride' // B comes from another ride at the same time: low correlation
  | 'uncalibrated' // one meter reads 20 % high: a large bias
  | 'mixed' // one leg against a total meter: a mixed comparison
  | 'wrong_tag' // the file's firmware is not the tagged one
  | 'short' // a short ride: a short overlap
  | 'duplicate'; // a ride uploaded before, from other files

export type Outcome =
  | { decision: 'accept'; moderator: string }
  | { decision: 'reject'; moderator: string; reason: RejectReason; note: string }
  | { decision: 'pending' };

/** The reasons of the moderation issue's list, in our words. */
export type RejectReason = 'not_same_ride' | 'wrong_tag' | 'not_calibrated' | 'mixed_comparison' | 'duplicate';

export interface PlannedSide {
  model: string;
  /** The firmware the rider tags. */
  firmware: string;
  device: string;
  recordingMode: 'every_second' | 'change_only';
  zeroOffset: 'yes' | 'no' | 'unsure';
  otherMetersOn: boolean;
  /** The meter's gain on this ride (scale × drivetrain loss × the cold's average effect), for checking the measured bias. */
  gain: number;
  /** The cold's average effect on this ride's reading (1 for most models, or when it is warm). */
  coldGain: number;
  powerDropoutsPerHour: number;
  cadenceDropoutsPerHour: number;
}

export interface PlannedSubmission {
  index: number;
  rider: string;
  daysAgo: number;
  surface: Surface;
  indoor: boolean;
  notes: string;
  a: PlannedSide;
  b: PlannedSide;
  simulation: PairOptions;
  /** For 'other_ride': B is taken from this simulation, another ride at the same time. */
  otherRide?: PairOptions;
  flaw?: Flaw;
  outcome: Outcome;
}

export interface PlanOptions {
  /** Unix seconds the ride dates count back from. */
  now: number;
  seed?: number;
  /** 1 = the full demo (~430 submissions); smaller for tests. */
  scale?: number;
}

const DAY_SECONDS = 86_400;
const HISTORY_DAYS = 548; // 18 months
const NORMAL_RIDES = 408;
const CLEAN_PENDING = 10;
/** How many of each flaw go to the queue and how many were rejected already. */
const FLAWS: Array<{ flaw: Flaw; pending: number; rejected: number; reason?: RejectReason; note?: string }> = [
  {
    flaw: 'other_ride',
    pending: 2,
    rejected: 2,
    reason: 'not_same_ride',
    note: 'The traces do not match: these look like two different rides.',
  },
  {
    flaw: 'uncalibrated',
    pending: 2,
    rejected: 1,
    reason: 'not_calibrated',
    note: 'One meter reads 20 % high; please check its crank length setting and zero it.',
  },
  {
    flaw: 'mixed',
    pending: 3,
    rejected: 1,
    reason: 'mixed_comparison',
    note: 'A single-leg meter against a trainer mixes leg balance into the difference.',
  },
  {
    flaw: 'wrong_tag',
    pending: 1,
    rejected: 1,
    reason: 'wrong_tag',
    note: "The file names the model's first firmware, the tags its latest.",
  },
  { flaw: 'short', pending: 2, rejected: 0 },
  { flaw: 'duplicate', pending: 0, rejected: 1, reason: 'duplicate', note: 'The same ride was uploaded before from the other head unit.' },
];
const MODERATORS = STAFF.filter((person) => person.roles.includes('moderator')).map((person) => person.handle);
const NOTES = [
  '',
  '',
  '',
  'Zeroed both at the start.',
  'Windy loop over the Carrowmede downs.',
  'Club ride, lots of surging.',
  'Wet morning, a few puddles on the lane.',
  'Tempo on the Ebbing Lane climbs.',
  'Hill repeats on Scarrow Brow.',
  'Washboard section on the old quarry track.',
];
const SECOND_DEVICES = ['Nimbus Wristlet', 'Pathwick Slate Mini', 'Tallyho Ride', 'Corrie Trailhead'];

const modelByName = new Map(MODELS.map((model) => [model.name, model]));
const deviceByName = new Map(RECORDING_DEVICES.map((device) => [device.name, device]));

export function worldModel(name: string): WorldModel {
  const model = modelByName.get(name);
  if (!model) throw new Error(`the demo world has no model ${name}`);
  return model;
}

function worldDevice(name: string): WorldRecordingDevice {
  const device = deviceByName.get(name);
  if (!device) throw new Error(`the demo world has no recording device ${name}`);
  return device;
}

/** Two positions a comparison can judge meter against meter (the engine's "direct" or "via balance"). */
export function isLikeForLike(a: WorldModel, b: WorldModel): boolean {
  const single = (m: WorldModel) => m.position === 'left' || m.position === 'right';
  if (a.position === b.position) return true;
  if (!single(a) && !single(b)) return true;
  return (single(a) && b.position === 'dual') || (single(b) && a.position === 'dual');
}

function likeForLikePairs(rider: WorldRider): Array<[WorldModel, WorldModel]> {
  const meters = rider.meters.map(worldModel);
  const pairs: Array<[WorldModel, WorldModel]> = [];
  for (let i = 0; i < meters.length; i++) {
    for (let j = i + 1; j < meters.length; j++) if (isLikeForLike(meters[i], meters[j])) pairs.push([meters[i], meters[j]]);
  }
  return pairs;
}

function releasedBy(model: WorldModel, daysAgo: number, betaTester: boolean): FirmwareTruth[] {
  return model.firmware.filter((f) => f.releasedDaysAgo >= daysAgo && (betaTester || !f.beta));
}

/** Most riders run the latest release; some are a version behind. */
function firmwareOnRide(model: WorldModel, daysAgo: number, betaTester: boolean, random: Random): FirmwareTruth {
  const available = releasedBy(model, daysAgo, betaTester);
  const latest = available.length - 1;
  return available[latest > 0 && random.chance(0.25) ? latest - 1 : latest];
}

function pick<T>(random: Random, items: readonly T[]): T {
  return items[random.integer(0, items.length - 1)];
}

function weighted<T>(random: Random, entries: Array<[T, number]>): T {
  const total = entries.reduce((sum, [, weight]) => sum + weight, 0);
  let draw = random.uniform(0, total);
  for (const [item, weight] of entries) {
    draw -= weight;
    if (draw < 0) return item;
  }
  return entries[entries.length - 1][0];
}

function riderDevices(rider: WorldRider, riderIndex: number): [string, string] {
  const first = rider.devices[0];
  const second = rider.devices[1] ?? SECOND_DEVICES.filter((name) => name !== first)[riderIndex % (SECOND_DEVICES.length - 1)];
  return [first, second];
}

// A zero offset before the ride keeps the meter at its own scale; without one it
// wanders a little from ride to ride (mean zero, so the model's bias is unchanged).
const ZERO_OFFSET_SCATTER_PERCENT = { yes: 0.3, unsure: 0.6, no: 1.0 } as const;

interface RideContext {
  random: Random;
  rider: WorldRider;
  riderIndex: number;
  daysAgo: number;
  surface: Surface;
  durationSeconds: number;
  seed: number;
  /** The air on this ride, which both head units record. */
  temperature: AmbientTemperature;
}

/**
 * The air on a ride: a temperate year (about 2 °C in mid-January, 20 °C in mid-July,
 * from memory of a mild maritime climate), a few degrees either way, warming or cooling
 * through the ride; indoors about 19 °C. Its own random stream, so the rest of the plan
 * is the same with or without it.
 */
function rideTemperature(seed: number, daysAgo: number, now: number, indoor: boolean): AmbientTemperature {
  const random = createRandom(deriveSeed(seed, 'temperature'));
  if (indoor) return { startCelsius: random.uniform(17, 21), changePerHour: random.uniform(0, 1.5) };
  const dayOfYear = (new Date((now - daysAgo * DAY_SECONDS) * 1000).getUTCMonth() * 30.4 + 15) % 365;
  const seasonal = 11 - 9 * Math.cos((2 * Math.PI * (dayOfYear - 15)) / 365);
  return { startCelsius: seasonal + 3 * random.normal(), changePerHour: random.uniform(-1.5, 3) };
}

/** The ride-time average of a meter's cold response over the ride's seconds. */
function averageColdGain(spec: MeterSpec, durationSeconds: number): number {
  let sum = 0;
  for (let t = 0; t < durationSeconds; t += 60) sum += coldGain(spec, t);
  return sum / Math.ceil(durationSeconds / 60);
}

function sideOf(ctx: RideContext, model: WorldModel, deviceName: string, firmware: FirmwareTruth, meterIndex: number) {
  const { random, rider, riderIndex, surface } = ctx;
  const device = worldDevice(deviceName);
  const otherMetersOn = random.chance(rider.habits.otherMetersOnShare);
  const changeOnly = random.chance(device.changeOnlyShare);
  const scatter = ZERO_OFFSET_SCATTER_PERCENT[rider.habits.zeroOffset] * random.normal();
  const afterDrivetrain = AFTER_DRIVETRAIN_KINDS.includes(model.kind);
  const scale = (1 + firmware.biasPercent / 100) * (1 + scatter / 100);
  const powerDropoutsPerHour =
    firmware.powerDropoutsPerHour *
    SURFACE_DROPOUT_FACTOR[surface] *
    (otherMetersOn ? OTHER_METERS_ON_POWER_FACTOR : 1) *
    device.powerDropoutFactor;
  const cadenceDropoutsPerHour = firmware.cadenceDropoutsPerHour * SURFACE_DROPOUT_FACTOR[surface];
  const modelIndex = MODELS.indexOf(model);
  const spec: MeterSpec = {
    position: model.position,
    scale,
    noiseWatts: model.noiseWatts,
    noisePercent: model.noisePercent,
    drivetrainLossPercent: afterDrivetrain ? DRIVETRAIN_LOSS_PERCENT : 0,
    smoothingSeconds: device.smoothingSeconds,
    cadenceLagSeconds: model.cadenceLagSeconds,
    powerDropoutsPerHour,
    cadenceDropoutsPerHour,
    recordingMode: changeOnly ? 'change-only' : 'every-second',
    startOffsetSeconds: random.integer(0, 90),
    endOffsetSeconds: random.integer(0, 60),
    device: {
      manufacturerId: 255,
      productId: 1 + RECORDING_DEVICES.indexOf(device),
      serialNumber: 300_000 + riderIndex * 10 + meterIndex,
      softwareVersion: Number(device.firmware),
      productName: device.name,
    },
    sensor: {
      manufacturerId: 255,
      productId: 100 + modelIndex,
      serialNumber: 700_000 + riderIndex * 100 + modelIndex,
      softwareVersion: Number(firmware.version),
      productName: model.name,
    },
    includeLocation: ctx.surface !== 'trainer',
    temperature: ctx.temperature,
    ...(model.coldResponse && { coldResponse: model.coldResponse }),
  };
  const cold = averageColdGain(spec, ctx.durationSeconds);
  const side: PlannedSide = {
    model: model.name,
    firmware: firmware.version,
    device: device.name,
    recordingMode: changeOnly ? 'change_only' : 'every_second',
    zeroOffset: rider.habits.zeroOffset,
    otherMetersOn,
    gain: scale * (1 - (spec.drivetrainLossPercent ?? 0) / 100) * cold,
    coldGain: cold,
    powerDropoutsPerHour,
    cadenceDropoutsPerHour,
  };
  return { side, spec };
}

function rideSurface(random: Random, rider: WorldRider, forcedIndoor?: boolean): { surface: Surface; indoor: boolean } {
  const indoor = forcedIndoor ?? random.chance(rider.habits.indoorShare);
  if (indoor) return { surface: 'trainer', indoor };
  return { surface: weighted(random, Object.entries(rider.habits.surfaces) as Array<[Surface, number]>), indoor };
}

function rideProfile(random: Random, indoor: boolean): RideProfile {
  if (indoor) return 'indoor';
  return weighted<RideProfile>(random, [
    ['endurance', 0.5],
    ['intervals', 0.25],
    ['race', 0.25],
  ]);
}

type PlannedRide = Omit<PlannedSubmission, 'index' | 'flaw' | 'outcome'>;

/** One like-for-like ride of a rider on a day, or null when they had no usable pair then. */
function planRide(
  ctx: Omit<RideContext, 'surface' | 'durationSeconds' | 'temperature'>,
  now: number,
  thinCounts: Map<string, number>,
): PlannedRide | null {
  const { random, rider, riderIndex, daysAgo } = ctx;
  const betaTester = riderIndex % 9 === 4;
  const thinFull = (model: WorldModel) => (thinCounts.get(model.name) ?? Infinity) <= 0;
  const pairs = likeForLikePairs(rider).filter(
    ([x, y]) =>
      !thinFull(x) && !thinFull(y) && releasedBy(x, daysAgo, betaTester).length > 0 && releasedBy(y, daysAgo, betaTester).length > 0,
  );
  if (pairs.length === 0) return null;
  let [first, second] = pick(random, pairs);
  // Trainers only indoors, hubs only outdoors.
  const hasTrainer = first.kind === 'trainer' || second.kind === 'trainer';
  const hasHub = first.kind === 'hub' || second.kind === 'hub';
  const { surface, indoor } = rideSurface(random, rider, hasTrainer ? true : hasHub ? false : undefined);
  if (random.chance(0.5)) [first, second] = [second, first];
  const [deviceA, deviceB] = riderDevices(rider, riderIndex);
  const durationSeconds = 60 * random.integer(25, 75);
  const full: RideContext = { ...ctx, surface, durationSeconds, temperature: rideTemperature(ctx.seed, daysAgo, now, indoor) };
  const a = sideOf(full, first, deviceA, firmwareOnRide(first, daysAgo, betaTester, random), 0);
  const b = sideOf(full, second, deviceB, firmwareOnRide(second, daysAgo, betaTester, random), 1);
  for (const model of [first, second]) if (thinCounts.has(model.name)) thinCounts.set(model.name, thinCounts.get(model.name)! - 1);
  const simulation: PairOptions = {
    seed: ctx.seed,
    durationSeconds: full.durationSeconds,
    startTime: Math.floor(now / DAY_SECONDS - daysAgo) * DAY_SECONDS + random.integer(6 * 3600, 18 * 3600),
    profile: rideProfile(random, indoor),
    riderFtpWatts: rider.habits.ftpWatts,
    balanceRightPercent: rider.habits.balanceRightPercent,
    a: { ...a.spec, clockOffsetSeconds: 0 },
    b: { ...b.spec, clockOffsetSeconds: random.integer(-45, 45) },
  };
  return { rider: rider.handle, daysAgo, surface, indoor, notes: pick(random, NOTES), a: a.side, b: b.side, simulation };
}

/**
 * The demo's submissions in upload order (oldest ride first). Deterministic for a
 * given seed and scale; `now` only moves the dates.
 */
export function planDemoWorld(options: PlanOptions): PlannedSubmission[] {
  const scale = options.scale ?? 1;
  const random = createRandom(options.seed ?? 2026);
  const thinCounts = new Map(Object.entries(THIN_EVIDENCE_MODELS));
  const riderWeights = RIDERS.map((rider, i) => [i, rider.habits.activity] as [number, number]);
  let nextSeed = (options.seed ?? 2026) * 1000;
  const moderator = () => pick(random, MODERATORS);

  const drawRide = (daysAgoRange: [number, number], riderIndex?: number) => {
    for (let attempt = 0; attempt < 200; attempt++) {
      const index = riderIndex ?? weighted(random, riderWeights);
      const ride = planRide(
        { random, rider: RIDERS[index], riderIndex: index, daysAgo: random.integer(...daysAgoRange), seed: nextSeed++ },
        options.now,
        thinCounts,
      );
      if (ride) return ride;
    }
    throw new Error('the demo plan could not find a ride: check the riders and firmware dates');
  };

  const planned: Array<Omit<PlannedSubmission, 'index'>> = [];
  const normalCount = Math.max(1, Math.round(NORMAL_RIDES * scale));
  for (let i = 0; i < normalCount; i++)
    planned.push({ ...drawRide([15, HISTORY_DAYS]), outcome: { decision: 'accept', moderator: moderator() } });
  // The newcomer's first few rides: accepted, but too few to say much.
  for (const [name, cap] of Object.entries(THIN_EVIDENCE_MODELS)) {
    const owner = RIDERS.findIndex((rider) => rider.meters.includes(name));
    const newest = Math.min(...worldModel(name).firmware.map((f) => f.releasedDaysAgo));
    const oldest = Math.max(...worldModel(name).firmware.map((f) => f.releasedDaysAgo));
    for (let i = 0; i < Math.min(cap - 1, thinCounts.get(name)!); i++) {
      planned.push({ ...drawRide([Math.min(15, newest), oldest], owner), outcome: { decision: 'accept', moderator: moderator() } });
    }
  }
  // Recently uploaded and not yet reviewed; the demo rider always has one waiting.
  const pendingCount = Math.max(1, Math.round(CLEAN_PENDING * scale));
  planned.push({ ...drawRide([0, 14], 0), outcome: { decision: 'pending' } });
  for (let i = 1; i < pendingCount; i++) planned.push({ ...drawRide([0, 14]), outcome: { decision: 'pending' } });

  for (const { flaw, pending, rejected, reason, note } of FLAWS) {
    const counts = { pending: Math.round(pending * Math.min(1, scale * 3)), rejected: Math.round(rejected * Math.min(1, scale * 3)) };
    if (counts.pending + counts.rejected === 0) counts[pending > 0 ? 'pending' : 'rejected'] = 1;
    for (const [decision, count] of Object.entries(counts) as Array<['pending' | 'rejected', number]>) {
      for (let i = 0; i < count; i++) {
        const ride = drawRide(decision === 'pending' ? [0, 14] : [20, 300]);
        const outcome: Outcome =
          decision === 'pending' ? { decision: 'pending' } : { decision: 'reject', moderator: moderator(), reason: reason!, note: note! };
        planned.push({ ...withFlaw(ride, flaw, random, planned, nextSeed++), flaw, outcome });
      }
    }
  }
  return planned.sort((x, y) => x.simulation.startTime! - y.simulation.startTime!).map((submission, index) => ({ index, ...submission }));
}

function withFlaw(
  ride: PlannedRide,
  flaw: Flaw,
  random: Random,
  planned: Array<Omit<PlannedSubmission, 'index'>>,
  seed: number,
): PlannedRide {
  const sim = ride.simulation;
  switch (flaw) {
    case 'other_ride':
      // A different kind of effort by a different rider, so the traces cannot match.
      return {
        ...ride,
        otherRide: {
          ...sim,
          seed,
          profile: sim.profile === 'race' ? 'endurance' : 'race',
          riderFtpWatts: (sim.riderFtpWatts ?? 250) * 0.8,
        },
        notes: 'Second file from the same morning.',
      };
    case 'uncalibrated':
      return {
        ...ride,
        a: { ...ride.a, gain: ride.a.gain * 1.2 },
        simulation: { ...sim, a: { ...sim.a, scale: (sim.a.scale ?? 1) * 1.2 } },
      };
    case 'short':
      return { ...ride, simulation: { ...sim, durationSeconds: 60 * random.integer(12, 16) } };
    case 'wrong_tag': {
      // The file still carries the model's first firmware; the tag claims the latest.
      const model = worldModel(ride.a.model);
      const first = model.firmware[0].version;
      const last = model.firmware.filter((f) => !f.beta).at(-1)!.version;
      return {
        ...ride,
        a: { ...ride.a, firmware: last === first ? (model.firmware[1]?.version ?? last) : last },
        simulation: { ...sim, a: { ...sim.a, sensor: { ...sim.a.sensor!, softwareVersion: Number(first) } } },
      };
    }
    case 'mixed': {
      // A single-leg meter on the club's trainer: the comparison cannot separate the legs.
      const trainer = pick(
        random,
        MODELS.filter((m) => m.kind === 'trainer'),
      );
      const single = pick(
        random,
        MODELS.filter((m) => m.position === 'left' || m.position === 'right'),
      );
      const firmware = trainer.firmware.filter((f) => f.releasedDaysAgo >= ride.daysAgo).at(-1)!;
      const singleFirmware = single.firmware.filter((f) => f.releasedDaysAgo >= ride.daysAgo).at(-1)!;
      const gain = (f: FirmwareTruth, loss: number) => (1 + f.biasPercent / 100) * (1 - loss / 100);
      return {
        ...ride,
        surface: 'trainer',
        indoor: true,
        notes: 'Borrowed the club trainer for an evening.',
        a: { ...ride.a, model: single.name, firmware: singleFirmware.version, gain: gain(singleFirmware, 0), coldGain: 1 },
        b: {
          ...ride.b,
          model: trainer.name,
          firmware: firmware.version,
          gain: gain(firmware, DRIVETRAIN_LOSS_PERCENT),
          coldGain: 1,
          powerDropoutsPerHour: 0,
          cadenceDropoutsPerHour: 0,
        },
        simulation: {
          ...sim,
          profile: 'indoor',
          a: {
            ...sim.a,
            coldResponse: undefined,
            position: single.position,
            scale: gain(singleFirmware, 0),
            drivetrainLossPercent: 0,
            sensor: { ...sim.a.sensor!, productId: 100 + MODELS.indexOf(single), softwareVersion: Number(singleFirmware.version) },
          },
          b: {
            ...sim.b,
            coldResponse: undefined,
            position: 'total',
            scale: gain(firmware, 0),
            drivetrainLossPercent: DRIVETRAIN_LOSS_PERCENT,
            powerDropoutsPerHour: 0,
            cadenceDropoutsPerHour: 0,
            includeLocation: false,
            sensor: { ...sim.b.sensor!, productId: 100 + MODELS.indexOf(trainer), softwareVersion: Number(firmware.version) },
          },
        },
      };
    }
    case 'duplicate': {
      // The same ride as an earlier accepted one, written by other head units.
      const original = planned.find((p) => p.outcome.decision === 'accept' && p.rider === ride.rider) ?? planned[0];
      const osim = original.simulation;
      const reserial = (spec: MeterSpec): MeterSpec => ({
        ...spec,
        device: { ...spec.device!, serialNumber: spec.device!.serialNumber + 5 },
      });
      return { ...original, notes: 'Uploading my Sunday ride.', simulation: { ...osim, a: reserial(osim.a), b: reserial(osim.b) } };
    }
  }
}
