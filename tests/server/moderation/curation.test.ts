import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { insertFirmware, insertModel } from '../../../server/features/catalogue/catalogue.repository';
import { versionOrder } from '../../../shared/schemas/catalogue';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { submissionAwaitingReview } from './moderation-fixtures';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let moderator: Awaited<ReturnType<typeof signedInAgent>>;
let rider: Awaited<ReturnType<typeof signedInAgent>>;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  moderator = await signedInAgent(app, { handle: 'curator', roles: ['moderator'] });
  rider = await signedInAgent(app, { handle: 'proposing-rider' });
});

async function send(method: 'post' | 'put' | 'delete', path: string, body?: object, who = moderator) {
  return who.agent[method](`/api/moderation/catalogue${path}`)
    .set('X-CSRF-Token', await who.csrf())
    .send(body ?? {});
}

async function accepted(meta?: Record<string, unknown>) {
  const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue, { meta });
  const res = await moderator.agent
    .post(`/api/moderation/submissions/${id}/decision`)
    .set('X-CSRF-Token', await moderator.csrf())
    .send({ decision: 'accept', expectedVersion: version });
  expect(res.status).toBe(200);
  return id;
}

const countOf = async (modelId: number, firmwareId: number | null = null) =>
  (
    await db('meter_statistics')
      .where({ model_id: modelId })
      .modify((q) => (firmwareId === null ? q.whereNull('firmware_id') : q.where('firmware_id', firmwareId)))
      .first('submission_count')
  )?.submission_count ?? 0;

describe('catalogue curation', () => {
  it('when a moderator approves a proposed firmware, then everyone can use it and the audit records it', async () => {
    const proposed = await rider.agent
      .post('/api/catalogue/proposals')
      .set('X-CSRF-Token', await rider.csrf())
      .send({ type: 'firmware', modelId: catalogue.spider.id, version: '2.9' });
    expect(proposed.status).toBe(201);
    const pending = await moderator.agent.get('/api/moderation/catalogue/pending');
    expect(pending.body.firmware.map((f: { id: number }) => f.id)).toContain(proposed.body.entry.id);

    const res = await send('post', `/firmware/${proposed.body.entry.id}`, { action: 'approve' });

    expect(res.status).toBe(200);
    const anyone = await request(app).get('/api/catalogue');
    expect(anyone.body.firmware.find((f: { id: number }) => f.id === proposed.body.entry.id)?.status).toBe('approved');
    const audit = await db('audit_log')
      .where({ action: 'catalogue.approved', subject_type: 'firmware', subject_id: String(proposed.body.entry.id) })
      .first();
    expect(audit.before.status).toBe('pending');
    expect(audit.actor_id).toBe(moderator.user.id);
  });

  it('when a moderator rejects a proposed maker, then it is rejected with the reason audited', async () => {
    const proposed = await rider.agent
      .post('/api/catalogue/proposals')
      .set('X-CSRF-Token', await rider.csrf())
      .send({ type: 'maker', name: 'Spokesworth Typo' });

    const res = await send('post', `/maker/${proposed.body.entry.id}`, { action: 'reject', reason: 'A misspelling of an existing maker.' });

    expect(res.status).toBe(200);
    expect((await db('makers').where({ id: proposed.body.entry.id }).first('status')).status).toBe('rejected');
    expect(
      (
        await db('audit_log')
          .where({ action: 'catalogue.rejected', subject_id: String(proposed.body.entry.id) })
          .first()
      ).reason,
    ).toBe('A misspelling of an existing maker.');
  });

  it('when a moderator renames a model, then the old name still finds it', async () => {
    const model = await insertModel(db, {
      makerId: catalogue.maker.id,
      slug: `${catalogue.maker.slug}-rename-me`,
      name: 'Quil',
      position: 'left',
      kind: 'crank_arm',
      status: 'approved',
    });

    const res = await send('post', `/model/${model.id}`, { action: 'rename', name: 'Quill' });

    expect(res.status).toBe(200);
    const found = await request(app).get('/api/catalogue/aliases').query({ type: 'model', q: 'quil' });
    expect(found.status).toBe(200);
    expect(found.body).toMatchObject({ id: model.id, name: 'Quill' });
  });

  it('when two models are merged, then their submissions and statistics move and the old name finds the kept one', async () => {
    const twin = await insertModel(db, {
      makerId: catalogue.maker.id,
      slug: `${catalogue.maker.slug}-orbit-two`,
      name: 'Orbit II',
      position: 'total',
      kind: 'spider',
      status: 'approved',
    });
    const twinSame = await insertFirmware(db, {
      modelId: twin.id,
      version: '2.1.0',
      versionOrder: versionOrder('2.1.0'),
      status: 'approved',
    });
    const twinOnly = await insertFirmware(db, {
      modelId: twin.id,
      version: '2.0.5',
      versionOrder: versionOrder('2.0.5'),
      status: 'approved',
    });
    const tags = (firmwareId: number) => ({
      a: {
        modelId: twin.id,
        firmwareId,
        position: 'total',
        recordingDeviceId: catalogue.headUnit.id,
        recordingMode: 'every_second',
        zeroOffset: 'yes',
        otherMetersOn: false,
      },
    });
    const first = await accepted(tags(twinSame.id));
    const second = await accepted(tags(twinOnly.id));
    const keptBefore = await countOf(catalogue.spider.id);
    expect(await countOf(twin.id)).toBe(2);

    const res = await send('post', `/model/${twin.id}/merge`, {
      intoId: catalogue.spider.id,
      reason: 'Orbit II is the same spider under a shop name.',
    });

    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ movedAcceptedSubmissions: 2, movedRecordings: 2 });
    expect(await countOf(twin.id)).toBe(0);
    expect(await countOf(catalogue.spider.id)).toBe(keptBefore + 2);
    expect(await countOf(catalogue.spider.id, catalogue.spiderFirmware.id)).toBeGreaterThanOrEqual(1);
    expect(await countOf(catalogue.spider.id, twinOnly.id)).toBe(1); // the version only the twin had moves with it
    const recordings = await db('submission_recordings')
      .whereIn('submission_id', [first, second])
      .where({ side: 'a' })
      .select('model_id', 'firmware_id');
    expect(recordings).toEqual(
      expect.arrayContaining([
        { model_id: catalogue.spider.id, firmware_id: catalogue.spiderFirmware.id },
        { model_id: catalogue.spider.id, firmware_id: twinOnly.id },
      ]),
    );
    expect(await db('models').where({ id: twin.id }).first('status', 'merged_into_id')).toEqual({
      status: 'merged',
      merged_into_id: catalogue.spider.id,
    });
    const found = await request(app).get('/api/catalogue/aliases').query({ type: 'model', q: 'Orbit II' });
    expect(found.body.id).toBe(catalogue.spider.id);
    const audit = await db('audit_log')
      .where({ action: 'catalogue.merged', subject_id: String(twin.id) })
      .first();
    expect(audit.reason).toBe('Orbit II is the same spider under a shop name.');
  });

  it('when a merged model is changed again, then it is a 409 pointing to the kept entry', async () => {
    const gone = await insertModel(db, {
      makerId: catalogue.maker.id,
      slug: `${catalogue.maker.slug}-gone`,
      name: 'Gone',
      position: 'dual',
      kind: 'pedal',
      status: 'approved',
    });
    await send('post', `/model/${gone.id}/merge`, { intoId: catalogue.pedals.id, reason: 'Duplicate entry.' });

    const res = await send('post', `/model/${gone.id}`, { action: 'approve' });

    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/merged into another entry/);
  });

  it('when a moderator pins a note to a firmware and hides a model with a reason, then both are stored and audited', async () => {
    const note = await send('put', `/firmware/${catalogue.pedalsFirmware.id}/note`, { body: 'Firmware 4.0.2 withdrawn by the maker.' });
    const hidden = await send('put', `/model/${catalogue.pedals.id}/hidden`, { reason: 'Sold only as a prototype.' });

    expect(note.status).toBe(200);
    expect(hidden.status).toBe(200);
    expect((await db('moderator_notes').where({ firmware_id: catalogue.pedalsFirmware.id }).first('body')).body).toBe(
      'Firmware 4.0.2 withdrawn by the maker.',
    );
    expect((await db('models').where({ id: catalogue.pedals.id }).first('hidden_reason')).hidden_reason).toBe('Sold only as a prototype.');
    expect(await db('audit_log').whereIn('action', ['firmware.note_pinned', 'model.hidden'])).toHaveLength(2);

    const shown = await send('delete', `/model/${catalogue.pedals.id}/hidden`);
    expect(shown.status).toBe(200);
    expect((await db('models').where({ id: catalogue.pedals.id }).first('hidden_reason')).hidden_reason).toBeNull();
  });

  it('when a moderator who is staff of a maker tries to curate, then it is refused', async () => {
    const staff = await signedInAgent(app, { handle: 'curating-staff', roles: ['moderator'], makerSlug: catalogue.maker.slug });

    const res = await send('put', `/model/${catalogue.spider.id}/hidden`, { reason: 'Hide our rival.' }, staff);

    expect(res.status).toBe(403);
  });

  it('when the note is empty or the type unknown, then it is a 400 on the field', async () => {
    const empty = await send('put', `/model/${catalogue.spider.id}/note`, { body: '   ' });
    const unknown = await send('post', `/saddle/1`, { action: 'approve' });

    expect(empty.status).toBe(400);
    expect(empty.body.error.details.fields.body).toBe('write the note');
    expect(unknown.status).toBe(400);
  });
});
