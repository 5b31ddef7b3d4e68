import { describe, expect, it } from 'vitest';
import { InputError, naturalNeighbor, nearestValue, triangulate } from '../../src/index.js';
import { prng } from '../support/live-cases.js';

const SQUARE = [0, 0, 1, 0, 1, 1, 0, 1];

function errorOf(fn: () => unknown): InputError {
  try { fn(); } catch (e) { if (e instanceof InputError) return e; throw e; }
  throw new Error('expected an InputError');
}

describe('naturalNeighbor: worked examples', () => {
  it('at the centre of a square of four sites every weight is 1/4 (symmetry)', () => {
    expect(naturalNeighbor(SQUARE, [1, 2, 3, 4]).at(0.5, 0.5)).toBe(2.5);
    // The same four sites turned 45 degrees, all cocircular with q at the centre: still 1/4 each.
    expect(naturalNeighbor([1, 0, 0, 1, -1, 0, 0, -1], [1, 10, 100, 1000]).at(0, 0)).toBeCloseTo(277.75, 12);
  });

  it('off the centre: weights from symmetry and linear precision, worked by hand', () => {
    // At (1/4, 1/2) the mirror y -> 1 - y gives w(0,0) = w(0,1) and w(1,0) = w(1,1); linear precision in x
    // (Sibson 1981) gives 2 w(1,0) = 1/4, so the weights are 3/8, 1/8, 1/8, 3/8 and the value
    // 3/8 (1 + 1000) + 1/8 (10 + 100) = 389.125. Rounding: a few units in the last place of 389.
    expect(naturalNeighbor(SQUARE, [1, 10, 100, 1000]).at(0.25, 0.5)).toBeCloseTo(389.125, 11);
  });

  it('equals the data at the sites and is NaN strictly outside the hull', () => {
    const interp = naturalNeighbor(SQUARE, [1, 10, 100, 1000]);
    expect([interp.at(0, 0), interp.at(1, 0), interp.at(1, 1), interp.at(0, 1)]).toEqual([1, 10, 100, 1000]);
    expect(interp.at(1.5, 0.5)).toBeNaN();
    expect(interp.at(-1e-300, 0.5)).toBeNaN();
    expect(interp.at(2, 0)).toBeNaN(); // on the line of a hull edge, beyond it
  });

  it('on a hull edge is linear along the edge, the limit of the values from inside', () => {
    const rnd = prng(31);
    const pts = [0, 0, 4, 0, 4, 4, 0, 4];
    for (let i = 0; i < 30; i++) pts.push(0.2 + 3.6 * rnd(), 0.2 + 3.6 * rnd());
    const values = Array.from({ length: pts.length / 2 }, () => rnd());
    const interp = naturalNeighbor(pts, values);
    const edge = values[0] + (1.3 / 4) * (values[1] - values[0]);
    expect(interp.at(1.3, 0)).toBeCloseTo(edge, 15);
    // From inside the gap to the edge value shrinks with the distance (measured here: about in proportion).
    const gaps = [1e-2, 1e-4, 1e-6, 1e-8].map((eps) => Math.abs(interp.at(1.3, eps) - edge));
    for (let k = 1; k < gaps.length; k++) expect(gaps[k]).toBeLessThan(gaps[k - 1] / 10);
    expect(gaps[3]).toBeLessThan(1e-6);
  });

  it('takes a triangulation with merged duplicates: one value per input point, duplicates agreeing', () => {
    const tri = triangulate([0, 0, 1, 0, 0, 1, 1, 0]);
    expect(tri.mergedCount).toBe(1);
    expect(naturalNeighbor(tri, [0, 1, 2, 1]).at(0.25, 0.25)).toBeCloseTo(0.25 + 2 * 0.25, 14);
    const err = errorOf(() => naturalNeighbor(tri, [0, 1, 2, 5]));
    expect(err.code).toBe('conflicting-values');
    expect(err.index).toBe(3);
  });

  it('is a snapshot: a later insert into the triangulation changes nothing', () => {
    const tri = triangulate(SQUARE);
    const interp = naturalNeighbor(tri, [1, 10, 100, 1000]);
    const before = interp.at(0.3, 0.6);
    tri.insert([0.5, 0.5, 0.2, 0.7]);
    expect(interp.at(0.3, 0.6)).toBe(before);
  });

  it('collinear sites interpolate along their segment, NaN off it; one site only at itself', () => {
    const line = naturalNeighbor([0, 0, 2, 2, 1, 1], [0, 20, 10]);
    expect(line.at(0.5, 0.5)).toBe(5);
    expect(line.at(1, 1)).toBe(10);
    expect(line.at(1.5, 1.5)).toBe(15);
    expect(line.at(1, 1.5)).toBeNaN();
    expect(line.at(3, 3)).toBeNaN();
    const one = naturalNeighbor([[2, 3]], [7]);
    expect(one.at(2, 3)).toBe(7);
    expect(one.at(2, 3.5)).toBeNaN();
    expect(Array.from(line.grid({ minX: 0, minY: 0, maxX: 2, maxY: 2, columns: 2, rows: 2 }))).toEqual([5, NaN, NaN, 15]);
  });

  it('stays finite and exact on an ill-conditioned case found by the property tests', () => {
    // Four sites within 2e-8 of each other near 1e7, two pairs an ulp or so apart: the floating sums cancel
    // and the exact path answers. The value must lie between the data, here 0 and 1.9e-15.
    const flat = [9999999.5, 9999999.5, 9999999.50000611, 9999999.5, 9999999.5, 9999999.500000015, 9999999.500000015, 9999999.5];
    const v = naturalNeighbor(flat, [0, 1.887379141862766e-15, 0, 1.887379141862766e-15]).at(9999999.500000007, 9999999.500000007);
    expect(v).toBeGreaterThanOrEqual(0);
    expect(v).toBeLessThanOrEqual(1.887379141862766e-15);
    // A sliver two sites an ulp apart: linear data reproduced (found by the property tests at 1.3e-9 relative
    // before the exact path; now within the rounding of the reference, a few u of 0.03).
    const sliver = [-0.5, -0.5, -0.5, -0.4999999999999999, -0.4999747574329376, -0.4999665468931198];
    const lin = (x: number, y: number) => 0.0625 * y;
    const vals = [0, 1, 2].map((i) => lin(sliver[2 * i], sliver[2 * i + 1]));
    const q = [-0.499986365514845, -0.4999819306852579];
    expect(Math.abs(naturalNeighbor(sliver, vals).at(q[0], q[1]) - lin(q[0], q[1]))).toBeLessThan(1e-17);
  });
});

describe('grids', () => {
  it('sample cell centres row by row from minY, equal to at() number for number', () => {
    const rnd = prng(8);
    const pts = Array.from({ length: 400 }, () => rnd());
    const values = Array.from({ length: 200 }, () => rnd());
    const spec = { minX: -0.1, minY: -0.05, maxX: 1.1, maxY: 1.05, columns: 37, rows: 23 };
    for (const interp of [naturalNeighbor(pts, values), nearestValue(pts, values)]) {
      const g = interp.grid(spec);
      expect(g.length).toBe(37 * 23);
      const dx = (spec.maxX - spec.minX) / spec.columns, dy = (spec.maxY - spec.minY) / spec.rows;
      for (let i = 0; i < spec.rows; i++) {
        for (let j = 0; j < spec.columns; j++) {
          expect(Object.is(g[i * spec.columns + j], interp.at(spec.minX + (j + 0.5) * dx, spec.minY + (i + 0.5) * dy))).toBe(true);
        }
      }
    }
  });

  it('refuses grids with zero or negative size and bad counts', () => {
    const interp = naturalNeighbor(SQUARE, [1, 2, 3, 4]);
    const ok = { minX: 0, minY: 0, maxX: 1, maxY: 1, columns: 2, rows: 2 };
    const bad: [Record<string, unknown>, string][] = [
      [{ columns: 0 }, 'grid.columns'], [{ columns: -3 }, 'grid.columns'], [{ rows: 1.5 }, 'grid.rows'],
      [{ rows: NaN }, 'grid.rows'], [{ maxX: 0 }, 'grid.maxX'], [{ maxY: -1 }, 'grid.maxY'],
      [{ minX: Infinity }, 'grid.minX'], [{ minY: '0' }, 'grid.minY'], [{ columns: 2 ** 14, rows: 2 ** 14 }, 'grid.columns'],
    ];
    for (const [change, field] of bad) {
      for (const it2 of [interp, nearestValue(SQUARE, [1, 2, 3, 4])]) {
        const err = errorOf(() => it2.grid({ ...ok, ...change } as never));
        expect(err.code).toBe('bad-grid');
        expect(err.field).toBe(field);
      }
    }
    expect(errorOf(() => interp.grid(null as never)).code).toBe('bad-grid');
  });
});

describe('bad input', () => {
  it('refuses values of the wrong length or kind, weighted sites and bad query coordinates', () => {
    expect(errorOf(() => naturalNeighbor(SQUARE, [1, 2, 3])).code).toBe('bad-length');
    expect(errorOf(() => nearestValue(SQUARE, [1, 2, 3, 4, 5])).code).toBe('bad-length');
    expect(errorOf(() => naturalNeighbor(SQUARE, 5 as never)).code).toBe('bad-option');
    const nan = errorOf(() => naturalNeighbor(SQUARE, [1, NaN, 3, 4]));
    expect([nan.code, nan.index, nan.field]).toEqual(['not-finite', 1, 'values']);
    expect(errorOf(() => naturalNeighbor(triangulate(SQUARE, { weights: [1, 0, 0, 0] }), [1, 2, 3, 4])).field).toBe('weights');
    const interp = naturalNeighbor(SQUARE, [1, 2, 3, 4]);
    expect(errorOf(() => interp.at(NaN, 0)).code).toBe('not-finite');
    expect(errorOf(() => interp.at(0, '1' as never)).code).toBe('not-a-number');
    expect(errorOf(() => nearestValue(SQUARE, [1, 2, 3, 4]).at(Infinity, 0)).code).toBe('not-finite');
  });
});

describe('nearestValue', () => {
  it('is the value of the nearest site, everywhere, ties to the smallest site', () => {
    const near = nearestValue(SQUARE, [1, 2, 3, 4]);
    expect(near.at(0.1, 0.2)).toBe(1);
    expect(near.at(0.9, 0.2)).toBe(2);
    expect(near.at(5, 5)).toBe(3);
    expect(near.at(0.5, 0.5)).toBe(1);
  });
});
