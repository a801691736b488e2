// The best k entries of a stream by score, in O(n log k): a binary min-heap
// whose root is the weakest entry kept. Ties keep the entry seen first.
// Typed arrays of fixed size: a plain array would change its element kind
// (small integers, then doubles) from query to query and throw optimised code away.
export class TopK {
  private readonly slots: Int32Array;
  private readonly scores: Float64Array;
  private count = 0;

  constructor(private readonly size: number) {
    this.slots = new Int32Array(Math.max(0, size));
    this.scores = new Float64Array(Math.max(0, size));
  }

  /** Whether push would keep an entry with this score (callers skip work for the rest). */
  accepts(score: number): boolean {
    return score > this.bar();
  }

  /** The score an entry must beat to be kept: the weakest kept once full, else -Infinity. */
  bar(): number {
    return this.count < this.size ? -Infinity : this.scores[0]!;
  }

  push(slot: number, score: number) {
    if (this.size <= 0) return;
    if (this.count < this.size) {
      this.slots[this.count] = slot;
      this.scores[this.count] = score;
      this.up(this.count++);
    } else if (score > this.scores[0]!) {
      this.slots[0] = slot;
      this.scores[0] = score;
      this.down(0);
    }
  }

  /** What was kept, in no particular order. */
  items(): number[] {
    return Array.from(this.slots.subarray(0, this.count));
  }

  /** What was kept with scores, best first (equal scores: lower slot first). */
  sorted(): { slot: number; score: number }[] {
    const out: { slot: number; score: number }[] = [];
    for (let i = 0; i < this.count; i++) out.push({ slot: this.slots[i]!, score: this.scores[i]! });
    return out.sort((a, b) => b.score - a.score || a.slot - b.slot);
  }

  private swap(a: number, b: number) {
    const slot = this.slots[a]!;
    this.slots[a] = this.slots[b]!;
    this.slots[b] = slot;
    const score = this.scores[a]!;
    this.scores[a] = this.scores[b]!;
    this.scores[b] = score;
  }

  private up(i: number) {
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (this.scores[p]! <= this.scores[i]!) return;
      this.swap(i, p);
      i = p;
    }
  }

  private down(i: number) {
    const n = this.count;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < n && this.scores[l]! < this.scores[m]!) m = l;
      if (r < n && this.scores[r]! < this.scores[m]!) m = r;
      if (m === i) return;
      this.swap(i, m);
      i = m;
    }
  }
}
