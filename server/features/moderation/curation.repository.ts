import type { Knex } from 'knex';
import type { CatalogueEntryType, PendingEntries, PendingEntry } from '@shared/schemas/moderation';

type Db = Knex | Knex.Transaction;

export const ENTRY_TABLES: Record<CatalogueEntryType, string> = {
  maker: 'makers',
  model: 'models',
  firmware: 'firmware_versions',
  recording_device: 'recording_devices',
};

/** The column naming an entry: makers, models and devices have a name, firmware a version. */
export const NAME_COLUMN: Record<CatalogueEntryType, string> = {
  maker: 'name',
  model: 'name',
  firmware: 'version',
  recording_device: 'name',
};

export interface CatalogueEntry {
  id: number;
  name: string;
  slug: string | null;
  status: string;
  makerId: number | null;
  modelId: number | null;
}

export async function lockEntry(trx: Knex.Transaction, type: CatalogueEntryType, id: number): Promise<CatalogueEntry | undefined> {
  const row = await trx(ENTRY_TABLES[type]).where({ id }).forUpdate().first();
  if (!row) return undefined;
  return {
    id: row.id,
    name: row[NAME_COLUMN[type]],
    slug: row.slug ?? null,
    status: row.status,
    makerId: type === 'maker' ? row.id : (row.maker_id ?? null),
    modelId: type === 'firmware' ? row.model_id : type === 'model' ? row.id : null,
  };
}

/** The maker a catalogue entry belongs to (none for recording devices). */
export async function makerOfEntry(db: Db, type: CatalogueEntryType, id: number): Promise<number | null> {
  if (type === 'maker') return id;
  if (type === 'model') return (await db('models').where({ id }).first('maker_id'))?.maker_id ?? null;
  if (type === 'firmware') {
    return (
      (await db('firmware_versions as f').join('models as m', 'm.id', 'f.model_id').where('f.id', id).first('m.maker_id'))?.maker_id ?? null
    );
  }
  return null;
}

export async function setStatus(
  trx: Knex.Transaction,
  type: CatalogueEntryType,
  id: number,
  status: string,
  mergedIntoId: number | null = null,
) {
  await trx(ENTRY_TABLES[type]).where({ id }).update({ status, merged_into_id: mergedIntoId });
}

export async function rename(trx: Knex.Transaction, type: CatalogueEntryType, id: number, name: string, versionOrder?: number[]) {
  await trx(ENTRY_TABLES[type])
    .where({ id })
    .update({ [NAME_COLUMN[type]]: name, ...(versionOrder && { version_order: versionOrder }) });
}

export async function addAlias(
  trx: Knex.Transaction,
  alias: { type: CatalogueEntryType; entryId: number; name: string; slug: string | null; createdBy: number },
) {
  await trx('catalogue_aliases').insert({
    entry_type: alias.type,
    entry_id: alias.entryId,
    name: alias.name,
    slug: alias.slug,
    created_by: alias.createdBy,
  });
}

/** Aliases that named the merged entry now name the one it merged into. */
export async function repointAliases(trx: Knex.Transaction, type: CatalogueEntryType, fromId: number, toId: number) {
  await trx('catalogue_aliases').where({ entry_type: type, entry_id: fromId }).update({ entry_id: toId });
}

/** Accepted submissions with a recording that uses the entry: their statistics move with it. */
export async function acceptedSubmissionsUsing(db: Db, type: CatalogueEntryType, id: number): Promise<number[]> {
  const q = db('submission_recordings as r')
    .join('submissions as s', 's.id', 'r.submission_id')
    .where('s.status', 'accepted')
    .distinct('s.id');
  if (type === 'maker') q.join('models as m', 'm.id', 'r.model_id').where('m.maker_id', id);
  if (type === 'model') q.where('r.model_id', id);
  if (type === 'firmware') q.where('r.firmware_id', id);
  if (type === 'recording_device') q.where('r.recording_device_id', id);
  return (await q).map((r) => r.id);
}

export async function countRecordingsUsing(db: Db, type: CatalogueEntryType, id: number): Promise<number> {
  const column = { model: 'model_id', firmware: 'firmware_id', recording_device: 'recording_device_id' } as const;
  if (type === 'maker') {
    const [{ count }] = await db('submission_recordings as r')
      .join('models as m', 'm.id', 'r.model_id')
      .where('m.maker_id', id)
      .count<{ count: string }[]>({ count: '*' });
    return Number(count);
  }
  const [{ count }] = await db('submission_recordings').where(column[type], id).count<{ count: string }[]>({ count: '*' });
  return Number(count);
}

/** Entries riders proposed that no moderator has looked at yet, with who proposed them and how often they are used. */
type PendingRecord = Omit<PendingEntry, 'createdAt'> & { createdAt: Date };
const pendingEntryOf = (row: PendingRecord): PendingEntry => ({ ...row, createdAt: row.createdAt.toISOString() });

export async function listPending(db: Knex): Promise<PendingEntries> {
  const proposer = (table: string) => db.raw(`(select handle from users u where u.id = ${table}.proposed_by) as "proposedBy"`);
  const [makers, models, firmware, devices] = await Promise.all([
    db('makers').where({ status: 'pending' }).select<PendingRecord[]>('id', 'name', 'slug', 'created_at as createdAt', proposer('makers')),
    db('models as models')
      .join('makers as mk', 'mk.id', 'models.maker_id')
      .where('models.status', 'pending')
      .select<PendingRecord[]>(
        'models.id',
        'models.name',
        'models.slug',
        'mk.name as makerName',
        'models.created_at as createdAt',
        proposer('models'),
      ),
    db('firmware_versions as firmware_versions')
      .join('models as m', 'm.id', 'firmware_versions.model_id')
      .where('firmware_versions.status', 'pending')
      .select<PendingRecord[]>(
        'firmware_versions.id',
        'firmware_versions.version as name',
        'm.name as modelName',
        'firmware_versions.created_at as createdAt',
        proposer('firmware_versions'),
      ),
    db('recording_devices')
      .where({ status: 'pending' })
      .select<PendingRecord[]>('id', 'name', 'slug', 'created_at as createdAt', proposer('recording_devices')),
  ]);
  return {
    makers: makers.map(pendingEntryOf),
    models: models.map(pendingEntryOf),
    firmware: firmware.map(pendingEntryOf),
    recordingDevices: devices.map(pendingEntryOf),
  };
}

/** Finds an entry by a name it had before (a rename or a merge); follows merges to the entry that is used now. */
export async function findByAlias(
  db: Db,
  type: CatalogueEntryType,
  nameOrSlug: string,
): Promise<{ id: number; name: string; slug: string | null; status: string } | undefined> {
  const alias = await db('catalogue_aliases')
    .where({ entry_type: type })
    .andWhere((q) => q.whereRaw('lower(name) = lower(?)', [nameOrSlug]).orWhere('slug', nameOrSlug))
    .orderBy('id', 'desc')
    .first<{ entry_id: number } | undefined>('entry_id');
  if (!alias) return undefined;
  const row = await db(ENTRY_TABLES[type]).where({ id: alias.entry_id }).first<Record<string, unknown> | undefined>();
  return (
    row && {
      id: row.id as number,
      name: row[NAME_COLUMN[type]] as string,
      slug: (row.slug ?? null) as string | null,
      status: row.status as string,
    }
  );
}
