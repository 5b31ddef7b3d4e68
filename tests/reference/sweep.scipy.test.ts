import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { checkMesh, voronoi } from '../../src/index.js';
import { diagramDifferences, diagramTolerance } from '../support/diagram-compare.js';

/**
 * Outside reference for the sweep: the committed scipy.spatial.Voronoi
 * fixtures (Qhull, from Debian's python3-scipy; made by
 * tests/fixtures/make_voronoi_fixtures.py, the same files
 * tests/reference/voronoi.scipy.test.ts checks the dual route with).
 *
 * Checked here on the sweep's own output, unclipped:
 *  - its Delaunay edges are scipy's ridge_points (mapped through
 *    siteOfInput): every ridge of nonzero length is an edge, and an edge
 *    that is no ridge must have a dual Voronoi edge no longer than the
 *    tolerance (Qhull may merge nearly cocircular facets);
 *  - the circumcentre of each of its triangles is a scipy vertex, within
 *    1e-9 of the region's size plus 4 ulps of its coordinates (scipy works
 *    in a frame moved back by scipyInputShift, adding it back rounds);
 * and its clipped diagram equals the dual route's (tests/support/diagram-compare.ts).
 */

interface Fixture {
  name: string;
  scipy: string;
  scipyInputShift: [number, number];
  points: [number, number][];
  vertices: [number, number][];
  ridgePoints: [number, number][];
  ridgeVertices: [number, number][];
}

const fixtureDir = fileURLToPath(new URL('../fixtures/voronoi/', import.meta.url));
const fixtures: Fixture[] = readdirSync(fixtureDir)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((f) => JSON.parse(readFileSync(fixtureDir + f, 'utf8')) as Fixture);

const pairKey = (a: number, b: number): string => (a < b ? `${a},${b}` : `${b},${a}`);

/** Circumcentre of a triangle, relative to its first corner for precision far from the origin. */
function circumcentre(xy: Float64Array, a: number, b: number, c: number): [number, number] {
  const ax = xy[2 * a], ay = xy[2 * a + 1];
  const bx = xy[2 * b] - ax, by = xy[2 * b + 1] - ay, cx = xy[2 * c] - ax, cy = xy[2 * c + 1] - ay;
  const d = 2 * (bx * cy - by * cx), bl = bx * bx + by * by, cl = cx * cx + cy * cy;
  return [ax + (cy * bl - by * cl) / d, ay + (bx * cl - cx * bl) / d];
}

describe('sweep equals scipy.spatial.Voronoi on the committed fixtures', () => {
  it('has the committed fixtures', () => {
    expect(fixtures.length).toBeGreaterThanOrEqual(12);
  });

  for (const f of fixtures) {
    it(`${f.name} (${f.points.length} points, scipy ${f.scipy})`, () => {
      const d = voronoi(f.points, { method: 'sweep' });
      expect(checkMesh(d.mesh).problems).toEqual([]);
      expect(diagramDifferences(d, voronoi(f.points))).toEqual([]);
      const tri = d.triangulation, xy = tri.siteXY, ts = tri.triangleSites;
      const { tol } = diagramTolerance(d);
      const [sx, sy] = f.scipyInputShift;
      const sv = f.vertices.map(([x, y]) => [x + sx, y + sy] as [number, number]);

      // Circumcentres of the sweep's triangles, and each Delaunay edge's dual length.
      const centres: [number, number][] = [];
      const dualEnds = new Map<string, [number, number][]>();
      for (let t = 0; t < ts.length; t += 3) {
        const c = circumcentre(xy, ts[t], ts[t + 1], ts[t + 2]);
        centres.push(c);
        for (let j = 0; j < 3; j++) {
          const k = pairKey(ts[t + j], ts[t + (j + 1) % 3]);
          dualEnds.set(k, [...(dualEnds.get(k) ?? []), c]);
        }
      }
      const problems: string[] = [];
      for (const [x, y] of centres) {
        let best = Infinity;
        for (const [u, v] of sv) best = Math.min(best, Math.max(Math.abs(u - x), Math.abs(v - y)));
        if (best > tol) problems.push(`circumcentre (${x}, ${y}) is ${best} from every scipy vertex`);
      }
      const ridges = new Set<string>();
      for (let r = 0; r < f.ridgePoints.length; r++) {
        const [p, q] = f.ridgePoints[r], [i, j] = f.ridgeVertices[r];
        const k = pairKey(tri.siteOfInput[p], tri.siteOfInput[q]);
        ridges.add(k);
        const zero = i >= 0 && j >= 0 && Math.max(Math.abs(sv[i][0] - sv[j][0]), Math.abs(sv[i][1] - sv[j][1])) <= tol;
        if (!zero && !dualEnds.has(k)) problems.push(`scipy ridge ${k} is not a Delaunay edge of the sweep`);
      }
      for (const [k, ends] of dualEnds) {
        if (ridges.has(k)) continue;
        const short = ends.length === 2 && Math.max(Math.abs(ends[0][0] - ends[1][0]), Math.abs(ends[0][1] - ends[1][1])) <= tol;
        if (!short) problems.push(`sweep edge ${k} is no scipy ridge`);
      }
      expect(problems.slice(0, 10), f.name).toEqual([]);
      // Not vacuous: a random set in general position has about 2n triangles and 3n edges.
      expect(centres.length, f.name).toBeGreaterThan(tri.siteCount);
      expect(ridges.size, f.name).toBeGreaterThan(tri.siteCount);
    });
  }
});
