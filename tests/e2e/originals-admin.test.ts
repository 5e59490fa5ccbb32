import { beforeAll, describe, expect, it } from 'vitest';
import { analyseSubmission } from '../../server/features/submissions/analyse-submission.job';
import { createSubmission } from '../../server/features/submissions/submissions.service';
import { createSubmissionInput } from '../../shared/schemas/submission';
import { createCatalogue, submissionMeta } from '../server/support/catalogue-factory';
import { asBuffer, cleanPair } from '../server/submissions/fit-pairs';
import { testObjectStore } from '../support/test-object-store';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('the kept originals, as admins and moderators see them', () => {
  const e2e = useBrowserSession();
  let submissionId: number;

  beforeAll(async () => {
    const page = await e2e.signedInPage('archive-rider', '/');
    await page.context().close();
    const rider = await e2e.db('users').where({ handle: 'archive-rider' }).first('id');
    const catalogue = await createCatalogue(e2e.db);
    const pair = cleanPair(2001);
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
    it(`when an admin opens People and roles on a ${viewport.name}, then a line gives the store's file count and size`, async () => {
      const page = await e2e.signedInPage('demo-admin', '/admin/users');
      await page.setViewportSize(viewport);
      const errors = watchConsole(page);

      const line = page.getByText(/^File store:/);
      await line.waitFor();

      expect(await line.textContent()).toMatch(/^File store: 2 uploaded files kept, location removed \(\d+(\.\d)?\skB\)$/);
      await saveScreenshot(page, `admin-object-store-${viewport.name}`);
      expect(errors).toEqual([]);
      await page.context().close();
    });
  }

  it('when a moderator reviews a submission, then the evidence says both originals are kept', async () => {
    const page = await e2e.signedInPage('demo-moderator', `/moderation/submissions/${submissionId}`);
    await page.setViewportSize({ width: 1366, height: 900 });

    const line = page.getByText(/^File A: original kept/);
    await line.waitFor();

    expect(await line.textContent()).toBe('File A: original kept (location removed) · File B: original kept (location removed)');
    await saveScreenshot(page, 'review-originals-desktop');
    await page.context().close();
  });
});
