import type { Knex } from 'knex';

// Which stored originals the recordings refer to (submission_recordings.original_key).

/** Those of `keys` that some recording still refers to. */
export async function referencedKeys(db: Knex, keys: string[]): Promise<Set<string>> {
  if (keys.length === 0) return new Set();
  const rows: Array<{ original_key: string }> = await db('submission_recordings').whereIn('original_key', keys).distinct('original_key');
  return new Set(rows.map((r) => r.original_key));
}

/**
 * Detaches the originals of every recording a rider uploaded (the streams and the
 * figures stay) and returns the keys they had, to be removed from the store.
 */
export async function detachRiderOriginals(trx: Knex.Transaction, riderId: number): Promise<string[]> {
  // UPDATE … RETURNING gives the new (null) values: the old keys come from the locked rows joined in.
  const { rows } = await trx.raw<{ rows: Array<{ original_key: string }> }>(
    `with kept as (
       select r.id, r.original_key
         from submission_recordings r
         join submissions s on s.id = r.submission_id
        where s.rider_id = ? and r.original_key is not null
          for update of r)
     update submission_recordings r
        set original_key = null, original_bytes = null
       from kept
      where r.id = kept.id
  returning kept.original_key`,
    [riderId],
  );
  return rows.map((r) => r.original_key);
}
