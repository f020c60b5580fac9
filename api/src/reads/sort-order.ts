/**
 * The order of a sorted results view, computed in JavaScript rather than by SQLite's ORDER BY: a
 * stable LSD radix sort on the IEEE-754 bits (four 16-bit passes), about ten times quicker than a
 * comparator sort on 10^6 rows, and interruptible (the read thread can be ended between batches,
 * whereas a statement inside SQLite's sorter cannot be). Same rules as the SQL it replaces: missing
 * values (NULL, stored for NaN/±Infinity) last in either direction, ties in index order.
 */

/** Accumulates (index, value) pairs in index order, then sorts them. */
export class OrderBuilder {
  private idx: Uint32Array;
  private val: Float64Array;
  private n = 0;
  private nulls: number[] = [];

  constructor(capacity = 1024) {
    this.idx = new Uint32Array(Math.max(16, capacity));
    this.val = new Float64Array(Math.max(16, capacity));
  }

  /** Pairs must arrive in increasing index order (the rowid scan), which makes ties come out in index order. */
  push(index: number, value: number | null): void {
    if (value === null || Number.isNaN(value)) {
      this.nulls.push(index);
      return;
    }
    if (this.n === this.idx.length) this.grow();
    this.idx[this.n] = index;
    // -0 and +0 compare equal in SQL; one bit pattern keeps them tied.
    this.val[this.n] = value === 0 ? 0 : value;
    this.n++;
  }

  private grow(): void {
    const idx = new Uint32Array(this.idx.length * 2);
    idx.set(this.idx);
    const val = new Float64Array(this.val.length * 2);
    val.set(this.val);
    this.idx = idx;
    this.val = val;
  }

  get size(): number {
    return this.n + this.nulls.length;
  }

  /**
   * Point indices in sorted order, in a SharedArrayBuffer so the order can travel between threads
   * (and sit in the api's cache) without a copy.
   */
  sort(desc: boolean): Uint32Array {
    const n = this.n;
    const total = n + this.nulls.length;
    const out = new Uint32Array(new SharedArrayBuffer(Math.max(4, total * 4)), 0, total);
    // Sortable keys: flip every bit of negatives, only the sign bit of positives; descending flips all.
    const bits = new Uint32Array(this.val.buffer, 0, n * 2);
    const lo = new Uint32Array(n);
    const hi = new Uint32Array(n);
    const le = littleEndian();
    for (let i = 0; i < n; i++) {
      let h = bits[2 * i + (le ? 1 : 0)]!;
      let l = bits[2 * i + (le ? 0 : 1)]!;
      if (h & 0x80000000) {
        h = ~h >>> 0;
        l = ~l >>> 0;
      } else h = (h | 0x80000000) >>> 0;
      if (desc) {
        h = ~h >>> 0;
        l = ~l >>> 0;
      }
      hi[i] = h;
      lo[i] = l;
    }
    // Positions into the key arrays, sorted by 16-bit digits from least to most significant.
    let from = new Uint32Array(n);
    for (let i = 0; i < n; i++) from[i] = i;
    let to = new Uint32Array(n);
    const count = new Uint32Array(65536);
    for (const [word, shift] of [
      [lo, 0],
      [lo, 16],
      [hi, 0],
      [hi, 16],
    ] as const) {
      count.fill(0);
      for (let i = 0; i < n; i++) count[(word[from[i]!]! >>> shift) & 0xffff]!++;
      let sum = 0;
      for (let d = 0; d < 65536; d++) {
        const c = count[d]!;
        count[d] = sum;
        sum += c;
      }
      for (let i = 0; i < n; i++) {
        const p = from[i]!;
        to[count[(word[p]! >>> shift) & 0xffff]!++] = p;
      }
      [from, to] = [to, from];
    }
    for (let i = 0; i < n; i++) out[i] = this.idx[from[i]!]!;
    for (let i = 0; i < this.nulls.length; i++) out[n + i] = this.nulls[i]!;
    return out;
  }
}

function littleEndian(): boolean {
  return new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;
}
