import { compareDistance } from '../../core/distance.js';
import type { SiteRanking } from '../../query/best-first.js';
import type { ExactMetric } from './bisector.js';
import { sumSign } from './geometry.js';

/**
 * Sign of key(q, a) - key(q, b) under the ordering rule: metric distance,
 * then Euclidean distance, then the site's x, then y. Exact: the sign of a
 * difference of doubles is exact in floating point, so the absolute values
 * become signed terms whose sum is decided by sumSign.
 */
export function compareMetric(metric: ExactMetric, qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const sa = metricTerms(metric, qx, qy, ax, ay), sb = metricTerms(metric, qx, qy, bx, by);
  const d = sumSign([...sa, ...sb.map((v) => -v)]);
  if (d !== 0) return d;
  const e = Math.sign(compareDistance(qx, qy, ax, ay, bx, by));
  if (e !== 0) return e;
  return ax !== bx ? (ax < bx ? -1 : 1) : ay !== by ? (ay < by ? -1 : 1) : 0;
}

/** Doubles whose exact sum is the metric distance from q to a. */
function metricTerms(metric: ExactMetric, qx: number, qy: number, ax: number, ay: number): number[] {
  const tx = qx >= ax ? [qx, -ax] : [ax, -qx], ty = qy >= ay ? [qy, -ay] : [ay, -qy];
  if (metric === 'L1') return [...tx, ...ty];
  return sumSign([...tx, -ty[0], -ty[1]]) >= 0 ? tx : ty;
}

function metricDistance(metric: ExactMetric, qx: number, qy: number, ax: number, ay: number): number {
  const dx = Math.abs(qx - ax), dy = Math.abs(qy - ay);
  return metric === 'L1' ? dx + dy : Math.max(dx, dy);
}

/**
 * Nearest sites under L1 or L-infinity: a site at metric distance r lies
 * within Euclidean distance r c (c = 1 for L1, sqrt 2 for L-infinity), with
 * a relative margin for the rounding of the distance.
 */
export function metricRanking(metric: ExactMetric): SiteRanking {
  return {
    compare: (qx, qy, ax, ay, bx, by) => compareMetric(metric, qx, qy, ax, ay, bx, by),
    distance: (qx, qy, ax, ay) => metricDistance(metric, qx, qy, ax, ay),
    reach: (metric === 'L1' ? 1 : Math.SQRT2) * (1 + 2 ** -30),
  };
}
