import { describe, expect, it } from 'vitest';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('failed mail in the Outbox, in the browser', () => {
  const e2e = useBrowserSession();

  for (const viewport of [
    { name: 'desktop', width: 1366, height: 900 },
    { name: 'phone', width: 390, height: 844 },
  ]) {
    it(`when an admin on a ${viewport.name} sends a failed message again, then it is delivered and leaves the list`, async () => {
      const subject = `Given up after an outage (${viewport.name})`;
      const rider = await e2e.db('users').where({ handle: 'demo-rider' }).first('id');
      await e2e.db('mail_messages').insert({
        user_id: rider.id,
        kind: 'submission_accepted',
        to_address: 'demo-rider@riders.crosswatt.test',
        subject,
        text_body: 'Your submission was accepted.',
        status: 'failed',
        attempts: 31,
        last_error: 'connect ECONNREFUSED 127.0.0.1:2525',
      });
      const page = await e2e.signedInPage('demo-admin', '/admin/outbox');
      await page.setViewportSize(viewport);
      const errors = watchConsole(page);
      const message = page.getByTestId('undelivered-message').filter({ hasText: subject });
      await message.waitFor();
      await expect(message.textContent()).resolves.toMatch(/31 attempts.*ECONNREFUSED/);
      expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width);
      await saveScreenshot(page, `outbox-undelivered-${viewport.name}`);

      await message.getByRole('button', { name: 'Send again' }).click();

      // The worker sends it; the captured list shows it and the undelivered list no longer does.
      await page.getByTestId('outbox-message').filter({ hasText: subject }).waitFor({ timeout: 20_000 });
      await message.waitFor({ state: 'detached', timeout: 20_000 });
      expect(errors).toEqual([]);
    });
  }
});
