// The soak's load: riders uploading simulated pairs (with some duplicates and some
// bad files), a moderator deciding, readers on the public pages and two riders
// replying in a thread, each request to the other web process. What the servers
// acknowledged is kept, to be checked against the database afterwards.
import { simulatePair } from '../../shared/simulator/pair';
import type { SoakCatalogue } from './soak-catalogue';
import type { Alternator, Session } from './soak-http';

export interface LoadContext {
  webs: Alternator;
  catalogue: SoakCatalogue;
  /** The load stops being generated at this time (ms since the epoch). */
  until: number;
}

export interface Acknowledged {
  /** Submission ids the servers answered 201 for (or 409 "uploaded before" for a retry of an unanswered upload). */
  submissions: Set<number>;
  duplicatesRefused: number;
  badFilesRefused: number;
  /** Decisions answered 200, by submission id. */
  decisions: Map<number, string>;
  /** Decisions sent but never answered (their outcome is read from the database). */
  decisionsUnanswered: Set<number>;
  posts: number;
  pageViews: number;
  /** Answers the soak did not expect (a good pair refused, a duplicate stored…), by what and status. */
  unexpected: Map<string, number>;
}

export function emptyAcknowledged(): Acknowledged {
  return {
    submissions: new Set(),
    duplicatesRefused: 0,
    badFilesRefused: 0,
    decisions: new Map(),
    decisionsUnanswered: new Set(),
    posts: 0,
    pageViews: 0,
    unexpected: new Map(),
  };
}

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));
const noAnswer = (status: number) => status === 0 || status >= 500 || status === 429;

function unexpected(ack: Acknowledged, what: string, status: number) {
  const key = `${what} → ${status}`;
  ack.unexpected.set(key, (ack.unexpected.get(key) ?? 0) + 1);
}

interface Pair {
  a: Uint8Array;
  b: Uint8Array;
}

let nextSeed = 1;
/** A 15-minute ride (the engine wants 10) on a spider reading 0–4 % high; each seed gives other files. */
function newPair(): Pair {
  const seed = nextSeed++;
  return simulatePair({
    seed,
    durationSeconds: 900,
    profile: 'endurance',
    a: { position: 'total', scale: 1 + (seed % 5) / 100, noisePercent: 1 },
    b: { position: 'dual', scale: 1, noisePercent: 1 },
  });
}

function uploadForm(catalogue: SoakCatalogue, pair: Pair): FormData {
  const form = new FormData();
  form.set('meta', JSON.stringify(catalogue.meta));
  form.set('fileA', new Blob([Buffer.from(pair.a)]), 'a.fit');
  form.set('fileB', new Blob([Buffer.from(pair.b)]), 'b.fit');
  return form;
}

/** Bad files the server must refuse with a 400: bytes that are no FIT file, or a file cut short. */
function badPair(n: number): Pair {
  const good = newPair();
  return n % 2 === 0
    ? { a: new TextEncoder().encode('not a FIT file at all'), b: good.b }
    : { a: good.a.slice(0, Math.floor(good.a.length / 3)), b: good.b };
}

/**
 * One rider uploading until the load stops; an upload that got no answer (or a 5xx,
 * or a 429) is sent again, and its "uploaded before" answer then names the stored one.
 * After the load stops, the unanswered ones are retried for up to `settleMs`.
 */
export async function uploadLoop(rider: Session, ctx: LoadContext, ack: Acknowledged, settleMs = 60_000): Promise<void> {
  const unanswered: Pair[] = [];
  const stored: Pair[] = [];
  const send = async (pair: Pair) => rider.send(ctx.webs.next(), 'POST', '/api/submissions', uploadForm(ctx.catalogue, pair));
  const retry = async (pair: Pair) => {
    const answer = await send(pair);
    const id =
      answer.status === 201 ? (answer.body as { id: number }).id : answer.status === 409 ? conflictSubmissionId(answer.body) : undefined;
    if (id !== undefined) {
      ack.submissions.add(id);
      stored.push(pair);
    } else if (noAnswer(answer.status)) unanswered.push(pair);
    else unexpected(ack, 'upload sent again', answer.status);
  };
  for (let n = 1; Date.now() < ctx.until; n++) {
    if (unanswered.length > 0) await retry(unanswered.shift()!);
    else if (n % 6 === 0 && stored.length > 0) {
      const answer = await send(stored[n % stored.length]!);
      if (answer.status === 409) ack.duplicatesRefused++;
      else if (!noAnswer(answer.status)) unexpected(ack, 'duplicate upload', answer.status);
    } else if (n % 7 === 0) {
      const answer = await send(badPair(n));
      if (answer.status === 400) ack.badFilesRefused++;
      else if (!noAnswer(answer.status)) unexpected(ack, 'bad file', answer.status);
    } else {
      const pair = newPair();
      const answer = await send(pair);
      if (answer.status === 201) {
        ack.submissions.add((answer.body as { id: number }).id);
        stored.push(pair);
      } else if (noAnswer(answer.status)) unanswered.push(pair);
      else unexpected(ack, 'new upload', answer.status);
    }
    await pause(300);
  }
  const settleUntil = Date.now() + settleMs;
  while (unanswered.length > 0 && Date.now() < settleUntil) {
    await retry(unanswered.shift()!);
    if (unanswered.length > 0) await pause(1_000);
  }
  for (const _ of unanswered) unexpected(ack, 'upload never answered', 0);
}

function conflictSubmissionId(body: unknown): number | undefined {
  const id = (body as { error?: { details?: { submissionId?: unknown } } })?.error?.details?.submissionId;
  return typeof id === 'number' ? id : undefined;
}

/** A moderator taking the oldest submission in the queue, accepting two in three and rejecting the third. */
export async function moderationLoop(moderator: Session, ctx: LoadContext, ack: Acknowledged): Promise<void> {
  for (let n = 0; Date.now() < ctx.until; n++) {
    const queue = await moderator.send(ctx.webs.next(), 'GET', '/api/moderation/queue');
    const next =
      queue.status === 200
        ? (queue.body as { submissions: { id: number; version: number }[] }).submissions.find((s) => !ack.decisionsUnanswered.has(s.id))
        : undefined;
    if (next) {
      const decision =
        n % 3 === 2
          ? { decision: 'reject', reason: 'not_calibrated', expectedVersion: next.version }
          : { decision: 'accept', expectedVersion: next.version };
      const answer = await moderator.send(ctx.webs.next(), 'POST', `/api/moderation/submissions/${next.id}/decision`, decision);
      if (answer.status === 200) ack.decisions.set(next.id, (answer.body as { status: string }).status);
      else if (noAnswer(answer.status)) ack.decisionsUnanswered.add(next.id);
      else if (answer.status !== 409) unexpected(ack, 'decision', answer.status);
    } else if (queue.status !== 200 && !noAnswer(queue.status)) unexpected(ack, 'review queue', queue.status);
    await pause(400);
  }
}

/** Someone browsing: the scoreboard, the models, a firmware page, a thread list and submissions. */
export async function readingLoop(reader: Session, ctx: LoadContext, ack: Acknowledged): Promise<void> {
  const { spider, pedals } = ctx.catalogue;
  for (let n = 0; Date.now() < ctx.until; n++) {
    const ids = [...ack.submissions];
    const pages = [
      '/api/scoreboard',
      `/api/models/${spider.slug}`,
      `/api/models/${pedals.slug}`,
      `/api/models/${spider.slug}/firmware/${spider.firmware}`,
      `/api/models/${spider.slug}/threads`,
      ids.length > 0 ? `/api/submissions/${ids[n % ids.length]}` : '/api/scoreboard',
    ];
    const page = pages[n % pages.length]!;
    const answer = await reader.send(ctx.webs.next(), 'GET', page);
    // A submission not yet accepted is not public: 404 is its right answer.
    if (answer.status === 200 || (answer.status === 404 && page.startsWith('/api/submissions/'))) ack.pageViews++;
    else if (!noAnswer(answer.status)) unexpected(ack, `GET ${page.replace(/\d+$/, ':id')}`, answer.status);
    await pause(150);
  }
}

/** Two riders replying to each other in one thread: each reply mails the other (posting follows the thread). */
export async function threadLoop(riders: [Session, Session], ctx: LoadContext, ack: Acknowledged): Promise<void> {
  let threadId: number | undefined;
  for (let n = 0; Date.now() < ctx.until; n++) {
    const poster = riders[n % 2]!;
    if (threadId === undefined) {
      const created = await poster.send(ctx.webs.next(), 'POST', `/api/models/${ctx.catalogue.spider.slug}/threads`, {
        title: 'Does the Tidal read high on cold mornings?',
        body: 'Mine reads a few percent above my pedals until it warms up.',
      });
      if (created.status === 201) threadId = (created.body as { id: number }).id;
      else if (!noAnswer(created.status)) unexpected(ack, 'new thread', created.status);
    } else {
      const answer = await poster.send(ctx.webs.next(), 'POST', `/api/threads/${threadId}/posts`, {
        body: `Reply ${n}: same here after the zero offset.`,
      });
      if (answer.status === 201) ack.posts++;
      else if (!noAnswer(answer.status)) unexpected(ack, 'reply', answer.status);
    }
    await pause(1_500);
  }
}
