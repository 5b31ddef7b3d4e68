import { InputError } from '../../core/errors.js';
import { readPoints, type PointInput } from '../../core/input.js';
import { orient } from '../../core/predicates.js';
import { SegmentGrid } from './segment-grid.js';
import { validateRings } from './validate.js';

/** One polygon with holes: its shell ring first, then its hole rings (GeoJSON Polygon coordinates). */
export type AreaPolygon = readonly PointInput[];

/**
 * A study area: one polygon with holes, an array of such polygons
 * (GeoJSON MultiPolygon coordinates), or a single ring. Rings take any
 * PointInput layout, either orientation; a closing vertex equal to the
 * first is dropped.
 */
export type StudyAreaInput = AreaPolygon | readonly AreaPolygon[] | PointInput;

/**
 * A study area that ambit refuses. `polygon` and `ring` (0 the shell,
 * 1, 2, ... the holes, in input order) name the ring; `index` is the
 * vertex, numbered as in the input ring (or -1).
 */
export class AreaInputError extends InputError {
  readonly polygon: number;
  readonly ring: number;
  constructor(code: string, message: string, polygon: number, ring: number, vertex = -1) {
    const where = polygon < 0 ? '' : ` polygon ${polygon}, ring ${ring} (${ring === 0 ? 'shell' : `hole ${ring}`})${vertex >= 0 ? `, vertex ${vertex}` : ''}:`;
    super(code, `study area:${where} ${message}`, vertex, 'area');
    this.name = 'AreaInputError';
    this.polygon = polygon;
    this.ring = ring;
  }
}

/**
 * A validated study area. All rings' vertices are in one array, each ring
 * oriented so that the area lies on its left (shells counter-clockwise,
 * holes clockwise); segment j runs from vertex j to vertex next[j].
 */
export class StudyArea {
  readonly xy: Float64Array;
  readonly next: Int32Array;
  readonly prev: Int32Array;
  /** Vertices of ring r: ringStart[r] .. ringStart[r + 1]. */
  readonly ringStart: Int32Array;
  /** The polygon and ring number (0 shell, 1.. holes) of each ring, as in the input. */
  readonly ringPolygon: Int32Array;
  readonly ringIndex: Int32Array;
  /** Each vertex's index in its input ring. */
  readonly inputVertex: Int32Array;
  readonly polygonCount: number;
  readonly grid: SegmentGrid;
  /** Shoelace area: shells minus holes. */
  readonly size: number;

  constructor(rings: { xy: Float64Array; input: Int32Array; polygon: number; ring: number }[], polygonCount: number) {
    const total = rings.reduce((s, r) => s + (r.xy.length >> 1), 0);
    this.xy = new Float64Array(2 * total);
    this.next = new Int32Array(total);
    this.prev = new Int32Array(total);
    this.inputVertex = new Int32Array(total);
    this.ringStart = new Int32Array(rings.length + 1);
    this.ringPolygon = Int32Array.from(rings, (r) => r.polygon);
    this.ringIndex = Int32Array.from(rings, (r) => r.ring);
    this.polygonCount = polygonCount;
    let at = 0;
    rings.forEach((r, ri) => {
      const m = r.xy.length >> 1;
      this.ringStart[ri] = at;
      this.xy.set(r.xy, 2 * at);
      this.inputVertex.set(r.input, at);
      for (let i = 0; i < m; i++) {
        this.next[at + i] = at + (i + 1) % m;
        this.prev[at + i] = at + (i + m - 1) % m;
      }
      at += m;
    });
    this.ringStart[rings.length] = at;
    validateRings(this);
    let size = 0;
    for (let r = 0; r < rings.length; r++) {
      if ((this.ringIndex[r] === 0) !== (this.ringTurn(r) > 0)) this.reverseRing(r);
      size += this.ringArea(r);
    }
    this.size = size;
    this.grid = new SegmentGrid(this.xy, this.next);
  }

  get ringCount(): number { return this.ringStart.length - 1; }

  /** Ring of vertex v. */
  ringOf(v: number): number {
    let lo = 0, hi = this.ringCount - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.ringStart[mid] <= v) lo = mid; else hi = mid - 1;
    }
    return lo;
  }

  error(code: string, message: string, v: number): AreaInputError {
    const r = this.ringOf(v);
    return new AreaInputError(code, message, this.ringPolygon[r], this.ringIndex[r], this.inputVertex[v]);
  }

  /** Exact orientation sign of ring r, at its smallest vertex by (x, then y), a strict corner of a simple ring. */
  private ringTurn(r: number): number {
    const xy = this.xy;
    let best = this.ringStart[r];
    for (let v = best + 1; v < this.ringStart[r + 1]; v++) {
      if (xy[2 * v] < xy[2 * best] || (xy[2 * v] === xy[2 * best] && xy[2 * v + 1] < xy[2 * best + 1])) best = v;
    }
    const a = this.prev[best], c = this.next[best];
    return orient(xy[2 * a], xy[2 * a + 1], xy[2 * best], xy[2 * best + 1], xy[2 * c], xy[2 * c + 1]);
  }

  /** Reverses a ring's vertex order in place (next/prev stay a cycle over the same slots). */
  private reverseRing(r: number): void {
    const s = this.ringStart[r], e = this.ringStart[r + 1] - 1, xy = this.xy, iv = this.inputVertex;
    for (let i = s, j = e; i < j; i++, j--) {
      for (const k of [0, 1]) { const t = xy[2 * i + k]; xy[2 * i + k] = xy[2 * j + k]; xy[2 * j + k] = t; }
      const t = iv[i]; iv[i] = iv[j]; iv[j] = t;
    }
  }

  /** Signed shoelace area of ring r, relative to its first vertex. */
  ringArea(r: number): number {
    const xy = this.xy, s = this.ringStart[r];
    const ox = xy[2 * s], oy = xy[2 * s + 1];
    let a2 = 0;
    for (let v = s; v < this.ringStart[r + 1]; v++) {
      const w = this.next[v];
      a2 += (xy[2 * v] - ox) * (xy[2 * w + 1] - oy) - (xy[2 * w] - ox) * (xy[2 * v + 1] - oy);
    }
    return a2 / 2;
  }

  /** Exactly: 1 inside the area, 0 on a ring, -1 outside. */
  locate(x: number, y: number): number { return this.grid.locate(x, y); }
}

const isNumberLike = (v: unknown): boolean => typeof v === 'number' || v === null || v === undefined || typeof v === 'string' || typeof v === 'boolean';

const isPair = (v: unknown): boolean => Array.isArray(v) && (v.length === 2 || v.length === 3) && v.every((c) => isNumberLike(c));

/** A ring: a flat array or typed array, or an array of [x, y] pairs or {x, y} objects. */
function isRing(v: unknown): boolean {
  if (ArrayBuffer.isView(v)) return true;
  if (!Array.isArray(v) || v.length === 0) return false;
  const f = v[0] as unknown;
  return isNumberLike(f) || isPair(f) || (typeof f === 'object' && !Array.isArray(f) && !ArrayBuffer.isView(f));
}

/** A polygon: rings, the first of which is not itself a point (so a ring of [x, y] pairs is not a polygon). */
const isPolygon = (v: unknown): boolean => Array.isArray(v) && v.length > 0 && isRing(v[0]) && !isPair(v[0]);

/** Reads one ring: drops a closing vertex equal to the first and consecutive repeats. */
function readRing(input: PointInput, polygon: number, ring: number): { xy: Float64Array; input: Int32Array; polygon: number; ring: number } {
  let pts: Float64Array;
  try {
    pts = readPoints(input);
  } catch (err) {
    if (err instanceof InputError) throw new AreaInputError(err.code, err.message.replace(/^point \d+: /, ''), polygon, ring, err.index);
    throw err;
  }
  const m = pts.length >> 1, keep: number[] = [];
  for (let i = 0; i < m; i++) {
    const j = keep.length ? keep[keep.length - 1] : -1;
    if (j >= 0 && pts[2 * i] === pts[2 * j] && pts[2 * i + 1] === pts[2 * j + 1]) continue;
    keep.push(i);
  }
  while (keep.length > 1 && pts[2 * keep[0]] === pts[2 * keep[keep.length - 1]] && pts[2 * keep[0] + 1] === pts[2 * keep[keep.length - 1] + 1]) keep.pop();
  if (keep.length < 3) throw new AreaInputError('area-too-few', `${keep.length} distinct vertices; a ring needs at least 3`, polygon, ring);
  const xy = new Float64Array(2 * keep.length);
  keep.forEach((i, k) => { xy[2 * k] = pts[2 * i]; xy[2 * k + 1] = pts[2 * i + 1]; });
  return { xy, input: Int32Array.from(keep), polygon, ring };
}

/**
 * Validates a study area (see StudyAreaInput): every ring has at least 3
 * distinct finite vertices, no ring touches or crosses itself or another
 * ring, every hole lies inside its shell and outside the polygon's other
 * holes, and no polygon overlaps another. Throws AreaInputError otherwise.
 */
export function readStudyArea(area: StudyAreaInput): StudyArea {
  let polygons: readonly (readonly PointInput[])[];
  if (isRing(area) && !isPolygon(area)) polygons = [[area as PointInput]];
  else if (isPolygon(area)) polygons = [area as AreaPolygon];
  else if (Array.isArray(area) && area.length > 0 && area.every((p) => isPolygon(p))) polygons = area as readonly AreaPolygon[];
  else throw new AreaInputError('bad-area', 'expected a polygon [shell, ...holes], an array of such polygons, or a ring', -1, -1);
  const rings = polygons.flatMap((poly, p) => poly.map((ring, r) => readRing(ring, p, r)));
  return new StudyArea(rings, polygons.length);
}
