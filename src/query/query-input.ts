import { InputError } from '../core/errors.js';
import { MAX_COORDINATE } from '../core/limits.js';

/** A query coordinate: a finite number of magnitude at most 2^120 (tiny values are fine). */
export function checkQuery(v: unknown, index: number, field: 'x' | 'y'): number {
  // A single query (index -1) has no place in a list to name.
  const which = index < 0 ? 'query point' : `query ${index}`;
  if (typeof v !== 'number') {
    throw new InputError('not-a-number', `${which}: ${field} is ${v === null ? 'null' : typeof v}, expected a number`, index, field);
  }
  if (!Number.isFinite(v)) {
    throw new InputError('not-finite', `${which}: ${field} is ${v}, coordinates must be finite`, index, field);
  }
  if (Math.abs(v) > MAX_COORDINATE) {
    throw new InputError('out-of-range', `${which}: ${field} = ${v} is beyond 2^120 in magnitude`, index, field);
  }
  return v;
}

/** The k of a k-nearest query: an integer in 1..n. */
export function checkK(k: unknown, n: number): number {
  if (typeof k !== 'number' || !Number.isInteger(k) || k < 1 || k > n) {
    throw new InputError('bad-k', `k = ${String(k)} must be an integer in 1..${n}`, -1, 'k');
  }
  return k;
}
