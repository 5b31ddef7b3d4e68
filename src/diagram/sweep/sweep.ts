import TinyQueue from 'tinyqueue';
import { inCircle, orient } from '../../core/predicates.js';
import { radixSort } from '../../core/hilbert.js';
import { HalfEdgeMesh } from '../../mesh/mesh.js';
import { Triangulation, triangleMesh } from '../../triangulate/triangulation.js';
import { BeachLine } from './beach-line.js';
import { circleEventKey, circleVersusCircleExact, circleVersusSiteExact } from './exact-keys.js';

/**
 * Fortune's sweep (1987) over distinct sites, run for its topology: every
 * circle event is a Voronoi vertex, i.e. a Delaunay triangle (left, middle,
 * right arc, counter-clockwise), and every breakpoint traces the Voronoi
 * edge dual to a Delaunay edge. Where four or more sites are cocircular,
 * several events fire at one point and fan the Delaunay polygon into
 * triangles; the diagram stage merges them again, exactly.
 *
 * Event order, one rule for every tie: by the event's y (a site's y, the top
 * of a circle), then its x; at the same point circle events come before a
 * site, and circle events among themselves by creation. That is the order of
 * a sweep line tilted by an infinitesimal angle, and at any tie the
 * remaining choices all give a Delaunay triangulation (events at one point
 * belong to cocircular sites). The first row (every site with the smallest
 * y) starts the beach line as vertical strips, in x order.
 */
export function sweepTriangulation(xy: Float64Array, n: number, siteOfInput: Int32Array): Triangulation {
  return Triangulation.fromMesh(new Sweep(xy, n).run(), siteOfInput);
}

/**
 * Sites by (y, x): a radix sort on y quantized to 32 bits (rounding is
 * monotone, so the quantized order never contradicts the true one), then
 * each run of equal keys (a grid row, or close values) sorted exactly.
 */
function sweepOrder(xy: Float64Array, n: number): Uint32Array {
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const y = xy[2 * i + 1];
    if (y < lo) lo = y;
    if (y > hi) hi = y;
  }
  const scale = hi > lo ? 4294967295 / (hi - lo) : 0;
  const ids = new Uint32Array(n), keys = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    ids[i] = i;
    keys[i] = Math.min(4294967295, Math.floor((xy[2 * i + 1] - lo) * scale));
  }
  const sorted = n < 2 ? { ids, keys } : radixSort(ids, keys);
  const order = sorted.ids, k = sorted.keys;
  const byYX = (a: number, b: number): number => xy[2 * a + 1] - xy[2 * b + 1] || xy[2 * a] - xy[2 * b];
  for (let i = 0; i < n;) {
    let j = i + 1;
    while (j < n && k[j] === k[i]) j++;
    if (j - i > 1) order.subarray(i, j).sort(byYX);
    i = j;
  }
  return order;
}

/** Union-find root, halving the path on the way. */
function root(parent: Int32Array, x: number): number {
  while (parent[x] !== x) x = parent[x] = parent[parent[x]];
  return x;
}

/** Growable Int32Array. */
function grownI32(a: Int32Array, need: number): Int32Array {
  if (need <= a.length) return a;
  const b = new Int32Array(Math.max(need, 2 * a.length));
  b.set(a);
  return b;
}

class Sweep {
  /** The sites' coordinates as given (site numbers). */
  private readonly siteXY: Float64Array;
  /**
   * The coordinates in sweep order: the sweep numbers sites by rank in that
   * order, so that the arcs of the beach line, all sites near the sweep line,
   * sit together in memory. Ranks become site numbers again in toMesh().
   */
  private xy: Float64Array;
  private siteOfRank: Uint32Array = new Uint32Array(0);
  private readonly n: number;
  private readonly beach: BeachLine;
  // Circle events: the vanishing arc, its sites, and key/err/x/err (circleEventKey).
  private evArc: Int32Array = new Int32Array(1024);
  private evSites: Int32Array = new Int32Array(3 * 1024);
  private evKey: Float64Array = new Float64Array(4 * 1024);
  private evLive: Uint8Array = new Uint8Array(1024);
  /**
   * Events found on one circle by a comparison share a class (union-find,
   * parent links). Cocircular sites make many such events (a ring: all of
   * them); within a class every comparison is a tie known without
   * arithmetic, so a class costs about one exact test per member.
   */
  private evClass: Int32Array = new Int32Array(1024);
  /**
   * Events found to have exactly the same key (the squares of a grid row)
   * share a row (union-find like evClass): between them only x is left to
   * compare, which the x filter usually decides at once.
   */
  private evRow: Int32Array = new Int32Array(1024);
  private evCount = 0;
  private queue: TinyQueue<number>;
  private readonly order: (i: number, j: number) => number;
  /** Cancelled events still in the heap. */
  private dead = 0;
  // Triangles, 3 sites each; half-edge 3t+j runs from site j to site j+1.
  private tri: Int32Array = new Int32Array(3 * 1024);
  private triCount = 0;
  private twin: Int32Array = new Int32Array(3 * 1024);
  // Edge records: one per Delaunay edge traced by breakpoints, holding the first half-edge that closed it.
  private edgeHalf: Int32Array = new Int32Array(1024);
  private edgeCount = 0;

  constructor(xy: Float64Array, n: number) {
    this.siteXY = xy;
    this.xy = xy;
    this.n = n;
    this.beach = new BeachLine(Math.max(2, 2 * n));
    // Room for the usual counts (2n triangles, 3n edges, about 3n events), grown if ever exceeded.
    this.tri = new Int32Array(6 * n + 3);
    this.twin = new Int32Array(6 * n + 3);
    this.edgeHalf = new Int32Array(3 * n + 1);
    this.growEvents(3 * n + 1);
    // The floating filter inline, so that the heap's hot comparator stays small.
    this.order = (i, j) => {
      const k = this.evKey, oi = 4 * i, oj = 4 * j;
      const dy = k[oi] - k[oj], ey = k[oi + 1] + k[oj + 1];
      return dy > ey || -dy > ey ? dy : this.compareEvents(i, j);
    };
    this.queue = new TinyQueue<number>([], this.order);
  }

  run(): HalfEdgeMesh {
    const n = this.n;
    const site = (this.siteOfRank = sweepOrder(this.siteXY, n));
    const xy = (this.xy = new Float64Array(2 * n));
    for (let r = 0; r < n; r++) {
      xy[2 * r] = this.siteXY[2 * site[r]];
      xy[2 * r + 1] = this.siteXY[2 * site[r] + 1];
    }
    // The first row: vertical strips left to right, their breakpoints run down to infinity.
    let arc = this.beach.first(0);
    let i = 1;
    for (; i < n && xy[2 * i + 1] === xy[1]; i++) {
      this.beach.rightEdge[arc] = this.newEdge();
      arc = this.beach.insertAfter(arc, i);
    }
    for (;;) {
      const queue = this.queue;
      while (queue.length > 0 && !this.evLive[queue.peek()!]) { queue.pop(); this.dead--; }
      const top = queue.length > 0 ? queue.peek()! : -1;
      if (i < n && (top < 0 || this.siteFirst(i, top))) this.siteEvent(i++);
      else if (top >= 0) this.circleEvent(queue.pop()!);
      else break;
    }
    return this.toMesh();
  }

  /** Every per-event array gets exactly `cap` entries (at least its current size), so that one length governs them all. */
  private growEvents(want: number): void {
    const cap = Math.max(want, this.evLive.length);
    const i32 = (a: Int32Array, per: number): Int32Array => { const b = new Int32Array(per * cap); b.set(a); return b; };
    this.evArc = i32(this.evArc, 1);
    this.evSites = i32(this.evSites, 3);
    this.evClass = i32(this.evClass, 1);
    this.evRow = i32(this.evRow, 1);
    const k = new Float64Array(4 * cap); k.set(this.evKey); this.evKey = k;
    const l = new Uint8Array(cap); l.set(this.evLive); this.evLive = l;
  }

  private newEdge(): number {
    this.edgeHalf = grownI32(this.edgeHalf, this.edgeCount + 1);
    this.edgeHalf[this.edgeCount] = -1;
    return this.edgeCount++;
  }

  /** A breakpoint of edge record r ends at half-edge h: the first end is kept, the second is its twin. */
  private closeEdge(r: number, h: number): void {
    const other = this.edgeHalf[r];
    if (other < 0) {
      this.edgeHalf[r] = h;
    } else {
      this.twin[h] = other;
      this.twin[other] = h;
      this.edgeHalf[r] = -2;
    }
  }

  private siteEvent(s: number): void {
    const b = this.beach, xy = this.xy;
    const x = b.locate(xy[2 * s], xy[2 * s + 1], xy);
    this.cancel(x);
    // x becomes x, s, x' : both new breakpoints trace the one edge between x's site and s.
    const e = this.newEdge();
    const q = b.insertAfter(x, s);
    const x2 = b.insertAfter(q, b.site[x]);
    b.rightEdge[x2] = b.rightEdge[x];
    b.rightEdge[x] = e;
    b.rightEdge[q] = e;
    this.check(x);
    this.check(x2);
  }

  private circleEvent(ev: number): void {
    const b = this.beach;
    const mid = this.evArc[ev];
    const left = b.prev[mid], right = b.next[mid];
    const t = this.triCount++;
    if (3 * this.triCount > this.tri.length) {
      this.tri = grownI32(this.tri, 3 * this.triCount);
      this.twin = grownI32(this.twin, 3 * this.triCount);
    }
    this.tri[3 * t] = b.site[left];
    this.tri[3 * t + 1] = b.site[mid];
    this.tri[3 * t + 2] = b.site[right];
    this.twin[3 * t] = this.twin[3 * t + 1] = this.twin[3 * t + 2] = -1;
    this.closeEdge(b.rightEdge[left], 3 * t);
    this.closeEdge(b.rightEdge[mid], 3 * t + 1);
    const e = this.newEdge();
    this.edgeHalf[e] = 3 * t + 2;
    b.rightEdge[left] = e;
    this.evLive[ev] = 0;
    b.event[mid] = -1;
    b.remove(mid);
    this.cancel(left);
    this.cancel(right);
    this.check(left);
    this.check(right);
  }

  private cancel(arc: number): void {
    const ev = this.beach.event[arc];
    if (ev >= 0) {
      this.evLive[ev] = 0;
      this.beach.event[arc] = -1;
      // Cancelled events far ahead of the line would pile up in the heap (most false alarms
      // are); once they are the majority, heapify the live ones again: linear, so amortised O(1).
      if (++this.dead > 1024 && 2 * this.dead > this.queue.length) {
        const live = this.queue.data.filter((e) => this.evLive[e] === 1);
        this.queue = new TinyQueue<number>(live, this.order);
        this.dead = 0;
      }
    }
  }

  /** Schedules the event of arc m if its neighbours' breakpoints converge (exact orientation). */
  private check(m: number): void {
    const b = this.beach, xy = this.xy;
    const l = b.prev[m], r = b.next[m];
    if (l < 0 || r < 0) return;
    const sa = b.site[l], sb = b.site[m], sc = b.site[r];
    if (sa === sc) return;
    const ax = xy[2 * sa], ay = xy[2 * sa + 1], bx = xy[2 * sb], by = xy[2 * sb + 1], cx = xy[2 * sc], cy = xy[2 * sc + 1];
    if (!(orient(ax, ay, bx, by, cx, cy) > 0)) return;
    const ev = this.evCount++;
    if (ev === this.evLive.length) this.growEvents(2 * ev);
    this.evArc[ev] = m;
    this.evSites[3 * ev] = sa; this.evSites[3 * ev + 1] = sb; this.evSites[3 * ev + 2] = sc;
    circleEventKey(ax, ay, bx, by, cx, cy, this.evKey, 4 * ev);
    this.evLive[ev] = 1;
    this.evClass[ev] = ev;
    this.evRow[ev] = ev;
    b.event[m] = ev;
    this.queue.push(ev);
  }

  /** Whether site s comes before circle event ev (see the tie rule above). */
  private siteFirst(s: number, ev: number): boolean {
    const k = this.evKey, xy = this.xy, o = 4 * ev;
    const sx = xy[2 * s], sy = xy[2 * s + 1];
    const dy = k[o] - sy;
    if (dy > k[o + 1]) return true;
    if (-dy > k[o + 1]) return false;
    const e = this.evSites;
    const a = e[3 * ev], b = e[3 * ev + 1], c = e[3 * ev + 2];
    // Positive: the circle's top is above the site, or level with it and to its right.
    return circleVersusSiteExact(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], sx, sy) > 0;
  }

  private classOf(ev: number): number { return root(this.evClass, ev); }
  private rowOf(ev: number): number { return root(this.evRow, ev); }

  /** Heap order of two circle events the filter could not separate: y, then x, then creation. */
  private compareEvents(i: number, j: number): number {
    const ci = this.classOf(i), cj = this.classOf(j);
    if (ci === cj) return i - j;
    const ri = this.rowOf(i), rj = this.rowOf(j);
    if (ri === rj) {
      const k = this.evKey, dx = k[4 * i + 2] - k[4 * j + 2], ex = k[4 * i + 3] + k[4 * j + 3];
      if (dx > ex || -dx > ex) return dx;
    }
    const e = this.evSites, xy = this.xy;
    const a = e[3 * i], b = e[3 * i + 1], c = e[3 * i + 2];
    const p = e[3 * j], q = e[3 * j + 1], r = e[3 * j + 2];
    // Events of cocircular sites (all of a ring, the squares of a grid) are one point: a tie, decided
    // by three exact in-circle signs, far cheaper than comparing the keys.
    const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1], cx = xy[2 * c], cy = xy[2 * c + 1];
    if (inCircle(ax, ay, bx, by, cx, cy, xy[2 * p], xy[2 * p + 1]) === 0 &&
        inCircle(ax, ay, bx, by, cx, cy, xy[2 * q], xy[2 * q + 1]) === 0 &&
        inCircle(ax, ay, bx, by, cx, cy, xy[2 * r], xy[2 * r + 1]) === 0) {
      this.evClass[Math.max(ci, cj)] = Math.min(ci, cj);
      return i - j;
    }
    const s = circleVersusCircleExact(
      xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1],
      xy[2 * p], xy[2 * p + 1], xy[2 * q], xy[2 * q + 1], xy[2 * r], xy[2 * r + 1]);
    // +-1: equal keys, told apart by x.
    if (s === 1 || s === -1) this.evRow[Math.max(ri, rj)] = Math.min(ri, rj);
    return s !== 0 ? s : i - j;
  }

  /**
   * The triangles as a Delaunay half-edge mesh: triangle faces first, then
   * one outer half-edge for every edge record closed on one side only (a
   * hull edge), linked into the clockwise outer cycle.
   */
  private toMesh(): HalfEdgeMesh {
    const n = this.n, T = this.triCount, len = 3 * T, site = this.siteOfRank;
    const vertexXY = this.siteXY.slice(0, 2 * n);
    if (T === 0) {
      const none = new Int32Array(0);
      return new HalfEdgeMesh({
        kind: 'delaunay', vertexXY, origin: none, twin: none, next: none, face: none,
        faceEdge: Int32Array.of(-1), faceSite: Int32Array.of(-1), outerFace: 0,
      });
    }
    let hull = 0;
    for (let r = 0; r < this.edgeCount; r++) {
      const h = this.edgeHalf[r];
      if (h >= 0) hull++;
    }
    const total = len + hull;
    const origin = new Int32Array(total), twin = new Int32Array(total), next = new Int32Array(total), face = new Int32Array(total);
    for (let e = 0; e < len; e++) {
      origin[e] = site[this.tri[e]];
      twin[e] = this.twin[e];
      next[e] = e % 3 === 2 ? e - 2 : e + 1;
      face[e] = (e / 3) | 0;
    }
    const outerFrom = new Int32Array(n).fill(-1);
    let H = len;
    for (let r = 0; r < this.edgeCount; r++) {
      const h = this.edgeHalf[r];
      if (h < 0) continue;
      // h runs u -> v with its triangle on the left; the outer half-edge runs v -> u.
      origin[H] = site[this.tri[next[h]]];
      twin[H] = h;
      twin[h] = H;
      face[H] = T;
      outerFrom[origin[H]] = H;
      H++;
    }
    for (let e = len; e < total; e++) next[e] = outerFrom[origin[twin[e]]];
    for (let e = 0; e < total; e++) {
      if (twin[e] < 0 || next[e] < 0) throw new Error('ambit: the sweep left a Delaunay edge unmatched; this is a bug');
    }
    return triangleMesh(vertexXY, origin, twin, next, face, T);
  }
}
