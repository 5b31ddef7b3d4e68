import { euclidLine, meet, midpoint, sideOf, specialLine, type Line, type Pt } from './geometry.js';
import type { ExactMetric } from './bisector.js';

/*
 * Who owns the far side of a boundary stretch that two competitors l and t
 * both share with the cell's site s (the stretch lies on both bisectors, so
 * s, l and t tie there in the metric). Just beyond the stretch, a site's
 * metric distance grows at the rate of its one-sided directional derivative
 * along the outward normal n: for L1, sum over the axes of sign(q - u) n,
 * with |n| where the sign is 0; for L-infinity, the same along the axis
 * where |q - u| is larger (the larger of the two when they are equal). The
 * site whose distance grows more slowly wins beyond; equal rates leave the
 * tie to the Euclidean rule, then to (x, then y). These rates and the
 * Euclidean comparison only change where q crosses an axis line (or, for
 * L-infinity, a diagonal) through l or t, or the Euclidean bisector of l and
 * t, so the stretch is cut there and each part decided at its midpoint.
 */

/** Lines along which the winner beyond a shared stretch can change. */
function breakLines(metric: ExactMetric, lx: number, ly: number, tx: number, ty: number): Line[] {
  const out = [euclidLine(lx, ly, tx, ty)];
  for (const [x, y] of [[lx, ly], [tx, ty]]) {
    out.push(specialLine(1, 0, [x], 1), specialLine(0, 1, [y], 1));
    if (metric === 'Linf') out.push(specialLine(1, 1, [x, y], 1), specialLine(1, -1, [x, -y], 1));
  }
  return out;
}

const rate = (sign: number, n: number): number => (sign !== 0 ? sign * n : Math.abs(n));

/** Growth rate of the metric distance to (ux, uy) at q along n, exactly (n has small integer components). */
function growth(metric: ExactMetric, q: Pt, ux: number, uy: number, nx: number, ny: number): number {
  const sx = sideOf(q, specialLine(1, 0, [ux], 1)), sy = sideOf(q, specialLine(0, 1, [uy], 1));
  if (metric === 'L1') return rate(sx, nx) + rate(sy, ny);
  // sign(|qx - ux| - |qy - uy|): with the signs of the differences known, one more line test.
  const cx = sx === 0 ? (sy === 0 ? 0 : -1) : sy === 0 ? 1 : sideOf(q, specialLine(sx, -sy, [sx * ux, -sy * uy], 1));
  if (cx > 0) return rate(sx, nx);
  if (cx < 0) return rate(sy, ny);
  return Math.max(rate(sx, nx), rate(sy, ny));
}

export interface Stretch { start: Pt; label: number }

/**
 * Splits the stretch from `start` to `end` on `line` (negative on the
 * cell's side) into parts labelled l or t by who wins beyond it.
 */
export function splitShared(
  metric: ExactMetric, start: Pt, end: Pt, line: Line, l: number, t: number,
  x: (s: number) => number, y: (s: number) => number,
): Stretch[] {
  const lx = x(l), ly = y(l), tx = x(t), ty = y(t);
  const cuts: Pt[] = [];
  for (const b of breakLines(metric, lx, ly, tx, ty)) {
    if (sideOf(start, b) * sideOf(end, b) < 0) cuts.push(meet(line, b));
  }
  const dx = end.x - start.x, dy = end.y - start.y;
  cuts.sort((p, q) => (p.x - q.x) * dx + (p.y - q.y) * dy);
  const e = euclidLine(lx, ly, tx, ty);
  const winner = (m: Pt): number => {
    const gl = growth(metric, m, lx, ly, line.a, line.b), gt = growth(metric, m, tx, ty, line.a, line.b);
    if (gl !== gt) return gl < gt ? l : t;
    const side = sideOf(m, e);
    if (side !== 0) return side < 0 ? l : t;
    return lx < tx || (lx === tx && ly < ty) ? l : t;
  };
  const out: Stretch[] = [];
  const points = [start, ...cuts, end];
  for (let i = 0; i + 1 < points.length; i++) {
    const label = winner(midpoint(points[i], points[i + 1]));
    if (out.length === 0 || out[out.length - 1].label !== label) out.push({ start: points[i], label });
  }
  return out;
}
