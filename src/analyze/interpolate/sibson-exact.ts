import { commonIntegers } from '../../core/exact.js';

/**
 * commonIntegers without the zeros: a zero would pin the common exponent to
 * the subnormal range and every other integer would grow by about 1000 bits.
 */
function integers(values: number[], out: bigint[]): number {
  const nonzero = values.filter((v) => v !== 0), ints: bigint[] = [];
  const e = nonzero.length > 0 ? commonIntegers(nonzero, ints) : 0;
  for (let i = 0, j = 0; i < values.length; i++) out[i] = values[i] === 0 ? 0n : ints[j++];
  return e;
}

function bitLength(v: bigint): number {
  return v === 0n ? 0 : v.toString(2).length;
}

/** n / d * 2^e as the nearest double or one next to it (d > 0). */
function toDouble(n: bigint, d: bigint, e: number): number {
  if (n === 0n) return 0;
  const neg = n < 0n, a = neg ? -n : n;
  // 64 quotient bits or more: the truncated quotient then rounds to within one unit of the exact value.
  // A negative s shifts the divisor instead: the quotient stays near 2^64 either way, far below overflow.
  const s = 64 + bitLength(d) - bitLength(a);
  let x = Number(s >= 0 ? (a << BigInt(s)) / d : a / (d << BigInt(-s))), k = e - s;
  while (k < -1000) { x *= 2 ** -1000; k += 1000; }
  while (k > 1000) { x *= 2 ** 1000; k -= 1000; }
  x *= 2 ** k;
  return neg ? -x : x;
}

/**
 * Sibson's value at q in exact rational arithmetic, for configurations too
 * ill-conditioned for the floating-point sums (thin triangles put
 * circumcentres far away, and the stolen areas come out as small
 * differences of huge cross products). Point k is the circumcentre of the
 * counter-clockwise triangle corners[6k..6k+5]; polygon i runs through the
 * points polygons[offsets[i]..offsets[i+1]-1], and its area weighs
 * values[i].
 *
 * Every double is an integer times 2^E for one common E, and every
 * circumcentre a vector of integers over its own positive denominator d_k.
 * Areas are only compared with each other, so any common positive factor
 * can go: E is dropped, and the points are brought to the common
 * denominator Π d_k (one product, instead of fractions that square their
 * denominators at every sum).
 */
export function exactSibson(qx: number, qy: number, corners: number[], polygons: number[], offsets: number[], values: number[]): number {
  const ints: bigint[] = [];
  integers([qx, qy, ...corners], ints);
  const X = ints[0], Y = ints[1];
  const points = corners.length / 6;
  const cx: bigint[] = [], cy: bigint[] = [], cd: bigint[] = [];
  for (let k = 0; k < points; k++) {
    const o = 2 + 6 * k;
    const px = ints[o] - X, py = ints[o + 1] - Y;
    const ux = ints[o + 2] - ints[o], uy = ints[o + 3] - ints[o + 1];
    const wx = ints[o + 4] - ints[o], wy = ints[o + 5] - ints[o + 1];
    const d = 2n * (ux * wy - uy * wx), u2 = ux * ux + uy * uy, w2 = wx * wx + wy * wy;
    cx.push(px * d + wy * u2 - uy * w2);
    cy.push(py * d + ux * w2 - wx * u2);
    cd.push(d);
  }
  // Point k times Π d / d_k, from prefix and suffix products.
  const suffix: bigint[] = new Array(points + 1);
  suffix[points] = 1n;
  for (let k = points - 1; k >= 0; k--) suffix[k] = suffix[k + 1] * cd[k];
  let prefix = 1n;
  for (let k = 0; k < points; k++) {
    const scale = prefix * suffix[k + 1];
    cx[k] *= scale;
    cy[k] *= scale;
    prefix *= cd[k];
  }
  const f: bigint[] = [];
  const fe = integers(values, f);
  let num = 0n, den = 0n;
  for (let i = 0; i + 1 < offsets.length; i++) {
    let area = 0n;
    for (let m = offsets[i]; m < offsets[i + 1]; m++) {
      const k = polygons[m], j = polygons[m + 1 === offsets[i + 1] ? offsets[i] : m + 1];
      area += cx[k] * cy[j] - cx[j] * cy[k];
    }
    den += area;
    num += area * f[i];
  }
  // den > 0: the new cell has positive area.
  return toDouble(num, den, fe);
}
