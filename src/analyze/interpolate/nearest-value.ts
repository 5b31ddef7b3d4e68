import type { PointInput } from '../../core/input.js';
import { SiteLocator } from '../../query/site-locator.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { readGrid, sampleX, sampleY, type GridSpec } from './grid.js';
import { checkCoordinate, readSites, type Interpolator } from './interpolator.js';
import { valuesBySite } from './values.js';

/**
 * Nearest-site interpolation: the value of the nearest site (ties to the
 * smallest site index, as SiteLocator), defined everywhere, also outside
 * the hull. Values: one per input point, as for naturalNeighbor.
 */
export function nearestValue(input: PointInput | Triangulation, values: ArrayLike<number>): Interpolator {
  const tri = readSites(input);
  const f = valuesBySite(tri, values);
  const locator = new SiteLocator(tri);
  return {
    at: (x, y) => f[locator.nearest(checkCoordinate(x, 'x'), checkCoordinate(y, 'y'))],
    grid: (spec: GridSpec) => {
      const g = readGrid(spec), q = new Float64Array(2 * g.columns * g.rows);
      for (let i = 0, k = 0; i < g.rows; i++) {
        const y = sampleY(g, i);
        for (let j = 0; j < g.columns; j++, k += 2) { q[k] = sampleX(g, j); q[k + 1] = y; }
      }
      const sites = locator.nearestMany(q), out = new Float64Array(sites.length);
      for (let k = 0; k < sites.length; k++) out[k] = f[sites[k]];
      return out;
    },
  };
}
