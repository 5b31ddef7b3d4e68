import type { PairFrame } from './bisector.js';
import { length } from '../../core/length.js';

/** A growable list of points with their bisector parameter s: the polyline of one edge. */
export class Polyline {
  xy: Float64Array = new Float64Array(256);
  s: Float64Array = new Float64Array(128);
  count = 0;
  clear(): void { this.count = 0; }
  add(x: number, y: number, s: number): void {
    if (this.count === this.s.length) {
      const grow = (a: Float64Array, k: number): Float64Array => { const b = new Float64Array(2 * a.length); b.set(a.subarray(0, k)); return b; };
      this.xy = grow(this.xy, 2 * this.count);
      this.s = grow(this.s, this.count);
    }
    const i = this.count++;
    this.xy[2 * i] = x; this.xy[2 * i + 1] = y; this.s[i] = s;
  }
}

/** Pending right ends of the subdivision: s, x, y, t, tangent x, tangent y per entry. */
const W = 6;
/** Most chord splits for one edge (see sampleEdge). */
const MAX_SPLITS = 1 << 15;
let stack = new Float64Array(W * 64);
let top = 0;

function push(s: number, x: number, y: number, t: number, tx: number, ty: number): void {
  if (W * top + W > stack.length) { const b = new Float64Array(2 * stack.length); b.set(stack); stack = b; }
  const k = W * top++;
  stack[k] = s; stack[k + 1] = x; stack[k + 2] = y; stack[k + 3] = t; stack[k + 4] = tx; stack[k + 5] = ty;
}

/**
 * Largest distance of a convex arc from its chord P0 P1 (length L), given
 * the unit tangents at its ends: the arc lies in the triangle of the chord
 * and the two tangent lines (a convex arc stays on one side of each of its
 * tangents), whose height is L tan α tan β / (tan α + tan β), α and β the
 * tangents' angles to the chord. When both tangents lie on one side of the
 * chord the arc has an inflection inside (or is straight, up to rounding):
 * then L max(tan α, tan β), twice the bound a graph with that slope
 * everywhere would have (a rule of thumb for the S bend, no source; such
 * chords are short, next to an inflection). Infinity when a tangent turns
 * by a right angle or more from the chord.
 */
function arcBound(dx: number, dy: number, t0x: number, t0y: number, t1x: number, t1y: number): number {
  const L = length(dx, dy);
  if (L === 0) return 0;
  const s0 = (dx * t0y - dy * t0x) / L, c0 = (dx * t0x + dy * t0y) / L;
  const s1 = (dx * t1y - dy * t1x) / L, c1 = (dx * t1x + dy * t1y) / L;
  if (!(c0 > 0) || !(c1 > 0)) return Infinity;
  const a = Math.abs(s0) / c0, b = Math.abs(s1) / c1;
  if (s0 * s1 > 0) return L * Math.max(a, b);
  return a + b > 0 ? (L * a * b) / (a + b) : 0;
}

/**
 * Appends to `out` the points of the bisector strictly between s0 and s1
 * (ends given with their t; the start not appended), then the end (x1, y1).
 *
 * Every chord is within `tol` of the curve (Euclidean distance), by the
 * triangle bound of arcBound, which holds for convex arcs. Lp bisectors have
 * inflections (three on the curves we traced: at the midpoint of the pair
 * and at two points symmetric about it), which the end tangents of a chord
 * do not always reveal; so a chord is accepted only when its middle point,
 * with its tangent, confirms it: the middle point's distance from the chord
 * plus the bounds of the two halves stays within tol (the curve is within
 * the halves' bounds of the path through the middle point, which is within
 * that distance of the chord). The bisector is centrally
 * symmetric about the pair's midpoint (the norm is symmetric), so its
 * curvature changes sign there: a chord across s = 0 is always split at 0.
 * Chords shorter in s than rounding can resolve are not split further.
 */
export function sampleEdge(f: PairFrame, s0: number, x0: number, y0: number, t0: number,
  s1: number, x1: number, y1: number, t1: number, tol: number, out: Polyline): void {
  top = 0;
  // Tangents at the ends (one Newton step from their exact t).
  f.at(s1, t1);
  push(s1, x1, y1, t1, f.tx, f.ty);
  const floor = 64 * Number.EPSILON * f.h;
  if (s0 < 0 && s1 > 0 && -s0 > floor && s1 > floor) {
    f.at(0, 0);
    push(0, f.x, f.y, f.t, f.tx, f.ty);
  }
  f.at(s0, t0);
  let ls = s0, lx = x0, ly = y0, lt = t0, ltx = f.tx, lty = f.ty;
  // A cap on the splits of one edge (far above the ~2e4 chords of a tolerance of 1e-8 of the region):
  // where rounding swamps the curve (large p far from the origin makes the
  // p-th powers lose every digit of the differences) no chord ever tests close enough, and splitting would go
  // on down to the last bit. Past the cap the edge keeps the chords it has; the tolerance is then not promised.
  let splits = 0;
  while (top > 0) {
    const k = W * (top - 1);
    const rs = stack[k], rx = stack[k + 1], ry = stack[k + 2], rt = stack[k + 3], rtx = stack[k + 4], rty = stack[k + 5];
    const ms = ls + (rs - ls) / 2;
    if (rs - ms > floor + 64 * Number.EPSILON * Math.abs(ms)) {
      // Chords span at most a doubling of |s| beyond the pair's half-distance h: the bends of the curve
      // (its inflections lie at |s| of a few h) then stay at the chord's own scale, where the middle point
      // sees them; without this a long ray hid an S bend near its inner end (found by the live cKDTree test).
      const near = Math.min(Math.abs(ls), Math.abs(rs)), far = Math.max(Math.abs(ls), Math.abs(rs));
      let split = far > 2 * Math.max(near, f.h) || arcBound(rx - lx, ry - ly, ltx, lty, rtx, rty) > tol;
      if (!split) {
        // An inflection inside can hide from the end tangents: the middle point, with its tangent, must
        // also be near the chord, and each half within the rest of the tolerance by its own bound.
        f.at(ms, lt + (rt - lt) / 2);
        const dx = rx - lx, dy = ry - ly, len = length(dx, dy);
        const dev = len > 0 ? Math.abs(dx * (f.y - ly) - dy * (f.x - lx)) / len : length(f.x - lx, f.y - ly);
        const half = Math.max(arcBound(f.x - lx, f.y - ly, ltx, lty, f.tx, f.ty), arcBound(rx - f.x, ry - f.y, f.tx, f.ty, rtx, rty));
        split = dev + half > tol;
      } else f.at(ms, lt + (rt - lt) / 2);
      if (split && splits++ < MAX_SPLITS) { push(ms, f.x, f.y, f.t, f.tx, f.ty); continue; }
    }
    top--;
    out.add(rx, ry, rs);
    ls = rs; lx = rx; ly = ry; lt = rt; ltx = rtx; lty = rty;
  }
}
