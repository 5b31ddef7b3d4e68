import { InputError } from '../core/errors.js';
import type { Triangulation } from '../triangulate/triangulation.js';
import { MIN_SPACING } from './dual.js';

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);

/**
 * The smallest distance two sites may be apart: MIN_SPACING times the
 * largest coordinate of the first n sites and the region, as the Euclidean
 * engine refuses (no bisector between closer sites can be placed in double
 * precision).
 */
export function spacingLimit(sites: Float64Array, n: number, region: Float64Array): { limit: number; magnitude: number } {
  let magnitude = 0;
  for (let i = 0; i < 2 * n; i++) magnitude = Math.max(magnitude, Math.abs(sites[i]));
  for (let i = 0; i < region.length; i++) magnitude = Math.max(magnitude, Math.abs(region[i]));
  return { limit: MIN_SPACING * magnitude, magnitude };
}

/**
 * Refuses sites closer than spacingLimit. The closest pair is a Delaunay
 * edge, so the triangulation's half-edges are scanned where it has them (no
 * edge list is made); the error names the pair by site. Only sites below
 * `n` count (default all): a triangulation of the sites followed by extra
 * ones (guards, far outside) is checked for its first n, which keep their
 * closest pair's edge, since the guards lie far outside its circle.
 */
export function checkSpacing(tri: Triangulation, region: Float64Array, n = tri.siteCount): void {
  const sites = tri.siteXY;
  const { limit, magnitude } = spacingLimit(sites, n, region);
  const layout = tri.implicitLayout();
  if (layout) {
    const { vert, xy } = layout, len = 3 * layout.real, rank = layout.siteOfRank;
    for (let e = 0; e < len; e++) {
      const a = vert[e], b = vert[nextOf(e)];
      const dx = xy[2 * a] - xy[2 * b], dy = xy[2 * a + 1] - xy[2 * b + 1];
      // Either difference past the limit settles it without the (slow) hypot.
      if (Math.abs(dx) >= limit || Math.abs(dy) >= limit) continue;
      const d = Math.hypot(dx, dy), sa = rank ? rank[a] : a, sb = rank ? rank[b] : b;
      if (d < limit && sa < n && sb < n) refuse(sa, sb, d, magnitude);
    }
    return;
  }
  const edges = tri.edges();
  for (let e = 0; e < edges.length; e += 2) {
    const a = edges[e], b = edges[e + 1];
    if (a >= n || b >= n) continue;
    const d = Math.hypot(sites[2 * a] - sites[2 * b], sites[2 * a + 1] - sites[2 * b + 1]);
    if (d < limit) refuse(a, b, d, magnitude);
  }
}

function refuse(a: number, b: number, d: number, magnitude: number): never {
  throw new InputError('too-close',
    `sites ${Math.min(a, b)} and ${Math.max(a, b)} are ${d} apart, closer than ${MIN_SPACING} times the largest coordinate (${magnitude}); ` +
    'no cell boundary can be placed between them in double precision', -1, 'points');
}
