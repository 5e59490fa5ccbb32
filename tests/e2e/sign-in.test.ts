import { describe, expect, it } from 'vitest';
import { saveScreenshot, watchConsole } from './support/browser';
import { useBrowserSession } from './support/browser-session';

describe('signing in in the browser', () => {
  const e2e = useBrowserSession();

  it('when a visitor creates an identity on the fake provider page, then they land back signed in with their name in the header, and can sign out', async () => {
    const page = await e2e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    const errors = watchConsole(page);
    await page.goto(e2e.baseUrl);

    await page.getByRole('link', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Who do you want to be?' }).waitFor();
    await saveScreenshot(page, 'fake-provider');
    await page.getByLabel('Name').fill('Sola Brennvik');
    await page.getByLabel('Handle').fill('sola-brennvik');
    await page.getByLabel('E-mail').fill('sola@riders.crosswatt.test');
    await page.getByRole('button', { name: 'Create and continue' }).click();
    await page.getByTestId('signed-in-as').waitFor();

    expect(new URL(page.url()).origin).toBe(e2e.baseUrl);
    expect(await page.getByTestId('signed-in-as').textContent()).toContain('Sola Brennvik');
    await saveScreenshot(page, 'signed-in');

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByRole('link', { name: 'Sign in' }).waitFor();
    expect(await page.getByTestId('signed-in-as').count()).toBe(0);
    await page.reload();
    await page.getByRole('link', { name: 'Sign in' }).waitFor();
    expect(errors.filter((e) => !e.includes('401'))).toEqual([]);
  });

  it('when the demo admin signs in, then they can make another person a moderator on the admin page', async () => {
    const page = await e2e.browser.newPage({ viewport: { width: 1280, height: 900 } });
    await page.goto(`${e2e.baseUrl}/admin/users`);
    await page.getByRole('heading', { name: 'Sign in to continue' }).waitFor();

    await page.getByRole('link', { name: 'Sign in', exact: true }).last().click();
    await page.getByRole('button', { name: /Demo Admin/ }).click();
    await page.getByRole('heading', { name: 'People and roles' }).waitFor();
    const moderatorBox = page.getByRole('checkbox', { name: 'moderator — Demo Rider (@demo-rider)' });
    await moderatorBox.click();
    // The box shows the server's answer, so it turns checked once the grant is saved.
    await page.waitForFunction(
      () => (document.querySelector('input[aria-label="moderator — Demo Rider (@demo-rider)"]') as HTMLInputElement | null)?.checked,
    );

    expect(await moderatorBox.isChecked()).toBe(true);
    await saveScreenshot(page, 'admin-users');
    await page.getByRole('navigation', { name: 'Admin pages' }).getByRole('link', { name: 'Audit log' }).click();
    await page.getByRole('cell', { name: 'role.granted' }).first().waitFor();
    await saveScreenshot(page, 'admin-audit-log');
  });

  it('when a rider opens the admin page, then they see the not-allowed page, not a blank screen', async () => {
    const page = await e2e.browser.newPage();
    await page.goto(`${e2e.baseUrl}/auth/github?login=plain-rider-e2e&returnTo=/admin/users`);

    await page.getByRole('heading', { name: 'This part is not open to you' }).waitFor();

    expect(await page.getByText('This page is for admins.').isVisible()).toBe(true);
  });
});
