import { InputError } from '../../core/errors.js';
import type { Triangulation } from '../../triangulate/triangulation.js';

/**
 * One value per site from one value per input point (the points the
 * triangulation was built from, `tri.inputCount` of them): points merged
 * onto one site must carry the same value. InputError `bad-option` (not an
 * array), `bad-length`, `not-finite` or `conflicting-values` (a merged point
 * whose value differs from the first point of its site), field 'values',
 * index the offending point.
 */
export function valuesBySite(tri: Triangulation, values: ArrayLike<number>): Float64Array {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw new InputError('bad-option', 'values must be an array of numbers, one per input point', -1, 'values');
  }
  const m = tri.inputCount;
  if (values.length !== m) {
    throw new InputError('bad-length', `values has length ${values.length}, expected one per input point (${m})`, -1, 'values');
  }
  const soi = tri.siteOfInput, out = new Float64Array(tri.siteCount), from = new Int32Array(tri.siteCount).fill(-1);
  for (let i = 0; i < m; i++) {
    const v = values[i];
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new InputError('not-finite', `values[${i}] is ${String(v)}; values must be finite numbers`, i, 'values');
    }
    const s = soi[i];
    if (from[s] < 0) { from[s] = i; out[s] = v; continue; }
    if (out[s] !== v) {
      throw new InputError('conflicting-values',
        `point ${i} is merged onto the same site as point ${from[s]} but carries ${v}, not ${out[s]}`, i, 'values');
    }
  }
  return out;
}
