import { InputError } from '../core/errors.js';
import { orient } from '../core/predicates.js';
import type { PointInput } from '../core/input.js';
import { HalfEdgeMesh } from '../mesh/mesh.js';
import { SiteLocator } from '../query/site-locator.js';
import { Triangulation, triangulate } from '../triangulate/triangulation.js';
import { ConvexRegion } from './clip.js';
import { clippedVoronoi } from './dual.js';
import { paddedBounds, readClipRegion, type ClipRegion } from './region.js';

export interface VoronoiOptions {
  /**
   * The region cells are clipped to: a rectangle or a convex polygon (either
   * orientation). Default: the sites' bounding box padded by 10% of its
   * larger side on every side.
   */
  clip?: ClipRegion;
}

/** A cell's neighbours and the length of the boundary shared with each. */
export interface CellNeighbors { sites: Int32Array; lengths: Float64Array }

/**
 * The Voronoi diagram of a set of sites, clipped to a convex region: every
 * cell a finite convex polygon, all of them on one half-edge mesh.
 */
export class VoronoiDiagram {
  /** The Delaunay triangulation of the sites (the dual), with the site numbering. */
  readonly triangulation: Triangulation;
  /** The cells: face s is the cell of site s (empty, faceEdge -1, when it misses the region); face siteCount, the outer face, walks the region's boundary. */
  readonly mesh: HalfEdgeMesh;
  /** The clip region, counter-clockwise, interleaved x, y. */
  readonly region: Float64Array;
  /** The face of each site's cell, or -1 when its cell does not reach into the region. */
  readonly faceOfSite: Int32Array;
  private locator: SiteLocator | null = null;
  private measured: { area: Float64Array; centroid: Float64Array; perimeter: Float64Array } | null = null;

  /** @internal Use {@link voronoi}. */
  constructor(tri: Triangulation, region: Float64Array) {
    this.triangulation = tri;
    this.region = region;
    const built = clippedVoronoi(tri, region);
    this.mesh = built.mesh;
    this.faceOfSite = built.faceOfSite;
  }

  /** Sites whose cell does not reach into the region (reported, not dropped). */
  get sitesWithoutCell(): Int32Array {
    const out: number[] = [];
    this.faceOfSite.forEach((f, s) => { if (f < 0) out.push(s); });
    return Int32Array.from(out);
  }

  private checkSite(site: number): void {
    if (!Number.isInteger(site) || site < 0 || site >= this.triangulation.siteCount) {
      throw new InputError('bad-site', `site ${site} is not in 0..${this.triangulation.siteCount - 1}`, -1, 'site');
    }
  }

  /**
   * The vertices of a site's cell, counter-clockwise, interleaved, starting
   * at the smallest by (x, then y); empty when the site has no cell.
   */
  cellPolygon(site: number): Float64Array {
    this.checkSite(site);
    const f = this.faceOfSite[site];
    if (f < 0) return new Float64Array(0);
    const vs = this.mesh.faceVertices(f), xy = this.mesh.vertexXY;
    let first = 0;
    for (let i = 1; i < vs.length; i++) {
      const a = vs[i], b = vs[first];
      if (xy[2 * a] < xy[2 * b] || (xy[2 * a] === xy[2 * b] && xy[2 * a + 1] < xy[2 * b + 1])) first = i;
    }
    const out = new Float64Array(2 * vs.length);
    for (let i = 0; i < vs.length; i++) {
      const v = vs[(first + i) % vs.length];
      out[2 * i] = xy[2 * v];
      out[2 * i + 1] = xy[2 * v + 1];
    }
    return out;
  }

  private measure(): { area: Float64Array; centroid: Float64Array; perimeter: Float64Array } {
    if (this.measured) return this.measured;
    const n = this.triangulation.siteCount, m = this.mesh, xy = m.vertexXY;
    const area = new Float64Array(n), centroid = new Float64Array(2 * n).fill(NaN), perimeter = new Float64Array(n);
    for (let s = 0; s < n; s++) {
      const f = this.faceOfSite[s];
      if (f < 0) continue;
      // Relative to the cell's first vertex: coordinates far from the origin keep their precision, and
      // a thin cell far from its site does not cancel itself away.
      const v0 = m.origin[m.faceEdge[f]];
      const ox = xy[2 * v0], oy = xy[2 * v0 + 1];
      let a2 = 0, cx = 0, cy = 0, per = 0;
      const start = m.faceEdge[f];
      let e = start;
      do {
        const p = m.origin[e], q = m.origin[m.next[e]];
        const x0 = xy[2 * p] - ox, y0 = xy[2 * p + 1] - oy, x1 = xy[2 * q] - ox, y1 = xy[2 * q + 1] - oy;
        const cross = x0 * y1 - x1 * y0;
        a2 += cross;
        cx += (x0 + x1) * cross;
        cy += (y0 + y1) * cross;
        per += Math.hypot(x1 - x0, y1 - y0);
        e = m.next[e];
      } while (e !== start);
      area[s] = a2 / 2;
      centroid[2 * s] = ox + cx / (3 * a2);
      centroid[2 * s + 1] = oy + cy / (3 * a2);
      perimeter[s] = per;
      if (!(Math.abs(a2) > 0) || !this.insideBox(f, centroid[2 * s], centroid[2 * s + 1])) {
        // A cell too thin for the area formula to divide by: its vertex mean is as good a centre.
        const vs = m.faceVertices(f);
        let mx = 0, my = 0;
        for (const v of vs) { mx += xy[2 * v] - ox; my += xy[2 * v + 1] - oy; }
        centroid[2 * s] = ox + mx / vs.length;
        centroid[2 * s + 1] = oy + my / vs.length;
      }
    }
    this.measured = { area, centroid, perimeter };
    return this.measured;
  }

  private insideBox(f: number, x: number, y: number): boolean {
    const xy = this.mesh.vertexXY;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (const v of this.mesh.faceVertices(f)) {
      minX = Math.min(minX, xy[2 * v]); maxX = Math.max(maxX, xy[2 * v]);
      minY = Math.min(minY, xy[2 * v + 1]); maxY = Math.max(maxY, xy[2 * v + 1]);
    }
    return x >= minX && x <= maxX && y >= minY && y <= maxY;
  }

  /** Area of each site's cell (0 without a cell). */
  cellAreas(): Float64Array { return this.measure().area.slice(); }
  /** Centroid of each site's cell, interleaved (NaN without a cell). */
  cellCentroids(): Float64Array { return this.measure().centroid.slice(); }
  /** Perimeter of each site's cell (0 without a cell). */
  cellPerimeters(): Float64Array { return this.measure().perimeter.slice(); }

  /** Area covered by all cells: the region's area, up to rounding. */
  totalArea(): number {
    const a = this.measure().area;
    let s = 0;
    for (let i = 0; i < a.length; i++) s += a[i];
    return s;
  }

  /** Length of the region's boundary, walked along the outer face. */
  totalPerimeter(): number {
    return new ConvexRegion(this.region).perimeter();
  }

  /**
   * The sites whose cells share a boundary of nonzero length with this
   * site's cell, counter-clockwise around it, with that length.
   */
  cellNeighbors(site: number): CellNeighbors {
    this.checkSite(site);
    const f = this.faceOfSite[site];
    const sites: number[] = [], lengths: number[] = [];
    if (f >= 0) {
      const m = this.mesh, xy = m.vertexXY;
      for (const e of m.faceEdges(f)) {
        const other = m.faceSite[m.face[m.twin[e]]];
        if (other < 0) continue;
        const p = m.origin[e], q = m.origin[m.next[e]];
        sites.push(other);
        lengths.push(Math.hypot(xy[2 * q] - xy[2 * p], xy[2 * q + 1] - xy[2 * p + 1]));
      }
    }
    return { sites: Int32Array.from(sites), lengths: Float64Array.from(lengths) };
  }

  /** For every site, how many cells its cell shares a boundary with. */
  neighborCounts(): Int32Array {
    const m = this.mesh, out = new Int32Array(this.triangulation.siteCount);
    for (let e = 0; e < m.halfEdgeCount; e++) {
      const s = m.faceSite[m.face[e]];
      if (s >= 0 && m.faceSite[m.face[m.twin[e]]] >= 0) out[s]++;
    }
    return out;
  }

  private queries(): SiteLocator {
    return (this.locator ??= new SiteLocator(this.triangulation));
  }

  /** The site nearest to (x, y); ties go to the smallest site index. */
  nearest(x: number, y: number): number { return this.queries().nearest(x, y); }
  /** nearest() for many points (interleaved x, y), answered along a space-filling curve. */
  nearestMany(xy: Float64Array | ArrayLike<number>): Int32Array { return this.queries().nearestMany(xy); }
  /** The k nearest sites by (distance, site index). */
  kNearest(x: number, y: number, k: number): Int32Array { return this.queries().kNearest(x, y, k); }

  /**
   * The site whose cell contains (x, y): its nearest site when the point is
   * inside the region or on its boundary (decided exactly), else -1.
   */
  cellAt(x: number, y: number): number {
    const s = this.nearest(x, y);
    const r = this.region, m = r.length >> 1;
    for (let j = 0; j < m; j++) {
      const k = j + 1 === m ? 0 : j + 1;
      if (orient(r[2 * j], r[2 * j + 1], r[2 * k], r[2 * k + 1], x, y) < 0) return -1;
    }
    return s;
  }
}

/**
 * The Voronoi diagram of points (or of an existing triangulation's sites),
 * clipped to a convex region. Throws InputError on invalid points or region.
 */
export function voronoi(input: PointInput | Triangulation, options: VoronoiOptions = {}): VoronoiDiagram {
  const tri = input instanceof Triangulation ? input : triangulate(input);
  const region = options.clip === undefined ? paddedBounds(tri.rankCoordinates(), tri.siteCount) : readClipRegion(options.clip);
  return new VoronoiDiagram(tri, region);
}
