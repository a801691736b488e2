// Follows the change log without skipping. An auto-increment id is taken when a row is
// inserted but becomes visible when its transaction commits, so ids can appear out of
// order: reading `id > highest seen` alone loses a lower id that commits after a higher
// one. The follower therefore remembers every id below its high-water mark that it has
// not seen (missing-ids.ts) and re-reads those on every poll, until the row appears or
// the gap timeout has passed (no writing transaction lives that long: it rolled back, or
// the id was never used). On start it reads one timeout back, since a transaction open
// then may commit an id below the newest. The argument is written out in docs/search.md.
import { asc, between, desc, eq, gt, lt, or, sql } from 'drizzle-orm';
import type { Db } from '../../db/client';
import { changeLog } from '../../db/schema';
import { MissingIds } from './missing-ids';

export interface Change {
  id: number;
  shopId: number;
  entity: string;
  entityId: number;
  op: 'upsert' | 'delete';
}

export interface FeedCounters {
  /** ids below the high-water mark not seen yet */
  open: number;
  /** ids that appeared after a higher one (a follower reading by `id > last` would have lost them) */
  filled: number;
  /** ids given up on after the timeout (rolled back, or never used) */
  expired: number;
}

export const PAGE = 5000;
const SPANS_PER_READ = 500;

const changeColumns = { id: changeLog.id, shopId: changeLog.shopId, entity: changeLog.entity, entityId: changeLog.entityId, op: changeLog.op };

const toChange = (r: { id: number; shopId: number; entity: string; entityId: number; op: 'upsert' | 'delete' }): Change => ({
  id: Number(r.id),
  shopId: Number(r.shopId),
  entity: r.entity,
  entityId: Number(r.entityId),
  op: r.op,
});

/** Changes after `afterId`, oldest first: one primary-key range read. */
async function changesAfter(db: Db, afterId: number): Promise<Change[]> {
  const rows = await db.select(changeColumns).from(changeLog).where(gt(changeLog.id, afterId)).orderBy(asc(changeLog.id)).limit(PAGE);
  return rows.map(toChange);
}

/** The rows now visible among the missing ranges. */
async function changesWithin(db: Db, spans: readonly { from: number; to: number }[]): Promise<Change[]> {
  const found: Change[] = [];
  for (let i = 0; i < spans.length; i += SPANS_PER_READ) {
    const part = spans.slice(i, i + SPANS_PER_READ).map((s) => (s.from === s.to ? eq(changeLog.id, s.from) : between(changeLog.id, s.from, s.to)));
    const rows = await db.select(changeColumns).from(changeLog).where(or(...part)).orderBy(asc(changeLog.id));
    found.push(...rows.map(toChange));
  }
  return found;
}

/**
 * Where to start: the last id logged more than `windowMs` ago by the database's clock
 * (0 on a young log). Everything after it is read again, and what is missing there is
 * waited for like any other gap.
 */
async function startingPoint(db: Db, windowMs: number): Promise<number> {
  const [row] = await db
    .select({ id: changeLog.id })
    .from(changeLog)
    .where(lt(changeLog.createdAt, sql`NOW(3) - INTERVAL ${Math.round(windowMs * 1000)} MICROSECOND`))
    .orderBy(desc(changeLog.createdAt), desc(changeLog.id))
    .limit(1);
  return Number(row?.id ?? 0);
}

export class ChangeFollower {
  private high = 0;
  private readonly missing = new MissingIds();
  private filled = 0;
  private expired = 0;

  constructor(
    private readonly db: Db,
    private readonly gapTimeoutMs: number,
    private readonly now: () => number = Date.now,
  ) {}

  /** Sets the starting point; call once before poll. */
  async start() {
    this.high = await startingPoint(this.db, this.gapTimeoutMs);
  }

  /** The highest id applied so far. */
  get highWater(): number {
    return this.high;
  }

  counters(): FeedCounters {
    return { open: this.missing.size, filled: this.filled, expired: this.expired };
  }

  /**
   * One pass: hands `apply` the missing ids that have appeared, then every new change in
   * pages, oldest first, then gives up on ids missing for longer than the timeout. The
   * position only moves once `apply` has finished, so a failed apply is read again.
   */
  async poll(apply: (changes: Change[]) => Promise<void>) {
    if (this.missing.size > 0) {
      const late = await changesWithin(this.db, this.missing.list());
      if (late.length > 0) {
        await apply(late);
        for (const c of late) if (this.missing.take(c.id)) this.filled++;
      }
    }
    for (;;) {
      const page = await changesAfter(this.db, this.high);
      if (page.length === 0) break;
      await apply(page);
      const seen = this.now();
      for (const c of page) {
        this.missing.add(this.high + 1, c.id - 1, seen);
        this.high = c.id;
      }
      if (page.length < PAGE) break;
    }
    this.expired += this.missing.expire(this.now(), this.gapTimeoutMs);
  }
}

