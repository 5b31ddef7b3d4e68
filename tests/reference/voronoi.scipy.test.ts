import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { triangulate, voronoi } from '../../src/index.js';
import { isStrictlyDelaunay } from '../support/brute.js';
import { runPython } from '../support/scipy.js';
import {
  boundingBox, clippedLength, compareDistanceExact, convexDepth, nearestSiteExact, ulp,
} from '../support/voronoi-brute.js';
import { liveCases, liveSeed, prng, scipyOrSkip } from '../support/live-cases.js';

/**
 * Outside reference: scipy.spatial.Voronoi (Qhull) and scipy.spatial.cKDTree
 * from Debian's python3-scipy.
 *
 * Region: the sites' bounding box padded by 10% of its larger side, which is
 * ambit's default clip (checked below against a box computed here).
 *
 * Tolerance: 1e-9 of the region's size, plus 4 ulps of the largest region
 * coordinate. The ulp term is there because scipy computes in a frame moved
 * back by `shift` (Qhull merges points near 1e7), and adding the shift back
 * rounds to the grid of doubles there; it matters only for the tight set at
 * 1e7 (region 0.012 wide, ulp 1.9e-9).
 *
 * Ridges: scipy's finite ridges are segments between its vertices; an
 * unbounded ridge (vertex -1) is a ray from its finite vertex, in the
 * direction scipy's documentation (and its voronoi_plot_2d) uses:
 * perpendicular to the two sites, pointing away from the centroid of all
 * input points. Both are clipped to the region here (Cyrus–Beck). Pairs whose
 * clipped length is within the tolerance of 0 are left out of the comparison:
 * whether such a ridge survives as an edge depends on floating positions.
 */

interface ScipyVoronoi {
  vertices: [number, number][];
  ridgePoints: [number, number][];
  ridgeVertices: [number, number][];
}

interface Fixture extends ScipyVoronoi {
  name: string;
  scipy: string;
  scipyInputShift: [number, number];
  points: [number, number][];
}

const fixtureDir = fileURLToPath(new URL('../fixtures/voronoi/', import.meta.url));
const fixtures: Fixture[] = readdirSync(fixtureDir)
  .filter((f) => f.endsWith('.json'))
  .sort()
  .map((f) => JSON.parse(readFileSync(fixtureDir + f, 'utf8')) as Fixture);

function pairKey(a: number, b: number): string { return a < b ? `${a},${b}` : `${b},${a}`; }

/** Compares ambit's diagram of `points` with scipy's answer (computed on points - shift). */
function compare(points: [number, number][], shift: [number, number], ref: ScipyVoronoi, label: string) {
  const d = voronoi(points);
  const tri = d.triangulation;
  const m = d.mesh;

  // The region: the padded bounding box, computed here from the input.
  const b = boundingBox(points.flat());
  const side = Math.max(b.maxX - b.minX, b.maxY - b.minY);
  const pad = 0.1 * side;
  const rb = boundingBox(d.region);
  const M = Math.max(Math.abs(rb.minX), Math.abs(rb.maxX), Math.abs(rb.minY), Math.abs(rb.maxY));
  const slack = 4 * ulp(M);
  for (const [got, want] of [[rb.minX, b.minX - pad], [rb.maxX, b.maxX + pad], [rb.minY, b.minY - pad], [rb.maxY, b.maxY + pad]]) {
    expect(Math.abs(got - want), `${label}: region bound ${got} vs padded box ${want}`).toBeLessThanOrEqual(slack);
  }
  const size = Math.max(rb.maxX - rb.minX, rb.maxY - rb.minY);
  const tol = 1e-9 * size + slack;
  const region = d.region;

  // scipy's vertices in our frame.
  const sv = ref.vertices.map(([x, y]) => [x + shift[0], y + shift[1]] as [number, number]);

  // Our interior vertices: those not on the outer face (the region boundary).
  const onBoundary = new Uint8Array(m.vertexXY.length >> 1);
  const e0 = m.faceEdge[m.outerFace];
  let e = e0;
  do { onBoundary[m.origin[e]] = 1; e = m.next[e]; } while (e !== e0);
  const matched = new Uint8Array(sv.length);
  let interior = 0;
  const far: string[] = [];
  for (let v = 0; v < onBoundary.length; v++) {
    if (onBoundary[v]) continue;
    interior++;
    const x = m.vertexXY[2 * v], y = m.vertexXY[2 * v + 1];
    let best = -1, bestD = Infinity;
    for (let i = 0; i < sv.length; i++) {
      const dd = Math.hypot(sv[i][0] - x, sv[i][1] - y);
      if (dd < bestD) { bestD = dd; best = i; }
    }
    if (bestD > tol) far.push(`vertex ${v} (${x}, ${y}): nearest scipy vertex ${best} at distance ${bestD}`);
    else matched[best] = 1;
  }
  expect(far.slice(0, 10), `${label}: our interior vertices vs scipy's (tolerance ${tol})`).toEqual([]);
  // Every scipy vertex clearly inside the region is one of ours.
  const missing: string[] = [];
  for (let i = 0; i < sv.length; i++) {
    if (!matched[i] && convexDepth(region, sv[i][0], sv[i][1]) > tol) missing.push(`scipy vertex ${i} (${sv[i]})`);
  }
  expect(missing.slice(0, 10), `${label}: scipy vertices inside the region with no vertex of ours`).toEqual([]);

  // Site pairs sharing an edge, with its length: ours from the mesh.
  const ours = new Map<string, number>();
  for (let h = 0; h < m.origin.length; h++) {
    const f = m.face[h], g = m.face[m.twin[h]];
    if (f === m.outerFace || g === m.outerFace || h > m.twin[h]) continue;
    const u = m.origin[h], w = m.origin[m.twin[h]];
    const k = pairKey(m.faceSite[f], m.faceSite[g]);
    ours.set(k, (ours.get(k) ?? 0) + Math.hypot(m.vertexXY[2 * w] - m.vertexXY[2 * u], m.vertexXY[2 * w + 1] - m.vertexXY[2 * u + 1]));
  }
  // scipy's: every ridge clipped to the region.
  let cx = 0, cy = 0;
  for (const [x, y] of points) { cx += x - shift[0]; cy += y - shift[1]; }
  cx /= points.length; cy /= points.length;
  const theirs = new Map<string, number>();
  for (let r = 0; r < ref.ridgePoints.length; r++) {
    const [p, q] = ref.ridgePoints[r];
    const [i, j] = ref.ridgeVertices[r];
    const sp = tri.siteOfInput[p], sq = tri.siteOfInput[q];
    let len: number;
    if (i >= 0 && j >= 0) {
      len = clippedLength(region, sv[i][0], sv[i][1], sv[j][0] - sv[i][0], sv[j][1] - sv[i][1], 0, 1);
    } else {
      const k = i >= 0 ? i : j;
      const [px, py] = [points[p][0] - shift[0], points[p][1] - shift[1]];
      const [qx, qy] = [points[q][0] - shift[0], points[q][1] - shift[1]];
      let nx = -(qy - py), ny = qx - px;
      const mx = (px + qx) / 2, my = (py + qy) / 2;
      if ((mx - cx) * nx + (my - cy) * ny < 0) { nx = -nx; ny = -ny; }
      len = clippedLength(region, sv[k][0], sv[k][1], nx, ny, 0, Infinity);
    }
    theirs.set(pairKey(sp, sq), len);
  }
  const problems: string[] = [];
  let excluded = 0;
  for (const [k, len] of theirs) {
    if (len <= tol) { excluded++; continue; }
    const mine = ours.get(k);
    if (mine === undefined) problems.push(`scipy ridge ${k} has length ${len} inside the region; ambit has no such edge`);
    else if (Math.abs(mine - len) > 2 * tol) problems.push(`edge ${k}: ambit length ${mine}, scipy ridge clipped ${len}`);
  }
  for (const [k, mine] of ours) {
    if (!theirs.has(k)) problems.push(`ambit edge ${k} (length ${mine}) is not a scipy ridge`);
  }
  expect(problems.slice(0, 10), `${label}: site pairs with a ridge inside the region`).toEqual([]);
  return { interior, pairs: ours.size, excluded };
}

describe('Voronoi diagram equals scipy.spatial.Voronoi on committed fixtures', () => {
  it('has the committed fixtures (made by tests/fixtures/make_voronoi_fixtures.py)', () => {
    expect(fixtures.length).toBeGreaterThanOrEqual(12);
    for (const f of fixtures) expect(f.scipy, f.name).toMatch(/^\d+\.\d+/);
  });

  for (const f of fixtures) {
    it(`${f.name} (${f.points.length} points, scipy ${f.scipy})`, () => {
      const r = compare(f.points, f.scipyInputShift, f, f.name);
      // A random set in general position has about 2n vertices, most inside the padded box.
      expect(r.interior, f.name).toBeGreaterThan(0);
      expect(r.pairs, f.name).toBeGreaterThan(0);
    });
  }
});


describe('Voronoi diagram and nearest sites equal scipy on fresh random input (live)', () => {
  const seed = liveSeed();
  const title = `seed ${seed} (replay with AMBIT_SEED=${seed})`;
  const version = scipyOrSkip(title);
  if (version === null) return;

  it(`scipy.spatial.Voronoi, ${title}, scipy ${version}`, () => {
    let compared = 0;
    for (const c of liveCases(seed, 20, false)) {
      const label = `${c.name} (${c.points.length} points), seed ${seed}`;
      const tri = triangulate(c.points);
      // Unique Delaunay triangulation (exact predicates): the Voronoi combinatorics are well defined.
      if (!isStrictlyDelaunay(tri.siteXY, tri.triangleSites)) {
        console.warn(`live scipy case ${label} not compared: 4 cocircular sites`);
        continue;
      }
      const moved = c.points.map(([x, y]) => [x - c.shift[0], y - c.shift[1]] as [number, number]);
      for (let i = 0; i < moved.length; i++) {
        for (let k = 0; k < 2; k++) expect(moved[i][k] + c.shift[k], `${label}: exact shift`).toBe(c.points[i][k]);
      }
      const r = runPython<ScipyVoronoi>('voronoi', { points: moved });
      expect(r.ok, `${label}: ${r.error}`).toBe(true);
      compare(c.points, c.shift, r.value!, label);
      compared++;
    }
    expect(compared, `seed ${seed}`).toBeGreaterThanOrEqual(2);
  });

  /** nearestMany against cKDTree; disagreements must be exact ties won by the smaller site index. */
  function compareNearest(points: [number, number][], queries: Float64Array, label: string): { ties: number } {
    const d = voronoi(points);
    const xy = d.triangulation.siteXY;
    const ours = d.nearestMany(queries);
    const r = runPython<{ nearest: number[] }>('kdtreeNearest', { points, queries: Array.from(queries) }, 120_000);
    expect(r.ok, `${label}: ${r.error}`).toBe(true);
    const theirs = r.value!.nearest;
    expect(theirs.length).toBe(ours.length);
    const problems: string[] = [];
    let ties = 0;
    for (let i = 0; i < ours.length; i++) {
      const t = d.triangulation.siteOfInput[theirs[i]];
      if (t === ours[i]) continue;
      const qx = queries[2 * i], qy = queries[2 * i + 1], s = ours[i];
      const cmp = compareDistanceExact(qx, qy, xy[2 * s], xy[2 * s + 1], xy[2 * t], xy[2 * t + 1]);
      if (cmp !== 0 || s > t) {
        problems.push(`query ${i} (${qx}, ${qy}): ambit ${s}, cKDTree ${t}, exact distance comparison ${cmp}`);
      } else {
        // A tie: ambit must give the smallest index of all exactly nearest sites.
        const want = nearestSiteExact(xy, qx, qy);
        if (want !== s) problems.push(`query ${i} (${qx}, ${qy}): ambit ${s}, exact brute force ${want}`);
        ties++;
      }
    }
    expect(problems.slice(0, 10), label).toEqual([]);
    return { ties };
  }

  it(`nearestMany equals scipy.spatial.cKDTree.query (p=2) on 10^5 queries, ${title}`, () => {
    const rnd = prng(seed ^ 0x5f3759df);
    const c = liveCases(seed, 20, false)[0];
    const b = boundingBox(c.points.flat());
    const w = b.maxX - b.minX, h = b.maxY - b.minY;
    const q = new Float64Array(2e5);
    for (let i = 0; i < q.length; i += 2) {
      q[i] = b.minX - 0.2 * w + 1.4 * w * rnd();
      q[i + 1] = b.minY - 0.2 * h + 1.4 * h * rnd();
    }
    compareNearest(c.points, q, `uniform sites, seed ${seed}`);
  });

  it(`nearestMany equals cKDTree except on exact ties, where the smallest index wins: integer lattice, ${title}`, () => {
    const rnd = prng(seed ^ 0x2545f491);
    // A thinned, shuffled 40 x 40 lattice and half-integer queries: many queries are exactly equidistant from 2 or 4 sites.
    const pts: [number, number][] = [];
    for (let i = 0; i < 40; i++) for (let j = 0; j < 40; j++) if (rnd() < 0.7) pts.push([i, j]);
    for (let i = pts.length - 1; i > 0; i--) {
      const j = Math.floor(rnd() * (i + 1));
      [pts[i], pts[j]] = [pts[j], pts[i]];
    }
    const q = new Float64Array(2e5);
    for (let i = 0; i < q.length; i++) q[i] = Math.floor(rnd() * 84 - 2) / 2;
    const { ties } = compareNearest(pts, q, `integer lattice, seed ${seed}`);
    console.info(`lattice: ${ties} of 10^5 queries were exact ties that cKDTree broke differently`);
  });
});
