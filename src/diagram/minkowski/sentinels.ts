import type { ConvexRegion } from '../clip.js';
import { triangulate, type Triangulation } from '../../triangulate/triangulation.js';
import { length } from '../../core/length.js';

/** How many guard sites ring the input. */
export const GUARDS = 8;

/**
 * The sites with GUARDS extra sites on a wide circle around them and the
 * region, triangulated (Euclidean, exact). Returns the triangulation and,
 * per site of it, the input site it is (-1 for a guard).
 *
 * Why: with every real site inside the guards' hull, no Lp-Delaunay triangle
 * of real sites needs an Lp circle larger than the guard circle, so their
 * centres stay at a computable distance. Without guards, near-flat hull
 * triangles have centres that for p near 1 lie astronomically far (the Lp
 * circle must bend around them with its nearly sharp axis points), beyond
 * what doubles can order, and the flips near the hull went wrong. It also
 * makes collinear input and one or two sites ordinary two-dimensional cases.
 *
 * Guard cells never reach the region (derived here): a region point q has a
 * site within Euclidean distance R + S (R the region's radius, S the sites'
 * largest distance from the region's centre), so within p-distance
 * sqrt 2 (R + S); a guard at radius G = 4 (R + S) from the centre is at
 * Euclidean distance >= G - R from q, so at p-distance >= (G - R) / sqrt 2,
 * which is larger (any p-norm lies between 1/sqrt 2 and sqrt 2 times the
 * Euclidean one). The angles are offset so that the guards are not
 * symmetric under the norm's own symmetries (no co-circular guards).
 */
export function guardedTriangulation(tri: Triangulation, region: ConvexRegion): { tri: Triangulation; inputOf: Int32Array } {
  const n = tri.siteCount;
  const big = triangulate(withGuards(tri.siteXY, n, region));
  const inputOf = new Int32Array(big.siteCount).fill(-1);
  for (let i = 0; i < n; i++) inputOf[big.siteOfInput[i]] = i;
  return { tri: big, inputOf };
}

/** The n sites of xy (interleaved) followed by GUARDS guard sites, placed as guardedTriangulation explains. */
export function withGuards(xy: Float64Array, n: number, region: ConvexRegion): Float64Array {
  const all = new Float64Array(2 * (n + GUARDS));
  all.set(xy.subarray(0, 2 * n));
  placeGuards(all, n, region);
  return all;
}

/** Writes the GUARDS guard sites after the n sites of `all` (interleaved, room for n + GUARDS). */
export function placeGuards(all: Float64Array, n: number, region: ConvexRegion): void {
  let spread = 0;
  for (let i = 0; i < n; i++) spread = Math.max(spread, length(all[2 * i] - region.cx, all[2 * i + 1] - region.cy));
  const G = 4 * (region.radius + spread);
  for (let k = 0; k < GUARDS; k++) {
    const angle = 0.3 + (2 * Math.PI * k) / GUARDS + 0.01 * k * k;
    all[2 * (n + k)] = region.cx + G * Math.cos(angle);
    all[2 * (n + k) + 1] = region.cy + G * Math.sin(angle);
  }
}
