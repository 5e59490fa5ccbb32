import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { FirmwarePage, ModelPage, ScoreboardPage } from '../../../shared/schemas/statistics';
import { hideModel, pinNote } from '../../../server/features/moderation/curation.service';
import { createPageCache } from '../../../server/features/scoreboard/page-cache';
import { readStatisticsState } from '../../../server/features/statistics/statistics-state';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { acceptSubmission, insertAnalysedSubmission, insertRider, unacceptSubmission } from '../support/statistics-factory';
import { createTestContext } from '../support/test-app';

// The public pages are kept in memory between changes (page-cache.ts). Every change
// below is made straight through the services or the database, never through this
// app, so the app can only learn of it from the statistics version in the database,
// as it would from a decision taken in another server process.

const { app, db } = await createTestContext();

let catalogue: TestCatalogue;
let riders: number[];
let moderatorId: number;

async function acceptedRide(bias: number): Promise<number> {
  const id = await insertAnalysedSubmission(db, {
    riderId: riders[0],
    a: { modelId: catalogue.spider.id, firmwareId: catalogue.spiderFirmware.id, recordingDeviceId: catalogue.headUnit.id },
    b: {
      modelId: catalogue.pedals.id,
      firmwareId: catalogue.pedalsFirmware.id,
      recordingDeviceId: catalogue.headUnit.id,
      position: 'dual',
    },
    biasPercent: bias,
    pedallingHours: 1,
    likeForLike: 'mixed',
  });
  await acceptSubmission(db, id);
  return id;
}

const modelPage = async () => (await request(app).get(`/api/models/${catalogue.spider.slug}`).expect(200)).body as ModelPage;
const firmwarePage = async () =>
  (await request(app).get(`/api/models/${catalogue.spider.slug}/firmware/2.1.0`).expect(200)).body as FirmwarePage;
const spiderRow = async () =>
  (
    (await request(app).get('/api/scoreboard').query({ q: catalogue.maker.name, sort: 'name' }).expect(200)).body as ScoreboardPage
  ).rows.find((row) => row.slug === catalogue.spider.slug);

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  riders = [await insertRider(db), await insertRider(db), await insertRider(db)];
  moderatorId = await insertRider(db);
  for (const bias of [1, 2, 3]) await acceptedRide(bias);
});

describe('public statistics pages kept in memory', () => {
  it('when a decision accepts a submission after the pages were served, then the next scoreboard, model and firmware pages count it', async () => {
    // Arrange: serve each page once, so that it is kept.
    expect((await modelPage()).figures.evidence.submissionCount).toBe(3);
    expect((await firmwarePage()).submissions).toHaveLength(3);
    expect((await spiderRow())!.figures.evidence.submissionCount).toBe(3);
    // Act
    const id = await acceptedRide(10);
    // Assert
    const page = await modelPage();
    expect(page.figures.evidence.submissionCount).toBe(4);
    expect(page.recentSubmissions[0]).toMatchObject({ id, biasPercent: 10 });
    expect((await firmwarePage()).submissions).toHaveLength(4);
    expect((await spiderRow())!.figures.evidence.submissionCount).toBe(4);
    // And when it is withdrawn again, then it is gone at once.
    await unacceptSubmission(db, id);
    expect((await modelPage()).figures.evidence.submissionCount).toBe(3);
    expect((await spiderRow())!.figures.evidence.submissionCount).toBe(3);
  });

  it('when a moderator pins a note or hides the model, then the next pages show it', async () => {
    // Arrange
    await modelPage();
    expect(await spiderRow()).toBeDefined();
    // Act
    await pinNote(db, {
      subject: 'model',
      id: catalogue.spider.id,
      body: 'Firmware 2.1.0 needs a zero offset after each ride.',
      actorId: moderatorId,
    });
    await hideModel(db, { modelId: catalogue.spider.id, reason: 'Under review', actorId: moderatorId });
    // Assert
    const page = await modelPage();
    expect(page.note?.body).toBe('Firmware 2.1.0 needs a zero offset after each ride.');
    expect(page.model.hiddenReason).toBe('Under review');
    expect(await spiderRow()).toBeUndefined();
    // Cleanup for the other tests: shown again.
    await hideModel(db, { modelId: catalogue.spider.id, reason: null, actorId: moderatorId });
    expect(await spiderRow()).toBeDefined();
  });

  it('when the catalogue is changed by hand in the database, then the next page shows the new name', async () => {
    // Arrange
    await modelPage();
    // Act: no service at all, as a maintenance script would.
    await db('models').where({ id: catalogue.spider.id }).update({ name: 'Orbit Pro' });
    // Assert
    expect((await modelPage()).model.name).toBe('Orbit Pro');
  });

  it('when nothing changes between two requests, then the page is computed once and reading it changes no version', async () => {
    // Arrange
    const pages = createPageCache(db);
    let renders = 0;
    const render = async () => `page ${++renders}`;
    const before = await readStatisticsState(db);
    // Act
    const first = await pages.get('model orbit', render);
    const second = await pages.get('model orbit', render);
    const together = await Promise.all([pages.get('model treadle', render), pages.get('model treadle', render)]);
    // Assert
    expect(second).toBe(first);
    expect(first.body.toString()).toBe('page 1');
    expect(together[0]).toBe(together[1]);
    expect(renders).toBe(2);
    expect((await readStatisticsState(db)).version).toBe(before.version);
    // And when a decision commits, then the page is computed afresh.
    await acceptedRide(4);
    expect((await pages.get('model orbit', render)).body.toString()).toBe('page 3');
  });

  it('when the client already has the current page, then the answer is 304 without a body, and 200 again after a decision', async () => {
    // Arrange
    const first = await request(app).get(`/api/models/${catalogue.spider.slug}`).expect(200);
    const etag = first.headers.etag;
    // Act
    const again = await request(app).get(`/api/models/${catalogue.spider.slug}`).set('If-None-Match', etag);
    await acceptedRide(5);
    const afterDecision = await request(app).get(`/api/models/${catalogue.spider.slug}`).set('If-None-Match', etag);
    // Assert
    expect(first.headers['content-type']).toMatch(/^application\/json/);
    expect(again.status).toBe(304);
    expect(afterDecision.status).toBe(200);
    expect(afterDecision.headers.etag).not.toBe(etag);
  });

  it('when a transaction that wrote the statistics rolls back, then the version stays', async () => {
    // Arrange
    const before = await readStatisticsState(db);
    // Act
    await db
      .transaction(async (trx) => {
        await trx('models').where({ id: catalogue.spider.id }).update({ name: 'Never' });
        throw new Error('rolled back');
      })
      .catch(() => undefined);
    // Assert
    expect((await readStatisticsState(db)).version).toBe(before.version);
  });
});
