import { inCircle } from '../../core/predicates.js';
import { radixSort } from '../../core/hilbert.js';
import { mergeDuplicates } from '../../core/dedupe.js';
import { HalfEdgeMesh } from '../../mesh/mesh.js';
import { Triangulation } from '../../triangulate/triangulation.js';
import { GHOST, TriangleStore } from '../../triangulate/store.js';
import { BeachLine } from './beach-line.js';
import { EventQueue, type EventTies } from './event-queue.js';
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
  const store = newStore(xy, n);
  return sweepOwned(xy.slice(0, 2 * n), n, siteOfInput, sweepOrder(xy, n, store.vert), store);
}

/**
 * The sweep of points read from the input (readPoints: a fresh array, which
 * the triangulation may keep). The sweep's own sort by (y, x) puts equal
 * points side by side, so it also tells whether there are any: without
 * them (the usual case) the sites are the points in input order, exactly
 * what mergeDuplicates would return, and its sort along a curve, which only
 * the incremental route needs, is skipped.
 */
export function sweepPoints(points: Float64Array): Triangulation {
  const n = points.length >> 1;
  const store = newStore(points, n);
  const order = sweepOrder(points, n, store.vert);
  for (let k = 1; k < n; k++) {
    const a = 2 * order[k - 1], b = 2 * order[k];
    if (points[a] === points[b] && points[a + 1] === points[b + 1]) {
      const sites = mergeDuplicates(points), m = sites.count, fewer = newStore(sites.xy, m);
      return sweepOwned(sites.xy, m, sites.siteOfInput, sweepOrder(sites.xy, m, fewer.vert), fewer);
    }
  }
  const siteOfInput = new Int32Array(n);
  for (let i = 0; i < n; i++) siteOfInput[i] = i;
  return sweepOwned(points, n, siteOfInput, order, store);
}

/** The store for the sweep of n sites: T triangles and h hull edges with T + h = 2n - 2, all the room it needs. */
function newStore(xy: Float64Array, n: number): TriangleStore {
  return new TriangleStore(xy, Math.max(1, 2 * n - 2));
}

/** The sweep over xy (2n numbers, kept by the triangulation), sites in `order` (sweepOrder), into `store` (newStore). */
function sweepOwned(xy: Float64Array, n: number, siteOfInput: Int32Array, order: Uint32Array, store: TriangleStore): Triangulation {
  const sweep = new Sweep(xy, n, store);
  sweep.run(order);
  const sites = { xy, count: n, siteOfInput, curveOrder: new Uint32Array(0) };
  if (sweep.triCount === 0) return Triangulation.fromMesh(collinearMesh(xy), siteOfInput);
  return Triangulation.fromStore(sites, sweep.closeHull(), sweep.triCount, { rankXY: sweep.rankXY, siteOfRank: sweep.siteOfRank });
}

/** The mesh of sites without a triangle (one or collinear): its vertices only, the rest is fromMesh's. */
function collinearMesh(vertexXY: Float64Array): HalfEdgeMesh {
  const none = new Int32Array(0);
  return new HalfEdgeMesh({
    kind: 'delaunay', vertexXY, origin: none, twin: none, next: none, face: none,
    faceEdge: Int32Array.of(-1), faceSite: Int32Array.of(-1), outerFace: 0,
  });
}

/**
 * Sites by (y, x): a radix sort on y quantized to 32 bits (rounding is
 * monotone, so the quantized order never contradicts the true one), then
 * each run of equal keys (a grid row, or close values) sorted exactly.
 * The keys and the sort's buffers live in `scratch` (the store's triangle
 * array, written over by the sweep later): its memory is then touched once.
 */
function sweepOrder(xy: Float64Array, n: number, scratch: Int32Array): Uint32Array {
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) {
    const y = xy[2 * i + 1];
    if (y < lo) lo = y;
    if (y > hi) hi = y;
  }
  const scale = hi > lo ? 4294967295 / (hi - lo) : 0;
  const room = scratch.length >= 3 * n ? new Uint32Array(scratch.buffer, scratch.byteOffset, 3 * n) : new Uint32Array(3 * n);
  const ids = new Uint32Array(n), keys = room.subarray(0, n);
  for (let i = 0; i < n; i++) {
    ids[i] = i;
    keys[i] = Math.min(4294967295, Math.floor((xy[2 * i + 1] - lo) * scale));
  }
  const sorted = n < 2 ? { ids, keys } : radixSort(ids, keys, room.subarray(n, 2 * n), room.subarray(2 * n, 3 * n));
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

class Sweep implements EventTies {
  /** The sites' coordinates as given (site numbers). */
  private readonly siteXY: Float64Array;
  /**
   * The coordinates in sweep order: the sweep numbers sites by rank in that
   * order, so that the arcs of the beach line, all sites near the sweep line,
   * sit together in memory. The triangulation keeps them (with siteOfRank),
   * as the incremental route keeps its own ranks: the diagram passes then
   * read triangles whose corners are near each other in memory too, where
   * site numbers (input order) would scatter them.
   */
  private xy: Float64Array;
  /** The coordinates by rank, for the triangulation (after run()). */
  get rankXY(): Float64Array { return this.xy; }
  siteOfRank: Int32Array = new Int32Array(0);
  private readonly n: number;
  private readonly beach: BeachLine;
  /**
   * Circle events, by slot: the vanishing arc, its sites, key/err/x/err
   * (circleEventKey), and the creation number that breaks exact ties. A slot
   * is reused once its event has left the heap, so the slots in use stay
   * about as few as the arcs (most events are false alarms, cancelled soon)
   * and in cache; the creation number, not the slot, keeps the order.
   */
  private evStamp: Int32Array = new Int32Array(1024);
  private evArc: Int32Array = new Int32Array(1024);
  private evSites: Int32Array = new Int32Array(3 * 1024);
  private evKey: Float64Array = new Float64Array(4 * 1024);
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
  /**
   * Slots on a class or row tree: never reused, so that the trees keep
   * meaning one circle or one key (they exist only where sites are
   * cocircular or keys equal).
   */
  private evPinned: Uint8Array = new Uint8Array(1024);
  private freeSlots: Int32Array = new Int32Array(1024);
  private freeCount = 0;
  /** Slots ever used. */
  private evCount = 0;
  /**
   * Where to start looking for a new site's arc: per strip of x, the arc
   * last placed or joined there, and its site (the arc is stale once its
   * site changed). From there the walk along the line is a step or two for
   * spread-out sites, where the tree search tests a breakpoint per level;
   * a walk longer than 32 steps (clusters crowd a strip) gives way to the
   * tree, so the worst case stays logarithmic.
   */
  private hintArc: Int32Array = new Int32Array(0);
  private hintSite: Int32Array = new Int32Array(0);
  private hintX0 = 0;
  private hintScale = 0;
  /**
   * Walks that found their arc since the tree was last searched: past twice
   * the arcs on the line, they have paid for building the tree again, and
   * the sweep stops keeping it (see BeachLine). Rebuilds then cost O(1) per
   * site amortised, and a search stays logarithmic whenever walks fail.
   */
  private walks = 0;
  /** Events ever made. */
  private created = 0;
  private readonly queue: EventQueue;
  /**
   * Triangles, 3 ranks each, written straight into the triangulation's
   * store (half-edge 3t+j runs from corner j to corner j+1); the ghosts
   * follow them in closeHull().
   */
  private store: TriangleStore;
  triCount = 0;
  /**
   * Edge records: one per Delaunay edge traced by breakpoints, holding the
   * first half-edge that closed it (-1: none yet, -2: both sides closed).
   * A record both of whose sides are closed is done, and its slot is
   * reused, so the slots in use stay about as few as the breakpoints
   * (instead of some 3n ever made); edgeStamp keeps each record's creation
   * number, the order in which closeHull() lays out the ghosts.
   */
  private edgeHalf: Int32Array = new Int32Array(1024);
  private edgeStamp: Int32Array = new Int32Array(1024);
  private edgeFree: Int32Array = new Int32Array(1024);
  private edgeFreeCount = 0;
  /** Slots ever used. */
  private edgeCount = 0;
  /** Records ever made. */
  private edgesMade = 0;

  constructor(xy: Float64Array, n: number, store: TriangleStore) {
    this.siteXY = xy;
    this.xy = xy;
    this.n = n;
    this.beach = new BeachLine(Math.max(2, Math.min(2 * n, 1024)));
    this.store = store;
    this.queue = new EventQueue(this, 1024);
  }

  run(order: Uint32Array): void {
    const n = this.n;
    const site = (this.siteOfRank = new Int32Array(order.buffer, order.byteOffset, n));
    const xy = (this.xy = this.store.xy = new Float64Array(2 * n));
    let lo = Infinity, hi = -Infinity;
    for (let r = 0; r < n; r++) {
      const x = (xy[2 * r] = this.siteXY[2 * site[r]]);
      xy[2 * r + 1] = this.siteXY[2 * site[r] + 1];
      if (x < lo) lo = x;
      if (x > hi) hi = x;
    }
    // Fewer strips than arcs, so that circle events refresh most strips before their arc is gone: with
    // half the square root, uniform sites cost about 3.5 breakpoint tests each (measured at 1e5 and 1e6).
    const strips = Math.ceil(0.5 * Math.sqrt(n));
    this.hintArc = new Int32Array(strips).fill(-1);
    this.hintSite = new Int32Array(strips);
    this.hintX0 = lo;
    this.hintScale = hi > lo ? strips / (hi - lo) : 0;
    // The first row: vertical strips left to right, their breakpoints run down to infinity.
    let arc = this.beach.first(0);
    let i = 1;
    for (; i < n && xy[2 * i + 1] === xy[1]; i++) {
      this.beach.rightEdge[arc] = this.newEdge();
      arc = this.beach.insertAfter(arc, i);
    }
    for (;;) {
      const queue = this.queue;
      const top = queue.length > 0 ? queue.peek() : -1;
      if (i < n && (top < 0 || this.siteFirst(i, top))) this.siteEvent(i++);
      else if (top >= 0) {
        const ev = queue.pop();
        this.circleEvent(ev);
        this.release(ev);
      }
      else break;
    }
  }

  /** Every per-event array gets exactly `cap` entries (at least its current size), so that one length governs them all. */
  private growEvents(want: number): void {
    const cap = Math.max(want, this.evArc.length);
    const i32 = (a: Int32Array, per: number): Int32Array => { const b = new Int32Array(per * cap); b.set(a); return b; };
    this.evStamp = i32(this.evStamp, 1);
    this.evArc = i32(this.evArc, 1);
    this.freeSlots = i32(this.freeSlots, 1);
    this.evSites = i32(this.evSites, 3);
    this.evClass = i32(this.evClass, 1);
    this.evRow = i32(this.evRow, 1);
    const k = new Float64Array(4 * cap); k.set(this.evKey); this.evKey = k;
    const p = new Uint8Array(cap); p.set(this.evPinned); this.evPinned = p;
  }

  private newEdge(): number {
    let r: number;
    if (this.edgeFreeCount > 0) r = this.edgeFree[--this.edgeFreeCount];
    else {
      r = this.edgeCount++;
      if (r === this.edgeHalf.length) {
        this.edgeHalf = grownI32(this.edgeHalf, r + 1);
        this.edgeStamp = grownI32(this.edgeStamp, r + 1);
        this.edgeFree = grownI32(this.edgeFree, r + 1);
      }
    }
    this.edgeHalf[r] = -1;
    this.edgeStamp[r] = this.edgesMade++;
    return r;
  }

  /** A breakpoint of edge record r ends at half-edge h: the first end is kept, the second is its twin. */
  private closeEdge(r: number, h: number): void {
    const other = this.edgeHalf[r];
    if (other < 0) {
      this.edgeHalf[r] = h;
    } else {
      const tw = this.store.twin;
      tw[h] = other;
      tw[other] = h;
      this.edgeHalf[r] = -2;
      this.edgeFree[this.edgeFreeCount++] = r;
    }
  }

  private siteEvent(s: number): void {
    const b = this.beach, xy = this.xy;
    const qx = xy[2 * s], qy = xy[2 * s + 1];
    const strip = this.stripOf(qx);
    let x = this.walkFrom(strip, qx, qy);
    // A stale hint (its arc has vanished since): a neighbouring strip's will do.
    if (x === -2 && strip > 0) x = this.walkFrom(strip - 1, qx, qy);
    if (x === -2 && strip + 1 < this.hintArc.length) x = this.walkFrom(strip + 1, qx, qy);
    if (x < 0) {
      x = b.locate(qx, qy, xy);
      this.walks = 0;
    } else if (b.hasTree && ++this.walks > 2 * b.live) b.dropTree();
    this.cancel(x);
    // x becomes x, s, x' : both new breakpoints trace the one edge between x's site and s.
    const e = this.newEdge();
    const q = b.insertAfter(x, s);
    const x2 = b.insertAfter(q, b.site[x]);
    b.rightEdge[x2] = b.rightEdge[x];
    b.rightEdge[x] = e;
    b.rightEdge[q] = e;
    this.hintArc[strip] = q;
    this.hintSite[strip] = s;
    this.check(x);
    this.check(x2);
  }

  private circleEvent(ev: number): void {
    const b = this.beach;
    const mid = this.evArc[ev];
    const left = b.prev[mid], right = b.next[mid];
    const t = this.triCount++;
    this.store.reserve(this.triCount);
    const v = this.store.vert, tw = this.store.twin;
    v[3 * t] = b.site[left];
    v[3 * t + 1] = b.site[mid];
    v[3 * t + 2] = b.site[right];
    tw[3 * t] = tw[3 * t + 1] = tw[3 * t + 2] = -1;
    this.closeEdge(b.rightEdge[left], 3 * t);
    this.closeEdge(b.rightEdge[mid], 3 * t + 1);
    const e = this.newEdge();
    this.edgeHalf[e] = 3 * t + 2;
    b.rightEdge[left] = e;
    b.event[mid] = -1;
    b.remove(mid);
    // Where the arc vanished its neighbours meet: a fresh hint for that strip.
    const strip = this.stripOf(this.evKey[4 * ev + 2]);
    this.hintArc[strip] = left;
    this.hintSite[strip] = b.site[left];
    this.cancel(left);
    this.cancel(right);
    this.check(left);
    this.check(right);
  }

  /** The arc above (qx, qy) found by walking from the hint of `strip`: -1 after too long a walk, -2 if the hint is stale. */
  private walkFrom(strip: number, qx: number, qy: number): number {
    const b = this.beach, h = this.hintArc[strip];
    return h >= 0 && b.site[h] === this.hintSite[strip] ? b.walk(h, qx, qy, this.xy, 32) : -2;
  }

  /** The hint strip of x (any number, even NaN, gives a valid strip). */
  private stripOf(x: number): number {
    const f = (x - this.hintX0) * this.hintScale, last = this.hintArc.length - 1;
    return f >= 0 ? (f < last ? f | 0 : last) : 0;
  }

  private cancel(arc: number): void {
    const ev = this.beach.event[arc];
    if (ev >= 0) {
      this.beach.event[arc] = -1;
      this.queue.remove(ev);
      this.release(ev);
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
    // The key goes straight into the next free slot, which is taken only if the breakpoints converge.
    const reuse = this.freeCount > 0, ev = reuse ? this.freeSlots[this.freeCount - 1] : this.evCount;
    if (ev === this.evArc.length) this.growEvents(2 * ev);
    if (!circleEventKey(ax, ay, bx, by, cx, cy, this.evKey, 4 * ev)) return;
    if (reuse) this.freeCount--;
    else this.evCount++;
    this.evStamp[ev] = this.created++;
    this.evArc[ev] = m;
    this.evSites[3 * ev] = sa; this.evSites[3 * ev + 1] = sb; this.evSites[3 * ev + 2] = sc;
    this.evClass[ev] = ev;
    this.evRow[ev] = ev;
    b.event[m] = ev;
    this.queue.push(ev, this.evKey[4 * ev], this.evKey[4 * ev + 1]);
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

  /** A slot whose event has left the heap: free for the next event, unless a tree holds it. */
  private release(ev: number): void {
    if (this.evPinned[ev] === 0) this.freeSlots[this.freeCount++] = ev;
  }

  private classOf(ev: number): number { return root(this.evClass, ev); }
  private rowOf(ev: number): number { return root(this.evRow, ev); }

  /** Heap order of two circle events the filter could not separate: y, then x, then creation. */
  compareEvents(i: number, j: number): number {
    const ci = this.classOf(i), cj = this.classOf(j);
    const ti = this.evStamp[i], tj = this.evStamp[j];
    if (ci === cj) return ti - tj;
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
      this.evPinned[ci] = this.evPinned[cj] = 1;
      return ti - tj;
    }
    const s = circleVersusCircleExact(
      xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1],
      xy[2 * p], xy[2 * p + 1], xy[2 * q], xy[2 * q + 1], xy[2 * r], xy[2 * r + 1]);
    // +-1: equal keys, told apart by x.
    if (s === 1 || s === -1) {
      this.evRow[Math.max(ri, rj)] = Math.min(ri, rj);
      this.evPinned[ri] = this.evPinned[rj] = 1;
    }
    return s !== 0 ? s : ti - tj;
  }

  /**
   * Adds one ghost per edge record closed on one side only (a hull edge),
   * in order of the records' creation, each ghost's outer side linked to the next one along
   * the hull: the layout Triangulation.fromMesh makes of the mesh the sweep
   * used to emit, so that the diagram stays the same.
   */
  closeHull(): TriangleStore {
    const T = this.triCount, len = 3 * T;
    let hull = 0;
    for (let r = 0; r < this.edgeCount; r++) if (this.edgeHalf[r] >= 0) hull++;
    const open = new Uint32Array(hull), made = new Uint32Array(hull);
    for (let r = 0, k = 0; r < this.edgeCount; r++) {
      if (this.edgeHalf[r] >= 0) { open[k] = r; made[k] = this.edgeStamp[r]; k++; }
    }
    const records = hull > 1 ? radixSort(open, made).ids : open;
    const store = this.store;
    store.reserve(T + hull);
    const v = store.vert, tw = store.twin;
    // Ghost g of hull half-edge h (u -> v) is (v, u, GHOST); outerFrom[v] = g + 1 (0: none). Only
    // hull vertices are written: the rest of the fresh, zero table is never touched.
    const outerFrom = new Int32Array(this.n);
    let g = T;
    for (let k = 0; k < hull; k++) {
      const h = this.edgeHalf[records[k]];
      const to = v[h % 3 === 2 ? h - 2 : h + 1];
      v[3 * g] = to;
      v[3 * g + 1] = v[h];
      v[3 * g + 2] = GHOST;
      tw[3 * g] = h;
      tw[h] = 3 * g;
      outerFrom[to] = g + 1;
      g++;
    }
    for (let e = 0; e < len; e++) {
      if (tw[e] < 0) throw new Error('ambit: the sweep left a Delaunay edge unmatched; this is a bug');
    }
    for (let k = T; k < g; k++) {
      // The outer side of ghost k runs on from its vertex 1, where the next ghost's starts.
      const after = outerFrom[v[3 * k + 1]] - 1;
      if (after < 0) throw new Error('ambit: the sweep left a Delaunay edge unmatched; this is a bug');
      tw[3 * k + 1] = 3 * after + 2;
      tw[3 * after + 2] = 3 * k + 1;
    }
    store.count = g;
    store.last = 0;
    return store;
  }
}
