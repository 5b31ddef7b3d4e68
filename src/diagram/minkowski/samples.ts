import type { PairFrame } from './bisector.js';
import { length } from '../../core/length.js';
import { siteLineCrossings } from './crossings.js';

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
/** The site-line crossings the subdivision always splits at (s, t pairs, in increasing s; see siteLineCrossings). */
const splitsAt = new Float64Array(8);

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
 * Largest distance from the line of the chord P0 P1 (unit direction (cx, cy),
 * length L, from P0 = (x0, y0)) of the part of the curve between Q0 and Q1,
 * one half of the chord's arc (one of Q0, Q1 is an end of the chord, the
 * other its middle point), given the unit tangents T0, T1 there. When the
 * tangents lie on opposite sides of Q0 Q1, each within a right angle of it,
 * the half is taken for convex like every arc arcBound bounds: it lies in
 * the triangle of Q0, Q1 and the meeting point A of the two tangent lines,
 * so its distance from any line is at most that of a corner; the corners
 * must also project onto the chord (then every point of the half does, and
 * its distance from the chord is the distance from the line). For a
 * circular arc this gives the arc's true height, where the height of the
 * middle point plus the half's arcBound is half again as much (A lies on
 * the tangent at the middle point, parallel to the chord). Otherwise (an S
 * bend inside the half, or a steep tangent) the middle point's distance
 * plus arcBound of the half.
 */
function halfBound(x0: number, y0: number, cx: number, cy: number, L: number, q0x: number, q0y: number, t0x: number, t0y: number,
  q1x: number, q1y: number, t1x: number, t1y: number, mid: number): number {
  const dx = q1x - q0x, dy = q1y - q0y;
  const s0 = dx * t0y - dy * t0x, s1 = dx * t1y - dy * t1x, c0 = dx * t0x + dy * t0y, c1 = dx * t1x + dy * t1y;
  const cross = t0x * t1y - t0y * t1x;
  if (c0 > 0 && c1 > 0 && s0 * s1 <= 0 && cross !== 0) {
    // A = Q0 + λ T0 = Q1 - μ T1: λ from the cross product with T1.
    const lambda = (dx * t1y - dy * t1x) / cross;
    const ax = q0x + lambda * t0x - x0, ay = q0y + lambda * t0y - y0;
    const along = ax * cx + ay * cy;
    if (lambda >= 0 && along >= 0 && along <= L) return Math.max(mid, Math.abs(ax * cy - ay * cx));
  }
  return mid + arcBound(dx, dy, t0x, t0y, t1x, t1y);
}

/**
 * Appends to `out` the points of the bisector strictly between s0 and s1
 * (ends given with their t; the start not appended), then the end (x1, y1).
 *
 * Every chord is within `tol` of the curve (Euclidean distance), by
 * triangle bounds, which hold for convex arcs. Lp bisectors have
 * inflections (three on the curves we traced: at the midpoint of the pair
 * and at two points symmetric about it), which the end tangents of a chord
 * do not always reveal; so every chord is judged with its middle point and
 * the tangent there. Where the tangent turns one way at all three points,
 * each half is taken for convex: the curve lies in the two halves' tangent
 * triangles, whose corners are within tol of the chord (halfBound).
 * Otherwise the chord's own arcBound must be within tol, and the middle
 * point's distance from the chord plus the arcBound of the two halves too
 * (the curve is within the halves' bounds of the path through the middle
 * point, which is within that distance of the chord). The first rule
 * accepts a circular arc of height up to tol, the second only up to tol / 2
 * (its chord's tangent triangle is twice as high): a quarter fewer bends at
 * p = 3 (2.85 to 2.14 million on 1e5 uniform sites).
 *
 * Both rules rest on the curvature changing sign only where the sampled
 * tangents can see it: at isolated points of a curve that is smooth at the
 * chord's scale. The bisector is centrally symmetric about the pair's
 * midpoint (the norm is symmetric), so its curvature changes sign there: a
 * chord across s = 0 is always split at 0. For p < 2 the norm is not smooth
 * on the axis-parallel lines through its centre: the curve of
 * ||q - a|| - ||q - b|| = 0 has curvature unbounded where it crosses a line
 * x = ax (likewise y = ay, x = bx, y = by). Near such a crossing,
 * ||q - a||_p = |y - ay| + |x - ax|^p / (p |y - ay|^(p-1)) + ..., so the
 * bisector is a smooth curve plus a term d |x - ax|^p: its curvature is the
 * smooth curve's plus d p (p - 1) |x - ax|^(p-2), a spike of one sign on
 * both sides of the line, which against an opposite background curvature
 * makes two inflections a short way either side, an S bend and its mirror
 * inside one chord that the tangents at its ends and middle can miss
 * entirely (a dense check of the sampled edges against the curve found
 * 1.31 tol at p = 1.1 and 1.08 at p = 1.5, 2,000 uniform sites, with such
 * chords judged by the second rule alone). So for p < 2 every edge is also split exactly at its
 * crossings with those four lines (siteLineCrossings: at most one per line,
 * solved on the line itself). Within a chord the coordinates of q - a and
 * q - b then keep their signs, the norms are analytic, and on either side of
 * a crossing the spike term decreases monotonically away from it: at most
 * one sign change where it meets the background, next to the chord's end,
 * an inflection the rules judge like the curve's others (the tangent is
 * continuous there, p - 1 > 0). That is the rules' premise, not a proof;
 * tests/property/minkowski-tolerance.test.ts checks the result densely, both
 * ways. For p > 2 the spike is a zero of the curvature instead, and the
 * curve needs no such split.
 * Chords shorter in s than rounding can resolve are not split further.
 */
export function sampleEdge(f: PairFrame, s0: number, x0: number, y0: number, t0: number,
  s1: number, x1: number, y1: number, t1: number, tol: number, out: Polyline): void {
  top = 0;
  // Tangents at the ends (one Newton step from their exact t).
  f.at(s1, t1);
  push(s1, x1, y1, t1, f.tx, f.ty);
  const floor = 64 * Number.EPSILON * f.h;
  const n = f.p < 2 ? siteLineCrossings(f, s0, x0, y0, s1, x1, y1, splitsAt) : 0;
  // The crossings and 0, from the largest down (the stack hands out the smallest first).
  let zero = s0 < 0 && s1 > 0 && -s0 > floor && s1 > floor;
  for (let i = n - 1; i >= -1; i--) {
    const s = i >= 0 ? splitsAt[2 * i] : -Infinity;
    if (zero && s < 0) { zero = false; f.at(0, 0); push(0, f.x, f.y, f.t, f.tx, f.ty); }
    if (i >= 0 && s - s0 > floor && s1 - s > floor) { f.at(s, splitsAt[2 * i + 1]); push(s, f.x, f.y, f.t, f.tx, f.ty); }
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
      f.at(ms, lt + (rt - lt) / 2);
      let split = far > 2 * Math.max(near, f.h);
      if (!split) {
        // An inflection inside can hide from the end tangents: the chord is judged by its middle point, with
        // its tangent, and each half's own bound (see halfBound).
        const dx = rx - lx, dy = ry - ly, len = length(dx, dy);
        if (len > 0) {
          const cx = dx / len, cy = dy / len, mx = f.x - lx, my = f.y - ly;
          const along = mx * cx + my * cy, mid = Math.abs(mx * cy - my * cx);
          // The tangent turns one way all along (each half, and the chord as a whole): then each half is
          // taken for convex (halfBound); otherwise the sum of the middle point's distance and the halves'
          // arcBound, and the chord's own arcBound.
          const turn0 = ltx * f.ty - lty * f.tx, turn1 = f.tx * rty - f.ty * rtx, turn = ltx * rty - lty * rtx;
          if (turn0 * turn1 > 0 && turn0 * turn > 0 && along >= 0 && along <= len) {
            split = halfBound(lx, ly, cx, cy, len, lx, ly, ltx, lty, f.x, f.y, f.tx, f.ty, mid) > tol ||
              halfBound(lx, ly, cx, cy, len, f.x, f.y, f.tx, f.ty, rx, ry, rtx, rty, mid) > tol;
          } else {
            split = arcBound(dx, dy, ltx, lty, rtx, rty) > tol ||
              mid + Math.max(arcBound(mx, my, ltx, lty, f.tx, f.ty), arcBound(rx - f.x, ry - f.y, f.tx, f.ty, rtx, rty)) > tol;
          }
        } else split = length(f.x - lx, f.y - ly) > tol;
      }
      if (split && splits++ < MAX_SPLITS) { push(ms, f.x, f.y, f.t, f.tx, f.ty); continue; }
    }
    top--;
    out.add(rx, ry, rs);
    ls = rs; lx = rx; ly = ry; lt = rt; ltx = rtx; lty = rty;
  }
}
