import type { Triangulation } from '../triangulate/triangulation.js';
import { adjacency } from '../diagram/metric/graph.js';
import { SiteHeap } from '../diagram/metric/heap.js';
import { checkK, checkQuery } from './query-input.js';
import { SiteLocator } from './site-locator.js';

/** How a metric other than the Euclidean ranks sites seen from a query point. */
export interface SiteRanking {
  /** Sign of rank(q, a) − rank(q, b): the metric distance first, then the metric's tie rule. */
  compare(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number;
  /** The metric distance from q to a, rounded: used only for the bound that stops the search. */
  distance(qx: number, qy: number, ax: number, ay: number): number;
  /** c with |q − a| ≤ c · distance(q, a) for all q, a, with room for the rounding of `distance`. */
  readonly reach: number;
}

/**
 * Nearest sites under any metric whose balls are convex and centrally
 * symmetric: best-first search over the Euclidean Delaunay graph from the
 * Euclidean nearest site, in order of Euclidean distance. The k
 * Euclidean-nearest sites are connected in that graph (a property of
 * order-k Voronoi diagrams, from memory), and a site at metric distance r
 * lies within Euclidean distance c r, so the search stops once the next
 * site is farther than c times the k-th best metric distance.
 */
export class BestFirstLocator {
  private readonly euclid: SiteLocator;
  private readonly xy: Float64Array;
  private readonly off: Int32Array;
  private readonly adj: Int32Array;
  private readonly seen: Int32Array;
  private readonly heap = new SiteHeap(64);
  private stamp = 0;

  constructor(tri: Triangulation, private readonly ranking: SiteRanking) {
    this.euclid = new SiteLocator(tri);
    this.xy = tri.siteXY;
    ({ off: this.off, adj: this.adj } = adjacency(tri));
    this.seen = new Int32Array(tri.siteCount);
  }

  nearest(x: number, y: number): number { return this.kNearest(x, y, 1)[0]; }

  kNearest(x: number, y: number, k: number): Int32Array {
    checkQuery(x, -1, 'x');
    checkQuery(y, -1, 'y');
    checkK(k, this.seen.length);
    const xy = this.xy, ranking = this.ranking, heap = this.heap, seen = this.seen;
    const tag = ++this.stamp;
    const start = this.euclid.nearest(x, y);
    const best: number[] = [];
    const cmp = (a: number, b: number): number => ranking.compare(x, y, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]);
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
          // The tiny absolute term keeps a zero distance (a query on a site) from stopping before ties are seen.
          limit = ranking.reach * ranking.distance(x, y, xy[2 * w], xy[2 * w + 1]) + 2 ** -1000;
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
