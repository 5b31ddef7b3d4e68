import { compareDistance } from '../../core/distance.js';
import { InputError } from '../../core/errors.js';
import { MAX_COORDINATE } from '../../core/limits.js';
import { SiteLocator } from '../../query/site-locator.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import type { ExactMetric } from './bisector.js';
import { sumSign } from './geometry.js';
import { SiteHeap } from './heap.js';
import { adjacency } from './graph.js';

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

function checkQuery(v: number, name: string): void {
  if (typeof v !== 'number' || !Number.isFinite(v) || Math.abs(v) > MAX_COORDINATE) {
    throw new InputError(typeof v !== 'number' ? 'not-a-number' : Number.isFinite(v) ? 'out-of-range' : 'not-finite', `query ${name} = ${String(v)} must be a finite number within ${MAX_COORDINATE}`, -1, name);
  }
}

/**
 * Nearest sites under L1 or L-infinity. The Euclidean nearest site starts a
 * best-first search over the Delaunay graph in order of Euclidean distance
 * (the k Euclidean-nearest sites are connected in it); a site at metric
 * distance r lies within Euclidean distance r c (c = 1 for L1, sqrt 2 for
 * L-infinity), so the search stops past c times the k-th best metric distance.
 */
export class MetricLocator {
  private readonly euclid: SiteLocator;
  private readonly xy: Float64Array;
  private readonly off: Int32Array;
  private readonly adj: Int32Array;
  private readonly seen: Int32Array;
  private readonly heap = new SiteHeap(64);
  private stamp = 0;
  private readonly reach: number;

  constructor(tri: Triangulation, private readonly metric: ExactMetric) {
    this.euclid = new SiteLocator(tri);
    this.xy = tri.siteXY;
    ({ off: this.off, adj: this.adj } = adjacency(tri));
    this.seen = new Int32Array(tri.siteCount);
    this.reach = metric === 'L1' ? 1 : Math.SQRT2;
  }

  nearest(x: number, y: number): number { return this.kNearest(x, y, 1)[0]; }

  kNearest(x: number, y: number, k: number): Int32Array {
    checkQuery(x, 'x');
    checkQuery(y, 'y');
    const n = this.seen.length;
    if (typeof k !== 'number' || !Number.isInteger(k) || k < 1 || k > n) {
      throw new InputError('bad-k', `k = ${String(k)} must be an integer in 1..${n}`, -1, 'k');
    }
    const xy = this.xy, metric = this.metric, heap = this.heap, seen = this.seen;
    const tag = ++this.stamp;
    const start = this.euclid.nearest(x, y);
    const best: number[] = [];
    const cmp = (a: number, b: number): number => compareMetric(metric, x, y, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]);
    heap.clear();
    heap.push(start, 0);
    seen[start] = tag;
    let limit = Infinity;
    while (heap.size > 0) {
      if (heap.topKey() > limit * limit) break;
      const u = heap.pop();
      if (best.length < k || cmp(u, best[best.length - 1]) < 0) {
        let i = best.length;
        best.push(u);
        while (i > 0 && cmp(u, best[i - 1]) < 0) { best[i] = best[i - 1]; i--; }
        best[i] = u;
        if (best.length > k) best.pop();
        if (best.length === k) {
          const w = best[k - 1];
          limit = this.reach * metricDistance(metric, x, y, xy[2 * w], xy[2 * w + 1]) * (1 + 2 ** -30) + 2 ** -1000;
        }
      }
      for (let e = this.off[u]; e < this.off[u + 1]; e++) {
        const v = this.adj[e];
        if (seen[v] === tag) continue;
        seen[v] = tag;
        const dx = xy[2 * v] - x, dy = xy[2 * v + 1] - y;
        heap.push(v, dx * dx + dy * dy);
      }
    }
    return Int32Array.from(best);
  }
}
