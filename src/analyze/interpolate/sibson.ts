import { inCircle, orient } from '../../core/predicates.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { exactSibson } from './sibson-exact.js';

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

/**
 * Sibson's natural-neighbour interpolation (Sibson 1981) over a Delaunay
 * triangulation of dimension 2, without changing it.
 *
 * The value at q is Σ w_i f_i, w_i = (area q's cell would take from site i)
 * / (area of q's cell), in the Voronoi diagram of the sites plus q. Only the
 * Bowyer–Watson cavity matters: the triangles whose circumcircle holds q
 * strictly (exact inCircle), found by a walk to the triangle holding q
 * (exact orient) and a flood. Around boundary vertex v_i of the cavity
 * (counter-clockwise v_{i-1}, v_i, v_{i+1}), the part of v_i's cell that q
 * takes is the convex polygon c_i, o(T_1), …, o(T_k), c_{i-1}: c_i the
 * circumcentre of the new triangle (q, v_i, v_{i+1}), o(T) the circumcentres
 * of the cavity triangles around v_i, counter-clockwise. Everything is
 * computed relative to q, so that coordinates far from the origin keep
 * their precision.
 *
 * Where the floating-point sums cancel badly (flat triangles near q), the
 * same sums are redone exactly (sibson-exact.ts).
 *
 * Determinism: the cavity does not depend on where the walk starts, and the
 * sums run in a fixed order (from the boundary vertex of smallest rank), so
 * value(q) is the same number whatever triangle the walk came from.
 *
 * Where: strictly outside the hull, NaN (Sibson's weights have no bounded
 * cell there); on a hull edge, linear along the edge (the limit of the
 * weights from inside: the cell of q grows without bound across that edge,
 * and the two edge ends' shares dominate); at a site, its value.
 */
export class SibsonKernel {
  private readonly vert: Int32Array;
  private readonly twin: Int32Array;
  private readonly real: number;
  private readonly xy: Float64Array;
  /** Values by rank. */
  private readonly f: Float64Array;
  /** The walk's start: a real triangle near the previous query. */
  last = 0;

  // Scratch, reused by every query: no allocation per query once grown.
  private readonly mark: Uint32Array;
  private readonly vedge: Int32Array;
  private readonly ccx: Float64Array;
  private readonly ccy: Float64Array;
  private stamp = 0;
  private stack = new Int32Array(64);
  private cavity = new Int32Array(64);
  private cx = new Float64Array(64);
  private cy = new Float64Array(64);
  private ring = new Int32Array(64);

  // Set by locate().
  private hitEdges = 0;
  private hitEdge = -1;

  constructor(tri: Triangulation, valuesBySite: Float64Array) {
    const layout = tri.implicitLayout();
    if (!layout) throw new Error('ambit: SibsonKernel needs a triangulation of dimension 2');
    // Copies: the layout is a view that a later insert() into the triangulation would rewrite in place.
    this.vert = layout.vert.slice(0, 3 * layout.count);
    this.twin = layout.twin.slice(0, 3 * layout.count);
    this.real = layout.real;
    this.xy = layout.xy.slice(0, 2 * tri.siteCount);
    const n = tri.siteCount, site = layout.siteOfRank;
    this.f = new Float64Array(n);
    for (let r = 0; r < n; r++) this.f[r] = valuesBySite[site ? site[r] : r];
    this.mark = new Uint32Array(this.real);
    this.vedge = new Int32Array(n);
    this.ccx = new Float64Array(this.real);
    this.ccy = new Float64Array(this.real);
  }

  /** The interpolated value at (qx, qy), walking from `last`. */
  value(qx: number, qy: number): number {
    const t = this.locate(qx, qy);
    if (t < 0) return NaN;
    const v = this.vert, xy = this.xy;
    if (this.hitEdges === 2) {
      for (let j = 0; j < 3; j++) {
        const s = v[3 * t + j];
        if (xy[2 * s] === qx && xy[2 * s + 1] === qy) return this.f[s];
      }
    }
    const e = this.hitEdge;
    if (e >= 0 && this.twin[e] >= 3 * this.real) {
      const a = v[e], b = v[nextOf(e)];
      return alongEdge(xy[2 * a], xy[2 * a + 1], this.f[a], xy[2 * b], xy[2 * b + 1], this.f[b], qx, qy);
    }
    return this.sibson(t, qx, qy);
  }

  /**
   * The real triangle holding q (on its boundary counts), or -1 when q is
   * strictly outside the hull. A visibility walk; it cannot cycle in a
   * Delaunay triangulation (Edelsbrunner), the step bound is a guard.
   */
  private locate(qx: number, qy: number): number {
    const v = this.vert, tw = this.twin, xy = this.xy, real = this.real;
    let t = this.last, came = -1;
    for (let steps = 0; steps <= real; steps++) {
      const e0 = 3 * t;
      const skip = came >= e0 && came < e0 + 3 ? came - e0 : -1;
      let zeros = 0, zeroEdge = -1, moved = false;
      for (let j = 0; j < 3; j++) {
        if (j === skip) continue;
        const a = v[e0 + j], b = v[e0 + (j === 2 ? 0 : j + 1)];
        const o = orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], qx, qy);
        if (o < 0) {
          const u = tw[e0 + j];
          if (u >= 3 * real) { this.last = t; return -1; }
          came = u;
          t = (u / 3) | 0;
          moved = true;
          break;
        }
        if (o === 0) { zeros++; zeroEdge = e0 + j; }
      }
      if (moved) continue;
      this.last = t;
      this.hitEdges = zeros;
      this.hitEdge = zeros === 1 ? zeroEdge : -1;
      return t;
    }
    return this.scan(qx, qy);
  }

  /** The guard's fallback: every triangle in turn. Never expected to run. */
  private scan(qx: number, qy: number): number {
    const v = this.vert, xy = this.xy;
    for (let t = 0; t < this.real; t++) {
      let zeros = 0, zeroEdge = -1, inside = true;
      for (let j = 0; j < 3 && inside; j++) {
        const a = v[3 * t + j], b = v[nextOf(3 * t + j)];
        const o = orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], qx, qy);
        if (o < 0) inside = false;
        else if (o === 0) { zeros++; zeroEdge = 3 * t + j; }
      }
      if (!inside) continue;
      this.last = t;
      this.hitEdges = zeros;
      this.hitEdge = zeros === 1 ? zeroEdge : -1;
      return t;
    }
    return -1;
  }

  private nextStamp(): number {
    if (this.stamp === 0xffffffff) { this.mark.fill(0); this.stamp = 0; }
    return ++this.stamp;
  }

  private grow(k: number): void {
    if (k < this.cavity.length) return;
    const m = 2 * this.cavity.length;
    const i32 = (a: Int32Array) => { const b = new Int32Array(m); b.set(a); return b; };
    const f64 = (a: Float64Array) => { const b = new Float64Array(m); b.set(a); return b; };
    this.stack = i32(this.stack); this.cavity = i32(this.cavity); this.ring = i32(this.ring);
    this.cx = f64(this.cx); this.cy = f64(this.cy);
  }

  /** Marks the cavity of q, flooding from t0, and stores each cavity triangle's circumcentre relative to q. */
  private flood(t0: number, qx: number, qy: number, tag: number): number {
    const v = this.vert, tw = this.twin, xy = this.xy, real = this.real, mark = this.mark;
    let top = 0, count = 0;
    mark[t0] = tag;
    this.stack[top++] = t0;
    while (top > 0) {
      const t = this.stack[--top];
      this.cavity[count++] = t;
      this.circumcentre(t, qx, qy);
      for (let j = 0; j < 3; j++) {
        const u = (tw[3 * t + j] / 3) | 0;
        if (u >= real || mark[u] === tag) continue;
        const a = v[3 * u], b = v[3 * u + 1], c = v[3 * u + 2];
        if (inCircle(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], qx, qy) <= 0) continue;
        mark[u] = tag;
        this.grow(top + count + 1);
        this.stack[top++] = u;
      }
    }
    return count;
  }

  private circumcentre(t: number, qx: number, qy: number): void {
    const v = this.vert, xy = this.xy;
    const a = v[3 * t], b = v[3 * t + 1], c = v[3 * t + 2];
    this.centre(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], qx, qy);
    this.ccx[t] = this.ox;
    this.ccy[t] = this.oy;
  }

  // The result of centre().
  private ox = 0;
  private oy = 0;

  /** The largest circumcentre condition (|u|² |w|² / cross²) since the query began. */
  private worst = 0;

  /**
   * The circumcentre of the counter-clockwise triangle (a, b, c), relative to
   * q, into (ox, oy). Worked out from the vertex opposite the longest edge
   * (the largest angle): with a very short edge elsewhere, the other origins
   * cancel terms of equal size in the numerators (measured: weights off by
   * 1e-5 relative for two sites an ulp apart). The cross product in the
   * denominator is computed with its rounding errors (Dekker's product), so
   * it keeps its relative precision in a flat triangle as long as the edge
   * vectors are exact (they are for nearby points, by Sterbenz's lemma);
   * `worst` records how flat the triangle is, for the exact-path decision.
   */
  private centre(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, qx: number, qy: number): void {
    const ab = (bx - ax) ** 2 + (by - ay) ** 2, bc = (cx - bx) ** 2 + (cy - by) ** 2, ca = (ax - cx) ** 2 + (ay - cy) ** 2;
    let px: number, py: number, ux: number, uy: number, wx: number, wy: number;
    // Origin p and the other two (u, w) in counter-clockwise order after it.
    if (bc >= ab && bc >= ca) { px = ax; py = ay; ux = bx - ax; uy = by - ay; wx = cx - ax; wy = cy - ay; }
    else if (ca >= ab) { px = bx; py = by; ux = cx - bx; uy = cy - by; wx = ax - bx; wy = ay - by; }
    else { px = cx; py = cy; ux = ax - cx; uy = ay - cy; wx = bx - cx; wy = by - cy; }
    const cross = accurateCross(ux, uy, wx, wy), u2 = ux * ux + uy * uy, w2 = wx * wx + wy * wy;
    const flat = (u2 * w2) / (cross * cross);
    if (!(flat <= this.worst)) this.worst = flat;
    const d = 2 * cross;
    this.ox = px - qx + (wy * u2 - uy * w2) / d;
    this.oy = py - qy + (ux * w2 - wx * u2) / d;
  }

  private sibson(t0: number, qx: number, qy: number): number {
    const v = this.vert, tw = this.twin, xy = this.xy, real = this.real, mark = this.mark;
    const tag = this.nextStamp();
    this.worst = 0;
    const count = this.flood(t0, qx, qy, tag);
    // Boundary half-edges (cavity on their left), keyed by their origin: the cavity is star-shaped
    // around q, so its boundary is a simple cycle and every origin appears once.
    let first = -1, edges = 0;
    for (let i = 0; i < count; i++) {
      const t = this.cavity[i];
      for (let j = 0; j < 3; j++) {
        const e = 3 * t + j, u = (tw[e] / 3) | 0;
        if (u < real && mark[u] === tag) continue;
        const a = v[e];
        this.vedge[a] = e;
        edges++;
        if (first < 0 || a < first) first = a;
      }
    }
    this.grow(edges + 1);
    // The ring in counter-clockwise order from the smallest rank, with the new circumcentres c_i of (q, v_i, v_{i+1}).
    const ring = this.ring, cx = this.cx, cy = this.cy;
    let a = first;
    for (let i = 0; i < edges; i++) {
      const e = this.vedge[a], b = v[nextOf(e)];
      ring[i] = e;
      this.centre(qx, qy, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], qx, qy);
      cx[i] = this.ox;
      cy[i] = this.oy;
      a = b;
    }
    let num = 0, den = 0, size = 0;
    for (let i = 0; i < edges; i++) {
      const h = i === 0 ? edges - 1 : i - 1;
      // Shoelace over c_i, o(T_1), …, o(T_k), c_{i-1}; `size` sums the terms' magnitudes.
      const x0 = cx[i], y0 = cy[i];
      let px = x0, py = y0, a2 = 0;
      let e = ring[i];
      for (;;) {
        const t = (e / 3) | 0, ox = this.ccx[t], oy = this.ccy[t];
        a2 += px * oy - ox * py;
        size += Math.abs(px * oy) + Math.abs(ox * py);
        px = ox; py = oy;
        const p = prevOf(e), u = (tw[p] / 3) | 0;
        if (u >= real || mark[u] !== tag) break;
        e = tw[p];
      }
      a2 += px * cy[h] - cx[h] * py + (cx[h] * y0 - x0 * cy[h]);
      size += Math.abs(px * cy[h]) + Math.abs(cx[h] * py) + Math.abs(cx[h] * y0) + Math.abs(x0 * cy[h]);
      num += a2 * this.f[v[ring[i]]];
      den += a2;
    }
    // The areas are sums of terms up to `size` in magnitude, each a few rounding units off, and so are the
    // circumcentres, up to a factor 1 / sin of their triangle's largest angle when the edge vectors were
    // rounded. When the areas cancel below 2^-8 of `size`, or a triangle is flatter than sin = 2^-12,
    // the weights could lose more than about 2^-33, and the exact path takes over. It is rare: flat
    // triangles near q (measured: 16 of 10^6 grid samples over 10^4 random sites).
    if (!(den > 0) || !(size <= 256 * den) || !(this.worst <= 2 ** 24)) return this.exact(qx, qy, edges, count, tag);
    return num / den;
  }

  /** sibson()'s sums in exact arithmetic (see sibson-exact.ts), from the cavity and ring already built. */
  private exact(qx: number, qy: number, edges: number, count: number, tag: number): number {
    const v = this.vert, tw = this.twin, xy = this.xy, real = this.real, mark = this.mark, ring = this.ring;
    const corners: number[] = [], polygons: number[] = [], offsets: number[] = [0], values: number[] = [];
    const push = (a: number, b: number, c: number) => {
      if (a < 0) corners.push(qx, qy); else corners.push(xy[2 * a], xy[2 * a + 1]);
      corners.push(xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1]);
    };
    // Points 0..count-1: the cavity triangles' circumcentres; then count + i: c_i.
    const slot = new Map<number, number>();
    for (let k = 0; k < count; k++) {
      const t = this.cavity[k];
      slot.set(t, k);
      push(v[3 * t], v[3 * t + 1], v[3 * t + 2]);
    }
    for (let i = 0; i < edges; i++) push(-1, v[ring[i]], v[nextOf(ring[i])]);
    for (let i = 0; i < edges; i++) {
      polygons.push(count + i);
      let e = ring[i];
      for (;;) {
        polygons.push(slot.get((e / 3) | 0)!);
        const p = prevOf(e), u = (tw[p] / 3) | 0;
        if (u >= real || mark[u] !== tag) break;
        e = tw[p];
      }
      polygons.push(count + (i === 0 ? edges - 1 : i - 1));
      offsets.push(polygons.length);
      values.push(this.f[v[ring[i]]]);
    }
    return exactSibson(qx, qy, corners, polygons, offsets, values);
  }
}

const SPLIT = 134217729; // 2^27 + 1, Veltkamp's split of a double into two 26-bit halves

/** a * b - p exactly, for p = a * b rounded (Dekker's TwoProduct, from memory; no overflow or underflow assumed). */
function productError(a: number, b: number, p: number): number {
  let c = SPLIT * a;
  const ah = c - (c - a), al = a - ah;
  c = SPLIT * b;
  const bh = c - (c - b), bl = b - bh;
  return ((ah * bh - p) + ah * bl + al * bh) + al * bl;
}

/**
 * ux * wy - uy * wx to within a few rounding units of its own size: the two
 * products' errors are added back after the (then exact, by Sterbenz's
 * lemma) cancelling subtraction.
 */
function accurateCross(ux: number, uy: number, wx: number, wy: number): number {
  const p = ux * wy, q = uy * wx;
  return (p - q) + (productError(ux, wy, p) - productError(uy, wx, q));
}

/** Linear interpolation along the segment a–b at q, a point on its line (exactly; the projection is rounded). */
export function alongEdge(ax: number, ay: number, fa: number, bx: number, by: number, fb: number, qx: number, qy: number): number {
  const dx = bx - ax, dy = by - ay;
  const t = ((qx - ax) * dx + (qy - ay) * dy) / (dx * dx + dy * dy);
  return fa + t * (fb - fa);
}
