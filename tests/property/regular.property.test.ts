import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMesh, comparePowerDistance, InputError, triangulate, voronoi, writeMeshJSON } from '../../src/index.js';
import { paddedBounds } from '../../src/diagram/region.js';
import { allGenerators, nextUp, type NamedGenerator } from '../support/generators.js';
import { brutePowerCellArea, brutePowerCells } from '../support/power-brute.js';
import { polygonArea } from '../support/voronoi-brute.js';

// 1000 runs per property in CI (process.env.CI set), 60 locally; the count is common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 60;

/**
 * How weights are drawn for n points spread over a box of side `size`.
 * Weights have the units of squared distance, so random ones scale with
 * size^2; integer weights on integer grids keep every lifted point exact,
 * which is where coplanar and collinear ties (the hard cases) come from.
 */
type WeightSpec =
  | { kind: 'zero' }
  | { kind: 'equal-ulp'; flips: boolean[] }
  | { kind: 'small'; u: number[] }
  | { kind: 'integer'; k: number[] }
  | { kind: 'hide-many'; heavy: boolean[]; u: number[] };

const unit = fc.integer({ min: 0, max: 2 ** 30 - 1 }).map((i) => i / 2 ** 30);
const weightSpec: fc.Arbitrary<WeightSpec> = fc.oneof(
  fc.constant<WeightSpec>({ kind: 'zero' }),
  fc.record({ kind: fc.constant('equal-ulp' as const), flips: fc.array(fc.boolean(), { maxLength: 200 }) }),
  fc.record({ kind: fc.constant('small' as const), u: fc.array(unit, { maxLength: 200 }) }),
  fc.record({ kind: fc.constant('integer' as const), k: fc.array(fc.integer({ min: 0, max: 3 }), { maxLength: 200 }) }),
  fc.record({
    kind: fc.constant('hide-many' as const),
    heavy: fc.array(fc.boolean(), { maxLength: 200 }), u: fc.array(unit, { maxLength: 200 }),
  }),
);

function makeWeights(points: number[], spec: WeightSpec): number[] {
  const n = points.length >> 1;
  let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
  for (let i = 0; i < n; i++) {
    minX = Math.min(minX, points[2 * i]); maxX = Math.max(maxX, points[2 * i]);
    minY = Math.min(minY, points[2 * i + 1]); maxY = Math.max(maxY, points[2 * i + 1]);
  }
  const size = Math.max(maxX - minX, maxY - minY, 1e-30);
  const spacing2 = (size * size) / Math.max(1, n);
  const at = <T>(a: T[], i: number, d: T): T => (a.length > 0 ? a[i % a.length] : d);
  return Array.from({ length: n }, (_, i) => {
    switch (spec.kind) {
      case 'zero': return 0;
      case 'equal-ulp': return at(spec.flips, i, false) ? nextUp(1) : 1;
      case 'small': return at(spec.u, i, 0) * spacing2;
      case 'integer': return at(spec.k, i, 0);
      case 'hide-many': return (at(spec.heavy, i, false) ? 4 : 0.1) * at(spec.u, i, 0.5) * spacing2;
    }
  });
}

/** The site with the least power distance to (x, y) among those with a cell, exactly; ties to the smallest index. */
function nearestByPower(xy: Float64Array, w: Float64Array, hidden: Set<number>, x: number, y: number): number {
  let best = -1;
  for (let i = 0; i < xy.length >> 1; i++) {
    if (hidden.has(i)) continue;
    if (best < 0) { best = i; continue; }
    if (comparePowerDistance(x, y, xy[2 * i], xy[2 * i + 1], w[i], xy[2 * best], xy[2 * best + 1], w[best]) < 0) best = i;
  }
  return best;
}

/**
 * The diagram, or null when it is refused as documented: InputError 'too-close' for sites closer than
 * 2^-40 times the largest coordinate of sites and region (README, src/diagram/dual.ts MIN_SPACING).
 * A refusal is accepted only when a brute-force pass finds such a pair (the padded default region
 * reaches at most 1.2 times the sites' extent beyond them, hence the loose factor 2 on the magnitude).
 * Likewise 'too-thin' (a power cell thinner than rounding) only when brute-force clipping finds that
 * cell's area below 1e-12 of the region's.
 */
function diagramOrRefusal(build: () => ReturnType<typeof voronoi>, xy: Float64Array, w: Float64Array | null): ReturnType<typeof voronoi> | null {
  try {
    return build();
  } catch (err) {
    if (!(err instanceof InputError)) throw err;
    if (err.code === 'too-thin') {
      // A power cell too thin to draw: an independent brute-force clipping must find it (nearly) empty.
      // The refusal names the site when a drawn cell came out flat, else (-1) some cell must be that thin.
      expect(w).not.toBeNull();
      const region = paddedBounds(xy, xy.length >> 1);
      const area = err.index >= 0 ? brutePowerCellArea(xy, w!, region, err.index)
        : Math.min(...Array.from(brutePowerCells(xy, w!, region).areas).filter((a) => a > 0));
      // "That thin": below what rounding at these coordinates resolves (the brute force rounds too).
      let magnitude = 0, size = 0;
      for (const v of region) magnitude = Math.max(magnitude, Math.abs(v));
      size = Math.max(region[2] - region[0], region[5] - region[1]);
      expect(area).toBeLessThanOrEqual(1e-12 * polygonArea(region) + 64 * Number.EPSILON * magnitude * size);
      return null;
    }
    if (err.code !== 'too-close') throw err;
    const n = xy.length >> 1;
    let closest = Infinity, magnitude = 0;
    for (let i = 0; i < n; i++) {
      magnitude = Math.max(magnitude, Math.abs(xy[2 * i]), Math.abs(xy[2 * i + 1]));
      for (let j = i + 1; j < n; j++) closest = Math.min(closest, Math.hypot(xy[2 * i] - xy[2 * j], xy[2 * i + 1] - xy[2 * j + 1]));
    }
    expect(closest).toBeLessThan(2 ** -40 * 2 * magnitude);
    return null;
  }
}

function expectNoProblems(list: string[]): void {
  expect(list.slice(0, 5)).toEqual([]);
}

const generators: NamedGenerator[] = allGenerators(120);

describe.each(generators.map((g) => [g.name, g] as const))('regular triangulation and power diagram on %s input', (_name, g) => {
  it('is locally regular (globally, for up to 60 sites), hides exactly the redundant sites, and its diagram tiles the region by least power distance', () => {
    fc.assert(
      fc.property(g.arb, weightSpec, fc.array(fc.tuple(unit, unit), { minLength: 20, maxLength: 20 }), (points, spec, probes) => {
        const weights = makeWeights(points, spec);
        const tri = triangulate(points, { weights });
        const w = tri.weights!;
        // Brute force (every vertex against every triangle) also proves each hidden site lifts on or above the hull.
        const mode = tri.siteCount <= 60 ? 'global' : 'local';
        expectNoProblems(checkMesh(tri.toMesh(), { weights: w, delaunay: mode }).problems);
        const used = new Set(tri.triangleSites);
        const hidden = new Set(tri.hiddenSites);
        if (tri.dimension === 2) for (let s = 0; s < tri.siteCount; s++) expect(used.has(s)).toBe(!hidden.has(s));

        const v = diagramOrRefusal(() => voronoi(tri), tri.siteXY, w);
        if (v === null) return;
        expectNoProblems(checkMesh(v.mesh).problems);
        for (const s of hidden) expect(v.faceOfSite[s]).toBe(-1);
        let sum = 0;
        for (const a of v.cellAreas()) sum += a;
        expect(Math.abs(sum - v.totalArea())).toBeLessThanOrEqual(1e-9 * v.totalArea());
        let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
        for (let i = 0; i < v.region.length; i += 2) {
          minX = Math.min(minX, v.region[i]); maxX = Math.max(maxX, v.region[i]);
          minY = Math.min(minY, v.region[i + 1]); maxY = Math.max(maxY, v.region[i + 1]);
        }
        for (const [fx, fy] of probes) {
          const x = minX + fx * (maxX - minX), y = minY + fy * (maxY - minY);
          expect(v.nearest(x, y)).toBe(nearestByPower(tri.siteXY, w, hidden, x, y));
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('with all weights equal gives exactly the unweighted triangulation and diagram', () => {
    fc.assert(
      fc.property(g.arb, fc.constantFrom(0, 1, -3.5, 1e-9), (points, value) => {
        const weights = new Array(points.length >> 1).fill(value);
        const plain = triangulate(points), weighted = triangulate(points, { weights });
        expect(Array.from(weighted.triangleSites)).toEqual(Array.from(plain.triangleSites));
        expect(weighted.hiddenSites.length).toBe(0);
        const weightedDiagram = diagramOrRefusal(() => voronoi(points, { weights }), plain.siteXY, null);
        if (weightedDiagram !== null) expect(writeMeshJSON(weightedDiagram.mesh)).toBe(writeMeshJSON(voronoi(points).mesh));
      }),
      { numRuns: Math.ceil(NUM_RUNS / 4) },
    );
  });
});
