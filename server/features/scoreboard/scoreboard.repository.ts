import type { Knex } from 'knex';
import { dayOf } from '@shared/schemas/day';
import type { ScoreboardCsvQuery, ScoreboardQuery, ScoreboardSort } from '@shared/schemas/statistics';
import { MINIMUM_RIDERS, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import type { DropoutTagRow, StatisticsRow } from '../statistics/figures';

// Queries behind the scoreboard, model and firmware pages. Everything reads the
// statistics tables (accepted submissions only) or accepted submissions themselves.

const ENOUGH = `(coalesce(st.submission_count, 0) >= ${MINIMUM_SUBMISSIONS} and coalesce(st.distinct_riders, 0) >= ${MINIMUM_RIDERS})`;
// The rider-level mean the pages show (rider-sums.ts).
const MEAN_BIAS = 'st.rider_sum_weighted_bias / nullif(st.rider_sum_weight, 0)';
// The reliability-weighted between-submission SD, as summariseBiasSums computes it.
const SCATTER =
  'sqrt(greatest(0, st.sum_weighted_bias_squared - st.sum_weighted_bias * st.sum_weighted_bias / nullif(st.sum_weight, 0)) / nullif(st.sum_weight - st.sum_weight_squared / nullif(st.sum_weight, 0), 0))';

const SORT_EXPRESSIONS: Record<ScoreboardSort, string> = {
  name: 'm.name',
  maker: 'mk.name',
  evidence: 'coalesce(st.submission_count, 0)',
  riders: 'coalesce(st.distinct_riders, 0)',
  hours: 'coalesce(st.pedalling_hours, 0)',
  bias: `case when ${ENOUGH} then ${MEAN_BIAS} end`,
  abs_bias: `case when ${ENOUGH} then abs(${MEAN_BIAS}) end`,
  scatter: `case when ${ENOUGH} then ${SCATTER} end`,
  dropouts: `case when ${ENOUGH} then st.power_dropouts / nullif(st.pedalling_hours, 0) end`,
  cadence_lag: `case when ${ENOUGH} then st.median_cadence_lag_seconds end`,
};

export interface ModelRow {
  id: number;
  slug: string;
  name: string;
  position: 'left' | 'right' | 'dual' | 'total';
  kind: 'crank_arm' | 'pedal' | 'spider' | 'spindle' | 'hub' | 'trainer';
  maker_slug: string;
  maker_name: string;
  hidden_reason: string | null;
}

export type ScoreboardDbRow = ModelRow &
  Partial<StatisticsRow> & { latest_version: string | null; latest_released_on: string | null; total: string };

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

function scoreboardBase(db: Knex, filters: ScoreboardCsvQuery) {
  const query = db('models as m')
    .join('makers as mk', 'mk.id', 'm.maker_id')
    .leftJoin('meter_statistics as st', (j) => j.on('st.model_id', 'm.id').andOnNull('st.firmware_id'))
    .joinRaw(
      `left join lateral (select f.version, f.released_on from firmware_versions f
        where f.model_id = m.id and f.status = 'approved' order by f.version_order desc limit 1) lf on true`,
    )
    .where('m.status', 'approved')
    .whereNull('m.hidden_reason');
  if (filters.position) query.where('m.position', filters.position);
  if (filters.kind) query.where('m.kind', filters.kind);
  if (filters.maker) query.where('mk.slug', filters.maker);
  if (filters.evidence === 'enough') query.whereRaw(ENOUGH);
  if (filters.q) {
    const pattern = likePattern(filters.q);
    query.where((q) =>
      q
        .whereILike('m.name', pattern)
        .orWhereILike('mk.name', pattern)
        .orWhereExists((sub) =>
          sub
            .select(db.raw('1'))
            .from('catalogue_aliases as al')
            .where('al.entry_type', 'model')
            .whereRaw('al.entry_id = m.id')
            .whereILike('al.name', pattern),
        ),
    );
  }
  return query.select(
    'm.id',
    'm.slug',
    'm.name',
    'm.position',
    'm.kind',
    'm.hidden_reason',
    'mk.slug as maker_slug',
    'mk.name as maker_name',
    'st.*',
    'm.id as id',
    'lf.version as latest_version',
    db.raw(`to_char(lf.released_on, 'YYYY-MM-DD') as latest_released_on`),
  );
}

export async function findScoreboardPage(db: Knex, query: ScoreboardQuery): Promise<{ rows: ScoreboardDbRow[]; total: number }> {
  const rows: ScoreboardDbRow[] = await scoreboardBase(db, query)
    .select(db.raw('count(*) over () as total'))
    .orderByRaw(`${SORT_EXPRESSIONS[query.sort]} ${query.order} nulls last, m.name asc, m.id asc`)
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const total =
    rows.length > 0 ? Number(rows[0].total) : Number((await scoreboardBase(db, query).clearSelect().count({ n: '*' }).first())?.n ?? 0);
  return { rows, total };
}

export async function findScoreboardAll(db: Knex, filters: ScoreboardCsvQuery): Promise<ScoreboardDbRow[]> {
  return scoreboardBase(db, filters).orderBy(['mk.name', 'm.name']);
}

export async function findModelBySlug(db: Knex, slug: string): Promise<ModelRow | undefined> {
  return db('models as m')
    .join('makers as mk', 'mk.id', 'm.maker_id')
    .where('m.slug', slug)
    .where('m.status', 'approved')
    .first('m.id', 'm.slug', 'm.name', 'm.position', 'm.kind', 'm.hidden_reason', 'mk.slug as maker_slug', 'mk.name as maker_name');
}

export interface FirmwareRow {
  id: number;
  version: string;
  released_on: string | null;
  beta: boolean;
}

export async function findFirmwareOfModel(db: Knex, modelId: number): Promise<FirmwareRow[]> {
  return db('firmware_versions')
    .where({ model_id: modelId, status: 'approved' })
    .orderBy('version_order', 'asc')
    .select('id', 'version', 'beta', db.raw(`to_char(released_on, 'YYYY-MM-DD') as released_on`));
}

export async function findStatisticsOfModel(db: Knex, modelId: number): Promise<(StatisticsRow & { firmware_id: number | null })[]> {
  return db('meter_statistics').where({ model_id: modelId });
}

export async function findConsensusOfModel(db: Knex, modelId: number) {
  return db('consensus_offsets')
    .where({ model_id: modelId, reportable: true })
    .select('firmware_id', 'offset_percent', 'lower_percent', 'upper_percent', 'connected_to') as Promise<
    { firmware_id: number; offset_percent: number; lower_percent: number | null; upper_percent: number | null; connected_to: number }[]
  >;
}

/** The stored consensus fit: the day it was made (null before the first) and whether a decision since has made it stale. */
export async function findConsensusFit(db: Knex): Promise<{ fittedOn: string | null; refitPending: boolean }> {
  const row: { consensus_computed_at: Date | null; consensus_stale: boolean } = await db('statistics_state')
    .where({ id: 1 })
    .first('consensus_computed_at', 'consensus_stale');
  return { fittedOn: row.consensus_computed_at && dayOf(row.consensus_computed_at), refitPending: row.consensus_stale };
}

export async function findDropoutTags(db: Knex, modelId: number, firmwareId: number | null): Promise<DropoutTagRow[]> {
  const query = db('dropout_tag_statistics').where({ model_id: modelId }).orderBy(['tag', 'value']);
  if (firmwareId === null) query.whereNull('firmware_id');
  else query.where('firmware_id', firmwareId);
  return query.select('tag', 'value', 'submission_count', 'pedalling_hours', 'power_dropouts');
}

export async function findRecordingDeviceNames(db: Knex, ids: number[]): Promise<Map<number, string>> {
  if (ids.length === 0) return new Map();
  const rows: { id: number; name: string }[] = await db('recording_devices').whereIn('id', ids).select('id', 'name');
  return new Map(rows.map((row) => [row.id, row.name]));
}

/** Each accepted side of the model: what the medians are computed from. */
export async function findAcceptedBiases(db: Knex, modelId: number) {
  return db('submission_recordings as r')
    .join('submissions as s', 's.id', 'r.submission_id')
    .where('r.model_id', modelId)
    .where('s.status', 'accepted')
    .where('s.pedalling_seconds', '>', 0)
    .select(
      'r.side',
      'r.firmware_id',
      's.rider_id',
      's.bias_percent',
      's.sum_a',
      's.sum_b',
      's.pedalling_seconds',
      's.like_for_like_mode',
    ) as Promise<
    {
      side: 'a' | 'b';
      firmware_id: number;
      rider_id: number | null;
      bias_percent: number | null;
      sum_a: number | null;
      sum_b: number | null;
      pedalling_seconds: number;
      like_for_like_mode: string | null;
    }[]
  >;
}

export interface RecentSubmissionRow {
  id: number;
  side: 'a' | 'b';
  ride_month: string;
  firmware: string;
  bias_percent: number | null;
  sum_a: number | null;
  sum_b: number | null;
  pedalling_seconds: number;
  a_power_dropouts: number | null;
  b_power_dropouts: number | null;
  partner_model_slug: string;
  partner_model_name: string;
  partner_maker_name: string;
  partner_firmware: string;
}

/** A model's (or one firmware's) latest accepted sides, newest decision first, each with its partner meter. */
export async function findRecentAccepted(
  db: Knex,
  where: { modelId: number; firmwareId?: number },
  limit: number,
): Promise<RecentSubmissionRow[]> {
  // The latest few first (index on the model's sides, then each submission by key),
  // and only then their partners: joining the partners of every side of the model
  // before the limit cost ten times more.
  const latest = db('submission_recordings as r')
    .join('submissions as s', 's.id', 'r.submission_id')
    .where('r.model_id', where.modelId)
    .where('s.status', 'accepted')
    .orderByRaw('s.decided_at desc nulls last, s.id desc')
    .limit(limit)
    .select('s.id', 'r.side', 'r.firmware_id', 's.decided_at');
  if (where.firmwareId !== undefined) latest.where('r.firmware_id', where.firmwareId);
  return db
    .from(latest.as('l'))
    .join('submissions as s', 's.id', 'l.id')
    .join('firmware_versions as f', 'f.id', 'l.firmware_id')
    .join('submission_recordings as p', (j) => j.on('p.submission_id', 'l.id').andOn('p.side', '<>', 'l.side'))
    .join('models as pm', 'pm.id', 'p.model_id')
    .join('makers as pmk', 'pmk.id', 'pm.maker_id')
    .join('firmware_versions as pf', 'pf.id', 'p.firmware_id')
    .orderByRaw('l.decided_at desc nulls last, l.id desc')
    .select(
      's.id',
      'l.side',
      db.raw(`to_char(s.ride_started_at at time zone 'UTC', 'YYYY-MM') as ride_month`),
      'f.version as firmware',
      's.bias_percent',
      's.sum_a',
      's.sum_b',
      's.pedalling_seconds',
      's.a_power_dropouts',
      's.b_power_dropouts',
      'pm.slug as partner_model_slug',
      'pm.name as partner_model_name',
      'pmk.name as partner_maker_name',
      'pf.version as partner_firmware',
    );
}

/** The method versions of the accepted rides with a side on this model (or this firmware), ascending. */
export async function findMethodVersions(db: Knex, where: { modelId: number; firmwareId?: number }): Promise<number[]> {
  const rows: { method_version: number }[] = await db('submission_recordings as r')
    .join('submissions as s', 's.id', 'r.submission_id')
    .where('r.model_id', where.modelId)
    .modify((q) => {
      if (where.firmwareId !== undefined) q.where('r.firmware_id', where.firmwareId);
    })
    .where('s.status', 'accepted')
    .whereNotNull('s.method_version')
    .distinct('s.method_version')
    .orderBy('s.method_version');
  return rows.map((r) => r.method_version);
}

export async function findPinnedNote(db: Knex, subject: { modelId: number } | { firmwareId: number }) {
  const row = await db('moderator_notes')
    .where('modelId' in subject ? { model_id: subject.modelId } : { firmware_id: subject.firmwareId })
    .first('body', 'pinned_at');
  return row ? { body: row.body as string, pinnedAt: dayOf(row.pinned_at) } : null;
}

/**
 * Where a merged model's old address leads: the slug of the model it was merged
 * into, following merges of merges (the old name stays an alias that still finds it).
 */
export async function findMergedModelTarget(db: Knex, slug: string): Promise<string | undefined> {
  const row = await db
    .withRecursive('chain', (q) => {
      q.select('id', 'slug', 'status', 'merged_into_id', db.raw('0 as depth'))
        .from('models')
        .where({ slug, status: 'merged' })
        .unionAll((u) =>
          u
            .select('m.id', 'm.slug', 'm.status', 'm.merged_into_id', db.raw('chain.depth + 1'))
            .from('models as m')
            .join('chain', 'chain.merged_into_id', 'm.id')
            .where('chain.depth', '<', 10),
        );
    })
    .from('chain')
    .where('status', 'approved')
    .first('slug');
  return row?.slug;
}

/** Where a merged firmware version's old address leads: its model's slug and the kept version. */
export async function findMergedFirmwareTarget(
  db: Knex,
  modelSlug: string,
  version: string,
): Promise<{ slug: string; version: string } | undefined> {
  return db('firmware_versions as old')
    .join('models as m', 'm.id', 'old.model_id')
    .join('firmware_versions as kept', 'kept.id', 'old.merged_into_id')
    .join('models as km', 'km.id', 'kept.model_id')
    .where({ 'm.slug': modelSlug, 'old.version': version, 'old.status': 'merged', 'kept.status': 'approved' })
    .first('km.slug as slug', 'kept.version as version');
}
