import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { MIN_BATTERIES } from '@shared/statistics/battery-life';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { insertAcceptedSubmission, type Person, write } from '../support/thread-factory';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let rider: Person;
let otherRider: Person;
let moderator: Person;
let staff: Person;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'battery-rider' });
  otherRider = await signedInAgent(app, { handle: 'battery-other' });
  moderator = await signedInAgent(app, { handle: 'battery-moderator', roles: ['moderator'] });
  staff = await signedInAgent(app, { handle: 'battery-staff', roles: ['moderator'], makerSlug: catalogue.maker.slug });
});

async function addSpiderMeter(person: Person, nickname: string) {
  const res = await write(person, 'post', '/api/me/meters', {
    modelId: catalogue.spider.id,
    position: 'total',
    nickname,
    batteryType: 'coin_cell',
  });
  expect(res.status).toBe(201);
  return res.body.id as number;
}

async function logEvent(person: Person, meterId: number, occurredOn: string, previousEnded: string) {
  return write(person, 'post', `/api/me/meters/${meterId}/battery-events`, {
    occurredOn,
    kind: 'changed',
    previousEnded,
    firmwareId: catalogue.spiderFirmware.id,
  });
}

const count = async (table: string) => Number((await db(table).count<{ count: string }[]>({ count: '*' }))[0]!.count);

describe('a rider logs batteries', () => {
  it('when a rider logs changes and riding, then each battery counts the submitted rides and the hand-added hours of its days', async () => {
    const meterId = await addSpiderMeter(rider, 'Gravel bike spider');
    expect((await logEvent(rider, meterId, '2026-01-01', 'first_battery')).status).toBe(201);
    expect((await logEvent(rider, meterId, '2026-07-01', 'ran_flat')).status).toBe(201);
    // A one-hour ride on 1 June 2026 (the factory's ride) and ten hours added by hand in February.
    await insertAcceptedSubmission(db, catalogue, { riderId: rider.user.id });
    expect((await write(rider, 'post', `/api/me/meters/${meterId}/riding`, { riddenOn: '2026-02-01', hours: 10 })).status).toBe(201);

    const { body } = await rider.agent.get('/api/me/meters');

    const meter = body.meters.find((m: { id: number }) => m.id === meterId);
    expect(meter.ridesAttributed).toBe(true);
    expect(meter.batteries).toEqual([
      { fromDay: '2026-01-01', toDay: '2026-07-01', firmwareVersion: '2.1.0', submittedHours: 1, selfReportedHours: 10, ended: true },
      { fromDay: '2026-07-01', toDay: null, firmwareVersion: '2.1.0', submittedHours: 0, selfReportedHours: 0, ended: false },
    ]);
  });

  it('when a rider has two meters of one model and position, then rides are not counted for either (they cannot be told apart)', async () => {
    const person = await signedInAgent(app, { handle: 'two-spiders' });
    const first = await addSpiderMeter(person, 'Road spider');
    await addSpiderMeter(person, 'Winter spider');
    await logEvent(person, first, '2026-01-01', 'first_battery');
    await insertAcceptedSubmission(db, catalogue, { riderId: person.user.id });

    const { body } = await person.agent.get('/api/me/meters');

    expect(body.meters.map((m: { ridesAttributed: boolean }) => m.ridesAttributed)).toEqual([false, false]);
    expect(body.meters[0].batteries[0].submittedHours).toBe(0);
  });

  it("when someone touches another rider's meter, then it is answered as missing and nothing changes", async () => {
    const meterId = await addSpiderMeter(rider, 'Spare spider');
    const before = await count('battery_events');

    const res = await logEvent(otherRider, meterId, '2026-03-01', 'first_battery');
    const removal = await write(otherRider, 'delete', `/api/me/meters/${meterId}`);

    expect(res.status).toBe(404);
    expect(removal.status).toBe(404);
    expect(await count('battery_events')).toBe(before);
    expect(await db('rider_meters').where({ id: meterId }).first()).toBeDefined();
  });

  it.each([
    ['a day in the future', { occurredOn: '2999-01-01' }, 'occurredOn: not a day in the future'],
    ['a malformed day', { occurredOn: '1 March' }, 'occurredOn'],
    ['an unknown reason', { previousEnded: 'exploded' }, 'previousEnded: say why the battery before came out'],
    ['a firmware of another model', { firmwareId: -1 }, 'firmwareId'],
  ])('when the event has %s, then it is refused with a message and nothing is written', async (_label, change, message) => {
    const meterId = await addSpiderMeter(rider, `Refusals ${Math.random()}`);
    const before = await count('battery_events');
    const payload = {
      occurredOn: '2026-03-01',
      kind: 'changed',
      previousEnded: 'first_battery',
      firmwareId: catalogue.spiderFirmware.id,
      ...change,
    };

    const res = await write(rider, 'post', `/api/me/meters/${meterId}/battery-events`, payload);

    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain(message);
    expect(await count('battery_events')).toBe(before);
  });

  it("when the firmware is another model's, then it is refused as not this model's", async () => {
    const meterId = await addSpiderMeter(rider, 'Firmware check');
    const res = await write(rider, 'post', `/api/me/meters/${meterId}/battery-events`, {
      occurredOn: '2026-03-01',
      kind: 'changed',
      previousEnded: 'first_battery',
      firmwareId: catalogue.pedalsFirmware.id,
    });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('firmwareId: not a firmware of this model');
  });

  it('when hand-added riding is over 1000 hours or the name has a line break, then it is refused', async () => {
    const meterId = await addSpiderMeter(rider, 'Hours check');
    const hours = await write(rider, 'post', `/api/me/meters/${meterId}/riding`, { riddenOn: '2026-02-01', hours: 1001 });
    const name = await write(rider, 'post', '/api/me/meters', {
      modelId: catalogue.spider.id,
      position: 'total',
      nickname: 'Bad\r\nBcc: x',
      batteryType: 'coin_cell',
    });
    expect(hours.status).toBe(400);
    expect(name.status).toBe(400);
    expect(await db('self_reported_riding').where({ rider_meter_id: meterId }).first()).toBeUndefined();
  });

  it('when a visitor asks for meters or writes, then they must sign in', async () => {
    expect((await request(app).get('/api/me/meters')).status).toBe(401);
  });
});

describe("the maker's claim", () => {
  it('when a moderator enters a claim with its source, then the model page shows it and the audit log has it', async () => {
    const res = await write(moderator, 'put', `/api/moderation/models/${catalogue.spider.id}/battery-claim`, {
      hours: 800,
      source: "Maker's manual, section 3",
    });

    const conditions = await request(app).get(`/api/models/${catalogue.spider.slug}/conditions`);

    expect(res.status).toBe(200);
    expect(conditions.body.claim).toEqual({ hours: 800, source: "Maker's manual, section 3" });
    const audit = await db('audit_log')
      .where({ action: 'model.battery_claim_set', subject_id: String(catalogue.spider.id) })
      .first();
    expect(audit.after).toEqual({ hours: 800, source: "Maker's manual, section 3" });
  });

  it("when the claim has no source, or a maker's staff member enters it, or a rider does, then it is refused", async () => {
    const url = `/api/moderation/models/${catalogue.spider.id}/battery-claim`;
    expect((await write(moderator, 'put', url, { hours: 500, source: null })).status).toBe(400);
    expect((await write(staff, 'put', url, { hours: 100, source: 'Our own lab' })).status).toBe(403);
    expect((await write(rider, 'put', url, { hours: 100, source: 'A forum' })).status).toBe(403);
    expect((await db('models').where({ id: catalogue.spider.id }).first()).battery_claim_hours).not.toBe(100);
  });
});

describe("a model's battery life", () => {
  it('when enough riders log batteries that ran flat, then the model page gives a median with an interval, counted per rider', async () => {
    const local = await createCatalogue(db);
    // Five riders, one flat battery each after 1, 2, 3, 4 and 5 hours of hand-added riding, and the next one still running.
    for (let r = 1; r <= MIN_BATTERIES; r++) {
      const person = await signedInAgent(app, { handle: `life-rider-${r}` });
      const meter = await write(person, 'post', '/api/me/meters', {
        modelId: local.spider.id,
        position: 'total',
        nickname: 'Spider',
        batteryType: 'coin_cell',
      });
      const meterId = meter.body.id as number;
      const event = (occurredOn: string, previousEnded: string) =>
        write(person, 'post', `/api/me/meters/${meterId}/battery-events`, {
          occurredOn,
          kind: 'changed',
          previousEnded,
          firmwareId: local.spiderFirmware.id,
        });
      await event('2026-01-01', 'first_battery');
      await write(person, 'post', `/api/me/meters/${meterId}/riding`, { riddenOn: '2026-01-02', hours: r * 100 });
      await event('2026-04-01', 'ran_flat');
    }

    const { body, status } = await request(app).get(`/api/models/${local.spider.slug}/conditions`);

    expect(status).toBe(200);
    // Kaplan–Meier on 100, 200, 300, 400, 500 (all ended) plus five still running at 0 h (not counted):
    // S drops to 0.4 at 300 h, so the median is 300 h (R: survfit(Surv(c(100,200,300,400,500), rep(1,5))) median 300).
    expect(body.batteryLife).toMatchObject({ enough: true, batteries: 5, riders: 5, ranFlat: 5, medianHours: 300 });
    expect(body.batteryLife.lowerHours).toBeLessThanOrEqual(300);
    expect(body.firmware[0].life.medianHours).toBe(300);
  });

  it('when a model has no logged batteries, then it says not enough with the minimums', async () => {
    const local = await createCatalogue(db);
    const { body } = await request(app).get(`/api/models/${local.pedals.slug}/conditions`);
    expect(body.batteryLife).toMatchObject({ enough: false, batteries: 0, medianHours: null });
    expect(body.minimums.batteries).toBe(MIN_BATTERIES);
    expect((await request(app).get('/api/models/no-such-model/conditions')).status).toBe(404);
  });
});
