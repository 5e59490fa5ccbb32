import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { insertFirmware } from '../../server/features/catalogue/catalogue.repository';
import { versionOrder } from '../../shared/schemas/catalogue';
import { simulatePair } from '../../shared/simulator/pair';
import { createCatalogue, type TestCatalogue } from '../server/support/catalogue-factory';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('the upload form reads the files before the rider answers', () => {
  const e2e = useBrowserSession();
  let catalogue: TestCatalogue;
  let newer: { id: number };
  const files = { a: '', b: '' };

  beforeAll(async () => {
    catalogue = await createCatalogue(e2e.db);
    newer = await insertFirmware(e2e.db, {
      modelId: catalogue.spider.id,
      version: '2.2.0',
      versionOrder: versionOrder('2.2.0'),
      status: 'approved',
    });
    // A's head unit is the catalogue's recording device (software 12.4) and its power meter runs 2.1 (FIT software_version 2.1).
    const headUnit = {
      manufacturerId: 255,
      productId: 7,
      serialNumber: 51_001,
      softwareVersion: 12.4,
      productName: catalogue.headUnit.name,
    };
    const pair = simulatePair({
      seed: 2114,
      durationSeconds: 1500,
      profile: 'endurance',
      a: { position: 'total', device: headUnit, sensor: { manufacturerId: 255, productId: 3, serialNumber: 61_001, softwareVersion: 2.1 } },
      b: { position: 'dual' },
    });
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-prefill-'));
    files.a = path.join(dir, 'a.fit');
    files.b = path.join(dir, 'b.fit');
    fs.writeFileSync(files.a, pair.a);
    fs.writeFileSync(files.b, pair.b);
  });

  it("when the files are chosen and A's model is picked, then the meter's and the recording device's firmware come from the file, and a different firmware is questioned before sending", async () => {
    const page = await e2e.signedInPage('prefill-rider', '/submit');
    const errors = watchConsole(page);
    await page.getByRole('heading', { name: 'Two meters, one ride' }).waitFor();
    await page.locator('#file-a').setInputFiles(files.a);
    await page.locator('#file-b').setInputFiles(files.b);
    await page.getByRole('region', { name: 'First look, in your browser' }).getByText('First bias, A vs B').waitFor();

    // The recording device's firmware is filled as soon as the files are read; the meter's firmware once the model is known.
    await expect.poll(() => page.locator('#a-device-firmware').inputValue()).toBe('12.4');
    await page.locator('#a-maker').selectOption(String(catalogue.maker.id));
    await page.locator('#a-model').selectOption(String(catalogue.spider.id));
    await expect.poll(() => page.locator('#a-firmware').inputValue()).toBe(String(catalogue.spiderFirmware.id));
    expect(await page.getByTestId('file-tag-warnings-a').count()).toBe(0);

    await page.locator('#a-firmware').selectOption(String(newer.id));
    const warning = page.getByTestId('file-tag-warnings-a');
    await warning.waitFor();
    expect(await warning.textContent()).toMatch(/power meter's firmware you chose 2\.2\.0; the file says 2\.1/);
    await warning.scrollIntoViewIfNeeded();
    await saveScreenshot(page, 'upload-prefill-warning');
    expect(errors).toEqual([]);
  });
});
