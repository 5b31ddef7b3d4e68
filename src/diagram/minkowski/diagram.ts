import type { Triangulation } from '../../triangulate/triangulation.js';
import { ClippedCells } from '../cells.js';
import { ConvexRegion } from '../clip.js';
import { minkowskiCells } from './build.js';
import { BestFirstLocator } from '../../query/best-first.js';
import { lpRanking } from './locate.js';

/**
 * The default edge tolerance, relative to the mean spacing of the sites,
 * sqrt(region area / site count): a thousandth of a typical cell's width.
 * Relative to the spacing rather than to the region, so that every edge
 * gets about the same number of bends whatever the number of sites (a
 * region-relative 1e-6 took 20-27x the Euclidean diagram's time at 1e5
 * sites, against 7-9x for this; measured, see the README). Smaller values
 * cost bends as 1/sqrt(tolerance).
 */
export const DEFAULT_TOLERANCE = 1e-3;

/** The default tolerance for n sites in a region: DEFAULT_TOLERANCE times the mean spacing. */
export function defaultTolerance(region: Float64Array, n: number): number {
  return DEFAULT_TOLERANCE * Math.sqrt(new ConvexRegion(region).area() / Math.max(1, n));
}

/**
 * The Voronoi diagram of sites under a Minkowski p-norm, 1 < p < ∞ (p ≠ 2),
 * clipped to a convex region. Bisectors are curves: each edge is a polyline
 * (its bends are degree-2 vertices of the mesh) within `tolerance` of the
 * true curve, and vertices are the Lp centres of the Lp-Delaunay triangles.
 * Same mesh conventions as VoronoiDiagram. A point belongs to the site
 * nearest in the p-norm; ties go to the Euclidean-nearer site, then to the
 * smaller by (x, then y); p-distances are compared in floating point.
 */
export class MinkowskiVoronoiDiagram extends ClippedCells {
  /** The exponent p of the norm. */
  readonly metric: number;
  /** The largest Euclidean distance, by construction, of an edge's polyline from the true bisector. */
  readonly tolerance: number;
  private locator: BestFirstLocator | null = null;

  /** @internal Use {@link voronoi} with a numeric metric. */
  constructor(tri: Triangulation, region: Float64Array, p: number, tolerance?: number) {
    const tol = tolerance ?? defaultTolerance(region, tri.siteCount);
    super(tri, region, minkowskiCells(tri, region, p, tol));
    this.metric = p;
    this.tolerance = tol;
  }

  private queries(): BestFirstLocator {
    return (this.locator ??= new BestFirstLocator(this.triangulation, lpRanking(this.metric)));
  }

  /** The site nearest to (x, y) in the p-norm, ties by the rule above. */
  nearest(x: number, y: number): number { return this.queries().nearest(x, y); }


  /** The k nearest sites in the p-norm, sorted by the rule above. */
  kNearest(x: number, y: number, k: number): Int32Array { return this.queries().kNearest(x, y, k); }
}
