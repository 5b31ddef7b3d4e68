/** A growable list of ints on a typed array. */
export class IntList {
  a: Int32Array;
  count = 0;
  constructor(capacity = 1024) { this.a = new Int32Array(Math.max(16, capacity)); }
  push(v: number): void {
    if (this.count === this.a.length) { const b = new Int32Array(2 * this.count); b.set(this.a); this.a = b; }
    this.a[this.count++] = v;
  }
  view(): Int32Array { return this.a.subarray(0, this.count); }
  /** Sets the capacity (never below the count): room made once, where doubling would copy. */
  room(capacity: number): void {
    const c = Math.max(16, this.count, Math.ceil(capacity));
    if (c !== this.a.length) { const b = new Int32Array(c); b.set(this.a.subarray(0, this.count)); this.a = b; }
  }
}

/** A growable list of points, interleaved x, y. */
export class PointList {
  xy: Float64Array;
  count = 0;
  constructor(capacity = 1024) { this.xy = new Float64Array(2 * Math.max(16, capacity)); }
  add(x: number, y: number): number {
    if (2 * this.count + 2 > this.xy.length) { const b = new Float64Array(2 * this.xy.length); b.set(this.xy); this.xy = b; }
    this.xy[2 * this.count] = x;
    this.xy[2 * this.count + 1] = y;
    return this.count++;
  }
  /** Sets the capacity in points (never below the count), as IntList.room. */
  room(capacity: number): void {
    const c = 2 * Math.max(16, this.count, Math.ceil(capacity));
    if (c !== this.xy.length) { const b = new Float64Array(c); b.set(this.xy.subarray(0, 2 * this.count)); this.xy = b; }
  }
}
