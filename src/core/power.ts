/**
 * Exact predicates for weighted sites (power distance |p - s|^2 - w).
 *
 * Lifting site (x, y, w) to (x, y, x^2 + y^2 - w) turns the regular
 * (weighted Delaunay) triangulation into the lower convex hull of the lifted
 * points (Aurenhammer 1987): a site d conflicts with triangle a, b, c when
 * its lifted point lies below their plane. Lifting rounds, so a floating
 * filter answers only when its error bound says the sign is right, and
 * integer arithmetic on the exact binary values of the doubles decides the
 * rest.
 */

import { bigSign, commonIntegers } from './exact.js';

/** Unit roundoff of binary64, u = 2^-53. */
const U = 2 ** -53;
/**
 * Relative bound of the power filter, 16u of the permanent. The usual
 * first-order count (each lifted entry carries at most 5u of its magnitude,
 * counting the rounded differences, squares, sums and the weight
 * subtraction; each 2x2 minor 5u; the products and the final sum 3u more)
 * gives 13u; 16u is slack on top. Derived here, not from a table.
 */
const POWER_REL = 16 * U;
/** Absolute slack that swallows underflow in the products. */
const ABS = 2 ** -1000;

/**
 * Largest |weight| accepted: weights have the units of squared coordinates,
 * and with |coordinate| <= 2^120 squared distances stay below 2^243; 2^240
 * keeps every product of the filter far below overflow.
 */
export const MAX_WEIGHT = 2 ** 240;
/** Smallest nonzero |weight| accepted, for the same reason at the other end. */
export const MIN_WEIGHT = 2 ** -240;

/**
 * The weighted in-circle test, exact: positive when d's lifted point lies
 * strictly below the plane through the lifted a, b, c (given counter-clockwise,
 * y-up), so that d conflicts with triangle a, b, c; negative above; zero when
 * the four lifted points are coplanar. With all weights equal its sign is
 * that of inCircle. Only the sign is meaningful.
 */
export function powerTest(
  ax: number, ay: number, aw: number, bx: number, by: number, bw: number,
  cx: number, cy: number, cw: number, dx: number, dy: number, dw: number,
): number {
  const adx = ax - dx, ady = ay - dy, bdx = bx - dx, bdy = by - dy, cdx = cx - dx, cdy = cy - dy;
  const aw0 = aw - dw, bw0 = bw - dw, cw0 = cw - dw;
  const al = adx * adx + ady * ady - aw0, bl = bdx * bdx + bdy * bdy - bw0, cl = cdx * cdx + cdy * cdy - cw0;
  const bc = bdx * cdy - cdx * bdy, ca = cdx * ady - adx * cdy, ab = adx * bdy - bdx * ady;
  const det = al * bc + bl * ca + cl * ab;
  const aL = adx * adx + ady * ady + Math.abs(aw0), bL = bdx * bdx + bdy * bdy + Math.abs(bw0), cL = cdx * cdx + cdy * cdy + Math.abs(cw0);
  const permanent = aL * (Math.abs(bdx * cdy) + Math.abs(cdx * bdy)) +
    bL * (Math.abs(cdx * ady) + Math.abs(adx * cdy)) + cL * (Math.abs(adx * bdy) + Math.abs(bdx * ady));
  const bound = POWER_REL * permanent + ABS;
  if (det > bound || -det > bound) return det;
  return powerTestExact(ax, ay, aw, bx, by, bw, cx, cy, cw, dx, dy, dw);
}

const coords = new Float64Array(8);
const weights = new Float64Array(4);
const X: bigint[] = [];
const W: bigint[] = [];

/** powerTest on exact integers; returns -1, 0 or 1. */
export function powerTestExact(
  ax: number, ay: number, aw: number, bx: number, by: number, bw: number,
  cx: number, cy: number, cw: number, dx: number, dy: number, dw: number,
): number {
  coords[0] = ax; coords[1] = ay; coords[2] = bx; coords[3] = by;
  coords[4] = cx; coords[5] = cy; coords[6] = dx; coords[7] = dy;
  weights[0] = aw; weights[1] = bw; weights[2] = cw; weights[3] = dw;
  // Coordinates are X * 2^E, weights W * 2^F; squared distances carry 2^(2E).
  const E = commonIntegers(coords, X);
  const F = commonIntegers(weights, W);
  const shiftSquares = BigInt(Math.max(0, 2 * E - F)), shiftWeights = BigInt(Math.max(0, F - 2 * E));
  const lift = (i: number): bigint => {
    const ddx = X[2 * i] - X[6], ddy = X[2 * i + 1] - X[7];
    return ((ddx * ddx + ddy * ddy) << shiftSquares) - ((W[i] - W[3]) << shiftWeights);
  };
  const adx = X[0] - X[6], ady = X[1] - X[7], bdx = X[2] - X[6], bdy = X[3] - X[7], cdx = X[4] - X[6], cdy = X[5] - X[7];
  const det = lift(0) * (bdx * cdy - cdx * bdy) + lift(1) * (cdx * ady - adx * cdy) + lift(2) * (adx * bdy - bdx * ady);
  return bigSign(det);
}

/**
 * Sign of (|q-a|^2 - wa) - (|q-b|^2 - wb), exactly: negative when a has the
 * smaller power distance to q, zero on a tie. The filter bound 8u of the
 * summed magnitudes covers the 5u of two squared distances (see
 * distance.ts) plus the two weight subtractions and the final one.
 */
export function comparePowerDistance(
  qx: number, qy: number, ax: number, ay: number, aw: number, bx: number, by: number, bw: number,
): number {
  const adx = qx - ax, ady = qy - ay, bdx = qx - bx, bdy = qy - by;
  const pa = adx * adx + ady * ady, pb = bdx * bdx + bdy * bdy;
  const d = (pa - aw) - (pb - bw);
  const bound = 8 * U * (pa + pb + Math.abs(aw) + Math.abs(bw)) + ABS;
  if (d > bound || -d > bound) return d;
  return comparePowerDistanceExact(qx, qy, ax, ay, aw, bx, by, bw);
}

const six = new Float64Array(6);
const two = new Float64Array(2);

/** comparePowerDistance on exact integers; returns -1, 0 or 1. */
export function comparePowerDistanceExact(
  qx: number, qy: number, ax: number, ay: number, aw: number, bx: number, by: number, bw: number,
): number {
  six[0] = qx; six[1] = qy; six[2] = ax; six[3] = ay; six[4] = bx; six[5] = by;
  two[0] = aw; two[1] = bw;
  const E = commonIntegers(six, X);
  const F = commonIntegers(two, W);
  const [Qx, Qy, Ax, Ay, Bx, By] = X;
  const squares = (Qx - Ax) ** 2n + (Qy - Ay) ** 2n - (Qx - Bx) ** 2n - (Qy - By) ** 2n;
  const wdiff = W[0] - W[1];
  const diff = (squares << BigInt(Math.max(0, 2 * E - F))) - (wdiff << BigInt(Math.max(0, F - 2 * E)));
  return bigSign(diff);
}

/**
 * For three collinear sites with b between a and c: positive when b's
 * lifted point lies strictly above the segment joining a's and c's (b is
 * then redundant in one dimension), zero on it, negative below. Exact; used
 * only for collinear input, so plain integer arithmetic.
 */
export function liftedAboveChord(
  ax: number, ay: number, aw: number, bx: number, by: number, bw: number, cx: number, cy: number, cw: number,
): number {
  coords[0] = ax; coords[1] = ay; coords[2] = bx; coords[3] = by; coords[4] = cx; coords[5] = cy;
  coords[6] = ax; coords[7] = ay;
  weights[0] = aw; weights[1] = bw; weights[2] = cw; weights[3] = aw;
  const E = commonIntegers(coords, X);
  const F = commonIntegers(weights, W);
  const shiftSquares = BigInt(Math.max(0, 2 * E - F)), shiftWeights = BigInt(Math.max(0, F - 2 * E));
  const lift = (i: number): bigint => ((X[2 * i] ** 2n + X[2 * i + 1] ** 2n) << shiftSquares) - (W[i] << shiftWeights);
  // Parameter along the line: x, or y for a vertical line.
  const k = X[0] !== X[4] ? 0 : 1;
  const ta = X[k], tb = X[2 + k], tc = X[4 + k];
  const above = lift(1) * (tc - ta) - lift(0) * (tc - tb) - lift(2) * (tb - ta);
  return bigSign(above) * bigSign(tc - ta);
}

/**
 * powerTest on sites a, b, c, d of `xyw`, interleaved x, y, weight: the
 * same filter and exact fallback, with the reads inside and each site's
 * three numbers side by side in memory, for the triangulation's hot loops.
 */
export function powerTestOf(xyw: Float64Array, a: number, b: number, c: number, d: number): number {
  const dx = xyw[3 * d], dy = xyw[3 * d + 1], dw = xyw[3 * d + 2];
  const adx = xyw[3 * a] - dx, ady = xyw[3 * a + 1] - dy, aw0 = xyw[3 * a + 2] - dw;
  const bdx = xyw[3 * b] - dx, bdy = xyw[3 * b + 1] - dy, bw0 = xyw[3 * b + 2] - dw;
  const cdx = xyw[3 * c] - dx, cdy = xyw[3 * c + 1] - dy, cw0 = xyw[3 * c + 2] - dw;
  const as = adx * adx + ady * ady, bs = bdx * bdx + bdy * bdy, cs = cdx * cdx + cdy * cdy;
  const bc = bdx * cdy - cdx * bdy, ca = cdx * ady - adx * cdy, ab = adx * bdy - bdx * ady;
  const det = (as - aw0) * bc + (bs - bw0) * ca + (cs - cw0) * ab;
  const permanent = (as + Math.abs(aw0)) * (Math.abs(bdx * cdy) + Math.abs(cdx * bdy)) +
    (bs + Math.abs(bw0)) * (Math.abs(cdx * ady) + Math.abs(adx * cdy)) + (cs + Math.abs(cw0)) * (Math.abs(adx * bdy) + Math.abs(bdx * ady));
  const bound = POWER_REL * permanent + ABS;
  if (det > bound || -det > bound) return det;
  return powerTestExact(xyw[3 * a], xyw[3 * a + 1], xyw[3 * a + 2], xyw[3 * b], xyw[3 * b + 1], xyw[3 * b + 2],
    xyw[3 * c], xyw[3 * c + 1], xyw[3 * c + 2], dx, dy, dw);
}
