import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { balanceTerritories, checkMesh } from '../../src/index.js';
import { brutePowerCells } from '../support/power-brute.js';

// 1000 runs in CI (process.env.CI set), 60 locally so the edit-test loop stays
// quick; the count is common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 60;

/** A region: a rectangle or a regular k-gon, at an offset and scale of its own. */
const regionArb = fc.record({
  k: fc.integer({ min: 3, max: 10 }),
  rect: fc.boolean(),
  scale: fc.constantFrom(1e-3, 1, 1e3),
  offset: fc.constantFrom(0, 1e4),
  phase: fc.double({ min: 0, max: 1, noNaN: true }),
});

/** Sites as fractions of the region: uniform, on a lattice (many cocircular), or on one line (collinear). */
const sitesArb = fc.oneof(
  fc.array(fc.tuple(fc.double({ min: 0.02, max: 0.98, noNaN: true }), fc.double({ min: 0.02, max: 0.98, noNaN: true })), { minLength: 1, maxLength: 60 }),
  fc.integer({ min: 1, max: 7 }).map((k) => Array.from({ length: k * k }, (_, i) => [(0.5 + (i % k)) / k, (0.5 + Math.floor(i / k)) / k] as [number, number])),
  fc.integer({ min: 2, max: 25 }).map((k) => Array.from({ length: k }, (_, i) => [(i + 0.5) / k, 0.3 + 0.4 * ((i + 0.5) / k)] as [number, number])),
);

describe('balanceTerritories (property)', () => {
  it('meets random shares in random convex regions, checked by brute-force power cells', () => {
    fc.assert(
      fc.property(regionArb, sitesArb, fc.array(fc.double({ min: 0.1, max: 10, noNaN: true }), { minLength: 60, maxLength: 60 }), (reg, unitSites, allShares) => {
        // Region and sites at the chosen scale; sites lie in the unit square's inner part, mapped into the region's inscribed box.
        const { scale: s, offset: o } = reg;
        const ring: number[] = [];
        if (reg.rect) ring.push(o, o, o + s, o, o + s, o + s, o, o + s);
        else {
          for (let j = 0; j < reg.k; j++) {
            const a = 2 * Math.PI * (reg.phase + j / reg.k);
            ring.push(o + s * (0.5 + 0.5 * Math.cos(a)), o + s * (0.5 + 0.5 * Math.sin(a)));
          }
        }
        // A regular k-gon of circumradius 1/2 contains the centred box of half-side cos(pi/k)/(2 sqrt 2) >= 0.17.
        const half = reg.rect ? 0.5 : Math.cos(Math.PI / reg.k) / (2 * Math.SQRT2);
        // Sites closer than 1e-4 of the region are dropped: much closer, double precision cannot separate their
        // cells (the diagram refuses them, 'too-close'), and territories that close are not the use case.
        const sites: [number, number][] = [];
        for (const [u, v] of unitSites) {
          const p: [number, number] = [o + s * (0.5 + 2 * half * (u - 0.5)), o + s * (0.5 + 2 * half * (v - 0.5))];
          if (sites.every((q) => Math.hypot(q[0] - p[0], q[1] - p[1]) >= 1e-4 * s)) sites.push(p);
        }
        const n = sites.length;
        const shares = allShares.slice(0, n);
        // Cell areas come from corners rounded to doubles near the offset, so they carry a relative noise of
        // about eps * (offset + scale) / scale times the region-to-cell size ratio (~100 here); no solver can
        // get below it. 1e-6 unless that floor is near it (the offset 1e4 at scale 1e-3 case).
        const tolerance = Math.max(1e-6, 1e4 * Number.EPSILON * (o + s) / s);
        const r = balanceTerritories(sites, { clip: ring, shares, tolerance });
        expect(r.converged).toBe(true);
        expect(r.iterations).toBeLessThanOrEqual(50);
        expect(Math.min(...r.weights)).toBe(0);
        expect(checkMesh(r.diagram.mesh).ok).toBe(true);
        // Independent: brute-force power cells with the returned weights.
        const region = r.diagram.region;
        const brute = brutePowerCells(Float64Array.from(sites.flat()), r.weights, region);
        let sum = 0, total = 0, area = 0;
        for (const v of shares) sum += v;
        for (let i = 0, m = region.length >> 1; i < m; i++) {
          const j = (i + 1) % m;
          area += (region[2 * i] - o) * (region[2 * j + 1] - o) - (region[2 * j] - o) * (region[2 * i + 1] - o);
        }
        area /= 2;
        for (let i = 0; i < n; i++) {
          const want = (area * shares[i]) / sum;
          expect(Math.abs(r.sizes[i] - want) / want, `site ${i}: reported size`).toBeLessThanOrEqual(tolerance);
          expect(Math.abs(brute.areas[i] - want) / want, `site ${i}: brute-force area`).toBeLessThanOrEqual(1.5 * tolerance);
          total += r.sizes[i];
        }
        // The cells' corners are doubles near the offset: each is off by up to an ulp there, a relative
        // error of about eps * (offset + scale) / scale in the areas that add up to the region's.
        expect(Math.abs(total - area) / area).toBeLessThanOrEqual(1e-12 + 16 * Number.EPSILON * (o + s) / s);
      }),
      { numRuns: NUM_RUNS },
    );
  });
});
