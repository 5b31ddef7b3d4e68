export interface EventTies {
  /** The order of two events whose keys are too close for the floating filter. */
  compareEvents(i: number, j: number): number;
  /** Told of each event that leaves the heap without being popped. */
  release(id: number): void;
}

/**
 * The sweep's circle events as a binary min-heap on typed arrays. Each slot
 * carries the event's floating key and its error bound next to its id, so
 * that almost every comparison is two subtractions on data already in
 * cache; only keys within their joint error go to the exact order. The
 * order is total (ties end at creation order), so any correct heap pops the
 * same sequence: the shape of this one changes nothing in the result.
 */
export class EventQueue {
  private ids: Int32Array;
  /** key, error bound per slot. */
  private keys: Float64Array;
  length = 0;
  private readonly ties: EventTies;

  constructor(ties: EventTies, capacity: number) {
    this.ties = ties;
    this.ids = new Int32Array(Math.max(16, capacity));
    this.keys = new Float64Array(2 * this.ids.length);
  }

  /** The first event (the queue must not be empty). */
  peek(): number { return this.ids[0]; }

  /** Whether event a (key ka +- ea) comes before event b. */
  private before(a: number, ka: number, ea: number, b: number, kb: number, eb: number): boolean {
    const d = ka - kb, e = ea + eb;
    if (d > e) return false;
    if (-d > e) return true;
    return this.ties.compareEvents(a, b) < 0;
  }

  push(id: number, key: number, err: number): void {
    if (this.length === this.ids.length) this.grow();
    this.place(this.length++, id, key, err);
  }

  pop(): number {
    const ids = this.ids, keys = this.keys;
    const top = ids[0];
    const last = --this.length;
    if (last > 0) this.siftDown(0, ids[last], keys[2 * last], keys[2 * last + 1]);
    return top;
  }

  /** Puts the item (id, key, err) into the hole at pos, or above it, moving larger parents down. */
  private place(pos: number, id: number, key: number, err: number): void {
    const ids = this.ids, keys = this.keys;
    while (pos > 0) {
      const up = (pos - 1) >> 1;
      if (!this.before(id, key, err, ids[up], keys[2 * up], keys[2 * up + 1])) break;
      this.copy(pos, up);
      pos = up;
    }
    this.put(pos, id, key, err);
  }

  /** Drops the events not marked live, then restores the heap order (bottom-up, linear). */
  keepLive(live: Uint8Array, owner: EventTies): void {
    const ids = this.ids, keys = this.keys;
    let m = 0;
    for (let i = 0; i < this.length; i++) {
      const id = ids[i];
      if (live[id] !== 1) { owner.release(id); continue; }
      this.copy(m, i);
      m++;
    }
    this.length = m;
    for (let i = (m >> 1) - 1; i >= 0; i--) this.siftDown(i, ids[i], keys[2 * i], keys[2 * i + 1]);
  }

  /** Places the item (id, key, err) at pos or below, moving smaller children up. */
  private siftDown(pos: number, id: number, key: number, err: number): void {
    const ids = this.ids, keys = this.keys, n = this.length, half = n >> 1;
    while (pos < half) {
      let c = 2 * pos + 1;
      const r = c + 1;
      if (r < n && this.before(ids[r], keys[2 * r], keys[2 * r + 1], ids[c], keys[2 * c], keys[2 * c + 1])) c = r;
      if (!this.before(ids[c], keys[2 * c], keys[2 * c + 1], id, key, err)) break;
      this.copy(pos, c);
      pos = c;
    }
    this.put(pos, id, key, err);
  }

  /** Slot `to` takes the item in slot `from`. */
  private copy(to: number, from: number): void {
    const ids = this.ids, keys = this.keys;
    ids[to] = ids[from];
    keys[2 * to] = keys[2 * from];
    keys[2 * to + 1] = keys[2 * from + 1];
  }

  private put(pos: number, id: number, key: number, err: number): void {
    const ids = this.ids, keys = this.keys;
    ids[pos] = id;
    keys[2 * pos] = key;
    keys[2 * pos + 1] = err;
  }

  private grow(): void {
    const ids = new Int32Array(2 * this.ids.length);
    ids.set(this.ids);
    const keys = new Float64Array(2 * this.keys.length);
    keys.set(this.keys);
    this.ids = ids;
    this.keys = keys;
  }
}
