import type { Knex } from 'knex';
import type { Catalogue, CatalogueFirmware, CatalogueMaker, CatalogueModel, CatalogueRecordingDevice } from '@shared/schemas/catalogue';

// Approved entries for everyone; a rider also sees what they proposed themselves.
function visibleTo(viewerId: number | undefined) {
  return (q: Knex.QueryBuilder) => {
    q.where('status', 'approved');
    if (viewerId) q.orWhere((w) => w.where('status', 'pending').andWhere('proposed_by', viewerId));
  };
}

export async function listCatalogue(db: Knex, viewerId?: number): Promise<Catalogue> {
  const [makers, models, firmware, recordingDevices] = await Promise.all([
    db('makers').select('id', 'slug', 'name', 'status').where(visibleTo(viewerId)).orderBy('name'),
    db('models')
      .select('id', 'maker_id as makerId', 'slug', 'name', 'position', 'kind', 'status')
      .where(visibleTo(viewerId))
      .orderBy('name'),
    db('firmware_versions')
      .select('id', 'model_id as modelId', 'version', db.raw(`to_char(released_on, 'YYYY-MM-DD') as "releasedOn"`), 'beta', 'status')
      .where(visibleTo(viewerId))
      .orderBy([{ column: 'model_id' }, { column: 'version_order', order: 'desc' }]),
    db('recording_devices').select('id', 'slug', 'name', 'kind', 'status').where(visibleTo(viewerId)).orderBy('name'),
  ]);
  return {
    makers: makers as CatalogueMaker[],
    models: models as CatalogueModel[],
    firmware: firmware as CatalogueFirmware[],
    recordingDevices: recordingDevices as CatalogueRecordingDevice[],
  };
}

export interface UsableModel {
  id: number;
  makerId: number;
  name: string;
  position: CatalogueModel['position'];
  kind: CatalogueModel['kind'];
}

export async function findUsableModel(db: Knex, modelId: number, riderId: number): Promise<UsableModel | undefined> {
  return db('models')
    .select('id', 'maker_id as makerId', 'name', 'position', 'kind')
    .where({ id: modelId })
    .andWhere(visibleTo(riderId))
    .first();
}

export async function findUsableFirmware(db: Knex, firmwareId: number, modelId: number, riderId: number) {
  return db('firmware_versions')
    .select('id', 'version')
    .where({ id: firmwareId, model_id: modelId })
    .andWhere(visibleTo(riderId))
    .first() as Promise<{ id: number; version: string } | undefined>;
}

export async function findUsableRecordingDevice(db: Knex, deviceId: number, riderId: number) {
  return db('recording_devices').select('id', 'name').where({ id: deviceId }).andWhere(visibleTo(riderId)).first() as Promise<
    { id: number; name: string } | undefined
  >;
}

export async function insertMaker(db: Knex, row: { slug: string; name: string; status: string; proposedBy?: number }) {
  const [maker] = await db('makers')
    .insert({ slug: row.slug, name: row.name, status: row.status, ...(row.proposedBy && { proposed_by: row.proposedBy }) })
    .returning(['id', 'slug', 'name', 'status']);
  return maker as CatalogueMaker;
}

export async function insertModel(db: Knex, row: Omit<CatalogueModel, 'id'> & { proposedBy?: number }): Promise<CatalogueModel> {
  const [model] = await db('models')
    .insert({
      maker_id: row.makerId,
      slug: row.slug,
      name: row.name,
      position: row.position,
      kind: row.kind,
      status: row.status,
      proposed_by: row.proposedBy ?? null,
    })
    .returning(['id', 'maker_id as makerId', 'slug', 'name', 'position', 'kind', 'status']);
  return model;
}

export async function insertFirmware(
  db: Knex,
  row: {
    modelId: number;
    version: string;
    versionOrder: number[];
    releasedOn?: string | null;
    beta?: boolean;
    status: string;
    proposedBy?: number;
  },
): Promise<CatalogueFirmware> {
  const [firmware] = await db('firmware_versions')
    .insert({
      model_id: row.modelId,
      version: row.version,
      version_order: row.versionOrder,
      released_on: row.releasedOn ?? null,
      beta: row.beta ?? false,
      status: row.status,
      proposed_by: row.proposedBy ?? null,
    })
    .returning(['id', 'model_id as modelId', 'version', db.raw(`to_char(released_on, 'YYYY-MM-DD') as "releasedOn"`), 'beta', 'status']);
  return firmware;
}

export async function insertRecordingDevice(
  db: Knex,
  row: Omit<CatalogueRecordingDevice, 'id'> & { proposedBy?: number },
): Promise<CatalogueRecordingDevice> {
  const [device] = await db('recording_devices')
    .insert({ slug: row.slug, name: row.name, kind: row.kind, status: row.status, proposed_by: row.proposedBy ?? null })
    .returning(['id', 'slug', 'name', 'kind', 'status']);
  return device;
}

export async function makerExists(db: Knex, makerId: number, viewerId: number) {
  return Boolean(await db('makers').where({ id: makerId }).andWhere(visibleTo(viewerId)).first('id'));
}

export async function modelExists(db: Knex, modelId: number, viewerId: number) {
  return Boolean(await findUsableModel(db, modelId, viewerId));
}
