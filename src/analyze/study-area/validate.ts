import { orient } from '../../core/predicates.js';
import type { StudyArea } from './area-input.js';
import { onSegment, SegmentGrid } from './segment-grid.js';

/** Whether the closed segments a–b and c–d share a point (exact). */
function segmentsMeet(xy: Float64Array, a: number, b: number, c: number, d: number): boolean {
  const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1];
  const cx = xy[2 * c], cy = xy[2 * c + 1], dx = xy[2 * d], dy = xy[2 * d + 1];
  const o1 = orient(ax, ay, bx, by, cx, cy), o2 = orient(ax, ay, bx, by, dx, dy);
  if ((o1 > 0 && o2 > 0) || (o1 < 0 && o2 < 0)) return false;
  const o3 = orient(cx, cy, dx, dy, ax, ay), o4 = orient(cx, cy, dx, dy, bx, by);
  if ((o3 > 0 && o4 > 0) || (o3 < 0 && o4 < 0)) return false;
  if (o1 !== 0 || o2 !== 0 || o3 !== 0 || o4 !== 0) return true;
  // Collinear: the closed boxes overlap exactly when the segments do.
  return Math.max(Math.min(ax, bx), Math.min(cx, dx)) <= Math.min(Math.max(ax, bx), Math.max(cx, dx)) &&
    Math.max(Math.min(ay, by), Math.min(cy, dy)) <= Math.min(Math.max(ay, by), Math.max(cy, dy));
}

/** The vertex to name where segments a–b and c–d meet: an end of c–d on a–b, else an end of a–b on c–d, else c. */
function touchingVertex(xy: Float64Array, a: number, b: number, c: number, d: number): number {
  const on = (v: number, p: number, q: number): boolean => onSegment(xy[2 * p], xy[2 * p + 1], xy[2 * q], xy[2 * q + 1], xy[2 * v], xy[2 * v + 1]);
  for (const [v, p, q] of [[c, a, b], [d, a, b], [a, c, d], [b, c, d]]) if (on(v, p, q)) return v;
  return c;
}

/** Segments j→next[j] and next[j]→next[next[j]] overlap beyond their shared vertex (the ring doubles back). */
function foldsBack(xy: Float64Array, a: number, b: number, c: number): boolean {
  if (orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1]) !== 0) return false;
  return (xy[2 * a] - xy[2 * b]) * (xy[2 * c] - xy[2 * b]) + (xy[2 * a + 1] - xy[2 * b + 1]) * (xy[2 * c + 1] - xy[2 * b + 1]) > 0;
}

/** Crossing parity of (x, y) against ring r; the point must not lie on it. */
function insideRing(area: StudyArea, r: number, x: number, y: number): boolean {
  const xy = area.xy;
  let inside = false;
  for (let j = area.ringStart[r]; j < area.ringStart[r + 1]; j++) {
    const k = area.next[j], ay = xy[2 * j + 1], by = xy[2 * k + 1];
    if ((ay > y) === (by > y)) continue;
    const o = orient(xy[2 * j], ay, xy[2 * k], by, x, y);
    if (by > ay ? o > 0 : o < 0) inside = !inside;
  }
  return inside;
}

/**
 * Throws AreaInputError unless every ring is simple, no two rings share a
 * point, every hole lies inside its shell and outside its polygon's other
 * holes, and no polygon overlaps another. Once no rings meet, one vertex
 * decides each containment question exactly.
 */
export function validateRings(area: StudyArea): void {
  const xy = area.xy, next = area.next, m = next.length, iv = area.inputVertex;
  const grid = new SegmentGrid(xy, next), found = new Int32Array(m);
  const edge = (j: number): string => `${iv[j]}–${iv[next[j]]}`;
  for (let j = 0; j < m; j++) {
    const b = next[j];
    if (foldsBack(xy, j, b, next[b])) throw area.error('area-self-intersecting', `the ring doubles back at vertex ${iv[b]}`, b);
    const n = grid.query(Math.min(xy[2 * j], xy[2 * b]), Math.min(xy[2 * j + 1], xy[2 * b + 1]),
      Math.max(xy[2 * j], xy[2 * b]), Math.max(xy[2 * j + 1], xy[2 * b + 1]), found);
    found.subarray(0, n).sort();
    for (let i = 0; i < n; i++) {
      const k = found[i];
      if (k <= j || k === b || next[k] === j) continue;
      if (!segmentsMeet(xy, j, b, k, next[k])) continue;
      const rj = area.ringOf(j), rk = area.ringOf(k), at = touchingVertex(xy, j, b, k, next[k]);
      if (rj === rk) throw area.error('area-self-intersecting', `edges ${edge(j)} and ${edge(k)} cross or touch`, at);
      const where = (r: number, e: number): string => `edge ${edge(e)} of polygon ${area.ringPolygon[r]}, ring ${area.ringIndex[r]}`;
      throw area.error('area-rings-cross', `${where(rj, j)} and ${where(rk, k)} cross or touch`, at);
    }
  }
  const rings = area.ringCount;
  const shellOf = new Int32Array(area.polygonCount);
  for (let r = 0; r < rings; r++) if (area.ringIndex[r] === 0) shellOf[area.ringPolygon[r]] = r;
  const holesOf = (p: number): number[] => {
    const out: number[] = [];
    for (let r = 0; r < rings; r++) if (area.ringPolygon[r] === p && area.ringIndex[r] > 0) out.push(r);
    return out;
  };
  for (let r = 0; r < rings; r++) {
    if (area.ringIndex[r] === 0) continue;
    const p = area.ringPolygon[r], v = area.ringStart[r], x = xy[2 * v], y = xy[2 * v + 1];
    if (!insideRing(area, shellOf[p], x, y)) throw area.error('area-hole-outside', 'the hole is not inside its shell', v);
    for (const h of holesOf(p)) {
      if (h !== r && insideRing(area, h, x, y)) throw area.error('area-hole-outside', `the hole lies inside hole ${area.ringIndex[h]} of its polygon`, v);
    }
  }
  for (let p = 0; p < area.polygonCount; p++) {
    const v = area.ringStart[shellOf[p]], x = xy[2 * v], y = xy[2 * v + 1];
    for (let q = 0; q < area.polygonCount; q++) {
      if (q === p || !insideRing(area, shellOf[q], x, y)) continue;
      if (holesOf(q).some((h) => insideRing(area, h, x, y))) continue;
      throw area.error('area-overlap', `the shell lies inside polygon ${q}`, v);
    }
  }
}
