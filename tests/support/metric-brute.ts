import { toScaledIntegers } from './voronoi-brute.js';

/** Brute-force references for the L1 / L-infinity diagrams, on exact integers (independent of src/). */

export type ExactMetricName = 'L1' | 'Linf';

const abs = (v: bigint): bigint => (v < 0n ? -v : v);
const max = (a: bigint, b: bigint): bigint => (a > b ? a : b);
const sign = (v: bigint): number => (v > 0n ? 1 : v < 0n ? -1 : 0);

/**
 * Sign of key(q, a) - key(q, b) under the documented rule: metric distance,
 * then Euclidean distance, then x, then y of the site.
 */
export function compareByRule(metric: ExactMetricName, qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const [QX, QY, AX, AY, BX, BY] = toScaledIntegers([qx, qy, ax, ay, bx, by]);
  const da = metric === 'L1' ? abs(QX - AX) + abs(QY - AY) : max(abs(QX - AX), abs(QY - AY));
  const db = metric === 'L1' ? abs(QX - BX) + abs(QY - BY) : max(abs(QX - BX), abs(QY - BY));
  if (da !== db) return sign(da - db);
  const ea = (QX - AX) ** 2n + (QY - AY) ** 2n, eb = (QX - BX) ** 2n + (QY - BY) ** 2n;
  if (ea !== eb) return sign(ea - eb);
  return ax !== bx ? Math.sign(ax - bx) : Math.sign(ay - by);
}

/** The owner of q by brute force over all sites (interleaved). */
export function ownerByRule(metric: ExactMetricName, xy: ArrayLike<number>, qx: number, qy: number): number {
  let best = 0;
  for (let s = 1; s < xy.length >> 1; s++) {
    if (compareByRule(metric, qx, qy, xy[2 * s], xy[2 * s + 1], xy[2 * best], xy[2 * best + 1]) < 0) best = s;
  }
  return best;
}

/** Whether a metric tie between the two nearest sites holds exactly (a point on a two-dimensional tie set or a boundary). */
export function metricTie(metric: ExactMetricName, xy: ArrayLike<number>, qx: number, qy: number, a: number, b: number): boolean {
  const [QX, QY, AX, AY, BX, BY] = toScaledIntegers([qx, qy, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]]);
  const da = metric === 'L1' ? abs(QX - AX) + abs(QY - AY) : max(abs(QX - AX), abs(QY - AY));
  const db = metric === 'L1' ? abs(QX - BX) + abs(QY - BY) : max(abs(QX - BX), abs(QY - BY));
  return da === db;
}

/** Winding-number point-in-polygon; also the distance from the point to the polygon's boundary. */
export function locateInPolygon(poly: ArrayLike<number>, x: number, y: number): { inside: boolean; boundaryDistance: number } {
  const n = poly.length >> 1;
  let wn = 0, dmin = Infinity;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const ax = poly[2 * i], ay = poly[2 * i + 1], bx = poly[2 * j], by = poly[2 * j + 1];
    const cross = (bx - ax) * (y - ay) - (by - ay) * (x - ax);
    if (ay <= y) { if (by > y && cross > 0) wn++; } else if (by <= y && cross < 0) wn--;
    const ex = bx - ax, ey = by - ay, len2 = ex * ex + ey * ey;
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((x - ax) * ex + (y - ay) * ey) / len2)) : 0;
    dmin = Math.min(dmin, Math.hypot(x - ax - t * ex, y - ay - t * ey));
  }
  return { inside: wn !== 0, boundaryDistance: dmin };
}
