import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { FirmwarePage } from '../../../shared/schemas/statistics';
import { insertFirmware } from '../../../server/features/catalogue/catalogue.repository';
import { REFIT_CONSENSUS_QUEUE, requestConsensusRefit } from '../../../server/features/statistics/consensus-refit.job';
import { versionOrder } from '../../../shared/schemas/catalogue';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { acceptSubmission, insertAnalysedSubmission, insertRider } from '../support/statistics-factory';
import { createTestContext } from '../support/test-app';
import { waitFor } from '../../support/wait-for';

const { app, db, queue } = await createTestContext({ worker: true });

let catalogue: TestCatalogue;

// The pedals compared like for like with two spider firmware versions, three rides each:
// enough for a consensus offset of the pedals (connected to 2 others).
beforeAll(async () => {
  catalogue = await createCatalogue(db);
  const newer = await insertFirmware(db, {
    modelId: catalogue.spider.id,
    version: '2.2.0',
    versionOrder: versionOrder('2.2.0'),
    releasedOn: '2026-05-01',
    status: 'approved',
  });
  const riders = [await insertRider(db), await insertRider(db), await insertRider(db)];
  for (const [i, firmwareId] of [
    catalogue.spiderFirmware.id,
    catalogue.spiderFirmware.id,
    catalogue.spiderFirmware.id,
    newer.id,
    newer.id,
    newer.id,
  ].entries()) {
    const id = await insertAnalysedSubmission(db, {
      riderId: riders[i % 3]!,
      a: { modelId: catalogue.spider.id, firmwareId, recordingDeviceId: catalogue.headUnit.id },
      b: {
        modelId: catalogue.pedals.id,
        firmwareId: catalogue.pedalsFirmware.id,
        recordingDeviceId: catalogue.headUnit.id,
        position: 'dual',
      },
      biasPercent: 1 + i,
      pedallingHours: 1,
    });
    await acceptSubmission(db, id);
  }
});

const pedalsPage = async () =>
  (await request(app).get(`/api/models/${catalogue.pedals.slug}/firmware/${encodeURIComponent(catalogue.pedalsFirmware.version)}`))
    .body as FirmwarePage;

function refitJobs() {
  return db('pgboss.job').where({ name: REFIT_CONSENSUS_QUEUE }).select('state');
}

describe('the consensus refit as a job', () => {
  it('when a page is read after like-for-like decisions, then it answers with the last fit at once and a worker refits shortly after', async () => {
    const first = await pedalsPage();

    // Nothing was fitted yet: the reader got the last fit (none), not a refit on its request.
    expect(first).toMatchObject({ consensusFittedOn: null, consensusRefitPending: true });
    expect(first.firmware.consensus).toBeNull();
    const refitted = await waitFor(
      async () => {
        const page = await pedalsPage();
        return page.firmware.consensus ? page : undefined;
      },
      { what: 'the worker’s refit on the page' },
    );
    expect(refitted.firmware.consensus).toMatchObject({ connectedTo: 2 });
    // Public times are days (tests/server/privacy): today's, in UTC.
    expect(refitted).toMatchObject({ consensusFittedOn: new Date().toISOString().slice(0, 10), consensusRefitPending: false });
    expect(await db('statistics_state').where({ id: 1 }).first('consensus_stale')).toEqual({ consensus_stale: false });
  });

  it('when a refit is asked for several times within the debounce interval, then one job waits for them all', async () => {
    const before = (await refitJobs()).length;

    await requestConsensusRefit(queue!);
    await requestConsensusRefit(queue!);
    await requestConsensusRefit(queue!);

    const jobs = await refitJobs();
    expect(jobs).toHaveLength(before + 1);
    expect(jobs.filter((j) => j.state === 'created')).toHaveLength(1);
  });
});
