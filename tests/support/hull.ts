import { orient } from '../../src/core/predicates.js';

/**
 * Convex hull by Andrew's monotone chain (A. M. Andrew, "Another efficient
 * algorithm for convex hulls in two dimensions", Information Processing
 * Letters 9, 1979), written here from the published method as an
 * independent oracle; it does not use ambit's triangulation.
 *
 * Differences from the textbook version, to match ambit's hull contract:
 * points lying ON a hull edge are kept (a chain pops only on a strict
 * clockwise turn, decided by the exact `orient`), the result is
 * counter-clockwise (y-up) starting at the lexicographically smallest
 * (x, then y) point, and an all-collinear set gives its points sorted along
 * the line from that smallest point.
 *
 * Input: interleaved x, y. Exact duplicates are merged. Output: the hull as
 * [x, y] pairs (coordinates, so callers can compare against any numbering).
 */
export function monotoneChainHull(xy: ArrayLike<number>): [number, number][] {
  const seen = new Set<string>();
  const pts: [number, number][] = [];
  for (let i = 0; i + 1 < xy.length; i += 2) {
    // `+ 0` turns -0 into 0, so -0 and 0 are one point.
    const p: [number, number] = [xy[i] + 0, xy[i + 1] + 0];
    const key = `${p[0]},${p[1]}`;
    if (seen.has(key)) continue;
    seen.add(key);
    pts.push(p);
  }
  pts.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const n = pts.length;
  if (n <= 2) return pts;

  const first = pts[0];
  const last = pts[n - 1];
  let allCollinear = true;
  for (const p of pts) {
    if (orient(first[0], first[1], last[0], last[1], p[0], p[1]) !== 0) {
      allCollinear = false;
      break;
    }
  }
  // Sorted lexicographically, collinear points are already in order along the line.
  if (allCollinear) return pts;

  const turnsClockwise = (h: [number, number][], p: [number, number]) => {
    const a = h[h.length - 2];
    const b = h[h.length - 1];
    return orient(a[0], a[1], b[0], b[1], p[0], p[1]) < 0;
  };
  const lower: [number, number][] = [];
  for (const p of pts) {
    while (lower.length >= 2 && turnsClockwise(lower, p)) lower.pop();
    lower.push(p);
  }
  const upper: [number, number][] = [];
  for (let i = n - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && turnsClockwise(upper, p)) upper.pop();
    upper.push(p);
  }
  // Each chain ends where the other starts.
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}

/**
 * 0 for one distinct point, 1 when all points are collinear (exact orient),
 * else 2: the dimension a triangulation of the points must report.
 */
export function affineDimension(xy: ArrayLike<number>): 0 | 1 | 2 {
  const n = xy.length >> 1;
  let j = -1;
  for (let i = 1; i < n; i++) {
    if (xy[2 * i] !== xy[0] || xy[2 * i + 1] !== xy[1]) { j = i; break; }
  }
  if (j < 0) return 0;
  for (let i = 1; i < n; i++) {
    if (orient(xy[0], xy[1], xy[2 * j], xy[2 * j + 1], xy[2 * i], xy[2 * i + 1]) !== 0) return 2;
  }
  return 1;
}
