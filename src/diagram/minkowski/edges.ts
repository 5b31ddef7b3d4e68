import { PairFrame } from './bisector.js';
import type { MeshParts } from './parts.js';
import { Polyline, sampleEdge } from './samples.js';

const frame = new PairFrame();
const line = new Polyline();

/**
 * One end of an edge: a Voronoi vertex (its point id, or -1 when it lies
 * outside the region, and its coordinates), or open (-Infinity / +Infinity
 * in s: a ray).
 */
export interface EdgeEnd { open: boolean; id: number; x: number; y: number }

/**
 * Adds to `parts` the edge between sites a (on the left) and b, running
 * along the bisector's parameter s from `from` to `to`: sampled once into a
 * polyline within `tol` of the curve, then clipped to the region. Only the
 * part within the region's disk is sampled (open ends, and far vertices,
 * are cut at s values just outside it).
 */
export function addEdge(parts: MeshParts, p: number, tol: number, sites: Float64Array, a: number, b: number, from: EdgeEnd, to: EdgeEnd): void {
  const ax = sites[2 * a], ay = sites[2 * a + 1], bx = sites[2 * b], by = sites[2 * b + 1];
  const f = frame.set(p, ax, ay, bx, by);
  const region = parts.region;
  // Every region point is within `radius` of its centre, so its s is within radius of the centre's;
  // the cut points lie 1% beyond, surely outside.
  const sC = f.sOf(region.cx, region.cy), lo = sC - 1.01 * region.radius, hi = sC + 1.01 * region.radius;
  let s0 = from.open ? -Infinity : f.sOf(from.x, from.y), s1 = to.open ? Infinity : f.sOf(to.x, to.y);
  const cut0 = s0 < lo, cut1 = s1 > hi;
  if (cut0) s0 = lo;
  if (cut1) s1 = hi;
  line.clear();
  if (!cut0 && !cut1 && !(s0 < s1)) {
    // Two vertices within rounding of each other, out of order: join them straight.
    line.add(from.x, from.y, s0);
    line.add(to.x, to.y, s1);
  } else {
    if (!(s0 < s1)) return;
    let x0: number, y0: number, t0: number, x1: number, y1: number, t1: number;
    if (cut0) { f.at(s0, 0); x0 = f.x; y0 = f.y; t0 = f.t; } else { x0 = from.x; y0 = from.y; t0 = tOf(f, x0, y0); }
    if (cut1) { f.at(s1, t0); x1 = f.x; y1 = f.y; t1 = f.t; } else { x1 = to.x; y1 = to.y; t1 = tOf(f, x1, y1); }
    line.add(x0, y0, s0);
    sampleEdge(f, s0, x0, y0, t0, s1, x1, y1, t1, tol, line);
  }
  clipPolyline(parts, line.xy, line.count, a, b, cut0 ? -1 : from.id, cut1 ? -1 : to.id, parts);
}

/** The bisector's other coordinate t of a point (a function, not a closure per edge). */
function tOf(f: PairFrame, x: number, y: number): number { return (x - f.mx) * f.ex + (y - f.my) * f.ey; }

/**
 * Walks a polyline (xy[0..2m)) through the region: runs of it become chains
 * of edges with `a` on their left and `b` on their right, with crossings
 * at their ends; the points it makes between two of its edges are declared
 * bends. `test.inside` is the region's inside rule (MeshParts.inside, or a
 * stricter one that refuses points too near a side); a segment with both
 * ends inside by it is whole. `startId` / `endId`, when not -1, are the
 * mesh points at the polyline's first / last point, made only for points
 * inside by that same rule (both engines' centres): those two are not
 * tested again, which for most edges leaves only the bends to test. Shared
 * by the Minkowski and the L1/L∞ dual route.
 */
export function clipPolyline(parts: MeshParts, P: Float64Array, m: number, a: number, b: number, startId: number, endId: number,
  test: { inside(x: number, y: number): boolean }): void {
  let cur = startId;
  // Whether cur is a point this walk made (a bend between the last edge and the next).
  let made = false;
  // Each point is tested once, for both of its segments. A segment with both ends inside by this rule is
  // whole, as clip() would find it: every side is positive at both ends, so no side cuts it.
  let inP = startId >= 0 || test.inside(P[0], P[1]);
  for (let i = 0; i + 1 < m; i++) {
    const px = P[2 * i], py = P[2 * i + 1], qx = P[2 * i + 2], qy = P[2 * i + 3];
    const inQ = (i + 2 === m && endId >= 0) || test.inside(qx, qy), whole = inP && inQ;
    inP = inQ;
    if (!whole && !parts.clip(px, py, qx, qy)) {
      if (cur >= 0) throw new Error(`minkowski edge ${a}-${b}: a run lost its way (inside point, no inside segment)`);
      continue;
    }
    const sideOut = whole ? -1 : parts.sideOut;
    if (cur < 0) {
      if (whole || parts.sideIn < 0) throw new Error(`minkowski edge ${a}-${b}: an inside point starts no run`);
      cur = parts.cross(parts.sideIn, px, py, qx, qy, parts.tIn, a, b, true);
    }
    const bend = made;
    let next: number;
    made = false;
    if (sideOut >= 0) next = parts.cross(sideOut, px, py, qx, qy, parts.tOut, a, b, false);
    else if (i + 2 === m && endId >= 0) next = endId;
    else { next = parts.points.add(qx, qy); made = true; }
    parts.link(cur, next, a, b);
    if (bend) parts.bend();
    cur = sideOut >= 0 ? -1 : next;
  }
}
