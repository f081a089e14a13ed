/**
 * An express-rate-limit store kept in the database (`rate_limit_hits`), so a limit holds across every API process
 * that shares the database: one row per key with its hit count and the end of its window, updated atomically with
 * `INSERT ... ON CONFLICT DO UPDATE` (a window that has ended starts again at one hit).
 */
import { eq, sql } from 'drizzle-orm';
import type { IncrementResponse, Options, Store } from 'express-rate-limit';
import type { Db } from '../db/client';
import { rateLimitHits } from '../db/schema';

/** See the file comment. */
export class DbRateLimitStore implements Store {
  /** Counts are shared by every process using the database. */
  localKeys = false;
  private windowMs = 60_000;

  /**
   * @param db - the shared database
   * @param prefix - distinguishes the counters of different limiters (e.g. `sign-in:`)
   */
  constructor(
    private readonly db: Db,
    readonly prefix: string,
  ) {}

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<IncrementResponse> {
    const resetAt = new Date(Date.now() + this.windowMs);
    const [row] = await this.db
      .insert(rateLimitHits)
      .values({ key: this.prefix + key, hits: 1, resetAt })
      .onConflictDoUpdate({
        target: rateLimitHits.key,
        set: {
          hits: sql`case when ${rateLimitHits.resetAt} <= now() then 1 else ${rateLimitHits.hits} + 1 end`,
          resetAt: sql`case when ${rateLimitHits.resetAt} <= now() then excluded.reset_at else ${rateLimitHits.resetAt} end`,
        },
      })
      .returning();
    return { totalHits: row.hits, resetTime: row.resetAt };
  }

  async decrement(key: string): Promise<void> {
    await this.db
      .update(rateLimitHits)
      .set({ hits: sql`greatest(${rateLimitHits.hits} - 1, 0)` })
      .where(eq(rateLimitHits.key, this.prefix + key));
  }

  async resetKey(key: string): Promise<void> {
    await this.db.delete(rateLimitHits).where(eq(rateLimitHits.key, this.prefix + key));
  }
}
