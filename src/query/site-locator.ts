import TinyQueue from 'tinyqueue';
import { compareDistance, compareDistanceExact, squaredDistance } from '../core/distance.js';
import { comparePowerDistance, comparePowerDistanceExact } from '../core/power.js';
import { InputError } from '../core/errors.js';
import { hilbertSort } from '../core/hilbert.js';
import { checkK, checkQuery } from './query-input.js';
import { renumbered } from '../diagram/metric/graph.js';
import type { Triangulation } from '../triangulate/triangulation.js';
import { boundingBox } from '../core/bounds.js';

/**
 * Nearest-site queries by walking the Delaunay graph.
 *
 * Known property (from memory; it is what greedy routing on Delaunay
 * triangulations rests on, e.g. Bose and Morin, "Online routing in
 * triangulations", 1999): a site that is not a nearest site of q has a
 * Delaunay neighbour strictly closer to q. So strict descent from any site
 * ends at a nearest site; tests/property/nearest.property.test.ts checks
 * this against brute force.
 *
 * Ties: the sites tied nearest to q lie on a circle around q with no site
 * inside, and two sites consecutive along such an empty circle are joined
 * by an edge of every Delaunay triangulation (an empty circle through just
 * those two exists: bend the circle slightly outwards over their arc). So
 * the tied sites are connected among themselves and a search through exact
 * ties from any one of them finds the smallest index.
 *
 * With weights, "nearest" means the least power distance |q - s|^2 - w
 * and the graph is the regular triangulation. The same descent works: a
 * site's power cell is cut out by its neighbours' half-planes alone, so a
 * point outside it has a neighbour strictly nearer. Tied sites have lifted
 * points on one face of the lower hull, joined by that face's edges.
 * Hidden sites (no cell) are never answered; among exact ties the smallest
 * site index with a cell wins.
 *
 * The locator is a snapshot: sites inserted into the triangulation later
 * are not seen; build a new locator then.
 */
export class SiteLocator {
  readonly siteCount: number;
  /**
   * Internally sites are renumbered along a Hilbert curve, so that a walk
   * touches nearby memory (with sites in input order every step of a walk on
   * a large random set is a cache miss). `site[i]` is the site number of
   * internal index i; everything below is in internal indices, and answers
   * are mapped back through `site`.
   */
  private readonly site: Int32Array;
  private readonly xy: Float64Array;
  /** Weights by internal index, or null. */
  private readonly w: Float64Array | null;
  /** CSR adjacency of the Delaunay graph: neighbours of i are adj[off[i]..off[i+1]). */
  private readonly off: Int32Array;
  private readonly adj: Int32Array;
  /** The previous answer (internal index): the start of the next walk (coherent queries walk little). */
  private last = 0;

  // Coarse grid of start sites, built on the first query.
  private grid: Int32Array | null = null;
  private gridNX = 1;
  private gridNY = 1;
  private gridMinX = 0;
  private gridMinY = 0;
  private gridInvCell = 0;

  // Scratch for tie searches and k-nearest searches, allocated on first need.
  private mark: Uint32Array | null = null;
  private stamp = 0;
  private stack: Int32Array | null = null;
  private dist: Float64Array | null = null;

  constructor(tri: Triangulation) {
    const n = tri.siteCount;
    this.siteCount = n;
    const ranked = rankedGraph(tri);
    let site: Int32Array, xy: Float64Array, w: Float64Array | null, off: Int32Array, adj: Int32Array;
    if (ranked !== null) ({ site, xy, w, off, adj } = ranked);
    else {
      site = Int32Array.from(hilbertSort(tri.siteXY.subarray(0, 2 * n)).ids);
      ({ xy, off, adj } = renumbered(tri, site));
      const weights = tri.weights;
      w = weights ? Float64Array.from(site, (s) => weights[s]) : null;
    }
    this.w = w;
    this.site = site;
    this.xy = xy;
    this.off = off;
    this.adj = adj;
    // Hidden sites have no edges: never start a walk there.
    if (n > 1) while (off[this.last + 1] === off[this.last]) this.last++;
  }

  /** The nearest site to (x, y); among exactly tied sites the smallest index. */
  nearest(x: number, y: number): number {
    checkQuery(x, -1, 'x');
    checkQuery(y, -1, 'y');
    const s = this.walk(this.startFor(x, y), x, y);
    this.last = s;
    return this.site[s];
  }

  /**
   * The nearest site of every query point (interleaved x, y), in input
   * order. Queries are answered along a Hilbert curve so that each walk
   * starts next to its answer.
   */
  nearestMany(xy: Float64Array | ArrayLike<number>): Int32Array {
    const len = xy.length;
    if (len % 2 !== 0) {
      throw new InputError('odd-length', `query array has odd length ${len}; expected x, y pairs`, Math.floor(len / 2), 'points');
    }
    const m = len >> 1;
    const q = new Float64Array(len);
    for (let i = 0; i < m; i++) {
      q[2 * i] = checkQuery(xy[2 * i], i, 'x');
      q[2 * i + 1] = checkQuery(xy[2 * i + 1], i, 'y');
    }
    const out = new Int32Array(m);
    if (m === 0) return out;
    const { ids } = hilbertSort(q);
    for (let j = 0; j < m; j++) {
      const i = ids[j];
      const x = q[2 * i], y = q[2 * i + 1];
      const s = this.walk(this.startFor(x, y), x, y);
      this.last = s;
      out[i] = this.site[s];
    }
    return out;
  }

  /**
   * The k nearest sites, ordered by (exact distance, site index).
   *
   * Best-first search over the Delaunay graph from the nearest site. Known
   * property (from memory, not checked against a source; tested against brute
   * force): the sites inside any closed disk induce a connected subgraph of
   * the Delaunay graph. With the disk of radius |q - s| around q (it holds
   * the start): while s is not popped, some unpopped site on a path from the
   * start to s inside that disk sits in the queue, no farther than s. The
   * queue orders by rounded distances, so the search keeps popping until the
   * queue's smallest rounded distance exceeds T, the largest rounded distance
   * of the first k pops (at least the exact k-th distance, up to rounding),
   * by a relative margin far above the rounding error. Then no site within
   * the exact k-th distance (ties included) can still be unpopped, and an
   * exact sort of the popped sites by (distance, index) gives the answer.
   */
  kNearest(x: number, y: number, k: number): Int32Array {
    checkQuery(x, -1, 'x');
    checkQuery(y, -1, 'y');
    const n = this.siteCount;
    checkK(k, n);
    const first = this.walk(this.startFor(x, y), x, y);
    this.last = first;
    const site = this.site;
    if (k === 1) return Int32Array.of(site[first]);
    if (this.w) return this.kNearestByPower(x, y, k);

    const xy = this.xy, off = this.off, adj = this.adj;
    const mark = this.marks();
    const dist = this.dist ?? (this.dist = new Float64Array(n));
    const tag = this.nextStamp();
    const queue = new TinyQueue<number>([], (a, b) => dist[a] - dist[b]);
    dist[first] = squaredDistance(x, y, xy[2 * first], xy[2 * first + 1]);
    mark[first] = tag;
    queue.push(first);

    const popped: number[] = [];
    // kth: the largest rounded distance among the first k pops. Those are k
    // distinct sites, so it is at least the exact k-th distance (up to
    // rounding). By exact distance the pops would come out in order (the disk
    // property again), but rounded distances may swap near-equal ones, so the
    // k-th pop alone is not a safe bound.
    let kth = -Infinity;
    while (queue.length > 0) {
      const top = queue.peek()!;
      // Rounded squared distances are within 4u relative (plus underflow
      // slack) of the exact ones; 2^-40 relative and 2^-1000 absolute are
      // far above that (see src/core/distance.ts for the error analysis).
      if (popped.length >= k && dist[top] > kth * (1 + 2 ** -40) + 2 ** -1000) break;
      queue.pop();
      popped.push(top);
      if (popped.length <= k && dist[top] > kth) kth = dist[top];
      for (let j = off[top], end = off[top + 1]; j < end; j++) {
        const nb = adj[j];
        if (mark[nb] === tag) continue;
        mark[nb] = tag;
        dist[nb] = squaredDistance(x, y, xy[2 * nb], xy[2 * nb + 1]);
        queue.push(nb);
      }
    }
    popped.sort((a, b) =>
      compareDistance(x, y, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]) || site[a] - site[b]);
    const out = new Int32Array(k);
    for (let i = 0; i < k; i++) out[i] = site[popped[i]];
    return out;
  }

  /**
   * The k least power distances, by brute force: hidden sites count here
   * (they are near, they just own no area), and the sites with power
   * distance below a bound need not be connected in the regular
   * triangulation, so no graph search is safe. O(n) per query.
   */
  private kNearestByPower(x: number, y: number, k: number): Int32Array {
    const xy = this.xy, w = this.w!, site = this.site, n = this.siteCount;
    const order = Array.from({ length: n }, (_, i) => i);
    const key = new Float64Array(n);
    for (let i = 0; i < n; i++) key[i] = squaredDistance(x, y, xy[2 * i], xy[2 * i + 1]) - w[i];
    const exact = (a: number, b: number): number =>
      Math.sign(comparePowerDistance(x, y, xy[2 * a], xy[2 * a + 1], w[a], xy[2 * b], xy[2 * b + 1], w[b])) || site[a] - site[b];
    order.sort((a, b) => exact(a, b));
    return Int32Array.from(order.slice(0, k), (i) => site[i]);
  }

  /**
   * Strict descent from `start`, then the smallest index among the exactly
   * tied nearest sites. Allocation-free except for the rare exact fallback.
   */
  private walk(start: number, x: number, y: number): number {
    if (this.w) return this.walkByPower(start, x, y);
    const xy = this.xy, off = this.off, adj = this.adj;
    let cur = start;
    let cd = squaredDistance(x, y, xy[2 * cur], xy[2 * cur + 1]);
    for (;;) {
      let best = cur, bd = cd, bx = xy[2 * cur], by = xy[2 * cur + 1];
      let tie = false;
      for (let j = off[cur], end = off[cur + 1]; j < end; j++) {
        const nb = adj[j];
        const nx = xy[2 * nb], ny = xy[2 * nb + 1];
        const dx = x - nx, dy = y - ny;
        const d = dx * dx + dy * dy;
        // The filter of compareKnownDistances, inlined (same rounding, same bound).
        const diff = d - bd;
        const bound = 5 * 2 ** -53 * (d + bd) + 2 ** -1000;
        let sign: number;
        if (diff > bound) continue;
        if (-diff > bound) sign = -1;
        else sign = compareDistanceExact(x, y, nx, ny, bx, by);
        if (sign < 0) {
          best = nb; bd = d; bx = nx; by = ny;
        } else if (sign === 0) {
          tie = true;
        }
      }
      if (best === cur) return tie ? this.smallestTied(cur, x, y) : cur;
      cur = best;
      cd = bd;
    }
  }

  /** walk() for weighted sites: the same descent by exact power distance. */
  private walkByPower(start: number, x: number, y: number): number {
    const xy = this.xy, w = this.w!, off = this.off, adj = this.adj;
    let cur = start;
    for (;;) {
      let best = cur, tie = false;
      for (let j = off[cur], end = off[cur + 1]; j < end; j++) {
        const nb = adj[j];
        const sign = comparePowerDistance(x, y, xy[2 * nb], xy[2 * nb + 1], w[nb], xy[2 * best], xy[2 * best + 1], w[best]);
        if (sign < 0) best = nb;
        else if (sign === 0) tie = true;
      }
      if (best === cur) return tie ? this.smallestTied(cur, x, y) : cur;
      cur = best;
    }
  }

  /**
   * Among the sites exactly as far from (x, y) as internal index `from` (a
   * nearest site), the internal index of the one with the smallest site number.
   */
  private smallestTied(from: number, x: number, y: number): number {
    const xy = this.xy, off = this.off, adj = this.adj, site = this.site;
    const mark = this.marks();
    const stack = this.stack ?? (this.stack = new Int32Array(this.siteCount));
    const tag = this.nextStamp();
    const sx = xy[2 * from], sy = xy[2 * from + 1];
    let top = 0, smallest = from;
    mark[from] = tag;
    stack[top++] = from;
    while (top > 0) {
      const s = stack[--top];
      for (let j = off[s], end = off[s + 1]; j < end; j++) {
        const nb = adj[j];
        if (mark[nb] === tag) continue;
        const w = this.w;
        if ((w ? comparePowerDistance(x, y, xy[2 * nb], xy[2 * nb + 1], w[nb], sx, sy, w[from])
          : compareDistance(x, y, xy[2 * nb], xy[2 * nb + 1], sx, sy)) !== 0) continue;
        mark[nb] = tag;
        stack[top++] = nb;
        if (site[nb] < site[smallest]) smallest = nb;
      }
    }
    return smallest;
  }

  /** A start site for a query: the previous answer or the grid's site for (x, y), whichever is closer. */
  private startFor(x: number, y: number): number {
    const g = this.gridSite(x, y);
    const last = this.last, xy = this.xy;
    // A rounded comparison is enough: any start is correct, this only picks the shorter walk.
    return squaredDistance(x, y, xy[2 * g], xy[2 * g + 1]) < squaredDistance(x, y, xy[2 * last], xy[2 * last + 1])
      ? g : last;
  }

  private gridSite(x: number, y: number): number {
    const grid = this.grid ?? this.buildGrid();
    const inv = this.gridInvCell;
    let cx = Math.floor((x - this.gridMinX) * inv), cy = Math.floor((y - this.gridMinY) * inv);
    // Written so that NaN (from inv = 0 times a huge difference) clamps too.
    cx = cx >= 0 ? (cx < this.gridNX ? cx : this.gridNX - 1) : 0;
    cy = cy >= 0 ? (cy < this.gridNY ? cy : this.gridNY - 1) : 0;
    return grid[cy * this.gridNX + cx];
  }

  /**
   * About n/8 square buckets over the sites' bounding box, each holding the
   * last site binned into it; empty buckets borrow from the nearest filled
   * bucket along their row, then rows from neighbouring rows. The bucket
   * count is common practice, no source: a few sites per bucket keep the
   * grid small while the walk from a bucket's site stays a few steps.
   */
  private buildGrid(): Int32Array {
    const n = this.siteCount, xy = this.xy;
    const { minX, minY, maxX, maxY } = boundingBox(xy, n);
    const target = Math.max(1, Math.floor(n / 8));
    const w = maxX - minX, h = maxY - minY;
    let cell: number;
    if (w > 0 && h > 0) cell = Math.max(Math.sqrt((w * h) / target), Math.max(w, h) / target);
    else cell = Math.max(w, h) / target; // collinear along an axis, or one site
    const inv = cell > 0 ? 1 / cell : 0;
    const nx = Math.min(target, Math.max(1, Math.ceil(w * inv)));
    const ny = Math.min(target, Math.max(1, Math.ceil(h * inv)));
    const grid = new Int32Array(nx * ny).fill(-1);
    for (let s = 0; s < n; s++) {
      if (n > 1 && this.off[s + 1] === this.off[s]) continue; // hidden: no cell, no edges
      const cx = Math.min(nx - 1, Math.floor((xy[2 * s] - minX) * inv));
      const cy = Math.min(ny - 1, Math.floor((xy[2 * s + 1] - minY) * inv));
      grid[cy * nx + cx] = s;
    }
    // Fill empty buckets along rows (forwards, then backwards), then whole empty rows from their neighbours.
    for (let r = 0; r < ny; r++) {
      const o = r * nx;
      for (let c = 1; c < nx; c++) if (grid[o + c] < 0) grid[o + c] = grid[o + c - 1];
      for (let c = nx - 2; c >= 0; c--) if (grid[o + c] < 0) grid[o + c] = grid[o + c + 1];
    }
    for (let r = 1; r < ny; r++) if (grid[r * nx] < 0) grid.copyWithin(r * nx, (r - 1) * nx, r * nx);
    for (let r = ny - 2; r >= 0; r--) if (grid[r * nx] < 0) grid.copyWithin(r * nx, (r + 1) * nx, (r + 2) * nx);
    this.gridNX = nx;
    this.gridNY = ny;
    this.gridMinX = minX;
    this.gridMinY = minY;
    this.gridInvCell = inv;
    this.grid = grid;
    return grid;
  }

  private marks(): Uint32Array {
    return this.mark ?? (this.mark = new Uint32Array(this.siteCount));
  }

  /** A fresh tag for the mark array (clears it on wrap-around, once every 2^32 searches). */
  private nextStamp(): number {
    if (this.stamp === 0xffffffff) {
      this.mark!.fill(0);
      this.stamp = 0;
    }
    return ++this.stamp;
  }
}

/**
 * The graph in the triangulation's own rank order, when it has one: its
 * ranks already follow a space-filling curve (or the sweep's order), so
 * they serve as internal indices as they are, and the adjacency comes
 * straight from its half-edges; no second sort, no site-numbered edge list.
 * Null for triangulations without a rank order (collinear sites, one read
 * from JSON).
 */
function rankedGraph(tri: Triangulation): { site: Int32Array; xy: Float64Array; w: Float64Array | null; off: Int32Array; adj: Int32Array } | null {
  const layout = tri.implicitLayout();
  if (layout === null || layout.siteOfRank === null) return null;
  const n = tri.siteCount, { vert, twin, real: T } = layout, H = 3 * T;
  const off = new Int32Array(n + 1);
  // Each edge once: from its smaller half-edge, or from its only real one on the hull.
  for (let x = 0; x < H; x++) {
    const y = twin[x];
    if (y < H && y < x) continue;
    off[vert[x] + 1]++;
    off[vert[x % 3 === 2 ? x - 2 : x + 1] + 1]++;
  }
  for (let i = 0; i < n; i++) off[i + 1] += off[i];
  const fill = off.slice(0, n), adj = new Int32Array(off[n]);
  for (let x = 0; x < H; x++) {
    const y = twin[x];
    if (y < H && y < x) continue;
    const a = vert[x], b = vert[x % 3 === 2 ? x - 2 : x + 1];
    adj[fill[a]++] = b;
    adj[fill[b]++] = a;
  }
  // Copies: the locator is a snapshot, and later insertions may rebuild the triangulation's arrays.
  const w = tri.rankWeights();
  return { site: layout.siteOfRank.slice(0, n), xy: layout.xy.slice(0, 2 * n), w: w === null ? null : w.slice(0, n), off, adj };
}
