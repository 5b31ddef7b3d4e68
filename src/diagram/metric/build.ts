import { AmbitError } from '../../core/errors.js';
import { orient } from '../../core/predicates.js';
import { HalfEdgeMesh } from '../../mesh/mesh.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { bisector, type ExactMetric } from './bisector.js';
import { clipCell, type Cell, type ClipContext } from './cell.js';
import { corner, meet, sideOf, throughLine, U, type Line, type Pt } from './geometry.js';
import { assembleCells, CellStore } from './assemble.js';
import { SiteHeap } from './heap.js';
import { dyAdd, dyMul, dySign, dySub, type Dyadic } from './dyadic.js';
import { hilbertSort } from '../../core/hilbert.js';
import { renumbered } from './graph.js';
import { dualRoute, metricDual } from './dual.js';
import { checkSpacing } from '../spacing.js';
import { BAIL, ballReach, CORNER_STRIDE, extent, FloatCell } from './fastcell.js';

/** Label of the temporary box sides used for sites outside the region (never survives). */
const BOX_LABEL = -(2 ** 30);

/**
 * The cells of an exact-metric Voronoi diagram, clipped to a convex region,
 * as a half-edge mesh of kind 'voronoi'.
 *
 * Each cell is built on its own: start from the region (a polygon star-
 * shaped about the site) and clip by one competitor at a time, nearest
 * (Euclidean) first, found by a best-first search over the Delaunay graph.
 * The k sites nearest a point are connected in the Delaunay graph (a known
 * property of order-k Voronoi diagrams, from memory), so the search visits
 * sites in order of Euclidean distance. It stops once the next one is
 * farther than max over corners q of |q - s| + c d(q,s), where c bounds the
 * Euclidean length of a vector of metric length 1 (1 for L1, sqrt 2 for
 * L-infinity): a site u can only take a cell point q when d(q,u) <= d(q,s),
 * and the balls B(q, d(q,s)) of all cell points lie in that disc (see
 * ballReach in fastcell.ts).
 */
export function metricCells(tri: Triangulation, region: Float64Array, metric: ExactMetric): { mesh: HalfEdgeMesh; faceOfSite: Int32Array } {
  const n = tri.siteCount;
  if (dualRoute.enabled) {
    const dual = metricDual(tri, region, metric);
    if (dual) {
      dualRoute.built++;
      // The route's own bound settles the spacing check on spread-out sites; else it needs the Euclidean edges.
      if (!dual.spaced) checkSpacing(tri, region);
      dualRoute.taken++;
      return dual;
    }
  }
  checkSpacing(tri, region);
  const edges = tri.edges();
  // Cells in the order of a space-filling curve, and the sites renumbered by
  // it (rank k is site order[k]), so that a cell's neighbourhood lies in
  // nearby memory; cells are stored and assembled by rank (labels too), and
  // only the mesh's faces are numbered by site.
  const order = n > 1 ? hilbertSort(tri.siteXY.subarray(0, 2 * n)).ids : Uint32Array.of(0);
  const { xy, off, adj } = renumbered(tri, order, edges);
  const m = region.length >> 1;
  const regionLines: Line[] = [];
  const regionPts: Pt[] = [];
  for (let j = 0; j < m; j++) {
    const k = j + 1 === m ? 0 : j + 1;
    regionPts.push(corner(region[2 * j], region[2 * j + 1]));
    regionLines.push(throughLine(region[2 * j], region[2 * j + 1], region[2 * k], region[2 * k + 1]));
  }
  const regionLabels = regionLines.map((_, j) => -1 - j);
  const box = outerBox(xy, n, region);
  const heap = new SiteHeap(Math.min(n, 1024));
  const seen = new Int32Array(n).fill(-1);
  let stamp = 0;
  // About seven corners per cell on uniform input; room for eight saves the regrowth.
  const store = new CellStore(n, 8 * n);
  let site = 0;
  const ctx: ClipContext = {
    get site() { return site; },
    bisectorWith: (other) => bisector(metric, xy[2 * site], xy[2 * site + 1], xy[2 * other], xy[2 * other + 1]),
    metric,
    x: (s) => xy[2 * s],
    y: (s) => xy[2 * s + 1],
  };
  const fast = new FloatCell(metric);
  const slow = new ObjectCell(ctx);

  /** The best-first search for one cell; false when the float cell gave up (it is then to be built on the exact path). */
  function search(work: CellWork): boolean {
    let R = work.farthest(), limit = extent[0];
    heap.clear();
    const mark = stamp++;
    seen[site] = mark;
    for (let e = off[site]; e < off[site + 1]; e++) {
      const u = adj[e];
      seen[u] = mark;
      heap.push(u, dist2(xy, site, u));
    }
    while (heap.size > 0) {
      if (heap.topKey() > limit * limit) break;
      const u = heap.pop();
      const ux = xy[2 * u], uy = xy[2 * u + 1];
      if (!work.cannotClip(ux, uy, R)) {
        const r = work.clip(u, ux, uy);
        if (r === BAIL) return false;
        if (r > 0) { R = work.farthest(); limit = extent[0]; }
      }
      for (let e = off[u]; e < off[u + 1]; e++) {
        const w = adj[e];
        if (seen[w] === mark) continue;
        seen[w] = mark;
        heap.push(w, dist2(xy, site, w));
      }
    }
    return true;
  }

  for (let k = 0; k < n; k++) {
    site = k;
    const sx = xy[2 * site], sy = xy[2 * site + 1];
    const inside = strictlyInside(region, sx, sy);
    if (inside) {
      fast.start(sx, sy, regionPts, regionLines, regionLabels);
      if (search(fast)) {
        store.addFlat(site, fast.C, CORNER_STRIDE, fast.pc, fast.lab, fast.n);
        continue;
      }
    }
    slow.start(sx, sy, inside
      ? { pts: regionPts.slice(), lines: regionLines.slice(), labels: regionLabels.slice() }
      : boxCell(box));
    search(slow);
    const cell = slow.cell;
    const done = inside ? cell : clipToRegion(cell, regionLines, order[site]);
    store.add(site, done ? done.pts : [], done ? done.labels : []);
  }
  return assembleCells(store, n, 'voronoi', order);
}

/** What the search needs of a cell under construction. */
interface CellWork {
  /** Largest metric distance from the site to the cell (rounded up); sets extent[0], the Euclidean radius the search must cover. */
  farthest(): number;
  /** True only when site (ux, uy) certainly takes nothing of the cell. */
  cannotClip(ux: number, uy: number, R: number): boolean;
  /** Clips by site u: 1 when the cell changed, 0 when not, BAIL when the float cell gives up. */
  clip(u: number, ux: number, uy: number): number;
}

/** The exact path: Pt and Line objects, every decision exact (cell.ts). */
class ObjectCell implements CellWork {
  cell: Cell = { pts: [], lines: [], labels: [] };
  private sx = 0;
  private sy = 0;
  constructor(private readonly ctx: ClipContext) {}
  start(sx: number, sy: number, cell: Cell): void { this.sx = sx; this.sy = sy; this.cell = cell; }
  farthest(): number { return farthest(this.cell, this.sx, this.sy, this.ctx.metric); }
  cannotClip(ux: number, uy: number, R: number): boolean { return cannotClip(this.cell, this.ctx.metric, this.sx, this.sy, ux, uy, R); }
  clip(u: number, ux: number, uy: number): number {
    return clipCell(this.cell, bisector(this.ctx.metric, this.sx, this.sy, ux, uy), u, this.ctx) ? 1 : 0;
  }
}


/**
 * A floating-point test that is only ever answered true when site u
 * certainly takes no point of the cell: every corner is clearly nearer s
 * (each metric distance is within 2u relative plus twice the corner's error
 * of its float value), and the bisector cannot bulge in between corners.
 * For that it would have to cross one edge twice, which takes a bend inside
 * the cell; the bends lie at metric distance d(s,u)/2 from s (worked out
 * from the formulas in bisector.ts), so beyond R (the cell's largest
 * distance from s) or clearly outside the polygon they cannot. False means
 * "clip exactly", never "u clips".
 */
function cannotClip(cell: Cell, metric: ExactMetric, sx: number, sy: number, ux: number, uy: number, R: number): boolean {
  const L1 = metric === 'L1';
  const dsu = L1 ? Math.abs(ux - sx) + Math.abs(uy - sy) : Math.max(Math.abs(ux - sx), Math.abs(uy - sy));
  if (dsu > 2 * R) return true;
  const pts = cell.pts;
  for (let i = 0; i < pts.length; i++) {
    const p = pts[i];
    const ax = Math.abs(p.x - sx), ay = Math.abs(p.y - sy), bx = Math.abs(p.x - ux), by = Math.abs(p.y - uy);
    const ds = L1 ? ax + ay : Math.max(ax, ay), du = L1 ? bx + by : Math.max(bx, by);
    if (!(du - ds > 4 * U * (ds + du) + 4 * p.err + 2 ** -900)) return false;
  }
  if (dsu / 2 > R) return true;
  // The bends, in the frame where the metric is L1 (see bisector.ts): at K = Ks and K = Ku.
  // No arrays here: this runs for every candidate.
  const Ps = L1 ? sx : sx + sy, Qs = L1 ? sy : sx - sy, Pu = L1 ? ux : ux + uy, Qu = L1 ? uy : ux - uy;
  const dP = Pu - Ps, dQ = Qu - Qs, h = (Math.abs(dP) + Math.abs(dQ)) / 2;
  // Equal |dP|, |dQ| (nearly): a straight bisector, or a bend the float test cannot place; leave it to the exact clip.
  if (Math.abs(Math.abs(dP) - Math.abs(dQ)) <= 8 * U * (Math.abs(dP) + Math.abs(dQ))) return dP === 0 || dQ === 0 ? true : false;
  const alongP = Math.abs(dQ) > Math.abs(dP);
  const hP = alongP ? 0 : Math.sign(dP) * h, hQ = alongP ? Math.sign(dQ) * h : 0;
  return bendOutside(pts, L1, Ps + hP, Qs + hQ) && bendOutside(pts, L1, Pu - hP, Qu - hQ);
}

/** clearlyOutside for a bend given in the frame of bisector.ts. */
function bendOutside(pts: Pt[], L1: boolean, P: number, Q: number): boolean {
  return L1 ? clearlyOutside(pts, P, Q) : clearlyOutside(pts, (P + Q) / 2, (P - Q) / 2);
}

/** Float point-in-polygon that only says "outside" with room to spare (no edge within a relative 2^-30). */
function clearlyOutside(pts: Pt[], x: number, y: number): boolean {
  let wn = 0;
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i], b = pts[i + 1 === pts.length ? 0 : i + 1];
    const ex = b.x - a.x, ey = b.y - a.y;
    const cross = ex * (y - a.y) - ey * (x - a.x);
    const len = Math.abs(ex) + Math.abs(ey);
    const scale = len * (Math.abs(x - a.x) + Math.abs(y - a.y) + len);
    if (Math.abs(cross) <= 2 ** -30 * scale + 2 * len * (a.err + b.err)) return false;
    if (a.y <= y) { if (b.y > y && cross > 0) wn++; } else if (b.y <= y && cross < 0) wn--;
  }
  return wn === 0;
}

function dist2(xy: Float64Array, a: number, b: number): number {
  const dx = xy[2 * a] - xy[2 * b], dy = xy[2 * a + 1] - xy[2 * b + 1];
  return dx * dx + dy * dy;
}

/** Largest metric distance from the site to a corner of its cell, rounded up a little (corners carry an error bound); sets extent[0]. */
function farthest(cell: Cell, sx: number, sy: number, metric: ExactMetric): number {
  let r = 0, reach = 0;
  for (const p of cell.pts) {
    const e = Number.isFinite(p.err) ? 2 * p.err : 0;
    const dx = Math.abs(p.x - sx) + e, dy = Math.abs(p.y - sy) + e;
    const d = metric === 'L1' ? dx + dy : Math.max(dx, dy);
    if (d > r) r = d;
    reach = Math.max(reach, ballReach(dx, dy, d, metric === 'L1'));
  }
  extent[0] = reach;
  return r;
}

function strictlyInside(region: Float64Array, x: number, y: number): boolean {
  const m = region.length >> 1;
  for (let j = 0; j < m; j++) {
    const k = j + 1 === m ? 0 : j + 1;
    if (orient(region[2 * j], region[2 * j + 1], region[2 * k], region[2 * k + 1], x, y) <= 0) return false;
  }
  return true;
}

/** A box around the sites and the region, with room: the start of cells of sites outside the region. */
function outerBox(xy: Float64Array, n: number, region: Float64Array): Float64Array {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const take = (x: number, y: number): void => {
    minX = Math.min(minX, x); maxX = Math.max(maxX, x); minY = Math.min(minY, y); maxY = Math.max(maxY, y);
  };
  for (let i = 0; i < n; i++) take(xy[2 * i], xy[2 * i + 1]);
  for (let i = 0; i < region.length; i += 2) take(region[i], region[i + 1]);
  const pad = 0.25 * Math.max(maxX - minX, maxY - minY) + 1;
  return Float64Array.of(minX - pad, minY - pad, maxX + pad, minY - pad, maxX + pad, maxY + pad, minX - pad, maxY + pad);
}

function boxCell(box: Float64Array): Cell {
  const pts: Pt[] = [], lines: Line[] = [], labels: number[] = [];
  for (let j = 0; j < 4; j++) {
    const k = (j + 1) % 4;
    pts.push(corner(box[2 * j], box[2 * j + 1]));
    lines.push(throughLine(box[2 * j], box[2 * j + 1], box[2 * k], box[2 * k + 1]));
    labels.push(BOX_LABEL);
  }
  return { pts, lines, labels };
}

/**
 * The cell of a site outside the region (or on its boundary), cut down to
 * the region one side at a time. Null when nothing of positive area is left.
 */
function clipToRegion(cell: Cell, sides: Line[], site: number): Cell | null {
  for (let j = 0; j < sides.length; j++) {
    const L = sides[j], { pts, lines, labels } = cell, n = pts.length;
    const sv = pts.map((p) => sideOf(p, L));
    if (sv.every((v) => v <= 0)) return null;
    const nPts: Pt[] = [], nLines: Line[] = [], nLabels: number[] = [];
    for (let i = 0; i < n; i++) {
      const k = i + 1 === n ? 0 : i + 1;
      const a = sv[i], b = sv[k];
      if (a > 0 || (a === 0 && b > 0)) { nPts.push(pts[i]); nLines.push(lines[i]); nLabels.push(labels[i]); }
      else if (a === 0) { nPts.push(pts[i]); nLines.push(L); nLabels.push(-1 - j); }
      if (a > 0 && b < 0) { nPts.push(meet(lines[i], L)); nLines.push(L); nLabels.push(-1 - j); }
      if (a < 0 && b > 0) { nPts.push(meet(lines[i], L)); nLines.push(lines[i]); nLabels.push(labels[i]); }
    }
    if (nPts.length < 3 || !positiveArea(nPts)) return null;
    // Two cuts along the same side that overlap would be a zero-width bridge between separate pieces.
    const along = (p: Pt): number => p.y * L.a - p.x * L.b;
    const spans = cutRuns(nLabels, -1 - j).map(([a, b]) => [along(nPts[a]), along(nPts[b])].sort((u, v) => u - v));
    for (let a = 0; a < spans.length; a++) {
      for (let b = a + 1; b < spans.length; b++) {
        if (spans[a][0] < spans[b][1] && spans[b][0] < spans[a][1]) {
          throw new AmbitError('unsupported-geometry', `the cell of site ${site}, which lies outside the clip region, meets the region in separate pieces; this is not supported yet`);
        }
      }
    }
    cell = { pts: nPts, lines: nLines, labels: nLabels };
  }
  if (cell.labels.includes(BOX_LABEL)) throw new Error('metric cells: a box side survived clipping to the region');
  return cell;
}

/**
 * The runs of consecutive edges labelled `label` in a closed polygon, as
 * [first corner, corner after the last edge]. A run may wrap past the last
 * corner (the cut a side made can straddle where the corner list starts),
 * so runs are found cyclically.
 */
export function cutRuns(labels: readonly number[], label: number): [number, number][] {
  const m = labels.length, runs: [number, number][] = [];
  for (let i = 0; i < m; i++) {
    if (labels[i] !== label || labels[(i + m - 1) % m] === label) continue;
    let last = i;
    while (labels[(last + 1) % m] === label && (last + 1) % m !== i) last = (last + 1) % m;
    runs.push([i, (last + 1) % m]);
  }
  return runs;
}

/**
 * Whether a clipped cell still has area: a cell whose part in the region lies
 * along a region side (its bisector runs exactly on the side) collapses to
 * points on that side. Floating point answers clear cases; thin ones are
 * decided exactly (twice the area over a common denominator of the
 * homogeneous corners).
 */
function positiveArea(pts: Pt[]): boolean {
  let a2 = 0, ext = 0;
  const x0 = pts[0].x, y0 = pts[0].y;
  for (let i = 1; i + 1 < pts.length; i++) {
    const ux = pts[i].x - x0, uy = pts[i].y - y0, vx = pts[i + 1].x - x0, vy = pts[i + 1].y - y0;
    a2 += ux * vy - uy * vx;
    ext = Math.max(ext, Math.abs(ux) + Math.abs(uy));
  }
  if (a2 > 2 ** -30 * ext * ext) return true;
  const ex = pts.map((p) => p.exact());
  const n = ex.length;
  let total: Dyadic = { m: 0n, e: 0 };
  let W: Dyadic = { m: 1n, e: 0 };
  for (let i = 0; i < n; i++) {
    W = dyMul(W, ex[i][2]);
    const j = (i + 1) % n;
    let term = dySub(dyMul(ex[i][0], ex[j][1]), dyMul(ex[j][0], ex[i][1]));
    for (let k = 0; k < n; k++) if (k !== i && k !== j) term = dyMul(term, ex[k][2]);
    total = dyAdd(total, term);
  }
  return dySign(total) * dySign(W) > 0;
}
