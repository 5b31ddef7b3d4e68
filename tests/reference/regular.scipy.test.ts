import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { triangulate } from '../../src/index.js';
import { canonicalTriangles } from '../support/brute.js';
import { regularUniqueness } from '../support/power-brute.js';
import { runPython } from '../support/scipy.js';
import { liveCases, liveSeed, prng, scipyOrSkip } from '../support/live-cases.js';

/**
 * Outside reference for the regular (weighted Delaunay) triangulation: the
 * lifting map (Aurenhammer 1987, "Power diagrams: properties, algorithms and
 * applications", SIAM J. Comput.). Site (x, y) of weight w lifts to
 * (x, y, x^2 + y^2 - w); the regular triangulation is the projection of the
 * lower faces of the convex hull of the lifted points, and the hidden sites
 * are exactly those whose lifted point lies above that lower hull. The hull
 * comes from scipy.spatial.ConvexHull (Qhull) of Debian's python3-scipy, on
 * committed fixtures (tests/fixtures/make_regular_fixtures.py verified each
 * one exactly, and unique) and live on fresh random input.
 *
 * Live: a case is compared only where the answer is unique, which is decided
 * here exactly (BigInt power tests on ambit's answer: every interior edge
 * strictly locally regular, every hidden site strictly above); otherwise the
 * skip is logged with the reason.
 */

interface Fixture {
  name: string;
  scipy: string;
  points: [number, number][];
  weights: number[];
  triangles: [number, number, number][];
  hidden: number[];
}

const fixtureDir = fileURLToPath(new URL('../fixtures/regular/', import.meta.url));
const fixtures: Fixture[] = readdirSync(fixtureDir)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((f) => JSON.parse(readFileSync(fixtureDir + f, 'utf8')) as Fixture);

/** Compares ambit's regular triangulation with lower-hull triangles and hidden points (input indices). */
function compare(points: [number, number][], weights: number[], triangles: number[][], hidden: number[], label: string) {
  const tri = triangulate(points, { weights });
  // Fixtures and live cases have distinct points, so sites are numbered as the input.
  expect(tri.siteCount, label).toBe(points.length);
  expect(Array.from(tri.siteOfInput), label).toEqual(points.map((_, i) => i));
  expect(canonicalTriangles(tri.triangleSites), `${label}: triangles`).toEqual(canonicalTriangles(triangles.flat()));
  expect(Array.from(tri.hiddenSites), `${label}: hidden sites`).toEqual([...hidden].sort((a, b) => a - b));
  return tri;
}

describe('regular triangulation equals the lower hull of scipy.spatial.ConvexHull of the lifted points (fixtures)', () => {
  it('has the committed fixtures (made by tests/fixtures/make_regular_fixtures.py)', () => {
    expect(fixtures.length).toBeGreaterThanOrEqual(12);
    for (const f of fixtures) expect(f.scipy, f.name).toMatch(/^\d+\.\d+/);
    // The set covers what it must: sets where many sites are hidden, and sets with none.
    expect(fixtures.some((f) => f.hidden.length > f.points.length / 3)).toBe(true);
    expect(fixtures.some((f) => f.hidden.length === 0 && f.weights.every((w) => w === f.weights[0]))).toBe(true);
  });

  for (const f of fixtures) {
    it(`${f.name} (${f.points.length} points, ${f.hidden.length} hidden, scipy ${f.scipy})`, () => {
      compare(f.points, f.weights, f.triangles, f.hidden, f.name);
    });
  }
});

describe('regular triangulation equals scipy.spatial.ConvexHull of the lifted points on fresh random input (live)', () => {
  const seed = liveSeed();
  const title = `seed ${seed} (replay with AMBIT_SEED=${seed})`;
  const version = scipyOrSkip(title);
  if (version === null) return;

  it(`lower hull of (x, y, x^2 + y^2 - w), ${title}, scipy ${version}`, () => {
    const rnd = prng(seed ^ 0x1b873593);
    let compared = 0, hiddenSeen = 0;
    for (const c of liveCases(seed, 20, false)) {
      // Weights up to `scale` times the mean squared spacing: light hides a few sites, heavy many.
      for (const scale of [0.1, 3]) {
        const n = c.points.length;
        let minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
        for (const [x, y] of c.points) { minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y); }
        const spacing2 = ((maxX - minX) * (maxY - minY)) / n;
        const weights = c.points.map(() => scale * spacing2 * rnd());
        const label = `${c.name} (${n} points, weight scale ${scale}), seed ${seed}`;
        const tri = triangulate(c.points, { weights });
        const why = regularUniqueness(tri.siteXY, weights, tri.triangleSites, tri.hiddenSites);
        if (why !== null) {
          console.warn(`live scipy case ${label} not compared: the lower hull is not unique (${why})`);
          continue;
        }
        const moved = c.points.map(([x, y]) => [x - c.shift[0], y - c.shift[1]] as [number, number]);
        for (let i = 0; i < n; i++) {
          for (let k = 0; k < 2; k++) expect(moved[i][k] + c.shift[k], `${label}: exact shift`).toBe(c.points[i][k]);
        }
        // A translation leaves power distances |p - s|^2 - w unchanged, so scipy may lift the moved points.
        const r = runPython<{ triangles: number[][] }>('regular', { points: moved, weights });
        expect(r.ok, `${label}: ${r.error}`).toBe(true);
        const used = new Set(r.value!.triangles.flat());
        const hidden = c.points.map((_, i) => i).filter((i) => !used.has(i));
        compare(c.points, weights, r.value!.triangles, hidden, label);
        hiddenSeen += hidden.length;
        compared++;
      }
    }
    expect(compared, `seed ${seed}`).toBeGreaterThanOrEqual(4);
    expect(hiddenSeen, `seed ${seed}: some sites hidden`).toBeGreaterThan(0);
  });
});
