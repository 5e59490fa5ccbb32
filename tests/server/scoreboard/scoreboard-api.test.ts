import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { poissonRate, rateRatio } from '../../../shared/statistics/poisson';
import { welchTestFromSamples } from '../../../shared/statistics/welch';
import type { ModelPage, ScoreboardPage } from '../../../shared/schemas/statistics';
import { insertFirmware, insertModel } from '../../../server/features/catalogue/catalogue.repository';
import { versionOrder } from '../../../shared/schemas/catalogue';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { acceptSubmission, insertAnalysedSubmission, insertRider } from '../support/statistics-factory';
import { createTestContext } from '../support/test-app';

const { app, db } = await createTestContext();

let catalogue: TestCatalogue;
let newerFirmwareId: number;
let emptyModelSlug: string;

// Spider 2.1.0 reads +1, +2, +3 % against the pedals, spider 2.2.0 reads +4, +5, +6 %,
// one hour each, by three riders; 2.2.0 drops out 10 times in 3 h against 2 in 3 h.
beforeAll(async () => {
  catalogue = await createCatalogue(db);
  const newer = await insertFirmware(db, {
    modelId: catalogue.spider.id,
    version: '2.2.0',
    versionOrder: versionOrder('2.2.0'),
    releasedOn: '2026-05-01',
    status: 'approved',
  });
  newerFirmwareId = newer.id;
  const empty = await insertModel(db, {
    makerId: catalogue.maker.id,
    slug: `${catalogue.maker.slug}-quiet`,
    name: 'Quiet',
    position: 'left',
    kind: 'crank_arm',
    status: 'approved',
  });
  emptyModelSlug = empty.slug;
  const riders = [await insertRider(db), await insertRider(db), await insertRider(db)];
  const rides = [
    { firmwareId: catalogue.spiderFirmware.id, bias: 1, dropouts: 0, rider: 0, surface: 'smooth_road' as const },
    { firmwareId: catalogue.spiderFirmware.id, bias: 2, dropouts: 1, rider: 1, surface: 'smooth_road' as const },
    { firmwareId: catalogue.spiderFirmware.id, bias: 3, dropouts: 1, rider: 2, surface: 'gravel' as const },
    { firmwareId: newerFirmwareId, bias: 4, dropouts: 3, rider: 0, surface: 'gravel' as const },
    { firmwareId: newerFirmwareId, bias: 5, dropouts: 3, rider: 1, surface: 'gravel' as const },
    { firmwareId: newerFirmwareId, bias: 6, dropouts: 4, rider: 2, surface: 'smooth_road' as const },
  ];
  for (const ride of rides) {
    const id = await insertAnalysedSubmission(db, {
      riderId: riders[ride.rider],
      a: { modelId: catalogue.spider.id, firmwareId: ride.firmwareId, recordingDeviceId: catalogue.headUnit.id },
      b: {
        modelId: catalogue.pedals.id,
        firmwareId: catalogue.pedalsFirmware.id,
        recordingDeviceId: catalogue.headUnit.id,
        position: 'dual',
      },
      biasPercent: ride.bias,
      pedallingHours: 1,
      aPowerDropouts: ride.dropouts,
      surface: ride.surface,
    });
    await acceptSubmission(db, id);
  }
  // Awaiting review: must not count anywhere.
  await insertAnalysedSubmission(db, {
    riderId: riders[0],
    a: { modelId: catalogue.spider.id, firmwareId: catalogue.spiderFirmware.id, recordingDeviceId: catalogue.headUnit.id },
    b: { modelId: catalogue.pedals.id, firmwareId: catalogue.pedalsFirmware.id, recordingDeviceId: catalogue.headUnit.id },
    biasPercent: 40,
    pedallingHours: 3,
  });
});

const scoreboard = (query: Record<string, string | number> = {}) =>
  request(app)
    .get('/api/scoreboard')
    .query({ q: catalogue.maker.name, ...query });

describe('GET /api/scoreboard', () => {
  it('when models have accepted submissions, then their figures are the rider-level bias with a t interval and the rider-clustered dropout rate', async () => {
    // Act
    const res = await scoreboard({ sort: 'name', order: 'asc' });
    // Assert
    expect(res.status).toBe(200);
    const body = res.body as ScoreboardPage;
    expect(body.rows.map((r) => r.name)).toEqual(['Orbit', 'Quiet', 'Treadle']);
    const spider = body.rows[0];
    expect(spider.latestFirmware?.version).toBe('2.2.0');
    expect(spider.figures.evidence).toMatchObject({ submissionCount: 6, distinctRiders: 3, pedallingHours: 6, likeForLikeShare: 1 });
    // Three riders, two one-hour rides each (+1/+4, +2/+5, +3/+6 %): rider means 2.5, 3.5 and
    // 4.5 with equal weights, so mean 3.5, SD 1 between riders, df 2, t(0.975, 2) = 4.302653 (any t table).
    expect(spider.figures.bias).toMatchObject({ riders: 3, degreesOfFreedom: 2 });
    expect(spider.figures.bias!.meanPercent).toBeCloseTo(3.5, 10);
    expect(spider.figures.bias!.upperPercent - 3.5).toBeCloseTo(4.302653 / Math.sqrt(3), 5);
    // Dropouts 3, 4 and 5 in 2 h per rider: rate 2, residuals −1, 0, +1, so the clustered
    // Var(rate) = 3/2 · 2 / 6² = 1/12 and the log-scale SE √(1/12) / 2 (hand-computed). Its
    // upper bound 2·exp(4.302653·SE) is above the exact one; the lower bound stays the exact one.
    const rate = poissonRate(12, 6);
    expect(spider.figures.powerDropouts).toMatchObject({ events: 12, perHour: 2, method: 'rider_clustered' });
    expect(spider.figures.powerDropouts!.lower).toBeCloseTo(rate.lower, 10);
    expect(spider.figures.powerDropouts!.upper).toBeCloseTo(2 * Math.exp((4.302653 * Math.sqrt(1 / 12)) / 2), 5);
    expect(spider.figures.powerDropouts!.upper).toBeGreaterThan(rate.upper);
    expect(body.rows[1].figures).toMatchObject({ enough: false, bias: null, powerDropouts: null });
    // The pedals are judged against the spider: the inverse bias.
    expect(body.rows[2].figures.bias!.meanPercent).toBeLessThan(0);
  });

  it('when filtered by kind, position or evidence, then only matching models are listed', async () => {
    // Act
    const byKind = await scoreboard({ kind: 'pedal' });
    const byPosition = await scoreboard({ position: 'left' });
    const enough = await scoreboard({ evidence: 'enough' });
    const byMaker = await scoreboard({ maker: catalogue.maker.slug, q: '' });
    // Assert
    expect(byKind.body.rows.map((r: { name: string }) => r.name)).toEqual(['Treadle']);
    expect(byPosition.body.rows.map((r: { name: string }) => r.name)).toEqual(['Quiet']);
    expect(enough.body.total).toBe(2);
    expect(byMaker.body.total).toBe(3);
  });

  it('when sorted by bias ascending and paginated, then the pedals come first and the page holds one row', async () => {
    // Act
    const res = await scoreboard({ sort: 'bias', order: 'asc', pageSize: 1, page: 1 });
    // Assert
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 3, page: 1, pageSize: 1 });
    expect(res.body.rows.map((r: { name: string }) => r.name)).toEqual(['Treadle']);
  });

  it('when the query is invalid, then the answer is 400 with the field named', async () => {
    // Act
    const tooLarge = await request(app).get('/api/scoreboard?pageSize=1000');
    const badSort = await request(app).get('/api/scoreboard?sort=price');
    const badPosition = await request(app).get('/api/scoreboard?position=middle');
    // Assert
    for (const res of [tooLarge, badSort, badPosition]) {
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
    }
    expect(tooLarge.body.error.message).toMatch(/^pageSize:/);
    expect(badSort.body.error.message).toMatch(/^sort:/);
  });
});

describe('GET /api/models/:slug', () => {
  it('when a model has two firmware versions, then the newer is compared with its predecessor by rider-level tests, Holm-adjusted, with a verdict in words', async () => {
    // Act
    const res = await request(app).get(`/api/models/${catalogue.spider.slug}`);
    // Assert
    expect(res.status).toBe(200);
    const page = res.body as ModelPage;
    expect(page.model).toMatchObject({ name: 'Orbit', threadsPath: `/models/${catalogue.spider.slug}/threads`, hiddenReason: null });
    expect(page.firmware.map((f) => f.version)).toEqual(['2.1.0', '2.2.0']);
    const [older, newer] = page.firmware;
    // Three equal weights: mean 2, SD 1, df 2, t(0.975, 2) = 4.302653 (any t table).
    expect(older.figures.bias!.meanPercent).toBeCloseTo(2, 10);
    expect(older.figures.bias!.upperPercent).toBeCloseTo(2 + 4.302653 / Math.sqrt(3), 5);
    expect(older.figures.bias!.medianPercent).toBe(2);
    expect(older.againstPredecessor).toBeNull();
    const comparison = newer.againstPredecessor!;
    // Never below the exact conditional test's p-value (the riders differ: the clustered one is larger).
    const exactRatio = rateRatio(10, 3, 2, 3);
    expect(comparison.powerDropoutRatio!.ratio).toBeCloseTo(5, 10);
    expect(comparison.powerDropoutRatio!.method).toBe('rider_clustered');
    expect(comparison.powerDropoutRatio!.pValue).toBeGreaterThan(exactRatio.pValue);
    // One ride per rider and firmware, equal weights: the weighted Welch test is the ordinary one.
    const welch = welchTestFromSamples([4, 5, 6], [1, 2, 3])!;
    expect(comparison.biasDifference!.differencePercent).toBeCloseTo(3, 10);
    expect(comparison.biasDifference!.pValue).toBeCloseTo(welch.pValue, 8);
    expect(comparison.biasDifference!.degreesOfFreedom).toBeCloseTo(4, 8);
    // Holm over the page's two tests: the smaller p-value (the bias's, 0.021) doubled is below 5 %.
    expect(comparison.biasDifference!.adjustedPValue).toBeCloseTo(2 * welch.pValue, 8);
    expect(comparison.biasDifference!.verdict).toBe('worse');
    expect(comparison.powerDropoutRatio!.verdict).toBe('no_clear_difference');
    expect(comparison).toMatchObject({ verdict: 'worse', words: 'No clear change in power dropouts from 2.1.0; bias further from zero.' });
    expect(page.recentSubmissions).toHaveLength(6);
    expect(page.recentSubmissions[0].partner.modelName).toBe('Treadle');
  });

  it('when dropouts follow a surface, then the breakdown gives its rate ratio against the rest', async () => {
    // Act
    const page = (await request(app).get(`/api/models/${catalogue.spider.slug}`)).body as ModelPage;
    // Assert: gravel 7 events in 3 h, the rest (smooth road) 5 in 3 h.
    const gravel = page.dropoutBreakdown.find((row) => row.tag === 'surface' && row.value === 'gravel')!;
    expect(gravel.label).toBe('Surface: gravel');
    expect(gravel.powerDropouts!.perHour).toBeCloseTo(7 / 3, 10);
    expect(gravel.againstRest!.ratio).toBeCloseTo(7 / 5, 10);
    expect(gravel.againstRest!.pValue).toBeCloseTo(rateRatio(7, 3, 5, 3).pValue, 10);
    // Every ride was outdoors: there is no rest to compare with.
    const outdoors = page.dropoutBreakdown.find((row) => row.value === 'outdoor')!;
    expect(outdoors).toMatchObject({ submissionCount: 6, againstRest: null });
  });

  it('when the pedals have been compared like for like with two spider firmware versions, then their consensus offset is reported', async () => {
    // Act
    const page = (await request(app).get(`/api/models/${catalogue.pedals.slug}`)).body as ModelPage;
    // Assert
    expect(page.firmware[0].consensus).toMatchObject({ connectedTo: 2 });
  });

  it('when the model or firmware does not exist, then the answer is 404', async () => {
    expect((await request(app).get('/api/models/no-such-model')).status).toBe(404);
    expect((await request(app).get(`/api/models/${catalogue.spider.slug}/firmware/9.9`)).status).toBe(404);
  });

  it('when a firmware page is asked for, then it lists that firmware only', async () => {
    // Act
    const res = await request(app).get(`/api/models/${catalogue.spider.slug}/firmware/2.1.0`);
    // Assert
    expect(res.status).toBe(200);
    expect(res.body.firmware.version).toBe('2.1.0');
    expect(res.body.submissions).toHaveLength(3);
    expect(res.body.firmware.figures.evidence.submissionCount).toBe(3);
  });

  it('when a model has no accepted submission, then its page says not enough data', async () => {
    const res = await request(app).get(`/api/models/${emptyModelSlug}`);
    expect(res.status).toBe(200);
    expect(res.body.figures).toMatchObject({ enough: false, bias: null });
  });
});

describe('open data', () => {
  it('when the scoreboard CSV is downloaded, then it has a header, one row per model and the licence link', async () => {
    // Act
    const res = await request(app).get('/api/scoreboard.csv').query({ maker: catalogue.maker.slug });
    // Assert
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers.link).toContain('creativecommons.org/licenses/by/4.0');
    const lines = res.text.trim().split('\r\n');
    expect(lines[0].split(',')).toContain('bias_lower_95_percent');
    expect(lines).toHaveLength(4);
    expect(lines.find((line) => line.includes(',Orbit,'))).toContain(',6,3,6,1,true,3.5,');
  });

  it('when the submissions CSV is downloaded, then it lists accepted submissions only, without rider or notes', async () => {
    // Act
    const res = await request(app).get('/api/submissions.csv');
    // Assert
    expect(res.status).toBe(200);
    const lines = res.text.trim().split('\r\n');
    const header = lines[0].split(',');
    expect(header).toEqual(
      expect.arrayContaining(['submission_id', 'ride_month', 'bias_a_vs_b_percent', 'a_model_slug', 'b_power_dropouts']),
    );
    expect(header.some((column) => /rider|note|latitude|longitude|position_lat|handle|email|user/.test(column))).toBe(false);
    expect(lines).toHaveLength(7);
    expect(res.text).not.toContain('Test ride');
    expect(lines[1]).toContain('2026-06');
  });
});
