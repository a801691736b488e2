// Per-query scratch of a shop's index, kept and reused from search to search: a
// broad query touches tens of thousands of cases, and fresh JS arrays that size
// per query land in V8's large-object space, which only a full garbage
// collection of the whole (index-sized) heap frees.

/** A growable list of slot numbers in one Int32Array. */
export class SlotList {
  items = new Int32Array(1024);
  length = 0;

  push(slot: number) {
    if (this.length === this.items.length) {
      const grown = new Int32Array(this.items.length * 2);
      grown.set(this.items);
      this.items = grown;
    }
    this.items[this.length++] = slot;
  }

  clear() {
    this.length = 0;
  }
}

/** Points per slot for the current query, and the slots that have any. */
export class CandidatePoints {
  points = new Float64Array(1024);
  readonly touched = new SlotList();

  ensure(slots: number) {
    if (this.points.length >= slots) return;
    const grown = new Float64Array(Math.max(slots, this.points.length * 2));
    grown.set(this.points);
    this.points = grown;
  }

  get size(): number {
    return this.touched.length;
  }

  has(slot: number): boolean {
    return this.points[slot] !== 0;
  }

  add(slot: number, pts: number) {
    if (pts <= 0) return;
    if (this.points[slot] === 0) this.touched.push(slot);
    this.points[slot]! += pts;
  }

  addAll(slots: Int32Array, pts: number) {
    if (pts <= 0) return;
    const points = this.points;
    for (let i = 0; i < slots.length; i++) {
      const slot = slots[i]!;
      if (points[slot] === 0) this.touched.push(slot);
      points[slot]! += pts;
    }
  }

  /** Back to no points, touching only the slots that had some. */
  clear() {
    const { items, length } = this.touched;
    for (let i = 0; i < length; i++) this.points[items[i]!] = 0;
    this.touched.clear();
  }
}
