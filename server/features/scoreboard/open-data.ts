import type { Knex } from 'knex';
import type { ScoreboardCsvQuery } from '@shared/schemas/statistics';
import { findScoreboardAll } from './scoreboard.repository';
import { scoreboardRowOf } from './scoreboard.service';

// Open data: the scoreboard and every accepted submission's derived metrics as CSV.
// No rider, no notes, no location, no exact ride time (the month only).

// Names come from riders' proposals: text a spreadsheet would run as a formula gets
// a leading apostrophe (OWASP, "CSV Injection"); numbers, negative ones too, stay numbers.
const FORMULA_START = /^[=+\-@\t\r]/;
const PLAIN_NUMBER = /^-?\d+(\.\d+)?(e[+-]?\d+)?$/i;

export function csvLine(values: unknown[]): string {
  return `${values
    .map((value) => {
      if (value === null || value === undefined) return '';
      let text = typeof value === 'number' ? (Number.isFinite(value) ? String(Number(value.toPrecision(10))) : '') : String(value);
      if (FORMULA_START.test(text) && !PLAIN_NUMBER.test(text)) text = `'${text}`;
      return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
    })
    .join(',')}\r\n`;
}

const SCOREBOARD_COLUMNS = [
  'maker',
  'model',
  'model_slug',
  'position',
  'kind',
  'latest_firmware',
  'submissions',
  'riders',
  'pedalling_hours',
  'like_for_like_share',
  'enough_evidence',
  'bias_percent',
  'bias_lower_95_percent',
  'bias_upper_95_percent',
  'scatter_percent',
  'loa_lower_percent',
  'loa_upper_percent',
  'power_dropouts_per_hour',
  'power_dropouts_lower_95',
  'power_dropouts_upper_95',
  'cadence_dropouts_per_hour',
  'median_cadence_lag_seconds',
];

export async function scoreboardCsv(db: Knex, filters: ScoreboardCsvQuery): Promise<string> {
  const rows = (await findScoreboardAll(db, filters)).map(scoreboardRowOf);
  return (
    csvLine(SCOREBOARD_COLUMNS) +
    rows
      .map(({ maker, name, slug, position, kind, latestFirmware, figures: f }) =>
        csvLine([
          maker.name,
          name,
          slug,
          position,
          kind,
          latestFirmware?.version,
          f.evidence.submissionCount,
          f.evidence.distinctRiders,
          f.evidence.pedallingHours,
          f.evidence.likeForLikeShare,
          f.enough,
          f.bias?.meanPercent,
          f.bias?.lowerPercent,
          f.bias?.upperPercent,
          f.bias?.scatterPercent,
          f.agreement?.lowerPercent,
          f.agreement?.upperPercent,
          f.powerDropouts?.perHour,
          f.powerDropouts?.lower,
          f.powerDropouts?.upper,
          f.cadenceDropouts?.perHour,
          f.medianCadenceLagSeconds,
        ]),
      )
      .join('')
  );
}

const SIDE_COLUMNS = [
  'maker',
  'model_slug',
  'firmware',
  'position',
  'recording_device',
  'recording_mode',
  'other_meters_on',
  'power_dropouts',
  'cadence_dropouts',
];
export const SUBMISSION_CSV_COLUMNS = [
  'submission_id',
  'ride_month',
  'method_version',
  'indoor',
  'surface',
  ...SIDE_COLUMNS.map((c) => `a_${c}`),
  ...SIDE_COLUMNS.map((c) => `b_${c}`),
  'pedalling_hours',
  'matched_seconds',
  'bias_a_vs_b_percent',
  'loa_lower_percent',
  'loa_upper_percent',
  'like_for_like_mode',
  'sum_a_joules',
  'sum_b_joules',
  'cadence_lag_seconds',
  'correlation',
];

/** Writes the per-submission CSV in pages of accepted submissions, so memory stays flat. */
export async function writeSubmissionsCsv(db: Knex, write: (chunk: string) => void): Promise<void> {
  write(csvLine(SUBMISSION_CSV_COLUMNS));
  const side = (alias: string, prefix: string) => [
    `${alias}mk.name as ${prefix}_maker`,
    `${alias}m.slug as ${prefix}_model_slug`,
    `${alias}f.version as ${prefix}_firmware`,
    `${alias}.position as ${prefix}_position`,
    `${alias}d.name as ${prefix}_recording_device`,
    `${alias}.recording_mode as ${prefix}_recording_mode`,
    `${alias}.other_meters_on as ${prefix}_other_meters_on`,
  ];
  const joinSide = (query: Knex.QueryBuilder, alias: string, letter: 'a' | 'b') =>
    query
      .join(`submission_recordings as ${alias}`, (j) => j.on(`${alias}.submission_id`, 's.id').andOnVal(`${alias}.side`, letter))
      .join(`models as ${alias}m`, `${alias}m.id`, `${alias}.model_id`)
      .join(`makers as ${alias}mk`, `${alias}mk.id`, `${alias}m.maker_id`)
      .join(`firmware_versions as ${alias}f`, `${alias}f.id`, `${alias}.firmware_id`)
      .join(`recording_devices as ${alias}d`, `${alias}d.id`, `${alias}.recording_device_id`);
  let after = 0;
  for (;;) {
    const query = db('submissions as s').where('s.status', 'accepted').where('s.id', '>', after).orderBy('s.id').limit(2000);
    joinSide(query, 'ra', 'a');
    joinSide(query, 'rb', 'b');
    const rows: Record<string, unknown>[] = await query.select(
      's.id',
      db.raw(`to_char(s.ride_started_at at time zone 'UTC', 'YYYY-MM') as ride_month`),
      's.method_version',
      's.indoor',
      's.surface',
      ...side('ra', 'a'),
      ...side('rb', 'b'),
      ...[
        'a_power_dropouts',
        'a_cadence_dropouts',
        'b_power_dropouts',
        'b_cadence_dropouts',
        'pedalling_seconds',
        'matched_seconds',
        'bias_percent',
        'loa_lower_percent',
        'loa_upper_percent',
        'like_for_like_mode',
        'sum_a',
        'sum_b',
        'cadence_lag_seconds',
        'correlation',
      ].map((c) => `s.${c}`),
    );
    if (rows.length === 0) return;
    write(
      rows
        .map((r) =>
          csvLine([
            r.id,
            r.ride_month,
            r.method_version,
            r.indoor,
            r.surface,
            ...(['a', 'b'] as const).flatMap((p) => [
              r[`${p}_maker`],
              r[`${p}_model_slug`],
              r[`${p}_firmware`],
              r[`${p}_position`],
              r[`${p}_recording_device`],
              r[`${p}_recording_mode`],
              r[`${p}_other_meters_on`],
              r[`${p}_power_dropouts`],
              r[`${p}_cadence_dropouts`],
            ]),
            Number(r.pedalling_seconds) / 3600,
            r.matched_seconds,
            r.bias_percent,
            r.loa_lower_percent,
            r.loa_upper_percent,
            r.like_for_like_mode,
            r.sum_a,
            r.sum_b,
            r.cadence_lag_seconds,
            r.correlation,
          ]),
        )
        .join(''),
    );
    after = Number(rows[rows.length - 1].id);
  }
}
