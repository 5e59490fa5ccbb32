import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseSubmission } from '../../server/features/submissions/analyse-submission.job';
import { createSubmission } from '../../server/features/submissions/submissions.service';
import { createSubmissionInput } from '../../shared/schemas/submission';
import { simulatePair } from '../../shared/simulator/pair';
import { createCatalogue, submissionMeta } from '../server/support/catalogue-factory';
import { asBuffer } from '../server/submissions/fit-pairs';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';
import { testObjectStore } from '../support/test-object-store';

describe('a reviewer inspects one ride on its result page', () => {
  const e2e = useBrowserSession();
  let submissionId: number;

  beforeAll(async () => {
    const page = await e2e.signedInPage('inspecting-rider', '/');
    await page.getByRole('link', { name: 'Submit a ride' }).waitFor();
    await page.context().close();
    const rider = await e2e.db('users').where({ handle: 'inspecting-rider' }).first('id');
    const catalogue = await createCatalogue(e2e.db);
    // Intervals with sprints and cadence steps; A drops out twice (once losing cadence too), B once.
    const pair = simulatePair({
      seed: 808,
      durationSeconds: 2400,
      profile: 'race',
      a: {
        position: 'total',
        scale: 1.02,
        cadenceLagSeconds: 2,
        dropouts: [
          { kind: 'power', startSecond: 900, durationSeconds: 6 },
          { kind: 'power', startSecond: 2000, durationSeconds: 4 },
          { kind: 'cadence', startSecond: 2000, durationSeconds: 4 },
        ],
      },
      b: { position: 'dual', dropouts: [{ kind: 'power', startSecond: 1200, durationSeconds: 8 }] },
    });
    const { id } = await createSubmission(
      { db: e2e.db, store: testObjectStore() },
      rider.id,
      createSubmissionInput.parse(submissionMeta(catalogue)),
      {
        a: { buffer: asBuffer(pair.a), originalName: 'a.fit' },
        b: { buffer: asBuffer(pair.b), originalName: 'b.fit' },
      },
    );
    await analyseSubmission(e2e.db, id);
    submissionId = id;
  });

  async function openResult(viewport: { width: number; height: number }): Promise<{ page: Page; errors: string[] }> {
    const page = await e2e.signedInPage('inspecting-rider', `/submissions/${submissionId}`);
    await page.setViewportSize(viewport);
    const errors = watchConsole(page);
    await page.getByRole('heading', { name: 'Inspect the ride' }).waitFor();
    await page.getByTestId('section-panel').waitFor();
    return { page, errors };
  }

  it('when the reviewer types a section, drags across the chart and picks a dropout, then the section figures follow each time', async () => {
    const { page, errors } = await openResult({ width: 1280, height: 900 });
    const text = page.getByTestId('section-text');
    expect(await text.textContent()).toMatch(/^0:00–\d+:\d\d \(\d+ s matched\)/);

    // Typed, by keyboard only: From, To, Enter.
    await page.getByLabel('From').fill('5:00');
    await page.getByLabel('To').fill('15:00');
    await page.getByLabel('To').press('Enter');
    await expect
      .poll(() => text.textContent())
      .toMatch(/^5:00–15:00 \(\d+ s matched\): .+ W against .+ W, difference [+−]\d+\.\d W \([+−]?\d+\.\d %\); peaks \d+ W and \d+ W\.$/);

    // The pointer: a readout under it, and a drag chooses a section.
    const plot = page.locator('.u-over').first();
    const box = (await plot.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.3, box.y + box.height / 2);
    await expect.poll(() => page.getByTestId('trace-readout').textContent()).toMatch(/· A \d+ W · B \d+ W · cadence A/);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height / 2, { steps: 5 });
    await page.mouse.up();
    await expect.poll(() => text.textContent()).not.toMatch(/^5:00–15:00/);

    // The dropout table: three rows in ride order; choosing one jumps there.
    const dropouts = page.getByRole('region', { name: 'Dropouts' });
    expect(await dropouts.getByRole('row').count()).toBe(4);
    await dropouts.getByRole('button', { name: /Show the dropout of B at 20:00/ }).click();
    await expect.poll(() => text.textContent()).toMatch(/^20:00–20:08/);
    expect(await dropouts.textContent()).toContain('yes');

    await page.getByRole('region', { name: 'Sprints' }).getByRole('row').nth(1).waitFor();
    await page
      .getByRole('region', { name: 'Cadence response' })
      .getByText(/Median lag on steps up \+2 s/)
      .waitFor();
    await page.getByTestId('ride-balance').waitFor();
    await page.getByText('Hard-effort weighted average').waitFor();
    await saveScreenshot(page, 'ride-inspection-desktop');
    await page
      .getByRole('region', { name: 'Inspect the ride' })
      .screenshot({ path: 'test-output/screenshots/ride-inspection-desktop-detail.png' });
    expect(errors).toEqual([]);
  });

  it('when the page is opened on a phone, then the inspection fits 390 px without sideways scrolling', async () => {
    const { page, errors } = await openResult({ width: 390, height: 844 });

    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await page.getByRole('button', { name: 'Copy as text' }).waitFor();
    await saveScreenshot(page, 'ride-inspection-phone');
    expect(errors).toEqual([]);
  });
});
