import { describe, expect, it } from 'vitest';
import { createCatalogue } from '../server/support/catalogue-factory';
import { submissionAwaitingReview } from '../server/moderation/moderation-fixtures';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('a moderator clears a flagged submission in the browser', () => {
  const e2e = useBrowserSession();

  it('when the demo moderator rejects a flagged submission with a reason, then the rider’s page shows the rejection and the Outbox shows the e-mail', async () => {
    // Arrange: a rider (signed in once, so the account exists) with an analysed submission carrying a severe flag.
    const riderPage = await e2e.signedInPage('journey-rider-7', '/');
    await riderPage.getByRole('link', { name: 'Submit a ride' }).waitFor();
    const rider = await e2e.db('users').where({ handle: 'journey-rider-7' }).first('id');
    const catalogue = await createCatalogue(e2e.db);
    const { id } = await submissionAwaitingReview(e2e.db, rider.id, catalogue);
    const flags = [
      {
        code: 'low_correlation',
        severity: 'severe',
        message: 'The two power traces barely move together: these may not be recordings of the same ride.',
      },
    ];
    await e2e
      .db('submissions')
      .where({ id })
      .update({ flags: JSON.stringify(flags), flag_severity: 3 });

    // The queue, through the header link.
    const moderator = await e2e.signedInPage('demo-moderator', '/');
    const errors = watchConsole(moderator);
    await moderator.getByRole('link', { name: 'Review queue' }).click();
    await moderator.getByRole('heading', { name: 'Review queue' }).waitFor();
    const row = moderator.getByRole('row').filter({ has: moderator.getByRole('link', { name: `#${id}` }) });
    await row.getByText('Problem').waitFor();
    await row.getByText('low correlation').waitFor();
    await saveScreenshot(moderator, 'moderation-1-queue');

    // The review page: flags with guidance, files against tags, the decision.
    await moderator.getByRole('link', { name: `#${id}` }).click();
    await moderator.getByRole('heading', { name: 'Flags and what to check' }).waitFor();
    await moderator.getByText(/if their efforts do not line up/).waitFor();
    await moderator.getByRole('heading', { name: 'The files against the tags' }).waitFor();
    await saveScreenshot(moderator, 'moderation-2-review');
    await moderator.getByRole('radio', { name: /Reject/ }).check();
    await expect(moderator.getByLabel('Reason').inputValue()).resolves.toBe('not_same_ride');
    await moderator.getByLabel('Note to the rider (optional)').fill('Your B file is from a different ride: the efforts do not line up.');
    await moderator.getByRole('button', { name: 'Record the decision' }).click();
    await moderator.getByText('Done: the submission is now rejected').waitFor();
    await saveScreenshot(moderator, 'moderation-3-rejected');
    expect(errors).toEqual([]);

    // The rider sees the rejection with its reason and note.
    await riderPage.goto(`${e2e.baseUrl}/submissions/${id}`);
    const notice = riderPage.getByTestId('decision-notice');
    await notice.getByText('The two files are not from the same ride').waitFor();
    await notice.getByText(/efforts do not line up/).waitFor();
    await expect(riderPage.getByTestId('submission-status').textContent()).resolves.toMatch(/reject/i);
    await saveScreenshot(riderPage, 'moderation-4-rider-page');

    // The Outbox shows the e-mail.
    const admin = await e2e.signedInPage('demo-admin', '/admin/outbox');
    const message = admin.getByTestId('outbox-message').filter({ hasText: `Your submission #${id} was not accepted` });
    await message.waitFor({ timeout: 20_000 });
    await message.getByText(`Your submission #${id} was not accepted`).click();
    await message.getByText('Reason: The two files are not from the same ride').waitFor();
    await expect(message.textContent()).resolves.toContain('journey-rider-7@riders.crosswatt.test');
    await saveScreenshot(admin, 'moderation-5-outbox');
  });

  it('when the demo moderator approves a rider’s proposed firmware on the catalogue page, then it leaves the list and is approved', async () => {
    const catalogue = await createCatalogue(e2e.db);
    const proposer = await e2e.db('users').where({ handle: 'journey-rider-7' }).first('id');
    const [proposed] = await e2e
      .db('firmware_versions')
      .insert({ model_id: catalogue.spider.id, version: '2.4.0', version_order: [2, 4, 0], status: 'pending', proposed_by: proposer.id })
      .returning('id');
    const moderator = await e2e.signedInPage('demo-moderator', '/moderation/catalogue');
    const row = moderator.getByRole('listitem').filter({ hasText: '2.4.0' }).filter({ hasText: 'proposed by journey-rider-7' });
    await row.waitFor();
    await saveScreenshot(moderator, 'moderation-6-catalogue');

    await row.getByRole('button', { name: 'Approve' }).click();

    await row.waitFor({ state: 'detached' });
    expect((await e2e.db('firmware_versions').where({ id: proposed.id }).first('status')).status).toBe('approved');
  });
});
