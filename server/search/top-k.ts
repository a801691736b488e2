// The best k entries of a stream by score, in O(n log k): a binary min-heap
// whose root is the weakest entry kept. Ties keep the entry seen first.
export class TopK {
  private slots: number[] = [];
  private scores: number[] = [];

  constructor(private readonly size: number) {}

  /** Whether push would keep an entry with this score (callers skip work for the rest). */
  accepts(score: number): boolean {
    return this.slots.length < this.size || score > this.scores[0]!;
  }

  push(slot: number, score: number) {
    if (this.size <= 0) return;
    if (this.slots.length < this.size) {
      this.slots.push(slot);
      this.scores.push(score);
      this.up(this.slots.length - 1);
    } else if (score > this.scores[0]!) {
      this.slots[0] = slot;
      this.scores[0] = score;
      this.down(0);
    }
  }

  /** What was kept, in no particular order. */
  items(): number[] {
    return this.slots;
  }

  /** What was kept with scores, best first (equal scores: lower slot first). */
  sorted(): { slot: number; score: number }[] {
    return this.slots.map((slot, i) => ({ slot, score: this.scores[i]! })).sort((a, b) => b.score - a.score || a.slot - b.slot);
  }

  private swap(a: number, b: number) {
    [this.slots[a], this.slots[b]] = [this.slots[b]!, this.slots[a]!];
    [this.scores[a], this.scores[b]] = [this.scores[b]!, this.scores[a]!];
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
    const n = this.scores.length;
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
