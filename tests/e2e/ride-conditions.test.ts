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

describe('a rider reads how the meters behaved as the morning warmed up', () => {
  const e2e = useBrowserSession();
  let submissionId: number;

  beforeAll(async () => {
    const page = await e2e.signedInPage('cold-start-rider', '/');
    await page.getByRole('link', { name: 'Submit a ride' }).waitFor();
    await page.context().close();
    const rider = await e2e.db('users').where({ handle: 'cold-start-rider' }).first('id');
    const catalogue = await createCatalogue(e2e.db);
    // A creeps 2 % per hour from a cold start at 1 °C; its battery goes from good to low.
    const pair = simulatePair({
      seed: 1903,
      durationSeconds: 5400,
      profile: 'endurance',
      a: {
        position: 'total',
        driftPercentPerHour: 2,
        temperature: { startCelsius: 1, changePerHour: 8 },
        sensor: { productId: 3, serialNumber: 9911, softwareVersion: 1.4 },
        sensorBattery: [
          { atFraction: 0.05, status: 2, volts: 2.9 },
          { atFraction: 0.8, status: 4, volts: 2.55 },
        ],
      },
      b: { position: 'total' },
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

  for (const viewport of [
    { name: 'desktop', width: 1366, height: 900 },
    { name: 'phone', width: 390, height: 844 },
  ]) {
    it(`when the result is opened on a ${viewport.name}, then drift, temperature bands and battery reports are shown and the drift is flagged`, async () => {
      const page = await e2e.signedInPage('cold-start-rider', `/submissions/${submissionId}`);
      await page.setViewportSize(viewport);
      const errors = watchConsole(page);
      const block = page.getByRole('region', { name: 'Drift, temperature and batteries' });
      await block.waitFor();

      await expect.poll(() => page.getByTestId('ride-drift').textContent()).toMatch(/moved by \+[12]\.\d points per hour/);
      expect(await block.getByText('The head unit recorded').textContent()).toMatch(/1 to 13 °C/);
      expect(await block.getByRole('row').allTextContents()).toEqual(
        expect.arrayContaining([expect.stringMatching(/^below 5 °C/), expect.stringMatching(/^5 to 15 °C/)]),
      );
      expect(await block.getByRole('list', { name: 'Battery reports' }).textContent()).toMatch(
        /battery good \(2\.90 V\).*battery low \(2\.55 V\)/,
      );
      await page.getByText(/grows by \d\.\d points per hour over the ride/).waitFor();
      const bodyWidth = await page.evaluate(() => document.documentElement.scrollWidth);
      expect(bodyWidth).toBeLessThanOrEqual(viewport.width);

      await block.scrollIntoViewIfNeeded();
      await saveScreenshot(page, `ride-conditions-${viewport.name}`);
      await block.screenshot({ path: `test-output/screenshots/ride-conditions-${viewport.name}-detail.png` });
      expect(errors).toEqual([]);
    });
  }
});
