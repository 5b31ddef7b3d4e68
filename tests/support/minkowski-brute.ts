/**
 * Brute-force references for Minkowski (p-norm) diagrams, written from the
 * definition ||v||_p = (|vx|^p + |vy|^p)^(1/p) with Math.pow, independent of
 * the engine's own norm code.
 */

export function lpDistance(p: number, dx: number, dy: number): number {
  return Math.pow(Math.pow(Math.abs(dx), p) + Math.pow(Math.abs(dy), p), 1 / p);
}

/**
 * The largest p-length of a Euclidean unit vector: 2^(1/p - 1/2) for p < 2
 * (on the diagonals), 1 for p >= 2 (on the axes). Hölder's inequality, from memory.
 */
export function lpPerEuclidean(p: number): number {
  return p < 2 ? Math.pow(2, 1 / p - 0.5) : 1;
}

/**
 * The nearest site to q by p-distance (ties by Euclidean distance, then x,
 * then y), and a lower bound on the Euclidean distance from q to any point
 * where another site is as near: moving q by δ changes each p-distance by at
 * most lpPerEuclidean(p) δ, so the gap between the best and second-best
 * p-distance closes only after gap / (2 lpPerEuclidean(p)).
 */
export function lpOwner(p: number, xy: ArrayLike<number>, n: number, qx: number, qy: number): { site: number; clearance: number } {
  let best = -1, bestD = Infinity, second = Infinity;
  for (let s = 0; s < n; s++) {
    const d = lpDistance(p, qx - xy[2 * s], qy - xy[2 * s + 1]);
    if (best < 0 || d < bestD || (d === bestD && ruleBefore(xy, qx, qy, s, best))) {
      second = Math.min(second, bestD);
      best = s; bestD = d;
    } else second = Math.min(second, d);
  }
  return { site: best, clearance: n > 1 ? (second - bestD) / (2 * lpPerEuclidean(p)) : Infinity };
}

function ruleBefore(xy: ArrayLike<number>, qx: number, qy: number, a: number, b: number): boolean {
  const da = Math.hypot(qx - xy[2 * a], qy - xy[2 * a + 1]), db = Math.hypot(qx - xy[2 * b], qy - xy[2 * b + 1]);
  if (da !== db) return da < db;
  return xy[2 * a] !== xy[2 * b] ? xy[2 * a] < xy[2 * b] : xy[2 * a + 1] < xy[2 * b + 1];
}

/**
 * Euclidean distance from q to the p-bisector of a and b, to first order:
 * |F(q)| / |grad F(q)| with F(q) = ||q - a||_p - ||q - b||_p.
 */
export function distanceToBisector(p: number, ax: number, ay: number, bx: number, by: number, qx: number, qy: number): number {
  const f = lpDistance(p, qx - ax, qy - ay) - lpDistance(p, qx - bx, qy - by);
  const grad = (dx: number, dy: number): [number, number] => {
    const n = lpDistance(p, dx, dy);
    return [Math.sign(dx) * Math.pow(Math.abs(dx) / n, p - 1), Math.sign(dy) * Math.pow(Math.abs(dy) / n, p - 1)];
  };
  const [gax, gay] = grad(qx - ax, qy - ay), [gbx, gby] = grad(qx - bx, qy - by);
  return Math.abs(f) / Math.hypot(gax - gbx, gay - gby);
}

/**
 * The point of the p-bisector of a and b at signed distance s from the line
 * ab (s along the left normal of a→b), from the definition
 * ||q - a||_p = ||q - b||_p alone: bisection on the line through
 * m + s û parallel to ab (m the midpoint, û the left normal), along which
 * ||q - a|| - ||q - b|| grows from -|ab| to |ab| for a strictly convex norm,
 * so the bisector meets it once. Returns [x, y].
 */
export function bisectorPointAt(p: number, ax: number, ay: number, bx: number, by: number, s: number): [number, number] {
  const L = Math.hypot(bx - ax, by - ay), ex = (bx - ax) / L, ey = (by - ay) / L, mx = (ax + bx) / 2, my = (ay + by) / 2;
  const ox = mx - s * ey, oy = my + s * ex;
  // The root lies within |t| < |s| + |ab| / 2 (argued at PairFrame.at); the bracket is four times that.
  let lo = -2 * (Math.abs(s) + L), hi = -lo;
  for (let i = 0; i < 200 && hi - lo > 1e-15 * (Math.abs(s) + L); i++) {
    const t = (lo + hi) / 2, x = ox + t * ex, y = oy + t * ey;
    if (lpDistance(p, x - ax, y - ay) - lpDistance(p, x - bx, y - by) < 0) lo = t; else hi = t;
  }
  const t = (lo + hi) / 2;
  return [ox + t * ex, oy + t * ey];
}
