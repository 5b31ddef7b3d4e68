import { InputError } from '../core/errors.js';
import { carriesWeights, readPoints, type PointInput } from '../core/input.js';
import { SiteLocator } from '../query/site-locator.js';
import { deferredTriangulation, Triangulation, triangulate } from '../triangulate/triangulation.js';
import { ClippedCells } from './cells.js';
import { clippedVoronoi } from './dual.js';
import { sweepPoints, sweepTriangulation } from './sweep/sweep.js';
import { paddedBounds, readClipRegion, type ClipRegion } from './region.js';
import { MetricVoronoiDiagram } from './metric/diagram.js';
import { readMetric, type Metric } from './metric/options.js';
import { MinkowskiVoronoiDiagram } from './minkowski/diagram.js';
import { checkOptionNames } from '../core/options.js';

export interface VoronoiOptions {
  /**
   * The region cells are clipped to: a rectangle or a convex polygon (either
   * orientation). Default: the sites' bounding box padded by 10% of its
   * larger side on every side.
   */
  clip?: ClipRegion;
  /**
   * How the Delaunay topology behind the diagram is built: 'dual'
   * (default, measured faster: see the README) triangulates incrementally;
   * 'sweep' runs Fortune's sweep line. Both are exact and give the same
   * diagram; clipping and vertex merging are shared.
   */
  method?: VoronoiMethod;
  /**
   * The distance cells are built for: 'L2' (Euclidean, default), 'L1',
   * 'Linf', or p >= 1 (1, 2 and Infinity route to the exact engines; see
   * MetricVoronoiDiagram). 'L1' and 'Linf' return a MetricVoronoiDiagram,
   * any other p a MinkowskiVoronoiDiagram (curved edges, see `tolerance`).
   */
  metric?: Metric;
  /**
   * For Minkowski metrics with curved bisectors: the largest Euclidean
   * distance an edge's polyline may stray from the true curve. Must be
   * positive. Default: 1e-3 of the sites' mean spacing, sqrt(region area / site count).
   */
  tolerance?: number;
  /**
   * One weight per input point: the power diagram, cells by least
   * |p - s|^2 - w (weights may also come inside the points, as for
   * triangulate). Euclidean, dual construction only. To reuse a weighted
   * triangulation, pass it instead.
   */
  weights?: ArrayLike<number>;
}

/** The constructions {@link voronoi} can use. */
export type VoronoiMethod = 'dual' | 'sweep';

export type { CellNeighbors } from './cells.js';

/**
 * The Voronoi diagram of a set of sites, clipped to a convex region: every
 * cell a finite convex polygon, all of them on one half-edge mesh.
 */
export class VoronoiDiagram extends ClippedCells {
  private locator: SiteLocator | null = null;

  /** @internal Use {@link voronoi}. */
  constructor(tri: Triangulation, region: Float64Array) {
    super(tri, region, clippedVoronoi(tri, region));
  }

  private queries(): SiteLocator {
    return (this.locator ??= new SiteLocator(this.triangulation));
  }

  /** The site nearest to (x, y); ties go to the smallest site index. */
  nearest(x: number, y: number): number { return this.queries().nearest(x, y); }
  /** nearest() for many points (interleaved x, y), answered along a space-filling curve. */
  override nearestMany(xy: Float64Array | ArrayLike<number>): Int32Array { return this.queries().nearestMany(xy); }
  /** The k nearest sites by (distance, site index). */
  kNearest(x: number, y: number, k: number): Int32Array { return this.queries().kNearest(x, y, k); }
}

/**
 * The Voronoi diagram of points (or of an existing triangulation's sites),
 * clipped to a convex region. Throws InputError on invalid points, region
 * or method. With a Triangulation and method 'sweep', the sweep rebuilds the
 * topology from its sites, keeping their numbering.
 */
export function voronoi(input: PointInput | Triangulation, options?: VoronoiOptions & { metric?: 'L2' | 2 }): VoronoiDiagram;
export function voronoi(input: PointInput | Triangulation, options: VoronoiOptions): VoronoiDiagram | MetricVoronoiDiagram | MinkowskiVoronoiDiagram;
export function voronoi(input: PointInput | Triangulation, options: VoronoiOptions = {}): VoronoiDiagram | MetricVoronoiDiagram | MinkowskiVoronoiDiagram {
  checkOptionNames(options, ['clip', 'method', 'metric', 'tolerance', 'weights'], 'voronoi');
  const method = options.method === undefined ? 'dual' : options.method;
  if (method !== 'dual' && method !== 'sweep') {
    throw new InputError('bad-option', `method must be 'dual' or 'sweep', got ${String(method)}`, -1, 'method');
  }
  const metric = readMetric(options.metric, options.tolerance);
  const weighted = input instanceof Triangulation
    ? input.weights !== null
    : options.weights !== undefined || carriesWeights(input);
  if (input instanceof Triangulation && options.weights !== undefined) {
    throw new InputError('bad-option', 'weights belong to the triangulation: build it with them, or pass the points', -1, 'weights');
  }
  if (weighted && (metric !== 'L2' || options.method === 'sweep')) {
    throw new InputError('bad-option', 'weighted sites (power diagrams) need the Euclidean metric and the dual construction', -1, 'weights');
  }
  if (metric !== 'L2' && options.method !== undefined && options.method !== 'dual') {
    throw new InputError('bad-option', `method '${String(options.method)}' builds Euclidean diagrams only; metric ${String(options.metric)} has its own engine`, -1, 'method');
  }
  if (metric !== 'L2') {
    // The metric engines build their own triangulations: the Euclidean one is made only if asked for.
    const tri = input instanceof Triangulation ? input : deferredTriangulation(input);
    const region = options.clip === undefined ? paddedBounds(tri.siteXY, tri.siteCount) : readClipRegion(options.clip);
    if (typeof metric === 'number') return new MinkowskiVoronoiDiagram(tri, region, metric, options.tolerance);
    return new MetricVoronoiDiagram(tri, region, metric);
  }
  let tri: Triangulation;
  if (method === 'dual') tri = input instanceof Triangulation ? input : triangulate(input, { weights: options.weights });
  else if (input instanceof Triangulation) tri = sweepTriangulation(input.siteXY, input.siteCount, input.siteOfInput);
  else tri = sweepPoints(readPoints(input));
  const region = options.clip === undefined ? paddedBounds(tri.rankCoordinates(), tri.siteCount) : readClipRegion(options.clip);
  return new VoronoiDiagram(tri, region);
}
