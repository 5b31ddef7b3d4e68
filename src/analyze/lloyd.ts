import { InputError } from '../core/errors.js';
import { readPoints, type PointInput } from '../core/input.js';
import { readClipRegion, type ClipRegion } from '../diagram/region.js';
import { voronoi, type VoronoiDiagram } from '../diagram/voronoi.js';
import { triangulate } from '../triangulate/triangulation.js';
import { DensitySum, MomentSum, normalizedSecondMoment, polygonSecondMoment } from './second-moment.js';
import { clipToStudyArea, studyAreaBounds, type StudyAreaCells } from './study-area/study-area-cells.js';
import type { StudyAreaInput } from './study-area/area-input.js';
import { checkOptionNames } from '../core/options.js';

export interface RelaxOptions {
  /** The region: a rectangle or a convex polygon (as for voronoi). Required unless `area` is given. */
  clip?: ClipRegion;
  /**
   * A study area (polygon with holes, or several; as for clipToStudyArea): cells are cut to it and sites
   * move to the centroids of their pieces. The diagram is clipped to `clip`, by default the area's bounding box.
   */
  area?: StudyAreaInput;
  /** Most steps to take, a whole number >= 0. Default 100. */
  steps?: number;
  /** Stop once no site moved farther than this in a step (coordinate units, >= 0). Default 1e-9 times the region's larger side. */
  tolerance?: number;
  /** A density ρ(x, y) >= 0 (finite) over the region: sites move to their cells' mass centroids under it. Default: uniform. */
  density?: (x: number, y: number) => number;
  /** Called after the first diagram (step 0, largestMove NaN) and after every step. */
  onProgress?: (info: RelaxProgress) => void;
}

export interface RelaxProgress { step: number; energy: number; largestMove: number }

export interface RelaxResult {
  /** Where every input point ended, interleaved x, y (points merged onto one site move together). */
  sites: Float64Array;
  /** The Voronoi diagram of the final sites, clipped to the region. */
  diagram: VoronoiDiagram;
  /** With `area`: the final cells cut to the study area; otherwise null. */
  studyArea: StudyAreaCells | null;
  /** Steps taken. */
  steps: number;
  /** Energy Σ ∫_cell ρ |x − site|² of the sites before any step, then after each: steps + 1 entries. */
  energy: Float64Array;
  /** The largest distance a site moved in each step: steps entries. */
  moves: Float64Array;
  /** The last step moved no site farther than the tolerance. */
  converged: boolean;
  /** G = E n / (2 A²) of the final sites (n cells, region or study area A); NaN under a density. */
  normalizedMoment: number;
  /** Input points that came to share a site with an earlier, distinct input point during the relaxation (ascending). */
  merged: Int32Array;
}

/**
 * Builds the cells of the given sites inside the region. relax() works on
 * this alone, so that another kind of region can be swapped in later.
 */
export type CellBuilder = (xy: Float64Array) => VoronoiDiagram;

const optionError = (message: string, field: string) => new InputError('bad-option', message, -1, field);

function readOptions(options: RelaxOptions): { steps: number; tolerance: number | null } {
  if (options === null || typeof options !== 'object') throw optionError('relax needs an options object with a clip region', 'options');
  if (options.clip === undefined && options.area === undefined) throw optionError('clip (or a study area) is required: the region the sites are relaxed in', 'clip');
  const { steps = 100, tolerance, density, onProgress } = options;
  if (typeof steps !== 'number' || !Number.isInteger(steps) || steps < 0) {
    throw optionError(`steps must be a whole number >= 0, got ${String(steps)}`, 'steps');
  }
  if (tolerance !== undefined && (typeof tolerance !== 'number' || !(tolerance >= 0) || tolerance === Infinity)) {
    throw optionError(`tolerance must be a finite number >= 0, got ${String(tolerance)}`, 'tolerance');
  }
  if (density !== undefined && typeof density !== 'function') throw optionError('density must be a function (x, y) => number', 'density');
  if (onProgress !== undefined && typeof onProgress !== 'function') throw optionError('onProgress must be a function', 'onProgress');
  return { steps, tolerance: tolerance ?? null };
}

/**
 * Lloyd relaxation (Lloyd 1982): every step moves each site to the centroid
 * of its cell, clipped to a convex region; with a density, to the cell's
 * mass centroid, giving centroidal Voronoi tessellations (Du, Faber and
 * Gunzburger 1999). Stops after `steps` steps or once the largest move is at
 * most `tolerance`. Energy is measured for each step's sites with their own
 * cells; for uniform density it is exact per cell (closed form) and a
 * Lloyd step never raises it (up to rounding). Under a density, integrals
 * use the degree-5 seven-point triangle rule on a fan of each cell.
 */
export function relax(points: PointInput, options: RelaxOptions): RelaxResult {
  const { steps, tolerance } = readOptions(options);
  checkOptionNames(options, ['clip', 'area', 'steps', 'tolerance', 'density', 'onProgress'], 'relax');
  const area = options.area;
  // studyAreaBounds reads (and so checks) the area before any work.
  const region = readClipRegion(options.clip ?? studyAreaBounds(area!));
  const build: CellBuilder = (xy) => voronoi(xy, { clip: region });
  const size = regionSize(region);
  const cut = area === undefined ? null : (d: VoronoiDiagram) => clipToStudyArea(d, area);
  return relaxWith(readPoints(points), build, size, steps, tolerance, options, cut);
}

function regionSize(region: Float64Array): { side: number; area: number } {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < region.length; i += 2) {
    minX = Math.min(minX, region[i]); maxX = Math.max(maxX, region[i]);
    minY = Math.min(minY, region[i + 1]); maxY = Math.max(maxY, region[i + 1]);
  }
  return { side: Math.max(maxX - minX, maxY - minY), area: polygonSecondMoment(region, minX, minY).area };
}

function relaxWith(
  pos: Float64Array, build: CellBuilder, size: { side: number; area: number }, steps: number,
  tolerance: number | null, options: RelaxOptions, cut: ((d: VoronoiDiagram) => StudyAreaCells) | null,
): RelaxResult {
  const tol = tolerance ?? 1e-9 * size.side;
  const { density, onProgress } = options;
  let d = buildMerging(pos, build);
  const initialSite = d.triangulation.siteOfInput.slice();
  const energy: number[] = [], moves: number[] = [];
  let pieces = cut?.(d) ?? null;
  let m = pieces ? measurePieces(pieces, density) : measure(d, density);
  energy.push(m.energy);
  onProgress?.({ step: 0, energy: m.energy, largestMove: NaN });
  let converged = false;
  for (let step = 1; step <= steps && !converged; step++) {
    const soi = d.triangulation.siteOfInput, c = m.centroids;
    let largest = 0;
    for (let i = 0; i < soi.length; i++) {
      const s = soi[i], x = c[2 * s], y = c[2 * s + 1];
      if (Number.isNaN(x)) continue; // no cell in the region: the site stays
      largest = Math.max(largest, Math.hypot(x - pos[2 * i], y - pos[2 * i + 1]));
      pos[2 * i] = x;
      pos[2 * i + 1] = y;
    }
    d = buildMerging(pos, build);
    pieces = cut?.(d) ?? null;
    m = pieces ? measurePieces(pieces, density) : measure(d, density);
    energy.push(m.energy);
    moves.push(largest);
    converged = largest <= tol;
    onProgress?.({ step, energy: m.energy, largestMove: largest });
  }
  const cells = pieces ? pieces.siteCount - pieces.sitesWithoutPiece.length : d.faceOfSite.reduce((k, f) => (f >= 0 ? k + 1 : k), 0);
  return {
    sites: pos,
    diagram: d,
    studyArea: pieces,
    steps: moves.length,
    energy: Float64Array.from(energy),
    moves: Float64Array.from(moves),
    converged,
    normalizedMoment: density ? NaN : normalizedSecondMoment(m.energy, cells, pieces ? pieces.studyAreaSize : size.area),
    merged: mergedDuring(initialSite, d.triangulation.siteOfInput),
  };
}

/** Input points whose final site is shared with an earlier input point that started on a different site. */
function mergedDuring(initial: Int32Array, final: Int32Array): Int32Array {
  const first = new Map<number, number>(), out: number[] = [];
  for (let i = 0; i < final.length; i++) {
    const j = first.get(final[i]);
    if (j === undefined) first.set(final[i], i);
    else if (initial[j] !== initial[i]) out.push(i);
  }
  return Int32Array.from(out);
}

/**
 * Builds the cells; two sites that relaxed too close for double precision
 * to separate (InputError too-close, naming one of them) are merged, the
 * second onto the first's position, and the build is tried again. In exact
 * arithmetic centroids of distinct cells never meet; this keeps rounding
 * from ending a long run with an error.
 */
function buildMerging(pos: Float64Array, build: CellBuilder): VoronoiDiagram {
  for (;;) {
    try {
      return build(pos);
    } catch (err) {
      if (!(err instanceof InputError) || err.code !== 'too-close' || err.index < 0) throw err;
      const tri = triangulate(pos), xy = tri.siteXY, a = err.index;
      let b = -1, best = Infinity;
      for (const nb of tri.neighbors(a)) {
        const dd = Math.hypot(xy[2 * nb] - xy[2 * a], xy[2 * nb + 1] - xy[2 * a + 1]);
        if (dd < best) { best = dd; b = nb; }
      }
      if (b < 0) throw err;
      const soi = tri.siteOfInput;
      for (let i = 0; i < soi.length; i++) {
        if (soi[i] === b) { pos[2 * i] = xy[2 * a]; pos[2 * i + 1] = xy[2 * a + 1]; }
      }
    }
  }
}

/**
 * The energy of the diagram's sites with their own cells, and each cell's
 * (mass) centroid (NaN without a cell). Uniform density: both from one
 * closed-form pass relative to the site, so coordinates far from the origin
 * keep their precision.
 */
function measure(d: VoronoiDiagram, density: ((x: number, y: number) => number) | undefined): { energy: number; centroids: Float64Array } {
  const mesh = d.mesh, xy = mesh.vertexXY, site = d.triangulation.siteXY, n = d.triangulation.siteCount;
  const centroids = new Float64Array(2 * n).fill(NaN);
  const sum = new MomentSum(), dsum = new DensitySum();
  let energy = 0;
  for (let s = 0; s < n; s++) {
    const f = d.faceOfSite[s];
    if (f < 0) continue;
    const sx = site[2 * s], sy = site[2 * s + 1];
    const start = mesh.faceEdge[f];
    sum.reset();
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, mx = 0, my = 0, corners = 0;
    let e = start;
    do {
      const p = mesh.origin[e], q = mesh.origin[mesh.next[e]];
      const px = xy[2 * p] - sx, py = xy[2 * p + 1] - sy;
      sum.add(px, py, xy[2 * q] - sx, xy[2 * q + 1] - sy);
      if (px < minX) minX = px;
      if (px > maxX) maxX = px;
      if (py < minY) minY = py;
      if (py > maxY) maxY = py;
      mx += px; my += py; corners++;
      e = mesh.next[e];
    } while (e !== start);
    let cx = sum.mx6 / (3 * sum.a2), cy = sum.my6 / (3 * sum.a2);
    // A cell too thin for the area formula to divide by: its corner mean is as good a centre.
    if (!(sum.a2 > 0) || !(cx >= minX && cx <= maxX && cy >= minY && cy <= maxY)) { cx = mx / corners; cy = my / corners; }
    centroids[2 * s] = sx + cx;
    centroids[2 * s + 1] = sy + cy;
    if (!density) {
      energy += sum.secondMoment;
      continue;
    }
    // A fan from the cell's first corner: every triangle lies in the cell, where the density is asked for.
    dsum.reset();
    const p0 = mesh.origin[start];
    e = mesh.next[start];
    for (let nx = mesh.next[e]; nx !== start; e = nx, nx = mesh.next[e]) {
      const p = mesh.origin[e], q = mesh.origin[nx];
      dsum.addTriangle(xy[2 * p0], xy[2 * p0 + 1], xy[2 * p], xy[2 * p + 1], xy[2 * q], xy[2 * q + 1], sx, sy, density, badDensity);
    }
    energy += dsum.moment;
    // A cell the density gives no mass keeps its plain centroid.
    if (dsum.mass > 0) {
      centroids[2 * s] = sx + dsum.mx / dsum.mass;
      centroids[2 * s + 1] = sy + dsum.my / dsum.mass;
    }
  }
  return { energy, centroids };
}

/**
 * measure() for cells cut to a study area: each piece's rings (outer counter-clockwise, holes clockwise) add
 * their signed fan moments about the site, so holes subtract themselves. Under a density the fan triangles of a
 * non-convex ring reach outside the piece (into the area's bounding box, within the diagram's region), where
 * their signed contributions cancel.
 */
function measurePieces(cut: StudyAreaCells, density: ((x: number, y: number) => number) | undefined): { energy: number; centroids: Float64Array } {
  const site = cut.diagram.triangulation.siteXY, n = cut.siteCount;
  const centroids = cut.clippedCentroids();
  const sum = new MomentSum(), dsum = new DensitySum();
  let energy = 0;
  for (let s = 0; s < n; s++) {
    if (Number.isNaN(centroids[2 * s])) continue;
    const sx = site[2 * s], sy = site[2 * s + 1];
    sum.reset(); dsum.reset();
    for (const piece of cut.pieces(s)) {
      for (const ring of [piece.outer, ...piece.holes]) {
        const m = ring.length >> 1;
        for (let j = 0; j < m; j++) {
          const k = j + 1 === m ? 0 : j + 1;
          sum.add(ring[2 * j] - sx, ring[2 * j + 1] - sy, ring[2 * k] - sx, ring[2 * k + 1] - sy);
          if (density && j > 0 && k > 0) {
            dsum.addTriangle(ring[0], ring[1], ring[2 * j], ring[2 * j + 1], ring[2 * k], ring[2 * k + 1], sx, sy, density, badDensity);
          }
        }
      }
    }
    // The pieces' own centroid (clippedCentroids) is kept where the fan sums cannot divide.
    if (density) {
      energy += dsum.moment;
      if (dsum.mass > 0) { centroids[2 * s] = sx + dsum.mx / dsum.mass; centroids[2 * s + 1] = sy + dsum.my / dsum.mass; }
    } else {
      energy += sum.secondMoment;
      if (sum.a2 > 0) { centroids[2 * s] = sx + sum.mx6 / (3 * sum.a2); centroids[2 * s + 1] = sy + sum.my6 / (3 * sum.a2); }
    }
  }
  return { energy, centroids };
}

function badDensity(v: number, x: number, y: number): never {
  throw new InputError('bad-option', `density(${x}, ${y}) is ${String(v)}; it must be a finite number >= 0`, -1, 'density');
}
