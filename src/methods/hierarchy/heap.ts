// Indexed binary min-heap over item ids 0..count-1 with changeable keys, for the generic
// algorithm's queue of nearest-neighbour lower bounds. Ties go to the smaller id, so the
// order of equal keys never depends on the heap's internal layout.

export class IndexedMinHeap {
  private readonly heap: Int32Array; // heap position -> item
  private readonly position: Int32Array; // item -> heap position, -1 when removed
  private readonly key: Float64Array;
  private length: number;

  constructor(keys: Float64Array) {
    const count = keys.length;
    this.key = keys;
    this.heap = new Int32Array(count);
    this.position = new Int32Array(count);
    for (let i = 0; i < count; i++) {
      this.heap[i] = i;
      this.position[i] = i;
    }
    this.length = count;
    for (let p = (count >> 1) - 1; p >= 0; p--) this.siftDown(p);
  }

  get size(): number {
    return this.length;
  }

  /** Item with the smallest key (smallest id among equal keys). */
  top(): number {
    return this.heap[0];
  }

  keyOf(item: number): number {
    return this.key[item];
  }

  removeTop(): void {
    const last = this.heap[--this.length];
    this.position[this.heap[0]] = -1;
    if (this.length > 0) {
      this.heap[0] = last;
      this.position[last] = 0;
      this.siftDown(0);
    }
  }

  change(item: number, value: number): void {
    const old = this.key[item];
    this.key[item] = value;
    const p = this.position[item];
    if (p < 0) return;
    if (value < old) this.siftUp(p);
    else this.siftDown(p);
  }

  private less(a: number, b: number): boolean {
    const ka = this.key[a];
    const kb = this.key[b];
    return ka < kb || (ka === kb && a < b);
  }

  private siftUp(p: number): void {
    const { heap, position } = this;
    const item = heap[p];
    while (p > 0) {
      const parent = (p - 1) >> 1;
      const other = heap[parent];
      if (!this.less(item, other)) break;
      heap[p] = other;
      position[other] = p;
      p = parent;
    }
    heap[p] = item;
    position[item] = p;
  }

  private siftDown(p: number): void {
    const { heap, position } = this;
    const n = this.length;
    const item = heap[p];
    for (;;) {
      let child = 2 * p + 1;
      if (child >= n) break;
      if (child + 1 < n && this.less(heap[child + 1], heap[child])) child++;
      const other = heap[child];
      if (!this.less(other, item)) break;
      heap[p] = other;
      position[other] = p;
      p = child;
    }
    heap[p] = item;
    position[item] = p;
  }
}
