// Per-query scratch of a shop's index, kept and reused from search to search: a
// broad query touches tens of thousands of cases, and fresh JS arrays that size
// per query land in V8's large-object space, which only a full garbage
// collection of the whole (index-sized) heap frees.

type NumberArray = Int32Array | Uint16Array | Uint8Array | Float64Array;

/** `a` itself when it holds `min` entries, else a copy with room for them (at least twice as long). */
export function withRoom<T extends NumberArray>(a: T, min: number): T {
  if (a.length >= min) return a;
  const grown = new (a.constructor as new (n: number) => T)(Math.max(min, a.length * 2));
  grown.set(a);
  return grown;
}

/** A growable list of slot numbers in one Int32Array. */
export class SlotList {
  items = new Int32Array(1024);
  length = 0;

  push(slot: number) {
    this.items = withRoom(this.items, this.length + 1);
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
    this.points = withRoom(this.points, slots);
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
