import type { HalfEdgeMesh } from '../../mesh/mesh.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { ConvexRegion } from '../clip.js';
import { linkMesh } from '../minkowski/link.js';
import { MeshParts } from '../minkowski/parts.js';
import { clipPolyline } from '../minkowski/edges.js';
import { addRing, OUTER } from '../minkowski/ring.js';
import { GUARDS, placeGuards } from '../minkowski/sentinels.js';
import { TriangleStore } from '../../triangulate/store.js';
import { hilbertSort } from '../../core/hilbert.js';
import { brioOrder } from '../../triangulate/order.js';
import type { ExactMetric } from './bisector.js';
import { PairBisector } from './pair.js';
import { spacingLimit } from '../spacing.js';
import { SquareCircle } from './square.js';
import { MetricFlipTest } from './flip-test.js';
import { TriangleCentres } from './centres.js';
import { Undecided } from './undecided.js';
import { localTriangles, type LocalTriangles } from './local-triangles.js';

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

/**
 * The L1 or L-infinity diagram as the dual of the metric's Delaunay
 * triangulation, for input in general position; null when some decision
 * falls within the rounding margin (or the input is not in general
 * position: grids, diagonal or axis-aligned pairs, co-circular sites), and
 * the caller then builds the cells one by one with exact arithmetic
 * (build.ts). Both give the same cells; this route computes each Voronoi
 * edge once instead of twice per cell clip.
 *
 * Method:
 * 1. Guard sites around everything (sentinels.ts; the argument that their
 *    cells stay outside the region holds for L1 and L-infinity, both within
 *    a factor sqrt 2 of the Euclidean norm): every real cell is bounded.
 * 2. The metric Delaunay triangulation by incremental insertion (sites in
 *    BRIO rounds into the guards' triangulation) with Lawson flips around
 *    each new site: TriangleStore with its edge test replaced (flip-test.ts).
 *    The edge a→b with the new site p on its left and d across goes when d
 *    lies inside the circle through a, b, p: a square read off the three
 *    sites' bounding box (square.ts), or near ties the root of a monotone
 *    piecewise-linear function along the bisector (pair.ts); a flip only
 *    ever adds an edge at p, so the flips end. (Lawson flips from the
 *    Euclidean triangulation cycle: in L1 a site can lie inside every
 *    circle through two others, and in a narrow strip of sites every
 *    diagonal is illegal in turn.)
 * 3. Certificate: every edge between two triangles clearly legal, the
 *    Voronoi edge dual to a→b running forwards along the bisector from the
 *    centre across to the centre of a→b's own triangle. Metric circles
 *    through two points are nested on each side of them, so, as in the
 *    Euclidean case, a triangulation whose edges are all locally Delaunay is
 *    the Delaunay triangulation (the walking argument carries over; derived,
 *    and what the Minkowski engine relies on too).
 * 4. Each Voronoi edge is its bisector between the two centres: at most two
 *    bends (exact places), clipped to the region in floating point, where
 *    every point must be clearly inside or outside (else Undecided), then
 *    linked into one mesh as in the Minkowski engine.
 *
 * Margins: decisions about sites (pair.ts allowance) must clear 2^-45 m,
 * m the largest frame coordinate among the sites involved, a derived bound
 * on their rounding with room to spare; points against the region's sides,
 * crossings and corners must clear 2^-38 M, M the largest coordinate of
 * everything (they are few: only the boundary's neighbourhood).
 */
export function metricDual(tri: Triangulation, regionXY: Float64Array, metric: ExactMetric): DualResult | null {
  try {
    return build(tri, regionXY, metric);
  } catch (e) {
    // Undecided, or anything the float route cannot link (a cell in pieces, a guard reaching the region):
    // the exact path then gives its own answer or error.
    if (e instanceof Error) return null;
    throw e;
  }
}

/**
 * The mesh, and whether the sites are surely far enough apart for the
 * spacing check (spacing.ts): the closest pair in the metric is an edge of
 * its Delaunay triangulation, and the Euclidean distance is at least 1/sqrt 2
 * of the L1 one and at least the L-infinity one, so a closest metric pair
 * clear of the limit by that factor settles it without the Euclidean
 * triangulation.
 */
interface DualResult { mesh: HalfEdgeMesh; faceOfSite: Int32Array; spaced: boolean }

function build(tri: Triangulation, regionXY: Float64Array, metric: ExactMetric): DualResult {
  const n = tri.siteCount;
  if (n < 2) throw new Undecided();
  // Everything is computed relative to an origin (see localOrigin) and moved back at the end.
  const [ox, oy] = localOrigin(tri.siteXY, n, regionXY);
  const local = regionXY.slice();
  for (let i = 0; i < local.length; i += 2) { local[i] -= ox; local[i + 1] -= oy; }
  const region = new ConvexRegion(local);
  const parts = new MeshParts(region);
  // The sites by rank along a space-filling curve (the Euclidean triangulation's order where it has one),
  // so that the triangles and pairs met one after another read nearby memory, then the guards (placed about
  // the local region: they are the route's own sites). siteOf: rank -> site, -1 for a guard.
  const order = tri.curveOrder() ?? hilbertSort(tri.siteXY.subarray(0, 2 * n)).ids;
  const N = n + GUARDS, xy = new Float64Array(2 * N), siteXY = tri.siteXY;
  for (let r = 0; r < n; r++) { const s = order[r]; xy[2 * r] = siteXY[2 * s] - ox; xy[2 * r + 1] = siteXY[2 * s + 1] - oy; }
  placeGuards(xy, n, region);
  const siteOf = new Int32Array(N).fill(-1);
  for (let r = 0; r < n; r++) siteOf[r] = order[r];
  const rotated = metric === 'Linf';
  // M: the largest frame coordinate (P, Q) = (x, y) for L1, (x + y, x - y) for L-infinity.
  let M = 0;
  for (let r = 0; r < N; r++) {
    const x = xy[2 * r], y = xy[2 * r + 1];
    M = rotated ? Math.max(M, Math.abs(x + y), Math.abs(x - y)) : Math.max(M, Math.abs(x), Math.abs(y));
  }
  for (let i = 0; i < local.length; i++) M = Math.max(M, 2 * Math.abs(local[i]));
  const eps = 2 ** -44 * M;
  const margin = 16 * eps;
  const pair = new PairBisector(xy, rotated);

  // The metric Delaunay triangulation (step 2).
  const store = new TriangleStore(xy, 2 * N + 8);
  const square = new SquareCircle(xy, !rotated);
  store.flipTest = new MetricFlipTest(xy, square, pair);
  store.init(n, n + 1, n + 2);
  for (let g = 3; g < GUARDS; g++) store.insert(n + g);
  // Insertion in BRIO rounds (order.ts), each along the curve: short walks, and fewer flips than the curve
  // order alone, whose newest site always faces the guards' long triangles.
  const sequence = brioOrder(n);
  for (let i = 0; i < n; i++) if (store.insert(sequence[i]) >= 0) throw new Undecided();
  const tris = localTriangles(store, N), count = tris.count;

  const sides = new SideTest(region, eps);
  // About 6 points (centres and bends) and 14 half-edges a site on well-spread input: room for them from the start.
  parts.room(6.3 * n + 64, 14.5 * n + 256);
  const centres = new TriangleCentres(count, tris.vert, pair, square, rotated, sides, parts.points);
  // Per triangle half-edge x (a = vert[x]): the mesh half-edge arriving at x's triangle's centre along the
  // Voronoi edge dual to x, with a on its left; -1 when that edge does not reach the centre.
  const arrive = new Int32Array(3 * count).fill(-1);
  const closest = drawEdges(tris, centres, pair, parts, sides, siteOf, rotated, margin, arrive);
  checkCrossings(parts, eps);
  checkCorners(region, xy, siteOf, rotated, margin);
  addRing(parts, OUTER, () => { throw new Undecided(); });
  const outside = (rank: number): boolean => !parts.inside(xy[2 * rank], xy[2 * rank + 1]);
  const out = linkMesh(parts, n, siteOf, outside, successors(arrive, centres.pointOf, count, parts.origin.count));
  if (ox !== 0 || oy !== 0) {
    const v = out.mesh.vertexXY;
    for (let i = 0; i < v.length; i += 2) { v[i] += ox; v[i + 1] += oy; }
  }
  // Euclidean >= L1 / sqrt 2 = closest / sqrt 2 (L1), or >= L-infinity = closest / 2 (in the rotated frame);
  // the factor 1.01 covers the rounding of the rotated frame and of the sums (under 2^-50 M against a limit of 2^-40 M).
  const { limit } = spacingLimit(tri.siteXY, n, regionXY);
  const spaced = closest / (rotated ? 2 : Math.SQRT2) > 1.01 * limit;
  return { mesh: out.mesh, faceOfSite: out.faceOfSite, spaced };
}

/**
 * One pass over the edges of the metric triangulation (steps 3 and 4): for
 * the edge a→b, with c the third corner of its triangle t and d across
 * (triangle u), where along the bisector (as s, pair.ts) the circles through
 * a, b, c and a, b, d are centred; the certificate (the edge clearly legal);
 * and the edge drawn between the centres, bends included, clipped to the
 * region. Fills `arrive`; returns the smallest |dP| + |dQ| of two real sites
 * joined by an edge (the L1 distance, or twice the L-infinity one).
 */
function drawEdges(
  tris: LocalTriangles, centres: TriangleCentres, pair: PairBisector, parts: MeshParts, sides: SideTest,
  siteOf: Int32Array, rotated: boolean, margin: number, arrive: Int32Array,
): number {
  const { count, vert, twin } = tris, region = parts.region, origin = parts.origin;
  const cxy = centres.xy, pointOf = centres.pointOf;
  const line = new Float64Array(8);
  const cP = rotated ? region.cx + region.cy : region.cx, cQ = rotated ? region.cx - region.cy : region.cy;
  const reach = (rotated ? Math.SQRT2 : 1) * region.radius * 1.01 + margin;
  let closest = Infinity;
  for (let x = 0; x < 3 * count; x++) {
    const t = (x / 3) | 0;
    const y = twin[x], u = y < 0 ? -1 : (y / 3) | 0, uLive = y >= 0;
    if (uLive && y < x) continue;
    const a = vert[x], b = vert[nextOf(x)], c = vert[prevOf(x)];
    if (!pair.set(a, b)) throw new Undecided();
    // u's centre first: the mesh numbers points as they are placed.
    const d = uLive ? vert[prevOf(y)] : -1;
    const su = uLive ? centres.along(u, d, -1) : -Infinity;
    const st = centres.along(t, c, 1);
    if (uLive && !(st - su > Math.max(pair.allowance(c, 4), pair.allowance(d, 4)))) throw new Undecided();
    // Guard cells stay outside the region (see withGuards): their edges are not drawn.
    if (siteOf[a] < 0 || siteOf[b] < 0) continue;
    if (pair.gap < closest) closest = pair.gap;
    let s0 = su, s1 = st;
    // Every region point has its K within `reach` of the region centre's: cut open or far ends there.
    const sC = pair.tau * (pair.kIsQ ? cQ : cP), lo = sC - reach, hi = sC + reach;
    const cut0 = s0 < lo, cut1 = s1 > hi;
    if (cut0) s0 = lo;
    if (cut1) s1 = hi;
    if (!(s0 < s1)) continue;
    if (cut0) { pair.point(s0); line[0] = pair.x; line[1] = pair.y; } else { line[0] = cxy[2 * u]; line[1] = cxy[2 * u + 1]; }
    let m = 1;
    const b0 = pair.tau * pair.Klo, b1 = pair.tau * pair.Khi, near = pair.allowance(a, 4);
    for (let i = 0; i < 2; i++) {
      const sb = (i === 0) === (b0 < b1) ? b0 : b1;
      if (Math.abs(sb - s0) <= near || Math.abs(sb - s1) <= near) {
        // A bend at a vertex, or at the cut of an open end (harmless there, far outside).
        if ((sb === s0 && cut0) || (sb === s1 && cut1)) continue;
        throw new Undecided();
      }
      if (sb > s0 && sb < s1) { pair.point(sb); line[2 * m] = pair.x; line[2 * m + 1] = pair.y; m++; }
    }
    if (cut1) { pair.point(s1); line[2 * m] = pair.x; line[2 * m + 1] = pair.y; } else { line[2 * m] = cxy[2 * t]; line[2 * m + 1] = cxy[2 * t + 1]; }
    m++;
    const k0 = origin.count >> 1;
    const start = cut0 ? -1 : pointOf[u], end = cut1 ? -1 : pointOf[t];
    // Centres with a point are inside by `sides` (TriangleCentres), as clipPolyline requires of its ids.
    clipPolyline(parts, line, m, a, b, start, end, sides);
    // The chain runs u -> t with a on its left: its last edge arrives at t along (a on the left), its first
    // arrives at u backwards (b on the left, b = vert[y]).
    const k1 = origin.count >> 1;
    if (k1 > k0) {
      if (end >= 0 && origin.a[2 * k1 - 1] === end) arrive[x] = 2 * k1 - 2;
      if (start >= 0 && origin.a[2 * k0] === start) arrive[y] = 2 * k0 + 1;
    }
  }
  return closest;
}

/**
 * The successors known from the triangles, for linkMesh: at the centre of a
 * triangle (a, b, c), counter-clockwise, the half-edge arriving along the
 * edge of a and b with a on its left goes on along the edge of c and a, the
 * other way round: the twin of the one arriving there with c on its left.
 * Only at centres that all three edges reach (every centre inside the
 * region, as guard cells stay outside it); the rest are searched.
 */
function successors(arrive: Int32Array, pointOf: Int32Array, count: number, H: number): Int32Array {
  const next = new Int32Array(H).fill(-1);
  for (let t = 0; t < count; t++) {
    if (pointOf[t] < 0) continue;
    const e0 = arrive[3 * t], e1 = arrive[3 * t + 1], e2 = arrive[3 * t + 2];
    if (e0 < 0 || e1 < 0 || e2 < 0) continue;
    // prevOf(3t) = 3t + 2, prevOf(3t + 1) = 3t, prevOf(3t + 2) = 3t + 1.
    next[e0] = e2 ^ 1; next[e1] = e0 ^ 1; next[e2] = e1 ^ 1;
  }
  return next;
}

/**
 * Where points are against the region's sides, in length units (positive
 * inside), for the float clip: every point must be clearly inside or
 * outside by the margin, or exactly on an axis-parallel side (exact: a
 * bend's K coordinate is a site's own coordinate, so the bisectors of a
 * site on a bounding-box side bend on that side).
 */
class SideTest {
  /** Per side: the unit inward normal and offset, so that nx x + ny y + c is the distance inside. */
  private readonly L: Float64Array;
  private readonly limit: number;
  constructor(private readonly region: ConvexRegion, eps: number) {
    const m = region.count, r = region.xy;
    this.L = new Float64Array(3 * m);
    for (let j = 0; j < m; j++) {
      const k = j + 1 === m ? 0 : j + 1, len = region.sideLength(j);
      const nx = -(r[2 * k + 1] - r[2 * j + 1]) / len, ny = (r[2 * k] - r[2 * j]) / len;
      this.L[3 * j] = nx; this.L[3 * j + 1] = ny; this.L[3 * j + 2] = -(nx * r[2 * j] + ny * r[2 * j + 1]);
    }
    // The normalised lines round a little differently from region.side(): that difference (a few ulps of the
    // coordinates) is far inside the limit, and within the limit the decision is region.side()'s own.
    this.limit = 64 * eps;
  }

  /** Strictly inside, by the margin (see least). */
  inside(x: number, y: number): boolean { return this.least(x, y) > 0; }

  /** The smallest side value of (x, y); throws Undecided within the margin of a side. */
  least(x: number, y: number): number {
    const L = this.L, m = this.region.count, limit = this.limit;
    let least = Infinity;
    for (let j = 0; j < m; j++) {
      let f = L[3 * j] * x + L[3 * j + 1] * y + L[3 * j + 2];
      if (Math.abs(f) <= limit) f = this.onSide(j, x, y);
      if (f < least) least = f;
    }
    return least;
  }

  /** Near side j: exactly on it when axis-parallel and matching (0), else Undecided. */
  private onSide(j: number, x: number, y: number): number {
    const r = this.region.xy, m = this.region.count, k = j + 1 === m ? 0 : j + 1;
    const on = (r[2 * j + 1] === r[2 * k + 1] && y === r[2 * j + 1]) || (r[2 * j] === r[2 * k] && x === r[2 * j]);
    if (!on) throw new Undecided();
    return 0;
  }
}

/** Crossings of one side must be clearly apart (and clear of the side's ends), or their order is a guess. */
function checkCrossings(parts: MeshParts, eps: number): void {
  const region = parts.region;
  for (let j = 0; j < region.count; j++) {
    const list = parts.crossings[j], gap = (64 * eps) / region.sideLength(j);
    list.sort((u, v) => u.along - v.along);
    let prev = 0;
    for (const c of list) {
      if (!(c.along - prev > gap)) throw new Undecided();
      prev = c.along;
    }
    if (list.length > 0 && !(1 - prev > gap)) throw new Undecided();
  }
}

/**
 * Each region corner must be clearly nearer one site than any other: else a
 * cell boundary passes within the margin of it, and which cell the float
 * clip gives it is a guess. Brute force, a few corners times n.
 */
function checkCorners(region: ConvexRegion, xy: Float64Array, siteOf: Int32Array, rotated: boolean, margin: number): void {
  for (let j = 0; j < region.count; j++) {
    const x = region.xy[2 * j], y = region.xy[2 * j + 1];
    const cp = rotated ? x + y : x, cq = rotated ? x - y : y;
    let best = Infinity, second = Infinity;
    for (let r = 0; r < siteOf.length; r++) {
      if (siteOf[r] < 0) continue;
      const sx = xy[2 * r], sy = xy[2 * r + 1];
      const d = rotated ? Math.abs(sx + sy - cp) + Math.abs(sx - sy - cq) : Math.abs(sx - cp) + Math.abs(sy - cq);
      if (d < best) { second = best; best = d; } else if (d < second) second = d;
    }
    if (!(second - best > 4 * margin)) throw new Undecided();
  }
}

/**
 * @internal Off makes every exact-metric diagram take the cell-by-cell
 * exact path; `built` counts the meshes the dual route made, `taken` those
 * of them returned (not refused by the spacing check after it). Tests
 * compare the two routes and check that the dual one ran.
 */
export const dualRoute = { enabled: true, built: 0, taken: 0 };

/**
 * An origin for the route's arithmetic: the region's vertex mean when every
 * site and region coordinate minus it is exact (sites far from zero, relative to their
 * spread: Sterbenz's lemma makes x - c exact for c/2 <= x <= 2c), else
 * (0, 0). Exact differences are the same sites, so every decision stays
 * about the input, while the margin scales with the sites' spread instead
 * of their distance from zero: data with a large offset (projected
 * coordinates) then rarely falls back to the exact path.
 */
function localOrigin(xy: Float64Array, n: number, region: Float64Array): [number, number] {
  const m = region.length >> 1;
  let ox = 0, oy = 0;
  for (let j = 0; j < m; j++) { ox += region[2 * j] / m; oy += region[2 * j + 1] / m; }
  for (let i = 0; i < n; i++) {
    if (!exactDifference(xy[2 * i], ox) || !exactDifference(xy[2 * i + 1], oy)) return [0, 0];
  }
  // The region too: its local copy must be the same polygon, for the clip and the exact on-side rule.
  for (let j = 0; j < m; j++) {
    if (!exactDifference(region[2 * j], ox) || !exactDifference(region[2 * j + 1], oy)) return [0, 0];
  }
  return [ox, oy];
}

/** Whether a - b is exact in doubles (the rounding error of the difference, computed exactly, is zero: Knuth's two-difference). */
function exactDifference(a: number, b: number): boolean {
  const d = a - b, bv = a - d, av = d + bv;
  return a - av + (bv - b) === 0;
}
