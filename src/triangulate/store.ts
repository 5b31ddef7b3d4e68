import { orient2d, incircle } from 'robust-predicates';
import { liftedAboveChord, powerTest, powerTestOf } from '../core/power.js';

/**
 * The vertex every hull edge is joined to, closing the triangulation into a
 * sphere. Its "ghost" triangles make the hull just another set of triangles:
 * a point outside the hull lands in a ghost, and every half-edge has a twin.
 */
export const GHOST = -1;

/** Marks the three slots of a triangle freed by a vertex removal (weighted build only). */
export const DEAD = -2;

/** A replacement in-circle test (see TriangleStore.flipTest). */
export interface FlipTest { mustFlip(a: number, b: number, p: number, d: number): boolean }

// Half-edges 3t, 3t+1, 3t+2 belong to triangle t, in counter-clockwise order.
const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

/**
 * (a,b,p) + (b,a,d) across half-edge e = a→b become (p,d,b) + (d,p,a).
 * A plain function shared by both flip loops: side by side in one process
 * at 10^6 sites it built as fast as the loop with the flip written out.
 */
function flip(v: Int32Array, tw: Int32Array, e: number): void {
  const e1 = nextOf(e), e2 = nextOf(e1), f = tw[e], f1 = nextOf(f), f2 = nextOf(f1);
  const a = v[e], b = v[e1], p = v[e2], d = v[f2];
  const x1 = tw[e1], x2 = tw[e2], y1 = tw[f1], y2 = tw[f2];
  v[e] = p; v[e1] = d; v[e2] = b;
  v[f] = d; v[f1] = p; v[f2] = a;
  tw[e1] = y2; tw[y2] = e1;
  tw[e2] = x1; tw[x1] = e2;
  tw[f1] = x2; tw[x2] = f1;
  tw[f2] = y1; tw[y1] = f2;
}

// Signs below are those of robust-predicates, y-down: orient2d(a, b, c) < 0
// means a, b, c turn counter-clockwise in ambit's y-up convention, and
// incircle(a, b, c, d) > 0 means d lies inside the circle of counter-clockwise a, b, c.

/**
 * Triangles of an incremental Delaunay triangulation in an implicit
 * half-edge layout: `vert[e]` is the origin of half-edge e, `twin[e]` its
 * opposite. Every topological decision uses exact predicates.
 */
export class TriangleStore {
  xy: Float64Array;
  /** Weights by vertex for a regular triangulation; null for Delaunay. */
  w: Float64Array | null = null;
  /**
   * x, y, weight per vertex side by side (a weighted build only): the power
   * tests and the orientation tests of its flips read one array, so a vertex
   * costs one cache line instead of two.
   */
  private xyw: Float64Array = new Float64Array(0);

  /** Makes the build weighted: w by vertex, as xy, and xyw interleaving the two. */
  setWeights(w: Float64Array, xyw: Float64Array): void {
    this.w = w;
    this.xyw = xyw;
  }
  /** Vertices removed because a later site made them redundant (weighted build only). */
  readonly removed: number[] = [];
  /** Freed triangle slots, reused by later splits. */
  private free: number[] = [];
  vert: Int32Array;
  twin: Int32Array;
  /** Triangles in use, ghosts included. */
  count = 0;
  /** A real triangle near the last insertion: where the next walk starts. */
  last = 0;
  /** Set by locate(): the half-edge p lies on, or -1. */
  hitEdge = -1;
  /** Set by locate(): the vertex p coincides with, or -1. */
  hitVertex = -1;
  private stack: Int32Array = new Int32Array(256);

  constructor(xy: Float64Array, triangleCapacity: number) {
    this.xy = xy;
    this.vert = new Int32Array(3 * triangleCapacity);
    this.twin = new Int32Array(3 * triangleCapacity);
  }

  /** Room for `triangles` triangles in total, keeping the content. */
  reserve(triangles: number): void {
    if (3 * triangles <= this.vert.length) return;
    const cap = Math.max(3 * triangles, 2 * this.vert.length);
    const v = new Int32Array(cap); v.set(this.vert); this.vert = v;
    const t = new Int32Array(cap); t.set(this.twin); this.twin = t;
  }

  isGhost(t: number): boolean {
    const v = this.vert;
    return v[3 * t] < 0 || v[3 * t + 1] < 0 || v[3 * t + 2] < 0;
  }

  /** Two triangle slots for a split: freed ones first, else new ones at the end. */
  private take(): number {
    return this.free.length > 0 ? this.free.pop()! : this.count++;
  }

  private link(a: number, b: number): void {
    this.twin[a] = b;
    this.twin[b] = a;
  }

  /** Starts from the counter-clockwise triangle (a, b, c) and its three ghosts. */
  init(a: number, b: number, c: number): void {
    const v = this.vert;
    v.set([a, b, c, b, a, GHOST, c, b, GHOST, a, c, GHOST], 0);
    this.count = 4;
    this.link(0, 3); this.link(1, 6); this.link(2, 9);
    // Ghost (b,a,G): a→G (4) meets G→a of (a,c,G) (11); G→b (5) meets b→G of (c,b,G) (7); G→c (8) meets c→G (10).
    this.link(4, 11); this.link(5, 7); this.link(8, 10);
    this.last = 0;
  }

  /**
   * Walks from `last` towards (px, py) through edges that p lies strictly
   * beyond. Returns a real triangle holding p (hitEdge / hitVertex say
   * whether p is on its boundary) or a ghost whose hull edge p lies
   * strictly outside of. A visibility walk cannot cycle in a Delaunay
   * triangulation (Edelsbrunner); the step bound is a guard all the same.
   */
  locate(px: number, py: number): number {
    const t = this.walk(px, py, false);
    if (t >= 0) return t;
    // A triangulation that is not Delaunay (a metric one, see flipTest) can make the walk cycle; a walk
    // that tries the edges in random order cannot cycle for ever in any triangulation (Devillers, Pion and
    // Teillaud 2002, from memory), so it goes next, and the scan stays the last resort.
    const u = this.walk(px, py, true);
    return u >= 0 ? u : this.locateByScan(px, py);
  }

  /** xorshift32 state for the random walk (Marsaglia 2003, from memory). */
  private seed = 2463534242;

  /** The visibility walk of locate(); -1 when it takes more steps than there are triangles (x4 when random). */
  private walk(px: number, py: number, random: boolean): number {
    const v = this.vert, tw = this.twin, xy = this.xy;
    let t = this.last;
    let came = -1;
    this.hitEdge = -1;
    this.hitVertex = -1;
    const limit = random ? 4 * this.count : this.count;
    for (let steps = 0; steps <= limit; steps++) {
      const e0 = 3 * t;
      const v0 = v[e0], v1 = v[e0 + 1], v2 = v[e0 + 2];
      if (v0 < 0 || v1 < 0 || v2 < 0) return t;
      const x0 = xy[2 * v0], y0 = xy[2 * v0 + 1];
      const x1 = xy[2 * v1], y1 = xy[2 * v1 + 1];
      const x2 = xy[2 * v2], y2 = xy[2 * v2 + 1];
      // Start with the edge after the one we came through: it cannot be crossed back. A random walk starts
      // with either of the other two.
      const skip = came >= e0 && came < e0 + 3 ? came - e0 : -1;
      let first = skip + 1;
      if (random) {
        let x = this.seed;
        x ^= x << 13; x ^= x >>> 17; x ^= x << 5;
        this.seed = x;
        first += x & 1;
      }
      let o: number;
      let zeros = 0, zeroEdge = -1;
      let moved = false;
      for (let k = 0; k < 3; k++) {
        const j = (first + k) % 3;
        if (j === skip) continue;
        if (j === 0) o = orient2d(x0, y0, x1, y1, px, py);
        else if (j === 1) o = orient2d(x1, y1, x2, y2, px, py);
        else o = orient2d(x2, y2, x0, y0, px, py);
        if (o > 0) {
          came = tw[e0 + j];
          t = (came / 3) | 0;
          moved = true;
          break;
        }
        if (o === 0) { zeros++; zeroEdge = e0 + j; }
      }
      if (moved) continue;
      if (zeros === 1) this.hitEdge = zeroEdge;
      else if (zeros === 2) {
        // p sits on two edges: it is their shared vertex.
        this.hitVertex = this.sharedZeroVertex(e0, px, py);
      }
      return t;
    }
    return -1;
  }

  private sharedZeroVertex(e0: number, px: number, py: number): number {
    const xy = this.xy;
    for (let j = 0; j < 3; j++) {
      const s = this.vert[e0 + j];
      if (xy[2 * s] === px && xy[2 * s + 1] === py) return s;
    }
    return -1;
  }

  /** The guard's fallback: every triangle tested in turn. Never expected to run. */
  private locateByScan(px: number, py: number): number {
    this.last = 0;
    for (let t = 0; t < this.count; t++) {
      if (this.isGhost(t)) continue;
      this.last = t;
      break;
    }
    const v = this.vert, xy = this.xy;
    for (let t = 0; t < this.count; t++) {
      if (this.isGhost(t)) continue;
      let inside = true;
      let zeros = 0, zeroEdge = -1;
      for (let j = 0; j < 3 && inside; j++) {
        const a = v[3 * t + j], b = v[nextOf(3 * t + j)];
        const o = orient2d(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], px, py);
        if (o > 0) inside = false;
        else if (o === 0) { zeros++; zeroEdge = 3 * t + j; }
      }
      if (!inside) continue;
      this.hitEdge = zeros === 1 ? zeroEdge : -1;
      this.hitVertex = zeros === 2 ? this.sharedZeroVertex(3 * t, px, py) : -1;
      return t;
    }
    for (let t = 0; t < this.count; t++) {
      if (!this.isGhost(t)) continue;
      const e = this.realEdgeOfGhost(t);
      const a = v[e], b = v[nextOf(e)];
      if (orient2d(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], px, py) < 0) return t;
    }
    throw new Error('ambit: point location failed; the triangulation is corrupt');
  }

  /** The half-edge of ghost t between its two real vertices. */
  realEdgeOfGhost(t: number): number {
    const v = this.vert;
    const e0 = 3 * t;
    if (v[e0] < 0) return e0 + 1;
    if (v[e0 + 1] < 0) return e0 + 2;
    return e0;
  }

  /**
   * Inserts site s, which is not yet a vertex. Returns the existing vertex
   * s coincides with, or -1 once s is in.
   */
  insert(s: number): number {
    const xy = this.xy, w = this.w;
    const px = xy[2 * s], py = xy[2 * s + 1];
    const t = this.locate(px, py);
    if (this.hitVertex >= 0) return this.hitVertex;
    if (this.isGhost(t)) this.extendHull(t, s);
    else {
      if (w !== null) {
        // Lifted on or above the plane of the triangle holding it (on an edge: above the lifted
        // edge, which the plane contains): the lower hull does not change, s is redundant.
        if (powerTestOf(this.xyw, this.vert[3 * t], this.vert[3 * t + 1], this.vert[3 * t + 2], s) <= 0) {
          this.removed.push(s);
          return -1;
        }
      }
      if (this.hitEdge >= 0) this.splitEdge(this.hitEdge, s);
      else this.splitTriangle(t, s);
    }
    if (w === null) {
      if (this.flipTest === null) this.legalize();
      else this.legalizeBy(this.flipTest);
    } else {
      this.legalizeWeighted();
      if (this.newGhost >= 0 && this.vert[this.newGhost] === s && this.vert[this.newGhost + 2] === GHOST) this.pruneFlatHull(s, this.newGhost);
    }
    this.newGhost = -1;
    return -1;
  }

  /**
   * When set, replaces the in-circle test of the unweighted build: whether
   * the edge a→b, with the new site p on its left and d across, must flip.
   * Metric Delaunay triangulations are built this way (diagram/metric/dual.ts).
   * An object of one class, not a closure: the call stays monomorphic from
   * one build to the next, and is inlined.
   */
  flipTest: FlipTest | null = null;

  /** Set by extendHull: the half-edge s→(next hull vertex) of the new site's ghost. */
  private newGhost = -1;


  /**
   * A hull vertex that a new hull vertex s leaves flat (on the segment
   * between its two hull neighbours) with its lifted point on or above
   * their chord is redundant; no edge test sees it (it has no triangle
   * across the hull), so the hull around s is checked here. e: an out-edge of s.
   */
  private pruneFlatHull(s: number, e: number): void {
    const v = this.vert, tw = this.twin, xy = this.xy, w = this.w!;
    const flat = (a: number, b: number, c: number): boolean =>
      a !== c && orient2d(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1]) === 0 &&
      liftedAboveChord(xy[2 * a], xy[2 * a + 1], w[a], xy[2 * b], xy[2 * b + 1], w[b], xy[2 * c], xy[2 * c + 1], w[c]) >= 0;
    for (let guard = 0; guard <= this.count; guard++) {
      let g = e, steps = 0;
      while (v[nextOf(g)] !== GHOST) {
        g = tw[prevOf(g)];
        if (++steps > this.count) return;
      }
      // g = s→G in the ghost (x, s, G); the ghost (s, y, G) is across G→s.
      const x = v[prevOf(g)], toX = tw[nextOf(g)], z = v[prevOf(toX)];
      const sy = nextOf(tw[g]), y = v[nextOf(sy)], toY = nextOf(sy), c = v[nextOf(nextOf(tw[toY]))];
      const before = this.removed.length;
      if (flat(z, x, s)) this.removeVertex(toX);
      else if (flat(s, y, c)) this.removeVertex(toY);
      else return;
      if (this.removed.length === before) return;
      const t = 3 * this.last;
      e = v[t] === s ? t : v[t + 1] === s ? t + 1 : v[t + 2] === s ? t + 2 : -1;
      if (e < 0) return;
    }
  }

  private push(e: number, depth: number): number {
    if (depth === this.stack.length) {
      const grown = new Int32Array(2 * depth);
      grown.set(this.stack);
      this.stack = grown;
    }
    this.stack[depth] = e;
    return depth + 1;
  }

  private depth = 0;

  private splitTriangle(t: number, s: number): void {
    const v = this.vert, tw = this.twin;
    const e0 = 3 * t;
    const a = v[e0], b = v[e0 + 1], c = v[e0 + 2];
    const o1 = tw[e0 + 1], o2 = tw[e0 + 2];
    const t1 = this.take(), t2 = this.take();
    const f0 = 3 * t1, g0 = 3 * t2;
    // t: (a, b, s); t1: (b, c, s); t2: (c, a, s).
    v[e0 + 2] = s;
    v[f0] = b; v[f0 + 1] = c; v[f0 + 2] = s;
    v[g0] = c; v[g0 + 1] = a; v[g0 + 2] = s;
    this.link(f0, o1);
    this.link(g0, o2);
    this.link(e0 + 1, f0 + 2);
    this.link(f0 + 1, g0 + 2);
    this.link(g0 + 1, e0 + 2);
    this.last = t;
    let d = 0;
    d = this.push(e0, d);
    d = this.push(f0, d);
    d = this.push(g0, d);
    this.depth = d;
  }

  private splitEdge(e: number, s: number): void {
    const v = this.vert, tw = this.twin;
    const f = tw[e];
    const e1 = nextOf(e), e2 = nextOf(e1);
    const f1 = nextOf(f), f2 = nextOf(f1);
    const a = v[e], b = v[e1], c = v[e2], d = v[f2];
    const x2 = tw[e2], y2 = tw[f2];
    const n1 = this.take(), n2 = this.take();
    const h = 3 * n1, k = 3 * n2;
    // (a,b,c) becomes (s,b,c) + (a,s,c); (b,a,d) becomes (s,a,d) + (b,s,d).
    v[e] = s;
    v[e2] = c;
    v[h] = a; v[h + 1] = s; v[h + 2] = c;
    v[f] = s;
    v[f2] = d;
    v[k] = b; v[k + 1] = s; v[k + 2] = d;
    this.link(e, k);
    this.link(e2, h + 1);
    this.link(f, h);
    this.link(f2, k + 1);
    this.link(h + 2, x2);
    this.link(k + 2, y2);
    this.last = (e / 3) | 0;
    let depth = 0;
    depth = this.push(e1, depth);
    depth = this.push(h + 2, depth);
    depth = this.push(f1, depth);
    depth = this.push(k + 2, depth);
    this.depth = depth;
  }

  /** s lies strictly outside the hull edge of ghost g: turn every ghost that sees s into a triangle. */
  private extendHull(g: number, s: number): void {
    const v = this.vert, tw = this.twin, xy = this.xy;
    const px = xy[2 * s], py = xy[2 * s + 1];
    let depth = 0;
    const real = this.realEdgeOfGhost(g);
    v[prevOf(real)] = s;
    depth = this.push(real, depth);
    // Forward: across b→s (was b→G) lies the ghost (b, c, G), entered at G→b.
    let out = nextOf(real);
    for (;;) {
      const f = tw[out];
      const bc = nextOf(f);
      const b = v[bc], c = v[nextOf(bc)];
      if (orient2d(xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], px, py) >= 0) break;
      v[f] = s;
      depth = this.push(bc, depth);
      out = nextOf(bc);
    }
    // Backward: across s→a (was G→a) lies the ghost (z, a, G), entered at a→G.
    let back = prevOf(real);
    for (;;) {
      const g2 = tw[back];
      const za = prevOf(g2);
      const z = v[za], a = v[g2];
      if (orient2d(xy[2 * z], xy[2 * z + 1], xy[2 * a], xy[2 * a + 1], px, py) >= 0) break;
      v[nextOf(g2)] = s;
      depth = this.push(za, depth);
      back = nextOf(g2);
    }
    // Two new ghosts close the hull: (a0, s, G) and (s, bk, G).
    const endOut = tw[out], startBack = tw[back];
    const a0 = v[nextOf(back)], bk = v[out];
    const n1 = this.take(), n2 = this.take();
    const h = 3 * n1, k = 3 * n2;
    v[h] = a0; v[h + 1] = s; v[h + 2] = GHOST;
    v[k] = s; v[k + 1] = bk; v[k + 2] = GHOST;
    this.link(h, back);
    this.link(h + 2, startBack);
    this.link(k, out);
    this.link(k + 1, endOut);
    this.link(h + 1, k + 2);
    this.last = (real / 3) | 0;
    this.depth = depth;
    this.newGhost = k;
  }

  /** Lawson flips until every edge opposite the new point is locally Delaunay. */
  private legalize(): void {
    const v = this.vert, tw = this.twin, xy = this.xy;
    let stack = this.stack;
    let depth = this.depth;
    while (depth > 0) {
      const e = stack[--depth];
      const e1 = e % 3 === 2 ? e - 2 : e + 1;
      const e2 = e1 % 3 === 2 ? e1 - 2 : e1 + 1;
      const a = v[e], b = v[e1];
      if (a < 0 || b < 0) continue;
      const f = tw[e];
      const f1 = f % 3 === 2 ? f - 2 : f + 1;
      const f2 = f1 % 3 === 2 ? f1 - 2 : f1 + 1;
      const d = v[f2];
      if (d < 0) continue;
      const p = v[e2];
      if (incircle(
        xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1],
        xy[2 * p], xy[2 * p + 1], xy[2 * d], xy[2 * d + 1]) <= 0) continue;
      flip(v, tw, e);
      if (depth + 2 > stack.length) {
        const grown = new Int32Array(2 * stack.length);
        grown.set(stack);
        stack = this.stack = grown;
      }
      stack[depth++] = e1;
      stack[depth++] = f2;
    }
    this.depth = 0;
  }

  /**
   * legalize() with another edge test. Kept apart so that the Euclidean loop,
   * the hot one, keeps its predicate inline.
   */
  private legalizeBy(test: FlipTest): void {
    const v = this.vert, tw = this.twin;
    let depth = this.depth;
    while (depth > 0) {
      const e = this.stack[--depth];
      const e1 = nextOf(e), f = tw[e], f2 = prevOf(f);
      const a = v[e], b = v[e1], d = v[f2];
      if (a < 0 || b < 0 || d < 0) continue;
      if (!test.mustFlip(a, b, v[prevOf(e)], d)) continue;
      flip(v, tw, e);
      depth = this.push(e1, depth);
      depth = this.push(f2, depth);
    }
    this.depth = 0;
  }

  /**
   * Lawson flips for a regular triangulation (Edelsbrunner and Shah 1996):
   * an edge of the new site's link that is not locally regular is flipped
   * when its quadrilateral is convex; when it is not, and the reflex vertex
   * has only three triangles, those three become one and the vertex, now
   * redundant, leaves (a 3-to-1 flip). Otherwise the edge waits: later
   * flips around the new site resolve it.
   */
  private legalizeWeighted(): void {
    const v = this.vert, tw = this.twin, xyw = this.xyw;
    let depth = this.depth;
    while (depth > 0) {
      const e = this.stack[--depth];
      const e1 = nextOf(e), e2 = nextOf(e1);
      const a = v[e], b = v[e1];
      if (a < 0 || b < 0) continue;
      const f = tw[e];
      const f1 = nextOf(f), f2 = nextOf(f1);
      const d = v[f2], p = v[e2];
      if (d < 0 || p < 0) continue;
      const power = powerTestOf(xyw, a, b, p, d);
      if (power < 0) continue;
      // After a flip the triangles would be (p, d, b) and (d, p, a): both must turn counter-clockwise.
      const px = xyw[3 * p], py = xyw[3 * p + 1], dx = xyw[3 * d], dy = xyw[3 * d + 1];
      const atB = orient2d(px, py, dx, dy, xyw[3 * b], xyw[3 * b + 1]);
      const atA = orient2d(dx, dy, px, py, xyw[3 * a], xyw[3 * a + 1]);
      // Coplanar: keep the edge, as Delaunay keeps a cocircular diagonal; but a vertex on the segment pd
      // with its lifted point on the chord has no area of its own: it is redundant, as inserted sites are.
      if (power === 0 && atA !== 0 && atB !== 0) continue;
      if (atB < 0 && atA < 0) {
        flip(this.vert, this.twin, e);
        depth = this.push(e1, depth);
        depth = this.push(f2, depth);
        continue;
      }
      this.depth = depth;
      // Reflex at b: with three triangles, b's third must be (p, b, d), entered across b→p.
      // Flat at b (on the segment pd): b is redundant whatever its degree (its lifted point lies
      // above the chord of p's and d's), and leaves by flips that bring it down to three.
      if (atB >= 0) {
        const g = tw[e1], g1 = nextOf(g);
        if (tw[g1] === f2) this.push3(this.removeDegree3(e2, f1, nextOf(g1), b));
        else if (atB === 0) this.removeVertex(f);
      } else {
        // The same at a: its third triangle (a, p, d), entered across p→a.
        const g = tw[e2];
        if (tw[prevOf(g)] === f1) this.push3(this.removeDegree3(nextOf(g), f2, e1, a));
        else if (atA === 0) this.removeVertex(e);
      }
      depth = this.depth;
    }
    this.depth = 0;
  }

  /** Pushes the three edges of the triangle holding half-edge e for a regularity check. */
  private push3(e: number): void {
    const t = 3 * ((e / 3) | 0);
    this.depth = this.push(t, this.depth);
    this.depth = this.push(t + 1, this.depth);
    this.depth = this.push(t + 2, this.depth);
  }

  /**
   * Removes the redundant vertex r at the origin of half-edge z: flips
   * edges out of r whose neighbours form a convex corner that r lies beyond
   * (an ear of r's star) until three remain, then merges those three.
   * Every triangle touched goes on the stack, so Lawson flips restore
   * regularity afterwards.
   */
  private removeVertex(z: number): void {
    const v = this.vert, tw = this.twin, xy = this.xy, r = v[z];
    const rx = xy[2 * r], ry = xy[2 * r + 1];
    for (let guard = 0; guard < 1 << 20; guard++) {
      const outs: number[] = [];
      let e = z, ghost = -1;
      do {
        if (v[nextOf(e)] < 0) ghost = outs.length;
        outs.push(e);
        e = tw[prevOf(e)];
      } while (e !== z && outs.length <= this.count);
      const k = outs.length;
      // On the hull (only flat there: a hull corner is never redundant), r's fan runs from the
      // edge after the ghost to the one before it; only edges inside the fan may flip.
      if (ghost >= 0) {
        const fan = outs.slice(ghost + 1).concat(outs.slice(0, ghost));
        if (fan.length === 3 && this.removeFlatHullVertex(outs[ghost], fan, r)) return;
        if (fan.length <= 3) return;
      } else if (k === 3) {
        this.push3(this.removeDegree3(nextOf(outs[0]), nextOf(outs[1]), nextOf(outs[2]), r));
        return;
      }
      // An ear strictly first; failing that (r where two diagonals of its star cross, on a grid say),
      // one whose new diagonal passes through r: the zero-area triangle left is merged away next.
      let flipped = false;
      for (let pass = 0; pass < 2 && !flipped; pass++) {
        for (let i = 0; i < k && !flipped; i++) {
          if (ghost >= 0) {
            // Inside the fan only: not the ghost edge nor the two hull edges beside it.
            const j = (i - ghost + k) % k;
            if (j <= 1 || j === k - 1) continue;
          }
          const x = v[nextOf(outs[i])], before = v[nextOf(outs[(i + k - 1) % k])], after = v[nextOf(outs[(i + 1) % k])];
          const bx = xy[2 * before], by = xy[2 * before + 1], ax = xy[2 * after], ay = xy[2 * after + 1];
          if (orient2d(bx, by, xy[2 * x], xy[2 * x + 1], ax, ay) >= 0) continue;
          const side = orient2d(rx, ry, bx, by, ax, ay);
          if (side > 0 || (side === 0 && pass === 0)) continue;
          const ei = outs[i], f = tw[ei];
          flip(this.vert, this.twin, ei);
          this.push3(ei);
          this.push3(f);
          z = nextOf(nextOf(f));
          flipped = true;
        }
      }
      if (!flipped) return;
    }
  }

  /**
   * Removes vertex r, whose three triangles have the outer edges x, y, z
   * (in counter-clockwise order around r's star); the first triangle's slot
   * takes the merged triangle, the two others are freed. Returns the new
   * half-edge in the place of y, the edge opposite the inserted site.
   */
  private removeDegree3(x: number, y: number, z: number, r: number): number {
    const v = this.vert, tw = this.twin;
    const tx = (x / 3) | 0, ty = (y / 3) | 0, tz = (z / 3) | 0;
    const ox = tw[x], oy = tw[y], oz = tw[z];
    const vx = v[x], vy = v[y], vz = v[z];
    const k = 3 * tx;
    v[k] = vx; v[k + 1] = vy; v[k + 2] = vz;
    tw[k] = ox; tw[ox] = k;
    tw[k + 1] = oy; tw[oy] = k + 1;
    tw[k + 2] = oz; tw[oz] = k + 2;
    this.retire(r, ty, tz, tx);
    return k + 1;
  }

  /**
   * Removes a redundant site r lying on a hull edge (flat there), whose
   * fan is down to two triangles (r, y1, y2), (r, y2, y3) between the
   * ghosts (r, G, y1) and (r, y3, G): they become the triangle (y1, y2, y3)
   * and the ghost (y1, y3, G). False (nothing done) if y1, y2, y3 do not
   * turn counter-clockwise.
   */
  private removeFlatHullVertex(toGhost: number, fan: number[], r: number): boolean {
    const v = this.vert, tw = this.twin, xy = this.xy;
    const [o1, o2, o3] = fan;
    const y1 = v[nextOf(o1)], y2 = v[nextOf(o2)], y3 = v[nextOf(o3)];
    if (orient2d(xy[2 * y1], xy[2 * y1 + 1], xy[2 * y2], xy[2 * y2 + 1], xy[2 * y3], xy[2 * y3 + 1]) >= 0) return false;
    const out12 = tw[nextOf(o1)], out23 = tw[nextOf(o2)];
    const outY3G = tw[nextOf(o3)], outGY1 = tw[nextOf(toGhost)];
    const t1 = (o1 / 3) | 0, t2 = (o2 / 3) | 0, g1 = (toGhost / 3) | 0, g2 = (o3 / 3) | 0;
    const k = 3 * t1, g = 3 * g1;
    v[k] = y1; v[k + 1] = y2; v[k + 2] = y3;
    v[g] = y1; v[g + 1] = y3; v[g + 2] = GHOST;
    tw[k] = out12; tw[out12] = k;
    tw[k + 1] = out23; tw[out23] = k + 1;
    tw[k + 2] = g; tw[g] = k + 2;
    tw[g + 1] = outY3G; tw[outY3G] = g + 1;
    tw[g + 2] = outGY1; tw[outGY1] = g + 2;
    this.retire(r, t2, g2, t1);
    this.push3(k);
    return true;
  }

  /** Records vertex r as removed and frees the slots of triangles t and u; the next walk starts at `keep`. */
  private retire(r: number, t: number, u: number, keep: number): void {
    const v = this.vert;
    v[3 * t] = v[3 * t + 1] = v[3 * t + 2] = DEAD;
    v[3 * u] = v[3 * u + 1] = v[3 * u + 2] = DEAD;
    this.free.push(t, u);
    this.removed.push(r);
    this.last = keep;
  }

  /**
   * The last word of a weighted build. A vertex whose lifted point lies on
   * a face of the lower hull without being a corner of it (on a chord of two
   * neighbours, or in a triangle of three) owns no area; the incremental
   * steps catch most, this pass catches the rest. Only vertices touching a
   * coplanar edge can be such (their star is not strictly convex when
   * lifted), so one filtered power test per edge finds the candidates, and
   * the hull is checked for flat corners. Repeats until nothing changes.
   */
  cleanupRedundant(): void {
    for (let round = 0; round < 64; round++) if (!this.cleanupPass()) return;
  }

  /**
   * One pass of cleanupRedundant over every edge and the whole hull; true
   * when it removed something.
   */
  private cleanupPass(): boolean {
    const v = this.vert, tw = this.twin;
    const removedBefore = this.removed.length;
    const outEdge = new Map<number, number>();
    const hullOut: number[] = [];
    for (let e = 0; e < 3 * this.count; e++) {
      const a = v[e];
      if (a < 0 || v[nextOf(e)] === DEAD) continue;
      const b = v[nextOf(e)], p = v[prevOf(e)];
      if (b === GHOST) { hullOut.push(e); continue; }
      if (p < 0) continue;
      const f = tw[e];
      if (f < e) continue;
      const d = v[prevOf(f)];
      if (d < 0) continue;
      const power = powerTestOf(this.xyw, a, b, p, d);
      if (power > 0) this.depth = this.push(e, this.depth);
      if (power >= 0) { outEdge.set(a, e); outEdge.set(b, f); }
    }
    if (this.depth > 0) this.legalizeWeighted();
    for (const e of hullOut) {
      if (v[e] < 0 || v[nextOf(e)] !== GHOST) continue;
      this.pruneFlatHull(v[e], e);
    }
    for (const [r, e] of outEdge) {
      if (v[e] !== r || !this.hasNoArea(r, e)) continue;
      this.removeVertex(e);
      this.legalizeWeighted();
    }
    return this.removed.length > removedBefore;
  }

  /** Whether interior vertex r (out-edge e) lies on a chord of two neighbours or in a triangle of three, lifted on or above. */
  private hasNoArea(r: number, e: number): boolean {
    const v = this.vert, tw = this.twin, xy = this.xy, w = this.w!;
    const nb: number[] = [];
    let z = e;
    do {
      const u = v[nextOf(z)];
      if (u < 0) return false;
      nb.push(u);
      z = tw[prevOf(z)];
    } while (z !== e && nb.length <= this.count);
    const rx = xy[2 * r], ry = xy[2 * r + 1], rw = w[r];
    const k = nb.length;
    for (let i = 0; i < k; i++) {
      const a = nb[i], ax = xy[2 * a], ay = xy[2 * a + 1];
      for (let j = i + 1; j < k; j++) {
        const b = nb[j], bx = xy[2 * b], by = xy[2 * b + 1];
        const o = orient2d(ax, ay, rx, ry, bx, by);
        if (o === 0 && (ax - rx) * (bx - rx) + (ay - ry) * (by - ry) < 0 &&
          liftedAboveChord(ax, ay, w[a], rx, ry, rw, bx, by, w[b]) >= 0) return true;
        for (let m = j + 1; m < k; m++) {
          const c = nb[m], cx = xy[2 * c], cy = xy[2 * c + 1];
          // Neighbours in counter-clockwise order around r: (a, b, c) turns counter-clockwise when it holds r.
          if (orient2d(ax, ay, bx, by, rx, ry) > 0 || orient2d(bx, by, cx, cy, rx, ry) > 0 ||
            orient2d(cx, cy, ax, ay, rx, ry) > 0) continue;
          if (orient2d(ax, ay, bx, by, cx, cy) >= 0) continue;
          if (powerTest(ax, ay, w[a], bx, by, w[b], cx, cy, w[c], rx, ry, rw) <= 0) return true;
        }
      }
    }
    return false;
  }

  /**
   * Moves live triangles into the slots freed by vertex removals, so that
   * triangles 0..count-1 are all in use again.
   */
  pack(): void {
    const v = this.vert, tw = this.twin;
    this.free.sort((p, q) => p - q);
    for (const hole of this.free) {
      while (this.count > 0 && v[3 * (this.count - 1)] === DEAD) this.count--;
      if (hole >= this.count) continue;
      const last = this.count - 1;
      for (let j = 0; j < 3; j++) {
        v[3 * hole + j] = v[3 * last + j];
        const o = tw[3 * last + j];
        tw[3 * hole + j] = o;
        tw[o] = 3 * hole + j;
      }
      v[3 * last] = v[3 * last + 1] = v[3 * last + 2] = DEAD;
      if (this.last === last) this.last = hole;
      this.count--;
    }
    while (this.count > 0 && v[3 * (this.count - 1)] === DEAD) this.count--;
    this.free = [];
    if (this.last >= this.count || v[3 * this.last] === DEAD) this.last = 0;
  }
}
