import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../server/support/catalogue-factory';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('a rider logs a meter and its batteries, and a shopper reads the model page', () => {
  const e2e = useBrowserSession();
  let catalogue: TestCatalogue;

  beforeAll(async () => {
    catalogue = await createCatalogue(e2e.db);
  });

  it('when the rider adds a meter, logs its first battery, adds riding and logs the flat battery, then the battery counts those hours and ran flat', async () => {
    const page = await e2e.signedInPage('coin-cell-rider', '/my-equipment');
    const errors = watchConsole(page);
    await page.getByRole('heading', { name: 'My meters and their batteries' }).waitFor();

    const add = page.getByRole('form', { name: 'Add a meter' });
    await add.getByLabel('Power meter').selectOption({ label: `${catalogue.maker.name} Orbit` });
    await add.getByLabel('Your name for it').fill('Commuter spider');
    await add.getByRole('button', { name: 'Add this meter' }).click();
    const card = page.getByRole('region', { name: 'Commuter spider' });
    await card.waitFor();
    await card.getByText('No battery logged yet').waitFor();

    const change = card.getByRole('form', { name: 'Log a battery change' });
    await change.getByLabel('New battery on').fill('2026-01-05');
    await change.getByLabel('The one before came out because').selectOption('first_battery');
    await change.getByRole('button', { name: 'Log the change' }).click();
    await card.getByRole('cell', { name: '2.1.0' }).waitFor();

    const riding = card.getByRole('form', { name: 'Add riding by hand' });
    await riding.getByLabel('Ridden on (or up to)').fill('2026-03-01');
    await riding.getByLabel(/Hours/).fill('120');
    await riding.getByRole('button', { name: 'Add riding' }).click();
    await card.getByRole('cell', { name: '120.0 h self-reported' }).waitFor();

    await change.getByLabel('New battery on').fill('2026-04-02');
    await change.getByLabel('The one before came out because').selectOption('ran_flat');
    await change.getByRole('button', { name: 'Log the change' }).click();
    await card.getByRole('cell', { name: 'ran flat', exact: true }).waitFor();

    const rows = await card.getByRole('row').allTextContents();
    expect(rows.some((r) => /5 Jan 2026 – 2 Apr 2026.*120\.0 h.*ran flat/.test(r))).toBe(true);
    expect(rows.some((r) => /2 Apr 2026 – now.*still running/.test(r))).toBe(true);
    await saveScreenshot(page, 'battery-log-desktop');
    await page.setViewportSize({ width: 390, height: 844 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
    await saveScreenshot(page, 'battery-log-phone');
    expect(errors).toEqual([]);
  });

  it('when a shopper opens the model page, then battery life says not enough batteries yet with the counts, and no maker claim', async () => {
    const context = await e2e.browser.newContext({ viewport: { width: 1366, height: 900 } });
    const page = await context.newPage();
    const errors = watchConsole(page);
    await page.goto(`${e2e.baseUrl}/models/${catalogue.spider.slug}`);

    const section = page.getByTestId('battery-and-temperature');
    await section.waitFor();
    expect(await section.getByTestId('battery-median').textContent()).toMatch(
      /Not enough batteries yet: a figure needs 5 batteries from 3 riders/,
    );
    expect(await section.textContent()).toMatch(/1 battery of 1 rider, 1 ran flat/);
    expect(await section.getByTestId('battery-claim').textContent()).toBe('No claim from the maker entered yet.');
    await section.scrollIntoViewIfNeeded();
    await saveScreenshot(page, 'model-battery-shopper');
    expect(errors).toEqual([]);
    await context.close();
  });
});
