import type { Db } from '../../../server/db/knex';
import { analyseSubmission } from '../../../server/features/submissions/analyse-submission.job';
import { createSubmission } from '../../../server/features/submissions/submissions.service';
import { createSubmissionInput } from '../../../shared/schemas/submission';
import { type TestCatalogue, submissionMeta } from '../support/catalogue-factory';
import { asBuffer, cleanPair } from '../submissions/fit-pairs';
import { testObjectStore } from '../../support/test-object-store';

let nextSeed = 1000;

/**
 * A rider's submission, stored and analysed, awaiting review. Arranged through the
 * services (the upload itself is tested elsewhere); pass a seed to get the same ride.
 */
export async function submissionAwaitingReview(
  db: Db,
  riderId: number,
  catalogue: TestCatalogue,
  /** pair: a simulated pair of its own (default: the clean pair of the seed). */
  options: { seed?: number; meta?: Record<string, unknown>; pair?: ReturnType<typeof cleanPair> } = {},
) {
  const pair = options.pair ?? cleanPair(options.seed ?? nextSeed++);
  const input = createSubmissionInput.parse(submissionMeta(catalogue, options.meta));
  const { id } = await createSubmission({ db, store: testObjectStore() }, riderId, input, {
    a: { buffer: asBuffer(pair.a), originalName: 'a.fit' },
    b: { buffer: asBuffer(pair.b), originalName: 'b.fit' },
  });
  await analyseSubmission(db, id);
  const row = await db('submissions').where({ id }).first('status', 'version');
  if (row.status !== 'awaiting_review') throw new Error(`submission ${id} is ${row.status}, not awaiting review`);
  return { id, version: row.version as number, pair };
}

/** Waits until the fake SMTP service has captured a message to `address` matching the subject. */
export async function capturedMail(db: Db, address: string, subject: RegExp, timeoutMs = 15_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const rows = await db('mail_outbox').whereRaw('? = any(recipients)', [address]).orderBy('id', 'desc').select('*');
    const found = rows.find((r) => subject.test(r.subject));
    if (found) return found as { subject: string; text_body: string; recipients: string[]; headers: Record<string, string> };
    if (Date.now() > until)
      throw new Error(`no mail to ${address} matching ${subject} (got: ${rows.map((r) => r.subject).join(' | ') || 'none'})`);
    await new Promise((r) => setTimeout(r, 150));
  }
}
