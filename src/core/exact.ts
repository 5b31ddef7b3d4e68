/**
 * The exact binary value of doubles as integers: every finite double is
 * m * 2^e with m a signed integer below 2^53 in magnitude. Shifting several
 * of them to their smallest exponent E gives integers X_i with
 * v_i = X_i * 2^E, on which any polynomial with integer coefficients can be
 * evaluated exactly (BigInt). The exact fallbacks of ambit's floating filters
 * (distance comparisons, the sweep's event keys) all start here.
 */

// One 8-byte buffer seen as a double and as an unsigned 64-bit integer: the
// integer view exposes the sign, exponent and fraction bits of the double.
const F64 = new Float64Array(1);
const U64 = new BigUint64Array(F64.buffer);
const FRACTION_MASK = (1n << 52n) - 1n;
const HIDDEN_BIT = 1n << 52n;

// Scratch for the decomposed values; the exact paths are rare, so plain arrays are fine.
const mant: bigint[] = [];
const expo: number[] = [];

/**
 * Writes to out[0..values.length-1] integers X_i with values[i] = X_i * 2^E
 * for one common exponent E, which is returned. Throws RangeError on a
 * value that is not finite.
 */
export function commonIntegers(values: ArrayLike<number>, out: bigint[]): number {
  const n = values.length;
  let e = Infinity;
  for (let i = 0; i < n; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) throw new RangeError('exact arithmetic needs finite values');
    F64[0] = v;
    const bits = U64[0];
    const biased = Number((bits >> 52n) & 0x7ffn);
    let m = bits & FRACTION_MASK;
    let ei: number;
    if (biased === 0) {
      ei = -1074; // zero or subnormal: no hidden bit
    } else {
      m |= HIDDEN_BIT;
      ei = biased - 1075;
    }
    mant[i] = bits >> 63n ? -m : m;
    expo[i] = ei;
    if (ei < e) e = ei;
  }
  for (let i = 0; i < n; i++) out[i] = mant[i] << BigInt(expo[i] - e);
  return e;
}

/** Sign of a BigInt as -1, 0 or 1. */
export function bigSign(v: bigint): number {
  return v > 0n ? 1 : v < 0n ? -1 : 0;
}
