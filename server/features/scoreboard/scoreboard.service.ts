import type { Knex } from 'knex';
import { METHOD_VERSION } from '@shared/analysis/method';
import type {
  ConsensusFigure,
  DropoutBreakdownRow,
  FirmwarePage,
  FirmwareSummary,
  ModelHeader,
  ModelPage,
  RecentSubmission,
  ScoreboardPage,
  ScoreboardQuery,
  ScoreboardRow,
} from '@shared/schemas/statistics';
import { medianBias } from '@shared/statistics/weighted-bias';
import { NotFoundError } from '../../lib/errors';
import { poolsBias, sideBias } from '../statistics/contributions';
import { compareFirmwareSteps, dropoutBreakdown, meterFigures, type DropoutTagRow, type StatisticsRow } from '../statistics/figures';
import * as repository from './scoreboard.repository';

const RECENT_ON_MODEL_PAGE = 10;
const SUBMISSIONS_ON_FIRMWARE_PAGE = 50;

const TAG_LABELS: Record<DropoutBreakdownRow['tag'], string> = {
  surface: 'Surface',
  environment: 'Where',
  recording_device: 'Recording device',
  recording_mode: 'Recording mode',
  other_meters_on: 'Other meters switched on',
};
const VALUE_LABELS: Record<string, string> = {
  smooth_road: 'smooth road',
  rough_road: 'rough road',
  gravel: 'gravel',
  trainer: 'trainer',
  indoor: 'indoors',
  outdoor: 'outdoors',
  every_second: 'every second',
  change_only: 'on change only',
  yes: 'yes',
  no: 'no',
};

function identityOf(model: repository.ModelRow) {
  return {
    slug: model.slug,
    name: model.name,
    maker: { slug: model.maker_slug, name: model.maker_name },
    position: model.position,
    kind: model.kind,
  };
}

export function scoreboardRowOf(row: repository.ScoreboardDbRow): ScoreboardRow {
  return {
    ...identityOf(row),
    latestFirmware: row.latest_version ? { version: row.latest_version, releasedOn: row.latest_released_on } : null,
    figures: meterFigures(row.submission_count ? (row as StatisticsRow) : undefined),
  };
}

export async function getScoreboard(db: Knex, query: ScoreboardQuery): Promise<ScoreboardPage> {
  const { rows, total } = await repository.findScoreboardPage(db, query);
  return { rows: rows.map(scoreboardRowOf), total, page: query.page, pageSize: query.pageSize, sort: query.sort, order: query.order };
}

function modelHeader(model: repository.ModelRow): ModelHeader {
  return {
    ...identityOf(model),
    hiddenReason: model.hidden_reason,
    threadsPath: `/models/${model.slug}/threads`,
  };
}

/** Everything both pages need about a model: its figures per firmware and overall (consensus offsets as last fitted: a worker refits stale ones, see consensus-refit.job.ts). */
async function loadModel(db: Knex, slug: string) {
  const model = await repository.findModelBySlug(db, slug);
  if (!model) throw new NotFoundError('No such model in the catalogue.');
  const [firmware, statistics, consensus, biases, consensusFit] = await Promise.all([
    repository.findFirmwareOfModel(db, model.id),
    repository.findStatisticsOfModel(db, model.id),
    repository.findConsensusOfModel(db, model.id),
    repository.findAcceptedBiases(db, model.id),
    repository.findConsensusFit(db),
  ]);
  const statisticsOf = (firmwareId: number | null) => statistics.find((row) => row.firmware_id === firmwareId);
  const medianOf = (firmwareId: number | null) =>
    medianBias(
      biases
        .filter((b) => firmwareId === null || b.firmware_id === firmwareId)
        .flatMap((b) => {
          const bias = poolsBias(b.like_for_like_mode) ? sideBias(b, b.side === 'a') : null;
          return bias === null ? [] : [{ biasPercent: bias, pedallingHours: b.pedalling_seconds / 3600, riderId: b.rider_id ?? 0 }];
        }),
    );

  const versions = firmware.map((version) => {
    const row = statisticsOf(version.id);
    return { version, row, figures: meterFigures(row, row ? medianOf(version.id) : null) };
  });
  const steps = compareFirmwareSteps(versions.map(({ version, row, figures }) => ({ version: version.version, row, figures })));
  const summaries: FirmwareSummary[] = versions.map(({ version, figures }, i) => {
    const offset = consensus.find((c) => c.firmware_id === version.id);
    return {
      version: version.version,
      releasedOn: version.released_on,
      beta: version.beta,
      figures,
      consensus: offset && figures.enough ? consensusFigure(offset) : null,
      againstPredecessor: i > 0 ? steps[i - 1]! : null,
    };
  });
  const modelRow = statisticsOf(null);
  return {
    model,
    firmware,
    summaries,
    statisticsOf,
    modelRow,
    figures: meterFigures(modelRow, modelRow ? medianOf(null) : null),
    consensusFit,
  };
}

function consensusFigure(row: {
  offset_percent: number;
  lower_percent: number | null;
  upper_percent: number | null;
  connected_to: number;
}): ConsensusFigure {
  return {
    offsetPercent: row.offset_percent,
    lowerPercent: row.lower_percent,
    upperPercent: row.upper_percent,
    connectedTo: row.connected_to,
  };
}

async function breakdown(
  db: Knex,
  modelId: number,
  firmwareId: number | null,
  scope: StatisticsRow | undefined,
): Promise<DropoutBreakdownRow[]> {
  const rows = await repository.findDropoutTags(db, modelId, firmwareId);
  const devices = await repository.findRecordingDeviceNames(
    db,
    rows.filter((r) => r.tag === 'recording_device').map((r) => Number(r.value)),
  );
  const labelOf = (row: DropoutTagRow) =>
    `${TAG_LABELS[row.tag]}: ${row.tag === 'recording_device' ? (devices.get(Number(row.value)) ?? 'unknown device') : (VALUE_LABELS[row.value] ?? row.value)}`;
  return dropoutBreakdown(scope, rows, labelOf);
}

function recentOf(rows: repository.RecentSubmissionRow[]): RecentSubmission[] {
  return rows.map((row) => ({
    id: row.id,
    rideMonth: row.ride_month,
    firmware: row.firmware,
    side: row.side,
    partner: {
      modelSlug: row.partner_model_slug,
      modelName: row.partner_model_name,
      makerName: row.partner_maker_name,
      firmware: row.partner_firmware,
    },
    biasPercent: sideBias(row, row.side === 'a'),
    pedallingHours: row.pedalling_seconds / 3600,
    powerDropouts: (row.side === 'a' ? row.a_power_dropouts : row.b_power_dropouts) ?? 0,
  }));
}

export async function getModelPage(db: Knex, slug: string): Promise<ModelPage> {
  const loaded = await loadModel(db, slug);
  const [dropouts, recent, note, versions] = await Promise.all([
    breakdown(db, loaded.model.id, null, loaded.modelRow),
    repository.findRecentAccepted(db, { modelId: loaded.model.id }, RECENT_ON_MODEL_PAGE),
    repository.findPinnedNote(db, { modelId: loaded.model.id }),
    repository.findMethodVersions(db, { modelId: loaded.model.id }),
  ]);
  return {
    model: modelHeader(loaded.model),
    consensusFittedOn: loaded.consensusFit.fittedOn,
    consensusRefitPending: loaded.consensusFit.refitPending,
    methods: { current: METHOD_VERSION, versions },
    note,
    figures: loaded.figures,
    firmware: loaded.summaries,
    dropoutBreakdown: dropouts,
    recentSubmissions: recentOf(recent),
  };
}

export async function getFirmwarePage(db: Knex, slug: string, version: string): Promise<FirmwarePage> {
  const loaded = await loadModel(db, slug);
  const index = loaded.firmware.findIndex((f) => f.version === version);
  if (index < 0) throw new NotFoundError(`No firmware ${version} for this model.`);
  const firmwareId = loaded.firmware[index].id;
  const scope = loaded.statisticsOf(firmwareId);
  const [dropouts, submissions, note, versions] = await Promise.all([
    breakdown(db, loaded.model.id, firmwareId, scope),
    repository.findRecentAccepted(db, { modelId: loaded.model.id, firmwareId }, SUBMISSIONS_ON_FIRMWARE_PAGE),
    repository.findPinnedNote(db, { firmwareId }),
    repository.findMethodVersions(db, { modelId: loaded.model.id, firmwareId }),
  ]);
  return {
    model: modelHeader(loaded.model),
    consensusFittedOn: loaded.consensusFit.fittedOn,
    consensusRefitPending: loaded.consensusFit.refitPending,
    methods: { current: METHOD_VERSION, versions },
    firmware: loaded.summaries[index],
    note,
    dropoutBreakdown: dropouts,
    submissions: recentOf(submissions),
  };
}
