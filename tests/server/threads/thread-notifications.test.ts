import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { type Person, reply, startThread, write } from '../support/thread-factory';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let author: Person;
let follower: Person;
let staff: Person;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  author = await signedInAgent(app, { handle: 'thread-author' });
  follower = await signedInAgent(app, { handle: 'thread-follower' });
  staff = await signedInAgent(app, { handle: 'maker-answers', makerSlug: catalogue.maker.slug });
});

async function notificationsOf(person: Person) {
  const res = await person.agent.get('/api/notifications');
  expect(res.status).toBe(200);
  return res.body as {
    unreadCount: number;
    notifications: Array<{ id: number; kind: string; thread: { id: number }; postId: number | null; read: boolean; url: string }>;
  };
}

async function mailTo(person: Person, threadId: number) {
  return db('mail_messages').where({ user_id: person.user.id }).whereLike('text_body', `%/threads/${threadId}#%`).orderBy('id');
}

describe('following and notifications', () => {
  it('when someone replies, then the author (auto-followed) gets a notification and an e-mail, and the replier does not', async () => {
    const { body: thread } = await startThread(author, catalogue.spider.slug, { title: 'Power reads high on cold mornings' });

    const { body: post } = await reply(follower, thread.id, 'Mine too, about **3 %** high until it warms up.');

    const forAuthor = await notificationsOf(author);
    expect(forAuthor.notifications[0]).toMatchObject({
      kind: 'reply',
      thread: { id: thread.id },
      postId: post.id,
      read: false,
      url: `/threads/${thread.id}#post-${post.id}`,
    });
    expect(forAuthor.unreadCount).toBeGreaterThanOrEqual(1);
    expect((await notificationsOf(follower)).notifications.filter((n) => n.thread.id === thread.id)).toEqual([]);
    const [mail] = await mailTo(author, thread.id);
    expect(mail.kind).toBe('thread_reply');
    expect(mail.to_address).toMatch(/^thread-author@/);
    expect(mail.subject).toBe('New reply: Power reads high on cold mornings');
    expect(mail.text_body).toContain('thread-follower replied');
    expect(mail.text_body).toContain('/api/mail/unsubscribe?token=');
  });

  it('when the maker marks an official response, then every follower gets a notification and an e-mail that names the maker', async () => {
    const { body: thread } = await startThread(author, catalogue.spider.slug);
    await reply(follower, thread.id, 'Following this.');
    const { body: answer } = await reply(staff, thread.id, 'Firmware 2.1.1 corrects the temperature compensation.');

    await write(staff, 'put', `/api/threads/${thread.id}/official-response`, { postId: answer.id });

    for (const person of [author, follower]) {
      const { notifications } = await notificationsOf(person);
      expect(notifications.filter((n) => n.thread.id === thread.id).map((n) => n.kind)).toContain('official_response');
      const mails = await mailTo(person, thread.id);
      const official = mails.find((m) => m.kind === 'maker_response');
      expect(official.subject).toBe(`${catalogue.maker.name} answered: Cadence drops out on gravel`);
      expect(official.text_body).toContain(`maker-answers (${catalogue.maker.name} staff)`);
      expect(official.text_body).toContain('temperature compensation');
    }
    expect((await notificationsOf(staff)).notifications.filter((n) => n.thread.id === thread.id && n.kind === 'official_response')).toEqual(
      [],
    );
  });

  it('when a follower has switched off reply e-mails, then they still get the notification but no e-mail', async () => {
    const quiet = await signedInAgent(app, { handle: 'quiet-follower' });
    await db('users').where({ id: quiet.user.id }).update({ email_on_reply: false });
    const { body: thread } = await startThread(quiet, catalogue.spider.slug);

    await reply(follower, thread.id, 'Any news?');

    expect((await notificationsOf(quiet)).notifications[0]).toMatchObject({ kind: 'reply', thread: { id: thread.id } });
    expect(await mailTo(quiet, thread.id)).toEqual([]);
  });

  it('when someone unfollows, then later replies do not notify them; following again does', async () => {
    const { body: thread } = await startThread(author, catalogue.spider.slug);
    await reply(follower, thread.id, 'Following this.');

    const off = await write(follower, 'delete', `/api/threads/${thread.id}/follow`);
    await reply(author, thread.id, 'First update');
    const on = await write(follower, 'put', `/api/threads/${thread.id}/follow`);
    await reply(author, thread.id, 'Second update');

    expect(off.body).toEqual({ following: false });
    expect(on.body).toEqual({ following: true });
    const mine = (await notificationsOf(follower)).notifications.filter((n) => n.thread.id === thread.id);
    expect(mine).toHaveLength(1);
  });

  it('when the maker sets a status, then followers get an in-app notification (no e-mail)', async () => {
    const { body: thread } = await startThread(author, catalogue.spider.slug);

    await write(staff, 'put', `/api/threads/${thread.id}/status`, { status: 'acknowledged' });

    expect((await notificationsOf(author)).notifications[0]).toMatchObject({ kind: 'status', thread: { id: thread.id }, postId: null });
    expect(await db('mail_messages').where({ user_id: author.user.id }).whereLike('text_body', `%/threads/${thread.id}#%`)).toEqual([]);
  });

  it('when notifications are marked read, one by one or all, then the unread count follows', async () => {
    const before = await notificationsOf(author);
    expect(before.unreadCount).toBeGreaterThan(1);

    const one = await write(author, 'post', '/api/notifications/read', { ids: [before.notifications[0].id] });
    const all = await write(author, 'post', '/api/notifications/read', { all: true });
    const bad = await write(author, 'post', '/api/notifications/read', { ids: [] });

    expect(one.body.unreadCount).toBe(before.unreadCount - 1);
    expect(all.body.unreadCount).toBe(0);
    expect((await notificationsOf(author)).notifications.every((n) => n.read)).toBe(true);
    expect(bad.status).toBe(400);
  });

  it("when someone marks another person's notification read, then nothing changes for its owner", async () => {
    const { body: thread } = await startThread(author, catalogue.spider.slug);
    await reply(follower, thread.id, 'Ping');
    const [theirs] = (await notificationsOf(author)).notifications;

    await write(follower, 'post', '/api/notifications/read', { ids: [theirs.id] });

    expect((await notificationsOf(author)).notifications[0]).toMatchObject({ id: theirs.id, read: false });
  });

  it('when a visitor asks for notifications, then the answer is 401', async () => {
    const res = await request(app).get('/api/notifications');

    expect(res.status).toBe(401);
  });
});
