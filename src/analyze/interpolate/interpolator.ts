import { InputError } from '../../core/errors.js';
import type { PointInput } from '../../core/input.js';
import { Triangulation, triangulate } from '../../triangulate/triangulation.js';
import type { GridSpec } from './grid.js';

/** Values at sites, interpolated anywhere. A snapshot: points inserted into the triangulation later are not seen. */
export interface Interpolator {
  /** The value at (x, y); NaN where the interpolant is not defined (see each kind). */
  at(x: number, y: number): number;
  /**
   * The value at every sample of a regular grid: samples at cell centres,
   * x = minX + (j + 0.5) * ((maxX - minX) / columns), y likewise; row-major,
   * row 0 at minY. Equal, number for number, to at() at those points.
   */
  grid(spec: GridSpec): Float64Array;
}

/** The triangulation to interpolate over: the one given, or one built from the points. Weighted ones are refused. */
export function readSites(input: PointInput | Triangulation): Triangulation {
  const tri = input instanceof Triangulation ? input : triangulate(input);
  if (tri.weights !== null) {
    throw new InputError('bad-option', 'interpolation works on unweighted sites; build the triangulation without weights', -1, 'weights');
  }
  return tri;
}

/** A query coordinate: a finite number. */
export function checkCoordinate(v: unknown, field: 'x' | 'y'): number {
  if (typeof v !== 'number') throw new InputError('not-a-number', `query ${field} is ${v === null ? 'null' : typeof v}, expected a number`, -1, field);
  if (!Number.isFinite(v)) throw new InputError('not-finite', `query ${field} is ${v}; it must be finite`, -1, field);
  return v;
}
