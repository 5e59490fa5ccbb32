import type { Knex } from 'knex';
import type { ObjectStoreSize } from '@shared/schemas/object-store';
import { AppError } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import { type ObjectStore, ObjectStoreError } from '../../lib/object-store';
import { detachRiderOriginals, referencedKeys } from './originals.repository';

// The uploaded files, every coordinate removed, kept in the object store so that a
// newer decoder can read again what today's skips. Keys are content addresses: the
// SHA-256 of the stripped bytes. An upload writes its objects before it commits the
// rows that name them, so a row never points at a missing object; objects that no
// row names (an upload refused after its write, a deleted account whose removal
// failed) are swept once they are older than a grace period.

export const ORIGINALS_PREFIX = 'originals/';

/** `originals/ab/cd/abcd….fit`: two levels of fan-out keep listings of one prefix short on any store. */
export function originalKey(sha256: string): string {
  if (!/^[0-9a-f]{64}$/.test(sha256)) throw new Error(`not a SHA-256 hex digest: ${sha256}`);
  return `${ORIGINALS_PREFIX}${sha256.slice(0, 2)}/${sha256.slice(2, 4)}/${sha256}.fit`;
}

export class StoreUnavailableError extends AppError {
  constructor(
    message = 'The file store is not answering, so your files could not be kept and nothing was saved. Please try again in a few minutes.',
  ) {
    super(503, 'store_unavailable', message);
  }
}

export interface KeptOriginal {
  key: string;
  bytes: number;
}

/** Writes the stripped files; a store that fails refuses the upload (503) before any row is written. */
export async function keepOriginals(store: ObjectStore, originals: Array<{ sha256: string; bytes: Uint8Array }>): Promise<KeptOriginal[]> {
  try {
    return await Promise.all(
      originals.map(async ({ sha256, bytes }) => {
        const key = originalKey(sha256);
        await store.put(key, bytes);
        return { key, bytes: bytes.byteLength };
      }),
    );
  } catch (err) {
    if (err instanceof ObjectStoreError) throw new StoreUnavailableError();
    throw err;
  }
}

/** A recording's stored original is not in the store (it never should be missing). */
export class OriginalMissingError extends Error {
  constructor(readonly key: string) {
    super(`the stored original ${key} is not in the object store`);
    this.name = 'OriginalMissingError';
  }
}

/** A recording's original (location removed) by its original_key: what re-decoding starts from. */
export async function fetchOriginal(store: ObjectStore, key: string): Promise<Uint8Array> {
  const bytes = await store.get(key);
  if (!bytes) throw new OriginalMissingError(key);
  return bytes;
}

/** Removes those of `keys` that no recording refers to any more; a store that fails leaves them to the sweep. */
export async function removeUnreferencedOriginals(
  deps: { db: Knex; store: ObjectStore; logger?: Logger },
  keys: string[],
): Promise<number> {
  const stillReferenced = await referencedKeys(deps.db, keys);
  let removed = 0;
  for (const key of new Set(keys)) {
    if (stillReferenced.has(key)) continue;
    try {
      await deps.store.delete(key);
      removed++;
    } catch (err) {
      if (!(err instanceof ObjectStoreError)) throw err;
      deps.logger?.warn({ err, key }, 'could not remove an original now; the sweep will');
    }
  }
  return removed;
}

/**
 * For account deletion, inside its transaction: detaches the rider's originals from
 * their recordings. Call the returned function after the commit to remove them.
 */
export async function detachOriginalsOfRider(trx: Knex.Transaction, riderId: number) {
  const keys = await detachRiderOriginals(trx, riderId);
  return (deps: { db: Knex; store: ObjectStore; logger?: Logger }) => removeUnreferencedOriginals(deps, keys);
}

export interface SweepReport {
  /** Objects under the prefix. */
  seen: number;
  removed: number;
}

/** Removes objects under `originals/` that no recording refers to and that are older than the grace period. */
export async function sweepUnreferencedOriginals(deps: {
  db: Knex;
  store: ObjectStore;
  graceHours: number;
  now?: Date;
  logger?: Logger;
}): Promise<SweepReport> {
  const cutoff = (deps.now ?? new Date()).getTime() - deps.graceHours * 3600_000;
  const report: SweepReport = { seen: 0, removed: 0 };
  let batch: string[] = [];
  const flush = async () => {
    const referenced = await referencedKeys(deps.db, batch);
    for (const key of batch) {
      if (referenced.has(key)) continue;
      // Written again since it was listed (the same file uploaded anew): young again, so kept.
      const current = await deps.store.head(key);
      if (!current || current.lastModified.getTime() > cutoff) continue;
      await deps.store.delete(key);
      report.removed++;
    }
    batch = [];
  };
  for await (const object of deps.store.list(ORIGINALS_PREFIX)) {
    report.seen++;
    if (object.lastModified.getTime() > cutoff) continue;
    batch.push(object.key);
    if (batch.length >= 500) await flush();
  }
  if (batch.length > 0) await flush();
  if (report.removed > 0) deps.logger?.info(report, 'swept originals no recording refers to');
  return report;
}

/** What the admins see: how much the store holds. */
export async function originalsStoreSize(store: ObjectStore): Promise<ObjectStoreSize> {
  try {
    return await store.size(ORIGINALS_PREFIX);
  } catch (err) {
    if (err instanceof ObjectStoreError)
      throw new StoreUnavailableError('The file store is not answering, so its size cannot be read now.');
    throw err;
  }
}
