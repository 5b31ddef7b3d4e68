import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TriangleStore } from '../../src/triangulate/store.js';
import { localTriangles } from '../../src/diagram/metric/local-triangles.js';

// The dual route renumbers its finished triangles by their least vertex (local-triangles.ts). Checked here
// against the store it came from: the same triangles with the same orientation, twins that pair each
// half-edge with its reverse, -1 exactly where the store had a ghost, and the promised order.

const NUM_RUNS = process.env.CI ? 300 : 60;

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);

/** A triangle as a string, rotated to start at its least vertex (orientation kept). */
function key(a: number, b: number, c: number): string {
  if (a < b && a < c) return `${a},${b},${c}`;
  if (b < c) return `${b},${c},${a}`;
  return `${c},${a},${b}`;
}

// Integer points (duplicates and collinear runs among them, which the store reports or keeps flat) and
// uniform doubles.
const points = fc.oneof(
  fc.array(fc.tuple(fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 6 })), { minLength: 3, maxLength: 40 }),
  fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 3, maxLength: 200 }),
);

describe('localTriangles', () => {
  it('keeps the store\'s real triangles, pairs twins, marks the hull, and orders by least vertex', () => {
    let checked = 0;
    fc.assert(fc.property(points, (pts) => {
      const xy = Float64Array.from(pts.flat());
      const n = pts.length;
      const store = new TriangleStore(xy, 2 * n + 8);
      // A first triangle that is not flat, then everything else (duplicates return their twin vertex).
      let first = -1;
      for (let c = 2; c < n && first < 0; c++) {
        const o = (xy[2] - xy[0]) * (xy[2 * c + 1] - xy[1]) - (xy[3] - xy[1]) * (xy[2 * c] - xy[0]);
        if (o > 0) first = c;
      }
      if (first < 0) return;
      store.init(0, 1, first);
      for (let s = 2; s < n; s++) if (s !== first) store.insert(s);
      const real: string[] = [];
      let hullEdges = 0;
      for (let t = 0; t < store.count; t++) {
        const v = store.vert;
        if (store.isGhost(t)) { hullEdges++; continue; }
        real.push(key(v[3 * t], v[3 * t + 1], v[3 * t + 2]));
      }
      const L = localTriangles(store, n);
      expect(L.count).toBe(real.length);
      const got: string[] = [];
      let prevLeast = -1, minusOnes = 0;
      for (let t = 0; t < L.count; t++) {
        const a = L.vert[3 * t], b = L.vert[3 * t + 1], c = L.vert[3 * t + 2];
        got.push(key(a, b, c));
        const least = Math.min(a, b, c);
        expect(least).toBeGreaterThanOrEqual(prevLeast);
        prevLeast = least;
        for (let j = 0; j < 3; j++) {
          const e = 3 * t + j, y = L.twin[e];
          if (y < 0) { minusOnes++; continue; }
          expect(L.twin[y]).toBe(e);
          // The twin runs the other way: its origin is e's end.
          expect(L.vert[y]).toBe(L.vert[nextOf(e)]);
        }
      }
      expect(got.sort()).toEqual(real.sort());
      // Each ghost triangle has exactly one real edge, across from one real half-edge.
      expect(minusOnes).toBe(hullEdges);
      checked++;
    }), { numRuns: NUM_RUNS });
    expect(checked).toBeGreaterThan(NUM_RUNS / 2);
  });
});
