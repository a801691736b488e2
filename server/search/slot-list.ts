// A growable list of slot numbers in one Int32Array, kept and reused from search
// to search: a broad query touches tens of thousands of cases, and a fresh JS
// array that size per query lands in V8's large-object space, which only a full
// garbage collection of the whole (index-sized) heap frees.
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
