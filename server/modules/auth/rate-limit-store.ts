import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { DataSource } from 'typeorm';

/**
 * A store for express-rate-limit that keeps its counters in PostgreSQL (table rate_limit_hits),
 * so a restart does not reset them and every instance on the database shares them. A fixed
 * window per key, as express-rate-limit's own memory store counts; the database's clock decides
 * when a window ends, so instances with skewed clocks still agree.
 */
export class PostgresRateLimitStore implements Store {
  /** Keys are shared by every instance on the database. */
  readonly localKeys = false;
  private windowMs = 60_000;
  private calls = 0;

  /** `prefix` keeps one limiter's keys apart from another's in the shared table. */
  constructor(
    private readonly ds: DataSource,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private key(k: string) {
    return (this.prefix + k).slice(0, 300);
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows: { hits: number; reset_at: Date }[] = await this.ds.query(`SELECT "hits", "reset_at" FROM "rate_limit_hits" WHERE "key" = $1 AND "reset_at" > now()`, [this.key(key)]);
    return rows[0] ? { totalHits: rows[0].hits, resetTime: rows[0].reset_at } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    // One statement, so that concurrent requests on any instance each count once.
    const rows: { hits: number; reset_at: Date }[] = await this.ds.query(
      `INSERT INTO "rate_limit_hits" ("key", "hits", "reset_at") VALUES ($1, 1, now() + $2 * interval '1 millisecond')
       ON CONFLICT ("key") DO UPDATE SET
         "hits" = CASE WHEN "rate_limit_hits"."reset_at" <= now() THEN 1 ELSE "rate_limit_hits"."hits" + 1 END,
         "reset_at" = CASE WHEN "rate_limit_hits"."reset_at" <= now() THEN EXCLUDED."reset_at" ELSE "rate_limit_hits"."reset_at" END
       RETURNING "hits", "reset_at"`,
      [this.key(key), this.windowMs],
    );
    // Now and then, forget windows that ended long ago (the table stays small).
    if (++this.calls % 200 === 0) await this.ds.query(`DELETE FROM "rate_limit_hits" WHERE "reset_at" < now() - interval '1 day'`);
    return { totalHits: rows[0].hits, resetTime: rows[0].reset_at };
  }

  async decrement(key: string): Promise<void> {
    await this.ds.query(`UPDATE "rate_limit_hits" SET "hits" = greatest("hits" - 1, 0) WHERE "key" = $1 AND "reset_at" > now()`, [this.key(key)]);
  }

  async resetKey(key: string): Promise<void> {
    await this.ds.query(`DELETE FROM "rate_limit_hits" WHERE "key" = $1`, [this.key(key)]);
  }

  async resetAll(): Promise<void> {
    await this.ds.query(`DELETE FROM "rate_limit_hits" WHERE starts_with("key", $1)`, [this.prefix]);
  }
}
