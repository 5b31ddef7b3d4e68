import { InputError } from '../core/errors.js';
import type { Triangulation } from '../triangulate/triangulation.js';
import { MIN_SPACING } from './dual.js';

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);

/**
 * Refuses sites closer than MIN_SPACING times the largest coordinate (of the
 * sites and the region), as the Euclidean engine does: no bisector between
 * them can be placed in double precision. The closest pair is a Delaunay
 * edge, so the triangulation's half-edges are scanned where it has them (no
 * edge list is made); the error names the pair by input site.
 */
export function checkSpacing(tri: Triangulation, region: Float64Array): void {
  let magnitude = 0;
  const sites = tri.siteXY;
  for (let i = 0; i < 2 * tri.siteCount; i++) magnitude = Math.max(magnitude, Math.abs(sites[i]));
  for (let i = 0; i < region.length; i++) magnitude = Math.max(magnitude, Math.abs(region[i]));
  const limit = MIN_SPACING * magnitude;
  const layout = tri.implicitLayout();
  if (layout) {
    const { vert, xy } = layout, len = 3 * layout.real;
    for (let e = 0; e < len; e++) {
      const a = vert[e], b = vert[nextOf(e)];
      const dx = xy[2 * a] - xy[2 * b], dy = xy[2 * a + 1] - xy[2 * b + 1];
      // Either difference past the limit settles it without the (slow) hypot.
      if (Math.abs(dx) >= limit || Math.abs(dy) >= limit) continue;
      const d = Math.hypot(dx, dy);
      if (d < limit) {
        const rank = layout.siteOfRank;
        refuse(rank ? rank[a] : a, rank ? rank[b] : b, d, magnitude);
      }
    }
    return;
  }
  const edges = tri.edges();
  for (let e = 0; e < edges.length; e += 2) {
    const a = edges[e], b = edges[e + 1];
    const d = Math.hypot(sites[2 * a] - sites[2 * b], sites[2 * a + 1] - sites[2 * b + 1]);
    if (d < limit) refuse(a, b, d, magnitude);
  }
}

function refuse(a: number, b: number, d: number, magnitude: number): never {
  throw new InputError('too-close',
    `sites ${Math.min(a, b)} and ${Math.max(a, b)} are ${d} apart, closer than ${MIN_SPACING} times the largest coordinate (${magnitude}); ` +
    'no cell boundary can be placed between them in double precision', -1, 'points');
}
