import path from 'node:path';
import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../server/support/catalogue-factory';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

const demoPair = (side: 'a' | 'b', pair = '01-clean-bias') => path.resolve(`demo/pairs/${pair}-${side}.fit`);
// The first bytes of a PNG image (PNG specification, section 5.2) and a little more: not a FIT file.
const PNG_BYTES = Buffer.from([
  0x89,
  0x50,
  0x4e,
  0x47,
  0x0d,
  0x0a,
  0x1a,
  0x0a,
  0,
  0,
  0,
  13,
  0x49,
  0x48,
  0x44,
  0x52,
  ...new Array(64).fill(7),
]);

describe('a rider submits a paired recording in the browser', () => {
  const e2e = useBrowserSession();
  let catalogue: TestCatalogue;

  beforeAll(async () => {
    catalogue = await createCatalogue(e2e.db);
  });

  async function signedInPage(handle: string, viewport = { width: 1280, height: 900 }): Promise<Page> {
    const context = await e2e.browser.newContext({ viewport });
    const page = await context.newPage();
    await page.goto(`${e2e.baseUrl}/auth/github?login=${handle}&returnTo=/submit`);
    await page.getByRole('heading', { name: 'Two meters, one ride' }).waitFor();
    return page;
  }

  async function describeMeter(page: Page, side: 'a' | 'b', modelId: number, firmwareId: number) {
    await page.locator(`#${side}-maker`).selectOption(String(catalogue.maker.id));
    await page.locator(`#${side}-model`).selectOption(String(modelId));
    await page.locator(`#${side}-firmware`).selectOption(String(firmwareId));
    await page.locator(`#${side}-device`).selectOption(String(catalogue.headUnit.id));
    await page.locator(`#${side}-device-firmware`).fill('12.1');
    await chooseRadio(page, `${side}-recording-mode`, 'every_second');
    await chooseRadio(page, `${side}-zero-offset`, 'yes');
    await chooseRadio(page, `${side}-other-meters-on`, 'no');
  }

  async function describeRide(page: Page) {
    await describeMeter(page, 'a', catalogue.spider.id, catalogue.spiderFirmware.id);
    await describeMeter(page, 'b', catalogue.pedals.id, catalogue.pedalsFirmware.id);
    await chooseRadio(page, 'indoor', 'outdoor');
    await chooseRadio(page, 'surface', 'smooth_road');
  }

  function chooseRadio(page: Page, name: string, value: string) {
    return page.locator('label', { has: page.locator(`input[name="${name}"][value="${value}"]`) }).click();
  }

  it('when a rider fills the form with two demo files and sends it, then the preview, the progress and the result page appear', async () => {
    const page = await signedInPage('journey-rider');
    const errors = watchConsole(page);
    const workers: string[] = [];
    page.on('worker', (worker) => workers.push(worker.url()));

    await page.locator('#file-a').setInputFiles(demoPair('a'));
    await page.locator('#file-b').setInputFiles(demoPair('b'));
    const preview = page.getByRole('region', { name: 'First look, in your browser' });
    await preview.getByText('First bias, A vs B').waitFor();
    await describeRide(page);
    await page.locator('#notes').fill('Flat loop, both meters zeroed at the start.');

    // The position comes from the model; the demo pair's truth is +2.5 % with clocks in step (demo/pairs/README.md).
    expect(await page.locator('#a-position').inputValue()).toBe('total');
    expect(await page.locator('#b-position').inputValue()).toBe('dual');
    expect(await preview.textContent()).toMatch(/\+2\.\d %/);
    expect(await preview.textContent()).toContain('30 min');
    expect(workers.some((url) => url.includes('pair-preview.worker'))).toBe(true);
    await saveScreenshot(page, 'submit-form-desktop');

    await page.getByRole('button', { name: 'Send the ride for analysis' }).click();
    await page.waitForURL(/\/submissions\/\d+$/);
    await page.getByTestId('submission-status').filter({ hasText: 'Awaiting review' }).waitFor({ timeout: 60_000 });
    await page.getByRole('heading', { name: 'How closely the meters agreed' }).waitFor();

    const headline = await page.getByRole('region', { name: 'How closely the meters agreed' }).textContent();
    expect(headline).toMatch(/\+2\.\d %/);
    expect(headline).toContain('Limits of agreement');
    expect(await page.locator('canvas').count()).toBeGreaterThanOrEqual(4);
    expect(await page.getByText('not a calibration certificate').first().isVisible()).toBe(true);
    await saveScreenshot(page, 'submission-result-desktop');
    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    await saveScreenshot(page, 'submission-result-phone');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

    await page.getByRole('link', { name: 'All your submissions' }).click();
    await page.getByRole('heading', { name: 'My submissions' }).waitFor();
    await page.getByRole('link', { name: /Orbit 2\.1\.0 vs Treadle 4\.0\.2/ }).waitFor();
    await saveScreenshot(page, 'my-submissions-phone');
    expect(errors).toEqual([]);
  });

  it('when a rider picks a PNG renamed .fit, then the message appears on that file and nothing is sent', async () => {
    const page = await signedInPage('png-rider', { width: 390, height: 844 });

    await page.locator('#file-a').setInputFiles({ name: 'ride.fit', mimeType: 'application/octet-stream', buffer: PNG_BYTES });
    await page.locator('#file-b').setInputFiles(demoPair('b'));
    await page.locator('#file-a-error').waitFor();

    expect(await page.locator('#file-a-error').textContent()).toContain('is not a FIT file');
    expect(await page.locator('#file-a').getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator('#file-b-error').count()).toBe(0);

    await page.getByRole('button', { name: 'Send the ride for analysis' }).click();
    await page.getByRole('alert').filter({ hasText: 'need another look' }).waitFor();
    expect(page.url()).toMatch(/\/submit$/);
    expect(await page.locator('#a-maker-error').textContent()).toContain('Choose a maker');
    await saveScreenshot(page, 'submit-form-phone-errors');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  });

  it('when a rider cannot find their firmware, then they propose it inline and it is chosen, marked pending', async () => {
    const page = await signedInPage('proposing-rider', { width: 390, height: 844 });
    await page.locator('#a-maker').selectOption(String(catalogue.maker.id));
    await page.locator('#a-model').selectOption(String(catalogue.spider.id));

    await page.getByRole('button', { name: 'Can’t find the firmware version? Propose it' }).click();
    await page.getByLabel('Version number').fill('9.9.1');
    await page.getByRole('button', { name: 'Propose this firmware version' }).click();

    await page.locator('#a-firmware option:checked', { hasText: '9.9.1' }).waitFor({ state: 'attached' });
    expect(await page.locator('#a-firmware option:checked').textContent()).toContain('pending review');
  });

  it('when a rider sends a pair that was uploaded before, then the server refuses it and the form links to the earlier submission', async () => {
    const page = await signedInPage('twice-rider');
    const sendPair = async () => {
      await page.locator('#file-a').setInputFiles(demoPair('a', '02-clock-offset'));
      await page.locator('#file-b').setInputFiles(demoPair('b', '02-clock-offset'));
      await page.getByText('First bias, A vs B').waitFor();
      await describeRide(page);
      await page.getByRole('button', { name: 'Send the ride for analysis' }).click();
    };
    await sendPair();
    await page.waitForURL(/\/submissions\/\d+$/);
    const firstUrl = page.url();

    await page.goto(`${e2e.baseUrl}/submit`);
    await sendPair();

    const alert = page.getByRole('alert').filter({ hasText: 'uploaded before' });
    await alert.waitFor();
    await alert.getByRole('link', { name: 'Open the earlier submission' }).click();
    await page.waitForURL(firstUrl);
  });
});
