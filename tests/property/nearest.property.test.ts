import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compareDistance } from '../../src/core/distance.js';
import { SiteLocator } from '../../src/query/site-locator.js';
import { triangulate, type Triangulation } from '../../src/triangulate/triangulation.js';
import { allGenerators, grid, ring, uniform, type NamedGenerator } from '../support/generators.js';

// 1000 runs per property in CI (process.env.CI set), 100 locally; the count is
// common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 100;

/**
 * Query recipes, turned into points once the sites are known: a site itself,
 * the midpoint of two sites, a "cell corner" mixing the x of one midpoint with
 * the y of another (grid points, half-integers and cell corners of lattices),
 * the rounded circumcentre of three sites (near ties everywhere), a point of
 * the padded bounding box, and a point very far away.
 */
interface Recipe { kind: number; i: number; j: number; k: number; l: number; u: number; v: number }
const recipe: fc.Arbitrary<Recipe> = fc.record({
  kind: fc.integer({ min: 0, max: 5 }),
  i: fc.nat(), j: fc.nat(), k: fc.nat(), l: fc.nat(),
  u: fc.double({ min: -0.5, max: 1.5, noNaN: true }),
  v: fc.double({ min: -0.5, max: 1.5, noNaN: true }),
});

function queryFrom(r: Recipe, xy: Float64Array, n: number): [number, number] {
  const X = (s: number): number => xy[2 * (s % n)], Y = (s: number): number => xy[2 * (s % n) + 1];
  switch (r.kind) {
    case 0: return [X(r.i), Y(r.i)];
    case 1: return [(X(r.i) + X(r.j)) / 2, (Y(r.i) + Y(r.j)) / 2];
    case 2: return [(X(r.i) + X(r.j)) / 2, (Y(r.k) + Y(r.l)) / 2];
    case 3: {
      // Circumcentre relative to site i (rounded; falls back to the centroid when degenerate).
      const ax = X(r.i), ay = Y(r.i);
      const bx = X(r.j) - ax, by = Y(r.j) - ay, cx = X(r.k) - ax, cy = Y(r.k) - ay;
      const d = 2 * (bx * cy - by * cx);
      const b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
      const ox = (cy * b2 - by * c2) / d, oy = (bx * c2 - cx * b2) / d;
      if (d !== 0 && Number.isFinite(ox) && Number.isFinite(oy) && Math.abs(ax + ox) < 1e30 && Math.abs(ay + oy) < 1e30) {
        return [ax + ox, ay + oy];
      }
      return [(ax + X(r.j) + X(r.k)) / 3, (ay + Y(r.j) + Y(r.k)) / 3];
    }
    case 4: {
      let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
      for (let s = 0; s < n; s++) {
        minX = Math.min(minX, xy[2 * s]); maxX = Math.max(maxX, xy[2 * s]);
        minY = Math.min(minY, xy[2 * s + 1]); maxY = Math.max(maxY, xy[2 * s + 1]);
      }
      const w = Math.max(maxX - minX, maxY - minY, 1);
      return [minX + r.u * w, minY + r.v * w];
    }
    default: return [(r.u - 0.5) * 1e30, (r.v - 0.5) * 1e30];
  }
}

/** Brute force: all sites sorted by (exact distance, index). */
function bruteOrder(xy: Float64Array, n: number, x: number, y: number): number[] {
  const ids = Array.from({ length: n }, (_, i) => i);
  return ids.sort((a, b) => compareDistance(x, y, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]) || a - b);
}

const casesArb = (g: NamedGenerator) =>
  fc.record({ pts: g.arb, recipes: fc.array(recipe, { minLength: 1, maxLength: 12 }), ks: fc.array(fc.nat(), { minLength: 1, maxLength: 12 }) });

function queriesOf(tri: Triangulation, recipes: Recipe[]): number[] {
  const out: number[] = [];
  for (const r of recipes) out.push(...queryFrom(r, tri.siteXY, tri.siteCount));
  return out;
}

describe.each(allGenerators(40))('SiteLocator vs brute force: $name', (g) => {
  it('nearest, kNearest (random k) and nearestMany agree with brute force', () => {
    fc.assert(
      fc.property(casesArb(g), ({ pts, recipes, ks }) => {
        const tri = triangulate(pts);
        const n = tri.siteCount, xy = tri.siteXY;
        const loc = new SiteLocator(tri);
        const q = queriesOf(tri, recipes);
        const want: number[] = [];
        for (let t = 0; t < recipes.length; t++) {
          const x = q[2 * t], y = q[2 * t + 1];
          const order = bruteOrder(xy, n, x, y);
          want.push(order[0]);
          expect(loc.nearest(x, y), `nearest(${x}, ${y})`).toBe(order[0]);
          const k = 1 + (ks[t % ks.length] % n);
          expect(Array.from(loc.kNearest(x, y, k)), `kNearest(${x}, ${y}, ${k})`).toEqual(order.slice(0, k));
        }
        // nearestMany equals nearest one by one, from a fresh locator and from a warm one.
        expect(Array.from(new SiteLocator(tri).nearestMany(q))).toEqual(want);
        expect(Array.from(loc.nearestMany(Float64Array.from(q)))).toEqual(want);
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

/** Adjacency from the triangulation's own neighbour lists (not the locator's CSR). */
function neighbourLists(tri: Triangulation): number[][] {
  return Array.from({ length: tri.siteCount }, (_, s) => Array.from(tri.neighbors(s)));
}

const someGenerators: NamedGenerator[] = [
  { name: 'uniform', arb: uniform(40, 3) },
  { name: 'grid', arb: grid(40) },
  { name: 'ring', arb: ring(40) },
];

describe.each(someGenerators)('the graph properties the walks rely on (brute force): $name', (g) => {
  it('greedy descent from EVERY site reaches a nearest site (known property of Delaunay triangulations)', () => {
    fc.assert(
      fc.property(casesArb(g), ({ pts, recipes }) => {
        const tri = triangulate(pts);
        const n = tri.siteCount, xy = tri.siteXY;
        const nb = neighbourLists(tri);
        const q = queriesOf(tri, recipes);
        for (let t = 0; t < recipes.length; t++) {
          const x = q[2 * t], y = q[2 * t + 1];
          const best = bruteOrder(xy, n, x, y)[0];
          for (let start = 0; start < n; start++) {
            let cur = start;
            for (let moved = true; moved;) {
              moved = false;
              for (const u of nb[cur]) {
                if (compareDistance(x, y, xy[2 * u], xy[2 * u + 1], xy[2 * cur], xy[2 * cur + 1]) < 0) {
                  cur = u; moved = true; break;
                }
              }
            }
            const d = compareDistance(x, y, xy[2 * cur], xy[2 * cur + 1], xy[2 * best], xy[2 * best + 1]);
            expect(d, `descent from ${start} to (${x}, ${y}) stopped at ${cur}, not a nearest site (${best})`).toBe(0);
          }
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('the sites in any closed disk around q induce a connected subgraph (known property, from memory)', () => {
    // The disk form, radius = distance to some site r, ties included. The
    // "k nearest by (distance, index)" set itself can be disconnected when it
    // cuts through a tie: e.g. a ring of sites queried at its centre with
    // k = 2 may pick two non-adjacent ring sites. kNearest relies on the disk form.
    fc.assert(
      fc.property(casesArb(g), fc.nat(), ({ pts, recipes }, rPick) => {
        const tri = triangulate(pts);
        const n = tri.siteCount, xy = tri.siteXY;
        const nb = neighbourLists(tri);
        const q = queriesOf(tri, recipes);
        for (let t = 0; t < recipes.length; t++) {
          const x = q[2 * t], y = q[2 * t + 1];
          const r = (rPick + t) % n;
          const inside = (s: number): boolean =>
            compareDistance(x, y, xy[2 * s], xy[2 * s + 1], xy[2 * r], xy[2 * r + 1]) <= 0;
          const members: number[] = [];
          for (let s = 0; s < n; s++) if (inside(s)) members.push(s);
          const seen = new Set<number>([r]);
          const stack = [r];
          while (stack.length > 0) {
            const s = stack.pop()!;
            for (const u of nb[s]) if (!seen.has(u) && inside(u)) { seen.add(u); stack.push(u); }
          }
          expect(seen.size, `disk around (${x}, ${y}) through site ${r}`).toBe(members.length);
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });
});
