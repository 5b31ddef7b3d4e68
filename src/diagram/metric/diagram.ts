import type { Triangulation } from '../../triangulate/triangulation.js';
import { ClippedCells } from '../cells.js';
import type { ExactMetric } from './bisector.js';
import { metricCells } from './build.js';
import { BestFirstLocator } from '../../query/best-first.js';
import { metricRanking } from './locate.js';

/**
 * The Voronoi diagram of sites under L1 (city block) or L-infinity
 * (chessboard) distance, clipped to a convex region: cells are star-shaped
 * polygons (bisectors bend, so a cell need not be convex), on one half-edge
 * mesh with the same conventions as VoronoiDiagram. A point belongs to the
 * site nearest in the metric; ties go to the Euclidean-nearer site, then
 * to the smaller by (x, then y), so cells partition the region whatever the
 * input order.
 */
export class MetricVoronoiDiagram extends ClippedCells {
  readonly metric: ExactMetric;
  private locator: BestFirstLocator | null = null;

  /** @internal Use {@link voronoi} with a metric option. */
  constructor(tri: Triangulation, region: Float64Array, metric: ExactMetric) {
    super(tri, region, metricCells(tri, region, metric));
    this.metric = metric;
  }

  private queries(): BestFirstLocator {
    return (this.locator ??= new BestFirstLocator(this.triangulation, metricRanking(this.metric)));
  }

  /** The site nearest to (x, y) in the metric, ties by the rule above. */
  nearest(x: number, y: number): number { return this.queries().nearest(x, y); }


  /** The k nearest sites in the metric, sorted by the rule above. */
  kNearest(x: number, y: number, k: number): Int32Array { return this.queries().kNearest(x, y, k); }
}
