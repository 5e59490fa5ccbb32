import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { createDb, type Db } from '../../../server/db/knex';
import { startAppForBrowser } from './app-server';
import { launchBrowser, signedInPage } from './browser';

export interface BrowserSession {
  /** Set before the file's own beforeAll hooks run. */
  browser: Browser;
  baseUrl: string;
  /** This test file's own database, for arranging data. */
  db: Db;
  signedInPage(handle: string, returnTo?: string): Promise<Page>;
}

/**
 * One browser test file's fixture: the whole app on its own database and a free
 * port, a headless Chromium, and a database handle; all closed after the file.
 * Call it at the top of the describe block, before the file's own hooks.
 */
export function useBrowserSession(): BrowserSession {
  const session = {
    db: createDb(process.env.DATABASE_URL!),
    signedInPage: (handle: string, returnTo?: string) => signedInPage(session.browser, session.baseUrl, handle, returnTo),
  } as BrowserSession;
  beforeAll(async () => {
    session.baseUrl = (await startAppForBrowser()).url;
    session.browser = await launchBrowser();
  });
  afterAll(async () => {
    await session.browser?.close();
    await session.db.destroy();
  });
  return session;
}
