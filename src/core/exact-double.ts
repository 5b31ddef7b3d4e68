/**
 * Exact-or-bail arithmetic on doubles: each operation also checks, with an
 * error-free transformation, that its result was not rounded (Knuth's
 * TwoSum; Dekker's TwoProduct with Veltkamp's split; both from memory of the
 * standard algorithms, exact under round-to-nearest without overflow or
 * underflow, which the guards below exclude). A polynomial evaluated with
 * them is exact when `exactOk()` still holds afterwards; the caller falls
 * back to BigInt otherwise. On grids of small integers or dyadic steps every
 * operation is exact, and this is many times cheaper than BigInt.
 */

let ok = true;

/** Starts a new evaluation. */
export function exactBegin(): void { ok = true; }
/** Whether every operation since exactBegin() was exact. */
export function exactOk(): boolean { return ok; }

const SPLIT = 134217729; // 2^27 + 1
/** Beyond these magnitudes the split could overflow or the product's tail underflow. */
const BIG = 2 ** 995;
const SMALL = 2 ** -960;

export function xAdd(a: number, b: number): number {
  const s = a + b;
  const bb = s - a;
  if ((a - (s - bb)) + (b - bb) !== 0 || Math.abs(s) > BIG) ok = false;
  return s;
}

export function xSub(a: number, b: number): number {
  return xAdd(a, -b);
}

export function xMul(a: number, b: number): number {
  const p = a * b;
  if (p === 0) {
    if (a !== 0 && b !== 0) ok = false;
    return p;
  }
  const ap = Math.abs(p);
  if (!(ap < BIG) || ap < SMALL || Math.abs(a) > BIG || Math.abs(b) > BIG) { ok = false; return p; }
  let c = SPLIT * a;
  const ah = c - (c - a), al = a - ah;
  c = SPLIT * b;
  const bh = c - (c - b), bl = b - bh;
  if (((ah * bh - p) + ah * bl + al * bh) + al * bl !== 0) ok = false;
  return p;
}
