import { describe, expect, it } from 'vitest';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('home page in the browser', () => {
  const e2e = useBrowserSession();

  it('when a visitor opens the home page, then it explains Crosswatt in Work Sans without console errors', async () => {
    const page = await e2e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchConsole(page);

    await page.goto(e2e.baseUrl);
    await page.getByRole('heading', { level: 1 }).waitFor();
    await page.evaluate(() => document.fonts.ready);

    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('How far can you trust a power meter?');
    const fontFamily = await page.locator('h1').evaluate((el) => getComputedStyle(el).fontFamily);
    expect(fontFamily.split(',')[0].replace(/"/g, '')).toBe('Work Sans');
    const workSansLoaded = await page.evaluate(() =>
      [...document.fonts].some((f) => f.family.replace(/"/g, '') === 'Work Sans' && f.status === 'loaded'),
    );
    expect(workSansLoaded).toBe(true);
    await saveScreenshot(page, 'home');
    expect(errors).toEqual([]);
  });

  it('when a visitor opens an unknown address, then the not-found page says so', async () => {
    const page = await e2e.browser.newPage();

    await page.goto(`${e2e.baseUrl}/no/such/page`);

    await expect(page.getByRole('heading', { name: 'This page dropped out' }).isVisible()).resolves.toBe(true);
  });

  it("when a page's chunk is gone after a deploy, then our own page offers a reload, and each page has its own title", async () => {
    const page = await e2e.browser.newPage();
    await page.goto(e2e.baseUrl);
    await page.getByRole('heading', { level: 1 }).waitFor();
    expect(await page.title()).toBe('Power meter accuracy from real rides · Crosswatt');
    // The old build's methodology chunk no longer exists on the server.
    await page.route(/\/assets\/methodology-[^/]+\.js$/, (route) => route.fulfill({ status: 404, body: 'gone' }));

    await page.evaluate(() => {
      window.history.pushState({}, '', '/methodology');
      window.dispatchEvent(new PopStateEvent('popstate'));
    });

    await page.getByRole('heading', { name: 'Crosswatt has been updated' }).waitFor();
    expect(await page.getByRole('button', { name: 'Reload the page' }).isVisible()).toBe(true);
    await saveScreenshot(page, 'stale-chunk');
    await page.unroute(/\/assets\/methodology-[^/]+\.js$/);
    await page.getByRole('button', { name: 'Reload the page' }).click();
    await page.waitForFunction(() => document.title === 'Methodology · Crosswatt');
  });
});
