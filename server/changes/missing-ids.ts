// The change-log ids a follower has not seen below its high-water mark, as sorted,
// disjoint ranges (a jump of a million ids is one range, not a million entries), each
// with the time it was first missed. Pure: the follower (follower.ts) does the reading.

export interface IdSpan {
  from: number;
  to: number;
}

interface MissingSpan extends IdSpan {
  since: number;
}

export class MissingIds {
  private spans: MissingSpan[] = [];

  /** How many ids are missing. */
  get size(): number {
    return this.spans.reduce((n, s) => n + s.to - s.from + 1, 0);
  }

  /** The missing ranges, lowest first. */
  list(): readonly IdSpan[] {
    return this.spans;
  }

  /** Records from..to as missing since `since`; always above every range held (the high-water mark only rises). */
  add(from: number, to: number, since: number) {
    if (from > to) return;
    const last = this.spans[this.spans.length - 1];
    if (last && from <= last.to) throw new Error(`missing ids ${from}..${to} overlap ${last.from}..${last.to}`);
    this.spans.push({ from, to, since });
  }

  /** Whether `id` was missing; if so it no longer is. */
  take(id: number): boolean {
    const i = this.indexOf(id);
    if (i < 0) return false;
    const s = this.spans[i]!;
    const parts: MissingSpan[] = [];
    if (s.from < id) parts.push({ from: s.from, to: id - 1, since: s.since });
    if (id < s.to) parts.push({ from: id + 1, to: s.to, since: s.since });
    this.spans.splice(i, 1, ...parts);
    return true;
  }

  /** Forgets the ids missing for longer than `timeoutMs` at `now`; returns how many. */
  expire(now: number, timeoutMs: number): number {
    let dropped = 0;
    this.spans = this.spans.filter((s) => {
      const keep = now - s.since < timeoutMs;
      if (!keep) dropped += s.to - s.from + 1;
      return keep;
    });
    return dropped;
  }

  /** Binary search for the range holding `id`, or -1. */
  private indexOf(id: number): number {
    let lo = 0;
    let hi = this.spans.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const s = this.spans[mid]!;
      if (id < s.from) hi = mid - 1;
      else if (id > s.to) lo = mid + 1;
      else return mid;
    }
    return -1;
  }
}
