import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { type Person, reply, startThread, write } from '../support/thread-factory';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let rider: Person;
let staff: Person;
let rivalStaff: Person;
let moderator: Person;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'pedal-rider' });
  staff = await signedInAgent(app, { handle: 'maker-engineer', makerSlug: catalogue.maker.slug });
  rivalStaff = await signedInAgent(app, { handle: 'rival-engineer', makerSlug: 'rival-cranks' });
  moderator = await signedInAgent(app, { handle: 'thread-moderator', roles: ['moderator'] });
});

async function threadWithReplies() {
  const { body } = await startThread(rider, catalogue.spider.slug);
  const staffReply = (await reply(staff, body.id, 'We can reproduce this and are working on it.')).body.id as number;
  const rivalReply = (await reply(rivalStaff, body.id, 'Our meters do not do this.')).body.id as number;
  const riderReply = (await reply(rider, body.id, 'Thanks for looking.')).body.id as number;
  return { threadId: body.id as number, staffReply, rivalReply, riderReply };
}

describe('the maker staff badge', () => {
  it("when staff of the model's maker reply, then the reply carries the maker's name; staff of another maker and riders get no badge", async () => {
    const { threadId, staffReply, rivalReply, riderReply } = await threadWithReplies();

    const { body: thread } = await request(app).get(`/api/threads/${threadId}`);

    const byId = (id: number) => thread.posts.find((p: { id: number }) => p.id === id);
    expect(byId(staffReply).staffOf).toEqual({ id: catalogue.maker.id, name: catalogue.maker.name });
    expect(byId(rivalReply).staffOf).toBeNull();
    expect(byId(riderReply).staffOf).toBeNull();
    expect(thread.makerResponded).toBe(true);
  });

  it('when staff of the maker open the thread, then they are told they may answer for the maker; staff of another maker are not', async () => {
    const { threadId } = await threadWithReplies();

    const own = await staff.agent.get(`/api/threads/${threadId}`);
    const rival = await rivalStaff.agent.get(`/api/threads/${threadId}`);

    expect(own.body.viewer.isMakerStaff).toBe(true);
    expect(rival.body.viewer.isMakerStaff).toBe(false);
  });
});

describe('the official response', () => {
  it("when the maker's staff mark their reply as official, then the thread shows it at the top", async () => {
    const { threadId, staffReply } = await threadWithReplies();

    const res = await write(staff, 'put', `/api/threads/${threadId}/official-response`, { postId: staffReply });

    expect(res.status).toBe(200);
    expect(res.body.officialResponse).toMatchObject({ id: staffReply, isOfficialResponse: true, staffOf: { name: catalogue.maker.name } });
    expect(res.body.hasOfficialResponse).toBe(true);
  });

  it('when another reply is marked official, then it replaces the first; withdrawing leaves none', async () => {
    const { threadId, staffReply } = await threadWithReplies();
    const second = (await reply(staff, threadId, 'Update: firmware 2.1.1 fixes this.')).body.id;
    await write(staff, 'put', `/api/threads/${threadId}/official-response`, { postId: staffReply });

    const replaced = await write(staff, 'put', `/api/threads/${threadId}/official-response`, { postId: second });
    const withdrawn = await write(staff, 'delete', `/api/threads/${threadId}/official-response`);

    expect(replaced.body.officialResponse.id).toBe(second);
    expect(await db('posts').where({ thread_id: threadId, is_official_response: true }).count()).toEqual([{ count: '0' }]);
    expect(withdrawn.body.officialResponse).toBeNull();
  });

  it.each([
    ['staff of another maker', () => rivalStaff, 403],
    ['a rider', () => rider, 403],
    ['a moderator', () => moderator, 403],
  ])('when %s tries to mark a staff reply official, then the answer is %i and nothing changes', async (_who, person, status) => {
    const { threadId, staffReply } = await threadWithReplies();

    const res = await write(person(), 'put', `/api/threads/${threadId}/official-response`, { postId: staffReply });

    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(/staff/);
    expect(await db('posts').where({ thread_id: threadId, is_official_response: true }).count()).toEqual([{ count: '0' }]);
  });

  it.each([
    ["a rider's reply", 'riderReply'],
    ["another maker's staff reply", 'rivalReply'],
  ] as const)('when staff try to make %s the official response, then the answer is 400', async (_what, which) => {
    const replies = await threadWithReplies();

    const res = await write(staff, 'put', `/api/threads/${replies.threadId}/official-response`, { postId: replies[which] });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.postId).toMatch(/staff of/);
  });
});

describe('the thread status', () => {
  it("when the maker's staff mark a thread fixed in a firmware version, then the thread and the model's summary show it", async () => {
    const { threadId } = await threadWithReplies();

    const res = await write(staff, 'put', `/api/threads/${threadId}/status`, {
      status: 'fixed',
      fixedInFirmwareId: catalogue.spiderFirmware.id,
    });

    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'fixed', fixedIn: { id: catalogue.spiderFirmware.id, version: '2.1.0' } });
    const summary = await request(app).get(`/api/models/${catalogue.spider.slug}/thread-summary`);
    expect(summary.body.threads).toContainEqual(
      expect.objectContaining({ id: threadId, status: 'fixed', fixedIn: { id: catalogue.spiderFirmware.id, version: '2.1.0' } }),
    );
  });

  it('when staff set investigating, then the open count still counts the thread', async () => {
    const { threadId } = await threadWithReplies();
    const before = (await request(app).get(`/api/models/${catalogue.spider.slug}/thread-summary`)).body.openCount;

    await write(staff, 'put', `/api/threads/${threadId}/status`, { status: 'investigating' });

    const after = await request(app).get(`/api/models/${catalogue.spider.slug}/thread-summary`);
    expect(after.body.openCount).toBe(before);
    expect(after.body.threads[0]).toMatchObject({ id: threadId, status: 'investigating' });
  });

  it.each([
    ['fixed without a firmware version', { status: 'fixed' }, 'fixedInFirmwareId'],
    ['fixed in firmware of another model', { status: 'fixed', fixedInFirmwareId: -5 }, 'fixedInFirmwareId'],
    ['an unknown status', { status: 'wontfix' }, 'status'],
  ])('when staff set %s, then the answer is 400', async (_what, body, field) => {
    const { threadId } = await threadWithReplies();

    const res = await write(staff, 'put', `/api/threads/${threadId}/status`, body);

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields).toHaveProperty(field);
  });

  it('when fixed names firmware of another model, then the answer is 400', async () => {
    const { threadId } = await threadWithReplies();

    const res = await write(staff, 'put', `/api/threads/${threadId}/status`, {
      status: 'fixed',
      fixedInFirmwareId: catalogue.pedalsFirmware.id,
    });

    expect(res.status).toBe(400);
  });

  it.each([
    ['staff of another maker', () => rivalStaff],
    ['a rider', () => rider],
    ['a moderator', () => moderator],
  ])('when %s tries to set the status, then the answer is 403 and the thread stays open', async (_who, person) => {
    const { threadId } = await threadWithReplies();

    const res = await write(person(), 'put', `/api/threads/${threadId}/status`, { status: 'acknowledged' });

    expect(res.status).toBe(403);
    expect((await db('threads').where({ id: threadId }).first()).status).toBe('open');
  });

  it('when a visitor tries to set the status, then the answer is 401', async () => {
    const { threadId } = await threadWithReplies();
    const anonymous = request.agent(app);
    const token = (await anonymous.get('/api/csrf-token')).body.token;

    const res = await anonymous.put(`/api/threads/${threadId}/status`).set('X-CSRF-Token', token).send({ status: 'acknowledged' });

    expect(res.status).toBe(401);
  });
});
