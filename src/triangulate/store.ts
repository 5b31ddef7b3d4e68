import { orient2d, incircle } from 'robust-predicates';

/**
 * The vertex every hull edge is joined to, closing the triangulation into a
 * sphere. Its "ghost" triangles make the hull just another set of triangles:
 * a point outside the hull lands in a ghost, and every half-edge has a twin.
 */
export const GHOST = -1;

// Half-edges 3t, 3t+1, 3t+2 belong to triangle t, in counter-clockwise order.
const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

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
    const v = this.vert, tw = this.twin, xy = this.xy;
    let t = this.last;
    let came = -1;
    this.hitEdge = -1;
    this.hitVertex = -1;
    for (let steps = 0; steps <= this.count; steps++) {
      const e0 = 3 * t;
      const v0 = v[e0], v1 = v[e0 + 1], v2 = v[e0 + 2];
      if (v0 < 0 || v1 < 0 || v2 < 0) return t;
      const x0 = xy[2 * v0], y0 = xy[2 * v0 + 1];
      const x1 = xy[2 * v1], y1 = xy[2 * v1 + 1];
      const x2 = xy[2 * v2], y2 = xy[2 * v2 + 1];
      // Start with the edge after the one we came through: it cannot be crossed back.
      const skip = came >= e0 && came < e0 + 3 ? came - e0 : -1;
      let o: number;
      let zeros = 0, zeroEdge = -1;
      let moved = false;
      for (let k = 0; k < 3; k++) {
        const j = (skip + 1 + k) % 3;
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
    return this.locateByScan(px, py);
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
    const xy = this.xy;
    const px = xy[2 * s], py = xy[2 * s + 1];
    const t = this.locate(px, py);
    if (this.hitVertex >= 0) return this.hitVertex;
    if (this.isGhost(t)) this.extendHull(t, s);
    else if (this.hitEdge >= 0) this.splitEdge(this.hitEdge, s);
    else this.splitTriangle(t, s);
    this.legalize();
    return -1;
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
    const t1 = this.count, t2 = this.count + 1;
    this.count += 2;
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
    const n1 = this.count, n2 = this.count + 1;
    this.count += 2;
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
    const n1 = this.count, n2 = this.count + 1;
    this.count += 2;
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
      const x1 = tw[e1], x2 = tw[e2], y1 = tw[f1], y2 = tw[f2];
      // (a,b,p) + (b,a,d) become (p,d,b) + (d,p,a).
      v[e] = p; v[e1] = d; v[e2] = b;
      v[f] = d; v[f1] = p; v[f2] = a;
      tw[e1] = y2; tw[y2] = e1;
      tw[e2] = x1; tw[x1] = e2;
      tw[f1] = x2; tw[x2] = f1;
      tw[f2] = y1; tw[y1] = f2;
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
}
