import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { insertAcceptedSubmission, type Person, reply, startThread, write } from '../support/thread-factory';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let rider: Person;
let otherRider: Person;
let staff: Person;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'gravel-rider' });
  otherRider = await signedInAgent(app, { handle: 'road-rider' });
  staff = await signedInAgent(app, { handle: 'orbit-support', makerSlug: catalogue.maker.slug });
});

describe('starting a thread and replying', () => {
  it('when a rider starts a thread about a firmware version, then anyone can read it with the opening post rendered', async () => {
    const res = await startThread(rider, catalogue.spider.slug, {
      firmwareId: catalogue.spiderFirmware.id,
      body: 'Cadence drops to **zero** on gravel.',
    });

    expect(res.status).toBe(201);
    const thread = await request(app).get(`/api/threads/${res.body.id}`);
    expect(thread.status).toBe(200);
    expect(thread.body).toMatchObject({
      title: 'Cadence drops out on gravel',
      status: 'open',
      firmware: { id: catalogue.spiderFirmware.id, version: '2.1.0' },
      author: { handle: 'gravel-rider' },
      model: { slug: catalogue.spider.slug, maker: { name: catalogue.maker.name } },
      viewer: { signedIn: false, canReply: false },
    });
    expect(thread.body.posts).toHaveLength(1);
    expect(thread.body.posts[0]).toMatchObject({
      isOpening: true,
      staffOf: null,
      bodyHtml: '<p>Cadence drops to <strong>zero</strong> on gravel.</p>',
    });
  });

  it('when a rider replies, then the reply follows the opening post and the thread counts it', async () => {
    const { body: created } = await startThread(rider, catalogue.spider.slug);

    const res = await reply(otherRider, created.id, 'Same here on 2.1.0.');

    expect(res.status).toBe(201);
    const thread = await otherRider.agent.get(`/api/threads/${created.id}`);
    expect(thread.body.replyCount).toBe(1);
    expect(thread.body.posts.map((p: { author: { handle: string } }) => p.author.handle)).toEqual(['gravel-rider', 'road-rider']);
    expect(thread.body.viewer).toMatchObject({ signedIn: true, following: true, isMakerStaff: false, canReply: true });
  });

  it('when a visitor tries to start a thread or reply, then the answer is 401', async () => {
    const anonymous = request.agent(app);
    const token = (await anonymous.get('/api/csrf-token')).body.token;

    const res = await anonymous
      .post(`/api/models/${catalogue.spider.slug}/threads`)
      .set('X-CSRF-Token', token)
      .send({ title: 'Anonymous report', body: 'text' });

    expect(res.status).toBe(401);
    expect(res.body.error.message).toMatch(/sign in/i);
  });

  it.each([
    ['a missing title', { title: undefined }, 'title'],
    ['a title that is too short', { title: 'drops' }, 'title'],
    ['a title with a line break', { title: 'Cadence drops\nout on gravel' }, 'title'],
    ['an empty body', { body: '   ' }, 'body'],
    ['a body that is too long', { body: 'x'.repeat(10_001) }, 'body'],
    ['a firmware of another model', { firmwareId: -1 }, 'firmwareId'],
    ['submissions that are not numbers', { submissionIds: ['abc'] }, 'submissionIds.0'],
  ])('when the thread has %s, then the answer is 400 naming the field', async (_name, fields, field) => {
    const res = await startThread(otherRider, catalogue.spider.slug, fields);

    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields)).toContain(field);
  });

  it('when the firmware belongs to another model, then the answer is 400 and nothing is stored', async () => {
    const [{ count: before }] = await db('threads').count();

    const res = await startThread(otherRider, catalogue.spider.slug, { firmwareId: catalogue.pedalsFirmware.id });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.firmwareId).toMatch(/not a firmware version of Orbit/);
    expect((await db('threads').count())[0].count).toBe(before);
  });

  it.each([
    ['an unknown model', (r: Person) => startThread(r, 'no-such-model'), 404],
    ['an unknown thread', (r: Person) => reply(r, 999_999, 'hello there'), 404],
    ['a thread number that is not a number', (r: Person) => reply(r, 'abc' as unknown as number, 'hello there'), 400],
    ['a huge thread number', (r: Person) => reply(r, 99_999_999_999 as number, 'hello there'), 400],
  ])('when a rider writes to %s, then the answer is a clear %i', async (_name, act, status) => {
    const res = await act(otherRider);

    expect(res.status).toBe(status);
    expect(res.body.error.message).toMatch(/\w/);
  });
});

describe('linking submissions as evidence', () => {
  it('when a post links an accepted submission of the model, then the thread shows its headline figures', async () => {
    const submissionId = await insertAcceptedSubmission(db, catalogue, { riderId: rider.user.id, biasPercent: 2.4 });

    const res = await startThread(rider, catalogue.spider.slug, { submissionIds: [submissionId] });

    expect(res.status).toBe(201);
    const thread = await request(app).get(`/api/threads/${res.body.id}`);
    expect(thread.body.posts[0].linkedSubmissions).toEqual([
      expect.objectContaining({
        id: submissionId,
        side: 'a',
        biasPercent: 2.4,
        loaLowerPercent: -2.1,
        loaUpperPercent: 5.7,
        powerDropouts: 3,
        firmware: '2.1.0',
      }),
    ]);
  });

  it('when a post links a submission that is not accepted, then the answer is 400 and names it', async () => {
    const waiting = await insertAcceptedSubmission(db, catalogue, { riderId: rider.user.id, status: 'awaiting_review' });

    const res = await startThread(rider, catalogue.spider.slug, { submissionIds: [waiting] });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.submissionIds).toContain(`#${waiting}`);
  });

  it('when a rider asks which submissions they can link, then only their accepted ones of that model are offered', async () => {
    const mine = await insertAcceptedSubmission(db, catalogue, { riderId: otherRider.user.id });
    await insertAcceptedSubmission(db, catalogue, { riderId: otherRider.user.id, status: 'rejected' });

    const res = await otherRider.agent.get(`/api/models/${catalogue.pedals.slug}/linkable-submissions`);

    expect(res.status).toBe(200);
    expect(res.body.submissions).toEqual([expect.objectContaining({ id: mine, side: 'b', firmware: '4.0.2' })]);
  });
});

describe('editing own posts', () => {
  it('when the author edits within the window, then the new text shows with an edited mark', async () => {
    const { body: created } = await startThread(rider, catalogue.spider.slug);
    const { body: thread } = await rider.agent.get(`/api/threads/${created.id}`);
    const post = thread.posts[0];
    expect(post.bodySource).toMatch(/cadence/);
    expect(post.editedOn).toBeNull();

    const res = await write(rider, 'patch', `/api/posts/${post.id}`, { body: 'Update: only below 60 rpm.' });

    expect(res.status).toBe(200);
    const after = await request(app).get(`/api/threads/${created.id}`);
    expect(after.body.posts[0]).toMatchObject({
      bodyHtml: '<p>Update: only below 60 rpm.</p>',
      editedOn: expect.stringMatching(/^\d{4}-\d{2}-\d{2}$/),
      bodySource: null,
    });
  });

  it('when the window has passed, then the edit is refused with edit_window_closed', async () => {
    const { body: created } = await startThread(rider, catalogue.spider.slug);
    const [post] = await db('posts').where({ thread_id: created.id });
    await db('posts')
      .where({ id: post.id })
      .update({ created_at: db.raw("now() - interval '31 minutes'") });

    const res = await write(rider, 'patch', `/api/posts/${post.id}`, { body: 'Too late to change this.' });

    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('edit_window_closed');
  });

  it("when maker staff or another rider edit a rider's post, then they are refused and the text is unchanged", async () => {
    const { body: created } = await startThread(rider, catalogue.spider.slug);
    const [post] = await db('posts').where({ thread_id: created.id });

    const byStaff = await write(staff, 'patch', `/api/posts/${post.id}`, { body: 'Works as designed.' });
    const byRider = await write(otherRider, 'patch', `/api/posts/${post.id}`, { body: 'Rewritten by someone else.' });

    expect(byStaff.status).toBe(403);
    expect(byRider.status).toBe(403);
    expect((await db('posts').where({ id: post.id }).first()).body_source).toBe(post.body_source);
  });
});

describe('thread lists', () => {
  it('when threads are listed, then the latest activity comes first and the filters narrow the list', async () => {
    const slug = catalogue.pedals.slug;
    const quiet = (await startThread(otherRider, slug, { title: 'Left pedal reads low when cold' })).body.id;
    const busy = (await startThread(otherRider, slug, { title: 'Dropouts on firmware 4.0.2', firmwareId: catalogue.pedalsFirmware.id }))
      .body.id;
    const answered = (await startThread(otherRider, slug, { title: 'Right pedal spikes at sprints' })).body.id;
    await reply(staff, answered, 'Thanks, we are looking into the sprint spikes.');
    await reply(rider, busy, 'Same on my pair.');

    const all = await request(app).get(`/api/models/${slug}/threads`);
    const responded = await request(app).get(`/api/models/${slug}/threads?makerResponded=true`);
    const onFirmware = await request(app).get(`/api/models/${slug}/threads?firmwareId=${catalogue.pedalsFirmware.id}`);
    const bad = await request(app).get(`/api/models/${slug}/threads?open=maybe`);

    expect(all.body.threads.map((t: { id: number }) => t.id)).toEqual([busy, answered, quiet]);
    expect(all.body.model.firmware).toEqual([{ id: catalogue.pedalsFirmware.id, version: '4.0.2' }]);
    expect(responded.body.threads.map((t: { id: number }) => t.id)).toEqual([answered]);
    expect(onFirmware.body.threads.map((t: { id: number }) => t.id)).toEqual([busy]);
    expect(bad.status).toBe(400);
  });
});
