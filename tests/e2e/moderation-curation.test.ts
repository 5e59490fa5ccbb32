import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { insertFirmware, insertRecordingDevice } from '../../server/features/catalogue/catalogue.repository';
import { ensureDemoIdentity } from '../../server/fakes/demo-identities';
import { versionOrder } from '../../shared/schemas/catalogue';
import { createCatalogue, type TestCatalogue } from '../server/support/catalogue-factory';
import { acceptSubmission, insertAnalysedSubmission, insertRider } from '../server/support/statistics-factory';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

// A curator's path: a pinned note, a model hidden from the scoreboard, a firmware
// version merged into the one it really is, and a recording device renamed.
describe('catalogue curation in the browser', () => {
  const e2e = useBrowserSession();
  let catalogue: TestCatalogue;
  let newer: { id: number };

  beforeAll(async () => {
    catalogue = await createCatalogue(e2e.db);
    newer = await insertFirmware(e2e.db, {
      modelId: catalogue.spider.id,
      version: '2.2.0',
      versionOrder: versionOrder('2.2.0'),
      releasedOn: '2026-05-01',
      status: 'approved',
    });
    const riders = [await insertRider(e2e.db), await insertRider(e2e.db)];
    // Two rides on each spider firmware, against the pedals.
    for (const [i, firmwareId] of [catalogue.spiderFirmware.id, catalogue.spiderFirmware.id, newer.id, newer.id].entries()) {
      const id = await insertAnalysedSubmission(e2e.db, {
        riderId: riders[i % 2],
        a: { modelId: catalogue.spider.id, firmwareId, recordingDeviceId: catalogue.headUnit.id },
        b: {
          modelId: catalogue.pedals.id,
          firmwareId: catalogue.pedalsFirmware.id,
          recordingDeviceId: catalogue.headUnit.id,
          position: 'dual',
        },
        biasPercent: 1 + i / 2,
        pedallingHours: 1.5,
      });
      await acceptSubmission(e2e.db, id);
    }
    await ensureDemoIdentity(e2e.db, { handle: 'curating-moderator', name: 'Curating Moderator', roles: ['moderator'] });
  });

  const openTool = (page: Page, name: string | RegExp) => page.locator('summary').filter({ hasText: name }).click();

  it('when a moderator pins a note and hides a model, then a visitor sees the note and the scoreboard leaves the model out', async () => {
    const modelPath = `/models/${catalogue.spider.slug}`;
    const moderator = await e2e.signedInPage('curating-moderator', modelPath);
    const errors = watchConsole(moderator);
    const tools = moderator.getByRole('region', { name: 'Curate this model' });
    await tools.waitFor();

    // Pin a note.
    await openTool(moderator, 'Pinned note');
    await tools
      .getByLabel('Note shown to everyone on this model page')
      .fill('The maker replaced the spider arms in spring 2026; rides before then used the first arms.');
    await tools.getByRole('button', { name: 'Pin the note' }).click();
    await tools.getByText('The note is pinned.').waitFor();
    await moderator
      .getByRole('complementary')
      .getByText(/replaced the spider arms/)
      .waitFor();

    // A rename that clashes with a sibling shows the server's conflict message.
    await openTool(moderator, 'Rename');
    await tools.getByLabel('New model name').fill('Treadle');
    await tools.getByRole('button', { name: 'Rename' }).click();
    await tools.getByRole('alert').getByText('There is already a model with that name.').waitFor();

    // Hide it from the scoreboard.
    await openTool(moderator, 'Scoreboard');
    await tools
      .getByLabel('Why it leaves the scoreboard (shown on its page)')
      .fill('Its submissions are being checked for a mixed-up firmware tag.');
    await tools.getByRole('button', { name: 'Hide from the scoreboard' }).click();
    await moderator.getByText('Left off the scoreboard by the moderators: Its submissions are being checked').waitFor();
    await tools.getByRole('button', { name: 'Show it on the scoreboard again' }).waitFor();
    await moderator.evaluate(() => document.fonts.ready);
    await saveScreenshot(moderator, 'curation-1-model-tools');

    // Merging asks first, saying what moves and that the old name stays.
    await openTool(moderator, 'Merge into another model');
    await tools.getByRole('radio', { name: /Treadle/ }).check();
    await tools.getByLabel('Why they are the same (kept in the audit log)').fill('Only checking the confirmation.');
    await tools.getByRole('button', { name: 'Review the merge…' }).click();
    const confirmation = tools.getByRole('alertdialog');
    await confirmation.getByText(/takes over the firmware versions of “Orbit” .* all its submissions and their statistics/).waitFor();
    await confirmation.getByText(/its name stays as an alias/).waitFor();
    await saveScreenshot(moderator, 'curation-2-model-merge-confirmation');
    await confirmation.getByRole('button', { name: 'Cancel' }).click();
    expect(errors.filter((error) => !error.includes('status of 409'))).toEqual([]);

    // A visitor sees the note and no tools; the scoreboard leaves the model out.
    const visitor = await e2e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await visitor.goto(`${e2e.baseUrl}${modelPath}`);
    await visitor.getByText(/replaced the spider arms/).waitFor();
    await expect(visitor.getByRole('region', { name: 'Curate this model' }).count()).resolves.toBe(0);
    await visitor.goto(`${e2e.baseUrl}/scoreboard?maker=${catalogue.maker.slug}`);
    await visitor.getByRole('link', { name: 'Treadle' }).waitFor();
    await expect(visitor.getByRole('link', { name: 'Orbit' }).count()).resolves.toBe(0);
    await saveScreenshot(visitor, 'curation-3-scoreboard-without-model');
    await visitor.close();
  });

  it('when a moderator merges a firmware version into another, then the kept version carries its rides and the old version finds it as an alias', async () => {
    const moderator = await e2e.signedInPage('curating-moderator', `/models/${catalogue.spider.slug}/firmware/2.1.0`);
    const errors = watchConsole(moderator);
    const tools = moderator.getByRole('region', { name: 'Curate this firmware version' });
    await tools.waitFor();

    await openTool(moderator, 'Merge into another version');
    await tools.getByLabel('Search: The Orbit version to keep').fill('2.2');
    await tools.getByRole('radio', { name: /2\.2\.0/ }).check();
    await tools
      .getByLabel('Why they are the same (kept in the audit log)')
      .fill('The maker confirmed 2.1.0 was a mislabelled 2.2.0 build.');
    await tools.getByRole('button', { name: 'Review the merge…' }).click();
    await tools
      .getByRole('alertdialog')
      .getByText(/“2\.2\.0” takes over all submissions tagged “2\.1\.0” and their statistics/)
      .waitFor();
    await saveScreenshot(moderator, 'curation-4-firmware-merge-confirmation');
    await tools.getByRole('button', { name: 'Merge into “2.2.0”' }).click();

    // The page moves to the kept version, which now counts all four rides.
    await moderator.waitForURL(/\/firmware\/2\.2\.0$/);
    await moderator.getByRole('heading', { level: 1, name: /firmware 2\.2\.0/ }).waitFor();
    await tools.getByText('Firmware 2.1.0 was merged into this version: 2 recordings moved. The old version stays as an alias.').waitFor();
    await moderator.evaluate(() => document.fonts.ready);
    await saveScreenshot(moderator, 'curation-5-kept-firmware');
    const moved = await e2e.db('submission_recordings').where({ firmware_id: newer.id }).count<{ count: string }[]>('* as count');
    expect(Number(moved[0].count)).toBe(4);
    const alias = await moderator.request.get(`${e2e.baseUrl}/api/catalogue/aliases?type=firmware&q=2.1.0`);
    expect((await alias.json()).id).toBe(newer.id);
    // The model page lists only the kept version.
    await moderator.goto(`${e2e.baseUrl}/models/${catalogue.spider.slug}`);
    await moderator
      .getByRole('row', { name: /2\.2\.0/ })
      .first()
      .waitFor();
    await expect(moderator.getByRole('row', { name: /2\.1\.0/ }).count()).resolves.toBe(0);
    expect(errors).toEqual([]);
  });

  it('when a moderator renames a recording device on the catalogue page, then the catalogue uses the new name', async () => {
    const device = await insertRecordingDevice(e2e.db, {
      slug: `trailmate-${catalogue.maker.id}`,
      name: `Trailmate ${catalogue.maker.id}`,
      kind: 'watch',
      status: 'approved',
    });
    const moderator = await e2e.signedInPage('curating-moderator', '/moderation/catalogue');
    const errors = watchConsole(moderator);
    const devices = moderator.getByRole('region', { name: 'Recording devices' });
    await devices.waitFor();

    await devices.getByLabel('Search: The recording device to rename or merge away').fill(`Trailmate ${catalogue.maker.id}`);
    await devices.getByRole('radio', { name: new RegExp(`Trailmate ${catalogue.maker.id}`) }).check();
    await openTool(moderator, `Rename “Trailmate ${catalogue.maker.id}”`);
    await devices.getByLabel('New recording device name').fill(`Trailmate Two ${catalogue.maker.id}`);
    await devices.getByRole('button', { name: 'Rename' }).click();
    await devices.getByText(/Renamed: .* and the old name still finds it\./).waitFor();
    await openTool(moderator, /Merge “Trailmate Two/);
    await moderator.evaluate(() => document.fonts.ready);
    await saveScreenshot(moderator, 'curation-6-catalogue-page');

    expect((await e2e.db('recording_devices').where({ id: device.id }).first('name')).name).toBe(`Trailmate Two ${catalogue.maker.id}`);
    expect(errors).toEqual([]);
  });
});
