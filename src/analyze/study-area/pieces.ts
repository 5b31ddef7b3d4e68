import { orient } from '../../core/predicates.js';

/** One connected piece of a cell inside the study area. */
export interface StudyAreaPiece {
  /** Outer ring, counter-clockwise, interleaved x, y. */
  outer: Float64Array;
  /** Hole rings, clockwise. */
  holes: Float64Array[];
  /** Area: the outer ring's minus the holes'. */
  area: number;
  /** Area centroid. */
  centroidX: number;
  centroidY: number;
}

/** Twice the signed area and the first moments (times 6) of a ring, relative to (ox, oy). */
function ringMoments(r: Float64Array, ox: number, oy: number): [number, number, number] {
  const m = r.length >> 1;
  let a2 = 0, mx = 0, my = 0;
  for (let i = 0, h = m - 1; i < m; h = i++) {
    const x0 = r[2 * h] - ox, y0 = r[2 * h + 1] - oy, x1 = r[2 * i] - ox, y1 = r[2 * i + 1] - oy;
    const cross = x0 * y1 - x1 * y0;
    a2 += cross;
    mx += (x0 + x1) * cross;
    my += (y0 + y1) * cross;
  }
  return [a2, mx, my];
}

/** 1 strictly inside ring r, 0 on it, -1 outside (exact). */
function locateInRing(r: Float64Array, x: number, y: number): number {
  const m = r.length >> 1;
  let inside = false;
  for (let i = 0, h = m - 1; i < m; h = i++) {
    const ax = r[2 * h], ay = r[2 * h + 1], bx = r[2 * i], by = r[2 * i + 1];
    const o = orient(ax, ay, bx, by, x, y);
    if (o === 0 && x >= Math.min(ax, bx) && x <= Math.max(ax, bx) && y >= Math.min(ay, by) && y <= Math.max(ay, by)) return 0;
    if ((ay > y) !== (by > y) && (by > ay ? o > 0 : o < 0)) inside = !inside;
  }
  return inside ? 1 : -1;
}

/**
 * Groups a cell's clipped rings into pieces: each counter-clockwise ring is
 * an outer boundary, each clockwise ring a hole of the outer ring that
 * holds it, the innermost one (tested at a hole vertex strictly inside;
 * holes are never ambiguous when the cell came out in one piece).
 */
export function assemblePieces(rings: Float64Array[]): StudyAreaPiece[] {
  if (rings.length === 0) return [];
  const ox = rings[0][0], oy = rings[0][1];
  if (rings.length === 1) {
    // The common case, a cell wholly inside or cut by the rings into one simple piece.
    const [a2, mx, my] = ringMoments(rings[0], ox, oy);
    return a2 > 0 ? [{ outer: rings[0], holes: [], area: a2 / 2, centroidX: ox + mx / (3 * a2), centroidY: oy + my / (3 * a2) }] : [];
  }
  const outers: { ring: Float64Array; holes: Float64Array[]; m: [number, number, number]; size: number }[] = [];
  const holes: { ring: Float64Array; m: [number, number, number] }[] = [];
  for (const ring of rings) {
    const m = ringMoments(ring, ox, oy);
    if (m[0] > 0) outers.push({ ring, holes: [], m, size: m[0] });
    else if (m[0] < 0) holes.push({ ring, m });
  }
  if (outers.length === 0) return [];
  for (const h of holes) {
    let owner = outers.length === 1 ? outers[0] : null;
    for (let v = 0; !owner && v < h.ring.length; v += 2) {
      // The innermost outer ring holding the vertex: an island in a lake can have a lake of its own.
      for (const o of outers) {
        if ((!owner || o.size < owner.size) && locateInRing(o.ring, h.ring[v], h.ring[v + 1]) > 0) owner = o;
      }
    }
    owner ??= outers[0];
    owner.holes.push(h.ring);
    for (let i = 0; i < 3; i++) owner.m[i] += h.m[i];
  }
  return outers.map((o) => {
    const [a2, mx, my] = o.m;
    return { outer: o.ring, holes: o.holes, area: a2 / 2, centroidX: ox + mx / (3 * a2), centroidY: oy + my / (3 * a2) };
  });
}
