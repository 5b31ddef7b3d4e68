import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readClipRegion } from '../../src/diagram/region.js';
import { checkMesh, InputError, orient, voronoi, type Metric } from '../../src/index.js';
import { monotoneChainHull } from '../support/hull.js';
import { polygonArea } from '../support/voronoi-brute.js';

// 1000 runs in CI, 100 locally: common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 100;

/** Whether b lists the vertices of a in the same cyclic order (any start). */
function sameCycle(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  const n = a.length >> 1;
  for (let r = 0; r < n; r++) {
    let ok = true;
    for (let i = 0; i < n && ok; i++) ok = a[2 * i] === b[2 * ((i + r) % n)] && a[2 * i + 1] === b[2 * ((i + r) % n) + 1];
    if (ok) return true;
  }
  return n === 0;
}

function reversed(flat: number[]): number[] {
  const out: number[] = [];
  for (let i = flat.length - 2; i >= 0; i -= 2) out.push(flat[i], flat[i + 1]);
  return out;
}

function clipError(region: unknown): InputError {
  try {
    readClipRegion(region as never);
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).field).toBe('clip');
    return e as InputError;
  }
  throw new Error('expected an InputError, nothing was thrown');
}

describe('readClipRegion', () => {
  it('turns a rectangle into its corners, counter-clockwise from (minX, minY)', () => {
    expect(Array.from(readClipRegion({ minX: -1, minY: 2, maxX: 3, maxY: 5 }))).toEqual([-1, 2, 3, 2, 3, 5, -1, 5]);
  });

  it('reads every point layout alike', () => {
    const ccw = [0, 0, 4, 0, 5, 3, 1, 4];
    const pairs = [[0, 0], [4, 0], [5, 3], [1, 4]] as [number, number][];
    for (const layout of [ccw, Float64Array.from(ccw), pairs, pairs.map(([x, y]) => ({ x, y }))]) {
      expect(Array.from(readClipRegion(layout))).toEqual(ccw);
    }
  });

  it('returns a clockwise polygon counter-clockwise, same vertices', () => {
    const ccw = [0, 0, 4, 0, 5, 3, 1, 4];
    const out = readClipRegion(reversed(ccw));
    expect(sameCycle(out, ccw)).toBe(true);
  });

  it('drops a closing vertex equal to the first', () => {
    expect(Array.from(readClipRegion([[0, 0], [2, 0], [0, 2], [0, 0]]))).toEqual([0, 0, 2, 0, 0, 2]);
  });

  it('keeps a vertex in the middle of a straight side (still convex) and clips with it', () => {
    const poly = [0, 0, 1, 0, 2, 0, 2, 2, 0, 2];
    expect(Array.from(readClipRegion(poly))).toEqual(poly);
    const d = voronoi([[0.5, 0.5], [1.5, 1.5]], { clip: poly });
    expect(checkMesh(d.mesh).problems).toEqual([]);
    expect(d.totalArea()).toBeCloseTo(4, 12);
  });

  it('cells crossing a straight side next to its middle vertex (found by a random search) tile the region, in every metric', () => {
    // The vertices (0.5, -0.25), (1.25, -0.25), (1.75, -0.25) lie on one line; so do (2.75, -0.5), (7, -0.5),
    // (7.25, -0.5) in the second case. A crossing near the middle vertex was once filed under the wrong half
    // of the side, out of order along the boundary, and the mesh could not be linked.
    // Under L1 and Linf the second case is refused: site (0.5, 0) lies outside and its cell reaches in twice.
    const cases: [[number, number][], [number, number][], Metric[]][] = [
      [[[2, 1], [0, 2], [1, 1.25], [0.25, 1], [1.25, 1.25], [1.75, 1.5], [0.75, 1.5], [0.75, 1.25], [0.25, 1]],
        [[1.25, 2.25], [0.25, 2.25], [-0.25, 0.5], [0, 0], [0.5, -0.25], [1.25, -0.25], [1.75, -0.25]], ['L2', 'L1', 'Linf', 1.5]],
      [[[5.25, 6.75], [4.75, 2], [0.25, 4.25], [9.5, 3.75], [7.5, 1.5], [4.25, 2.75], [0.5, 0]],
        [[10, 8.25], [9, 9.5], [1, 9.25], [2.75, -0.5], [7, -0.5], [7.25, -0.5]], ['L2', 1.5, 3]],
    ];
    for (const [sites, clip, metrics] of cases) {
      const area = Math.abs(clip.reduce((s, [x, y], i) => s + x * clip[(i + 1) % clip.length][1] - clip[(i + 1) % clip.length][0] * y, 0)) / 2;
      for (const metric of metrics) {
        const d = voronoi(sites, { clip, metric });
        expect(checkMesh(d.mesh).problems, `metric ${metric}`).toEqual([]);
        expect(Math.abs(d.totalArea() - area)).toBeLessThanOrEqual(1e-12 * area);
      }
    }
  });

  const bad: [string, unknown, string, number | null][] = [
    ['two vertices', [[0, 0], [1, 1]], 'clip-too-few', null],
    ['a repeated vertex', [[0, 0], [1, 0], [1, 0], [1, 1]], 'clip-repeated', 2],
    ['a NaN vertex', [[0, 0], [1, 0], [1, Number.NaN]], 'not-finite', 2],
    ['a string coordinate', [[0, 0], [1, 0], ['1', 1]], 'not-a-number', 2],
    ['a NaN rectangle bound', { minX: 0, minY: 0, maxX: Number.NaN, maxY: 1 }, 'not-finite', null],
    ['an empty rectangle', { minX: 0, minY: 0, maxX: 0, maxY: 1 }, 'clip-degenerate', null],
    ['a bow-tie', [[0, 0], [2, 2], [2, 0], [0, 2]], 'clip-self-intersecting', null],
    ['an L-shape', [[0, 0], [4, 0], [4, 2], [2, 2], [2, 4], [0, 4]], 'clip-not-convex', 3],
    ['three collinear vertices (zero area)', [[0, 0], [1, 1], [2, 2]], 'clip-degenerate', null],
  ];
  it.each(bad)('rejects %s', (_label, region, code, index) => {
    const e = clipError(region);
    expect(e.code).toBe(code);
    if (index !== null) expect(e.index).toBe(index);
  });

  it('returns any convex polygon counter-clockwise with the same vertices, in either orientation and any start', () => {
    const coord = fc.integer({ min: -1000, max: 1000 });
    fc.assert(
      fc.property(fc.array(fc.tuple(coord, coord), { minLength: 3, maxLength: 30 }), fc.boolean(), fc.nat(), (pts, cw, rot) => {
        // Hull with strict corners only (exact orient), counter-clockwise.
        const h = monotoneChainHull(pts.flat());
        const ccw: number[] = [];
        for (let i = 0; i < h.length; i++) {
          const a = h[(i + h.length - 1) % h.length], b = h[i], c = h[(i + 1) % h.length];
          if (orient(a[0], a[1], b[0], b[1], c[0], c[1]) > 0) ccw.push(b[0], b[1]);
        }
        fc.pre(ccw.length >= 6);
        const given = cw ? reversed(ccw) : ccw.slice();
        const r = 2 * (rot % (given.length / 2));
        const out = readClipRegion(given.slice(r).concat(given.slice(0, r)));
        expect(polygonArea(out)).toBeGreaterThan(0);
        expect(sameCycle(out, ccw)).toBe(true);
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('rejects a convex polygon with one vertex pushed inward past its neighbours chord (non-convex)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 4, max: 16 }), fc.nat(), fc.double({ min: 0.05, max: 0.9, noNaN: true }), (k, which, depth) => {
        // Regular k-gon of radius 1000, rounded to integers; vertex j moved towards the centre past its neighbours' chord.
        const pts: [number, number][] = [];
        for (let i = 0; i < k; i++) pts.push([Math.round(1000 * Math.cos((2 * Math.PI * i) / k)), Math.round(1000 * Math.sin((2 * Math.PI * i) / k))]);
        const j = which % k;
        const chord = Math.cos(Math.PI / k); // distance of the neighbours' chord midpoint, in radii
        const rr = Math.round(1000 * chord * (1 - depth));
        pts[j] = [Math.round(rr * Math.cos((2 * Math.PI * j) / k)), Math.round(rr * Math.sin((2 * Math.PI * j) / k))];
        const a = pts[(j + k - 1) % k], b = pts[j], c = pts[(j + 1) % k];
        fc.pre(orient(a[0], a[1], b[0], b[1], c[0], c[1]) < 0);
        const e = clipError(pts);
        expect(e.code).toBe('clip-not-convex');
        expect(e.index).toBe(j);
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('rejects a region only a few ulps wide at its coordinates (too thin to clip to)', () => {
    // At 1e7 one ulp is about 1.9e-9; a triangle 1.5e-8 wide is 8 ulps across.
    const thin: [number, number][] = [[1e7, 1e7], [1e7 + 1.5e-8, 1e7 + 0.5], [1e7, 1e7 + 1]];
    const e = clipError(thin);
    expect(e.code).toBe('clip-degenerate');
    const rect = clipError({ minX: 1e7, minY: 0, maxX: 1e7 + 4e-9, maxY: 1 });
    expect(rect.code).toBe('clip-degenerate');
    // The same shape a thousand times wider is fine.
    expect(readClipRegion([[1e7, 1e7], [1e7 + 1.5e-5, 1e7 + 0.5], [1e7, 1e7 + 1]]).length).toBe(6);
  });
});
