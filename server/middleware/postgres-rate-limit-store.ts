import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { Knex } from 'knex';

/**
 * express-rate-limit's Store on a PostgreSQL table (rate_limit_counters), so every
 * web process counts against the same budget and a restart forgets nothing. Each
 * limiter has its own prefix. A key's window is fixed: it starts with its first hit
 * and ends windowMs later, when the next hit starts a new one. One statement per
 * hit, atomic under concurrency (an upsert on the key).
 */
export class PostgresRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;
  private lastCleanup = 0;

  constructor(
    private readonly db: Knex,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.db('rate_limit_counters')
      .where({ key: this.prefix + key })
      .where('reset_at', '>', this.db.fn.now())
      .first('hits', 'reset_at');
    return row && { totalHits: row.hits, resetTime: row.reset_at };
  }

  async increment(key: string): Promise<IncrementResponse> {
    const { rows } = await this.db.raw<{ rows: Array<{ hits: number; reset_at: Date }> }>(
      `insert into rate_limit_counters as c (key, hits, reset_at) values (?, 1, now() + make_interval(secs => ?))
       on conflict (key) do update set
         hits = case when c.reset_at <= now() then 1 else c.hits + 1 end,
         reset_at = case when c.reset_at <= now() then excluded.reset_at else c.reset_at end
       returning hits, reset_at`,
      [this.prefix + key, this.windowMs / 1000],
    );
    this.cleanUpNowAndThen();
    return { totalHits: rows[0]!.hits, resetTime: rows[0]!.reset_at };
  }

  async decrement(key: string): Promise<void> {
    await this.db('rate_limit_counters')
      .where({ key: this.prefix + key })
      .where('hits', '>', 0)
      .decrement('hits', 1);
  }

  async resetKey(key: string): Promise<void> {
    await this.db('rate_limit_counters')
      .where({ key: this.prefix + key })
      .delete();
  }

  // Windows that ended long ago are deleted by whichever process gets there, at most
  // once a window per store; a failure only leaves rows for the next try.
  private cleanUpNowAndThen(): void {
    const now = Date.now();
    if (now - this.lastCleanup < this.windowMs) return;
    this.lastCleanup = now;
    this.db('rate_limit_counters')
      .where('reset_at', '<', this.db.raw(`now() - interval '1 hour'`))
      .delete()
      .catch(() => undefined);
  }
}
