import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { Queue } from '../../jobs/queue';
import { requestConsensusRefit } from '../statistics/consensus-refit.job';
import { ensureConsensusFresh } from '../statistics/consensus.service';
import { readStatisticsState, type StatisticsState } from '../statistics/statistics-state';

// Whole public responses, kept in this process while the statistics version stays
// the same (migration 20261201005000 bumps it at the commit of every change to what
// the pages show). The version is read from the database for every request, before
// the data, so another process's decision shows at once and a response is never
// kept under a newer version than the data it shows. Concurrent misses for one page
// share one computation, and concurrent requests share one version read.

const MAX_PAGES = 1_000;

/** A response body ready to send: encoded once, with its entity tag. */
export interface KeptPage {
  body: Buffer;
  etag: string;
}

export interface PageCache {
  get(key: string, render: () => Promise<string>): Promise<KeptPage>;
}

function keptPage(text: string): KeptPage {
  const body = Buffer.from(text);
  return { body, etag: `"${createHash('sha1').update(body).digest('base64url')}"` };
}

/**
 * The statistics state as read by a query that started after the call: a read
 * already in flight may have started before a change this caller must see, so
 * callers arriving meanwhile share the next read instead.
 */
function stateReader(db: Knex): () => Promise<StatisticsState> {
  let inFlight: Promise<StatisticsState> | null = null;
  let next: Promise<StatisticsState> | null = null;
  const read = (): Promise<StatisticsState> => {
    if (!inFlight) {
      inFlight = readStatisticsState(db).finally(() => {
        inFlight = null;
      });
      return inFlight;
    }
    next ??= inFlight
      .catch(() => undefined)
      .then(() => {
        next = null;
        return read();
      });
    return next;
  };
  return read;
}

/**
 * With a queue, stale consensus offsets are refitted by a worker (asked for here,
 * at most once per debounce interval from this process) and pages show the last
 * fit meanwhile; without one (scripts, tests without a queue) the first reader refits.
 */
export function createPageCache(db: Knex, { queue, maxPages = MAX_PAGES }: { queue?: Queue; maxPages?: number } = {}): PageCache {
  const readState = stateReader(db);
  let version = -1;
  const pages = new Map<string, Promise<KeptPage>>();
  let refitAskedAt = 0;
  const askForRefit = (q: Queue) => {
    if (Date.now() - refitAskedAt < 1000) return;
    refitAskedAt = Date.now();
    requestConsensusRefit(q).catch(() => {
      refitAskedAt = 0;
    });
  };

  return {
    async get(key, render) {
      let state = await readState();
      if (state.consensusStale && queue) askForRefit(queue);
      else if (state.consensusStale) {
        // A decision marked the consensus offsets stale: refit (one process claims it), then read the new version.
        await ensureConsensusFresh(db);
        state = await readState();
      }
      if (state.version < version) return keptPage(await render()); // older than what is kept: answer, do not keep
      if (state.version > version) {
        pages.clear();
        version = state.version;
      }
      const kept = pages.get(key);
      if (kept) return kept;
      const rendered = render().then(keptPage);
      if (pages.size >= maxPages) pages.delete(pages.keys().next().value as string);
      pages.set(key, rendered);
      rendered.catch(() => {
        if (pages.get(key) === rendered) pages.delete(key);
      });
      return rendered;
    },
  };
}
