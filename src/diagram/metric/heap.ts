/** A binary min-heap of sites keyed by a number, on typed arrays (the candidate queue of a cell). */
export class SiteHeap {
  private keys: Float64Array;
  private ids: Int32Array;
  size = 0;
  constructor(capacity: number) {
    this.keys = new Float64Array(Math.max(16, capacity));
    this.ids = new Int32Array(Math.max(16, capacity));
  }
  clear(): void { this.size = 0; }
  topKey(): number { return this.keys[0]; }
  push(id: number, key: number): void {
    if (this.size === this.keys.length) {
      const k = new Float64Array(2 * this.size), d = new Int32Array(2 * this.size);
      k.set(this.keys); d.set(this.ids);
      this.keys = k; this.ids = d;
    }
    let i = this.size++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (this.keys[p] <= key) break;
      this.keys[i] = this.keys[p]; this.ids[i] = this.ids[p];
      i = p;
    }
    this.keys[i] = key; this.ids[i] = id;
  }
  pop(): number {
    const top = this.ids[0];
    const n = --this.size;
    if (n > 0) {
      const key = this.keys[n], id = this.ids[n];
      let i = 0;
      for (;;) {
        let c = 2 * i + 1;
        if (c >= n) break;
        if (c + 1 < n && this.keys[c + 1] < this.keys[c]) c++;
        if (this.keys[c] >= key) break;
        this.keys[i] = this.keys[c]; this.ids[i] = this.ids[c];
        i = c;
      }
      this.keys[i] = key; this.ids[i] = id;
    }
    return top;
  }
}
