// Builds the demo world through the real pipeline: the catalogue through its
// repository, the people through the users service (each one able to sign in on
// the fake provider), every planned ride simulated into two FIT files, uploaded
// with createSubmission, analysed by the job's own handler, then decided by a
// moderator through the moderation service; then the riders' threads, the makers'
// answers and a moderator's pinned note through the threads and curation services.
import type { Knex } from 'knex';
import { createSubmissionInput, type CreateSubmissionInput } from '@shared/schemas/submission';
import { slugify, versionOrder } from '@shared/schemas/catalogue';
import { simulatePair } from '@shared/simulator/pair';
import { insertFirmware, insertMaker, insertModel, insertRecordingDevice } from '@server/features/catalogue/catalogue.repository';
import { createSubmission } from '@server/features/submissions/submissions.service';
import { analyseSubmission } from '@server/features/submissions/analyse-submission.job';
import { ensureDemoIdentity } from '@server/fakes/demo-identities';
import { decideSubmission } from '@server/features/moderation/moderation.service';
import { type Config, loadConfig } from '@server/config/env';
import { createObjectStore, type ObjectStore } from '@server/lib/object-store';
import type { SessionUser } from '@server/features/users/users.service';
import { planDemoWorld, type Outcome, type PlannedSide, type PlannedSubmission } from './plan';
import { seedBatteryLogs } from './batteries';
import { seedThreadsAndNotes } from './threads';
import { MAKERS, MODELS, RECORDING_DEVICES, RIDERS, STAFF } from './world';

export interface SeedDemoOptions {
  db: Knex;
  /** Unix seconds the ride dates count back from; default now. */
  now?: number;
  seed?: number;
  /** 1 = the full demo; tests use a small fraction. */
  scale?: number;
  log?: (line: string) => void;
  /** For the links in thread e-mails to followers; default: the environment's configuration. */
  config?: Config;
  /** Where the uploads' originals go; default: the configuration's object store. */
  store?: ObjectStore;
}

export interface SeedDemoReport {
  seeded: boolean;
  seconds: number;
  plan: PlannedSubmission[];
  /** Submission id per planned index. */
  submissionIds: number[];
  analysed: number;
  failed: number;
  decided: number;
  threads: number;
  posts: number;
  /** Batteries logged by the riders of models with a battery story. */
  batteries: number;
  /** Seconds spent in each step, to see where the time goes. */
  phases: {
    catalogue: number;
    people: number;
    simulate: number;
    upload: number;
    analyse: number;
    decide: number;
    threads: number;
    batteries: number;
  };
}

interface CatalogueIds {
  models: Map<string, number>;
  firmware: Map<string, number>;
  devices: Map<string, number>;
}

const DAY_MS = 86_400_000;
const PROGRESS_EVERY = 50;

/**
 * Seeds the demo world unless the database already has makers. Everything happens
 * in one transaction, so an interrupted seed leaves nothing and runs again next time.
 */
export async function seedDemoWorld(options: SeedDemoOptions): Promise<SeedDemoReport> {
  const started = performance.now();
  const log = options.log ?? (() => {});
  const now = options.now ?? Math.floor(Date.now() / 1000);
  const plan = planDemoWorld({ now, seed: options.seed, scale: options.scale });
  const phases = { catalogue: 0, people: 0, simulate: 0, upload: 0, analyse: 0, decide: 0, threads: 0, batteries: 0 };
  const report: SeedDemoReport = {
    seeded: false,
    seconds: 0,
    plan,
    submissionIds: [],
    analysed: 0,
    failed: 0,
    decided: 0,
    threads: 0,
    posts: 0,
    batteries: 0,
    phases,
  };
  const timed = async <T>(phase: keyof typeof phases, step: () => Promise<T>): Promise<T> => {
    const start = performance.now();
    try {
      return await step();
    } finally {
      phases[phase] += (performance.now() - start) / 1000;
    }
  };
  if (await options.db('makers').first('id')) {
    log('Demo world: the database already has makers, so it is left as it is.');
    return report;
  }

  const config = options.config ?? loadConfig();
  const store = options.store ?? createObjectStore(config);
  await options.db.transaction(async (trx) => {
    log(`Demo world: building ${MAKERS.length} makers, ${MODELS.length} models and ${plan.length} submissions through the real pipeline…`);
    const ids = await timed('catalogue', () => createCatalogue(trx, now));
    const people = await timed('people', () => createPeople(trx));
    for (const planned of plan) {
      const id = await uploadAndAnalyse({ db: trx, store }, planned, ids, people.get(planned.rider)!.id, timed);
      report.submissionIds.push(id);
      const { status } = await trx('submissions').where({ id }).first('status');
      if (status === 'failed') report.failed += 1;
      else report.analysed += 1;
      if ((planned.index + 1) % PROGRESS_EVERY === 0) log(`  ${planned.index + 1}/${plan.length} submissions analysed`);
    }
    report.decided = await timed('decide', () =>
      applyModerationDecisions(
        trx,
        plan.map((planned, i) => ({ submissionId: report.submissionIds[i], outcome: planned.outcome })),
        people,
      ),
    );
    const conversations = await timed('threads', () =>
      seedThreadsAndNotes({ db: trx, config, people, firmwareIds: ids.firmware, plan, submissionIds: report.submissionIds }),
    );
    report.threads = conversations.threads;
    report.posts = conversations.posts;
    report.batteries = await timed('batteries', () =>
      seedBatteryLogs(trx, {
        now,
        people,
        modelIds: ids.models,
        firmwareIds: ids.firmware,
        moderator: people.get('demo-moderator')!,
        seed: options.seed,
      }),
    );
  });
  report.seeded = true;
  report.seconds = (performance.now() - started) / 1000;
  log(
    `Demo world ready in ${report.seconds.toFixed(1)} s: ${report.analysed} submissions analysed` +
      (report.failed ? `, ${report.failed} failed` : '') +
      `, ${report.decided} decided, ${report.threads} threads with ${report.posts} posts, ${report.batteries} batteries logged` +
      ` (${Object.entries(phases)
        .map(([phase, seconds]) => `${phase} ${seconds.toFixed(1)} s`)
        .join(', ')}).`,
  );
  return report;
}

async function createCatalogue(db: Knex, now: number): Promise<CatalogueIds> {
  const makerIds = new Map<string, number>();
  for (const maker of MAKERS) makerIds.set(maker.slug, (await insertMaker(db, { ...maker, status: 'approved' })).id);
  const ids: CatalogueIds = { models: new Map(), firmware: new Map(), devices: new Map() };
  for (const model of MODELS) {
    const { id } = await insertModel(db, {
      makerId: makerIds.get(model.maker)!,
      slug: slugify(model.name),
      name: model.name,
      position: model.position,
      kind: model.kind,
      status: 'approved',
    });
    ids.models.set(model.name, id);
    for (const firmware of model.firmware) {
      const row = await insertFirmware(db, {
        modelId: id,
        version: firmware.version,
        versionOrder: versionOrder(firmware.version),
        releasedOn: new Date(now * 1000 - firmware.releasedDaysAgo * DAY_MS).toISOString().slice(0, 10),
        beta: firmware.beta ?? false,
        status: 'approved',
      });
      ids.firmware.set(`${model.name}@${firmware.version}`, row.id);
    }
  }
  for (const device of RECORDING_DEVICES) {
    ids.devices.set(
      device.name,
      (await insertRecordingDevice(db, { slug: slugify(device.name), name: device.name, kind: device.kind, status: 'approved' })).id,
    );
  }
  return ids;
}

/** Every demo person, by handle, as a signed-in user would be; each can sign in on the fake provider. */
async function createPeople(db: Knex): Promise<Map<string, SessionUser>> {
  const people = new Map<string, SessionUser>();
  for (const person of [...STAFF, ...RIDERS]) {
    people.set(
      person.handle,
      await ensureDemoIdentity(db, { handle: person.handle, name: person.name, roles: person.roles, makerSlug: person.makerSlug }),
    );
  }
  return people;
}

function tagsOf(side: PlannedSide, ids: CatalogueIds) {
  const model = MODELS.find((m) => m.name === side.model)!;
  const device = RECORDING_DEVICES.find((d) => d.name === side.device)!;
  return {
    modelId: ids.models.get(side.model)!,
    firmwareId: ids.firmware.get(`${side.model}@${side.firmware}`)!,
    position: model.position,
    recordingDeviceId: ids.devices.get(side.device)!,
    recordingDeviceFirmware: device.firmware,
    recordingMode: side.recordingMode,
    zeroOffset: side.zeroOffset,
    otherMetersOn: side.otherMetersOn,
  };
}

type Timed = <T>(phase: 'simulate' | 'upload' | 'analyse', step: () => Promise<T>) => Promise<T>;

async function uploadAndAnalyse(
  { db, store }: { db: Knex; store: ObjectStore },
  planned: PlannedSubmission,
  ids: CatalogueIds,
  riderId: number,
  timed: Timed,
): Promise<number> {
  const { pair, b } = await timed('simulate', async () => {
    const pair = simulatePair(planned.simulation);
    return { pair, b: planned.otherRide ? simulatePair(planned.otherRide).b : pair.b };
  });
  const input: CreateSubmissionInput = createSubmissionInput.parse({
    a: tagsOf(planned.a, ids),
    b: tagsOf(planned.b, ids),
    indoor: planned.indoor,
    surface: planned.surface,
    notes: planned.notes,
  });
  const name = `ride-${planned.index + 1}`;
  const { id } = await timed('upload', () =>
    createSubmission({ db, store }, riderId, input, {
      a: { buffer: Buffer.from(pair.a), originalName: `${name}-a.fit` },
      b: { buffer: Buffer.from(b), originalName: `${name}-b.fit` },
    }),
  );
  await timed('analyse', () => analyseSubmission(db, id));
  return id;
}

/**
 * The moderators' planned decisions, through the moderation service (statistics,
 * audit entry; no e-mail for the demo). Returns how many were decided.
 */
async function applyModerationDecisions(
  db: Knex,
  decisions: Array<{ submissionId: number; outcome: Outcome }>,
  people: Map<string, SessionUser>,
): Promise<number> {
  let decided = 0;
  for (const { submissionId, outcome } of decisions) {
    if (outcome.decision === 'pending') continue;
    const status = (await db('submissions').where({ id: submissionId }).first('status')).status;
    if (status !== 'awaiting_review') continue; // the engine refused it: nothing to decide
    const moderatorId = people.get(outcome.moderator)!.id;
    if (outcome.decision === 'accept') await decideSubmission(db, { submissionId, moderatorId, decision: 'accept' });
    else await decideSubmission(db, { submissionId, moderatorId, decision: 'reject', reason: outcome.reason, note: outcome.note });
    decided += 1;
  }
  return decided;
}
