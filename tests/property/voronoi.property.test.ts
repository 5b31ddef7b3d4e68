import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMesh, InputError, orient, triangulate, voronoi } from '../../src/index.js';
import { allGenerators, latticeCircle, permuteBy, RING_RADII, type NamedGenerator } from '../support/generators.js';
import { cellPairs } from '../support/diagram-compare.js';
import { monotoneChainHull } from '../support/hull.js';
import {
  boundingBox, convexDepth, dualEdges, nearestSiteExact, polygonArea, polygonCentroid, polygonPerimeter,
  sitesByDistanceExact, ulp,
} from '../support/voronoi-brute.js';

// 1000 runs per property in CI (process.env.CI set), 100 locally so the
// edit-test loop stays quick; the count is common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 100;

type Diagram = ReturnType<typeof voronoi>;
type Rect = { minX: number; minY: number; maxX: number; maxY: number };
type Clip = Rect | number[] | [number, number][] | { x: number; y: number }[];

/** A double uniform in [0, 1) with 53 random bits (shrinks towards 0). */
const unit = fc
  .tuple(fc.integer({ min: 0, max: 2 ** 26 - 1 }), fc.integer({ min: 0, max: 2 ** 27 - 1 }))
  .map(([hi, lo]) => (hi * 2 ** 27 + lo) / 2 ** 53);

/** How the clip region is built from the sites' bounding box (so it lives at the sites' scale and offset). */
type RegionSpec =
  | { kind: 'default' }
  | { kind: 'rect'; f: [number, number, number, number] }
  | { kind: 'hull'; pts: [number, number][]; cw: boolean; rot: number }
  | { kind: 'regular'; k: number; phase: number; radius: number; centre: [number, number]; cw: boolean; rot: number };

const regionArb: fc.Arbitrary<RegionSpec> = fc.oneof(
  fc.constant<RegionSpec>({ kind: 'default' }),
  fc.record({ kind: fc.constant('rect' as const), f: fc.tuple(unit, unit, unit, unit) }),
  fc.record({
    kind: fc.constant('hull' as const),
    pts: fc.array(fc.tuple(unit, unit), { minLength: 3, maxLength: 14 }),
    cw: fc.boolean(),
    rot: fc.nat({ max: 30 }),
  }),
  fc.record({
    kind: fc.constant('regular' as const),
    k: fc.integer({ min: 3, max: 12 }),
    phase: unit,
    radius: unit,
    centre: fc.tuple(unit, unit),
    cw: fc.boolean(),
    rot: fc.nat({ max: 30 }),
  }),
);

/** Convex hull with every vertex a strict corner (exact orient): collinear boundary points removed. */
function strictHull(flat: number[]): number[] {
  const h = monotoneChainHull(flat);
  const out: number[] = [];
  for (let i = 0; i < h.length; i++) {
    const a = h[(i + h.length - 1) % h.length], b = h[i], c = h[(i + 1) % h.length];
    if (orient(a[0], a[1], b[0], b[1], c[0], c[1]) > 0) out.push(b[0], b[1]);
  }
  return out;
}

function strictlyConvexCcw(p: number[]): boolean {
  const n = p.length >> 1;
  if (n < 3) return false;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n, k = (i + 2) % n;
    if (!(orient(p[2 * i], p[2 * i + 1], p[2 * j], p[2 * j + 1], p[2 * k], p[2 * k + 1]) > 0)) return false;
  }
  return true;
}

interface RegionPlan { clip: Clip | undefined; expected: number[]; label: string }

/**
 * The clip option to pass and the counter-clockwise polygon it must become.
 * Custom regions get a half-size of at least 1024 ulps of their centre, so
 * that they are not collapsed by rounding; the default clip is not touched
 * (tiny default regions are exercised as they come).
 */
/** The smallest, over the sides, of the largest distance of a vertex from the side's line. */
function minimumWidth(poly: number[]): number {
  const m = poly.length >> 1;
  let width = Infinity;
  for (let j = 0; j < m; j++) {
    const k = (j + 1) % m;
    const ex = poly[2 * k] - poly[2 * j], ey = poly[2 * k + 1] - poly[2 * j + 1], el = Math.hypot(ex, ey);
    let far = 0;
    for (let i = 0; i < m; i++) far = Math.max(far, Math.abs(ex * (poly[2 * i + 1] - poly[2 * j + 1]) - ey * (poly[2 * i] - poly[2 * j])) / el);
    width = Math.min(width, far);
  }
  return width;
}

function planRegion(spec: RegionSpec, siteXY: Float64Array): RegionPlan {
  const b = boundingBox(siteXY);
  const side = Math.max(b.maxX - b.minX, b.maxY - b.minY);
  if (spec.kind === 'default') {
    // The API: the bounding box padded by 10% of its larger side on every side, by 1 if all sites coincide.
    const pad = side > 0 ? 0.1 * side : 1;
    const x0 = b.minX - pad, y0 = b.minY - pad, x1 = b.maxX + pad, y1 = b.maxY + pad;
    return { clip: undefined, expected: [x0, y0, x1, y0, x1, y1, x0, y1], label: 'default clip' };
  }
  const cx = b.minX + (b.maxX - b.minX) / 2, cy = b.minY + (b.maxY - b.minY) / 2;
  const h = Math.max(side > 0 ? side / 2 : 1, 1024 * ulp(Math.max(Math.abs(cx), Math.abs(cy))));
  const rectFallback = (f: number[]): RegionPlan => {
    const x0 = cx - h * (0.2 + 1.4 * f[0]), x1 = cx + h * (0.2 + 1.4 * f[1]);
    const y0 = cy - h * (0.2 + 1.4 * f[2]), y1 = cy + h * (0.2 + 1.4 * f[3]);
    return { clip: { minX: x0, minY: y0, maxX: x1, maxY: y1 }, expected: [x0, y0, x1, y0, x1, y1, x0, y1], label: 'rectangle' };
  };
  if (spec.kind === 'rect') return rectFallback(spec.f);
  let poly: number[];
  let label: string;
  if (spec.kind === 'hull') {
    poly = strictHull(spec.pts.flatMap(([u, v]) => [cx + h * 1.5 * (2 * u - 1), cy + h * 1.5 * (2 * v - 1)]));
    label = `hull of ${spec.pts.length} random points`;
  } else {
    const r = h * (0.5 + spec.radius);
    const ox = cx + h * (spec.centre[0] - 0.5), oy = cy + h * (spec.centre[1] - 0.5);
    poly = [];
    for (let i = 0; i < spec.k; i++) {
      const a = 2 * Math.PI * (spec.phase + i / spec.k);
      poly.push(ox + r * Math.cos(a), oy + r * Math.sin(a));
    }
    // Rounding can flatten a corner; then take the strict hull of what rounding left.
    if (!strictlyConvexCcw(poly)) poly = strictHull(poly);
    label = `regular ${spec.k}-gon`;
  }
  // Sides much shorter than the region would be mesh edges of that length
  // (and a region a few ulps wide is not what this case is about; the
  // default clip covers tiny regions): drop corners closer than 1e-3 h to
  // the previous kept one, then keep only strict corners again.
  const spaced: number[] = [];
  for (let i = 0; i < poly.length; i += 2) {
    const n = spaced.length;
    const far = (x: number, y: number) => Math.hypot(poly[i] - x, poly[i + 1] - y) >= 1e-3 * h;
    if (n === 0 || (far(spaced[n - 2], spaced[n - 1]) && (i + 2 < poly.length || far(spaced[0], spaced[1])))) spaced.push(poly[i], poly[i + 1]);
  }
  poly = spaced.length >= 6 ? strictHull(spaced) : [];
  if (poly.length < 6) return rectFallback([0.5, 0.5, 0.5, 0.5]);
  // Likewise a region thinner than 1e-3 h (a sliver triangle): the library rejects regions only a few
  // ulps wide (clip-degenerate, tested in tests/unit/clip-region.test.ts), and thin ones are not what
  // this case is about.
  if (minimumWidth(poly) < 1e-3 * h) return rectFallback([0.5, 0.5, 0.5, 0.5]);
  const expected = poly.slice();
  const n = poly.length >> 1;
  let pts: [number, number][] = Array.from({ length: n }, (_, i) => [poly[2 * i], poly[2 * i + 1]]);
  if (spec.cw) pts = pts.reverse();
  const r = spec.rot % n;
  pts = pts.slice(r).concat(pts.slice(0, r));
  label += spec.cw ? ', clockwise' : ', counter-clockwise';
  // Every accepted point layout, in turn.
  const clip: Clip = spec.rot % 3 === 0 ? pts.flat() : spec.rot % 3 === 1 ? pts : pts.map(([x, y]) => ({ x, y }));
  return { clip, expected, label };
}

interface Extra {
  probes: [number, number][];
  pairs: [number, number][];
  knn: [number, number][];
  viaTriangulation: boolean;
}

const extraArb: fc.Arbitrary<Extra> = fc.record({
  probes: fc.array(fc.tuple(unit, unit), { minLength: 10, maxLength: 40 }),
  pairs: fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 10 }),
  knn: fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 3 }),
  viaTriangulation: fc.boolean(),
});

function key(x: number, y: number): string { return `${x},${y}`; }

/** Vertex coordinates around face f, in next order. */
function faceCycle(d: Diagram, f: number): number[] {
  const m = d.mesh;
  const out: number[] = [];
  const e0 = m.faceEdge[f];
  let e = e0;
  let guard = 0;
  do {
    const v = m.origin[e];
    out.push(m.vertexXY[2 * v], m.vertexXY[2 * v + 1]);
    e = m.next[e];
  } while (e !== e0 && ++guard <= m.origin.length);
  return out;
}

/** Whether two interleaved polygons list the same vertices in the same cyclic order. */
function sameCycle(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  const n = a.length >> 1;
  if (n === 0) return true;
  for (let r = 0; r < n; r++) {
    let ok = true;
    for (let i = 0; i < n && ok; i++) {
      const j = (i + r) % n;
      ok = a[2 * i] === b[2 * j] && a[2 * i + 1] === b[2 * j + 1];
    }
    if (ok) return true;
  }
  return false;
}

/**
 * Every property of one diagram, as a list of problems (empty when all hold).
 *
 * Tolerances. `size` is the larger side of the region's bounding box. Voronoi
 * vertices are computed in floating point, so positions are compared within
 * 1e-9 * size as the brief asks, PLUS `slack` = 4 ulps of the largest region
 * coordinate: a point where a Voronoi edge crosses a slanted region edge can
 * only be placed on the grid of doubles, up to half an ulp off that edge, plus
 * a few ulps of arithmetic. Near the origin slack is far below 1e-9 * size; at
 * an offset of 1e7 with a region 1e-3 wide it dominates, and nothing better
 * is representable there.
 */
function diagramProblems(input: number[], spec: RegionSpec, extra: Extra): string[] {
  const out: string[] = [];
  const tri = triangulate(input);
  const n = tri.siteCount;
  const xy = tri.siteXY;
  const plan = planRegion(spec, xy);
  const options = plan.clip === undefined ? undefined : { clip: plan.clip };
  // The documented limit (README, src/diagram/dual.ts MIN_SPACING): sites closer than 2^-40 times the
  // largest coordinate of the sites and the region are refused with InputError 'too-close', since double
  // precision cannot place the boundary between them. Decide it here by brute force over all pairs.
  let closest = Infinity;
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) closest = Math.min(closest, Math.hypot(xy[2 * i] - xy[2 * j], xy[2 * i + 1] - xy[2 * j + 1]));
  const regionPoly = plan.expected;
  const rbb = boundingBox(Float64Array.from(regionPoly));
  let magnitude = Math.max(rbb.maxX - rbb.minX, rbb.maxY - rbb.minY);
  for (const v of regionPoly) magnitude = Math.max(magnitude, Math.abs(v));
  for (const v of xy) magnitude = Math.max(magnitude, Math.abs(v));
  if (closest < 2 ** -40 * magnitude) {
    try {
      if (extra.viaTriangulation) voronoi(tri, options); else voronoi(input, options);
      out.push(`sites ${closest} apart at coordinates of ${magnitude}: expected InputError 'too-close'`);
    } catch (err) {
      if (!(err instanceof InputError) || err.code !== 'too-close') out.push(`expected InputError 'too-close', got ${String(err)}`);
    }
    return out;
  }
  const d = extra.viaTriangulation ? voronoi(tri, options) : voronoi(input, options);
  const m = d.mesh;
  out.push(`(${plan.label}, ${n} sites, dimension ${tri.dimension})`);
  const mark = out.length;

  // -- the mesh itself
  if (m.kind !== 'voronoi') out.push(`mesh.kind is ${m.kind}`);
  const check = checkMesh(m);
  if (!check.ok) {
    out.push(...check.problems.map((p) => `checkMesh: ${p}`));
    return out;
  }
  if (d.triangulation.siteCount !== n) out.push(`diagram has ${d.triangulation.siteCount} sites, expected ${n}`);

  // -- the region
  const region = d.region;
  const rb = boundingBox(region);
  const size = Math.max(rb.maxX - rb.minX, rb.maxY - rb.minY);
  const M = Math.max(Math.abs(rb.minX), Math.abs(rb.maxX), Math.abs(rb.minY), Math.abs(rb.maxY));
  const slack = 4 * ulp(M);
  const tol = 1e-9 * size + slack;
  const regionArea = polygonArea(region);
  const regionPerimeter = polygonPerimeter(region);
  if (!(regionArea > 0)) out.push(`region is not counter-clockwise with positive area: ${Array.from(region)}`);
  if (region.length !== plan.expected.length) {
    out.push(`region has ${region.length / 2} vertices, expected ${plan.expected.length / 2}: ${Array.from(region)}`);
  } else if (spec.kind === 'default') {
    // Computed by the library from the sites: equal up to the rounding of the padding.
    for (let i = 0; i < region.length; i += 2) {
      let hit = false;
      for (let j = 0; j < plan.expected.length && !hit; j += 2) {
        hit = Math.abs(region[i] - plan.expected[j]) <= slack && Math.abs(region[i + 1] - plan.expected[j + 1]) <= slack;
      }
      if (!hit) out.push(`default region vertex (${region[i]}, ${region[i + 1]}) is not a corner of the padded box ${plan.expected}`);
    }
  } else {
    const want = new Set<string>();
    for (let j = 0; j < plan.expected.length; j += 2) want.add(key(plan.expected[j], plan.expected[j + 1]));
    for (let i = 0; i < region.length; i += 2) {
      if (!want.has(key(region[i], region[i + 1]))) out.push(`region vertex (${region[i]}, ${region[i + 1]}) is not a clip vertex`);
    }
  }
  if (out.length > mark) return out;

  // -- faces and sites: face s is the cell of site s (the API), empty (faceEdge -1) when it has no cell;
  // face n is the outer face.
  const F = m.faceEdge.length;
  if (F !== n + 1 || m.outerFace !== n) out.push(`${F} faces with outer face ${m.outerFace}; expected ${n + 1} and ${n}`);
  if (m.faceSite[m.outerFace] !== -1) out.push(`outer face has faceSite ${m.faceSite[m.outerFace]}`);
  if (d.faceOfSite.length !== n) out.push(`faceOfSite has length ${d.faceOfSite.length}, expected ${n}`);
  const without: number[] = [];
  for (let s = 0; s < n && s < F; s++) {
    if (m.faceSite[s] !== s) out.push(`face ${s} has faceSite ${m.faceSite[s]}, expected ${s}`);
    const f = d.faceOfSite[s];
    if (f === -1) {
      without.push(s);
      if (m.faceEdge[s] !== -1) out.push(`site ${s} is reported without a cell but face ${s} has half-edge ${m.faceEdge[s]}`);
    } else if (f !== s || m.faceEdge[s] < 0) out.push(`faceOfSite[${s}] = ${f}, but face ${s} is ${m.faceEdge[s] < 0 ? 'empty' : 'its cell'}`);
  }
  const reported = Array.from(d.sitesWithoutCell).sort((a, b) => a - b);
  if (JSON.stringify(reported) !== JSON.stringify(without)) out.push(`sitesWithoutCell ${reported} != sites with faceOfSite -1 ${without}`);
  if (out.length > mark) return out;

  // -- measures
  const areas = d.cellAreas();
  const perims = d.cellPerimeters();
  const cents = d.cellCentroids();
  const polys: Float64Array[] = [];
  let areaSum = 0;
  for (let s = 0; s < n; s++) {
    const poly = d.cellPolygon(s);
    polys.push(poly);
    const f = d.faceOfSite[s];
    if (f === -1) {
      if (poly.length !== 0) out.push(`site ${s} has no cell but cellPolygon has ${poly.length / 2} vertices`);
      if (areas[s] !== 0) out.push(`site ${s} has no cell but area ${areas[s]}`);
      if (!Number.isNaN(cents[2 * s]) || !Number.isNaN(cents[2 * s + 1])) out.push(`site ${s} has no cell but centroid (${cents[2 * s]}, ${cents[2 * s + 1]})`);
      continue;
    }
    if (!sameCycle(poly, faceCycle(d, f))) out.push(`cellPolygon(${s}) is not the cycle of face ${f}`);
    const a = polygonArea(poly);
    areaSum += areas[s];
    if (Math.abs(areas[s] - a) > 1e-9 * regionArea + polygonPerimeter(poly) * slack) out.push(`cellAreas[${s}] = ${areas[s]}, shoelace gives ${a}`);
    const p = polygonPerimeter(poly);
    if (Math.abs(perims[s] - p) > 1e-9 * p + slack) out.push(`cellPerimeters[${s}] = ${perims[s]}, polygon gives ${p}`);
    // A centroid lies in its cell's bounding box; it is compared with the
    // shoelace centroid only when the cell is not a sliver (area below 1e-6
    // of the region's makes both computations ill-conditioned).
    const cb = boundingBox(poly);
    const cx = cents[2 * s], cy = cents[2 * s + 1];
    if (!(cx >= cb.minX - tol && cx <= cb.maxX + tol && cy >= cb.minY - tol && cy <= cb.maxY + tol)) {
      const [gx, gy] = polygonCentroid(poly);
      out.push(`centroid of cell ${s} (${cx}, ${cy}) is outside the cell's bounding box [${cb.minX}, ${cb.maxX}] x [${cb.minY}, ${cb.maxY}] (area ${a}; shoelace centroid from its first vertex: (${gx}, ${gy}))`);
    } else if (a > 1e-6 * regionArea) {
      const [gx, gy] = polygonCentroid(poly);
      if (Math.abs(cx - gx) > tol || Math.abs(cy - gy) > tol) out.push(`centroid of cell ${s} (${cx}, ${cy}), polygon gives (${gx}, ${gy})`);
    }
  }
  // Cells tile the region: in exact arithmetic the shoelace sums telescope to
  // the region's, whatever the interior vertices; only boundary points that
  // sit up to `slack` off a region edge move it.
  const areaTol = 1e-9 * regionArea + regionPerimeter * slack;
  if (Math.abs(areaSum - regionArea) > areaTol) out.push(`cell areas sum to ${areaSum}, region area ${regionArea} (relative error ${Math.abs(areaSum - regionArea) / regionArea})`);
  if (Math.abs(d.totalArea() - regionArea) > areaTol) out.push(`totalArea ${d.totalArea()}, region area ${regionArea}`);
  const outerVertices = faceCycle(d, m.outerFace).length / 2;
  if (Math.abs(d.totalPerimeter() - regionPerimeter) > 1e-9 * regionPerimeter + outerVertices * slack) {
    out.push(`totalPerimeter ${d.totalPerimeter()}, region perimeter ${regionPerimeter}`);
  }

  // -- every site well inside the region lies in its own cell. Only sites
  // deeper than `tol`: a site on (or within rounding of) the region's
  // boundary sits on its clipped cell's boundary, where floating corners
  // decide the side.
  for (let s = 0; s < n; s++) {
    const sx = xy[2 * s], sy = xy[2 * s + 1];
    if (convexDepth(region, sx, sy) <= tol) continue;
    if (d.faceOfSite[s] === -1) { out.push(`site ${s} (${sx}, ${sy}) is inside the region but has no cell`); continue; }
    const depth = convexDepth(polys[s], sx, sy, tol);
    if (depth < -tol) out.push(`site ${s} (${sx}, ${sy}) lies outside its own cell by ${-depth}`);
  }

  // -- edges: none of zero length. Exactly cocircular sites share one vertex; sites a few ulps off
  // cocircular really do have Voronoi edges of about 1e-16 (their circumcentres differ by that much),
  // so no fixed fraction of the region size can be a floor here; only zero is wrong.
  for (let e = 0; e < m.origin.length; e++) {
    const t = m.twin[e];
    if (t < e) continue;
    const u = m.origin[e], v = m.origin[t];
    const len = Math.hypot(m.vertexXY[2 * v] - m.vertexXY[2 * u], m.vertexXY[2 * v + 1] - m.vertexXY[2 * u + 1]);
    if (!(len > 0)) out.push(`mesh edge ${e} (${u} -> ${v}) has length ${len}`);
  }

  // -- adjacency against the duals of the Delaunay edges
  const ours = cellPairs(d);
  // The library counts points within 4 ulps of the region's coordinates of a side as on it
  // (src/diagram/clip.ts, SNAP_ULPS), so an edge that close to a side along its length is dropped
  // with the sliver beside it; 16 ulps here covers that rule and the test's own rounding.
  const duals = dualEdges(xy, tri.triangleSites, tri.edges(), region, 16 * ulp(M));
  const dualLength = new Map<string, number>();
  const dualSlack = new Map<string, number>();
  for (const de of duals) {
    const k = `${de.a},${de.b}`;
    dualLength.set(k, de.clipped);
    // A cut end on a side met at a shallow angle moves along the edge by the
    // side's rounding divided by the sine of that angle (capped at 1e-6).
    dualSlack.set(k, slack / Math.max(de.endSines[0], 1e-6) + slack / Math.max(de.endSines[1], 1e-6));
  }
  // Positions are floating, so a dual edge clipped to within 1e-7 * size of
  // zero length may or may not survive as a mesh edge (it can be an edge cut
  // near a region corner, or the merged edge of nearly cocircular sites).
  // An edge length depends on two floating endpoints: twice the slack.
  const ambiguous = 1e-7 * size + 2 * slack;
  for (const de of duals) {
    const k = `${de.a},${de.b}`;
    if (de.clipped > ambiguous && !de.alongSide && !ours.has(k)) out.push(`cells ${k} should share an edge of length ${de.clipped} (Delaunay dual clipped to the region) but do not`);
  }
  for (const [k, len] of ours) {
    const want = dualLength.get(k);
    if (want === undefined) out.push(`cells ${k} share an edge of length ${len} but ${k} is not a Delaunay edge`);
    else if (Math.abs(len - want) > ambiguous + dualSlack.get(k)!) out.push(`cells ${k} share length ${len}, the clipped dual edge has ${want}`);
  }

  // -- cellNeighbors: the same pairs with the same lengths, in face-cycle (counter-clockwise) order
  const counts = d.neighborCounts();
  for (let s = 0; s < n && out.length < mark + 30; s++) {
    const nb = d.cellNeighbors(s);
    if (counts[s] !== nb.sites.length) out.push(`neighborCounts[${s}] = ${counts[s]} but cellNeighbors lists ${nb.sites.length}`);
    const f = d.faceOfSite[s];
    const order: number[] = [];
    const lens = new Map<number, number>();
    if (f !== -1) {
      const e0 = m.faceEdge[f];
      let e = e0;
      do {
        const g = m.face[m.twin[e]];
        if (g !== m.outerFace) {
          const t = m.faceSite[g];
          if (order[order.length - 1] !== t) order.push(t);
          const u = m.origin[e], v = m.origin[m.twin[e]];
          lens.set(t, (lens.get(t) ?? 0) + Math.hypot(m.vertexXY[2 * v] - m.vertexXY[2 * u], m.vertexXY[2 * v + 1] - m.vertexXY[2 * u + 1]));
        }
        e = m.next[e];
      } while (e !== e0);
      if (order.length > 1 && order[0] === order[order.length - 1]) order.pop();
    }
    const got = Array.from(nb.sites);
    if (!sameCycle(got.flatMap((t) => [t, 0]), order.flatMap((t) => [t, 0]))) {
      out.push(`cellNeighbors(${s}).sites = ${got}, the face cycle gives ${order} (counter-clockwise)`);
      continue;
    }
    for (let i = 0; i < got.length; i++) {
      const want = lens.get(got[i])!;
      if (Math.abs(nb.lengths[i] - want) > 1e-9 * size) out.push(`cellNeighbors(${s}) length to ${got[i]} is ${nb.lengths[i]}, the mesh gives ${want}`);
    }
  }

  // -- probes: the cell holding a probe belongs to the exactly nearest site
  const probes: [number, number][] = [];
  const w = rb.maxX - rb.minX, hgt = rb.maxY - rb.minY;
  for (const [u, v] of extra.probes) probes.push([rb.minX - 0.05 * w + 1.1 * w * u, rb.minY - 0.05 * hgt + 1.1 * hgt * v]);
  // Points of exact ties: midpoints of site pairs, Voronoi vertices, the sites themselves.
  for (const [i, j] of extra.pairs) {
    const a = i % n, b = j % n;
    probes.push([xy[2 * a] + (xy[2 * b] - xy[2 * a]) / 2, xy[2 * a + 1] + (xy[2 * b + 1] - xy[2 * a + 1]) / 2]);
  }
  for (let v = 0; v < Math.min(m.vertexXY.length >> 1, 40); v++) probes.push([m.vertexXY[2 * v], m.vertexXY[2 * v + 1]]);
  for (let s = 0; s < Math.min(n, 20); s++) probes.push([xy[2 * s], xy[2 * s + 1]]);

  const expectedNearest: number[] = [];
  for (const [px, py] of probes) {
    const want = nearestSiteExact(xy, px, py);
    expectedNearest.push(want);
    const got = d.nearest(px, py);
    if (got !== want) out.push(`nearest(${px}, ${py}) = ${got}, exact brute force gives ${want}`);
    const depth = convexDepth(region, px, py);
    if (depth < -tol) {
      const c = d.cellAt(px, py);
      if (c !== -1) out.push(`cellAt(${px}, ${py}) = ${c} for a point outside the region`);
      continue;
    }
    if (depth <= tol) continue;
    const c = d.cellAt(px, py);
    if (c !== want) out.push(`cellAt(${px}, ${py}) = ${c}, exact brute force gives ${want}`);
    let holder = -1;
    let nearEdge = false;
    for (let s = 0; s < n && !nearEdge; s++) {
      if (polys[s].length === 0) continue;
      const cd = convexDepth(polys[s], px, py, tol);
      if (Math.abs(cd) <= tol) nearEdge = true;
      else if (cd > tol) {
        if (holder !== -1) out.push(`probe (${px}, ${py}) lies inside the cells of both ${holder} and ${s}`);
        holder = s;
      }
    }
    if (nearEdge) continue;
    if (holder === -1) out.push(`probe (${px}, ${py}) inside the region lies in no cell`);
    else if (holder !== want) out.push(`probe (${px}, ${py}) lies in the cell of ${holder}, but the nearest site is ${want}`);
  }
  const many = d.nearestMany(probes.flat());
  if (JSON.stringify(Array.from(many)) !== JSON.stringify(expectedNearest)) out.push(`nearestMany differs from exact brute force: ${Array.from(many)} vs ${expectedNearest}`);

  // -- k nearest by (exact distance, index)
  for (const [pi, kk] of extra.knn) {
    const [px, py] = probes[pi % probes.length];
    const k = 1 + (kk % n);
    const want = sitesByDistanceExact(xy, px, py).slice(0, k);
    const got = Array.from(d.kNearest(px, py, k));
    if (JSON.stringify(got) !== JSON.stringify(want)) out.push(`kNearest(${px}, ${py}, ${k}) = ${got}, exact brute force gives ${want}`);
  }
  return out.length > mark ? out : [];
}

function expectNoProblems(problems: string[]): void {
  if (problems.length > 0) throw new Error(`${problems.length - 1} problem(s):\n  ${problems.slice(0, 25).join('\n  ')}`);
}

const generators: NamedGenerator[] = allGenerators(150);

describe.each(generators.map((g) => [g.name, g] as const))('voronoi on %s input', (_name, g) => {
  it('is a valid clipped diagram: tiles the region, cells hold their sites, adjacency = clipped Delaunay duals, exact queries', () => {
    fc.assert(
      fc.property(g.arb, regionArb, extraArb, (input, spec, extra) => {
        expectNoProblems(diagramProblems(input, spec, extra));
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

/** Vertices on the outer face's cycle: the region boundary. */
function boundaryVertices(d: Diagram): Set<number> {
  const m = d.mesh;
  const on = new Set<number>();
  const e0 = m.faceEdge[m.outerFace];
  let e = e0;
  do { on.add(m.origin[e]); e = m.next[e]; } while (e !== e0);
  return on;
}

function degrees(d: Diagram): Int32Array {
  const deg = new Int32Array(d.mesh.vertexXY.length >> 1);
  for (let e = 0; e < d.mesh.origin.length; e++) deg[d.mesh.origin[e]]++;
  return deg;
}

describe('Voronoi vertices of cocircular sites are merged (degree > 3)', () => {
  it('a full k x m lattice has (k-1)(m-1) interior vertices, all of degree 4', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 12 }),
        fc.tuple(fc.integer({ min: -1000, max: 1000 }), fc.integer({ min: -1000, max: 1000 })),
        fc.constantFrom(1, 3, 7), fc.integer({ min: -3, max: 6 }), fc.boolean(),
        fc.array(fc.nat({ max: 1 << 20 }), { maxLength: 32 }),
        (k, mm, origin, step, shift, far, keys) => {
          const s = step * 2 ** -shift;
          const off = far ? 1e7 : 0;
          const pts: [number, number][] = [];
          for (let i = 0; i < k; i++) for (let j = 0; j < mm; j++) pts.push([off + (origin[0] + i) * s, off + (origin[1] + j) * s]);
          const d = voronoi(permuteBy(pts, keys));
          const check = checkMesh(d.mesh);
          expect(check.problems).toEqual([]);
          const on = boundaryVertices(d);
          const deg = degrees(d);
          const interior: number[] = [];
          for (let v = 0; v < deg.length; v++) if (!on.has(v)) interior.push(deg[v]);
          expect(interior.length, `${k} x ${mm} lattice`).toBe((k - 1) * (mm - 1));
          expect(interior.every((x) => x === 4), `interior degrees ${interior}`).toBe(true);
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });

  it.each(RING_RADII.map((r) => [r] as const))('all lattice points on x^2 + y^2 = %i^2 meet at one vertex of full degree', (r) => {
    const pts = latticeCircle(r);
    const d = voronoi(pts);
    expect(checkMesh(d.mesh).problems).toEqual([]);
    const on = boundaryVertices(d);
    const deg = degrees(d);
    const interior: number[] = [];
    for (let v = 0; v < deg.length; v++) if (!on.has(v)) interior.push(v);
    expect(interior.length).toBe(1);
    const v = interior[0];
    // The centre is a computed circumcentre: at (0, 0) up to rounding.
    expect(Math.abs(d.mesh.vertexXY[2 * v])).toBeLessThanOrEqual(1e-9 * 2 * r);
    expect(Math.abs(d.mesh.vertexXY[2 * v + 1])).toBeLessThanOrEqual(1e-9 * 2 * r);
    expect(deg[v]).toBe(pts.length);
  });
});
