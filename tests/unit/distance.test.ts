import { describe, expect, it } from 'vitest';
import {
  compareDistance, compareDistanceExact, compareKnownDistances, squaredDistance,
} from '../../src/core/distance.js';
import { mulberry32 as words } from '../../src/core/random.js';

/** Seeded uniform doubles in [0, 1). */
const mulberry32 = (seed: number): (() => number) => {
  const next = words(seed);
  return () => next() / 2 ** 32;
};

/**
 * Reference, independent of the decomposition in src/core/distance.ts:
 * every double v with |v| in [2^-120, 2^120] (or 0) is a multiple of 2^-172,
 * so v * 2^180 is an integer-valued double (multiplying by a power of two is
 * exact) and BigInt() converts it exactly. The difference of squared
 * distances is then evaluated as written, without the factored form.
 */
const SCALE = 2 ** 180;
function refSign(qx: number, qy: number, ax: number, ay: number, bx: number, by: number, scale = SCALE): number {
  const [Qx, Qy, Ax, Ay, Bx, By] = [qx, qy, ax, ay, bx, by].map((v) => BigInt(v * scale));
  const D = (Qx - Ax) ** 2n + (Qy - Ay) ** 2n - (Qx - Bx) ** 2n - (Qy - By) ** 2n;
  return D > 0n ? 1 : D < 0n ? -1 : 0;
}

/** The usual floating-point formula, with no error control. */
function naiveSign(qx: number, qy: number, ax: number, ay: number, bx: number, by: number): number {
  return Math.sign((qx - ax) ** 2 + (qy - ay) ** 2 - ((qx - bx) ** 2 + (qy - by) ** 2));
}

const sign = (v: number): number => (v > 0 ? 1 : v < 0 ? -1 : 0);

describe('compareDistance: worked examples (signs pinned by hand)', () => {
  it('a strictly closer gives a negative sign, b closer positive, equal zero', () => {
    expect(sign(compareDistance(0, 0, 1, 0, 2, 0))).toBe(-1); // 1 vs 4
    expect(sign(compareDistance(0, 0, 0, 3, 1, 1))).toBe(1); // 9 vs 2
    expect(sign(compareDistance(0, 0, 3, 4, 5, 0))).toBe(0); // 25 vs 25
    expect(sign(compareDistance(1, 1, 0, 0, 2, 2))).toBe(0); // q is the midpoint
    expect(sign(compareDistance(7, -2, 7, -2, 7, -2))).toBe(0); // a = b = q
  });

  it('extreme magnitudes of the accepted range', () => {
    const M = 2 ** 120, m = 2 ** -120;
    // |q-a|^2 = 8 * 2^240 vs |q-b|^2 = 4 * 2^240: b closer.
    expect(sign(compareDistance(M, M, -M, -M, M, -M))).toBe(1);
    // q = (m, 0): a = (0, 0) and b = (2m, 0) are equally far.
    expect(sign(compareDistance(m, 0, 0, 0, 2 * m, 0))).toBe(0);
    // One ulp of 2^120 is 2^68: q one ulp right of the midpoint of a = 0 and b = 2^121 is closer to b.
    expect(sign(compareDistance(M + 2 ** 68, 0, 0, 0, 2 * M, 0))).toBe(1);
  });

  it('subnormal query coordinates (below the site range): squares underflow, the exact path decides', () => {
    const t = Number.MIN_VALUE; // 2^-1074
    // q = (t, 0), a = (0, 0), b = (3t, 0): |q-a| = t < |q-b| = 2t. Every square underflows to 0.
    expect(sign(compareDistance(t, 0, 0, 0, 3 * t, 0))).toBe(-1);
    expect(naiveSign(t, 0, 0, 0, 3 * t, 0)).toBe(0); // the naive formula cannot tell
    expect(sign(compareDistance(t, 0, 0, 0, 2 * t, 0))).toBe(0);
    expect(sign(compareDistance(0, 5 * t, 0, 0, 0, 9 * t))).toBe(1); // 5t vs 4t
  });

  it('the exact path rejects non-finite input instead of guessing', () => {
    expect(() => compareDistanceExact(NaN, 0, 0, 0, 1, 1)).toThrow(RangeError);
    expect(() => compareDistance(0, 0, Infinity, 0, 1, 1)).toThrow(RangeError);
  });
});

describe('compareDistance against a pure-BigInt reference', () => {
  const rnd = mulberry32(0x5eed1);
  /** A double with a random exponent in [-120, 119], random sign, 53 random bits; sometimes 0. */
  const wide = (): number => {
    if (rnd() < 0.03) return 0;
    const mant = 1 + Math.floor(rnd() * 2 ** 26) * 2 ** -26 + Math.floor(rnd() * 2 ** 26) * 2 ** -52;
    const e = Math.floor(rnd() * 240) - 120;
    return (rnd() < 0.5 ? -1 : 1) * mant * 2 ** e;
  };
  const inRange = (...v: number[]): boolean => v.every((x) => x === 0 || (Math.abs(x) >= 2 ** -120 && Math.abs(x) <= 2 ** 120));

  function check(q: number[], a: number[], b: number[]): void {
    const want = refSign(q[0], q[1], a[0], a[1], b[0], b[1]);
    const got = sign(compareDistance(q[0], q[1], a[0], a[1], b[0], b[1]));
    if (got !== want) throw new Error(`q=${q} a=${a} b=${b}: got ${got}, reference ${want}`);
    const pa = squaredDistance(q[0], q[1], a[0], a[1]), pb = squaredDistance(q[0], q[1], b[0], b[1]);
    expect(sign(compareKnownDistances(q[0], q[1], a[0], a[1], b[0], b[1], pa, pb))).toBe(want);
    expect(compareDistanceExact(q[0], q[1], a[0], a[1], b[0], b[1])).toBe(want);
    expect(sign(compareDistance(q[0], q[1], b[0], b[1], a[0], a[1]))).toBe(0 - want); // 0 - 0 is +0, unlike -0
  }

  it('random points of wildly different magnitudes', () => {
    for (let i = 0; i < 3000; i++) check([wide(), wide()], [wide(), wide()], [wide(), wide()]);
  });

  it('near ties: b is a rotated by a lattice-norm-preserving map about q, then nudged by a few ulps', () => {
    let ties = 0, nonTies = 0;
    for (let i = 0; i < 3000; i++) {
      const off = rnd() < 0.5 ? 1e7 : 0;
      // At 1e7 the grid step must stay a multiple of 2^-29 for the points to be exact.
      const s = off ? 2 ** (Math.floor(rnd() * 20) - 29) : 2 ** (Math.floor(rnd() * 60) - 30);
      const q = [off + Math.floor(rnd() * 2000 - 1000) * s, off + Math.floor(rnd() * 2000 - 1000) * s];
      // (3,4)/(5,0), (1,7)/(5,5), (1,8)/(4,7): equal integer norms, so exact ties before the nudge.
      const pairs = [[3, 4, 5, 0], [1, 7, 5, 5], [1, 8, 4, 7], [0, 25, 7, 24]];
      const [u, v, w, z] = pairs[i % pairs.length];
      const k = Math.floor(rnd() * 50) + 1;
      const a = [q[0] + u * k * s, q[1] + v * k * s];
      const b = [q[0] + w * k * s, q[1] - z * k * s];
      const nudge = Math.floor(rnd() * 5) - 2;
      b[0] += nudge * 2 ** -29 * (off ? 1 : s); // a few ulps at 1e7, a few steps of s otherwise
      if (!inRange(...q, ...a, ...b)) continue;
      if (refSign(q[0], q[1], a[0], a[1], b[0], b[1]) === 0) ties++;
      else nonTies++;
      check(q, a, b);
    }
    expect(ties).toBeGreaterThan(300);
    expect(nonTies).toBeGreaterThan(300);
  });

  it('q on the perpendicular bisector of integer points (exact ties, both orders)', () => {
    for (let i = 0; i < 2000; i++) {
      const ax = Math.floor(rnd() * 2000 - 1000), ay = Math.floor(rnd() * 2000 - 1000);
      const dx = Math.floor(rnd() * 200 - 100), dy = Math.floor(rnd() * 200 - 100);
      const t = Math.floor(rnd() * 200 - 100);
      // a and b = a + 2d; q = a + d + t * perp(d) is on the bisector.
      const q = [ax + dx - t * dy, ay + dy + t * dx];
      const b = [ax + 2 * dx, ay + 2 * dy];
      expect(refSign(q[0], q[1], ax, ay, b[0], b[1])).toBe(0);
      expect(sign(compareDistance(q[0], q[1], ax, ay, b[0], b[1]))).toBe(0);
      // One step off the bisector towards b.
      if (dx !== 0 || dy !== 0) {
        expect(sign(compareDistance(q[0] + dx, q[1] + dy, ax, ay, b[0], b[1]))).toBe(1);
      }
    }
  });
});

describe('exact ties near 1e7 where the naive formula is wrong (found by search)', () => {
  it('finds lattice-norm ties at offset 1e7 that the naive formula calls unequal; compareDistance gets all right', () => {
    // q = (1e7 + i * 2^-29, 1e7 + j * 2^-29) has 2^-29 resolution (1e7 is in [2^23, 2^24)),
    // a = q + m * 2^-29 * (3, 4), b = q + m * 2^-29 * (5, 0): exactly tied, and every
    // coordinate is a double (the same binade, multiples of 2^-29).
    const rnd = mulberry32(0x1e7);
    let naiveWrong = 0;
    let example = '';
    for (let trial = 0; trial < 2000; trial++) {
      const h = 2 ** -29;
      const q = [1e7 + Math.floor(rnd() * 2 ** 20) * h, 1e7 + Math.floor(rnd() * 2 ** 20) * h];
      const m = Math.floor(rnd() * 2 ** 40) + 2 ** 27; // 3m, 4m, 5m squared need rounding
      const a = [q[0] + 3 * m * h, q[1] + 4 * m * h];
      const b = [q[0] + 5 * m * h, q[1]];
      expect(refSign(q[0], q[1], a[0], a[1], b[0], b[1])).toBe(0);
      expect(sign(compareDistance(q[0], q[1], a[0], a[1], b[0], b[1]))).toBe(0);
      if (naiveSign(q[0], q[1], a[0], a[1], b[0], b[1]) !== 0) {
        naiveWrong++;
        if (!example) example = `q=(${q}) a=(${a}) b=(${b})`;
      }
    }
    // The naive formula rounds 9m^2 + 16m^2 differently from 25m^2 for many m.
    expect(naiveWrong, example).toBeGreaterThan(0);
  });

  it('finds near ties at 1e7 where the naive formula returns the OPPOSITE sign', () => {
    // a - q = (N, M) h and b - q = (N - k, M + k) h with N - M - k = +-1 give
    // |q-a|^2 - |q-b|^2 = 2k (N - M - k) h^2 = +-2k h^2: tiny next to the
    // rounding error of squares of ~40-bit integers, so the naive sign is a coin toss.
    const rnd = mulberry32(0xbad5);
    const h = 2 ** -29;
    let opposite = 0;
    let example = '';
    for (let trial = 0; trial < 2000; trial++) {
      const q = [1e7 + Math.floor(rnd() * 2 ** 20) * h, 1e7 + Math.floor(rnd() * 2 ** 20) * h];
      const N = Math.floor(rnd() * 2 ** 40) + 2 ** 28;
      const k = Math.floor(rnd() * 8) + 1;
      const M = N - k + (rnd() < 0.5 ? 1 : -1);
      const a = [q[0] + N * h, q[1] + M * h];
      const b = [q[0] + (N - k) * h, q[1] + (M + k) * h];
      const want = refSign(q[0], q[1], a[0], a[1], b[0], b[1]);
      expect(want).not.toBe(0);
      expect(sign(compareDistance(q[0], q[1], a[0], a[1], b[0], b[1]))).toBe(want);
      if (naiveSign(q[0], q[1], a[0], a[1], b[0], b[1]) === -want) {
        opposite++;
        if (!example) example = `q=(${q}) a=(${a}) b=(${b}) exact sign ${want}`;
      }
    }
    expect(opposite, example).toBeGreaterThan(0);
  });
});
