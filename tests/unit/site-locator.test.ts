import { describe, expect, it } from 'vitest';
import { compareDistance } from '../../src/core/distance.js';
import { InputError } from '../../src/core/errors.js';
import { mulberry32 } from '../../src/core/random.js';
import { SiteLocator } from '../../src/query/site-locator.js';
import { triangulate, type Triangulation } from '../../src/triangulate/triangulation.js';
import { latticeCircle, permuteBy } from '../support/generators.js';

/** Brute force: every site, exact comparisons, ties to the smallest index. */
function bruteNearest(xy: Float64Array, n: number, x: number, y: number): number {
  let best = 0;
  for (let s = 1; s < n; s++) {
    if (compareDistance(x, y, xy[2 * s], xy[2 * s + 1], xy[2 * best], xy[2 * best + 1]) < 0) best = s;
  }
  return best;
}

/** Brute force: all sites sorted by (exact distance, index). */
function bruteOrder(xy: Float64Array, n: number, x: number, y: number): number[] {
  const ids = Array.from({ length: n }, (_, i) => i);
  return ids.sort((a, b) => compareDistance(x, y, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]) || a - b);
}

/** Checks nearest, kNearest (a few k) and nearestMany against brute force at the given queries. */
function checkAll(tri: Triangulation, queries: number[], ks: number[] = [1, 2, 3, 7]): void {
  const loc = new SiteLocator(tri);
  const n = tri.siteCount, xy = tri.siteXY;
  const want: number[] = [];
  for (let i = 0; i < queries.length; i += 2) {
    const x = queries[i], y = queries[i + 1];
    const order = bruteOrder(xy, n, x, y);
    const w = bruteNearest(xy, n, x, y);
    expect(order[0]).toBe(w); // the two brute forces agree
    want.push(w);
    expect(loc.nearest(x, y), `nearest(${x}, ${y})`).toBe(w);
    for (const k of ks) {
      if (k > n) continue;
      expect(Array.from(loc.kNearest(x, y, k)), `kNearest(${x}, ${y}, ${k})`).toEqual(order.slice(0, k));
    }
  }
  expect(Array.from(new SiteLocator(tri).nearestMany(queries))).toEqual(want);
  expect(Array.from(loc.nearestMany(Float64Array.from(queries)))).toEqual(want);
}

const seeded = (seed: number): (() => number) => {
  const next = mulberry32(seed);
  return () => next() / 2 ** 32;
};

/** Runs fn, which must throw an InputError with exactly these code, index and field. */
function expectInputError(fn: () => unknown, code: string, index: number, field: string): void {
  let caught: unknown;
  try { fn(); } catch (e) { caught = e; }
  expect(caught).toBeInstanceOf(InputError);
  const err = caught as InputError;
  expect({ code: err.code, index: err.index, field: err.field }).toEqual({ code, index, field });
}

describe('SiteLocator: worked examples', () => {
  it('three sites: answers pinned by hand', () => {
    const tri = triangulate([[0, 0], [10, 0], [0, 10]]);
    const loc = new SiteLocator(tri);
    expect(loc.nearest(1, 1)).toBe(0);
    expect(loc.nearest(9, 1)).toBe(1);
    expect(loc.nearest(-5, 12)).toBe(2);
    expect(loc.nearest(5, 5)).toBe(0); // the circumcentre: all three tied at 50
    expect(loc.nearest(6, 6)).toBe(1); // 72 from site 0, 52 from sites 1 and 2: smallest tied index
    expect(loc.nearest(5, 0)).toBe(0); // tied between 0 and 1
    expect(Array.from(loc.kNearest(5, 5, 3))).toEqual([0, 1, 2]);
    expect(Array.from(loc.kNearest(6, 6, 3))).toEqual([1, 2, 0]);
    expect(Array.from(loc.kNearest(100, 0, 3))).toEqual([1, 0, 2]);
    expect(Array.from(loc.nearestMany([1, 1, 9, 1, -5, 12]))).toEqual([0, 1, 2]);
  });

  it('one site: every query answers it; k = 1 only', () => {
    const tri = triangulate([[3, -4]]);
    const loc = new SiteLocator(tri);
    expect(tri.dimension).toBe(0);
    expect(loc.nearest(1e30, -1e30)).toBe(0);
    expect(loc.nearest(3, -4)).toBe(0);
    expect(Array.from(loc.kNearest(0, 0, 1))).toEqual([0]);
    expect(Array.from(loc.nearestMany([0, 0, 5, 5]))).toEqual([0, 0]);
    expectInputError(() => loc.kNearest(0, 0, 2), 'bad-k', -1, 'k');
  });

  it('two sites: the bisector goes to the smaller index', () => {
    const tri = triangulate([[4, 4], [0, 0]]);
    const loc = new SiteLocator(tri);
    expect(loc.nearest(2, 2)).toBe(0);
    expect(loc.nearest(4, 0)).toBe(0); // (4,0) is on the bisector x + y = 4
    expect(loc.nearest(-1, 4.5)).toBe(1); // 25.25 from site 0, 21.25 from site 1
    expect(loc.nearest(-1, 5)).toBe(0); // on the bisector: tie
    expect(loc.nearest(-1, 4)).toBe(1);
    expect(Array.from(loc.kNearest(-1, 5, 2))).toEqual([0, 1]);
    expect(Array.from(loc.kNearest(-1, 4, 2))).toEqual([1, 0]);
  });

  it('empty query arrays give an empty answer', () => {
    const loc = new SiteLocator(triangulate([[0, 0], [1, 0], [0, 1]]));
    expect(loc.nearestMany([]).length).toBe(0);
    expect(loc.nearestMany(new Float64Array(0)).length).toBe(0);
  });
});

describe('SiteLocator against brute force', () => {
  it('uniform random sites, random queries inside and far outside the hull (fresh locators use the grid)', () => {
    const rnd = seeded(11);
    const pts: number[] = [];
    for (let i = 0; i < 3000; i++) pts.push(rnd() * 100 - 50, rnd() * 60 - 30);
    const tri = triangulate(pts);
    const q: number[] = [];
    for (let i = 0; i < 150; i++) q.push(rnd() * 140 - 70, rnd() * 100 - 50);
    for (let i = 0; i < 20; i++) q.push((rnd() - 0.5) * 1e30, (rnd() - 0.5) * 1e30);
    checkAll(tri, q, [1, 5, 40]);
    // A fresh locator per query: the start comes from the grid, not from a previous answer.
    for (let i = 0; i < q.length; i += 2) {
      expect(new SiteLocator(tri).nearest(q[i], q[i + 1])).toBe(bruteNearest(tri.siteXY, tri.siteCount, q[i], q[i + 1]));
    }
  });

  it('integer grid (massive ties): queries at grid points, half-integers and cell corners', () => {
    const pts: [number, number][] = [];
    for (let i = 0; i < 15; i++) for (let j = 0; j < 12; j++) pts.push([i, j]);
    const rnd = mulberry32(7);
    const keys = Array.from({ length: 64 }, () => rnd() % 100000);
    const tri = triangulate(permuteBy(pts, keys));
    const q: number[] = [];
    for (let i = -1; i <= 15; i++) {
      for (let j = -1; j <= 12; j++) q.push(i, j, i + 0.5, j, i, j + 0.5, i + 0.5, j + 0.5);
    }
    checkAll(tri, q, [1, 2, 4, 5, 9, 13]);
  });

  it('a lattice ring queried at its centre: every site is tied', () => {
    const ring = latticeCircle(65); // 36 exactly cocircular integer points
    const rnd = mulberry32(3);
    const pts = permuteBy(ring, Array.from({ length: 64 }, () => rnd() % 100000)).map(([x, y]) => [x + 1000, y - 7]);
    const tri = triangulate(pts as [number, number][]);
    const loc = new SiteLocator(tri);
    const n = tri.siteCount;
    expect(n).toBe(36);
    expect(loc.nearest(1000, -7)).toBe(0);
    expect(Array.from(loc.kNearest(1000, -7, n))).toEqual(Array.from({ length: n }, (_, i) => i));
    expect(Array.from(loc.kNearest(1000, -7, 5))).toEqual([0, 1, 2, 3, 4]);
    // Warm-started from every site in turn, the answer stays the smallest index.
    for (let s = 0; s < n; s++) {
      loc.nearest(tri.siteXY[2 * s], tri.siteXY[2 * s + 1]);
      expect(loc.nearest(1000, -7)).toBe(0);
    }
    checkAll(tri, [1000, -7, 1000.5, -7, 1065, -7, 1000, 58, 999, -6], [1, 3, 10, 36]);
  });

  it('the same ring with its centre as a site', () => {
    const pts = latticeCircle(25).concat([[0, 0]]);
    const tri = triangulate(pts as [number, number][]);
    const loc = new SiteLocator(tri);
    const centre = tri.siteCount - 1;
    expect(loc.nearest(0, 0)).toBe(centre);
    expect(loc.nearest(0.25, -0.5)).toBe(centre);
    expect(Array.from(loc.kNearest(0, 0, 4))).toEqual([centre, 0, 1, 2]);
    checkAll(tri, [0, 0, 12.5, 0, 0, 12.5, 3, 4, 15, 20, -30, 0], [1, 2, 6, 21]);
  });

  it('collinear sites (dimension 1): the Delaunay graph is the path', () => {
    const pts: [number, number][] = [];
    for (let k = 0; k < 40; k++) pts.push([3 + 7 * ((k * 17) % 40), -2 + 5 * ((k * 17) % 40)]);
    const tri = triangulate(pts);
    expect(tri.dimension).toBe(1);
    const q: number[] = [];
    const rnd = seeded(5);
    for (let i = 0; i < 100; i++) q.push(rnd() * 400 - 50, rnd() * 300 - 50);
    // On perpendicular bisectors of consecutive sites: (mid) + t * (5, -7).
    for (let k = 0; k < 39; k++) q.push(3 + 7 * k + 3.5 + 5 * (k - 20), -2 + 5 * k + 2.5 - 7 * (k - 20));
    checkAll(tri, q, [1, 2, 3, 40]);
  });

  it('duplicates are merged: answers are sites, and each input point finds its own site', () => {
    const rnd = mulberry32(99);
    const base: [number, number][] = [[0, 0], [5, 1], [2, 7], [-3, 4], [6, 6], [1, -5]];
    const input: [number, number][] = [];
    for (let i = 0; i < 60; i++) input.push(base[rnd() % base.length]);
    const tri = triangulate(input);
    expect(tri.siteCount).toBeLessThanOrEqual(base.length);
    const loc = new SiteLocator(tri);
    const flat = input.flat();
    const many = loc.nearestMany(flat);
    for (let i = 0; i < input.length; i++) {
      expect(loc.nearest(input[i][0], input[i][1])).toBe(tri.siteOfInput[i]);
      expect(many[i]).toBe(tri.siteOfInput[i]);
    }
    checkAll(tri, [1, 1, 2.5, 0.5, 10, 10, -3, 4, 0, -2.5], [1, 2, tri.siteCount]);
  });

  it('offsets of 1e7: tiny cells far from the origin, and lattice ties the naive formula misjudges', () => {
    const rnd = seeded(17);
    const pts: number[] = [];
    for (let i = 0; i < 1500; i++) pts.push(1e7 + rnd() * 10, 1e7 + rnd() * 10);
    const tri = triangulate(pts);
    const q: number[] = [];
    for (let i = 0; i < 200; i++) q.push(1e7 + rnd() * 12 - 1, 1e7 + rnd() * 12 - 1);
    checkAll(tri, q, [1, 4, 25]);

    // q = (1e7 + f, 1e7 + g), sites q + m h (3, 4), q + m h (5, 0), q + m h (0, -5) (h = 2^-29,
    // the spacing of doubles near 1e7): exactly tied, and with m large the naive squared
    // distances round differently. A nearer decoy keeps the walk honest for k = 4.
    const h = 2 ** -29;
    let checked = 0;
    for (let t = 0; t < 50; t++) {
      const qx = 1e7 + Math.floor(rnd() * 2 ** 20) * h, qy = 1e7 + Math.floor(rnd() * 2 ** 20) * h;
      const m = Math.floor(rnd() * 2 ** 36) + 2 ** 30;
      const sites = [
        [qx + 6 * m * h, qy + 6 * m * h], // farther (72 m^2 > 25 m^2)
        [qx + 5 * m * h, qy], [qx + 3 * m * h, qy + 4 * m * h], [qx, qy - 5 * m * h],
        [qx - 2 * m * h, qy + m * h], // nearer (5 m^2)
      ];
      const tri2 = triangulate(sites as [number, number][]);
      const loc = new SiteLocator(tri2);
      expect(loc.nearest(qx, qy)).toBe(4);
      expect(Array.from(loc.kNearest(qx, qy, 4))).toEqual([4, 1, 2, 3]);
      checkAll(tri2, [qx, qy, qx + m * h, qy + m * h], [1, 2, 3, 4, 5]);
      checked++;
    }
    expect(checked).toBe(50);
  });

  it('queries with subnormal coordinates are accepted and answered exactly', () => {
    const tri = triangulate([[0, 0], [2 ** -100, 0], [0, 2 ** -100], [2 ** -100, 2 ** -100]]);
    const loc = new SiteLocator(tri);
    expect(loc.nearest(Number.MIN_VALUE, 0)).toBe(0);
    expect(loc.nearest(2 ** -101, 2 ** -101)).toBe(0); // the centre: all four tied
    expect(loc.nearest(2 ** -101 + 2 ** -150, 2 ** -101)).toBe(1); // right of the centre: 1 and 3 tied
    expect(Array.from(loc.kNearest(2 ** -101, 2 ** -101, 4))).toEqual([0, 1, 2, 3]);
  });
});

describe('SiteLocator: bad input', () => {
  const tri = triangulate([[0, 0], [1, 0], [0, 1], [1, 1]]);
  const loc = new SiteLocator(tri);

  it('non-finite and out-of-range coordinates', () => {
    expectInputError(() => loc.nearest(NaN, 0), 'not-finite', -1, 'x');
    expectInputError(() => loc.nearest(0, Infinity), 'not-finite', -1, 'y');
    expectInputError(() => loc.nearest(-Infinity, 0), 'not-finite', -1, 'x');
    expectInputError(() => loc.nearest(2 ** 121, 0), 'out-of-range', -1, 'x');
    expectInputError(() => loc.kNearest(0, NaN, 1), 'not-finite', -1, 'y');
    expectInputError(() => loc.kNearest(-(2 ** 121), 0, 1), 'out-of-range', -1, 'x');
    expectInputError(() => loc.nearest('1' as unknown as number, 0), 'not-a-number', -1, 'x');
    expect(loc.nearest(2 ** 120, -(2 ** 120))).toBe(1); // the limit itself is fine
  });

  it('nearestMany names the first bad query', () => {
    expectInputError(() => loc.nearestMany([0, 0, 1, 1, 2, 2, 3, NaN]), 'not-finite', 3, 'y');
    expectInputError(() => loc.nearestMany(Float64Array.of(0, 0, Infinity, 1)), 'not-finite', 1, 'x');
    expectInputError(() => loc.nearestMany([0, 0, 1e37, 0]), 'out-of-range', 1, 'x');
    expectInputError(() => loc.nearestMany([0, 0, 1]), 'odd-length', 1, 'points');
  });

  it('k must be an integer in 1..siteCount', () => {
    expectInputError(() => loc.kNearest(0, 0, 0), 'bad-k', -1, 'k');
    expectInputError(() => loc.kNearest(0, 0, 5), 'bad-k', -1, 'k');
    expectInputError(() => loc.kNearest(0, 0, 1.5), 'bad-k', -1, 'k');
    expectInputError(() => loc.kNearest(0, 0, -1), 'bad-k', -1, 'k');
    expectInputError(() => loc.kNearest(0, 0, NaN), 'bad-k', -1, 'k');
    expectInputError(() => loc.kNearest(0, 0, Infinity), 'bad-k', -1, 'k');
    expectInputError(() => loc.kNearest(0, 0, '2' as unknown as number), 'bad-k', -1, 'k');
    expect(Array.from(loc.kNearest(0, 0, 4))).toEqual([0, 1, 2, 3]);
  });

  it('a failed query leaves the locator usable', () => {
    expect(() => loc.nearestMany([0, 0, NaN, 0])).toThrow(InputError);
    expect(loc.nearest(0.9, 0.8)).toBe(3);
  });
});
