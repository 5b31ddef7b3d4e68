import { describe, expect, it } from 'vitest';
import { AmbitError, checkMesh, InputError, MetricVoronoiDiagram, voronoi, VoronoiDiagram } from '../../src/index.js';
import { mulberry32 } from '../../src/core/random.js';
import { dualRoute } from '../../src/diagram/metric/dual.js';

/** The cell polygon as [x, y] pairs. */
const cell = (d: { cellPolygon(s: number): Float64Array }, s: number): number[][] => {
  const p = Array.from(d.cellPolygon(s)), out: number[][] = [];
  for (let i = 0; i < p.length; i += 2) out.push([p[i], p[i + 1]]);
  return out;
};

const metricDiagram = (points: number[], metric: 'L1' | 'Linf', clip: { minX: number; minY: number; maxX: number; maxY: number }): MetricVoronoiDiagram => {
  const d = voronoi(points, { metric, clip });
  expect(d).toBeInstanceOf(MetricVoronoiDiagram);
  expect(checkMesh(d.mesh).problems).toEqual([]);
  return d as MetricVoronoiDiagram;
};

describe('worked examples (bisectors worked out by hand)', () => {
  it('L1, two sites on a 45 degree diagonal: the tie quadrants are split by the Euclidean bisector x + y = 2', () => {
    // d1 ties on {x <= 0, y >= 2} and {x >= 2, y <= 0}; the rule gives them to the Euclidean-nearer site,
    // so the whole boundary is x + y = 2, which cuts the box [-2, 4]^2 through (4, -2) and (-2, 4).
    const d = metricDiagram([0, 0, 2, 2], 'L1', { minX: -2, minY: -2, maxX: 4, maxY: 4 });
    expect(cell(d, 0)).toEqual([[-2, -2], [4, -2], [-2, 4]]);
    expect(cell(d, 1)).toEqual([[-2, 4], [4, -2], [4, 4]]);
    expect(Array.from(d.cellAreas())).toEqual([18, 18]);
    expect(d.cellNeighbors(0).sites).toEqual(Int32Array.of(1));
    expect(d.cellNeighbors(0).lengths[0]).toBeCloseTo(6 * Math.SQRT2, 12);
  });

  it('L-infinity, an axis-parallel pair: the boundary is x = 1 all the way', () => {
    // d_inf ties on the cones |y| >= max(|x|, |x - 2|); the Euclidean rule splits them at x = 1.
    const d = metricDiagram([0, 0, 2, 0], 'Linf', { minX: -1, minY: -3, maxX: 3, maxY: 3 });
    expect(cell(d, 0)).toEqual([[-1, -3], [1, -3], [1, 3], [-1, 3]]);
    expect(Array.from(d.cellAreas())).toEqual([12, 12]);
  });

  it('L1, a general pair bends twice: vertical rays joined by a 45 degree segment', () => {
    // Sites (0,0), (2,1): below y = 0 the boundary is x = 1.5, between y = 0 and 1 it is x + y = 1.5,
    // above y = 1 it is x = 0.5.
    const d = metricDiagram([0, 0, 2, 1], 'L1', { minX: -2, minY: -2, maxX: 4, maxY: 3 });
    expect(cell(d, 0)).toEqual([[-2, -2], [1.5, -2], [1.5, 0], [0.5, 1], [0.5, 3], [-2, 3]]);
    // Shoelace by hand: (7 + 3 + 1.5 + 1 + 7.5 + 10) / 2 = 15.
    expect(d.cellAreas()[0]).toBe(15);
    expect(d.cellAreas()[0] + d.cellAreas()[1]).toBe(30);
    // Bends are mesh vertices of degree 2: the shared boundary is one neighbour with three edges.
    expect(d.cellNeighbors(0).sites).toEqual(Int32Array.of(1));
    expect(d.neighborCounts()).toEqual(Int32Array.of(1, 1));
  });

  it('L-infinity, a general pair: 45 degree rays joined by a vertical segment', () => {
    // Sites (0,0), (2,1): for 0 <= y <= 1 the boundary is x = 1; above, x + y = 2; below, x + y = 1.
    const d = metricDiagram([0, 0, 2, 1], 'Linf', { minX: -2, minY: -2, maxX: 4, maxY: 3 });
    expect(cell(d, 0)).toEqual([[-2, -2], [3, -2], [1, 0], [1, 1], [-1, 3], [-2, 3]]);
  });

  it('a 2 x 2 grid under L-infinity meets at one vertex of degree 4', () => {
    const d = metricDiagram([0, 0, 0, 2, 1, 0, 1, 2], 'Linf', { minX: -1, minY: -1, maxX: 2, maxY: 3 });
    const xy = d.mesh.vertexXY;
    let centre = -1;
    for (let v = 0; v < d.mesh.vertexCount; v++) if (xy[2 * v] === 0.5 && xy[2 * v + 1] === 1) centre = v;
    expect(centre).toBeGreaterThanOrEqual(0);
    let degree = 0;
    for (let e = 0; e < d.mesh.halfEdgeCount; e++) if (d.mesh.origin[e] === centre) degree++;
    expect(degree).toBe(4);
    expect(Array.from(d.cellAreas())).toEqual([3, 3, 3, 3]);
  });

  it('duplicates merge onto one site and the cells still partition the region', () => {
    const d = metricDiagram([0, 0, 2, 2, 0, 0, 2, 2, 0, 0], 'L1', { minX: -2, minY: -2, maxX: 4, maxY: 4 });
    expect(d.triangulation.siteCount).toBe(2);
    expect(d.triangulation.mergedCount).toBe(3);
    expect(d.totalArea()).toBe(36);
  });

  it('a site outside the clip region keeps the part of its cell that reaches in', () => {
    const d = metricDiagram([0, 0, 3, 0], 'L1', { minX: -1, minY: -1, maxX: 2, maxY: 1 });
    expect(cell(d, 1)).toEqual([[1.5, -1], [2, -1], [2, 1], [1.5, 1]]);
    const far = metricDiagram([0, 0, 30, 0], 'L1', { minX: -1, minY: -1, maxX: 2, maxY: 1 });
    expect(Array.from(far.sitesWithoutCell)).toEqual([1]);
    expect(far.cellPolygon(1).length).toBe(0);
  });
});

describe('convex polygon clips, worked by hand', () => {
  it('L-infinity: a bisector through a region corner bulges past the side whose ends both lie on it', () => {
    // Sites s = (0.5, 0.75), u = (1, 0.5): the boundary is x = 0.75 for 0.5 <= y <= 0.75, then y = x up to the
    // corner (1, 1), and y = x - 0.25 below. The region side from (0.5, 0) to (1, 1) meets it at (0.75, 0.5) and
    // (1, 1) only, so u keeps the triangle (0.75, 0.5), (1, 1), (0.75, 0.75) of area 1/32 although no corner of
    // s's first cell lies strictly on u's side.
    const d = voronoi([0.5, 0.75, 1, 0.5, 0.5, 0.25], { metric: 'Linf', clip: [1, 1, 0.5, 1, 0, 0.5, 0.5, 0] });
    expect(checkMesh(d.mesh).problems).toEqual([]);
    expect(cell(d, 1)).toEqual([[0.75, 0.5], [1, 1], [0.75, 0.75]]);
    expect(d.cellAreas()[1]).toBe(1 / 32);
    expect(d.totalArea()).toBe(0.5);
  });

  it('a site outside the region whose cell meets it in two pieces is refused with a typed error, whichever corner its cell starts at', () => {
    // Site (1, 1) lies below the side from (-0.5, 2.75) to (4.5, 1.25). Under L-infinity its boundary with
    // (1.5, 3.5) is y = 2.25 for 0.25 <= x <= 2.25 and y = 2.5 - x further left, which dips below that side
    // between x = -1/7 and x = 7/6; under L1 it is y = 2.5 for x <= 1, y = 3.5 - x up to x = 1.5, then y = 2,
    // which dips below that side between x = 9/7 and x = 2. Either way the cell reaches in twice.
    const clip = [1.75, 4.5, 1.25, 4.5, 1, 4.5, 0, 3.75, -0.5, 2.75, 4.5, 1.25];
    for (const metric of ['L1', 'Linf'] as const) {
      let caught: unknown;
      try { voronoi([1, 1, 1.5, 3.5, 3.25, 3.75], { metric, clip }); } catch (err) { caught = err; }
      expect(caught).toBeInstanceOf(AmbitError);
      expect((caught as AmbitError).code).toBe('unsupported-geometry');
    }
  });

  it('a site outside the region whose cell reaches in once, passing a corner by 2e-9, is built (found by the dual-route property)', () => {
    // Sites a = (0.2080, 0.3733) and b = (0.3813, 0) (below the pentagon). Their L1 bisector is a ray at
    // y = (ya + yb - (xb - xa)) / 2 = 0.0999999977540 for x <= xa, which passes under the corner (0.1, 0.1):
    // d(corner, a) - d(corner, b) = -4.49e-9 (worked out with exact rationals), so the corner and both sides
    // at it are a's, and b's cell meets the region once, from its crossing of the bottom side at x = 0.2234
    // onwards. The cell-by-cell route once refused it as "separate pieces" (a float projection there).
    const clip = [0.1, 0.1, 0.9, 0.2, 0.85, 0.7, 0.3, 0.9, 0.05, 0.6];
    const d = voronoi([0.2079695612192154, 0.3733349069736215, 0.38130447268486023, 0], { metric: 'L1', clip });
    expect(checkMesh(d.mesh).problems).toEqual([]);
    expect(d.cellAt(0.1 + 1e-7, 0.1 + 1e-7)).toBe(0);
    expect(d.cellAt(0.6, 0.2)).toBe(1);
    const poly = Array.from(d.cellPolygon(1));
    // b's cell: the crossing of the bottom side, the bottom side's end (0.9, 0.2), and up the right side to y = 0.27333.
    expect(poly.length).toBe(8);
    expect(Math.min(...poly.filter((_, i) => i % 2 === 0))).toBeCloseTo(0.2233937868, 9);
  });
});

describe('queries under the metric and the tie rule', () => {
  const d = voronoi([0, 0, 2, 2, 5, 0], { metric: 'L1' }) as MetricVoronoiDiagram;
  it('nearest: metric first', () => {
    // (3, 0): d1 = 3, 3, 2.
    expect(d.nearest(3, 0)).toBe(2);
  });
  it('nearest: metric tie broken by Euclidean distance', () => {
    // (-1, 2): d1 = 3 to both (0,0) and (2,2); Euclidean 5 vs 9.
    expect(d.nearest(-1, 2)).toBe(0);
    // (2, 0): d1 = 2 to (0,0) and (2,2), 3 to (5,0); Euclidean 4 and 4: the smaller (x, then y) wins.
    expect(d.nearest(2, 0)).toBe(0);
  });
  it('kNearest sorts by the rule', () => {
    expect(Array.from(d.kNearest(2, 0, 3))).toEqual([0, 1, 2]);
    expect(Array.from(d.kNearest(4, 1, 3))).toEqual([2, 1, 0]);
  });
  it('cellAt is -1 outside the region', () => {
    const r = d.region;
    expect(d.cellAt(r[0] - 1, r[1])).toBe(-1);
    expect(d.cellAt(1, 1)).toBe(d.nearest(1, 1));
  });
  it('nearestMany agrees with nearest', () => {
    const q = [0.3, 1.7, 2, 0, 4.9, 0.1, -1, 2];
    const many = d.nearestMany(q);
    for (let i = 0; i < 4; i++) expect(many[i]).toBe(d.nearest(q[2 * i], q[2 * i + 1]));
  });
});

describe('metric option', () => {
  it('L2, 2 and the default build the Euclidean diagram', () => {
    for (const metric of [undefined, 'L2', 2] as const) expect(voronoi([0, 0, 1, 1], { metric })).toBeInstanceOf(VoronoiDiagram);
  });
  it('1, Infinity and the L-infinity spellings route to the exact engines', () => {
    const pts = [0, 0, 2, 1, 3, 5];
    const a = voronoi(pts, { metric: 1 }) as MetricVoronoiDiagram, b = voronoi(pts, { metric: 'L1' }) as MetricVoronoiDiagram;
    expect(a.metric).toBe('L1');
    expect(Array.from(a.cellAreas())).toEqual(Array.from(b.cellAreas()));
    for (const metric of [Infinity, 'Linf', 'L∞'] as const) expect((voronoi(pts, { metric }) as MetricVoronoiDiagram).metric).toBe('Linf');
  });
  it.each([0.5, 0, -1, NaN, -Infinity, 'L3', 'l1', null, {}, '1'])('metric %s is a bad option', (metric) => {
    const call = () => voronoi([0, 0, 1, 1], { metric: metric as never });
    expect(call).toThrow(InputError);
    try { call(); } catch (e) {
      expect((e as InputError).code).toBe('bad-option');
      expect((e as InputError).field).toBe('metric');
    }
  });
  it.each([0, -1e-9, NaN, Infinity, '0.1', null])('tolerance %s is a bad option', (tolerance) => {
    const call = () => voronoi([0, 0, 1, 1], { metric: 'L1', tolerance: tolerance as never });
    expect(call).toThrow(InputError);
    try { call(); } catch (e) {
      expect((e as InputError).code).toBe('bad-option');
      expect((e as InputError).field).toBe('tolerance');
    }
  });
  it('a Minkowski p other than 1, 2 and Infinity builds its own diagram (see minkowski-voronoi.test.ts)', () => {
    for (const metric of [1.5, 3]) {
      const d = voronoi([0, 0, 1, 1], { metric });
      expect(d).not.toBeInstanceOf(MetricVoronoiDiagram);
      expect(checkMesh(d.mesh).problems).toEqual([]);
    }
  });
});

describe('the precision limit under other metrics (the Euclidean triangulation is built only when needed)', () => {
  // The documented limit (src/diagram/dual.ts MIN_SPACING, README): sites closer (Euclidean) than 2^-40 times
  // the largest coordinate of the sites and the region are refused with 'too-close', in every metric. The dual
  // route settles the check from its own closest metric pair where that clears the limit by the norm's factor
  // (Euclidean >= L1 / sqrt 2, >= L-infinity), and asks the Euclidean triangulation otherwise. Both sides of
  // the limit, in directions where the route's bound settles it (3-4-5: L1 1.4 times the Euclidean distance;
  // 24-7-25: L-infinity 0.96 times it) and where it does not; axis-aligned and diagonal pairs are two-dimensional
  // ties the dual route leaves to the cell route.
  // Spread sites in general position (no shared coordinates, so the dual route can take them).
  const random = mulberry32(20261202), grid: number[] = [];
  for (let i = 0; i < 150; i++) grid.push(100 * (random() / 2 ** 32), 100 * (random() / 2 ** 32));
  const clip = { minX: 0, minY: 0, maxX: 100, maxY: 100 };
  const limit = 2 ** -40 * 100;
  const cases: [string, number, number, boolean][] = [];
  for (const f of [0.9, 1.1]) {
    cases.push([`a 3-4-5 pair at ${f} of the limit`, 0.6 * f * limit, 0.8 * f * limit, true]);
    cases.push([`a 24-7-25 pair at ${f} of the limit`, 0.96 * f * limit, 0.28 * f * limit, true]);
    cases.push([`an axis pair at ${f} of the limit`, f * limit, 0, false]);
    cases.push([`a diagonal pair at ${f} of the limit`, (f * limit) / Math.SQRT2, (f * limit) / Math.SQRT2, false]);
  }
  for (const metric of ['L1', 'Linf', 3] as const) {
    for (const [label, dx, dy, general] of cases) {
      it(`${String(metric)}, ${label}`, () => {
        const x = 41.3, y = 52.9, points = [...grid, x, y, x + dx, y + dy];
        const d = Math.hypot(x + dx - x, y + dy - y), n = points.length / 2;
        let err: unknown = null;
        const built = dualRoute.built;
        try { voronoi(points, { metric, clip }); } catch (e) { err = e; }
        // In general position the dual route must have built the mesh, so that its own bound is what is tested.
        if (metric !== 3 && general) expect(dualRoute.built).toBe(built + 1);
        if (d < limit) {
          expect(err).toBeInstanceOf(InputError);
          expect((err as InputError).code).toBe('too-close');
          expect((err as InputError).message).toMatch(new RegExp(`sites ${n - 2} and ${n - 1}`));
        } else {
          expect(err).toBeNull();
        }
      });
    }
  }

  it('the triangulation the diagram reports is still the Delaunay triangulation of its sites', () => {
    const d = voronoi(grid, { metric: 'L1', clip });
    const t = d.triangulation;
    expect(t.siteCount).toBe(grid.length / 2);
    expect(t.dimension).toBe(2);
    expect(checkMesh(t.toMesh(), { delaunay: 'global' }).problems).toEqual([]);
    // It grows like any other (its first use built it).
    expect(Array.from(t.insert([[50.25, 50.75]]))).toEqual([grid.length / 2]);
    expect(checkMesh(t.toMesh(), { delaunay: 'global' }).problems).toEqual([]);
  });
});
