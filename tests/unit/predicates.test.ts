import { describe, expect, it } from 'vitest';
import { inCircle, orient } from '../../src/core/predicates.js';
import { latticeCircle, nextDown, nextUp } from '../support/generators.js';

// Exact reference: every finite double is m * 2^e with integer m, so the
// determinants below are computed exactly with BigInt after scaling all
// inputs to the smallest exponent. Independent of robust-predicates.
function decompose(x: number): { m: bigint; e: number } {
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  const sign = bits >> 63n ? -1n : 1n;
  const expField = Number((bits >> 52n) & 0x7ffn);
  const frac = bits & ((1n << 52n) - 1n);
  if (expField === 0) return { m: sign * frac, e: -1074 };
  return { m: sign * (frac | (1n << 52n)), e: expField - 1075 };
}

function exactInts(xs: number[]): bigint[] {
  const parts = xs.map(decompose);
  const minE = Math.min(...parts.map((p) => p.e));
  return parts.map((p) => p.m << BigInt(p.e - minE));
}

const sign = (v: bigint) => (v > 0n ? 1 : v < 0n ? -1 : 0);

function exactOrientSign(...c: number[]): number {
  const [ax, ay, bx, by, cx, cy] = exactInts(c);
  return sign((bx - ax) * (cy - ay) - (by - ay) * (cx - ax));
}

function exactInCircleSign(...c: number[]): number {
  const [ax, ay, bx, by, cx, cy, dx, dy] = exactInts(c);
  const adx = ax - dx, ady = ay - dy, bdx = bx - dx, bdy = by - dy, cdx = cx - dx, cdy = cy - dy;
  return sign(
    (adx * adx + ady * ady) * (bdx * cdy - cdx * bdy) +
      (bdx * bdx + bdy * bdy) * (cdx * ady - adx * cdy) +
      (cdx * cdx + cdy * cdy) * (adx * bdy - bdx * ady),
  );
}

// The plain floating-point formulas, to show where rounding gets the sign wrong.
function naiveOrient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

function naiveInCircle(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): number {
  const adx = ax - dx, ady = ay - dy, bdx = bx - dx, bdy = by - dy, cdx = cx - dx, cdy = cy - dy;
  return (adx * adx + ady * ady) * (bdx * cdy - cdx * bdy) +
    (bdx * bdx + bdy * bdy) * (cdx * ady - adx * cdy) +
    (cdx * cdx + cdy * cdy) * (adx * bdy - bdx * ady);
}

describe('orient (y-up, counter-clockwise positive)', () => {
  it('is positive for a counter-clockwise turn and negative for a clockwise one', () => {
    expect(orient(0, 0, 1, 0, 0, 1)).toBeGreaterThan(0);
    expect(orient(0, 0, 0, 1, 1, 0)).toBeLessThan(0);
    expect(orient(1, 0, 0, 1, 0, 0)).toBeGreaterThan(0); // cyclic rotation keeps the sign
  });

  it('is exactly zero on collinear points', () => {
    expect(orient(0, 0, 1, 1, 2, 2)).toBe(0);
    expect(orient(0.1, 0.1, 0.2, 0.2, 0.3, 0.3)).toBe(0); // on y = x whatever the rounding of 0.1
    expect(orient(1e7, 1e7, 1e7 + 1, 1e7 + 3, 1e7 + 2, 1e7 + 6)).toBe(0);
    expect(orient(-3, 5, 0.5, -2, 4, -9)).toBe(0); // slope -2, exact dyadic step
    expect(orient(2 ** 120, 0, 0, 2 ** 120, 2 ** 119, 2 ** 119)).toBe(0); // the largest accepted magnitude
  });

  it('gets the sign right near-collinear where naive floating point does not', () => {
    // Setting after the "classroom examples" of Kettner, Mehlhorn, Pion, Schirra,
    // Yap (2004, from memory): a ranges over a 256 x 256 grid of doubles next to
    // (0.5, 0.5), the line through (12, 12) and (24, 24) passes through it.
    const ulp = 2 ** -53; // spacing of doubles in [0.5, 1)
    let naiveWrong = 0;
    let zeros = 0;
    const wrong: string[] = [];
    for (let k = 0; k < 256; k++) {
      for (let m = 0; m < 256; m++) {
        const ax = 0.5 + k * ulp, ay = 0.5 + m * ulp;
        const exact = exactOrientSign(ax, ay, 12, 12, 24, 24);
        if (Math.sign(orient(ax, ay, 12, 12, 24, 24)) !== exact) wrong.push(`a = (0.5+${k}ulp, 0.5+${m}ulp)`);
        if (Math.sign(naiveOrient(ax, ay, 12, 12, 24, 24)) !== exact) naiveWrong++;
        if (exact === 0) zeros++;
      }
    }
    expect(wrong.slice(0, 10)).toEqual([]);
    expect(zeros).toBe(256); // exactly the diagonal k = m is collinear
    expect(naiveWrong).toBeGreaterThan(0); // the search did find cases where rounding lies
  });

  it('agrees with exact BigInt arithmetic on 1-ulp perturbations at 1e7', () => {
    const base = [1e7, 1e7, 1e7 + 3, 1e7 + 1, 1e7 + 9, 1e7 + 3]; // collinear
    let nonzero = 0;
    for (let mask = 0; mask < 729; mask++) {
      const c = base.slice();
      let r = mask;
      for (let i = 0; i < 6; i++, r = Math.floor(r / 3)) {
        if (r % 3 === 1) c[i] = nextUp(c[i]);
        if (r % 3 === 2) c[i] = nextDown(c[i]);
      }
      const exact = exactOrientSign(...c);
      if (exact !== 0) nonzero++;
      expect(Math.sign(orient(c[0], c[1], c[2], c[3], c[4], c[5])), `mask ${mask}`).toBe(exact);
    }
    expect(nonzero).toBeGreaterThan(0);
  });
});

describe('inCircle (positive inside the circle of counter-clockwise a, b, c)', () => {
  const a = [5, 0], b = [0, 5], c = [-5, 0]; // counter-clockwise on x^2 + y^2 = 25

  it('is positive inside, negative outside, and flips with a clockwise triangle', () => {
    expect(inCircle(a[0], a[1], b[0], b[1], c[0], c[1], 0, 0)).toBeGreaterThan(0);
    expect(inCircle(a[0], a[1], b[0], b[1], c[0], c[1], 1, -4)).toBeGreaterThan(0);
    expect(inCircle(a[0], a[1], b[0], b[1], c[0], c[1], 6, 0)).toBeLessThan(0);
    expect(inCircle(a[0], a[1], b[0], b[1], c[0], c[1], 4, -4)).toBeLessThan(0);
    expect(inCircle(c[0], c[1], b[0], b[1], a[0], a[1], 0, 0)).toBeLessThan(0);
  });

  it('is exactly zero for integer cocircular points, also translated by 1e7', () => {
    // Lattice points on x^2 + y^2 = 25^2 (integers, so exactly cocircular).
    const ring = latticeCircle(25);
    expect(ring.length).toBe(20);
    for (const off of [0, 1e7, -3e6]) {
      const [p, q, r] = [[25, 0], [0, 25], [-25, 0]].map(([x, y]) => [x + off, y + off]);
      for (const [x, y] of ring) {
        expect(inCircle(p[0], p[1], q[0], q[1], r[0], r[1], x + off, y + off), `(${x},${y}) + ${off}`).toBe(0);
      }
    }
  });

  it('decides 1-ulp moves off a ring translated by 1e7 exactly', () => {
    const off = 1e7;
    const ring = latticeCircle(65).map(([x, y]) => [x + off, y + off]);
    const [p, q, r] = [ring[0], ring[7], ring[20]];
    expect(Math.sign(orient(p[0], p[1], q[0], q[1], r[0], r[1]))).not.toBe(0);
    const [ax, ay, bx, by, cx, cy] = orient(p[0], p[1], q[0], q[1], r[0], r[1]) > 0
      ? [p[0], p[1], q[0], q[1], r[0], r[1]]
      : [r[0], r[1], q[0], q[1], p[0], p[1]];
    let naiveWrong = 0;
    let checked = 0;
    for (const [x, y] of ring) {
      for (const [dx, dy] of [[nextUp(x), y], [nextDown(x), y], [x, nextUp(y)], [x, nextDown(y)]]) {
        const exact = exactInCircleSign(ax, ay, bx, by, cx, cy, dx, dy);
        expect(Math.sign(inCircle(ax, ay, bx, by, cx, cy, dx, dy)), `d = (${dx}, ${dy})`).toBe(exact);
        if (Math.sign(naiveInCircle(ax, ay, bx, by, cx, cy, dx, dy)) !== exact) naiveWrong++;
        checked++;
      }
    }
    expect(checked).toBe(4 * 36);
    // Moving a ring point one ulp toward the centre (x > centre, nextDown of x) puts it inside.
    const e = ring.find(([x, y]) => x === off + 65 && y === off)!;
    expect(inCircle(ax, ay, bx, by, cx, cy, nextDown(e[0]), e[1])).toBeGreaterThan(0);
    expect(inCircle(ax, ay, bx, by, cx, cy, nextUp(e[0]), e[1])).toBeLessThan(0);
    expect(naiveWrong).toBeGreaterThan(0); // at 1e7 the naive formula cannot see one ulp
  });
});
