/**
 * Shortest round-trip decimal text of a double, written as ASCII bytes:
 * byte for byte what String(x) gives (the shortest digits that read back
 * to x, the closest to x when several are that short, in the same layout),
 * several times faster for the usual magnitudes. Writers format millions
 * of coordinates; String(x) was most of their time.
 *
 * Method. For 1e-31 <= |x| < 1e15, X = |x| * 10^p lies in [1e14, 1e15) for
 * one p in 0..45 and is computed as a double-double: exactly for p <= 22
 * (10^p is a double and Dekker's product is exact), and for larger p from
 * 10^p = hi + lo, both doubles (5^p < 2^106), with an absolute error below
 * 2^-50 (the dropped part is |x * lo| * 2^-53 <= 2^-53 and the sums round
 * by at most 2^-53 each). So I = floor(X) is exact and F = X - I is known
 * to within E = 2^-50. The doubles that read back to x are those within
 * delta = ulp(x)/2 * 10^p of X (closed when x's significand is even), and
 * delta > X * 2^-54 > 0.0055 (significands are below 2^53), delta <= 0.111.
 * Hence, with 2 * delta < 1:
 *  - a whole number within delta of X can only be I (when F <= delta) or
 *    I + 1 (when 1 - F <= delta); it is then the only candidate with at
 *    most 15 digits, and its trailing zeros come off;
 *  - otherwise the closest multiple of 0.1 is taken when within delta
 *    (16 digits), else the closest multiple of 0.01 (17 digits; it is within
 *    0.005 < delta).
 * Every comparison whose outcome the error could flip (within a margin of
 * 2^-40, far above the error) goes to String(x) instead, as do exact ties
 * between two candidates, powers of two (their lower neighbour is nearer
 * than their upper one), subnormals, and magnitudes outside the range.
 * The fallback is String(x) itself, so the text never differs from it;
 * the tests compare both on many millions of values, ties and near-ties.
 */

const f64 = new Float64Array(1);
const u32 = new Uint32Array(f64.buffer);
// Word order of a double in memory (the high word holds sign and exponent).
const HI = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f ? 1 : 0, LO = 1 - HI;

const MAX_P = 45;
/** 10^p rounded to a double, and the exact remainder 10^p - POW_HI[p] (also a double: 5^p < 2^106). */
const POW_HI = new Float64Array(MAX_P + 1), POW_LO = new Float64Array(MAX_P + 1);
/** Dekker's halves of POW_HI[p]. */
const POW_H1 = new Float64Array(MAX_P + 1), POW_H2 = new Float64Array(MAX_P + 1);
const SPLIT = 134217729; // 2^27 + 1
for (let p = 0; p <= MAX_P; p++) {
  const exact = 10n ** BigInt(p);
  const hi = Number(exact);
  POW_HI[p] = hi;
  POW_LO[p] = Number(exact - BigInt(hi));
  const c = SPLIT * hi, h1 = c - (c - hi);
  POW_H1[p] = h1;
  POW_H2[p] = hi - h1;
}

// Margin for decisions the computed F (error < 2^-50, after scaling by at most 100: < 2^-43) could flip.
const MARGIN = 2 ** -40;

/** Digits of the chosen decimal, before layout. */
const digits = new Uint8Array(24);

/** Writes the ASCII characters of a string (one that String(x) made). */
function writeAscii(s: string, out: Uint8Array, pos: number): number {
  for (let i = 0; i < s.length; i++) out[pos++] = s.charCodeAt(i);
  return pos;
}

/** "00".."99" as character codes, two per entry: digit pairs halve the divisions. */
const PAIRS = new Uint8Array(200);
for (let i = 0; i < 100; i++) { PAIRS[2 * i] = 48 + ((i / 10) | 0); PAIRS[2 * i + 1] = 48 + (i % 10); }

/** Writes the eight digits of 0 <= v < 1e8, leading zeros included, into `digits` at `at`. */
function eightDigits(v: number, at: number): void {
  const hi = (v / 10000) | 0, lo = v - hi * 10000;
  const a = (hi / 100) | 0, b = hi - a * 100, c = (lo / 100) | 0, d = lo - c * 100;
  digits[at] = PAIRS[2 * a]; digits[at + 1] = PAIRS[2 * a + 1];
  digits[at + 2] = PAIRS[2 * b]; digits[at + 3] = PAIRS[2 * b + 1];
  digits[at + 4] = PAIRS[2 * c]; digits[at + 5] = PAIRS[2 * c + 1];
  digits[at + 6] = PAIRS[2 * d]; digits[at + 7] = PAIRS[2 * d + 1];
}

/** Writes a whole number 1 <= v < 1e16 as sixteen digits into digits[0..16); returns the index of its first nonzero digit. */
function integerDigits(v: number): number {
  const hi = Math.floor(v / 1e8);
  eightDigits(hi, 0);
  eightDigits(v - hi * 1e8, 8);
  let z = 0;
  while (digits[z] === 48) z++;
  return z;
}

/** Writes the digits of 1e14 <= v < 1e15 and then fd's fracDigits (1 or 2) digits; returns the position after them. */
function fifteenDigits(v: number, fd: number, fracDigits: number, out: Uint8Array, pos: number): number {
  const hi = Math.floor(v / 1e8), lo = v - hi * 1e8;
  // hi has seven digits: one, then three pairs.
  const h1 = (hi / 1000000) | 0, h2 = hi - h1 * 1000000, a = (h2 / 10000) | 0, r = h2 - a * 10000, b = (r / 100) | 0, c = r - b * 100;
  out[pos] = 48 + h1;
  out[pos + 1] = PAIRS[2 * a]; out[pos + 2] = PAIRS[2 * a + 1];
  out[pos + 3] = PAIRS[2 * b]; out[pos + 4] = PAIRS[2 * b + 1];
  out[pos + 5] = PAIRS[2 * c]; out[pos + 6] = PAIRS[2 * c + 1];
  const l1 = (lo / 10000) | 0, l2 = lo - l1 * 10000;
  const d = (l1 / 100) | 0, e = l1 - d * 100, f = (l2 / 100) | 0, g = l2 - f * 100;
  out[pos + 7] = PAIRS[2 * d]; out[pos + 8] = PAIRS[2 * d + 1];
  out[pos + 9] = PAIRS[2 * e]; out[pos + 10] = PAIRS[2 * e + 1];
  out[pos + 11] = PAIRS[2 * f]; out[pos + 12] = PAIRS[2 * f + 1];
  out[pos + 13] = PAIRS[2 * g]; out[pos + 14] = PAIRS[2 * g + 1];
  if (fracDigits === 2) { out[pos + 15] = PAIRS[2 * fd]; out[pos + 16] = PAIRS[2 * fd + 1]; return pos + 17; }
  out[pos + 15] = 48 + fd;
  return pos + 16;
}

/**
 * Lays out the significant digits digits[from..end) with decimal exponent n
 * (value = 0.d1d2... * 10^n) as Number.prototype.toString does.
 */
function layout(from: number, end: number, n: number, out: Uint8Array, pos: number): number {
  const count = end - from;
  if (count <= n && n <= 21) {
    for (let i = 0; i < count; i++) out[pos++] = digits[from + i];
    for (let i = count; i < n; i++) out[pos++] = 48;
  } else if (0 < n && n <= 21) {
    for (let i = 0; i < n; i++) out[pos++] = digits[from + i];
    out[pos++] = 46;
    for (let i = n; i < count; i++) out[pos++] = digits[from + i];
  } else if (-6 < n && n <= 0) {
    out[pos++] = 48; out[pos++] = 46;
    for (let i = n; i < 0; i++) out[pos++] = 48;
    for (let i = 0; i < count; i++) out[pos++] = digits[from + i];
  } else {
    out[pos++] = digits[from];
    if (count > 1) {
      out[pos++] = 46;
      for (let i = 1; i < count; i++) out[pos++] = digits[from + i];
    }
    out[pos++] = 101;
    let e = n - 1;
    out[pos++] = e < 0 ? 45 : 43;
    if (e < 0) e = -e;
    if (e >= 100) { out[pos++] = 48 + ((e / 100) | 0); e %= 100; out[pos++] = 48 + ((e / 10) | 0); out[pos++] = 48 + (e % 10); }
    else if (e >= 10) { out[pos++] = 48 + ((e / 10) | 0); out[pos++] = 48 + (e % 10); }
    else out[pos++] = 48 + e;
  }
  return pos;
}

/**
 * Writes String(x) for a finite x into `out` at `pos` (room for 25 bytes
 * needed) and returns the position after it.
 */
export function writeShortest(x: number, out: Uint8Array, pos: number): number {
  if (x === 0) { out[pos] = 48; return pos + 1; }
  let a = x;
  if (a < 0) { out[pos++] = 45; a = -a; }
  if (!(a >= 1e-31 && a < 1e15)) return writeAscii(String(a), out, pos);
  f64[0] = a;
  const hiWord = u32[HI], biased = hiWord >>> 20;
  // Powers of two have an asymmetric rounding interval: leave them to String.
  if ((hiWord & 0xfffff) === 0 && u32[LO] === 0) return writeAscii(String(a), out, pos);
  // delta = ulp(a) / 2 * 10^p; ulp(a) / 2 = 2^(biased - 1076), built from its bits (exact).
  u32[HI] = (biased - 53) << 20; u32[LO] = 0;
  const halfUlp = f64[0];

  // floor(log10 a) is floor(E * log10(2)) or one more, E the binary exponent; the loop below corrects p.
  let p = 14 - Math.floor((biased - 1023) * 0.30102999566398120);
  if (p < 0) p = 0; else if (p > MAX_P) p = MAX_P;
  let xh = 0, xl = 0;
  for (let attempt = 0; ; attempt++) {
    // Dekker: xh + err = a * POW_HI[p] exactly.
    const ph = POW_HI[p];
    xh = a * ph;
    const c = SPLIT * a, a1 = c - (c - a), a2 = a - a1;
    const err = ((a1 * POW_H1[p] - xh) + a1 * POW_H2[p] + a2 * POW_H1[p]) + a2 * POW_H2[p];
    xl = p > 22 ? err + a * POW_LO[p] : err;
    if (xh < 1e14 && p < MAX_P && attempt < 2) { p++; continue; }
    if (xh >= 1e15 && p > 0 && attempt < 2) { p--; continue; }
    break;
  }
  if (!(xh >= 1e14 && xh < 1e15)) return writeAscii(String(a), out, pos);
  let int = Math.floor(xh);
  let frac = (xh - int) + xl;
  if (frac < 0) { int -= 1; frac += 1; } else if (frac >= 1) { int += 1; frac -= 1; }
  const delta = halfUlp * POW_HI[p];
  // Whether the interval is closed (even significand) matters only at exact equality, inside the margins below.

  let from: number, end: number, n: number;
  const low = frac - delta, high = (1 - frac) - delta;
  if (Math.abs(low) <= MARGIN || Math.abs(high) <= MARGIN) return writeAscii(String(a), out, pos);
  if (low < 0 || high < 0) {
    // A whole number is within delta: I or I + 1, the only candidate of at most 15 digits.
    const v = low < 0 ? int : int + 1;
    from = integerDigits(v);
    end = 16;
    n = 16 - from - p;
    while (digits[end - 1] === 48) end--;
  } else {
    const t = 10 * frac, d1 = Math.floor(t + 0.5), r1 = Math.abs(t - d1);
    if (0.5 - r1 <= MARGIN) return writeAscii(String(a), out, pos);
    const gap1 = r1 - 10 * delta;
    if (Math.abs(gap1) <= MARGIN) return writeAscii(String(a), out, pos);
    let fracDigits: number, fd: number;
    if (gap1 < 0) {
      fracDigits = 1; fd = d1;
    } else {
      const u = 100 * frac, d2 = Math.floor(u + 0.5), r2 = Math.abs(u - d2);
      if (0.5 - r2 <= MARGIN) return writeAscii(String(a), out, pos);
      fracDigits = 2; fd = d2;
    }
    // fd has exactly fracDigits digits, its last one nonzero (rounder candidates were found above).
    if (fd <= 0 || fd >= (fracDigits === 1 ? 10 : 100) || fd % 10 === 0 || int < 1) return writeAscii(String(a), out, pos);
    if (int >= 1e14) {
      // The usual case, 15 + fracDigits digits: written straight into the output.
      n = 15 - p;
      if (n <= 0 && n > -6) {
        out[pos++] = 48; out[pos++] = 46;
        for (let i = n; i < 0; i++) out[pos++] = 48;
        return fifteenDigits(int, fd, fracDigits, out, pos);
      }
      if (n > 0) {
        // Digits one place to the right, then the first n moved back over the gap and the point put in it.
        const after = fifteenDigits(int, fd, fracDigits, out, pos + 1);
        for (let i = 0; i < n; i++) out[pos + i] = out[pos + 1 + i];
        out[pos + n] = 46;
        return after;
      }
    }
    from = integerDigits(int);
    end = 16;
    n = 16 - from - p;
    if (fracDigits === 2) { digits[end++] = PAIRS[2 * fd]; digits[end++] = PAIRS[2 * fd + 1]; }
    else digits[end++] = 48 + fd;
  }
  return layout(from, end, n, out, pos);
}
