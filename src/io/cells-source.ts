import { InputError } from '../core/errors.js';
import { ClippedCells } from '../diagram/cells.js';

/**
 * One connected piece of a cell: its outer ring and any holes, each
 * interleaved x, y, without a closing vertex, in either orientation
 * (writers orient them).
 */
export interface CellPiece { outer: ArrayLike<number>; holes?: ReadonlyArray<ArrayLike<number>> }

/** Cells given as pieces: entry s holds the pieces of site s's cell (empty: no cell). */
export type CellPieceList = ReadonlyArray<ReadonlyArray<CellPiece>>;

/** What the writers accept: a diagram (one piece per cell, no holes) or a piece list. */
export type CellSource = ClippedCells | CellPieceList;

/** Per-site measures the writers report. */
export interface CellMeasures {
  count: number;
  area: Float64Array;
  perimeter: Float64Array;
  centroid: Float64Array;
  /** Neighbouring cells per site; null for piece lists (their adjacency is not known). */
  neighbors: Int32Array | null;
  /** Site weights of a power diagram, else null. */
  weights: Float64Array | null;
}

/** Twice the signed area of a ring (positive when counter-clockwise, y up), relative to its first vertex. */
export function ringArea2(r: ArrayLike<number>): number {
  const m = r.length >> 1, ox = r[0], oy = r[1];
  let a2 = 0;
  for (let i = 1; i + 1 < m; i++) {
    a2 += (r[2 * i] - ox) * (r[2 * i + 3] - oy) - (r[2 * i + 2] - ox) * (r[2 * i + 1] - oy);
  }
  return a2;
}

function ringLength(r: ArrayLike<number>): number {
  const m = r.length >> 1;
  let len = 0;
  for (let i = 0; i < m; i++) {
    const j = i + 1 === m ? 0 : i + 1;
    len += Math.hypot(r[2 * j] - r[2 * i], r[2 * j + 1] - r[2 * i + 1]);
  }
  return len;
}

/** Area-weighted centroid sums of a ring relative to (ox, oy): [Σ(x0+x1)c, Σ(y0+y1)c, Σc]. */
function ringMoments(r: ArrayLike<number>, ox: number, oy: number, acc: Float64Array): void {
  const m = r.length >> 1;
  for (let i = 0; i < m; i++) {
    const j = i + 1 === m ? 0 : i + 1;
    const x0 = r[2 * i] - ox, y0 = r[2 * i + 1] - oy, x1 = r[2 * j] - ox, y1 = r[2 * j + 1] - oy;
    const c = x0 * y1 - x1 * y0;
    acc[0] += (x0 + x1) * c; acc[1] += (y0 + y1) * c; acc[2] += c;
  }
}

/** Checks a piece list's shape: rings of at least 3 finite vertices. */
export function checkPieceList(list: CellPieceList): void {
  if (!Array.isArray(list)) throw new InputError('bad-option', 'cells must be a diagram or an array of piece lists, one per site', -1, 'cells');
  const ring = (r: ArrayLike<number>, s: number, what: string): void => {
    if (r === null || typeof r !== 'object' || typeof r.length !== 'number' || r.length % 2 !== 0 || r.length < 6) {
      throw new InputError('bad-option', `cell ${s}: ${what} must be an interleaved ring of at least 3 vertices`, s, 'cells');
    }
    for (let i = 0; i < r.length; i++) {
      if (typeof r[i] !== 'number' || !Number.isFinite(r[i])) throw new InputError('not-finite', `cell ${s}: ${what} has a coordinate ${String(r[i])}`, s, 'cells');
    }
  };
  list.forEach((pieces, s) => {
    if (!Array.isArray(pieces)) throw new InputError('bad-option', `cell ${s}: expected an array of pieces`, s, 'cells');
    for (const p of pieces) {
      ring(p.outer, s, 'an outer ring');
      for (const h of p.holes ?? []) ring(h, s, 'a hole');
    }
  });
}

/** Measures of a piece list: area (outer minus holes), all ring lengths, centroid of the whole cell. */
function pieceMeasures(list: CellPieceList): CellMeasures {
  const n = list.length, area = new Float64Array(n), perimeter = new Float64Array(n);
  const centroid = new Float64Array(2 * n).fill(NaN), acc = new Float64Array(3);
  for (let s = 0; s < n; s++) {
    const pieces = list[s];
    if (pieces.length === 0) continue;
    const ox = pieces[0].outer[0], oy = pieces[0].outer[1];
    acc.fill(0);
    let a = 0, per = 0;
    for (const p of pieces) {
      // Outer rings count positive and holes negative whatever their given orientation.
      const sign = ringArea2(p.outer) < 0 ? -1 : 1;
      const before = acc.slice();
      ringMoments(p.outer, ox, oy, acc);
      if (sign < 0) for (let k = 0; k < 3; k++) acc[k] = 2 * before[k] - acc[k];
      a += Math.abs(ringArea2(p.outer)) / 2;
      per += ringLength(p.outer);
      for (const h of p.holes ?? []) {
        const hs = ringArea2(h) > 0 ? -1 : 1;
        const b2 = acc.slice();
        ringMoments(h, ox, oy, acc);
        if (hs < 0) for (let k = 0; k < 3; k++) acc[k] = 2 * b2[k] - acc[k];
        a -= Math.abs(ringArea2(h)) / 2;
        per += ringLength(h);
      }
    }
    area[s] = a;
    perimeter[s] = per;
    if (acc[2] !== 0) {
      centroid[2 * s] = ox + acc[0] / (3 * acc[2]);
      centroid[2 * s + 1] = oy + acc[1] / (3 * acc[2]);
    }
  }
  return { count: n, area, perimeter, centroid, neighbors: null, weights: null };
}

export function measuresOf(source: CellSource): CellMeasures {
  if (source instanceof ClippedCells) {
    return {
      count: source.triangulation.siteCount,
      area: source.cellAreas(),
      perimeter: source.cellPerimeters(),
      centroid: source.cellCentroids(),
      neighbors: source.neighborCounts(),
      weights: source.triangulation.weights,
    };
  }
  checkPieceList(source);
  return pieceMeasures(source);
}
