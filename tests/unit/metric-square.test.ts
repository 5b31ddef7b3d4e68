import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { FOUND, NONE, SquareCircle, UNSURE } from '../../src/diagram/metric/square.js';
import { PairBisector } from '../../src/diagram/metric/pair.js';

// The closed-form circle of the dual route (square.ts) against two things it does not use: the metric's own
// definition (|dx| + |dy|, max(|dx|, |dy|)) for the circles it finds, and the general construction along a
// bisector (pair.ts, the route's other path) for the cases it decides without a circle.

const NUM_RUNS = process.env.CI ? 2000 : 200;

type Metric = 'L1' | 'Linf';
const dist = (m: Metric, ax: number, ay: number, bx: number, by: number): number =>
  m === 'L1' ? Math.abs(ax - bx) + Math.abs(ay - by) : Math.max(Math.abs(ax - bx), Math.abs(ay - by));

/** The centre found, back in (x, y), as the dual route places it. */
const centreXY = (sq: SquareCircle, m: Metric): [number, number] =>
  m === 'L1' ? [(sq.cu + sq.cv) / 2, (sq.cu - sq.cv) / 2] : [sq.cu, sq.cv];

/** Whether c is on the left of a→b (counter-clockwise, y up), in floating point: the tests only use clear cases. */
const leftOf = (xy: Float64Array, a: number, b: number, c: number): number =>
  Math.sign((xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * b + 1] - xy[2 * a + 1]) * (xy[2 * c] - xy[2 * a]));

// Triples: uniform doubles, small integers (ties of every kind: equal coordinates, diagonal pairs,
// U = V), 1-ulp perturbations of integers, and the same far from zero.
const coord = fc.oneof(
  fc.double({ min: -1, max: 1, noNaN: true }),
  fc.integer({ min: -4, max: 4 }),
  fc.integer({ min: -4, max: 4 }).map((k) => k + (k === 0 ? 2 ** -52 : k * 2 ** -52)),
);
const triple = fc.tuple(fc.array(coord, { minLength: 8, maxLength: 8 }), fc.constantFrom(0, 1e7), fc.constantFrom<Metric>('L1', 'Linf'))
  .map(([c, off, m]) => ({ xy: Float64Array.from(c, (v) => v + off), m }));

describe('SquareCircle (the dual route\'s closed-form metric circle)', () => {
  it('a circle it finds passes through all three sites (the metric\'s definition)', () => {
    let found = 0;
    fc.assert(fc.property(triple, ({ xy, m }) => {
      const sq = new SquareCircle(xy, m === 'L1');
      if (sq.through(0, 1, 2) !== FOUND) return;
      found++;
      const [x, y] = centreXY(sq, m);
      let M = 0;
      for (const v of xy) M = Math.max(M, Math.abs(v));
      for (let i = 0; i < 3; i++) {
        // The centre is within about 16 u M of exact (square.ts): the distances within a few times that.
        expect(Math.abs(dist(m, x, y, xy[2 * i], xy[2 * i + 1]) - sq.r)).toBeLessThanOrEqual(2 ** -46 * M);
      }
    }), { numRuns: NUM_RUNS });
    expect(found).toBeGreaterThan(NUM_RUNS / 10);
  });

  it('its centres and its "no circle" agree with the bisector roots of pair.ts, whenever both decide', () => {
    let compared = 0, none = 0;
    fc.assert(fc.property(triple, ({ xy, m }) => {
      const sq = new SquareCircle(xy, m === 'L1');
      const pair = new PairBisector(xy, m === 'Linf');
      const side = leftOf(xy, 0, 1, 2);
      if (side === 0 || !pair.set(0, 1)) return;
      const s = pair.root(2, side);
      if (Number.isNaN(s)) return;
      const found = sq.through(0, 1, 2);
      if (found === UNSURE) return;
      compared++;
      if (found === NONE) {
        none++;
        expect(Number.isFinite(s)).toBe(false);
        return;
      }
      expect(Number.isFinite(s)).toBe(true);
      pair.point(s);
      const [x, y] = centreXY(sq, m);
      let M = 0;
      for (const v of xy) M = Math.max(M, Math.abs(v));
      expect(Math.abs(pair.x - x)).toBeLessThanOrEqual(2 ** -44 * M);
      expect(Math.abs(pair.y - y)).toBeLessThanOrEqual(2 ** -44 * M);
    }), { numRuns: NUM_RUNS });
    expect(compared).toBeGreaterThan(NUM_RUNS / 10);
    expect(none).toBeGreaterThan(0);
  });

  it('"inside every circle through a and b" is the pair\'s bounding box: checked on circles along the bisector', () => {
    let inside = 0, outside = 0;
    fc.assert(fc.property(triple, ({ xy, m }) => {
      const sq = new SquareCircle(xy, m === 'L1');
      const pair = new PairBisector(xy, m === 'Linf');
      if (!pair.set(0, 1)) return;
      const verdict = sq.insideBox(0, 1, 2);
      if (verdict === 0) return;
      // Circles through a and b: centres along the bisector, across its bends and far along both rays.
      const lo = Math.min(pair.tau * pair.Klo, pair.tau * pair.Khi), hi = Math.max(pair.tau * pair.Klo, pair.tau * pair.Khi);
      const w = hi - lo + 1;
      let outsideSome = false;
      for (let k = -40; k <= 40; k++) {
        const s = lo + ((hi - lo) * (k + 20)) / 40 + (Math.abs(k) > 20 ? Math.sign(k) * w * 2 ** (Math.abs(k) - 20) : 0);
        pair.point(s);
        const r = dist(m, pair.x, pair.y, xy[0], xy[1]);
        if (dist(m, pair.x, pair.y, xy[4], xy[5]) > r) outsideSome = true;
      }
      if (verdict > 0) { inside++; expect(outsideSome).toBe(false); } else { outside++; expect(outsideSome).toBe(true); }
    }), { numRuns: NUM_RUNS });
    expect(inside).toBeGreaterThan(0);
    expect(outside).toBeGreaterThan(0);
  });

  it('worked examples (by hand)', () => {
    // L-infinity, (0,0), (4,1), (2,3): the middle site in x is the highest, so the square's top is y = 3 and
    // its sides x = 0 and x = 4: centre (2, 1), radius 2.
    const sq = new SquareCircle(Float64Array.of(0, 0, 4, 1, 2, 3), false);
    expect(sq.through(0, 1, 2)).toBe(FOUND);
    expect([sq.cu, sq.cv, sq.r]).toEqual([2, 1, 2]);
    // (2, 0.5) instead lies between the others in y too: no square has all three on its sides.
    const none = new SquareCircle(Float64Array.of(0, 0, 4, 1, 2, 0.5), false);
    expect(none.through(0, 1, 2)).toBe(NONE);
    expect(none.inner).toBe(2);
    // L1, (0,0), (4,1), (2,4): in (x + y, x - y) they are (0,0), (5,3), (6,-2); U = 6 > V = 5, the middle one in
    // u, (5,3), is the highest in v, so the square spans u in [0, 6] and v in [-3, 3]: centre (3, 0), i.e.
    // (x, y) = (1.5, 1.5), at L1 distance 3 from all three (1.5 + 1.5, 2.5 + 0.5, 0.5 + 2.5).
    const l1 = new SquareCircle(Float64Array.of(0, 0, 4, 1, 2, 4), true);
    expect(l1.through(0, 1, 2)).toBe(FOUND);
    expect(centreXY(l1, 'L1')).toEqual([1.5, 1.5]);
    expect(l1.r).toBe(3);
    // (2, 1) level with (4, 1): the square [0, 4] x [-3, 1] holds the three on its sides, at a corner; a tie.
    expect(new SquareCircle(Float64Array.of(0, 0, 4, 1, 2, 1), false).through(0, 1, 2)).toBe(UNSURE);
    // Two sites on the x axis and one above the middle: U = V in the rotated frame, a tie left to pair.ts.
    expect(new SquareCircle(Float64Array.of(0, 0, 2, 0, 1, 2), true).through(0, 1, 2)).toBe(UNSURE);
  });
});
