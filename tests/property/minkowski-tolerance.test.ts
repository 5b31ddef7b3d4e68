import { describe, expect, it } from 'vitest';
import { voronoi, type MinkowskiVoronoiDiagram } from '../../src/index.js';
import { prng } from '../support/live-cases.js';
import { boundingBox, type Box } from '../../src/core/bounds.js';
import { bisectorPointAt, distanceToBisector } from '../support/minkowski-brute.js';

/**
 * The documented edge guarantee of Minkowski diagrams, checked densely both
 * ways: every point of an edge's polyline is within `tolerance` of the true
 * bisector of its two sites, and every point of the bisector (inside the
 * region, between the edge's ends) within `tolerance` of that pair's
 * polyline. The bisector's points come from the definition
 * ||q - a||_p = ||q - b||_p alone, by bisection along lines parallel to ab
 * (bisectorPointAt); the polyline-to-curve distance is first order,
 * |F| / |∇F| with F = ||q - a||_p - ||q - b||_p (distanceToBisector), whose
 * error is of the order of the squared distance times the curvature, far
 * below the tolerance here.
 */

const EXPONENTS = [1.1, 1.5, 2.5, 3, 7, 30];
/** Points per polyline segment for the first direction, and curve samples per segment for the second. */
const PER_SEGMENT = 8;

function sets(): { name: string; points: Float64Array }[] {
  const rnd = prng(20261202);
  const uniform = new Float64Array(2 * 400);
  for (let i = 0; i < uniform.length; i++) uniform[i] = rnd();
  // Gaussian clusters of different spreads, moved far from the origin: spacings over two orders of magnitude,
  // and coordinates whose low digits the differences lose.
  const clustered = new Float64Array(2 * 300);
  const gauss = (): number => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  for (let i = 0; i < 300; i++) {
    const c = i % 3, spread = [0.01, 0.05, 0.2][c];
    clustered[2 * i] = 1000 + 0.3 * c + spread * gauss();
    clustered[2 * i + 1] = -2000 + 0.5 * (c % 2) + spread * gauss();
  }
  return [{ name: '400 uniform sites', points: uniform }, { name: '300 sites in three clusters near (1000, -2000)', points: clustered }];
}

/** Worst distance in each direction, in units of the diagram's tolerance. */
function worst(d: MinkowskiVoronoiDiagram, p: number, box: Box): [number, number] {
  const m = d.mesh, xy = d.triangulation.siteXY, V = m.vertexXY, tol = d.tolerance;
  const n = d.triangulation.siteCount;
  const pairs = new Map<number, number[]>();
  let toCurve = 0;
  for (let e = 0; e < m.halfEdgeCount; e++) {
    const t = m.twin[e];
    if (t < e) continue;
    const a = m.faceSite[m.face[e]], b = m.faceSite[m.face[t]];
    if (a < 0 || b < 0) continue;
    const u = m.origin[e], w = m.origin[t];
    const x0 = V[2 * u], y0 = V[2 * u + 1], x1 = V[2 * w], y1 = V[2 * w + 1];
    for (let k = 0; k <= PER_SEGMENT; k++) {
      const x = x0 + (k / PER_SEGMENT) * (x1 - x0), y = y0 + (k / PER_SEGMENT) * (y1 - y0);
      toCurve = Math.max(toCurve, distanceToBisector(p, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], x, y) / tol);
    }
    const key = a < b ? a * n + b : b * n + a;
    let list = pairs.get(key);
    if (list === undefined) pairs.set(key, (list = []));
    list.push(x0, y0, x1, y1);
  }
  let toPolyline = 0;
  for (const [key, segs] of pairs) {
    const a = Math.floor(key / n), b = key % n;
    const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1];
    const L = Math.hypot(bx - ax, by - ay), ux = -(by - ay) / L, uy = (bx - ax) / L, mx = (ax + bx) / 2, my = (ay + by) / 2;
    let s0 = Infinity, s1 = -Infinity;
    for (let i = 0; i < segs.length; i += 2) {
      const s = (segs[i] - mx) * ux + (segs[i + 1] - my) * uy;
      s0 = Math.min(s0, s); s1 = Math.max(s1, s);
    }
    const K = (segs.length / 4) * PER_SEGMENT;
    for (let k = 1; k < K; k++) {
      const [x, y] = bisectorPointAt(p, ax, ay, bx, by, s0 + (k / K) * (s1 - s0));
      // Where the curve leaves the region the edge is clipped: only points inside by more than the tolerance count.
      if (!(x > box.minX + tol && x < box.maxX - tol && y > box.minY + tol && y < box.maxY - tol)) continue;
      let best = Infinity;
      for (let i = 0; i < segs.length; i += 4) best = Math.min(best, segmentDistance(x, y, segs[i], segs[i + 1], segs[i + 2], segs[i + 3]));
      toPolyline = Math.max(toPolyline, best / tol);
    }
  }
  return [toCurve, toPolyline];
}

function segmentDistance(px: number, py: number, x0: number, y0: number, x1: number, y1: number): number {
  const dx = x1 - x0, dy = y1 - y0, L2 = dx * dx + dy * dy;
  const t = L2 > 0 ? Math.max(0, Math.min(1, ((px - x0) * dx + (py - y0) * dy) / L2)) : 0;
  return Math.hypot(px - x0 - t * dx, py - y0 - t * dy);
}

describe('Minkowski edges within the tolerance of the true bisector, both ways', () => {
  for (const { name, points } of sets()) {
    const clip = boundingBox(points);
    for (const p of EXPONENTS) {
      it(`${name}, p = ${p}`, () => {
        const d = voronoi(points, { metric: p, clip }) as MinkowskiVoronoiDiagram;
        const [toCurve, toPolyline] = worst(d, p, clip);
        expect(toCurve).toBeLessThanOrEqual(1);
        expect(toPolyline).toBeLessThanOrEqual(1);
      });
    }
  }
});
