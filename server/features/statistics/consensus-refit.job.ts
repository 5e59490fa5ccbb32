import type { Knex } from 'knex';
import type { Queue } from '../../jobs/queue';
import { defineQueue } from '../../jobs/queue-schema';
import type { Logger } from '../../lib/logger';
import { ensureConsensusFresh } from './consensus.service';
import { readStatisticsState } from './statistics-state';

// The consensus refit (seconds at scale) runs in a worker, not on the request of
// whoever reads a page first after a like-for-like decision: that reader asks for
// it and gets the last fit, with the time it was made. The request is debounced:
// the job waits a few seconds, and requests meanwhile join it ('stately', one key:
// at most one refit waiting and one running).
export const REFIT_CONSENSUS_QUEUE = 'refit-consensus';
export const CONSENSUS_REFIT_DEBOUNCE_SECONDS = 5;

export async function createConsensusQueue(queue: Queue) {
  await defineQueue(queue, REFIT_CONSENSUS_QUEUE, {
    policy: 'stately',
    retryLimit: 3,
    retryDelay: 10,
    retryBackoff: true,
    expireInSeconds: 600,
  });
}

export async function requestConsensusRefit(queue: Queue): Promise<void> {
  await queue.send(REFIT_CONSENSUS_QUEUE, {}, { singletonKey: 'consensus', startAfter: CONSENSUS_REFIT_DEBOUNCE_SECONDS });
}

export async function workConsensusQueue(queue: Queue, db: Knex, logger: Logger) {
  await queue.work(REFIT_CONSENSUS_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async () => {
    await ensureConsensusFresh(db);
  });
  // A stale fit left by processes that stopped before its refit ran.
  if ((await readStatisticsState(db)).consensusStale)
    await requestConsensusRefit(queue).catch((err) => logger.warn({ err }, 'could not ask for a consensus refit'));
}
