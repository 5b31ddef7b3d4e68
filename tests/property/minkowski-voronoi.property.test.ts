import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMesh, InputError, voronoi, type MinkowskiVoronoiDiagram } from '../../src/index.js';
import { allGenerators } from '../support/generators.js';
import { polygonArea, ulp } from '../support/voronoi-brute.js';
import { locateInPolygon } from '../support/metric-brute.js';
import { lpOwner } from '../support/minkowski-brute.js';

// 1000 runs per property in CI, fewer locally so the edit-test loop stays quick (common practice, no source).
const NUM_RUNS = process.env.CI ? 1000 : 40;

/** The exponents: the two of the acceptance test, and any p in (1, 8). */
const exponent = fc.oneof(fc.constant(1.5), fc.constant(3), fc.double({ min: 1.01, max: 8, noNaN: true }));

/** A diagram, or null for inputs every engine refuses by design (sites closer than the documented spacing). */
function build(points: number[], p: number): MinkowskiVoronoiDiagram | null {
  try {
    return voronoi(points, { metric: p }) as MinkowskiVoronoiDiagram;
  } catch (err) {
    if (err instanceof InputError && err.code === 'too-close') return null;
    throw err;
  }
}

const probeArb = fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 1, maxLength: 12 });

describe('Minkowski voronoi', () => {
  // At most 12 sites: the diagrams carry curved edges of many bends, and CI runs each property 1000 times.
  for (const g of allGenerators(12)) {
    it(`${g.name}: valid mesh, areas sum to the region's, sites in their cells, probes owned by the brute-force nearest`, () => {
      fc.assert(
        fc.property(g.arb, exponent, probeArb, (points, p, probes) => {
          const d = build(points, p);
          if (d === null) return;
          expect(checkMesh(d.mesh).problems).toEqual([]);
          const region = Array.from(d.region);
          const regionArea = polygonArea(region);
          const xy = d.triangulation.siteXY, n = d.triangulation.siteCount;
          const [minX, minY, maxX, maxY] = [region[0], region[1], region[4], region[5]];
          const M = Math.max(Math.abs(minX), Math.abs(maxX), Math.abs(minY), Math.abs(maxY));
          // Every cell edge is shared by two faces, so the signed areas cancel to the region's up to the
          // rounding of each term: a few ulps of the coordinates times the perimeter, per vertex.
          const perimeter = 2 * (maxX - minX + maxY - minY);
          expect(Math.abs(d.totalArea() - regionArea)).toBeLessThanOrEqual(1e-9 * regionArea + 4 * d.mesh.vertexCount * perimeter * 4 * ulp(M));
          // Positions (centres, crossings, bends) are rounded: 1e-9 of the coordinates' size covers them with room
          // (the same allowance the other diagrams' tests use); edges may also stray by the tolerance.
          const rounding = 1e-9 * Math.max(maxX - minX, M);
          const polys: Float64Array[] = [];
          for (let s = 0; s < n; s++) {
            polys.push(d.cellPolygon(s));
            expect(d.faceOfSite[s]).toBe(s);
            const at = locateInPolygon(polys[s], xy[2 * s], xy[2 * s + 1]);
            expect(at.inside || at.boundaryDistance <= d.tolerance + rounding).toBe(true);
          }
          for (const [fx, fy] of probes) {
            // Strictly inside the region: on its boundary a probe is in no cell's interior.
            const qx = minX + (0.001 + 0.998 * fx) * (maxX - minX), qy = minY + (0.001 + 0.998 * fy) * (maxY - minY);
            const { site, clearance } = lpOwner(p, xy, n, qx, qy);
            // Too near a cell boundary to tell (brute-force clearance): skipped.
            if (clearance <= d.tolerance + rounding) continue;
            expect(d.nearest(qx, qy)).toBe(site);
            for (let s = 0; s < n; s++) {
              const at = locateInPolygon(polys[s], qx, qy);
              if (s === site) expect(at.inside).toBe(true);
              else expect(at.inside).toBe(false);
            }
          }
        }),
        { numRuns: NUM_RUNS },
      );
    });
  }
});

describe('custom clip rectangles (sites outside the region keep the part of their cell that reaches in)', () => {
  const frac = fc.integer({ min: 0, max: 64 }).map((k) => k / 64);
  it('uniform sites, random boxes', () => {
    fc.assert(
      fc.property(allGenerators(20)[0].arb, exponent, frac, frac, frac, frac, (points, p, f0, f1, f2, f3) => {
        let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
        for (let i = 0; i < points.length; i += 2) {
          minX = Math.min(minX, points[i]); maxX = Math.max(maxX, points[i]);
          minY = Math.min(minY, points[i + 1]); maxY = Math.max(maxY, points[i + 1]);
        }
        const w = Math.max(maxX - minX, maxY - minY, 1);
        const x0 = minX - 0.2 * w + f0 * 0.7 * w, y0 = minY - 0.2 * w + f1 * 0.7 * w;
        const clip = { minX: x0, minY: y0, maxX: x0 + (0.1 + f2 * 0.8) * w, maxY: y0 + (0.1 + f3 * 0.8) * w };
        let d: MinkowskiVoronoiDiagram;
        try {
          d = voronoi(points, { metric: p, clip }) as MinkowskiVoronoiDiagram;
        } catch (err) {
          // Refused by design: sites too close, or a site outside the box whose cell meets it in two pieces.
          if (err instanceof InputError && err.code === 'too-close') return;
          if (err instanceof Error && (err as { code?: string }).code === 'unsupported-geometry') return;
          throw err;
        }
        expect(checkMesh(d.mesh).problems).toEqual([]);
        const area = polygonArea(Array.from(d.region));
        expect(Math.abs(d.totalArea() - area)).toBeLessThanOrEqual(1e-9 * area);
        const xy = d.triangulation.siteXY, n = d.triangulation.siteCount;
        for (let k = 0; k < 8; k++) {
          const qx = clip.minX + (0.05 + 0.9 * ((k * 0.37 + f0) % 1)) * (clip.maxX - clip.minX);
          const qy = clip.minY + (0.05 + 0.9 * ((k * 0.61 + f1) % 1)) * (clip.maxY - clip.minY);
          const { site, clearance } = lpOwner(p, xy, n, qx, qy);
          if (clearance <= d.tolerance + 1e-9 * w) continue;
          expect(d.faceOfSite[site]).toBe(site);
          expect(locateInPolygon(d.cellPolygon(site), qx, qy).inside).toBe(true);
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });
});
