import { beforeAll, describe, expect, it } from 'vitest';
import { insertFirmware } from '../../server/features/catalogue/catalogue.repository';
import { versionOrder } from '../../shared/schemas/catalogue';
import { createCatalogue, type TestCatalogue } from '../server/support/catalogue-factory';
import { acceptSubmission, insertAnalysedSubmission, insertRider } from '../server/support/statistics-factory';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

// A shopper's path: the scoreboard, a sort, a filter, then a model's page.
describe('scoreboard in the browser', () => {
  const e2e = useBrowserSession();
  let catalogue: TestCatalogue;

  beforeAll(async () => {
    catalogue = await createCatalogue(e2e.db);
    const newer = await insertFirmware(e2e.db, {
      modelId: catalogue.spider.id,
      version: '2.2.0',
      versionOrder: versionOrder('2.2.0'),
      releasedOn: '2026-05-01',
      status: 'approved',
    });
    const riders = [await insertRider(e2e.db), await insertRider(e2e.db), await insertRider(e2e.db)];
    const rides: [number, number, number, number][] = [
      // firmware, bias %, hours, dropouts of the spider
      [catalogue.spiderFirmware.id, 1.2, 1.5, 0],
      [catalogue.spiderFirmware.id, 2.4, 2.0, 1],
      [catalogue.spiderFirmware.id, 1.9, 1.0, 0],
      [catalogue.spiderFirmware.id, 0.8, 3.0, 1],
      [newer.id, 3.1, 1.2, 4],
      [newer.id, 2.6, 2.2, 3],
      [newer.id, 3.8, 1.7, 6],
    ];
    for (const [i, [firmwareId, bias, hours, dropouts]] of rides.entries()) {
      const id = await insertAnalysedSubmission(e2e.db, {
        riderId: riders[i % 3],
        a: { modelId: catalogue.spider.id, firmwareId, recordingDeviceId: catalogue.headUnit.id },
        b: {
          modelId: catalogue.pedals.id,
          firmwareId: catalogue.pedalsFirmware.id,
          recordingDeviceId: catalogue.headUnit.id,
          position: 'dual',
        },
        biasPercent: bias,
        pedallingHours: hours,
        aPowerDropouts: dropouts,
        surface: i % 2 ? 'rough_road' : 'smooth_road',
        cadenceLagSeconds: 1,
      });
      await acceptSubmission(e2e.db, id);
    }
  });

  it('when a shopper sorts and filters the scoreboard and opens a model, then the model page shows its firmware with intervals', async () => {
    const page = await e2e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchConsole(page);

    // Open the scoreboard
    await page.goto(`${e2e.baseUrl}/scoreboard`);
    await page.getByRole('heading', { name: 'Scoreboard', level: 1 }).waitFor();
    await page.getByRole('link', { name: 'Orbit' }).waitFor();
    await page.evaluate(() => document.fonts.ready);
    await saveScreenshot(page, 'scoreboard');

    // Sort by bias, ascending: the pedals (judged against a spider that reads high) come first
    await page.getByRole('button', { name: /Bias vs partners/ }).click();
    await page.waitForURL(/sort=bias/);
    await page.getByRole('button', { name: /Bias vs partners/ }).click();
    await page.waitForURL(/order=asc/);
    await page.waitForFunction(() => document.querySelector('tbody tr a')?.textContent === 'Treadle');

    // Filter by kind: only the spider remains, and the filter lives in the URL
    await page.getByLabel('Kind').selectOption('spider');
    await page.waitForURL(/kind=spider/);
    await page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 1);
    expect(await page.locator('tbody tr').first().textContent()).toContain('Orbit');
    expect(await page.locator('tbody tr').first().textContent()).toMatch(/\+2\.\d % ± \d\.\d/);

    // Open the model
    await page.getByRole('link', { name: 'Orbit' }).click();
    await page.getByRole('heading', { level: 1, name: /Orbit/ }).waitFor();
    await page.getByRole('img', { name: /Bias, power and cadence dropouts by firmware version/ }).waitFor();
    expect(await page.getByRole('row', { name: /2\.2\.0/ }).textContent()).toMatch(/× \(/);
    expect(await page.getByRole('link', { name: /Discussion threads/ }).getAttribute('href')).toBe(
      `/models/${catalogue.spider.slug}/threads`,
    );
    await page.evaluate(() => document.fonts.ready);
    await saveScreenshot(page, 'model-page');

    // The methodology page states the caution
    await page.getByRole('link', { name: 'Method' }).click();
    await page.getByText('Not a calibration certificate', { exact: true }).waitFor();
    // A signed-out visitor's header asks for the session and gets 401 (not this page's doing).
    expect(errors.filter((error) => !error.includes('status of 401'))).toEqual([]);
  });
});
