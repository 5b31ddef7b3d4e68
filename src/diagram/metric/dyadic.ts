import { commonIntegers } from '../../core/exact.js';

/**
 * An exact dyadic rational m * 2^e. Every input coordinate is one, and the
 * L1/L-infinity constructions only add, subtract and multiply them (points
 * are kept homogeneous, so nothing is ever divided): the exact fallback of
 * every filtered predicate in this directory works on these.
 */
export interface Dyadic { m: bigint; e: number }

const one: bigint[] = [0n];
const single = new Float64Array(1);

export function dyadic(v: number): Dyadic {
  single[0] = v;
  const e = commonIntegers(single, one);
  return { m: one[0], e };
}

export const dyInt = (k: number): Dyadic => ({ m: BigInt(k), e: 0 });

export function dyAdd(a: Dyadic, b: Dyadic): Dyadic {
  if (a.m === 0n) return b;
  if (b.m === 0n) return a;
  return a.e <= b.e ? { m: a.m + (b.m << BigInt(b.e - a.e)), e: a.e } : { m: (a.m << BigInt(a.e - b.e)) + b.m, e: b.e };
}

export const dyNeg = (a: Dyadic): Dyadic => ({ m: -a.m, e: a.e });
export const dySub = (a: Dyadic, b: Dyadic): Dyadic => dyAdd(a, dyNeg(b));
export const dyMul = (a: Dyadic, b: Dyadic): Dyadic => ({ m: a.m * b.m, e: a.e + b.e });
export const dySign = (a: Dyadic): number => (a.m > 0n ? 1 : a.m < 0n ? -1 : 0);
/** a * 2^k. */
export const dyScale = (a: Dyadic, k: number): Dyadic => ({ m: a.m, e: a.e + k });

const bitLength = (v: bigint): number => (v < 0n ? -v : v).toString(2).length;

/** num / den rounded to a double (to within one ulp: a quotient of about 70 bits is converted once). */
export function dyRatio(num: Dyadic, den: Dyadic): number {
  if (num.m === 0n) return 0;
  const shift = 70 - bitLength(num.m) + bitLength(den.m);
  const q = shift >= 0 ? (num.m << BigInt(shift)) / den.m : num.m / (den.m << BigInt(-shift));
  // Two power-of-two factors: each stays in range where the product does.
  const e = num.e - den.e - shift, half = Math.trunc(e / 2);
  return Number(q) * 2 ** half * 2 ** (e - half);
}
