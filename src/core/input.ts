import { InputError } from './errors.js';
import { MAX_COORDINATE, MIN_COORDINATE } from './limits.js';
import { MAX_WEIGHT, MIN_WEIGHT } from './power.js';

/** A point as an object; `w`, a weight, is read only by weighted builds. */
export interface XY { x: number; y: number; w?: number }

/**
 * Points in any of the three accepted layouts: an interleaved flat array
 * `[x0, y0, x1, y1, ...]` (plain or Float64Array), an array of `[x, y]`
 * pairs, or an array of `{x, y}` objects.
 */
export type PointInput = Float64Array | ArrayLike<number> | ReadonlyArray<readonly [number, number]> |
  ReadonlyArray<readonly [number, number, number]> | ReadonlyArray<XY>;

function checkCoordinate(v: unknown, index: number, field: 'x' | 'y'): number {
  if (typeof v !== 'number') {
    throw new InputError('not-a-number', `point ${index}: ${field} is ${v === null ? 'null' : typeof v}, expected a number`, index, field);
  }
  if (!Number.isFinite(v)) {
    throw new InputError('not-finite', `point ${index}: ${field} is ${v}, coordinates must be finite`, index, field);
  }
  const a = Math.abs(v);
  if (a > MAX_COORDINATE || (a !== 0 && a < MIN_COORDINATE)) {
    throw new InputError(
      'out-of-range',
      `point ${index}: ${field} = ${v} is outside the exact range (0 or 2^-120 <= |v| <= 2^120)`,
      index, field,
    );
  }
  // -0 becomes 0 so that equal points are equal bit for bit.
  return v + 0;
}

/**
 * Validates points in any accepted layout and returns them interleaved in a
 * fresh Float64Array. Throws InputError naming the first bad point.
 */
export function readPoints(points: PointInput, allowEmpty = false): Float64Array {
  if (points === null || typeof points !== 'object' || typeof (points as ArrayLike<unknown>).length !== 'number') {
    throw new InputError('bad-points', 'points must be an array or a Float64Array', -1, 'points');
  }
  const list = points as ArrayLike<unknown>;
  const len = list.length;
  if (len === 0) {
    if (allowEmpty) return new Float64Array(0);
    throw new InputError('empty', 'no points given', -1, 'points');
  }
  const first = list[0];
  if (ArrayBuffer.isView(points) || typeof first === 'number' || first === null || first === undefined ||
      typeof first === 'string' || typeof first === 'boolean') {
    if (len % 2 !== 0) {
      throw new InputError('odd-length', `flat point array has odd length ${len}; expected x, y pairs`, Math.floor(len / 2), 'points');
    }
    const out = new Float64Array(len);
    for (let i = 0; i < len; i += 2) {
      out[i] = checkCoordinate(list[i], i >> 1, 'x');
      out[i + 1] = checkCoordinate(list[i + 1], i >> 1, 'y');
    }
    return out;
  }
  const out = new Float64Array(2 * len);
  for (let i = 0; i < len; i++) {
    const p = list[i] as unknown;
    if (Array.isArray(p)) {
      if (p.length !== 2 && p.length !== 3) {
        throw new InputError('bad-point', `point ${i}: expected [x, y] or [x, y, w], got an array of length ${p.length}`, i, 'points');
      }
      out[2 * i] = checkCoordinate(p[0], i, 'x');
      out[2 * i + 1] = checkCoordinate(p[1], i, 'y');
    } else if (p !== null && typeof p === 'object') {
      out[2 * i] = checkCoordinate((p as XY).x, i, 'x');
      out[2 * i + 1] = checkCoordinate((p as XY).y, i, 'y');
    } else {
      throw new InputError('bad-point', `point ${i}: expected [x, y] or {x, y}, got ${p === null ? 'null' : typeof p}`, i, 'points');
    }
  }
  return out;
}

function checkWeight(v: unknown, index: number): number {
  if (typeof v !== 'number') {
    throw new InputError('not-a-number', `point ${index}: weight is ${v === null ? 'null' : typeof v}, expected a number`, index, 'w');
  }
  if (!Number.isFinite(v)) {
    throw new InputError('not-finite', `point ${index}: weight is ${v}, weights must be finite`, index, 'w');
  }
  const a = Math.abs(v);
  if (a > MAX_WEIGHT || (a !== 0 && a < MIN_WEIGHT)) {
    throw new InputError('out-of-range', `point ${index}: weight ${v} is outside the exact range (0 or 2^-240 <= |w| <= 2^240)`, index, 'w');
  }
  return v + 0;
}

/** Whether the points carry weights: [x, y, w] triples or {x, y, w} objects (judged by the first point). */
export function carriesWeights(points: PointInput): boolean {
  if (points === null || typeof points !== 'object' || ArrayBuffer.isView(points)) return false;
  const first = (points as ArrayLike<unknown>).length > 0 ? (points as ArrayLike<unknown>)[0] : undefined;
  return first !== null && typeof first === 'object' &&
    (Array.isArray(first) ? first.length === 3 : (first as XY).w !== undefined);
}

/**
 * The weights of points: from `weights` (one per point) when given, else
 * from the points themselves ([x, y, w] triples or {x, y, w} objects), else
 * null. Weights in both places, or in only some points, are an InputError.
 */
export function readWeights(points: PointInput, weights: ArrayLike<number> | undefined, count: number): Float64Array | null {
  const list = points as ArrayLike<unknown>;
  const carried = carriesWeights(points);
  if (weights !== undefined) {
    if (carried) throw new InputError('bad-option', 'weights given twice: in the points and as the weights option', 0, 'weights');
    if (weights === null || typeof weights !== 'object' || typeof weights.length !== 'number') {
      throw new InputError('bad-option', 'weights must be an array of numbers', -1, 'weights');
    }
    if (weights.length !== count) {
      throw new InputError('bad-option', `weights has length ${weights.length}, expected one per point (${count})`, -1, 'weights');
    }
    const out = new Float64Array(count);
    for (let i = 0; i < count; i++) out[i] = checkWeight(weights[i], i);
    return out;
  }
  if (!carried) {
    for (let i = 1; i < list.length; i++) {
      const p = list[i] as unknown;
      if (p !== null && typeof p === 'object' && (Array.isArray(p) ? p.length === 3 : (p as XY).w !== undefined)) {
        throw new InputError('bad-point', `point ${i} has a weight but point 0 has none: give every point one, or none`, i, 'w');
      }
    }
    return null;
  }
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const p = list[i] as unknown;
    const w = Array.isArray(p) ? (p.length === 3 ? p[2] : undefined) : (p as XY).w;
    if (w === undefined) throw new InputError('bad-point', `point ${i} has no weight but point 0 has one: give every point one, or none`, i, 'w');
    out[i] = checkWeight(w, i);
  }
  return out;
}
