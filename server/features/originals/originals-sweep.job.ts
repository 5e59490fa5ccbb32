import type { Knex } from 'knex';
import type { Queue } from '../../jobs/queue';
import type { Logger } from '../../lib/logger';
import type { ObjectStore } from '../../lib/object-store';
import { sweepUnreferencedOriginals } from './originals.service';

export const SWEEP_ORIGINALS_QUEUE = 'sweep-originals';
/** Every hour at :17 (pg-boss runs a schedule once across all processes). */
export const SWEEP_ORIGINALS_CRON = '17 * * * *';

export async function createOriginalsSweepQueue(queue: Queue) {
  await queue.createQueue(SWEEP_ORIGINALS_QUEUE, { name: SWEEP_ORIGINALS_QUEUE, retryLimit: 2, retryDelay: 60 });
}

export async function workOriginalsSweepQueue(queue: Queue, deps: { db: Knex; store: ObjectStore; logger: Logger; graceHours: number }) {
  await queue.work(SWEEP_ORIGINALS_QUEUE, { batchSize: 1 }, async () => {
    await sweepUnreferencedOriginals(deps);
  });
  await queue.schedule(SWEEP_ORIGINALS_QUEUE, SWEEP_ORIGINALS_CRON);
}
