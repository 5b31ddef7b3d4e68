export interface EventTies {
  /** The order of two events whose keys are too close for the floating filter. */
  compareEvents(i: number, j: number): number;
}

/**
 * The sweep's circle events as a binary min-heap on typed arrays. Each slot
 * carries the event's floating key and its error bound next to its id, so
 * that almost every comparison is two subtractions on data already in
 * cache; only keys within their joint error go to the exact order. The
 * order is total (ties end at creation order), so any correct heap pops the
 * same sequence: the shape of this one changes nothing in the result.
 *
 * The heap knows where each event sits, so that a cancelled event (most
 * are false alarms) leaves at once: a removal is cheap where most items
 * are, near the bottom, while a cancelled item left in place would cost a
 * whole pop later and make every other operation a level deeper.
 */
export class EventQueue {
  private ids: Int32Array;
  /** key, error bound per slot. */
  private keys: Float64Array;
  /** Heap slot of each event id, -1 when not in the heap. */
  private at: Int32Array;
  length = 0;
  private readonly ties: EventTies;

  constructor(ties: EventTies, capacity: number) {
    this.ties = ties;
    this.ids = new Int32Array(Math.max(16, capacity));
    this.keys = new Float64Array(2 * this.ids.length);
    this.at = new Int32Array(this.ids.length).fill(-1);
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
    if (id >= this.at.length) this.growIds(id + 1);
    this.place(this.length++, id, key, err);
  }

  /**
   * Floyd's bottom-up removal: the hole left at the root goes down to a leaf
   * along the smaller children (one comparison per level), then the last
   * item rises from there, usually a step or none since it came from the
   * bottom. About half the comparisons of sifting the last item down.
   */
  pop(): number {
    const ids = this.ids, keys = this.keys;
    const top = ids[0];
    this.at[top] = -1;
    const n = --this.length;
    if (n === 0) return top;
    let pos = 0;
    for (;;) {
      let c = 2 * pos + 1;
      if (c >= n) break;
      const r = c + 1;
      if (r < n && this.before(ids[r], keys[2 * r], keys[2 * r + 1], ids[c], keys[2 * c], keys[2 * c + 1])) c = r;
      this.copy(pos, c);
      pos = c;
    }
    this.place(pos, ids[n], keys[2 * n], keys[2 * n + 1]);
    return top;
  }

  /** Takes event id (in the heap) out: the last item fills its slot, going up or down from there. */
  remove(id: number): void {
    const ids = this.ids, keys = this.keys;
    const pos = this.at[id];
    this.at[id] = -1;
    const n = --this.length;
    if (pos === n) return;
    const m = ids[n], km = keys[2 * n], em = keys[2 * n + 1];
    if (pos > 0) {
      const up = (pos - 1) >> 1;
      if (this.before(m, km, em, ids[up], keys[2 * up], keys[2 * up + 1])) { this.place(pos, m, km, em); return; }
    }
    this.siftDown(pos, m, km, em);
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
    const id = ids[from];
    ids[to] = id;
    this.at[id] = to;
    keys[2 * to] = keys[2 * from];
    keys[2 * to + 1] = keys[2 * from + 1];
  }

  private put(pos: number, id: number, key: number, err: number): void {
    const ids = this.ids, keys = this.keys;
    ids[pos] = id;
    this.at[id] = pos;
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

  private growIds(need: number): void {
    const at = new Int32Array(Math.max(need, 2 * this.at.length)).fill(-1);
    at.set(this.at);
    this.at = at;
  }
}
