import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { type Person, reply, startThread, write } from '../support/thread-factory';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let otherCatalogue: TestCatalogue;
let rider: Person;
let staff: Person;
let moderator: Person;
let staffModerator: Person;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  otherCatalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'report-rider' });
  staff = await signedInAgent(app, { handle: 'maker-rep', makerSlug: catalogue.maker.slug });
  moderator = await signedInAgent(app, { handle: 'fair-moderator', roles: ['moderator'] });
  staffModerator = await signedInAgent(app, { handle: 'conflicted-moderator', roles: ['moderator'], makerSlug: catalogue.maker.slug });
});

async function auditOf(subjectType: string, subjectId: number) {
  return db('audit_log')
    .where({ subject_type: subjectType, subject_id: String(subjectId) })
    .orderBy('id');
}

describe('hiding a post', () => {
  it('when a moderator hides a post with a reason, then everyone else sees the reason in its place and the action is audited', async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);
    const postId = (await reply(rider, thread.id, 'Buy cheap meters at a shady shop')).body.id;

    const res = await write(moderator, 'put', `/api/posts/${postId}/visibility`, { hidden: true, reason: 'Advertising' });

    expect(res.status).toBe(200);
    const seen = await request(app).get(`/api/threads/${thread.id}`);
    const post = seen.body.posts.find((p: { id: number }) => p.id === postId);
    expect(post).toMatchObject({ bodyHtml: null, hidden: { reason: 'Advertising' } });
    expect(JSON.stringify(seen.body)).not.toContain('shady shop');
    const [entry] = await auditOf('post', postId);
    expect(entry).toMatchObject({ action: 'post.hidden', actor_id: moderator.user.id, reason: 'Advertising' });
  });

  it('when a moderator shows the post again, then its text is back and that is audited too', async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);
    const postId = (await reply(rider, thread.id, 'A borderline remark')).body.id;
    await write(moderator, 'put', `/api/posts/${postId}/visibility`, { hidden: true, reason: 'Check later' });

    const res = await write(moderator, 'put', `/api/posts/${postId}/visibility`, { hidden: false });

    expect(res.status).toBe(200);
    const seen = await request(app).get(`/api/threads/${thread.id}`);
    expect(seen.body.posts.find((p: { id: number }) => p.id === postId)).toMatchObject({
      hidden: null,
      bodyHtml: '<p>A borderline remark</p>',
    });
    expect((await auditOf('post', postId)).map((e) => e.action)).toEqual(['post.hidden', 'post.unhidden']);
  });

  it("when maker staff try to hide a rider's post, then the answer is 403 and the post stays visible", async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);
    const postId = (await reply(rider, thread.id, 'Your meter reads 4 % high.')).body.id;

    const byStaff = await write(staff, 'put', `/api/posts/${postId}/visibility`, { hidden: true, reason: 'Not true' });
    const byConflicted = await write(staffModerator, 'put', `/api/posts/${postId}/visibility`, { hidden: true, reason: 'Not true' });

    expect(byStaff.status).toBe(403);
    expect(byConflicted.status).toBe(403);
    expect(byConflicted.body.error.message).toMatch(/independent/);
    expect((await db('posts').where({ id: postId }).first()).hidden_reason).toBeNull();
  });

  it("when a moderator who is staff of another maker tries to hide, lock or move a thread, then the answer is 403: makers' staff never moderate riders' posts", async () => {
    const { body: thread } = await startThread(rider, otherCatalogue.spider.slug);
    const postId = (await reply(rider, thread.id, "The rival's meter drops out.")).body.id;

    const hide = await write(staffModerator, 'put', `/api/posts/${postId}/visibility`, { hidden: true, reason: 'Not true' });
    const lock = await write(staffModerator, 'put', `/api/threads/${thread.id}/lock`, { locked: true });
    const move = await write(staffModerator, 'post', `/api/threads/${thread.id}/move`, { modelSlug: catalogue.spider.slug });

    expect([hide.status, lock.status, move.status]).toEqual([403, 403, 403]);
    expect(hide.body.error.message).toMatch(/staff cannot do this/);
    expect((await db('posts').where({ id: postId }).first()).hidden_reason).toBeNull();
  });

  it('when a moderator hides without a reason, then the answer is 400', async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);
    const [opening] = await db('posts').where({ thread_id: thread.id });

    const res = await write(moderator, 'put', `/api/posts/${opening.id}/visibility`, { hidden: true });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields).toHaveProperty('reason');
  });
});

describe('locking a thread', () => {
  it('when a moderator locks a thread, then replies and edits are refused with 409, and unlocking allows them again', async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);
    const [opening] = await db('posts').where({ thread_id: thread.id });

    const locked = await write(moderator, 'put', `/api/threads/${thread.id}/lock`, { locked: true, reason: 'Going in circles' });
    const replyWhileLocked = await reply(rider, thread.id, 'One more thing');
    const editWhileLocked = await write(rider, 'patch', `/api/posts/${opening.id}`, { body: 'Edited while locked' });
    await write(moderator, 'put', `/api/threads/${thread.id}/lock`, { locked: false });
    const replyAfter = await reply(rider, thread.id, 'One more thing');

    expect(locked.status).toBe(200);
    expect(locked.body).toMatchObject({ locked: true });
    expect(replyWhileLocked.status).toBe(409);
    expect(replyWhileLocked.body.error.code).toBe('thread_locked');
    expect(editWhileLocked.status).toBe(409);
    expect(replyAfter.status).toBe(201);
    expect((await auditOf('thread', thread.id)).map((e) => e.action)).toEqual(['thread.locked', 'thread.unlocked']);
  });

  it.each([
    ['a rider', () => rider, 403],
    ['maker staff', () => staff, 403],
  ])('when %s tries to lock a thread, then the answer is %i', async (_who, person, status) => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);

    const res = await write(person(), 'put', `/api/threads/${thread.id}/lock`, { locked: true });

    expect(res.status).toBe(status);
    expect((await db('threads').where({ id: thread.id }).first()).locked).toBe(false);
  });
});

describe('moving a thread', () => {
  it("when a moderator moves a thread to another maker's model, then it lists there, the old maker's status and official response are cleared, and the move is audited", async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug, { firmwareId: catalogue.spiderFirmware.id });
    const staffReply = (await reply(staff, thread.id, 'Looking into it.')).body.id;
    await write(staff, 'put', `/api/threads/${thread.id}/official-response`, { postId: staffReply });
    await write(staff, 'put', `/api/threads/${thread.id}/status`, { status: 'investigating' });

    const res = await write(moderator, 'post', `/api/threads/${thread.id}/move`, {
      modelSlug: otherCatalogue.spider.slug,
      reason: 'About the other spider',
    });

    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({
      model: { slug: otherCatalogue.spider.slug },
      movedFrom: { slug: catalogue.spider.slug },
      firmware: null,
      status: 'open',
      officialResponse: null,
      makerResponded: false,
    });
    const there = await request(app).get(`/api/models/${otherCatalogue.spider.slug}/threads`);
    expect(there.body.threads.map((t: { id: number }) => t.id)).toContain(thread.id);
    const [entry] = await auditOf('thread', thread.id);
    expect(entry).toMatchObject({ action: 'thread.moved', reason: 'About the other spider' });
    expect(entry.before).toMatchObject({ modelSlug: catalogue.spider.slug, status: 'investigating' });
    expect(entry.after).toMatchObject({ modelSlug: otherCatalogue.spider.slug, status: 'open' });
  });

  it('when the target model does not exist, then the answer is 400 and the thread stays', async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);

    const res = await write(moderator, 'post', `/api/threads/${thread.id}/move`, { modelSlug: 'no-such-model', reason: 'Wrong place' });

    expect(res.status).toBe(400);
    expect((await db('threads').where({ id: thread.id }).first()).model_id).toBe(catalogue.spider.id);
  });

  it('when maker staff try to move a thread away from their model, then the answer is 403', async () => {
    const { body: thread } = await startThread(rider, catalogue.spider.slug);

    const res = await write(staff, 'post', `/api/threads/${thread.id}/move`, { modelSlug: otherCatalogue.spider.slug, reason: 'Not ours' });

    expect(res.status).toBe(403);
  });
});
