import { beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config/env';
import { ensureDemoIdentity } from '../../server/fakes/demo-identities';
import { createThread, replyToThread } from '../../server/features/threads/threads.service';
import { createCatalogue, type TestCatalogue } from '../server/support/catalogue-factory';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

const TITLE = 'Power reads 4 % high on cold mornings';

describe("a maker's staff member answers a thread in the browser", () => {
  const e2e = useBrowserSession();
  let catalogue: TestCatalogue;
  let threadId: number;
  let staffHandle: string;

  beforeAll(async () => {
    catalogue = await createCatalogue(e2e.db);
    const deps = { db: e2e.db, config: loadConfig({ DATABASE_URL: process.env.DATABASE_URL, PUBLIC_URL: e2e.baseUrl }) };
    staffHandle = `demo-staff-${catalogue.maker.slug}`;
    await ensureDemoIdentity(e2e.db, { handle: staffHandle, name: 'Ilse Staffmember', makerSlug: catalogue.maker.slug });
    const reporter = await ensureDemoIdentity(e2e.db, { handle: 'cold-morning-rider', name: 'Cold Morning Rider' });
    const follower = await ensureDemoIdentity(e2e.db, { handle: 'second-rider', name: 'Second Rider' });
    threadId = (
      await createThread(deps, reporter, catalogue.spider.slug, {
        title: TITLE,
        firmwareId: catalogue.spiderFirmware.id,
        body: 'Below 5 °C the **Orbit** reads about 4 % above my trainer until it warms up.\n\n- zero offset done\n- same on two rides',
      })
    ).id;
    await replyToThread(deps, follower, threadId, { body: 'Same here, and it settles after about 20 minutes.' });
    // A hostile title on the same model: the list must show it as text.
    await createThread(deps, follower, catalogue.spider.slug, {
      title: '<img src=x onerror=alert(1)> <b>bold</b> claim',
      body: 'Testing titles.',
    });
  });

  it('when staff reply, mark the reply official and set the status, then the thread, the model threads and the follower see it, and the follower is e-mailed', async () => {
    const page = await e2e.signedInPage(staffHandle, `/threads/${threadId}`);
    const errors = watchConsole(page);
    await page.getByRole('heading', { name: TITLE }).waitFor();

    await page
      .getByLabel(`Reply as ${catalogue.maker.name} staff`)
      .fill('We reproduced this: the temperature compensation starts too late. **Firmware 2.2** will correct it.');
    await page.getByRole('button', { name: 'Post reply' }).click();
    const staffPost = page.getByRole('article', { name: 'Post by Ilse Staffmember' });
    await staffPost.getByTestId('maker-staff-badge').waitFor();
    await staffPost.getByRole('button', { name: 'Mark as official response' }).click();
    const pinned = page.getByRole('article', { name: `Official response from ${catalogue.maker.name}` });
    await pinned.waitFor();
    await page.getByLabel('Thread status', { exact: true }).selectOption('investigating');
    await page.getByRole('button', { name: 'Set status' }).click();
    await page.locator('header').getByTestId('thread-status').filter({ hasText: 'Maker investigating' }).waitFor();

    expect(await pinned.textContent()).toContain('temperature compensation starts too late');
    expect(await staffPost.getByTestId('maker-staff-badge').textContent()).toContain(catalogue.maker.name);
    // The pinned copy comes before the opening post.
    const articles = await page.getByRole('article').evaluateAll((els) => els.map((el) => el.getAttribute('aria-label')));
    expect(articles[0]).toBe(`Official response from ${catalogue.maker.name}`);
    await page.evaluate(() => document.fonts.ready);
    await saveScreenshot(page, 'maker-journey-thread');

    await page.goto(`${e2e.baseUrl}/models/${catalogue.spider.slug}/threads`);
    const row = page.getByRole('listitem').filter({ hasText: TITLE });
    await row.waitFor();
    expect(await row.getByTestId('thread-status').textContent()).toBe('Maker investigating');
    expect(await row.textContent()).toContain('Official response');
    const hostile = page.getByRole('listitem').filter({ hasText: 'bold' });
    expect(await hostile.getByRole('link').textContent()).toBe('<img src=x onerror=alert(1)> <b>bold</b> claim');
    expect(await page.locator('ul[aria-label="Threads"] img, ul[aria-label="Threads"] b').count()).toBe(0);
    await saveScreenshot(page, 'maker-journey-model-threads');

    // The model page itself carries the maker's status in its discussion summary.
    await page.goto(`${e2e.baseUrl}/models/${catalogue.spider.slug}`);
    const summary = page.getByTestId('model-thread-summary');
    await summary.getByRole('link', { name: TITLE }).waitFor();
    expect(await summary.getByTestId('thread-status').first().textContent()).toBe('Maker investigating');
    expect(errors).toEqual([]);

    // The follower: an e-mail in the fake SMTP service's outbox, and the bell in the header.
    const mail = await waitFor(async () =>
      e2e
        .db('mail_outbox')
        .whereRaw('? = any(recipients)', ['second-rider@demo.crosswatt.test'])
        .where('subject', `${catalogue.maker.name} answered: ${TITLE}`)
        .first(),
    );
    expect(mail.text_body).toContain('temperature compensation starts too late');
    expect(mail.text_body).toContain(`/threads/${threadId}#post-`);
    const followerPage = await e2e.signedInPage('second-rider', `/threads/${threadId}`);
    await followerPage.getByRole('heading', { name: TITLE }).waitFor();
    const bell = followerPage.getByRole('button', { name: /^Notifications, \d+ unread$/ });
    await bell.click();
    await followerPage
      .getByRole('region', { name: 'Notifications' })
      .getByText(/gave the official response/)
      .waitFor();
    await saveScreenshot(followerPage, 'maker-journey-follower-bell');
  });
});

async function waitFor<T>(probe: () => Promise<T | undefined>, timeoutMs = 20_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > until) throw new Error('timed out waiting for the e-mail');
    await new Promise((r) => setTimeout(r, 250));
  }
}
