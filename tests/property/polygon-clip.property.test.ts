import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { AmbitError, checkMesh, voronoi, type Metric } from '../../src/index.js';
import { flatten, type Pt } from '../support/generators.js';
import { monotoneChainHull } from '../support/hull.js';
import { locateInPolygon, ownerByRule } from '../support/metric-brute.js';
import { lpOwner } from '../support/minkowski-brute.js';
import { nearestSiteExact, polygonArea } from '../support/voronoi-brute.js';

// 1000 runs per property in CI, fewer locally so the edit-test loop stays quick (common practice, no source).
const NUM_RUNS = process.env.CI ? 1000 : 60;

// Sites and region corners on one coarse grid, so that corners fall exactly on bisectors and their bends, and
// sides carry extra vertices where the boundary runs straight on: places where a clip decides by ties.
const quarter = fc.tuple(fc.integer({ min: 0, max: 16 }), fc.integer({ min: 0, max: 16 })).map(([x, y]): Pt => [x / 4, y / 4]);
const half = fc.tuple(fc.integer({ min: 0, max: 8 }), fc.integer({ min: 0, max: 8 })).map(([x, y]): Pt => [x / 2, y / 2]);

/** The convex hull of the corners, with the exact midpoint of each side flagged in `straight` added as a vertex. */
function polygon(corners: Pt[], straight: boolean[]): number[] {
  const hull = monotoneChainHull(flatten(corners)), out: number[] = [];
  hull.forEach(([x, y], i) => {
    out.push(x, y);
    const [u, v] = hull[(i + 1) % hull.length];
    if (straight[i % straight.length]) out.push((x + u) / 2, (y + v) / 2);
  });
  return out;
}

describe('convex polygon clips on a quarter grid, with straight corners (every metric)', () => {
  const metrics: Metric[] = ['L2', 'L1', 'Linf', 1.5, 3];
  it("valid mesh, areas sum to the region's, probes owned by the brute-force nearest", () => {
    fc.assert(
      fc.property(fc.array(quarter, { minLength: 2, maxLength: 9 }), fc.array(half, { minLength: 3, maxLength: 7 }),
        fc.array(fc.boolean(), { minLength: 1, maxLength: 7 }), fc.constantFrom(...metrics),
        fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { maxLength: 16 }),
        (sites, corners, straight, metric, probes) => {
          const clip = polygon(corners, straight), points = flatten(sites);
          fc.pre(clip.length >= 6 && polygonArea(clip) > 0);
          let d;
          try {
            d = voronoi(points, { metric, clip });
          } catch (err) {
            // A documented limit: the cell of a site outside the region may meet it in separate pieces.
            if (err instanceof AmbitError && err.code === 'unsupported-geometry') return;
            throw err;
          }
          expect(checkMesh(d.mesh).problems).toEqual([]);
          const area = polygonArea(clip);
          expect(Math.abs(d.totalArea() - area)).toBeLessThanOrEqual(1e-12 * area);
          const xy = d.triangulation.siteXY, n = d.triangulation.siteCount;
          let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
          for (let i = 0; i < clip.length; i += 2) {
            minX = Math.min(minX, clip[i]); maxX = Math.max(maxX, clip[i]);
            minY = Math.min(minY, clip[i + 1]); maxY = Math.max(maxY, clip[i + 1]);
          }
          const size = Math.max(maxX - minX, maxY - minY);
          for (const [u, v] of probes) {
            const qx = minX + u * (maxX - minX), qy = minY + v * (maxY - minY);
            // Strictly inside the region: a probe on its boundary may belong to a cell that has no area there
            // (and the distance to a side it lies on can come out as a rounding error, not 0).
            const where = locateInPolygon(clip, qx, qy);
            if (!where.inside || where.boundaryDistance <= 1e-12 * size) continue;
            let owner: number, slack = 1e-12 * size;
            if (metric === 'L2') owner = nearestSiteExact(xy, qx, qy);
            else if (metric === 'L1' || metric === 'Linf') owner = ownerByRule(metric, xy, qx, qy);
            else {
              // Curved edges stray from the true curve by up to the tolerance: probes that near a boundary are skipped.
              const { site, clearance } = lpOwner(metric as number, xy, n, qx, qy);
              const tolerance = (d as { tolerance: number }).tolerance;
              // The same near the region's boundary, where the cells' crossings are rounded.
              if (clearance <= tolerance + 1e-9 * size || where.boundaryDistance <= tolerance + 1e-9 * size) continue;
              owner = site;
              slack = 0;
            }
            const at = locateInPolygon(d.cellPolygon(owner), qx, qy);
            expect(at.inside || at.boundaryDistance <= slack).toBe(true);
          }
        }),
      { numRuns: NUM_RUNS },
    );
  });
});
