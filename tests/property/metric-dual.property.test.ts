import fc from 'fast-check';
import { afterEach, describe, expect, it } from 'vitest';
import { AmbitError, checkMesh, voronoi, type ClipRegion, type VoronoiDiagram } from '../../src/index.js';
import { dualRoute } from '../../src/diagram/metric/dual.js';
import { diagramDifferences } from '../support/diagram-compare.js';
import { allGenerators, flatten, type Pt } from '../support/generators.js';
import { locateInPolygon, ownerByRule } from '../support/metric-brute.js';

// The L1 / L-infinity diagram has two constructions: the dual of the metric Delaunay triangulation (fast,
// floating point with a margin, for input in general position) and the cell-by-cell exact clip (every
// decision exact). The first hands over to the second whenever a decision falls within its margin. These
// properties build every input both ways and require the same diagram (diagram-compare.ts: neighbours,
// vertices both ways, areas), and a valid mesh from the dual route.

// 1000 runs per property in CI, fewer locally so the edit-test loop stays quick (common practice, no source).
const NUM_RUNS = process.env.CI ? 1000 : 60;

afterEach(() => { dualRoute.enabled = true; });

/** Both routes, or both errors with one code; returns whether the dual route built it. */
function bothWays(points: number[], metric: 'L1' | 'Linf', clip?: ClipRegion): boolean {
  const before = dualRoute.taken;
  let dual: VoronoiDiagram | null = null, dualError: unknown = null;
  try { dual = voronoi(points, { metric, clip }) as unknown as VoronoiDiagram; } catch (err) { dualError = err; }
  const took = dualRoute.taken > before;
  dualRoute.enabled = false;
  let exact: VoronoiDiagram | null = null, exactError: unknown = null;
  try { exact = voronoi(points, { metric, clip }) as unknown as VoronoiDiagram; } catch (err) { exactError = err; }
  dualRoute.enabled = true;
  if (exactError instanceof AmbitError && exactError.code === 'unsupported-geometry' && dual !== null) {
    // The exact route refuses a site outside the region whose cell meets it in separate pieces, and
    // decides "separate" by a float projection (a documented limit): it can refuse a cell that is one
    // piece, which the dual route then builds. Such a diagram is checked against brute force instead.
    expect(took).toBe(true);
    expect(checkMesh(dual.mesh).problems).toEqual([]);
    probeOwners(dual, metric);
    return took;
  }
  if (exactError !== null || dualError !== null) {
    // A refused input is refused the same way (the dual route hands such inputs to the exact one).
    expect(dualError).toBeInstanceOf(AmbitError);
    expect((dualError as AmbitError).code).toBe((exactError as AmbitError).code);
    expect(took).toBe(false);
    return false;
  }
  expect(checkMesh(dual!.mesh).problems).toEqual([]);
  // The exact route places a point from floating point when its error bound is within 2^-48 of the size of
  // its coordinates (REFINE in src/diagram/metric/geometry.ts): tens of ulps at a 1e7 offset, where the dual
  // route's local origin gives about one. That documented placement is allowed for here.
  let M = 0;
  for (const v of exact!.region) M = Math.max(M, Math.abs(v));
  expect(diagramDifferences(dual!, exact!, 'dual route', 2 ** -47 * M)).toEqual([]);
  return took;
}

// Doubles uniform on [0, 1) with all 53 bits random (fc.double favours edge values, which tie).
/** A grid of probes over the region's box: each strictly inside a cell polygon must be owned by that cell's site by the rule (brute force). */
function probeOwners(d: VoronoiDiagram, metric: 'L1' | 'Linf'): void {
  const r = d.region, xy = d.triangulation.siteXY, n = d.triangulation.siteCount;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < r.length; i += 2) {
    minX = Math.min(minX, r[i]); maxX = Math.max(maxX, r[i]); minY = Math.min(minY, r[i + 1]); maxY = Math.max(maxY, r[i + 1]);
  }
  const tol = 1e-9 * Math.max(maxX - minX, maxY - minY);
  const polys = Array.from({ length: n }, (_, s) => d.cellPolygon(s));
  for (let i = 1; i < 40; i++) {
    for (let j = 1; j < 40; j++) {
      const qx = minX + (i / 40) * (maxX - minX), qy = minY + (j / 40) * (maxY - minY);
      const owner = ownerByRule(metric, xy, qx, qy);
      for (let s = 0; s < n; s++) {
        const at = locateInPolygon(polys[s], qx, qy);
        if (at.inside && at.boundaryDistance > tol) expect(s).toBe(owner);
      }
    }
  }
}

function boundingBox(pts: Pt[]): ClipRegion {
  const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
  return { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) };
}

const unit = fc
  .tuple(fc.integer({ min: 0, max: 2 ** 26 - 1 }), fc.integer({ min: 0, max: 2 ** 27 - 1 }))
  .map(([hi, lo]) => (hi * 2 ** 27 + lo) / 2 ** 53);
const cloud = (maxN: number): fc.Arbitrary<Pt[]> => fc.array(fc.tuple(unit, unit), { minLength: 2, maxLength: maxN });

/**
 * A region: the default, the sites' own bounding box (sites on its sides: bisectors bend exactly on them), an
 * axis box in the middle, a diamond, or a pentagon (sites outside the last three).
 */
const regions: fc.Arbitrary<ClipRegion | undefined | 'bbox'> = fc.oneof(
  fc.constant(undefined),
  fc.constant('bbox' as const),
  fc.constant({ minX: 0.2, minY: 0.25, maxX: 0.8, maxY: 0.7 }),
  fc.constant([[0.5, 0.05], [0.95, 0.5], [0.5, 0.95], [0.05, 0.5]] as [number, number][]),
  fc.constant([[0.1, 0.1], [0.9, 0.2], [0.85, 0.7], [0.3, 0.9], [0.05, 0.6]] as [number, number][]),
);

describe.each(['L1', 'Linf'] as const)('%s: the dual route gives the exact route\'s diagram', (metric) => {
  it('uniform points, several regions; the dual route builds most of them', () => {
    let runs = 0, taken = 0;
    fc.assert(
      fc.property(cloud(120), regions, (pts, region) => {
        runs++;
        const clip = region === 'bbox' ? boundingBox(pts) : region;
        if (bothWays(flatten(pts), metric, clip)) taken++;
      }),
      { numRuns: NUM_RUNS },
    );
    // The property is only worth something if the dual route ran: on uniform points it should nearly always.
    expect(taken).toBeGreaterThan(0.5 * runs);
  });

  it('uniform points offset by 1e6 and 1e7 (a local origin keeps the margin at the sites\' spread)', () => {
    let runs = 0, taken = 0;
    fc.assert(
      fc.property(cloud(120), fc.constantFrom(1e6, 1e7, -3e6), (pts, offset) => {
        runs++;
        const flat = flatten(pts).map((v) => v + offset);
        if (bothWays(flat, metric)) taken++;
      }),
      { numRuns: NUM_RUNS },
    );
    expect(taken).toBeGreaterThan(0.5 * runs);
  });

  it('larger inputs (a few thousand sites)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1000, max: 3000 }), fc.integer(), (n, seed) => {
        let s = seed | 0;
        // xorshift32 (Marsaglia 2003, from memory): cheap reproducible points from the fast-check seed.
        const next = (): number => { s ^= s << 13; s ^= s >>> 17; s ^= s << 5; return (s >>> 0) / 2 ** 32; };
        const flat: number[] = [];
        for (let i = 0; i < n; i++) flat.push(next(), next());
        bothWays(flat, metric);
      }),
      { numRuns: process.env.CI ? 20 : 3 },
    );
  });

  for (const g of allGenerators(40)) {
    it(`${g.name}: same diagram (degenerate input mostly goes to the exact route)`, () => {
      fc.assert(fc.property(g.arb, (points) => { bothWays(points, metric); }), { numRuns: Math.ceil(NUM_RUNS / 4) });
    });
  }
});
