import { compareDistance } from '../../core/distance.js';
import { InputError } from '../../core/errors.js';
import { MAX_COORDINATE } from '../../core/limits.js';
import { SiteLocator } from '../../query/site-locator.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { adjacency } from '../metric/graph.js';
import { SiteHeap } from '../metric/heap.js';
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

function checkQuery(v: number, name: string): void {
  if (typeof v !== 'number' || !Number.isFinite(v) || Math.abs(v) > MAX_COORDINATE) {
    throw new InputError(typeof v !== 'number' ? 'not-a-number' : Number.isFinite(v) ? 'out-of-range' : 'not-finite', `query ${name} = ${String(v)} must be a finite number within ${MAX_COORDINATE}`, -1, name);
  }
}

/**
 * Nearest sites under a p-norm: best-first search over the Euclidean
 * Delaunay graph from the Euclidean nearest site, in order of Euclidean
 * distance (the k Euclidean-nearest sites are connected in that graph, a
 * property of order-k Voronoi diagrams, from memory). A site at p-distance
 * r is within Euclidean distance r c (c = euclideanReach(p)), so the search
 * stops past c times the k-th best p-distance (with a relative margin for
 * its rounding).
 */
export class MinkowskiLocator {
  private readonly euclid: SiteLocator;
  private readonly xy: Float64Array;
  private readonly off: Int32Array;
  private readonly adj: Int32Array;
  private readonly seen: Int32Array;
  private readonly heap = new SiteHeap(64);
  private stamp = 0;
  private readonly reach: number;

  constructor(tri: Triangulation, private readonly p: number) {
    this.euclid = new SiteLocator(tri);
    this.xy = tri.siteXY;
    ({ off: this.off, adj: this.adj } = adjacency(tri));
    this.seen = new Int32Array(tri.siteCount);
    this.reach = euclideanReach(p) * (1 + 2 ** -30);
  }

  nearest(x: number, y: number): number { return this.kNearest(x, y, 1)[0]; }

  kNearest(x: number, y: number, k: number): Int32Array {
    checkQuery(x, 'x');
    checkQuery(y, 'y');
    const n = this.seen.length;
    if (typeof k !== 'number' || !Number.isInteger(k) || k < 1 || k > n) {
      throw new InputError('bad-k', `k = ${String(k)} must be an integer in 1..${n}`, -1, 'k');
    }
    const xy = this.xy, p = this.p, heap = this.heap, seen = this.seen;
    const tag = ++this.stamp;
    const start = this.euclid.nearest(x, y);
    const best: number[] = [];
    const cmp = (a: number, b: number): number => compareLp(p, x, y, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]);
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
          limit = this.reach * lpLength(p, x - xy[2 * w], y - xy[2 * w + 1]) + 2 ** -1000;
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
