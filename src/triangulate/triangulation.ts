import { orient2d } from 'robust-predicates';
import { readPoints, readWeights, type PointInput } from '../core/input.js';
import { liftedAboveChord } from '../core/power.js';
import { InputError } from '../core/errors.js';
import { mergeDuplicates, type SiteSet } from '../core/dedupe.js';
import { HalfEdgeMesh } from '../mesh/mesh.js';
import { TriangleStore, GHOST } from './store.js';
import { brioOrder, identityOrder } from './order.js';
import { checkOptionNames } from '../core/options.js';

/** How sites are ordered before insertion. */
export type InsertionOrder = 'brio' | 'hilbert' | 'input';

export interface TriangulateOptions {
  /**
   * Insertion order (default 'brio', measured faster than plain curve
   * order from 1e5 sites up; see the README). The result is a Delaunay
   * triangulation whichever is chosen; where four or more sites are
   * cocircular, which diagonal is kept depends on the order.
   */
  order?: InsertionOrder;
  /**
   * One weight per input point, for the regular (weighted Delaunay)
   * triangulation: the dual of the power diagram, distance |p - s|^2 - w.
   * Weights may also come inside the points, as [x, y, w] or {x, y, w}.
   */
  weights?: ArrayLike<number>;
}

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

/**
 * The store's numbering of the sites (rank → site) and the order in which
 * ranks are inserted. Ranks follow the Hilbert curve (but for 'input'), so
 * that sites near in the plane are near in memory: for the walks and flips
 * of the build, whatever round BRIO is in, and for every pass over the
 * triangles after it.
 */
function orderSites(curveOrder: Uint32Array, order: InsertionOrder): { siteOfRank: Uint32Array; sequence: Uint32Array } {
  const n = curveOrder.length;
  if (order === 'input') return { siteOfRank: identityOrder(n), sequence: identityOrder(n) };
  return { siteOfRank: curveOrder, sequence: order === 'brio' ? brioOrder(n) : identityOrder(n) };
}

/** Sites sorted by x, then y: the order of a collinear set along its line. */
function lexicographic(xy: Float64Array, count: number): Int32Array {
  const ids = Array.from({ length: count }, (_, i) => i);
  ids.sort((a, b) => xy[2 * a] - xy[2 * b] || xy[2 * a + 1] - xy[2 * b + 1]);
  return Int32Array.from(ids);
}

/**
 * A Delaunay triangulation of distinct sites. Build one with
 * {@link triangulate}; grow it with {@link Triangulation.insert}.
 */
export class Triangulation {
  siteCount: number;
  /** For every input point so far, the site it was merged onto. */
  siteOfInput: Int32Array;
  private dim: 0 | 1 | 2;
  /**
   * The build still to run (see deferredTriangulation): the sites are read,
   * merged and numbered, the triangles made on first use.
   */
  private pending: { curve: Uint32Array; order: InsertionOrder } | null = null;

  private store: TriangleStore | null = null;
  /** Sites along their line when dimension < 2. */
  private path: Int32Array | null = null;
  /** Real triangles, once compacted in front of the ghosts; -1 when stale. */
  private real = -1;
  private vertexEdge: Int32Array | null = null;
  /**
   * The store works on ranks, the order in which sites were inserted, with
   * its own copy of the coordinates in that order: then the triangles a step
   * reads, and later the neighbours a diagram pass reads, sit together in
   * memory instead of all over an input-ordered array. Site numbers (order of
   * first appearance) are mapped at the public boundary.
   */
  private rankXY: Float64Array;
  /** Site of each rank; null when ranks are site numbers. */
  private siteOfRank: Int32Array | null = null;
  private rankOfSiteCache: Int32Array | null = null;
  /** Coordinates by site number, made on first request when ranks differ from sites. */
  private bySite: Float64Array | null;
  private sitesCache: Int32Array | null = null;
  /** Weights by site, or null; by rank in the store. */
  private siteW: Float64Array | null;
  private rankW: Float64Array | null = null;
  /** Sites with no vertex: made redundant by heavier neighbours. */
  private hidden: Int32Array = new Int32Array(0);

  /** @internal Use {@link triangulate}. */
  constructor(sites: SiteSet, order: InsertionOrder | null, weights: Float64Array | null = null, deferred = false) {
    this.bySite = sites.xy;
    this.rankXY = sites.xy;
    this.siteW = weights;
    this.siteCount = sites.count;
    this.siteOfInput = sites.siteOfInput;
    this.dim = 0;
    // null: the caller (fromMesh) fills the triangles in itself.
    if (order === null) return;
    if (deferred) this.pending = { curve: sites.curveOrder, order };
    else this.build(orderSites(sites.curveOrder, order));
  }

  /** Runs the deferred build, if any: every method that reads the triangles calls this first. */
  private settle(): void {
    const p = this.pending;
    if (p === null) return;
    this.pending = null;
    this.build(orderSites(p.curve, p.order));
  }

  /**
   * 2 when the sites span the plane; 1 when they all lie on one line (no
   * triangles, the hull is a path); 0 for a single site.
   */
  get dimension(): 0 | 1 | 2 { this.settle(); return this.dim; }

  /**
   * @internal The sites along a space-filling curve (site numbers), as the
   * build orders them: for work on the sites that wants neighbours near in
   * memory without the triangles. Null when the build keeps input order.
   */
  curveOrder(): Uint32Array | Int32Array | null {
    if (this.pending) return this.pending.order === 'input' ? null : this.pending.curve;
    return this.store ? this.siteOfRank : null;
  }

  /**
   * @internal Rebuilds a triangulation from a validated Delaunay mesh whose
   * vertices are the sites: bounded faces become triangles in face order,
   * outer half-edges become ghosts in half-edge order, so that toMesh()
   * gives the same mesh back. Used by the JSON reader.
   */
  static fromMesh(mesh: HalfEdgeMesh, siteOfInput: Int32Array): Triangulation {
    const n = mesh.vertexCount;
    const xy = mesh.vertexXY.slice();
    const tri = new Triangulation({ xy, count: n, siteOfInput, curveOrder: new Uint32Array(0) }, null);
    const bounded = mesh.faceCount - 1;
    if (bounded === 0) {
      tri.dim = n === 1 ? 0 : 1;
      tri.path = lexicographic(xy, n);
      return tri;
    }
    const outer: number[] = [];
    for (let e = 0; e < mesh.halfEdgeCount; e++) if (mesh.face[e] === mesh.outerFace) outer.push(e);
    const store = new TriangleStore(xy, bounded + outer.length);
    const slot = new Int32Array(mesh.halfEdgeCount);
    let t = 0;
    for (let f = 0; f < mesh.faceCount; f++) {
      if (f === mesh.outerFace) continue;
      let e = mesh.faceEdge[f];
      for (let j = 0; j < 3; j++, e = mesh.next[e]) {
        slot[e] = 3 * t + j;
        store.vert[3 * t + j] = mesh.origin[e];
      }
      t++;
    }
    outer.forEach((H, j) => {
      const g = bounded + j;
      slot[H] = 3 * g;
      store.vert[3 * g] = mesh.origin[H];
      store.vert[3 * g + 1] = mesh.origin[mesh.next[H]];
      store.vert[3 * g + 2] = GHOST;
    });
    for (let e = 0; e < mesh.halfEdgeCount; e++) store.twin[slot[e]] = slot[mesh.twin[e]];
    outer.forEach((H, j) => {
      // Ghost (u, v, G) meets the ghost of the next outer half-edge (v, w, G) along v–G.
      const g = bounded + j, h = (slot[mesh.next[H]] / 3) | 0;
      store.twin[3 * g + 1] = 3 * h + 2;
      store.twin[3 * h + 2] = 3 * g + 1;
    });
    store.count = bounded + outer.length;
    store.last = 0;
    tri.store = store;
    tri.dim = 2;
    tri.real = bounded;
    return tri;
  }

  /**
   * @internal Wraps a store filled elsewhere (Fortune's sweep): real
   * triangles 0..real-1 first, then one ghost per hull edge, as fromMesh
   * lays them out. Over site numbers (store.xy is sites.xy), or over the
   * ranks given (store.xy is ranks.rankXY, siteOfRank their sites).
   */
  static fromStore(
    sites: SiteSet, store: TriangleStore, real: number, ranks?: { rankXY: Float64Array; siteOfRank: Int32Array },
  ): Triangulation {
    const tri = new Triangulation(sites, null);
    if (ranks) {
      tri.rankXY = ranks.rankXY;
      tri.siteOfRank = ranks.siteOfRank;
    }
    tri.store = store;
    tri.dim = 2;
    tri.real = real;
    return tri;
  }

  /** Distinct sites, interleaved x, y, numbered by first appearance in the input. */
  get siteXY(): Float64Array {
    if (this.bySite) return this.bySite;
    const n = this.siteCount, rx = this.rankXY, site = this.siteOfRank!;
    const xy = new Float64Array(2 * n);
    for (let r = 0; r < n; r++) {
      const s = site[r];
      xy[2 * s] = rx[2 * r];
      xy[2 * s + 1] = rx[2 * r + 1];
    }
    return (this.bySite = xy);
  }

  private rankOfSite(): Int32Array | null {
    const site = this.siteOfRank;
    if (!site || this.rankOfSiteCache) return this.rankOfSiteCache;
    const rank = new Int32Array(this.siteCount);
    for (let r = 0; r < this.siteCount; r++) rank[site[r]] = r;
    return (this.rankOfSiteCache = rank);
  }

  private siteOf(rank: number): number {
    return this.siteOfRank ? this.siteOfRank[rank] : rank;
  }

  /** The weight of each site (the largest of the points merged onto it); null when unweighted. */
  get weights(): Float64Array | null { return this.siteW; }

  /**
   * Sites that are not vertices of the regular triangulation: their lifted
   * point lies on or above the lower hull, so their power cell is empty.
   * Always empty without weights. Ascending.
   */
  get hiddenSites(): Int32Array { this.settle(); return this.hidden; }

  /**
   * @internal Weights in the store's rank order; null when unweighted or
   * when all are equal (then the build, and any diagram of it, is the
   * unweighted one).
   */
  rankWeights(): Float64Array | null {
    this.settle();
    // Without a store, ranks are site numbers (a path); with one, only a weighted build has rank weights.
    if (this.store) return this.rankW;
    return this.siteW !== null && !allEqual(this.siteW) ? this.siteW : null;
  }

  get inputCount(): number { return this.siteOfInput.length; }
  /** Input points merged onto an earlier equal point. */
  get mergedCount(): number { return this.siteOfInput.length - this.siteCount; }

  get triangleCount(): number {
    this.settle();
    if (!this.store) return 0;
    this.compact();
    return this.real;
  }

  /**
   * Three sites per triangle, counter-clockwise (y-up). Valid until the
   * next {@link insert}; do not modify it.
   */
  get triangleSites(): Int32Array {
    this.settle();
    if (!this.store) return new Int32Array(0);
    this.compact();
    const ranks = this.store.vert.subarray(0, 3 * this.real), site = this.siteOfRank;
    if (!site) return ranks;
    if (this.sitesCache) return this.sitesCache;
    const out = new Int32Array(ranks.length);
    for (let e = 0; e < out.length; e++) out[e] = site[ranks[e]];
    return (this.sitesCache = out);
  }

  private build({ siteOfRank, sequence: ord }: { siteOfRank: Uint32Array; sequence: Uint32Array }): void {
    const n = this.siteCount, xy = this.siteXY;
    this.store = null;
    this.path = null;
    this.real = -1;
    this.vertexEdge = null;
    this.rankXY = xy;
    this.rankW = null;
    this.siteOfRank = null;
    this.rankOfSiteCache = null;
    this.sitesCache = null;
    this.hidden = new Int32Array(0);
    const weighted = this.siteW !== null && !allEqual(this.siteW);
    if (n < 3) {
      this.dim = n === 1 ? 0 : 1;
      this.setPath(lexicographic(xy, n));
      return;
    }
    const local = new Float64Array(2 * n);
    // Equal weights change nothing: such builds take the unweighted path and give its result exactly.
    const lw = weighted ? new Float64Array(n) : null, xyw = weighted ? new Float64Array(3 * n) : null;
    if (lw !== null && xyw !== null) {
      // One gather for coordinates and weights: the reads by site are the scattered ones.
      const w = this.siteW!;
      for (let r = 0; r < n; r++) {
        const q = siteOfRank[r], x = xy[2 * q], y = xy[2 * q + 1], wq = w[q];
        local[2 * r] = x; local[2 * r + 1] = y;
        lw[r] = wq;
        xyw[3 * r] = x; xyw[3 * r + 1] = y; xyw[3 * r + 2] = wq;
      }
    } else {
      for (let r = 0; r < n; r++) {
        local[2 * r] = xy[2 * siteOfRank[r]];
        local[2 * r + 1] = xy[2 * siteOfRank[r] + 1];
      }
    }
    const a = ord[0], b = ord[1];
    let k = 2;
    let turn = 0;
    for (; k < n; k++) {
      turn = orient2d(local[2 * a], local[2 * a + 1], local[2 * b], local[2 * b + 1], local[2 * ord[k]], local[2 * ord[k] + 1]);
      if (turn !== 0) break;
    }
    if (k === n) {
      this.dim = 1;
      this.setPath(lexicographic(xy, n));
      return;
    }
    this.dim = 2;
    const store = new TriangleStore(local, 2 * n - 2);
    if (lw !== null && xyw !== null) {
      store.setWeights(lw, xyw);
      this.rankW = lw;
    }
    // orient2d < 0 is counter-clockwise (y-up).
    if (turn < 0) store.init(a, b, ord[k]);
    else store.init(b, a, ord[k]);
    for (let i = 2; i < n; i++) {
      if (i !== k) store.insert(ord[i]);
    }
    if (weighted) store.cleanupRedundant();
    if (store.removed.length > 0) {
      store.pack();
      const removed = store.removed, hidden = new Int32Array(removed.length);
      for (let i = 0; i < removed.length; i++) hidden[i] = siteOfRank[removed[i]];
      this.hidden = hidden.sort();
    }
    this.store = store;
    this.rankXY = local;
    this.siteOfRank = new Int32Array(siteOfRank.buffer, siteOfRank.byteOffset, n);
    // The site-ordered copy is made again only if asked for: most users never read it.
    this.bySite = null;
    this.compact();
  }

  /**
   * Sites along their line (or the one site). With weights, a site whose
   * lifted point is on or above the chord of its neighbours' is hidden:
   * the one-dimensional lower hull, by exact tests.
   */
  private setPath(line: Int32Array): void {
    const w = this.siteW;
    if (w === null || allEqual(w) || line.length < 3) { this.path = line; return; }
    const xy = this.siteXY;
    const kept: number[] = [];
    const hidden: number[] = [];
    for (const c of line) {
      while (kept.length >= 2) {
        const b = kept[kept.length - 1], a = kept[kept.length - 2];
        if (liftedAboveChord(xy[2 * a], xy[2 * a + 1], w[a], xy[2 * b], xy[2 * b + 1], w[b], xy[2 * c], xy[2 * c + 1], w[c]) < 0) break;
        hidden.push(kept.pop()!);
      }
      kept.push(c);
    }
    this.path = Int32Array.from(kept);
    this.hidden = Int32Array.from(hidden).sort();
  }

  /**
   * Renumbers triangles so that the real ones come first and the ghosts
   * after, by swapping each misplaced ghost with a misplaced real triangle:
   * one scan, then work proportional to the hull only.
   */
  private compact(): void {
    const store = this.store;
    if (!store || this.real >= 0) return;
    const v = store.vert, tw = store.twin, count = store.count;
    let ghosts = 0;
    for (let e = 0; e < 3 * count; e++) if (v[e] < 0) ghosts++;
    const real = count - ghosts;
    let r = count - 1;
    for (let g = 0; g < real; g++) {
      if (v[3 * g] >= 0 && v[3 * g + 1] >= 0 && v[3 * g + 2] >= 0) continue;
      while (store.isGhost(r)) r--;
      swapTriangles(v, tw, g, r);
      if (store.last === r) store.last = g;
      r--;
    }
    this.real = real;
    this.vertexEdge = null;
    this.sitesCache = null;
  }

  /** A half-edge out of each rank. */
  private edgeOfVertex(): Int32Array {
    if (this.vertexEdge) return this.vertexEdge;
    const store = this.store!;
    const ve = new Int32Array(this.siteCount).fill(-1);
    const v = store.vert, len = 3 * store.count;
    for (let e = 0; e < len; e++) if (v[e] >= 0) ve[v[e]] = e;
    this.vertexEdge = ve;
    return ve;
  }

  /**
   * @internal The implicit layout behind the triangulation: `vert` and
   * `twin` per half-edge, three per triangle; triangles 0..real-1 are real,
   * real..count-1 are ghosts (one per hull edge, holding GHOST = -1).
   * `vert` holds ranks: `xy` gives their coordinates, `siteOfRank` their
   * site numbers (null: the same). Views, valid until the next insert.
   * Null when dimension < 2.
   */
  implicitLayout(): { vert: Int32Array; twin: Int32Array; real: number; count: number; xy: Float64Array; siteOfRank: Int32Array | null } | null {
    this.settle();
    if (!this.store) return null;
    this.compact();
    return { vert: this.store.vert, twin: this.store.twin, real: this.real, count: this.store.count, xy: this.rankXY, siteOfRank: this.siteOfRank };
  }

  /**
   * @internal The sites' coordinates in the store's rank order (a view, do
   * not modify): for work that does not care which site is which, such as a
   * bounding box, without making the site-ordered copy.
   */
  rankCoordinates(): Float64Array {
    this.settle();
    return this.rankXY.subarray(0, 2 * this.siteCount);
  }

  /** @internal The sites in order along their line when dimension < 2. */
  linearOrder(): Int32Array | null {
    this.settle();
    return this.path;
  }

  /**
   * Sites on the convex hull, counter-clockwise, starting at the smallest
   * site by (x, y). Sites lying on a hull edge are included. For collinear
   * sites: all of them in order along the line; for one site: that site.
   */
  hull(): Int32Array {
    this.settle();
    if (!this.store) return this.path!.slice();
    this.compact();
    const v = this.store.vert, tw = this.store.twin;
    const out: number[] = [];
    const start = this.store.realEdgeOfGhost(this.real);
    let re = start;
    do {
      out.push(this.siteOf(v[re]));
      re = prevOf(tw[prevOf(re)]);
    } while (re !== start && out.length <= this.siteCount);
    const xy = this.siteXY;
    let first = 0;
    for (let i = 1; i < out.length; i++) {
      const a = out[i], b = out[first];
      if (xy[2 * a] < xy[2 * b] || (xy[2 * a] === xy[2 * b] && xy[2 * a + 1] < xy[2 * b + 1])) first = i;
    }
    return Int32Array.from(out.slice(first).concat(out.slice(0, first)));
  }

  /**
   * Delaunay neighbours of a site, counter-clockwise around it. For a hull
   * site the list starts just after the outside; for an interior site, at
   * its smallest neighbour.
   */
  neighbors(site: number): Int32Array {
    if (!Number.isInteger(site) || site < 0 || site >= this.siteCount) {
      throw new RangeError(`site ${site} is not in 0..${this.siteCount - 1}`);
    }
    this.settle();
    if (!this.store) {
      const p = this.path!;
      const i = p.indexOf(site);
      const out: number[] = [];
      if (i > 0) out.push(p[i - 1]);
      if (i < p.length - 1) out.push(p[i + 1]);
      return Int32Array.from(out);
    }
    this.compact();
    const v = this.store.vert, tw = this.store.twin;
    const rank = this.rankOfSite();
    const e0 = this.edgeOfVertex()[rank ? rank[site] : site];
    // Rotate counter-clockwise (e → twin(prev(e))) to the edge towards the ghost, if any.
    let start = e0;
    let e = e0;
    let onHull = false;
    do {
      if (v[nextOf(e)] === GHOST) { start = tw[prevOf(e)]; onHull = true; break; }
      e = tw[prevOf(e)];
    } while (e !== e0);
    const out: number[] = [];
    e = start;
    do {
      const u = v[nextOf(e)];
      if (u !== GHOST) out.push(this.siteOf(u));
      e = tw[prevOf(e)];
    } while (e !== start);
    if (!onHull && out.length > 0) {
      // An interior site: start at its smallest neighbour, so the list depends only on the triangulation.
      let m = 0;
      for (let i = 1; i < out.length; i++) if (out[i] < out[m]) m = i;
      return Int32Array.from(out.slice(m).concat(out.slice(0, m)));
    }
    return Int32Array.from(out);
  }

  /** Undirected edges as pairs (a, b) with a < b. */
  edges(): Int32Array {
    this.settle();
    if (!this.store) {
      const p = this.path!;
      const out = new Int32Array(2 * Math.max(0, p.length - 1));
      for (let i = 0; i + 1 < p.length; i++) {
        out[2 * i] = Math.min(p[i], p[i + 1]);
        out[2 * i + 1] = Math.max(p[i], p[i + 1]);
      }
      return out;
    }
    this.compact();
    const v = this.store.vert, tw = this.store.twin, len = 3 * this.real;
    // Each edge once: from the half-edge with the smaller origin, or from its only real one on the hull.
    let count = 0;
    for (let e = 0; e < len; e++) if (tw[e] >= len || v[e] < v[nextOf(e)]) count++;
    const out = new Int32Array(2 * count);
    let k = 0;
    for (let e = 0; e < len; e++) {
      const a = v[e], b = v[nextOf(e)];
      if (tw[e] >= len || a < b) {
        const p = this.siteOf(a), q = this.siteOf(b);
        out[k++] = p < q ? p : q;
        out[k++] = p < q ? q : p;
      }
    }
    return out;
  }

  /**
   * Adds points (any accepted layout) to the triangulation. A point equal to
   * an existing site, or to an earlier point of the batch, is merged onto
   * it. Returns the site of each given point, in order.
   */
  insert(points: PointInput): Int32Array {
    if (this.siteW !== null) {
      throw new InputError('bad-option', 'insert() into a weighted triangulation is not supported; build it again with all weights', -1, 'weights');
    }
    const batch = readPoints(points, true);
    const m = batch.length >> 1;
    if (m === 0) return new Int32Array(0);
    this.settle();
    const merged = mergeDuplicates(batch);
    const result = new Int32Array(m);
    const siteOfBatch = new Int32Array(merged.count);
    const old = this.siteCount;
    if (this.store) {
      this.compact();
      const store = this.store;
      // First find which distinct points already are sites, so that new sites
      // can be numbered in order of first appearance.
      const ord = merged.curveOrder;
      const existing = new Int32Array(merged.count).fill(-1);
      for (let i = 0; i < ord.length; i++) {
        const q = ord[i];
        store.locate(merged.xy[2 * q], merged.xy[2 * q + 1]);
        existing[q] = store.hitVertex < 0 ? -1 : this.siteOf(store.hitVertex);
      }
      let count = old;
      for (let q = 0; q < merged.count; q++) siteOfBatch[q] = existing[q] >= 0 ? existing[q] : count++;
      this.growSites(merged.xy, siteOfBatch, count);
      store.xy = this.rankXY;
      store.reserve(2 * count - 2);
      // New sites take the ranks equal to their site numbers, after the old ranks.
      for (let i = 0; i < ord.length; i++) {
        const q = ord[i];
        if (existing[q] < 0) store.insert(siteOfBatch[q]);
      }
      this.real = -1;
      this.vertexEdge = null;
      this.sitesCache = null;
    } else {
      // Too few or collinear sites: merge against the old ones and build anew.
      const both = new Float64Array(2 * old + merged.xy.length);
      both.set(this.siteXY.subarray(0, 2 * old));
      both.set(merged.xy, 2 * old);
      const all = mergeDuplicates(both);
      for (let q = 0; q < merged.count; q++) siteOfBatch[q] = all.siteOfInput[old + q];
      this.bySite = all.xy;
      this.siteCount = all.count;
      this.build(orderSites(all.curveOrder, 'hilbert'));
    }
    for (let i = 0; i < m; i++) result[i] = siteOfBatch[merged.siteOfInput[i]];
    const soi = new Int32Array(this.siteOfInput.length + m);
    soi.set(this.siteOfInput);
    soi.set(result, this.siteOfInput.length);
    this.siteOfInput = soi;
    return result;
  }

  /** Appends the batch's new sites (numbers old..count-1, ranks the same) to the rank coordinates. */
  private growSites(batchXY: Float64Array, siteOfBatch: Int32Array, count: number): void {
    const old = this.siteCount;
    if (count === old) return;
    const xy = new Float64Array(2 * count);
    xy.set(this.rankXY.subarray(0, 2 * old));
    for (let q = 0; q < siteOfBatch.length; q++) {
      const s = siteOfBatch[q];
      if (s >= old) {
        xy[2 * s] = batchXY[2 * q];
        xy[2 * s + 1] = batchXY[2 * q + 1];
      }
    }
    if (this.siteOfRank) {
      const site = new Int32Array(count);
      site.set(this.siteOfRank);
      for (let r = old; r < count; r++) site[r] = r;
      this.siteOfRank = site;
      this.bySite = null;
    } else {
      this.bySite = xy;
    }
    this.rankXY = xy;
    this.rankOfSiteCache = null;
    this.siteCount = count;
  }

  /**
   * The triangulation as an explicit half-edge mesh of kind 'delaunay':
   * vertex v is site v, face t is triangle t (as in triangleSites), the last
   * face is the outer one, walked clockwise along the hull.
   */
  toMesh(): HalfEdgeMesh {
    this.settle();
    const vertexXY = this.siteXY.slice(0, 2 * this.siteCount);
    if (!this.store) return pathMesh(vertexXY, this.path!);
    this.compact();
    const store = this.store;
    const T = this.real, h = store.count - T, len = 3 * T, total = len + h;
    const v = store.vert, tw = store.twin;
    const origin = new Int32Array(total), twin = new Int32Array(total);
    const next = new Int32Array(total), face = new Int32Array(total);
    const site = this.siteOfRank;
    for (let e = 0; e < len; e++) origin[e] = site ? site[v[e]] : v[e];
    for (let e = 0; e < len; e++) {
      next[e] = nextOf(e);
      face[e] = (e / 3) | 0;
      const f = tw[e];
      // A twin in a ghost is a hull edge; its outer half-edge is numbered by the ghost.
      twin[e] = f < len ? f : len + ((f / 3) | 0) - T;
    }
    for (let g = T; g < store.count; g++) {
      const re = store.realEdgeOfGhost(g);
      const H = len + g - T;
      origin[H] = this.siteOf(v[re]);
      twin[H] = tw[re];
      face[H] = T;
      // The next outer half-edge starts where this one ends, in the ghost across (target → G).
      const across = tw[nextOf(re)];
      next[H] = len + ((across / 3) | 0) - T;
    }
    return triangleMesh(vertexXY, origin, twin, next, face, T);
  }
}

/**
 * A Delaunay mesh from half-edge arrays laid out as toMesh() lays them:
 * triangle t holds half-edges 3t..3t+2, the outer face (number T) the rest,
 * from 3T on.
 */
export function triangleMesh(
  vertexXY: Float64Array, origin: Int32Array, twin: Int32Array, next: Int32Array, face: Int32Array, T: number,
): HalfEdgeMesh {
  const faceEdge = new Int32Array(T + 1);
  for (let t = 0; t < T; t++) faceEdge[t] = 3 * t;
  faceEdge[T] = 3 * T;
  return new HalfEdgeMesh({
    kind: 'delaunay', vertexXY, origin, twin, next, face, faceEdge,
    faceSite: new Int32Array(T + 1).fill(-1), outerFace: T,
  });
}

/** Exchanges the numbers of triangles g and r, keeping every twin link right. */
function swapTriangles(v: Int32Array, tw: Int32Array, g: number, r: number): void {
  const relabel = (x: number): number => {
    const t = (x / 3) | 0;
    return t === g ? 3 * r + (x % 3) : t === r ? 3 * g + (x % 3) : x;
  };
  for (let j = 0; j < 3; j++) {
    const a = 3 * g + j, b = 3 * r + j;
    const tv = v[a]; v[a] = v[b]; v[b] = tv;
    const tt = tw[a]; tw[a] = tw[b]; tw[b] = tt;
  }
  for (let j = 0; j < 3; j++) {
    tw[3 * g + j] = relabel(tw[3 * g + j]);
    tw[3 * r + j] = relabel(tw[3 * r + j]);
  }
  for (let j = 0; j < 3; j++) {
    tw[tw[3 * g + j]] = 3 * g + j;
    tw[tw[3 * r + j]] = 3 * r + j;
  }
}

/** A path through collinear sites (or one site), as a mesh with one face. */
function pathMesh(vertexXY: Float64Array, path: Int32Array): HalfEdgeMesh {
  const m = path.length;
  const edges = Math.max(0, m - 1);
  const origin = new Int32Array(2 * edges), twin = new Int32Array(2 * edges);
  const next = new Int32Array(2 * edges), face = new Int32Array(2 * edges);
  // Half-edge 2i runs path[i] → path[i+1]; 2i+1 runs back.
  for (let i = 0; i < edges; i++) {
    origin[2 * i] = path[i];
    origin[2 * i + 1] = path[i + 1];
    twin[2 * i] = 2 * i + 1;
    twin[2 * i + 1] = 2 * i;
    next[2 * i] = i + 1 < edges ? 2 * (i + 1) : 2 * i + 1;
    next[2 * i + 1] = i > 0 ? 2 * (i - 1) + 1 : 0;
  }
  return new HalfEdgeMesh({
    kind: 'delaunay', vertexXY, origin, twin, next, face,
    faceEdge: Int32Array.of(edges > 0 ? 0 : -1), faceSite: Int32Array.of(-1), outerFace: 0,
  });
}

/**
 * The Delaunay triangulation of a point set: duplicates merged, every
 * topological decision exact. Throws InputError on invalid input.
 */
export function triangulate(points: PointInput, options: TriangulateOptions = {}): Triangulation {
  checkOptionNames(options, ['order', 'weights'], 'triangulate');
  const order = options.order ?? 'brio';
  if (order !== 'hilbert' && order !== 'brio' && order !== 'input') {
    throw new InputError('bad-option', `order must be 'hilbert', 'brio' or 'input', got ${String(order)}`, -1, 'order');
  }
  const xy = readPoints(points);
  const weights = readWeights(points, options.weights, xy.length >> 1);
  const sites = mergeDuplicates(xy);
  return new Triangulation(sites, order, weights && weightsOfSites(weights, sites));
}

/**
 * @internal triangulate() for callers that may never read the triangles:
 * the points are read, checked and merged now (errors are thrown here), the
 * Delaunay build runs on first use. The L1/L-infinity and Minkowski diagrams
 * build their own triangulations and need only the sites, unless a query or
 * a fallback asks for the Euclidean one.
 */
export function deferredTriangulation(points: PointInput): Triangulation {
  return new Triangulation(mergeDuplicates(readPoints(points)), 'brio', null, true);
}

/** Each site's weight: the largest among the points merged onto it (the others would be hidden by it). */
function weightsOfSites(weights: Float64Array, sites: SiteSet): Float64Array {
  const out = new Float64Array(sites.count).fill(-Infinity);
  const soi = sites.siteOfInput;
  for (let i = 0; i < soi.length; i++) if (weights[i] > out[soi[i]]) out[soi[i]] = weights[i];
  return out;
}

function allEqual(w: Float64Array): boolean {
  for (let i = 1; i < w.length; i++) if (w[i] !== w[0]) return false;
  return true;
}
