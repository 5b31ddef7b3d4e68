import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMesh, InputError, voronoi, type ClipRegion, type MetricVoronoiDiagram } from '../../src/index.js';
import { allGenerators, flatten, permuteBy, type NamedGenerator, type Pt } from '../support/generators.js';
import { polygonArea, ulp } from '../support/voronoi-brute.js';
import { locateInPolygon, ownerByRule, type ExactMetricName } from '../support/metric-brute.js';

// 1000 runs per property in CI, fewer locally so the edit-test loop stays quick (common practice, no source).
const NUM_RUNS = process.env.CI ? 1000 : 60;
const METRICS: ExactMetricName[] = ['L1', 'Linf'];

/** The diagram, checked by the validator; null when it is refused with an error `allowed` accepts. */
function validOrRefused(points: number[], metric: ExactMetricName, clip: ClipRegion, allowed: (err: unknown) => boolean): MetricVoronoiDiagram | null {
  let d: MetricVoronoiDiagram;
  try {
    d = voronoi(points, { metric, clip }) as MetricVoronoiDiagram;
  } catch (err) {
    if (allowed(err)) return null;
    throw err;
  }
  expect(checkMesh(d.mesh).problems).toEqual([]);
  return d;
}

const keys = fc.array(fc.nat({ max: 1 << 20 }), { maxLength: 32 });

/** The two-dimensional tie cases: pairs on 45 degree diagonals (L1) and on axis-parallel lines (L-infinity), mixed and repeated. */
const tiePairs: fc.Arbitrary<number[]> = fc
  .record({
    base: fc.array(fc.tuple(fc.integer({ min: -20, max: 20 }), fc.integer({ min: -20, max: 20 })), { minLength: 1, maxLength: 8 }),
    steps: fc.array(fc.tuple(fc.integer({ min: 1, max: 9 }), fc.constantFrom<[number, number]>([1, 1], [1, -1], [1, 0], [0, 1])), { minLength: 1, maxLength: 8 }),
    dup: fc.boolean(),
    k: keys,
  })
  .map(({ base, steps, dup, k }) => {
    const pts: Pt[] = [];
    base.forEach((b, i) => {
      const [len, [dx, dy]] = steps[i % steps.length];
      pts.push(b, [b[0] + len * dx, b[1] + len * dy]);
      if (dup) pts.push(b);
    });
    return flatten(permuteBy(pts, k));
  });

/** Small integer lattices, axis-aligned or rotated by 45 degrees (both metrics' tie cases everywhere). */
const lattices: fc.Arbitrary<number[]> = fc
  .record({ k: fc.integer({ min: 1, max: 7 }), m: fc.integer({ min: 1, max: 7 }), rotated: fc.boolean(), step: fc.constantFrom(1, 2, 3), keys })
  .map(({ k, m, rotated, step, keys: ks }) => {
    const pts: Pt[] = [];
    for (let i = 0; i < k; i++) for (let j = 0; j < m; j++) pts.push(rotated ? [(i + j) * step, (i - j) * step] : [i * step, j * step]);
    return flatten(permuteBy(pts, ks));
  });

const generators: NamedGenerator[] = [
  ...allGenerators(30),
  { name: 'tie-pairs', arb: tiePairs },
  { name: 'lattices', arb: lattices },
];

/** A diagram, or null for inputs the engine refuses by design (sites closer than the documented spacing). */
function build(points: number[], metric: ExactMetricName): MetricVoronoiDiagram | null {
  try {
    return voronoi(points, { metric }) as MetricVoronoiDiagram;
  } catch (err) {
    if (err instanceof InputError && err.code === 'too-close') return null;
    throw err;
  }
}

const probeArb = fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.boolean()), { minLength: 1, maxLength: 24 });

describe.each(METRICS)('metric voronoi %s', (metric) => {
  for (const g of generators) {
    it(`${g.name}: valid mesh, areas sum to the region's, sites in their cells, probes owned by the brute-force nearest`, () => {
      fc.assert(
        fc.property(g.arb, probeArb, (points, probes) => {
          const d = build(points, metric);
          if (d === null) return;
          const check = checkMesh(d.mesh);
          expect(check.problems).toEqual([]);
          const region = Array.from(d.region);
          const regionArea = polygonArea(region);
          const xy = d.triangulation.siteXY, n = d.triangulation.siteCount;
          let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
          for (let i = 0; i < region.length; i += 2) {
            minX = Math.min(minX, region[i]); maxX = Math.max(maxX, region[i]);
            minY = Math.min(minY, region[i + 1]); maxY = Math.max(maxY, region[i + 1]);
          }
          // Rounded corners may sit a few ulps (of the coordinates) off: each moves the area by that much times the perimeter.
          const slack = 4 * ulp(Math.max(Math.abs(minX), Math.abs(maxX), Math.abs(minY), Math.abs(maxY)));
          const perimeter = 2 * (maxX - minX + maxY - minY);
          expect(Math.abs(d.totalArea() - regionArea)).toBeLessThanOrEqual(1e-9 * regionArea + 4 * d.mesh.vertexCount * perimeter * slack);
          const tol = 1e-9 * Math.max(maxX - minX, maxY - minY, Math.abs(minX), Math.abs(maxX), Math.abs(minY), Math.abs(maxY));
          const polys: Float64Array[] = [];
          for (let s = 0; s < n; s++) {
            polys.push(d.cellPolygon(s));
            expect(d.faceOfSite[s]).toBe(s);
            const at = locateInPolygon(polys[s], xy[2 * s], xy[2 * s + 1]);
            expect(at.inside || at.boundaryDistance <= tol).toBe(true);
          }
          for (const [fx, fy, onSite] of probes) {
            // Half the probes sit on a site's grid (exact ties are likely), half anywhere in the box.
            let qx = minX + fx * (maxX - minX), qy = minY + fy * (maxY - minY);
            if (onSite) {
              const s = Math.floor(fx * n) % n, t = Math.floor(fy * n) % n;
              qx = xy[2 * s]; qy = xy[2 * t + 1];
            }
            const owner = ownerByRule(metric, xy, qx, qy);
            expect(d.nearest(qx, qy)).toBe(owner);
            for (let s = 0; s < n; s++) {
              const at = locateInPolygon(polys[s], qx, qy);
              if (at.inside && at.boundaryDistance > tol) expect(s).toBe(owner);
            }
          }
        }),
        { numRuns: NUM_RUNS },
      );
    });
  }
});

/** (x, y) -> (x + y, x - y): ||(x, y)||_1 = ||(x + y, x - y)||_inf (a published identity; exact on the integer inputs used here). */
const rotate = (flat: number[]): number[] => flat.map((_, i) => (i % 2 === 0 ? flat[i] + flat[i + 1] : flat[i - 1] - flat[i]));

describe('L1 diagram = L-infinity diagram of the sites rotated by 45 degrees, mapped back', () => {
  const ints = fc.array(fc.tuple(fc.integer({ min: -30, max: 30 }), fc.integer({ min: -30, max: 30 })), { minLength: 1, maxLength: 30 }).map(flatten);
  for (const [name, arb] of [['random integers', ints], ['lattices', lattices], ['tie pairs', tiePairs]] as const) {
    it(name, () => {
      fc.assert(
        fc.property(arb, (points) => {
          const clip = { minX: -200, minY: -200, maxX: 200, maxY: 200 };
          const a = voronoi(points, { metric: 'L1', clip }) as MetricVoronoiDiagram;
          const diamond = rotate([clip.minX, clip.minY, clip.maxX, clip.minY, clip.maxX, clip.maxY, clip.minX, clip.maxY]);
          const b = voronoi(rotate(points), { metric: 'Linf', clip: diamond }) as MetricVoronoiDiagram;
          expect(b.triangulation.siteCount).toBe(a.triangulation.siteCount);
          const areaA = a.cellAreas(), areaB = b.cellAreas();
          for (let s = 0; s < a.triangulation.siteCount; s++) {
            // The map has determinant -2: areas double.
            expect(Math.abs(areaB[s] - 2 * areaA[s])).toBeLessThanOrEqual(1e-9 * 160000);
            const pa = Array.from(a.cellPolygon(s)), pb = Array.from(b.cellPolygon(s));
            const back: [number, number][] = [];
            for (let i = 0; i < pb.length; i += 2) back.push([(pb[i] + pb[i + 1]) / 2, (pb[i] - pb[i + 1]) / 2]);
            expect(back.length).toBe(pa.length / 2);
            for (let i = 0; i < pa.length; i += 2) {
              expect(back.some(([x, y]) => Math.abs(x - pa[i]) + Math.abs(y - pa[i + 1]) <= 1e-9)).toBe(true);
            }
          }
        }),
        { numRuns: NUM_RUNS },
      );
    });
  }
});

describe('input order', () => {
  it('the cells do not depend on the order of the input', () => {
    fc.assert(
      fc.property(fc.oneof(tiePairs, lattices), keys, fc.constantFrom(...METRICS), (points, k, metric) => {
        const pts: Pt[] = [];
        for (let i = 0; i < points.length; i += 2) pts.push([points[i], points[i + 1]]);
        const shuffled = flatten(permuteBy(pts, k));
        const a = voronoi(points, { metric }) as MetricVoronoiDiagram, b = voronoi(shuffled, { metric }) as MetricVoronoiDiagram;
        const byCoords = (d: MetricVoronoiDiagram): string[] => {
          const out: string[] = [], xy = d.triangulation.siteXY;
          for (let s = 0; s < d.triangulation.siteCount; s++) out.push(`${xy[2 * s]},${xy[2 * s + 1]}:${Array.from(d.cellPolygon(s)).join(',')}`);
          return out.sort();
        };
        expect(byCoords(b)).toEqual(byCoords(a));
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

describe('custom clip rectangles (sites outside the region keep the part of their cell that reaches in)', () => {
  const frac = fc.integer({ min: 0, max: 64 }).map((k) => k / 64);
  for (const [name, arb] of [['lattices', lattices], ['tie pairs', tiePairs], ['uniform', allGenerators(30)[0].arb]] as const) {
    it(name, () => {
      fc.assert(
        fc.property(arb, frac, frac, frac, frac, fc.constantFrom(...METRICS), (points, f0, f1, f2, f3, metric) => {
          let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
          for (let i = 0; i < points.length; i += 2) {
            minX = Math.min(minX, points[i]); maxX = Math.max(maxX, points[i]);
            minY = Math.min(minY, points[i + 1]); maxY = Math.max(maxY, points[i + 1]);
          }
          const w = Math.max(maxX - minX, maxY - minY, 1);
          // Clip sides on a grid of w / 2^20: a side a few ulps off a bisector would leave a sliver cell thinner
          // than double precision can draw (a known limitation, see src/diagram/metric/DESIGN.md).
          const snap = (v: number): number => Math.round(v / w * 2 ** 20) * w / 2 ** 20;
          const x0 = snap(minX - 0.2 * w + f0 * 0.7 * w), y0 = snap(minY - 0.2 * w + f1 * 0.7 * w);
          const clip = { minX: x0, minY: y0, maxX: snap(x0 + (0.1 + f2 * 0.8) * w), maxY: snap(y0 + (0.1 + f3 * 0.8) * w) };
          const d = validOrRefused(points, metric, clip, (err) => err instanceof InputError && err.code === 'too-close');
          if (d === null) return;
          const r = d.region, area = polygonArea(Array.from(r));
          const M = Math.max(...Array.from(r, Math.abs));
          expect(Math.abs(d.totalArea() - area)).toBeLessThanOrEqual(1e-9 * area + 16 * d.mesh.vertexCount * ulp(M) * 4 * w);
          const xy = d.triangulation.siteXY;
          for (let k = 0; k < 8; k++) {
            // Strictly inside the region: a probe on its boundary may belong to a cell that has no area there.
            const qx = clip.minX + (0.05 + 0.9 * ((k * 0.37 + f0) % 1)) * (clip.maxX - clip.minX);
            const qy = clip.minY + (0.05 + 0.9 * ((k * 0.61 + f1) % 1)) * (clip.maxY - clip.minY);
            const owner = ownerByRule(metric, xy, qx, qy);
            expect(d.faceOfSite[owner]).toBe(owner);
            const at = locateInPolygon(d.cellPolygon(owner), qx, qy);
            expect(at.inside || at.boundaryDistance <= 1e-9 * w).toBe(true);
          }
        }),
        { numRuns: NUM_RUNS },
      );
    });
  }
});

