// express-rate-limit's Store over MariaDB: every app instance counts into the same rows, so a
// limit of N per address holds across N instances instead of multiplying. Times come from the
// database clock, one clock for all instances.
import { lt, sql } from 'drizzle-orm';
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import { retryDeadlocks, type Db } from '../../db/client';
import { rateLimits } from '../../db/schema';

/** Expired rows are deleted on every this many-th increment of a process. */
const PRUNE_EVERY = 200;

export class MariaDbRateLimitStore implements Store {
  readonly localKeys = false;
  private windowMs = 60_000;
  private increments = 0;

  constructor(
    private readonly db: Db,
    readonly prefix: string,
  ) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    if (++this.increments % PRUNE_EVERY === 0) await this.db.delete(rateLimits).where(lt(rateLimits.resetAt, sql`UTC_TIMESTAMP(3)`));
    const rateKey = this.prefix + key;
    // The insert locks the row until commit, so the count read back is this request's own.
    // Concurrent first inserts of one key can deadlock on the key's gap lock: retried.
    return retryDeadlocks(() => this.db.transaction(async (tx) => {
      await tx.execute(sql`
        INSERT INTO rate_limits (rate_key, hits, reset_at)
        VALUES (${rateKey}, 1, UTC_TIMESTAMP(3) + INTERVAL ${this.windowMs * 1000} MICROSECOND)
        ON DUPLICATE KEY UPDATE
          hits = IF(reset_at <= UTC_TIMESTAMP(3), 1, hits + 1),
          reset_at = IF(reset_at <= UTC_TIMESTAMP(3), VALUES(reset_at), reset_at)`);
      return (await readInfo(tx, rateKey))!;
    }));
  }

  get(key: string): Promise<ClientRateLimitInfo | undefined> {
    return readInfo(this.db, this.prefix + key);
  }

  async decrement(key: string): Promise<void> {
    await this.db.execute(sql`UPDATE rate_limits SET hits = GREATEST(hits, 1) - 1 WHERE rate_key = ${this.prefix + key}`);
  }

  async resetKey(key: string): Promise<void> {
    await this.db.execute(sql`DELETE FROM rate_limits WHERE rate_key = ${this.prefix + key}`);
  }
}

/** The counter as of now: a window that has ended counts as none. */
async function readInfo(db: Db, rateKey: string): Promise<ClientRateLimitInfo | undefined> {
  const [rows] = (await db.execute(sql`SELECT hits, reset_at AS resetAt FROM rate_limits WHERE rate_key = ${rateKey} AND reset_at > UTC_TIMESTAMP(3)`)) as unknown as [
    { hits: number; resetAt: Date }[],
  ];
  const row = rows[0];
  return row ? { totalHits: Number(row.hits), resetTime: new Date(row.resetAt) } : undefined;
}
