import type { Knex } from 'knex';
import { TEMPERATURE_BANDS } from '@shared/analysis/drift';
import type {
  AddRidingInput,
  BatteryClaimInput,
  CreateBatteryEventInput,
  CreateRiderMeterInput,
  FirmwareTemperature,
  ModelConditions,
  RiderMeterView,
} from '@shared/schemas/battery';
import {
  batteryLife,
  batteryLifeByFirmware,
  batteryPeriods,
  biasByTemperature,
  inPeriod,
  MIN_BATTERIES,
  MIN_BATTERY_RIDERS,
  MIN_TEMPERATURE_RIDERS,
  type BatterySpan,
  type TemperatureBandRide,
} from '@shared/statistics/battery-life';
import { recordAudit } from '../audit/audit.repository';
import { ConflictError, NotFoundError, ValidationError } from '../../lib/errors';
import * as repository from './battery.repository';

type Meter = repository.RiderMeter;
const groupKey = (m: { riderId: number; modelId: number; position: string }) => `${m.riderId}:${m.modelId}:${m.position}`;

/**
 * Each meter's batteries with their hours: the rider's submitted rides of the meter's model
 * and position (only when the rider has one such meter, or the rides could be another's),
 * plus riding added by hand, both counted on the days of each battery's period.
 */
function metersWithBatteries(
  meters: Meter[],
  events: repository.BatteryEvent[],
  riding: repository.RidingEntry[],
  rides: repository.SubmittedRide[],
  allMetersOfRiders: Meter[],
) {
  const metersPerGroup = new Map<string, number>();
  for (const m of allMetersOfRiders) {
    const key = groupKey({ riderId: m.riderId, modelId: m.model.id, position: m.position });
    metersPerGroup.set(key, (metersPerGroup.get(key) ?? 0) + 1);
  }
  return meters.map((meter) => {
    const key = groupKey({ riderId: meter.riderId, modelId: meter.model.id, position: meter.position });
    const ridesAttributed = (metersPerGroup.get(key) ?? 0) === 1;
    const ownRides = ridesAttributed ? rides.filter((r) => groupKey(r) === key) : [];
    const ownEvents = events.filter((e) => e.riderMeterId === meter.id);
    const ownRiding = riding.filter((r) => r.riderMeterId === meter.id);
    const versions = new Map(ownEvents.map((e) => [e.firmwareId, e.firmwareVersion]));
    const batteries = batteryPeriods(ownEvents).map((period) => ({
      period,
      firmwareVersion: versions.get(period.firmwareId) ?? '',
      submittedHours: ownRides.filter((r) => inPeriod(r.day, period)).reduce((sum, r) => sum + r.hours, 0),
      selfReportedHours: ownRiding.filter((r) => inPeriod(r.riddenOn, period)).reduce((sum, r) => sum + r.hours, 0),
    }));
    return { meter, ridesAttributed, events: ownEvents, riding: ownRiding, batteries };
  });
}

export async function listMyMeters(db: Knex, riderId: number): Promise<RiderMeterView[]> {
  const meters = await repository.listRiderMeters(db, riderId);
  const ids = meters.map((m) => m.id);
  const [events, riding, rides] = await Promise.all([
    repository.listBatteryEvents(db, ids),
    repository.listRiding(db, ids),
    repository.listSubmittedRides(db, { riderIds: [riderId] }),
  ]);
  return metersWithBatteries(meters, events, riding, rides, meters).map(
    ({ meter, ridesAttributed, events: own, riding: ownRiding, batteries }) => ({
      id: meter.id,
      nickname: meter.nickname,
      position: meter.position,
      batteryType: meter.batteryType,
      model: meter.model,
      ridesAttributed,
      events: own.map((e) => ({
        id: e.id,
        occurredOn: e.occurredOn,
        kind: e.kind,
        previousEnded: e.previousEnded,
        firmwareVersion: e.firmwareVersion,
      })),
      riding: ownRiding.map((r) => ({ id: r.id, riddenOn: r.riddenOn, hours: r.hours })),
      batteries: batteries.map((b) => ({
        fromDay: b.period.fromDay,
        toDay: b.period.toDay,
        firmwareVersion: b.firmwareVersion,
        submittedHours: b.submittedHours,
        selfReportedHours: b.selfReportedHours,
        ended: b.period.ended,
      })),
    }),
  );
}

async function ownMeter(db: Knex, riderId: number, meterId: number): Promise<Meter> {
  const meter = await repository.findRiderMeter(db, riderId, meterId);
  // Another rider's meter is answered the same as a missing one: ids are not a way to probe.
  if (!meter) throw new NotFoundError('You have no meter with that number.');
  return meter;
}

function isUniqueViolation(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: string }).code === '23505';
}

export async function addMeter(db: Knex, riderId: number, input: CreateRiderMeterInput): Promise<number> {
  if (!(await repository.findApprovedModel(db, input.modelId)))
    throw new ValidationError('modelId: no such model in the catalogue', { fields: { modelId: 'no such model in the catalogue' } });
  try {
    return await repository.insertRiderMeter(db, { riderId, ...input });
  } catch (error) {
    if (isUniqueViolation(error)) throw new ConflictError('You already have a meter with that name.');
    throw error;
  }
}

export async function removeMeter(db: Knex, riderId: number, meterId: number): Promise<void> {
  await ownMeter(db, riderId, meterId);
  await repository.deleteRiderMeter(db, meterId);
}

export async function addBatteryEvent(db: Knex, riderId: number, meterId: number, input: CreateBatteryEventInput): Promise<number> {
  const meter = await ownMeter(db, riderId, meterId);
  if (!(await repository.findFirmwareOfModel(db, input.firmwareId, meter.model.id))) {
    throw new ValidationError('firmwareId: not a firmware of this model', { fields: { firmwareId: 'not a firmware of this model' } });
  }
  try {
    return await repository.insertBatteryEvent(db, { riderMeterId: meterId, ...input });
  } catch (error) {
    if (isUniqueViolation(error)) throw new ConflictError('This meter already has a battery event on that day.');
    throw error;
  }
}

export async function removeBatteryEvent(db: Knex, riderId: number, meterId: number, eventId: number): Promise<void> {
  await ownMeter(db, riderId, meterId);
  if ((await repository.deleteBatteryEvent(db, meterId, eventId)) === 0)
    throw new NotFoundError('That battery event is not on this meter.');
}

export async function addRiding(db: Knex, riderId: number, meterId: number, input: AddRidingInput): Promise<number> {
  await ownMeter(db, riderId, meterId);
  return repository.insertRiding(db, { riderMeterId: meterId, ...input });
}

export async function removeRiding(db: Knex, riderId: number, meterId: number, ridingId: number): Promise<void> {
  await ownMeter(db, riderId, meterId);
  if ((await repository.deleteRiding(db, meterId, ridingId)) === 0) throw new NotFoundError('That riding entry is not on this meter.');
}

/** A band bias of A against B, as the side's own meter read it against its partner. */
function asSideRead(side: 'a' | 'b', percent: number): number {
  return side === 'a' ? percent : 100 * (1 / (1 + percent / 100) - 1);
}

/** Battery life and bias by temperature band for one model, per firmware, for the model and firmware pages. */
export async function getModelConditions(db: Knex, slug: string): Promise<ModelConditions> {
  const model = await repository.findModelForConditions(db, slug);
  if (!model) throw new NotFoundError('No such power meter in the catalogue.');
  const meters = await repository.listMetersOfModel(db, model.id);
  const ids = meters.map((m) => m.id);
  const riderIds = [...new Set(meters.map((m) => m.riderId))];
  const [events, riding, rides, metersOfRiders, bandRows] = await Promise.all([
    repository.listBatteryEvents(db, ids),
    repository.listRiding(db, ids),
    repository.listSubmittedRides(db, { riderIds, modelId: model.id }),
    repository.listMetersOfRiders(db, riderIds),
    repository.listTemperatureBandRides(db, model.id),
  ]);
  const spans: BatterySpan[] = metersWithBatteries(meters, events, riding, rides, metersOfRiders).flatMap(({ meter, batteries }) =>
    batteries.map((b) => ({
      riderId: meter.riderId,
      firmwareId: b.period.firmwareId,
      hours: b.submittedHours + b.selfReportedHours,
      ended: b.period.ended,
    })),
  );

  const bandRides: (TemperatureBandRide & { firmwareId: number })[] = bandRows.flatMap((row) =>
    (row.bands ?? [])
      .filter((b) => b.percent !== null)
      .map((b) => ({
        riderId: row.rider_id,
        firmwareId: row.firmware_id,
        band: b.band,
        seconds: b.seconds,
        percent: asSideRead(row.side, b.percent!),
      })),
  );
  const bandLabels = TEMPERATURE_BANDS.map((b) => b.label);
  const firmwareTemperature: FirmwareTemperature[] = model.firmware.map((f) => ({
    version: f.version,
    bands: biasByTemperature(
      bandRides.filter((r) => r.firmwareId === f.id),
      bandLabels,
    ),
  }));

  return {
    claim: model.claimHours !== null && model.claimSource ? { hours: model.claimHours, source: model.claimSource } : null,
    batteryLife: batteryLife(spans),
    firmware: batteryLifeByFirmware(spans, model.firmware),
    temperature: { all: biasByTemperature(bandRides, bandLabels), firmware: firmwareTemperature },
    minimums: { batteries: MIN_BATTERIES, batteryRiders: MIN_BATTERY_RIDERS, temperatureRiders: MIN_TEMPERATURE_RIDERS },
  };
}

/** A moderator enters (or clears) the maker's battery claim for a model, with its source; audited. */
export async function setBatteryClaim(db: Knex, actorId: number, modelId: number, input: BatteryClaimInput) {
  return db.transaction(async (trx) => {
    const before = await repository.findModelClaim(trx, modelId);
    if (!before) throw new NotFoundError('No such model.');
    const after = { hours: input.hours, source: input.hours === null ? null : (input.source ?? null) };
    await repository.updateBatteryClaim(trx, modelId, after);
    await recordAudit(trx, {
      actorId,
      action: after.hours === null ? 'model.battery_claim_cleared' : 'model.battery_claim_set',
      subjectType: 'model',
      subjectId: modelId,
      before: { hours: before.hours, source: before.source },
      after,
    });
    return after;
  });
}
