/**
 * Reads a decimal number from ASCII bytes as Number(text) would (correctly
 * rounded), without making the text: CSV files hold millions of them.
 *
 * Syntax: [+-]? (digits [. digits?] | . digits) ([eE] [+-]? digits)?, no
 * spaces; anything else gives NaN (no such text is a number, so the caller
 * can tell and take its careful path).
 *
 * Value = M * 10^E, M the digits as a whole number. With at most 15
 * significant digits M is a double and, for |E| <= 22, one correctly
 * rounded product or quotient of two exact doubles gives the answer. With
 * 16 or 17 digits and -22 <= E <= 0, M = S + s exactly (S = fl(M)) and the
 * quotient c = fl(S / 10^k) is within one unit of the answer; c is the answer
 * exactly when |M - c * 10^k| < ulp(c) / 2 * 10^k. The residual is computed
 * from Dekker's exact product c * 10^k = P1 + P2 as (S - P1) + (s - P2):
 * S - P1 is exact (Sterbenz: the two agree to within a few units), the
 * rest rounds by under 1e-14 while the bound ulp(c) / 2 * 10^k (exact: a
 * power of two times 10^k) is at least 0.5 since M >= 2^53. So a residual
 * more than 1e-9 inside the bound accepts c, one more than 1e-9 outside it
 * moves c by one unit toward M, and one within 1e-9 of it (ties included)
 * is left to Number(). Powers of two (asymmetric neighbours), more digits
 * and other exponents also go to Number().
 */

const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
const HI = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f ? 1 : 0, LO = 1 - HI;

const POW10 = new Float64Array(23);
for (let k = 0; k <= 22; k++) POW10[k] = Number(`1e${k}`);
const SPLIT = 134217729; // 2^27 + 1, Dekker's splitter
const P1_HI = new Float64Array(23), P1_LO = new Float64Array(23);
for (let k = 0; k <= 22; k++) {
  const c = SPLIT * POW10[k], h = c - (c - POW10[k]);
  P1_HI[k] = h; P1_LO[k] = POW10[k] - h;
}
const TWO53 = 9007199254740992;

function slow(bytes: Uint8Array, start: number, end: number): number {
  let s = '';
  for (let i = start; i < end; i++) s += String.fromCharCode(bytes[i]);
  return Number(s);
}

/** The correctly rounded quotient (S + s) / 10^k for 2^53 <= S + s < 1e17, 0 <= k <= 22; NaN when undecided. */
function divide(S: number, s: number, k: number): number {
  const P = POW10[k], ph = P1_HI[k], pl = P1_LO[k];
  let c = S / P;
  for (let step = 0; step < 3; step++) {
    f64[0] = c;
    const hi = u32[HI], lo = u32[LO];
    if ((hi & 0xfffff) === 0 && lo === 0) return NaN;
    // ulp(c) / 2, from c's exponent (c is normal here).
    u32[HI] = ((hi >>> 20) - 53) << 20; u32[LO] = 0;
    const bound = f64[0] * P;
    const p1 = c * P;
    const cs = SPLIT * c, ch = cs - (cs - c), cl = c - ch;
    const p2 = ((ch * ph - p1) + ch * pl + cl * ph) + cl * pl;
    const r = (S - p1) + (s - p2);
    const gap = Math.abs(r) - bound;
    if (gap < -1e-9) return c;
    if (gap <= 1e-9) return NaN;
    // One unit toward M.
    f64[0] = c;
    if (r > 0) { if (lo === 0xffffffff) { u32[LO] = 0; u32[HI] = hi + 1; } else u32[LO] = lo + 1; }
    else { if (lo === 0) { u32[LO] = 0xffffffff; u32[HI] = hi - 1; } else u32[LO] = lo - 1; }
    c = f64[0];
  }
  return NaN;
}

/** Number(text) of bytes[start..end) when it is a plain decimal; NaN otherwise. */
export function parseDecimal(bytes: Uint8Array, start: number, end: number): number {
  const v = parseDecimalPrefix(bytes, start, end);
  return decimalEnd === end ? v : NaN;
}

/** Where the number read by the last parseDecimalPrefix ended. */
export let decimalEnd = 0;

/**
 * The plain decimal at the start of bytes[start..limit), as parseDecimal
 * reads it, ending at the first byte that cannot continue it (decimalEnd
 * says where); NaN when no decimal starts there or its exponent has no digits.
 */
export function parseDecimalPrefix(bytes: Uint8Array, start: number, limit: number): number {
  const end = limit;
  let i = start;
  let neg = false;
  if (i < end && (bytes[i] === 45 || bytes[i] === 43)) { neg = bytes[i] === 45; i++; }
  // All digits form M; a: the first nine significant ones, b: up to eight more.
  let a = 0, b = 0, nb = 0, nd = 0, digits = 0, frac = 0;
  let c = 0;
  for (; i < end; i++) {
    c = bytes[i] - 48;
    if (c < 0 || c > 9) break;
    digits++;
    if (nd === 0 && c === 0) continue;
    if (nd < 9) a = a * 10 + c; else { b = b * 10 + c; nb++; }
    nd++;
  }
  if (i < end && bytes[i] === 46) {
    for (i++; i < end; i++) {
      c = bytes[i] - 48;
      if (c < 0 || c > 9) break;
      digits++; frac++;
      if (nd === 0 && c === 0) continue;
      if (nd < 9) a = a * 10 + c; else { b = b * 10 + c; nb++; }
      nd++;
    }
  }
  if (digits === 0) return NaN;
  let exp = 0;
  if (i < end && (bytes[i] === 101 || bytes[i] === 69)) {
    i++;
    let eneg = false;
    if (i < end && (bytes[i] === 45 || bytes[i] === 43)) { eneg = bytes[i] === 45; i++; }
    const from = i;
    for (; i < end; i++) {
      c = bytes[i] - 48;
      if (c < 0 || c > 9) break;
      if (exp < 100000) exp = exp * 10 + c;
    }
    if (i === from) return NaN;
    if (eneg) exp = -exp;
  }
  decimalEnd = i;
  const stop = i;
  if (nd === 0) return neg ? -0 : 0;
  if (nd > 17) return slow(bytes, start, stop);
  const E = exp - frac;
  // a * 10^nb is exact: a < 1e9 and 5^nb <= 5^8, so a * 5^nb < 2^53.
  const S0 = a * POW10[nb];
  const S = S0 + b, s = b - (S - S0); // Fast2Sum: S + s = M exactly
  let v: number;
  if (S < TWO53 && s === 0) {
    if (E >= 0 && E <= 22) v = S * POW10[E];
    else if (E < 0 && E >= -22) v = S / POW10[-E];
    else return slow(bytes, start, stop);
  } else if (E <= 0 && E >= -22) {
    v = divide(S, s, -E);
    if (v !== v) return slow(bytes, start, stop);
  } else {
    return slow(bytes, start, stop);
  }
  return neg ? -v : v;
}
