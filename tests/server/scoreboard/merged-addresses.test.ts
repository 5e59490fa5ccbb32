import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { insertFirmware, insertModel } from '../../../server/features/catalogue/catalogue.repository';
import { mergeEntries } from '../../../server/features/moderation/curation.service';
import { versionOrder } from '../../../shared/schemas/catalogue';
import { createCatalogue } from '../support/catalogue-factory';
import { insertRider } from '../support/statistics-factory';
import { createTestContext } from '../support/test-app';

// A merge keeps the old name as an alias that still finds the entry (issue 7):
// the old page address leads to the page of the entry it became.

const { app, db } = await createTestContext();

describe('old addresses of merged catalogue entries', () => {
  it('when a model was merged into another, then its old page address redirects to the kept model', async () => {
    const catalogue = await createCatalogue(db);
    const moderatorId = await insertRider(db);
    const twin = await insertModel(db, {
      makerId: catalogue.maker.id,
      slug: `${catalogue.spider.slug}-twin`,
      name: 'Orbit Twin',
      position: 'total',
      kind: 'spider',
      status: 'approved',
    });
    await mergeEntries(db, {
      type: 'model',
      fromId: twin.id,
      intoId: catalogue.spider.id,
      actorId: moderatorId,
      reason: 'same spider, listed twice',
    });

    const res = await request(app).get(`/api/models/${twin.slug}`);

    expect(res.status).toBe(308);
    expect(res.headers.location).toBe(`/api/models/${catalogue.spider.slug}`);
    const followed = await request(app).get(res.headers.location);
    expect(followed.status).toBe(200);
    expect(followed.body.model.slug).toBe(catalogue.spider.slug);
  });

  it('when a firmware version was merged into another, then its old page address redirects to the kept version', async () => {
    const catalogue = await createCatalogue(db);
    const moderatorId = await insertRider(db);
    const typo = await insertFirmware(db, {
      modelId: catalogue.spider.id,
      version: '2.1',
      versionOrder: versionOrder('2.1'),
      status: 'approved',
    });
    await mergeEntries(db, {
      type: 'firmware',
      fromId: typo.id,
      intoId: catalogue.spiderFirmware.id,
      actorId: moderatorId,
      reason: 'the same release',
    });

    const res = await request(app).get(`/api/models/${catalogue.spider.slug}/firmware/2.1`);

    expect(res.status).toBe(308);
    expect(res.headers.location).toBe(`/api/models/${catalogue.spider.slug}/firmware/2.1.0`);
  });

  it('when a model never existed, then the answer is still 404', async () => {
    const res = await request(app).get('/api/models/no-such-model');

    expect(res.status).toBe(404);
  });
});
