import { beforeAll, describe, expect, it } from 'vitest';
import { recomputeAllAggregates } from '../../../server/features/statistics/aggregates';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import {
  acceptSubmission,
  expectSameFigures,
  insertAnalysedSubmission,
  insertRider,
  statisticsSnapshot as snapshot,
  unacceptSubmission,
  type AnalysedSubmission,
} from '../support/statistics-factory';
import { createTestContext } from '../support/test-app';

const { db } = await createTestContext();

let catalogue: TestCatalogue;
let riders: number[];

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  riders = [await insertRider(db), await insertRider(db), await insertRider(db)];
});

function spiderAgainstPedals(overrides: Partial<AnalysedSubmission>): AnalysedSubmission {
  return {
    riderId: riders[0],
    a: { modelId: catalogue.spider.id, firmwareId: catalogue.spiderFirmware.id, recordingDeviceId: catalogue.headUnit.id },
    b: {
      modelId: catalogue.pedals.id,
      firmwareId: catalogue.pedalsFirmware.id,
      recordingDeviceId: catalogue.headUnit.id,
      position: 'dual',
    },
    biasPercent: 0,
    pedallingHours: 1,
    ...overrides,
  };
}

const scope = (modelId: number, firmwareId: number | null) =>
  db('meter_statistics')
    .where({ model_id: modelId })
    .andWhere((q) => (firmwareId === null ? q.whereNull('firmware_id') : q.where('firmware_id', firmwareId)))
    .first();

describe('aggregates of accepted submissions', () => {
  it('when three riders have accepted submissions, then the sums are the hand-computed ones for both sides', async () => {
    // Arrange
    const ids = [
      await insertAnalysedSubmission(
        db,
        spiderAgainstPedals({ riderId: riders[0], biasPercent: 2, pedallingHours: 1, aPowerDropouts: 1, cadenceLagSeconds: 1 }),
      ),
      await insertAnalysedSubmission(
        db,
        spiderAgainstPedals({ riderId: riders[1], biasPercent: 4, pedallingHours: 2, cadenceLagSeconds: 2 }),
      ),
      await insertAnalysedSubmission(
        db,
        spiderAgainstPedals({
          riderId: riders[2],
          biasPercent: 3,
          pedallingHours: 6,
          aPowerDropouts: 2,
          bPowerDropouts: 5,
          surface: 'rough_road',
          cadenceLagSeconds: 4,
        }),
      ),
    ];
    // Act
    for (const id of ids) await acceptSubmission(db, id);
    // Assert: side A (the spider). Weights 1, 2 and 4 (6 h capped at 4 h).
    const spider = await scope(catalogue.spider.id, catalogue.spiderFirmware.id);
    expect(spider).toMatchObject({
      submission_count: 3,
      distinct_riders: 3,
      like_for_like_count: 3,
      power_dropouts: 3,
      median_cadence_lag_seconds: 2,
    });
    expect(spider.pedalling_hours).toBeCloseTo(9, 9);
    expect(spider.sum_weight).toBeCloseTo(7, 9);
    expect(spider.sum_weighted_bias).toBeCloseTo(1 * 2 + 2 * 4 + 4 * 3, 9);
    // Side B (the pedals) is judged against the spider: bias inverted, its own dropouts, lag negated.
    const pedals = await scope(catalogue.pedals.id, catalogue.pedalsFirmware.id);
    expect(pedals).toMatchObject({ submission_count: 3, power_dropouts: 5, median_cadence_lag_seconds: -2 });
    expect(pedals.sum_weighted_bias).toBeCloseTo(1 * 100 * (1 / 1.02 - 1) + 2 * 100 * (1 / 1.04 - 1) + 4 * 100 * (1 / 1.03 - 1), 9);
    // The model scope over all firmware holds the same as its only firmware.
    const spiderModel = await scope(catalogue.spider.id, null);
    expect(spiderModel.sum_weighted_bias).toBeCloseTo(spider.sum_weighted_bias, 9);
    const rough = await db('dropout_tag_statistics')
      .where({ model_id: catalogue.spider.id, firmware_id: catalogue.spiderFirmware.id, tag: 'surface', value: 'rough_road' })
      .first();
    expect(rough).toMatchObject({ submission_count: 1, power_dropouts: 2 });
    expect(rough.pedalling_hours).toBeCloseTo(6, 9);
  });

  it('when submissions are accepted and some later removed, then the tables equal a full recompute', async () => {
    // Arrange: a second firmware, a rider with two submissions, one removal of a rider's only submission.
    const added = [
      await insertAnalysedSubmission(
        db,
        spiderAgainstPedals({ riderId: riders[0], biasPercent: -1.5, pedallingHours: 0.75, likeForLike: 'mixed', aCadenceDropouts: 3 }),
      ),
      await insertAnalysedSubmission(
        db,
        spiderAgainstPedals({
          riderId: riders[1],
          biasPercent: 5.25,
          pedallingHours: 4.5,
          indoor: true,
          surface: 'trainer',
          cadenceLagSeconds: null,
        }),
      ),
      await insertAnalysedSubmission(
        db,
        spiderAgainstPedals({
          riderId: await insertRider(db),
          biasPercent: 0.4,
          pedallingHours: 1.2,
          sprints: [{ percent: 3, aSecondsTo80Percent: 2, bSecondsTo80Percent: 3 }],
        }),
      ),
    ];
    for (const id of added) await acceptSubmission(db, id);
    // Act
    await unacceptSubmission(db, added[2]);
    await unacceptSubmission(db, added[0]);
    const incremental = await snapshot(db);
    await recomputeAllAggregates(db);
    const recomputed = await snapshot(db);
    // Assert
    expect(incremental.statistics.length).toBe(4);
    expectSameFigures(incremental, recomputed);
  });

  it('when a mixed comparison is accepted, then it adds its dropouts and hours but no bias, to the rides and to its rider', async () => {
    // Arrange
    const firmware = await db('firmware_versions')
      .insert({ model_id: catalogue.spider.id, version: '2.3.0', version_order: [2, 3, 0], status: 'approved' })
      .returning('id');
    const a = { modelId: catalogue.spider.id, firmwareId: firmware[0].id, recordingDeviceId: catalogue.headUnit.id };
    const direct = await insertAnalysedSubmission(
      db,
      spiderAgainstPedals({ a, riderId: riders[0], biasPercent: 1, pedallingHours: 2, aPowerDropouts: 1 }),
    );
    const mixed = await insertAnalysedSubmission(
      db,
      spiderAgainstPedals({ a, riderId: riders[0], biasPercent: 6, pedallingHours: 1, aPowerDropouts: 2, likeForLike: 'mixed' }),
    );
    // Act
    await acceptSubmission(db, direct);
    await acceptSubmission(db, mixed);
    // Assert: one rider, mean bias +1 % from the direct ride alone; 3 dropouts in 3 h.
    const row = await scope(catalogue.spider.id, firmware[0].id);
    expect(row).toMatchObject({ submission_count: 2, bias_count: 1, power_dropouts: 3, rider_count: 1, rider_bias_count: 1 });
    expect(row.rider_sum_weighted_bias / row.rider_sum_weight).toBeCloseTo(1, 12);
    expect(row.rider_sum_hours_squared).toBeCloseTo(9, 9);
    expect(row.rider_sum_power_dropouts_hours).toBeCloseTo(9, 9);
    const rider = await db('meter_statistics_riders').where({ firmware_id: firmware[0].id, rider_id: riders[0] }).first();
    expect(rider).toMatchObject({ contribution_count: 2, bias_count: 1, power_dropouts: 3 });
  });

  it('when the only submission of a scope is removed, then its rows disappear', async () => {
    // Arrange
    const otherFirmware = await db('firmware_versions')
      .insert({ model_id: catalogue.spider.id, version: '2.2.0', version_order: [2, 2, 0], status: 'approved' })
      .returning('id');
    const id = await insertAnalysedSubmission(
      db,
      spiderAgainstPedals({
        a: { modelId: catalogue.spider.id, firmwareId: otherFirmware[0].id, recordingDeviceId: catalogue.headUnit.id },
      }),
    );
    await acceptSubmission(db, id);
    expect(await scope(catalogue.spider.id, otherFirmware[0].id)).toBeDefined();
    // Act
    await unacceptSubmission(db, id);
    // Assert
    expect(await scope(catalogue.spider.id, otherFirmware[0].id)).toBeUndefined();
    expect(await db('meter_statistics_riders').where({ firmware_id: otherFirmware[0].id })).toEqual([]);
  });
});
