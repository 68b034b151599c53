import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';
import type { MikroORM } from '@mikro-orm/postgresql';

/**
 * An express-rate-limit store over the `rate_limit_hit` table: counters survive a restart
 * and are shared by every server process. Each increment is one atomic upsert, so
 * concurrent requests from several processes never lose a hit. When the database is away
 * the store throws, and the request is answered 503 like any other that needs it.
 */
export class PgRateLimitStore implements Store {
  /** Counters live in the database, not in this process. */
  readonly localKeys = false;
  private windowMs = 60_000;
  private readonly table: string;

  /**
   * @param orm the app's ORM (its connection pool and schema)
   * @param prefix keeps limiters apart, e.g. `signin`; keys are stored as `prefix:key`
   */
  constructor(
    private readonly orm: MikroORM,
    readonly prefix: string,
    schema = 'public',
  ) {
    this.table = `"${schema.replace(/"/g, '""')}"."rate_limit_hit"`;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private run<T>(sql: string, params: unknown[]): Promise<T[]> {
    return this.orm.em.getConnection().execute(sql, params, 'all') as Promise<T[]>;
  }

  private key(key: string): string {
    return `${this.prefix}:${key}`.slice(0, 255);
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const rows = await this.run<{ hits: number; reset_at: Date }>(
      `select hits, reset_at from ${this.table} where key = ? and reset_at > now()`,
      [this.key(key)],
    );
    return rows[0] ? { totalHits: rows[0].hits, resetTime: new Date(rows[0].reset_at) } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    // A counter whose window has ended starts again at 1 with a new window.
    const rows = await this.run<{ hits: number; reset_at: Date }>(
      `insert into ${this.table} as r (key, hits, reset_at)
         values (?, 1, now() + ? * interval '1 millisecond')
       on conflict (key) do update set
         hits = case when r.reset_at <= now() then 1 else r.hits + 1 end,
         reset_at = case when r.reset_at <= now() then excluded.reset_at else r.reset_at end
       returning hits, reset_at`,
      [this.key(key), this.windowMs],
    );
    // Now and then, forget counters whose window ended long ago.
    if (Math.random() < 0.01) {
      await this.run(`delete from ${this.table} where reset_at < now() - interval '1 day'`, []);
    }
    return { totalHits: rows[0].hits, resetTime: new Date(rows[0].reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await this.run(
      `update ${this.table} set hits = greatest(hits - 1, 0) where key = ? and reset_at > now()`,
      [this.key(key)],
    );
  }

  async resetKey(key: string): Promise<void> {
    await this.run(`delete from ${this.table} where key = ?`, [this.key(key)]);
  }
}
