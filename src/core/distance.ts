/**
 * Exact comparison of squared Euclidean distances: which of two sites is
 * closer to a query point. A floating-point filter decides almost every call;
 * near-ties and exact ties fall back to integer arithmetic on the exact
 * binary values of the doubles.
 */

import { commonIntegers } from './exact.js';

/** Unit roundoff of binary64, u = 2^-53. */
const U = 2 ** -53;
/** 5u, exact as a double. */
const FILTER_REL = 5 * U;
/** Absolute slack that swallows every underflow error (see the derivation below). */
const FILTER_ABS = 2 ** -1000;

/**
 * The query's squared distance to (ax, ay), rounded exactly the way the
 * filter of {@link compareKnownDistances} assumes: P = fl(fl(dx*dx) + fl(dy*dy))
 * with dx = fl(qx - ax), dy = fl(qy - ay).
 */
export function squaredDistance(qx: number, qy: number, ax: number, ay: number): number {
  const dx = qx - ax, dy = qy - ay;
  return dx * dx + dy * dy;
}

/*
 * Error bound of the filter (derived here; the model is the standard one,
 * fl(x op y) = (x op y)(1 + d), |d| <= u, plus an absolute error of at most
 * eta = 2^-1075 for a product that lands in the subnormal range).
 *
 * Let Ta = (qx-ax)^2 + (qy-ay)^2 and Tb likewise be the exact values, and
 * Pa, Pb the rounded ones computed by squaredDistance.
 *  1. dx = fl(qx - ax) = (qx - ax)(1 + d1). A difference of two doubles never
 *     suffers from underflow (a subnormal difference is exact).
 *  2. fl(dx*dx) = (qx-ax)^2 (1+d1)^2 (1+d2) + e, |e| <= eta.
 *  3. The sum of two such non-negative terms, rounded once more, gives
 *     Pa = Ta (1 + ta) + e', with |ta| <= g4 = (1+u)^4 - 1 <= 4u + 7u^2
 *     (each term carries at most four (1+d) factors; a weighted mean of
 *     non-negative terms keeps the worst relative error) and |e'| <= 2 eta (1+u).
 *  4. Hence |(Pa - Pb) - (Ta - Tb)| <= g4 (Ta + Tb) + 4 eta (1+u), and from 3,
 *     Ta + Tb <= (Pa + Pb + 4 eta (1+u)) / (1 - g4). Together
 *       E := |(Pa - Pb) - (Ta - Tb)| <= (4u + 28u^2) S + 8 eta,  S = Pa + Pb.
 *  5. Computed quantities: s = fl(Pa + Pb) >= S (1-u); the bound
 *     B = fl(fl(5u * s) + 2^-1000) >= (5u S (1-u)^2 - eta)(1-u) + 2^-1000 (1-u)
 *     (5u * s may underflow: the -eta); and d = fl(Pa - Pb) satisfies
 *     |d| <= |Pa - Pb| (1+u), sign(d) = sign(Pa - Pb) (round-to-nearest keeps
 *     signs, and fl(x - y) = 0 only when x = y).
 *  6. If |d| > B then |Pa - Pb| > B / (1+u) >= 5u (1-u)^3/(1+u) S + 2^-1001
 *     >= (5u - 20u^2) S + 2^-1001 > (4u + 28u^2) S + 8 eta >= E
 *     (u >= 48u^2, and 2^-1001 is far above 8 eta = 2^-1072). So Ta - Tb and
 *     Pa - Pb (and d) have the same sign, and the filter may answer.
 * Overflow cannot happen inside the accepted range: |coordinate| <= 2^120
 * keeps every difference below 2^121 and every square below 2^243.
 * The coefficient 5u over the 4u needed is deliberate slack (conservative).
 */

/**
 * Sign of |q-a|^2 - |q-b|^2 given Pa = squaredDistance(q, a) and
 * Pb = squaredDistance(q, b) already computed: lets a caller that keeps the
 * distance of its current best site avoid recomputing it. The sign is exact;
 * the magnitude is approximate (or -1, 0, 1 after the exact fallback).
 */
export function compareKnownDistances(
  qx: number, qy: number, ax: number, ay: number, bx: number, by: number, pa: number, pb: number,
): number {
  const d = pa - pb;
  const bound = FILTER_REL * (pa + pb) + FILTER_ABS;
  if (d > bound || -d > bound) return d;
  return compareDistanceExact(qx, qy, ax, ay, bx, by);
}

/**
 * Sign of |q-a|^2 - |q-b|^2, exactly: negative when a is strictly closer to
 * q, zero when a and b are exactly equally far, positive when b is closer.
 * Only the sign is meaningful. Exact for all finite doubles; fast (filtered)
 * inside ambit's accepted range.
 */
export function compareDistance(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const ax0 = qx - ax, ay0 = qy - ay, bx0 = qx - bx, by0 = qy - by;
  const pa = ax0 * ax0 + ay0 * ay0;
  const pb = bx0 * bx0 + by0 * by0;
  const d = pa - pb;
  const bound = FILTER_REL * (pa + pb) + FILTER_ABS;
  if (d > bound || -d > bound) return d;
  return compareDistanceExact(qx, qy, ax, ay, bx, by);
}

// Scratch for the six exact integers; the exact path is rare.
const ints: bigint[] = [0n, 0n, 0n, 0n, 0n, 0n];
const six = new Float64Array(6);

/**
 * The exact sign, on integers: every coordinate is m * 2^e; shifting all six
 * mantissas to the smallest exponent E gives integers X with x = X * 2^E, and
 * |q-a|^2 - |q-b|^2 = 2^(2E) [(Bx-Ax)(2Qx-Ax-Bx) + (By-Ay)(2Qy-Ay-By)].
 */
export function compareDistanceExact(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  if (!(Number.isFinite(qx) && Number.isFinite(qy) && Number.isFinite(ax) && Number.isFinite(ay) &&
        Number.isFinite(bx) && Number.isFinite(by))) {
    throw new RangeError('compareDistance needs finite coordinates');
  }
  six[0] = qx; six[1] = qy; six[2] = ax; six[3] = ay; six[4] = bx; six[5] = by;
  commonIntegers(six, ints);
  const [Qx, Qy, Ax, Ay, Bx, By] = ints;
  const D = (Bx - Ax) * (2n * Qx - Ax - Bx) + (By - Ay) * (2n * Qy - Ay - By);
  return D > 0n ? 1 : D < 0n ? -1 : 0;
}
