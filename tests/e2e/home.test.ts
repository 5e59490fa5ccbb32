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
});
