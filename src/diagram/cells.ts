import { InputError } from '../core/errors.js';
import { hilbertSort } from '../core/hilbert.js';
import { orient } from '../core/predicates.js';
import type { HalfEdgeMesh } from '../mesh/mesh.js';
import type { Triangulation } from '../triangulate/triangulation.js';
import { ConvexRegion } from './clip.js';

/** A cell's neighbours and the length of the boundary shared with each. */
export interface CellNeighbors { sites: Int32Array; lengths: Float64Array }

interface Measures { area: Float64Array; centroid: Float64Array; perimeter: Float64Array; neighbors: Int32Array }

/**
 * What every clipped diagram offers on top of its mesh (face s = cell of
 * site s, outer face = siteCount): polygons, measures, neighbours and the
 * region test of cellAt. Subclasses supply the mesh and the nearest-site
 * queries of their metric.
 */
export abstract class ClippedCells {
  /** The Delaunay triangulation of the sites, with the site numbering. */
  readonly triangulation: Triangulation;
  /** The cells: face s is the cell of site s (empty, faceEdge -1, when it misses the region); face siteCount, the outer face, walks the region's boundary. */
  readonly mesh: HalfEdgeMesh;
  /** The clip region, counter-clockwise, interleaved x, y. */
  readonly region: Float64Array;
  /** The face of each site's cell, or -1 when its cell does not reach into the region. */
  readonly faceOfSite: Int32Array;
  private measured: Measures | null = null;

  protected constructor(tri: Triangulation, region: Float64Array, built: { mesh: HalfEdgeMesh; faceOfSite: Int32Array }) {
    this.triangulation = tri;
    this.region = region;
    this.mesh = built.mesh;
    this.faceOfSite = built.faceOfSite;
  }

  /** The site nearest to (x, y). */
  abstract nearest(x: number, y: number): number;
  /** nearest() for many points (interleaved x, y), answered along a space-filling curve so that each walk starts near the last. */
  nearestMany(xy: Float64Array | ArrayLike<number>): Int32Array {
    const m = xy.length >> 1, out = new Int32Array(m);
    const pts = Float64Array.from(xy as ArrayLike<number>);
    for (const i of hilbertSort(pts).ids) out[i] = this.nearest(pts[2 * i], pts[2 * i + 1]);
    return out;
  }
  /** The k nearest sites, nearest first. */
  abstract kNearest(x: number, y: number, k: number): Int32Array;

  /** Sites whose cell does not reach into the region (reported, not dropped). */
  get sitesWithoutCell(): Int32Array {
    const out: number[] = [];
    this.faceOfSite.forEach((f, s) => { if (f < 0) out.push(s); });
    return Int32Array.from(out);
  }

  protected checkSite(site: number): void {
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

  private measure(): Measures {
    if (this.measured) return this.measured;
    const n = this.triangulation.siteCount, m = this.mesh, xy = m.vertexXY, origin = m.origin, next = m.next;
    const area = new Float64Array(n), centroid = new Float64Array(2 * n).fill(NaN), perimeter = new Float64Array(n);
    const neighbors = new Int32Array(n);
    const face = m.face, twin = m.twin, faceEdge = m.faceEdge, faceSite = m.faceSite;
    // Cells in the order of their first half-edge, not of their sites: the mesh lays cells out along the
    // sites' curve order, so neighbouring cells, and the vertices they share, are read from nearby memory.
    // The first half-edges are collected and sorted rather than found by scanning every half-edge.
    let starts = new Int32Array(n), k = 0;
    for (let s = 0; s < n; s++) {
      const f = this.faceOfSite[s];
      if (f >= 0) starts[k++] = faceEdge[f];
    }
    starts = starts.subarray(0, k).sort();
    for (let i = 0; i < k; i++) {
      const start = starts[i], f = face[start], s = faceSite[f];
      if (s < 0 || this.faceOfSite[s] !== f) continue;
      // Relative to the cell's first vertex: coordinates far from the origin keep their precision, and
      // a thin cell far from its site does not cancel itself away.
      const v0 = origin[start];
      const ox = xy[2 * v0], oy = xy[2 * v0 + 1];
      let a2 = 0, cx = 0, cy = 0, per = 0, mx = 0, my = 0, count = 0;
      // The cell's box, relative to its first vertex: the centroid must fall inside it.
      let loX = 0, loY = 0, hiX = 0, hiY = 0;
      // Neighbours in the same walk: runs of edges with the same site across count once (cellNeighbors merges
      // them the same way), including a run that wraps around the cell's first edge.
      let neighborCount = 0, last = -1, first = -2;
      let e = start;
      do {
        const en = next[e];
        const q = origin[en];
        const p = origin[e];
        const x0 = xy[2 * p] - ox, y0 = xy[2 * p + 1] - oy, x1 = xy[2 * q] - ox, y1 = xy[2 * q + 1] - oy;
        const cross = x0 * y1 - x1 * y0;
        a2 += cross;
        cx += (x0 + x1) * cross;
        cy += (y0 + y1) * cross;
        // sqrt, not Math.hypot (several times slower): coordinates within 2^±120 cannot overflow or underflow here.
        const dx = x1 - x0, dy = y1 - y0;
        per += Math.sqrt(dx * dx + dy * dy);
        mx += x0; my += y0; count++;
        if (x0 < loX) loX = x0; else if (x0 > hiX) hiX = x0;
        if (y0 < loY) loY = y0; else if (y0 > hiY) hiY = y0;
        const other = faceSite[face[twin[e]]];
        if (other >= 0 && other !== last) { neighborCount++; if (first === -2) first = other; }
        last = other;
        e = en;
      } while (e !== start);
      if (neighborCount > 1 && last === first) neighborCount--;
      neighbors[s] = neighborCount;
      area[s] = a2 / 2;
      perimeter[s] = per;
      const gx = cx / (3 * a2), gy = cy / (3 * a2);
      // A cell too thin for the area formula to divide by: its vertex mean is as good a centre.
      const thin = !(Math.abs(a2) > 0) || !(gx >= loX && gx <= hiX && gy >= loY && gy <= hiY);
      centroid[2 * s] = ox + (thin ? mx / count : gx);
      centroid[2 * s + 1] = oy + (thin ? my / count : gy);
    }
    this.measured = { area, centroid, perimeter, neighbors };
    return this.measured;
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
   * site's cell, counter-clockwise around it, with that length. A boundary
   * made of several edges (a bent bisector) counts once, with its whole length.
   */
  cellNeighbors(site: number): CellNeighbors {
    this.checkSite(site);
    const f = this.faceOfSite[site];
    const sites: number[] = [], lengths: number[] = [];
    if (f >= 0) {
      const m = this.mesh, xy = m.vertexXY;
      let last = -1;
      for (const e of m.faceEdges(f)) {
        const other = m.faceSite[m.face[m.twin[e]]];
        if (other < 0) { last = -1; continue; }
        const p = m.origin[e], q = m.origin[m.next[e]];
        const len = Math.hypot(xy[2 * q] - xy[2 * p], xy[2 * q + 1] - xy[2 * p + 1]);
        if (other === last) lengths[lengths.length - 1] += len;
        else { sites.push(other); lengths.push(len); }
        last = other;
      }
      if (sites.length > 1 && sites[0] === sites[sites.length - 1] && last === sites[0]) {
        lengths[0] += lengths.pop()!;
        sites.pop();
      }
    }
    return { sites: Int32Array.from(sites), lengths: Float64Array.from(lengths) };
  }

  /** For every site, how many cells its cell shares a boundary with. */
  neighborCounts(): Int32Array { return this.measure().neighbors.slice(); }


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
