import { InputError } from '../../core/errors.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { MIN_SPACING } from '../dual.js';

/**
 * Refuses sites closer than MIN_SPACING times the largest coordinate (of the
 * sites and the region), as the other engines do: no bisector between them
 * can be placed in double precision. The closest pair is a Delaunay edge.
 */
export function checkSpacing(tri: Triangulation, region: Float64Array): void {
  const xy = tri.siteXY, edges = tri.edges();
  let magnitude = 0;
  for (let i = 0; i < 2 * tri.siteCount; i++) magnitude = Math.max(magnitude, Math.abs(xy[i]));
  for (let i = 0; i < region.length; i++) magnitude = Math.max(magnitude, Math.abs(region[i]));
  for (let e = 0; e < edges.length; e += 2) {
    const a = edges[e], b = edges[e + 1];
    const d = Math.hypot(xy[2 * a] - xy[2 * b], xy[2 * a + 1] - xy[2 * b + 1]);
    if (d < MIN_SPACING * magnitude) {
      throw new InputError('too-close',
        `sites ${a} and ${b} are ${d} apart, closer than ${MIN_SPACING} times the largest coordinate (${magnitude}); ` +
        'no cell boundary can be placed between them in double precision', -1, 'points');
    }
  }
}
