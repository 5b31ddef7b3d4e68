/**
 * The sweep's two kinds of geometric decision, each exact: where a new site
 * lies relative to a breakpoint of the beach line, and the order of events
 * (a site, or the top of the circle through three sites). Every decision
 * first tries a floating-point filter with a proven error bound and falls
 * back to integer arithmetic on the exact binary values of the doubles
 * (src/core/exact.ts) when the filter cannot answer.
 *
 * The sweep line is horizontal and moves up (increasing y). A site s below
 * the line y = L has the parabola of points as far from s as from the line;
 * the beach line is their upper envelope.
 */
import { bigSign, commonIntegers } from '../../core/exact.js';
import { exactBegin, exactOk, xAdd, xMul, xSub } from '../../core/exact-double.js';
import { orient } from '../../core/predicates.js';

/** Unit roundoff of binary64. */
const U = 2 ** -53;

// ---------------------------------------------------------------------------
// Breakpoints
//
// Let q be the new site (the line is at L = qy), and a, b the sites of two
// neighbouring arcs, a on the left. With A = a - q and B = b - q,
//   F = By |A|^2 - Ay |B|^2  =  2 (L - ay)(L - by) (ya(qx) - yb(qx))
// where ys is the parabola of s: F > 0 when a's parabola is the higher one
// above q. F, as a function of qx, is a quadratic with leading coefficient
// by - ay and derivative 2G, G = Ay Bx - Ax By. The breakpoint (a left of b)
// is the root where F falls (a on top just left of it, b just right):
//   by > ay: the smaller root, so q is left of it iff F > 0 and G < 0;
//   by < ay: the larger root, so q is left of it iff F > 0 or G > 0;
//   by = ay: F is linear and falling, q is left iff F > 0.
// q is on the breakpoint iff F = 0 and G < 0 (F falls there). A site on
// the line (ay = L) has a degenerate parabola, the vertical ray above it;
// the rules hold for it too (checked by hand in tests/unit/sweep.test.ts),
// as long as a and b are not both on the line, which the sweep never asks.
//
// Filter. Each of t1 = By (Ax^2 + Ay^2) and t2 = Ay (Bx^2 + By^2) is computed
// with at most six roundings in a product-and-sum chain (the differences,
// the squares, the sum, the product), so |t_computed - t| <= g6 |t| with
// g6 = 6u / (1 - 6u) (Higham, Accuracy and Stability of Numerical
// Algorithms, Lemma 3.1; from memory). Then
//   |F_computed - F| <= u |t1c - t2c| + g6 / (1 - g6) (|t1c| + |t2c|)
//                    <= 7.01u (|t1c| + |t2c|),
// and the bound used, fl(8u fl(|t1c| + |t2c|)) >= 8u (1 - u)^2 (...), is
// larger. Likewise G (three roundings per product) with 5u over the 4.01u
// needed. No underflow: every nonzero coordinate difference of accepted
// input is at least 2^-172, so a product of three is above 2^-516.
// ---------------------------------------------------------------------------

const F_REL = 8 * U;
const G_REL = 5 * U;

const six = new Float64Array(6);
const ints: bigint[] = [];

/** a - q and b - q as exact integers (all scaled by one power of two, which no sign below sees). */
function exactDifferences(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): bigint[] {
  six[0] = qx; six[1] = qy; six[2] = ax; six[3] = ay; six[4] = bx; six[5] = by;
  commonIntegers(six, ints);
  return [ints[2] - ints[0], ints[3] - ints[1], ints[4] - ints[0], ints[5] - ints[1]];
}

/** Sign of F, exactly. */
function fSign(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const Ax = ax - qx, Ay = ay - qy, Bx = bx - qx, By = by - qy;
  const t1 = By * (Ax * Ax + Ay * Ay), t2 = Ay * (Bx * Bx + By * By);
  const f = t1 - t2;
  const bound = F_REL * (Math.abs(t1) + Math.abs(t2));
  if (f > bound) return 1;
  if (-f > bound) return -1;
  const [ex, ey, fx, fy] = exactDifferences(qx, qy, ax, ay, bx, by);
  return bigSign(fy * (ex * ex + ey * ey) - ey * (fx * fx + fy * fy));
}

/** Sign of G, exactly. */
function gSign(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const Ax = ax - qx, Ay = ay - qy, Bx = bx - qx, By = by - qy;
  const p1 = Ay * Bx, p2 = Ax * By;
  const g = p1 - p2;
  const bound = G_REL * (Math.abs(p1) + Math.abs(p2));
  if (g > bound) return 1;
  if (-g > bound) return -1;
  const [ex, ey, fx, fy] = exactDifferences(qx, qy, ax, ay, bx, by);
  return bigSign(ey * fx - ex * fy);
}

/**
 * Where q lies relative to the breakpoint between the arcs of a (left) and
 * b (right) when the sweep line passes through q: -1 left of it, 0 exactly
 * below it, 1 right of it. Exact.
 */
export function breakpointSide(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  const f = fSign(qx, qy, ax, ay, bx, by);
  if (by > ay) {
    if (f <= 0) return f === 0 && gSign(qx, qy, ax, ay, bx, by) < 0 ? 0 : 1;
    return gSign(qx, qy, ax, ay, bx, by) < 0 ? -1 : 1;
  }
  if (by === ay) return f === 0 ? 0 : -f;
  if (f > 0) return -1;
  const g = gSign(qx, qy, ax, ay, bx, by);
  if (g > 0) return -1;
  return f === 0 && g < 0 ? 0 : 1;
}

// ---------------------------------------------------------------------------
// Circle events
//
// For counter-clockwise sites a, b, c (in beach-line order left, middle,
// right) the middle arc vanishes when the line reaches the top of their
// circle. Relative to a, with b' = b - a, c' = c - a:
//   D = 2 (b'x c'y - b'y c'x)  (> 0),
//   Nx = c'y |b'|^2 - b'y |c'|^2,  Ny = b'x |c'|^2 - c'x |b'|^2,
//   centre = a + (Nx, Ny) / D,  radius = sqrt(Nx^2 + Ny^2) / D,
//   key    = ay + (Ny + sqrt(Nx^2 + Ny^2)) / D   (the top's y),
//   x      = ax + Nx / D                         (the top's x).
//
// Filter. The numerators and the denominator are polynomials in the site
// coordinates; evaluated in floating point, each of their terms carries at
// most k roundings (a coordinate difference, squares, sums, a product, the
// final difference), so the computed value is within g_k = ku / (1 - ku)
// times the sum of the terms' absolute values (Higham, Accuracy and
// Stability of Numerical Algorithms, Lemma 3.1 and Section 3.1; from
// memory): k = 7 for Nx and Ny, whose absolute sums are |c'y| |b'|^2 +
// |b'y| |c'|^2 and |b'x| |c'|^2 + |c'x| |b'|^2, and k = 4 for D, with
// 2 (|b'x c'y| + |b'y c'x|). Those sums are themselves computed with a
// relative error below g_4, so 8u (resp. 5u) times the computed sums bounds
// the errors. The few steps after (squares, square root, sum, quotients) are
// bounded by running error analysis (Higham, Section 3.3; from memory):
//   fl(x * y):   |x| ey + |y| ex + ex ey + u|v|
//   fl(x +- y):  ex + ey + u|v|
//   fl(x / y):   (|x| ey + |y| ex) / (|y| (|y| - ey)) + u|v|   (|y| > ey)
//   fl(sqrt x):  min(sqrt(ex), ex / sqrt(x)) + u|v|
// each plus ETA where a degree-6 term of tiny coordinates may land among
// subnormals. These bounds are computed in floating point too, a few dozen
// roundings, so the final bound is scaled by 1 + 2^-30, far more than
// (1 - u)^-100. A denominator within its own error of zero gives an
// infinite bound: that event always takes the exact path.
// ---------------------------------------------------------------------------

const ETA = 2 ** -1060;
const SCALE = 1 + 2 ** -30;
const N_REL = 8 * U;
const D_REL = 5 * U;

/**
 * Whether a, b, c turn counter-clockwise (exactly: the breakpoints around
 * b's arc converge); if so, the key, its error bound, x and its error bound
 * of their event, written to out[o..o+3]. D is twice the orientation, so
 * its filter decides most turns before the rest of the key is computed.
 */
export function circleEventKey(
  ax: number, ay: number, bx: number, by: number, cx: number, cy: number, out: Float64Array, o: number,
): boolean {
  const bxr = bx - ax, byr = by - ay, cxr = cx - ax, cyr = cy - ay;
  const abx = Math.abs(bxr), aby = Math.abs(byr), acx = Math.abs(cxr), acy = Math.abs(cyr);
  const D = 2 * (bxr * cyr - byr * cxr);
  const eD = D_REL * 2 * (abx * acy + aby * acx);
  const aD = Math.abs(D);
  if (!(aD > eD)) {
    if (!(orient(ax, ay, bx, by, cx, cy) > 0)) return false;
    out[o] = ay; out[o + 1] = Infinity; out[o + 2] = ax; out[o + 3] = Infinity;
    return true;
  }
  if (D < 0) return false;
  const B2 = bxr * bxr + byr * byr, C2 = cxr * cxr + cyr * cyr;
  const Nx = cyr * B2 - byr * C2, Ny = bxr * C2 - cxr * B2;
  const eNx = N_REL * (acy * B2 + aby * C2), eNy = N_REL * (abx * C2 + acx * B2);
  const aNx = Math.abs(Nx), aNy = Math.abs(Ny);
  const X = Nx * Nx + Ny * Ny;
  const eX = 2 * (aNx * eNx + aNy * eNy) + eNx * eNx + eNy * eNy + 3 * U * X + ETA;
  const S = Math.sqrt(X);
  const eS = (X > 0 ? Math.min(Math.sqrt(eX), eX / S) : Math.sqrt(eX)) + U * S + ETA;
  const T = Ny + S;
  const aT = Math.abs(T);
  const eT = eNy + eS + U * aT;
  const ky = T / D, kx = Nx / D, q = aD * (aD - eD);
  const key = ay + ky, x = ax + kx;
  out[o] = key;
  out[o + 1] = ((aT * eD + aD * eT) / q + U * (Math.abs(ky) + Math.abs(key)) + ETA) * SCALE;
  out[o + 2] = x;
  out[o + 3] = ((aNx * eD + aD * eNx) / q + U * (Math.abs(kx) + Math.abs(x)) + ETA) * SCALE;
  return true;
}

/** Exact Nx, Ny, D (times 2^-E factors that cancel in every sign below) of (a, b, c) from ints[i..i+5]. */
function circleParts(v: bigint[], i: number): [bigint, bigint, bigint] {
  const bxr = v[i + 2] - v[i], byr = v[i + 3] - v[i + 1], cxr = v[i + 4] - v[i], cyr = v[i + 5] - v[i + 1];
  const B2 = bxr * bxr + byr * byr, C2 = cxr * cxr + cyr * cyr;
  return [cyr * B2 - byr * C2, bxr * C2 - cxr * B2, 2n * (bxr * cyr - byr * cxr)];
}

const eight = new Float64Array(8);
const twelve = new Float64Array(12);

/**
 * Exact order of the event of counter-clockwise (a, b, c) against the site
 * s: 2 sign(key - sy) when the key differs from sy, else sign(x - sx)
 * (0: the site is the top of the circle).
 */
export function circleVersusSiteExact(
  ax: number, ay: number, bx: number, by: number, cx: number, cy: number, sx: number, sy: number,
): number {
  eight[0] = ax; eight[1] = ay; eight[2] = bx; eight[3] = by; eight[4] = cx; eight[5] = cy; eight[6] = sx; eight[7] = sy;
  commonIntegers(eight, ints);
  const [Nx, Ny, D] = circleParts(ints, 0);
  const Ax = ints[0], Ay = ints[1], Sx = ints[6], Sy = ints[7];
  // key - sy = ((ay - sy) D + Ny + sqrt(Nx^2 + Ny^2)) / D, D > 0: compare the root with W.
  const W = (Sy - Ay) * D - Ny;
  const ys = W < 0n ? 1 : bigSign(Nx * Nx + Ny * Ny - W * W);
  if (ys !== 0) return 2 * ys;
  return bigSign((Ax - Sx) * D + Nx);
}

/** Nx, Ny, D of (a, b, c) in exact-or-bail doubles (see circleParts). */
function circlePartsDouble(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, out: Float64Array, o: number): void {
  const bxr = xSub(bx, ax), byr = xSub(by, ay), cxr = xSub(cx, ax), cyr = xSub(cy, ay);
  const B2 = xAdd(xMul(bxr, bxr), xMul(byr, byr)), C2 = xAdd(xMul(cxr, cxr), xMul(cyr, cyr));
  out[o] = xSub(xMul(cyr, B2), xMul(byr, C2));
  out[o + 1] = xSub(xMul(bxr, C2), xMul(cxr, B2));
  out[o + 2] = 2 * xSub(xMul(bxr, cyr), xMul(byr, cxr));
}

const parts = new Float64Array(6);

/** circleVersusCircleExact in exact-or-bail doubles; NaN when some step was not exact. */
function circleVersusCircleDouble(
  a1x: number, a1y: number, b1x: number, b1y: number, c1x: number, c1y: number,
  a2x: number, a2y: number, b2x: number, b2y: number, c2x: number, c2y: number,
): number {
  exactBegin();
  circlePartsDouble(a1x, a1y, b1x, b1y, c1x, c1y, parts, 0);
  circlePartsDouble(a2x, a2y, b2x, b2y, c2x, c2y, parts, 3);
  const Nx1 = parts[0], Ny1 = parts[1], D1 = parts[2], Nx2 = parts[3], Ny2 = parts[4], D2 = parts[5];
  const D12 = xMul(D1, D2);
  const K = xAdd(xMul(xSub(a1y, a2y), D12), xSub(xMul(Ny1, D2), xMul(Ny2, D1)));
  const A = xMul(xMul(D2, D2), xAdd(xMul(Nx1, Nx1), xMul(Ny1, Ny1)));
  const B = xMul(xMul(D1, D1), xAdd(xMul(Nx2, Nx2), xMul(Ny2, Ny2)));
  if (!exactOk()) return NaN;
  const s1 = Math.sign(xSub(A, B)), s2 = Math.sign(K);
  let ys: number;
  if (s1 === 0) ys = s2;
  else if (s2 === 0 || s2 === s1) ys = s1;
  else {
    const M = xSub(xAdd(A, B), xMul(K, K));
    ys = M < 0 ? -s1 : s1 * Math.sign(xSub(xMul(M, M), xMul(4 * A, B)));
  }
  if (ys !== 0) return exactOk() ? 2 * ys : NaN;
  const xs = Math.sign(xAdd(xMul(xSub(a1x, a2x), D12), xSub(xMul(Nx1, D2), xMul(Nx2, D1))));
  return exactOk() ? xs : NaN;
}

/**
 * Exact order of two circle events (counter-clockwise triples): the sign of
 * key1 - key2, and on a tie (returned as +-1 instead of +-2) of x1 - x2.
 */
export function circleVersusCircleExact(
  a1x: number, a1y: number, b1x: number, b1y: number, c1x: number, c1y: number,
  a2x: number, a2y: number, b2x: number, b2y: number, c2x: number, c2y: number,
): number {
  const fast = circleVersusCircleDouble(a1x, a1y, b1x, b1y, c1x, c1y, a2x, a2y, b2x, b2y, c2x, c2y);
  if (fast === fast) return fast;
  const t = twelve;
  t[0] = a1x; t[1] = a1y; t[2] = b1x; t[3] = b1y; t[4] = c1x; t[5] = c1y;
  t[6] = a2x; t[7] = a2y; t[8] = b2x; t[9] = b2y; t[10] = c2x; t[11] = c2y;
  commonIntegers(t, ints);
  const [Nx1, Ny1, D1] = circleParts(ints, 0);
  const [Nx2, Ny2, D2] = circleParts(ints, 6);
  // (key1 - key2) D1 D2 = D2 sqrt(X1) - D1 sqrt(X2) + K.
  const K = (ints[1] - ints[7]) * D1 * D2 + Ny1 * D2 - Ny2 * D1;
  const A = D2 * D2 * (Nx1 * Nx1 + Ny1 * Ny1), B = D1 * D1 * (Nx2 * Nx2 + Ny2 * Ny2);
  const ys = rootSumSign(A, B, K);
  if (ys !== 0) return 2 * ys;
  return bigSign((ints[0] - ints[6]) * D1 * D2 + Nx1 * D2 - Nx2 * D1);
}

/** Sign of sqrt(A) - sqrt(B) + K for A, B >= 0, exactly. */
function rootSumSign(A: bigint, B: bigint, K: bigint): number {
  const s1 = bigSign(A - B), s2 = bigSign(K);
  if (s1 === 0) return s2;
  if (s2 === 0 || s2 === s1) return s1;
  // The two parts have opposite signs: compare |sqrt A - sqrt B| with |K|, squared,
  // i.e. M = A + B - K^2 against 2 sqrt(AB).
  const M = A + B - K * K;
  if (M < 0n) return -s1;
  return s1 * bigSign(M * M - 4n * A * B);
}
