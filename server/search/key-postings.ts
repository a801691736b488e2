// Exact-key postings of a shop's index: key ('code:P0302', 'tag:rough-idle') -> the
// slots of the cases holding it. Edits go to Sets; searches read a frozen Int32Array
// copy of each posting, made on the first read after a change, because walking a
// typed array is several times quicker than a Set and a shop searches far more
// often than it edits.
const NONE = new Int32Array(0);

export class KeyPostings {
  private sets = new Map<string, Set<number>>();
  private frozen = new Map<string, Int32Array>();

  /** Adds a slot to a key; true when the key is new. */
  add(key: string, slot: number): boolean {
    let set = this.sets.get(key);
    const fresh = !set;
    if (!set) {
      set = new Set();
      this.sets.set(key, set);
    }
    set.add(slot);
    this.frozen.delete(key);
    return fresh;
  }

  /** Removes a slot from a key; true when the key has no slots left (and is gone). */
  delete(key: string, slot: number): boolean {
    const set = this.sets.get(key);
    if (!set) return false;
    set.delete(slot);
    this.frozen.delete(key);
    if (set.size > 0) return false;
    this.sets.delete(key);
    return true;
  }

  slots(key: string): Int32Array {
    let slots = this.frozen.get(key);
    if (!slots) {
      const set = this.sets.get(key);
      if (!set) return NONE;
      slots = Int32Array.from(set);
      this.frozen.set(key, slots);
    }
    return slots;
  }

  keys(): IterableIterator<string> {
    return this.sets.keys();
  }
}
