import fs from 'node:fs';
import path from 'node:path';
import { type Browser, chromium, type Page } from 'playwright-core';
import { chromiumPath } from '../../../scripts/lib/chromium';

export const SCREENSHOT_DIR = path.resolve('test-output/screenshots');

// Debian's Chromium, headless, with nothing reaching out to the network.
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: chromiumPath(),
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
    ],
  });
}

// A signed-out visitor's "who am I?" request is answered 401 by design; Chromium
// logs every failed request as a console error, so that one is expected.
const expectedFailures = [{ path: '/api/me', status: 401 }];

function isExpectedFailure(text: string, url: string | undefined): boolean {
  return expectedFailures.some((f) => url?.endsWith(f.path) && text.includes(`status of ${f.status}`));
}

/** Collects console errors and uncaught page errors for a test to assert on. */
export function watchConsole(page: Page): string[] {
  const errors: string[] = [];
  page.on('console', (msg) => {
    if (msg.type() === 'error' && !isExpectedFailure(msg.text(), msg.location().url)) errors.push(msg.text());
  });
  page.on('pageerror', (err) => errors.push(err.message));
  return errors;
}

export async function saveScreenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  const file = path.join(SCREENSHOT_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * A page in a fresh browser context, signed in as `handle` through the fake OAuth
 * provider (which approves `login=<handle>` without its form) and landed on `returnTo`.
 */
export async function signedInPage(browser: Browser, baseUrl: string, handle: string, returnTo = '/'): Promise<Page> {
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  await page.goto(`${baseUrl}/auth/github?login=${encodeURIComponent(handle)}&returnTo=${encodeURIComponent(returnTo)}`);
  return page;
}
