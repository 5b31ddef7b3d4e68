import { PairFrame } from './bisector.js';
import { lpLength, smallInteger } from './norm.js';
import { PowerPoint } from './powers.js';

/** Result of lpCentre: the centre's coordinates, and whether it lies beyond the horizon (then placed there). */
export const centre = { x: 0, y: 0, far: false };

const frame = new PairFrame();
const pp = new PowerPoint();

/**
 * The centre of the Lp circle (a homothet of the unit p-ball) through the
 * corners of a counter-clockwise triangle a, b, c. For a strictly convex,
 * smooth norm it exists and is unique for non-collinear points (Chew and
 * Drysdale 1985, from memory).
 *
 * Newton's method on the two equations ||x-a||^p = ||x-b||^p,
 * ||x-a||^p = ||x-c||^p (the p-th powers: same root as the norms, and no
 * root to take; integer p multiplies out, see powP), in coordinates
 * relative to a scaled by the longest side, started at the Euclidean
 * circumcentre and damped: a step that makes the residual (relative to
 * ||x-a||^p) grow is halved until it does not. When it does not converge
 * (far centres of near-flat triangles, p far from 2), the centre is found
 * by bisection along the bisector of the longest side: there
 * ||q-c|| - ||q-a|| is decreasing in s (the Lp circles through two points
 * are nested on each side of them, as two such circles meet in at most two
 * points), so the bracket is safe.
 */
export function lpCentre(p: number, ax: number, ay: number, bx: number, by: number, cx: number, cy: number, horizon: number): void {
  const L = Math.max(Math.hypot(bx - ax, by - ay), Math.hypot(cx - bx, cy - by), Math.hypot(ax - cx, ay - cy));
  const Bx = (bx - ax) / L, By = (by - ay) / L, Cx = (cx - ax) / L, Cy = (cy - ay) / L;
  const d = 2 * (Bx * Cy - By * Cx);
  const b2 = Bx * Bx + By * By, c2 = Cx * Cx + Cy * Cy;
  let X = (Cy * b2 - By * c2) / d, Y = (Bx * c2 - Cx * b2) / d;
  // Newton is trusted only near the triangle: far out the residuals flatten to differences of
  // nearly equal large norms, and "converged" would mean nothing. Far centres (near-flat triangles) bisect.
  const NEAR = 1e4;
  const pi = smallInteger(p);
  let ok = Number.isFinite(X) && Number.isFinite(Y) && Math.abs(X) + Math.abs(Y) < NEAR;
  if (ok) {
    ok = false;
    // The last full step from (X0, Y0) and the fraction of it taken (halved while the residual grows).
    let res = Infinity, X0 = X, Y0 = Y, dX = 0, dY = 0, frac = 1;
    for (let it = 0; it < 60 && Math.abs(X) + Math.abs(Y) < NEAR; it++) {
      pp.set(p, pi, X, Y, X - Bx, Y - By, X - Cx, Y - Cy);
      const g1 = pp.p0 - pp.p1, g2 = pp.p0 - pp.p2;
      // Relative to ||x-a||^p, so that the rescaling by the largest coordinate (see PowerPoint) cancels.
      const r = (Math.abs(g1) + Math.abs(g2)) / pp.p0;
      if (r > res) {
        if (frac < 1e-3) break;
        frac /= 2;
        X = X0 - frac * dX; Y = Y0 - frac * dY;
        continue;
      }
      res = r;
      const j11 = pp.g0x - pp.g1x, j12 = pp.g0y - pp.g1y, j21 = pp.g0x - pp.g2x, j22 = pp.g0y - pp.g2y;
      const det = j11 * j22 - j12 * j21;
      if (!(Math.abs(det) > 0)) break;
      // The gradients lack the factor p / M of the residuals' true derivatives: the step puts it back.
      const k = pp.M / p;
      X0 = X; Y0 = Y; frac = 1;
      dX = k * (g1 * j22 - g2 * j12) / det; dY = k * (j11 * g2 - j21 * g1) / det;
      X -= dX; Y -= dY;
      // Converged: the step is at rounding level and so is the residual (a few ulps of the powers; relative
      // to them, p times the norms' relative residual, which is at most a few ulps of the norms).
      if (Math.abs(dX) + Math.abs(dY) <= 4 * Number.EPSILON * (Math.abs(X) + Math.abs(Y) + 1) && r <= 64 * p * Number.EPSILON) { ok = true; break; }
    }
  }
  if (ok && Math.abs(X) + Math.abs(Y) < NEAR) {
    centre.x = ax + X * L;
    centre.y = ay + Y * L;
    centre.far = false;
    return;
  }
  bisectCentre(p, ax, ay, bx, by, cx, cy, horizon);
}

/**
 * The fallback of lpCentre: bisection in s along the bisector of the longest
 * side. The bracket grows only to `horizon`: a centre beyond it (near-flat
 * triangles; for p near 1 or very large, even fat ones, whose Lp circles
 * approach those of L1 or L-infinity, where three points can have no circle)
 * is placed at the horizon on the right branch of the bisector. Far outside
 * the region, only which way it lies matters to the edges that end there.
 */
function bisectCentre(p: number, ax: number, ay: number, bx: number, by: number, cx: number, cy: number, horizon: number): void {
  // Rotate the corners so that a→b is the longest side (c stays on its left).
  const ab = Math.hypot(bx - ax, by - ay), bc = Math.hypot(cx - bx, cy - by), ca = Math.hypot(ax - cx, ay - cy);
  if (bc >= ab && bc >= ca) { const tx = ax, ty = ay; ax = bx; ay = by; bx = cx; by = cy; cx = tx; cy = ty; }
  else if (ca >= ab && ca >= bc) { const tx = cx, ty = cy; cx = bx; cy = by; bx = ax; by = ay; ax = tx; ay = ty; }
  const f = frame.set(p, ax, ay, bx, by);
  // h(s) = ||q-c|| - ||q-a||, decreasing: positive below the centre.
  const hOf = (s: number, guess: number): number => {
    f.at(s, guess);
    return lpLength(p, f.x - cx, f.y - cy) - lpLength(p, f.x - ax, f.y - ay);
  };
  let lo = 0, hi = 0, step = f.h;
  if (hOf(0, 0) > 0) {
    hi = step;
    while (hOf(hi, f.t) > 0) {
      if (hi >= horizon) { centre.x = f.x; centre.y = f.y; centre.far = true; return; }
      lo = hi; step *= 2; hi = Math.min(hi + step, horizon);
    }
  } else {
    lo = -step;
    while (hOf(lo, f.t) <= 0) {
      if (lo <= -horizon) { centre.x = f.x; centre.y = f.y; centre.far = true; return; }
      hi = lo; step *= 2; lo = Math.max(lo - step, -horizon);
    }
  }
  let t = f.t;
  for (let it = 0; it < 200 && hi - lo > 2 * Number.EPSILON * (Math.abs(lo) + Math.abs(hi)); it++) {
    const mid = lo + (hi - lo) / 2;
    if (hOf(mid, t) > 0) lo = mid; else hi = mid;
    t = f.t;
  }
  f.at(lo + (hi - lo) / 2, t);
  centre.x = f.x;
  centre.y = f.y;
  centre.far = false;
}
