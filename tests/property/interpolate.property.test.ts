import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { naturalNeighbor, nearestValue, orient, triangulate } from '../../src/index.js';
import { allGenerators } from '../support/generators.js';

// 1000 runs per property in CI (process.env.CI set), 100 locally; the count is common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 100;

/** A double uniform in [0, 1) with 53 random bits (shrinks towards 0). */
const unit = fc
  .tuple(fc.integer({ min: 0, max: 2 ** 26 - 1 }), fc.integer({ min: 0, max: 2 ** 27 - 1 }))
  .map(([hi, lo]) => (hi * 2 ** 27 + lo) / 2 ** 53);

/** Query points as convex combinations of three input points: inside the hull, or on it (rounding aside). */
const queryArb = fc.array(fc.tuple(fc.nat(), fc.nat(), fc.nat(), unit, unit, unit), { minLength: 1, maxLength: 12 });
/** Coefficients k / 16, |k| <= 64: no subnormal products to lose the relative scale of the tolerance. */
const coefficient = fc.integer({ min: -64, max: 64 }).map((k) => k / 16);
const coefficients = fc.tuple(coefficient, coefficient, coefficient);

function queries(flat: number[], picks: [number, number, number, number, number, number][]): [number, number][] {
  const m = flat.length >> 1;
  return picks.map(([i, j, k, u, v, w]) => {
    const s = u + v + w || 1;
    const a = i % m, b = j % m, c = k % m;
    return [(u * flat[2 * a] + v * flat[2 * b] + w * flat[2 * c]) / s, (u * flat[2 * a + 1] + v * flat[2 * b + 1] + w * flat[2 * c + 1]) / s];
  });
}

// Up to 40 points, but rings only up to 12: on a ring every circumcircle is the same circle, probes on it
// sit where the floating sums cancel, and the exact path's cost grows with the square of the cavity.
const GENERATORS = allGenerators(40).map((g) => (g.name.startsWith('ring') ? allGenerators(12).find((h) => h.name === g.name)! : g));

describe.each(GENERATORS)('natural-neighbour interpolation on $name', ({ arb }) => {
  it('reproduces linear functions inside the hull and the data at the sites (Sibson 1981)', () => {
    fc.assert(fc.property(arb, queryArb, coefficients, (flat, picks, [a, b, c]) => {
      const lin = (x: number, y: number) => a * x + b * y + c;
      const values = Array.from({ length: flat.length >> 1 }, (_, i) => lin(flat[2 * i], flat[2 * i + 1]));
      const interp = naturalNeighbor(flat, values);
      // Sibson's interpolant has linear precision (Sibson 1981). The values, and the reference a x + b y + c,
      // carry rounding of a few u times the terms' size |a x| + |b y| + |c| (not |f|: near 1e7 the terms
      // cancel), and the weights a relative error near 1e-13 (the exact path takes over beyond); 1e-9 of
      // the largest terms is the claim under test and leaves a wide margin.
      let scale = 0;
      for (let i = 0; i < flat.length; i += 2) scale = Math.max(scale, Math.abs(a * flat[i]) + Math.abs(b * flat[i + 1]) + Math.abs(c));
      const tri = triangulate(flat);
      // One expect per run (vitest's expect is slow at 1000 runs): the worst case is what is checked.
      let worst = 0, nanInside = false, offSite = -1;
      for (const [x, y] of queries(flat, picks)) {
        const got = interp.at(x, y);
        // A combination of three points can round to just outside the hull: then NaN is right, checked exactly.
        if (Number.isNaN(got)) { if (!outsideHull(tri, x, y)) nanInside = true; continue; }
        worst = Math.max(worst, Math.abs(got - lin(x, y)));
      }
      for (let i = 0; i < values.length && offSite < 0; i++) if (interp.at(flat[2 * i], flat[2 * i + 1]) !== values[i]) offSite = i;
      expect({ nanInside, offSite }).toEqual({ nanInside: false, offSite: -1 });
      expect(worst).toBeLessThanOrEqual(1e-9 * scale);
    }), { numRuns: NUM_RUNS });
  });

  it('is continuous across circumcircles, Delaunay edges and cell boundaries (probe pairs 1e-9 apart)', () => {
    fc.assert(fc.property(arb, fc.array(unit, { minLength: 1, maxLength: 64 }), fc.array(unit, { minLength: 3, maxLength: 12 }), (flat, data, angles) => {
      const tri = triangulate(flat);
      if (tri.dimension < 2) return;
      const n = tri.siteCount, xy = tri.siteXY;
      const values = Array.from({ length: tri.inputCount }, (_, i) => data[tri.siteOfInput[i] % data.length]);
      const interp = naturalNeighbor(tri, values);
      let L = 0, minX = Infinity, maxX = -Infinity, minY = Infinity, maxY = -Infinity;
      for (let i = 0; i < n; i++) {
        minX = Math.min(minX, xy[2 * i]); maxX = Math.max(maxX, xy[2 * i]);
        minY = Math.min(minY, xy[2 * i + 1]); maxY = Math.max(maxY, xy[2 * i + 1]);
        for (let j = 0; j < i; j++) {
          const fi = data[i % data.length], fj = data[j % data.length];
          L = Math.max(L, Math.abs(fi - fj) / Math.hypot(xy[2 * i] - xy[2 * j], xy[2 * i + 1] - xy[2 * j + 1]));
        }
      }
      // 1e-9 of the extent, but at least 16 units in the last place of the coordinates (near 1e7 an ulp is
      // 1.9e-9): probes closer than that would round onto the same doubles.
      const size = Math.max(maxX - minX, maxY - minY);
      const magnitude = Math.max(Math.abs(minX), Math.abs(maxX), Math.abs(minY), Math.abs(maxY));
      const delta = Math.max(1e-9 * size, 16 * Number.EPSILON * magnitude);
      // Two bounds on the jump between probes 2 delta apart. (1) Lipschitz: the interpolant's slope mixes
      // the data's difference quotients between natural neighbours (at most L) through the weights'
      // gradients; over random sets |jump| / (distance L) was measured at most 31, and K = 1000 leaves room.
      // That holds away from the hull only: on a hull edge the value is the edge's linear interpolant, so a
      // site a hair inside the edge forces a slope of (its value's distance from that line) / (its
      // distance), unbounded by L (found by this test: a slope 1000 L at 1e-8 from the edge), and the
      // slope changes on the scale of that distance. So both bounds are asked 1% of the sites' extent
      // inside the hull. (2) No jump beyond the local slope: |jump| <= 4 max(differences of the
      // neighbouring probe pairs either side), the interpolant being C1 away from the sites (Sibson 1981).
      // Nearer the hull: every value within the data's range (Sibson's weights are >= 0 and add up to 1).
      // Values lie in [0, 1): rounding adds at most about 1e-12.
      const hull = tri.hull();
      const inside = (x: number, y: number) => {
        for (let i = 0; i < hull.length; i++) {
          const a = hull[i], b = hull[(i + 1) % hull.length];
          const ex = xy[2 * b] - xy[2 * a], ey = xy[2 * b + 1] - xy[2 * a + 1];
          if ((ex * (y - xy[2 * a + 1]) - ey * (x - xy[2 * a])) / Math.hypot(ex, ey) < 0.01 * size) return false;
        }
        return true;
      };
      // Probes on a lattice of doubles (multiples of twice the ulp at the largest coordinate), so that the
      // four of them lie exactly on one line, equally spaced: rounded probes wander off the line, and across
      // a steep slope that looks like a jump (found at 1e7, where an ulp is 1.9e-9).
      const unit = 2 ** (Math.floor(Math.log2(magnitude || 1)) - 51);
      const snap = (v: number) => Math.round(v / unit) * unit;
      // Near a site the interpolant is a cone-like C0 point and its slope turns on the scale of the distance
      // to it (found by this test: a ratio of 5 at 9 probe spacings from a site), so (2) wants 1000.
      const farFromSites = (x: number, y: number) => {
        for (let i = 0; i < n; i++) if (Math.hypot(x - xy[2 * i], y - xy[2 * i + 1]) < 1000 * delta) return false;
        return true;
      };
      let excess = -Infinity;
      const lo = Math.min(...values), hi = Math.max(...values);
      const probe = (qx: number, qy: number, dx: number, dy: number) => {
        const len = Math.hypot(dx, dy);
        if (!(len > 0)) return;
        // A triangle flat in floating point (exact predicates still see it turn) has its circumcentre beyond
        // doubles, and there is no circle to probe across (found by this test: a perturbed grid, d = 0).
        if (!Number.isFinite(qx) || !Number.isFinite(qy)) return;
        const px = snap(qx), py = snap(qy), ex = snap((delta * dx) / len), ey = snap((delta * dy) / len);
        const xs = [-3, -1, 1, 3].map((k) => px + k * ex), ys = [-3, -1, 1, 3].map((k) => py + k * ey);
        const f = xs.map((x, k) => interp.at(x, ys[k]));
        if (f.some(Number.isNaN)) return; // a probe outside the hull
        // Near the hull only the weights' sign is certain: the values stay within the data's range.
        for (const v of f) excess = Math.max(excess, lo - v - 1e-12, v - hi - 1e-12);
        if (!inside(px, py)) return;
        const jump = Math.abs(f[2] - f[1]);
        // Collected, asserted once per run: the excess of the jump over each bound (<= 0 when it holds).
        if (farFromSites(px, py)) excess = Math.max(excess, jump - (4 * Math.max(Math.abs(f[1] - f[0]), Math.abs(f[3] - f[2])) + 1e-12));
        excess = Math.max(excess, jump - (Math.hypot(xs[2] - xs[1], ys[2] - ys[1]) * L * 1000 + 1e-12));
      };
      const ts = tri.triangleSites, T = ts.length / 3;
      const centre = (t: number): [number, number] => {
        const a = ts[3 * t], b = ts[3 * t + 1], c = ts[3 * t + 2];
        const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b] - ax, by = xy[2 * b + 1] - ay, cx = xy[2 * c] - ax, cy = xy[2 * c + 1] - ay;
        const d = 2 * (bx * cy - by * cx), b2 = bx * bx + by * by, c2 = cx * cx + cy * cy;
        return [ax + (cy * b2 - by * c2) / d, ay + (bx * c2 - cx * b2) / d];
      };
      angles.forEach((u, k) => {
        const t = Math.floor(u * T) % T, [ox, oy] = centre(t), a = ts[3 * t], b = ts[3 * t + 1 + (k % 2)];
        // Across the circumcircle of triangle t, where t enters or leaves the cavity.
        const th = 2 * Math.PI * angles[(k + 1) % angles.length], R = Math.hypot(xy[2 * a] - ox, xy[2 * a + 1] - oy);
        probe(ox + R * Math.cos(th), oy + R * Math.sin(th), Math.cos(th), Math.sin(th));
        // Across the Delaunay edge a–b, where the walk changes triangle.
        const s = angles[(k + 2) % angles.length];
        const ex = xy[2 * b] - xy[2 * a], ey = xy[2 * b + 1] - xy[2 * a + 1];
        probe(xy[2 * a] + s * ex, xy[2 * a + 1] + s * ey, -ey, ex);
        // Across the cell boundary of a and b: the bisector, at the circumcentre of a triangle holding both.
        probe(ox, oy, ex, ey);
      });
      expect(excess).toBeLessThanOrEqual(0);
    }), { numRuns: NUM_RUNS });
  });

  it('fills a grid with exactly the values at() gives, NaN outside the hull included', () => {
    fc.assert(fc.property(arb, fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 9 }), fc.array(unit, { minLength: 1, maxLength: 64 }),
      (flat, columns, rows, data) => {
        const values = Array.from({ length: flat.length >> 1 }, (_, i) => data[i % data.length]);
        // Merged duplicates must agree: give every copy of a point the value of its first copy.
        const tri = triangulate(flat);
        const first = new Map<number, number>();
        tri.siteOfInput.forEach((s, i) => { if (!first.has(s)) first.set(s, values[i]); else values[i] = first.get(s)!; });
        let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
        for (let i = 0; i < flat.length; i += 2) {
          minX = Math.min(minX, flat[i]); maxX = Math.max(maxX, flat[i]);
          minY = Math.min(minY, flat[i + 1]); maxY = Math.max(maxY, flat[i + 1]);
        }
        // A box a little larger than the sites' (and never empty), so that some samples fall outside the hull.
        const padX = (maxX - minX) * 0.1 || 1, padY = (maxY - minY) * 0.1 || 1;
        const spec = { minX: minX - padX, minY: minY - padY, maxX: maxX + padX, maxY: maxY + padY, columns, rows };
        for (const interp of [naturalNeighbor(tri, values), nearestValue(tri, values)]) {
          const grid = interp.grid(spec);
          const dx = (spec.maxX - spec.minX) / columns, dy = (spec.maxY - spec.minY) / rows;
          let differ = -1;
          for (let i = 0; i < rows; i++) {
            for (let j = 0; j < columns; j++) {
              const x = spec.minX + (j + 0.5) * dx, y = spec.minY + (i + 0.5) * dy;
              if (differ < 0 && !Object.is(grid[i * columns + j], interp.at(x, y))) differ = i * columns + j;
            }
          }
          expect(differ).toBe(-1);
        }
      }), { numRuns: NUM_RUNS });
  });
});

/** Strictly outside the sites' convex hull (or off their segment, for collinear sites), decided with exact orient. */
function outsideHull(tri: ReturnType<typeof triangulate>, x: number, y: number): boolean {
  const h = tri.hull(), xy = tri.siteXY;
  if (tri.dimension < 2) {
    const a = h[0], b = h[h.length - 1];
    if (orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], x, y) !== 0) return true;
    const before = (s: number) => x < xy[2 * s] || (x === xy[2 * s] && y < xy[2 * s + 1]);
    const after = (s: number) => x > xy[2 * s] || (x === xy[2 * s] && y > xy[2 * s + 1]);
    return before(a) || after(b);
  }
  for (let i = 0; i < h.length; i++) {
    const a = h[i], b = h[(i + 1) % h.length];
    // orient < 0: right of a counter-clockwise hull edge.
    if (orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], x, y) < 0) return true;
  }
  return false;
}
