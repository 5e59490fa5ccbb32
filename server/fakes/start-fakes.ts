import type { Db } from '../db/knex';
import type { Logger } from '../lib/logger';
import { ensureDemoPeople } from './demo-identities';
import { startFakeOAuth } from './fake-oauth';
import { startFakeS3 } from './fake-s3';
import { type FakeSmtp, startFakeSmtp } from './fake-smtp';

export interface LocalFakes {
  /** Environment overrides that point the app at the fakes. */
  env: Record<string, string>;
  /** The mail service alone, to take it down and bring it back on the same port (the soak's outage). */
  smtp: { stop(): Promise<void>; start(): Promise<void> };
  stop(): Promise<void>;
}

// Starts the loopback stand-ins for hosted services (OAuth provider, SMTP, object
// storage) and returns the settings that point the app at them. Used by npm start and tests.
export async function startLocalFakes(options: {
  db: Db;
  logger: Logger;
  host?: string;
  /** Where the fake object store keeps its files (default: a temporary folder removed on stop); false: no fake store. */
  objectStore?: { directory?: string } | false;
}): Promise<LocalFakes> {
  const stops: Array<() => Promise<void>> = [];
  const env: Record<string, string> = {};

  // OAuth: its page offers the demo people (demo-admin, demo-moderator, demo-rider).
  await ensureDemoPeople(options.db);
  const oauth = await startFakeOAuth({ db: options.db, host: options.host });
  stops.push(oauth.stop);
  Object.assign(env, oauth.env);

  // SMTP: every message lands in mail_outbox, read by the admin Outbox page.
  let smtp: FakeSmtp | undefined = await startFakeSmtp({ db: options.db, host: options.host });
  Object.assign(env, smtp.env);
  const smtpControl = {
    async stop() {
      await smtp?.stop();
      smtp = undefined;
    },
    async start() {
      smtp ??= await startFakeSmtp({ db: options.db, host: options.host, port: Number(env.SMTP_PORT) });
    },
  };
  stops.push(smtpControl.stop);

  // Object storage: the uploads' originals (location removed), through the S3 API.
  if (options.objectStore !== false) {
    const s3 = await startFakeS3({ host: options.host, directory: options.objectStore?.directory });
    stops.push(s3.stop);
    Object.assign(env, s3.env);
  }
  return {
    env,
    smtp: smtpControl,
    async stop() {
      for (const stop of stops.reverse()) await stop();
    },
  };
}
