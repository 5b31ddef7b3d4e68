import { boundingBox, type Box } from '../../core/bounds.js';
import { InputError } from '../../core/errors.js';
import { orient } from '../../core/predicates.js';
import type { ClippedCells } from '../../diagram/cells.js';
import { readStudyArea, type StudyArea, type StudyAreaInput } from './area-input.js';
import { readCell } from './cell-ring.js';
import { CellClipper } from './overlay.js';
import { assemblePieces, type StudyAreaPiece } from './pieces.js';
import { areaShares, compensatedSum, weightedMean } from './weights.js';

/**
 * A diagram's cells cut to a study area (a polygon with holes, or several).
 * A cell may come out in several pieces; all stay with their site. Sites
 * whose cell misses the study area have no piece and are listed in
 * sitesWithoutPiece.
 */
export class StudyAreaCells {
  /** The diagram that was clipped. */
  readonly diagram: ClippedCells;
  /** Number of sites (as in the diagram). */
  readonly siteCount: number;
  /** The study area's size by the shoelace formula: shells minus holes. */
  readonly studyAreaSize: number;
  /** Pieces of site s are numbered pieceStart[s] .. pieceStart[s + 1] - 1. */
  readonly pieceStart: Int32Array;
  /** The site of each piece. */
  readonly pieceSite: Int32Array;
  /** The area of each piece. */
  readonly pieceAreas: Float64Array;
  private readonly list: StudyAreaPiece[];
  private readonly area: StudyArea;

  /** @internal Use {@link clipToStudyArea}. */
  constructor(diagram: ClippedCells, area: StudyArea) {
    this.diagram = diagram;
    this.area = area;
    this.studyAreaSize = area.size;
    const n = diagram.triangulation.siteCount, mesh = diagram.mesh;
    this.siteCount = n;
    const clipper = new CellClipper(area);
    const cell = { xy: new Float64Array(64) };
    // Cells in the order their edges were built (which follows the sites' space-filling curve):
    // neighbouring cells share memory, several times faster than site order on random input.
    const bySlot = new Int32Array(mesh.halfEdgeCount).fill(-1);
    for (let s = 0; s < n; s++) if (diagram.faceOfSite[s] >= 0) bySlot[mesh.faceEdge[diagram.faceOfSite[s]]] = s;
    const found: StudyAreaPiece[] = [], foundSite: number[] = [], start = new Int32Array(n + 1);
    for (let e = 0; e < bySlot.length; e++) {
      const s = bySlot[e];
      if (s < 0) continue;
      const k = readCell(mesh, diagram.faceOfSite[s], cell);
      if (k === 0) continue;
      for (const p of assemblePieces(clipper.clip(cell.xy, k))) { found.push(p); foundSite.push(s); start[s + 1]++; }
    }
    for (let s = 0; s < n; s++) start[s + 1] += start[s];
    const list = new Array<StudyAreaPiece>(found.length), site = new Int32Array(found.length), fill = start.slice(0, n);
    found.forEach((p, i) => { const at = fill[foundSite[i]]++; list[at] = p; site[at] = foundSite[i]; });
    start[n] = list.length;
    this.list = list;
    this.pieceStart = start;
    this.pieceSite = site;
    this.pieceAreas = Float64Array.from(list, (p) => p.area);
  }

  get pieceCount(): number { return this.list.length; }

  /** Sites with no piece in the study area (reported, not dropped). */
  get sitesWithoutPiece(): Int32Array {
    const out: number[] = [];
    for (let s = 0; s < this.siteCount; s++) if (this.pieceStart[s] === this.pieceStart[s + 1]) out.push(s);
    return Int32Array.from(out);
  }

  /** The pieces of a site's cell inside the study area (copies). */
  pieces(site: number): StudyAreaPiece[] {
    if (!Number.isInteger(site) || site < 0 || site >= this.siteCount) {
      throw new InputError('bad-site', `site ${site} is not in 0..${this.siteCount - 1}`, -1, 'site');
    }
    return this.list.slice(this.pieceStart[site], this.pieceStart[site + 1])
      .map((p) => ({ ...p, outer: p.outer.slice(), holes: p.holes.map((h) => h.slice()) }));
  }

  /** Each site's area inside the study area (0 without a piece). */
  clippedAreas(): Float64Array {
    const out = new Float64Array(this.siteCount);
    for (let s = 0; s < this.siteCount; s++) out[s] = compensatedSum(this.pieceAreas.subarray(this.pieceStart[s], this.pieceStart[s + 1]));
    return out;
  }

  /**
   * Each site's centroid of all its pieces together, interleaved (NaN
   * without a piece): the centre a Lloyd step inside the study area moves to.
   */
  clippedCentroids(): Float64Array {
    const out = new Float64Array(2 * this.siteCount).fill(NaN);
    for (let s = 0; s < this.siteCount; s++) {
      let a = 0, mx = 0, my = 0;
      for (let i = this.pieceStart[s]; i < this.pieceStart[s + 1]; i++) {
        const p = this.list[i];
        a += p.area; mx += p.area * p.centroidX; my += p.area * p.centroidY;
      }
      if (a > 0) { out[2 * s] = mx / a; out[2 * s + 1] = my / a; }
    }
    return out;
  }

  /** Sum of all pieces' areas: the study area's size, up to rounding. */
  totalArea(): number { return compensatedSum(this.pieceAreas); }

  /** Thiessen weights: each site's share of the clipped total, adding up to 1. */
  areaShares(): Float64Array { return areaShares(this.clippedAreas()); }

  /** The area-weighted mean of one finite value per site (InputError bad-length / not-finite, field 'values'). */
  weightedMean(values: ArrayLike<number>): number { return weightedMean(this.areaShares(), values); }

  /**
   * The site whose piece holds (x, y): the diagram's cellAt for points in
   * the study area or on its boundary (decided exactly), else -1.
   */
  pieceAt(x: number, y: number): number {
    for (const [name, v] of [['x', x], ['y', y]] as const) {
      if (typeof v !== 'number' || !Number.isFinite(v)) throw new InputError('not-finite', `${name} is ${v}; query coordinates must be finite`, -1, name);
    }
    return this.area.locate(x, y) < 0 ? -1 : this.diagram.cellAt(x, y);
  }
}

/**
 * Cuts every cell of a diagram (Euclidean, power or metric) to a study
 * area: a polygon with holes `[shell, ...holes]`, an array of such
 * polygons, or one ring (see StudyAreaInput). The study area must lie in
 * the diagram's clip region; build the diagram with
 * `clip: studyAreaBounds(area)` to make sure. Throws AreaInputError
 * (an InputError, field 'area') naming the polygon, ring and vertex.
 */
export function clipToStudyArea(diagram: ClippedCells, area: StudyAreaInput): StudyAreaCells {
  const a = readStudyArea(area), r = diagram.region, m = r.length >> 1, xy = a.xy;
  for (let v = 0; v < a.next.length; v++) {
    for (let j = 0; j < m; j++) {
      const k = j + 1 === m ? 0 : j + 1;
      if (orient(r[2 * j], r[2 * j + 1], r[2 * k], r[2 * k + 1], xy[2 * v], xy[2 * v + 1]) < 0) {
        throw a.error('area-outside-region', `(${xy[2 * v]}, ${xy[2 * v + 1]}) lies outside the diagram's clip region`, v);
      }
    }
  }
  return new StudyAreaCells(diagram, a);
}

/** The bounding box of a study area, to clip a diagram to (validates the area). */
export function studyAreaBounds(area: StudyAreaInput): Box {
  return boundingBox(readStudyArea(area).xy);
}
