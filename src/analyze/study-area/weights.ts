import { InputError } from '../../core/errors.js';

/** Sum with Neumaier's compensation, so that shares divided by it add up to 1 within a few ulps. */
export function compensatedSum(values: ArrayLike<number>): number {
  let sum = 0, comp = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i], t = sum + v;
    comp += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
  }
  return sum + comp;
}

/**
 * Thiessen area weights: each site's clipped area over the clipped areas'
 * total (not over the area's shoelace size, which differs by rounding), so
 * that the shares add up to 1.
 */
export function areaShares(areas: Float64Array): Float64Array {
  const total = compensatedSum(areas);
  return areas.map((a) => a / total);
}

/**
 * The share-weighted mean of one value per site (the Thiessen areal
 * average). Every value must be a finite number, also at sites whose share
 * is 0: a missing reading is an error, not a silent zero.
 */
export function weightedMean(shares: Float64Array, values: ArrayLike<number>): number {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw new InputError('bad-option', 'values must be an array of numbers, one per site', -1, 'values');
  }
  if (values.length !== shares.length) {
    throw new InputError('bad-length', `values has length ${values.length}, expected one per site (${shares.length})`, -1, 'values');
  }
  const terms = new Float64Array(shares.length);
  for (let i = 0; i < shares.length; i++) {
    const v = values[i] as unknown;
    if (typeof v !== 'number') throw new InputError('not-a-number', `values[${i}] is ${v === null ? 'null' : typeof v}, expected a number`, i, 'values');
    if (!Number.isFinite(v)) throw new InputError('not-finite', `values[${i}] is ${v}; values must be finite`, i, 'values');
    terms[i] = shares[i] * v;
  }
  return compensatedSum(terms);
}
