import { compareDistance } from '../../core/distance.js';
import type { SiteRanking } from '../../query/best-first.js';
import { euclideanReach, lpLength } from './norm.js';

/**
 * Order of sites a, b seen from q: p-norm distance, then Euclidean distance
 * (exact), then the site's x, then y. The p-norm distances are compared as
 * rounded doubles (no exact test exists for irrational powers): two sites
 * whose distances agree to the last bit or two may come in either order.
 */
export function compareLp(p: number, qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const da = lpLength(p, qx - ax, qy - ay), db = lpLength(p, qx - bx, qy - by);
  if (da !== db) return da < db ? -1 : 1;
  const e = Math.sign(compareDistance(qx, qy, ax, ay, bx, by));
  if (e !== 0) return e;
  return ax !== bx ? (ax < bx ? -1 : 1) : ay !== by ? (ay < by ? -1 : 1) : 0;
}

/**
 * Nearest sites under a p-norm: a site at p-distance r is within Euclidean
 * distance r c (c = euclideanReach(p)), with a relative margin for the
 * rounding of the p-distance.
 */
export function lpRanking(p: number): SiteRanking {
  return {
    compare: (qx, qy, ax, ay, bx, by) => compareLp(p, qx, qy, ax, ay, bx, by),
    distance: (qx, qy, ax, ay) => lpLength(p, qx - ax, qy - ay),
    reach: euclideanReach(p) * (1 + 2 ** -30),
  };
}
