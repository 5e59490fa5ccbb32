import type { Knex } from 'knex';
import type { BatteryEventKind, BatteryType, PreviousBatteryEnding } from '@shared/schemas/battery';

// Riders' meters, their battery events and hand-added riding, and what the
// battery-life and temperature figures are computed from.

type Position = 'left' | 'right' | 'dual' | 'total';

interface RiderMeterRecord {
  id: number;
  rider_id: number;
  nickname: string;
  position: Position;
  battery_type: BatteryType;
  model_id: number;
  model_slug: string;
  model_name: string;
  maker_name: string;
}

export interface RiderMeter {
  id: number;
  riderId: number;
  nickname: string;
  position: Position;
  batteryType: BatteryType;
  model: { id: number; slug: string; name: string; makerName: string };
}

const meterOf = (r: RiderMeterRecord): RiderMeter => ({
  id: r.id,
  riderId: r.rider_id,
  nickname: r.nickname,
  position: r.position,
  batteryType: r.battery_type,
  model: { id: r.model_id, slug: r.model_slug, name: r.model_name, makerName: r.maker_name },
});

function meters(db: Knex) {
  return db('rider_meters as rm')
    .join('models as m', 'm.id', 'rm.model_id')
    .join('makers as mk', 'mk.id', 'm.maker_id')
    .select<RiderMeterRecord[]>(
      'rm.id',
      'rm.rider_id',
      'rm.nickname',
      'rm.position',
      'rm.battery_type',
      'm.id as model_id',
      'm.slug as model_slug',
      'm.name as model_name',
      'mk.name as maker_name',
    );
}

export async function listRiderMeters(db: Knex, riderId: number): Promise<RiderMeter[]> {
  return (await meters(db).where('rm.rider_id', riderId).orderBy('rm.id')).map(meterOf);
}

export async function findRiderMeter(db: Knex, riderId: number, meterId: number): Promise<RiderMeter | undefined> {
  const row = await meters(db).where({ 'rm.rider_id': riderId, 'rm.id': meterId }).first();
  return row ? meterOf(row) : undefined;
}

export async function insertRiderMeter(
  db: Knex,
  row: { riderId: number; modelId: number; position: Position; nickname: string; batteryType: BatteryType },
): Promise<number> {
  const [inserted] = await db('rider_meters')
    .insert({ rider_id: row.riderId, model_id: row.modelId, position: row.position, nickname: row.nickname, battery_type: row.batteryType })
    .returning<{ id: number }[]>('id');
  return inserted!.id;
}

export async function deleteRiderMeter(db: Knex, meterId: number): Promise<void> {
  await db('rider_meters').where({ id: meterId }).delete();
}

/** An approved model riders may log a meter of. */
export async function findApprovedModel(db: Knex, modelId: number): Promise<{ id: number } | undefined> {
  return db('models').where({ id: modelId, status: 'approved' }).first('id');
}

/** An approved firmware of the model. */
export async function findFirmwareOfModel(
  db: Knex,
  firmwareId: number,
  modelId: number,
): Promise<{ id: number; version: string } | undefined> {
  return db('firmware_versions').where({ id: firmwareId, model_id: modelId, status: 'approved' }).first('id', 'version');
}

interface BatteryEventRecord {
  id: number;
  rider_meter_id: number;
  occurred_on: string;
  kind: BatteryEventKind;
  previous_ended: PreviousBatteryEnding;
  firmware_id: number;
  firmware_version: string;
}

export interface BatteryEvent {
  id: number;
  riderMeterId: number;
  occurredOn: string;
  kind: BatteryEventKind;
  previousEnded: PreviousBatteryEnding;
  firmwareId: number;
  firmwareVersion: string;
}

const eventOf = (r: BatteryEventRecord): BatteryEvent => ({
  id: r.id,
  riderMeterId: r.rider_meter_id,
  occurredOn: r.occurred_on,
  kind: r.kind,
  previousEnded: r.previous_ended,
  firmwareId: r.firmware_id,
  firmwareVersion: r.firmware_version,
});

function events(db: Knex) {
  return db('battery_events as e')
    .join('firmware_versions as f', 'f.id', 'e.firmware_id')
    .orderBy(['e.rider_meter_id', 'e.occurred_on'])
    .select<BatteryEventRecord[]>(
      'e.id',
      'e.rider_meter_id',
      db.raw(`to_char(e.occurred_on, 'YYYY-MM-DD') as occurred_on`),
      'e.kind',
      'e.previous_ended',
      'e.firmware_id',
      'f.version as firmware_version',
    );
}

export async function listBatteryEvents(db: Knex, meterIds: number[]): Promise<BatteryEvent[]> {
  if (meterIds.length === 0) return [];
  return (await events(db).whereIn('e.rider_meter_id', meterIds)).map(eventOf);
}

export async function insertBatteryEvent(db: Knex, row: Omit<BatteryEvent, 'id' | 'firmwareVersion'>): Promise<number> {
  const [inserted] = await db('battery_events')
    .insert({
      rider_meter_id: row.riderMeterId,
      occurred_on: row.occurredOn,
      kind: row.kind,
      previous_ended: row.previousEnded,
      firmware_id: row.firmwareId,
    })
    .returning<{ id: number }[]>('id');
  return inserted!.id;
}

export async function deleteBatteryEvent(db: Knex, meterId: number, eventId: number): Promise<number> {
  return db('battery_events').where({ id: eventId, rider_meter_id: meterId }).delete();
}

export interface RidingEntry {
  id: number;
  riderMeterId: number;
  riddenOn: string;
  hours: number;
}

export async function listRiding(db: Knex, meterIds: number[]): Promise<RidingEntry[]> {
  if (meterIds.length === 0) return [];
  const rows = await db('self_reported_riding')
    .whereIn('rider_meter_id', meterIds)
    .orderBy(['rider_meter_id', 'ridden_on'])
    .select<{ id: number; rider_meter_id: number; ridden_on: string; hours: number }[]>(
      'id',
      'rider_meter_id',
      db.raw(`to_char(ridden_on, 'YYYY-MM-DD') as ridden_on`),
      'hours',
    );
  return rows.map((r) => ({ id: r.id, riderMeterId: r.rider_meter_id, riddenOn: r.ridden_on, hours: r.hours }));
}

export async function insertRiding(db: Knex, row: { riderMeterId: number; riddenOn: string; hours: number }): Promise<number> {
  const [inserted] = await db('self_reported_riding')
    .insert({ rider_meter_id: row.riderMeterId, ridden_on: row.riddenOn, hours: row.hours })
    .returning<{ id: number }[]>('id');
  return inserted!.id;
}

export async function deleteRiding(db: Knex, meterId: number, ridingId: number): Promise<number> {
  return db('self_reported_riding').where({ id: ridingId, rider_meter_id: meterId }).delete();
}

/** One ride a rider submitted with a meter of this model and position: its day and hours. */
export interface SubmittedRide {
  riderId: number;
  modelId: number;
  position: Position;
  day: string;
  hours: number;
}

/** The rides of these riders on these models, any status but withdrawn or failed (the ride happened either way). */
export async function listSubmittedRides(db: Knex, where: { riderIds?: number[]; modelId?: number }): Promise<SubmittedRide[]> {
  const query = db('submission_recordings as r')
    .join('submissions as s', 's.id', 'r.submission_id')
    .whereNotIn('s.status', ['withdrawn', 'failed'])
    .whereNotNull('s.rider_id')
    .select<{ rider_id: number; model_id: number; position: Position; day: string; hours: number }[]>(
      's.rider_id',
      'r.model_id',
      'r.position',
      db.raw(`to_char(s.ride_started_at at time zone 'UTC', 'YYYY-MM-DD') as day`),
      db.raw('extract(epoch from (s.ride_ended_at - s.ride_started_at)) / 3600.0 as hours'),
    );
  if (where.riderIds) query.whereIn('s.rider_id', where.riderIds);
  if (where.modelId !== undefined) query.where('r.model_id', where.modelId);
  return (await query).map((r) => ({ riderId: r.rider_id, modelId: r.model_id, position: r.position, day: r.day, hours: Number(r.hours) }));
}

/** Every meter of one model, with its rider: battery life counts all of them. */
export async function listMetersOfModel(db: Knex, modelId: number): Promise<RiderMeter[]> {
  return (await meters(db).where('rm.model_id', modelId)).map(meterOf);
}

/** Meters of these riders, for telling whether a rider's rides of a model can be attributed to one meter. */
export async function listMetersOfRiders(db: Knex, riderIds: number[]): Promise<RiderMeter[]> {
  if (riderIds.length === 0) return [];
  return (await meters(db).whereIn('rm.rider_id', riderIds)).map(meterOf);
}

export interface ModelForConditions {
  id: number;
  slug: string;
  claimHours: number | null;
  claimSource: string | null;
  firmware: { id: number; version: string }[];
}

export async function findModelForConditions(db: Knex, slug: string): Promise<ModelForConditions | undefined> {
  const model = await db('models')
    .where({ slug, status: 'approved' })
    .first<{ id: number; slug: string; battery_claim_hours: number | null; battery_claim_source: string | null } | undefined>(
      'id',
      'slug',
      'battery_claim_hours',
      'battery_claim_source',
    );
  if (!model) return undefined;
  const firmware = await db('firmware_versions')
    .where({ model_id: model.id, status: 'approved' })
    .orderBy('version_order', 'asc')
    .select<{ id: number; version: string }[]>('id', 'version');
  return { id: model.id, slug: model.slug, claimHours: model.battery_claim_hours, claimSource: model.battery_claim_source, firmware };
}

export async function updateBatteryClaim(db: Knex, modelId: number, claim: { hours: number | null; source: string | null }) {
  return db('models').where({ id: modelId }).update({ battery_claim_hours: claim.hours, battery_claim_source: claim.source });
}

export async function findModelClaim(
  db: Knex,
  modelId: number,
): Promise<{ id: number; hours: number | null; source: string | null } | undefined> {
  const row = await db('models')
    .where({ id: modelId })
    .first<{ id: number; battery_claim_hours: number | null; battery_claim_source: string | null } | undefined>(
      'id',
      'battery_claim_hours',
      'battery_claim_source',
    );
  return row ? { id: row.id, hours: row.battery_claim_hours, source: row.battery_claim_source } : undefined;
}

/** The model's side of each accepted ride with temperature bands: its band biases, signed as the model read them. */
export async function listTemperatureBandRides(db: Knex, modelId: number) {
  return db('submission_recordings as r')
    .join('submissions as s', 's.id', 'r.submission_id')
    .where('r.model_id', modelId)
    .where('s.status', 'accepted')
    .whereNotNull('s.rider_id')
    .whereRaw(`jsonb_typeof(s.result -> 'temperature') = 'object'`)
    .select<
      { rider_id: number; side: 'a' | 'b'; firmware_id: number; bands: { band: string; seconds: number; percent: number | null }[] }[]
    >('s.rider_id', 'r.side', 'r.firmware_id', db.raw(`s.result -> 'temperature' -> 'bands' as bands`));
}
