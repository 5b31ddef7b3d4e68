import { InputError } from '../core/errors.js';
import { readPoints, type PointInput } from '../core/input.js';
import { orient } from '../core/predicates.js';
import { boundingBox } from '../core/bounds.js';

/** An axis-aligned rectangle. */
export interface RectRegion { minX: number; minY: number; maxX: number; maxY: number }

/** Where a diagram is clipped: a rectangle, or a convex polygon in either orientation. */
export type ClipRegion = RectRegion | PointInput;

function isRect(r: unknown): r is RectRegion {
  return r !== null && typeof r === 'object' && !Array.isArray(r) && !ArrayBuffer.isView(r) && 'minX' in (r as object);
}

const clipError = (code: string, message: string, index = -1): InputError =>
  new InputError(code, `clip region: ${message}`, index, 'clip');

/** Segments a→b and c→d cross at a point interior to both (exact). */
function properlyCross(p: Float64Array, a: number, b: number, c: number, d: number): boolean {
  const o1 = orient(p[2 * a], p[2 * a + 1], p[2 * b], p[2 * b + 1], p[2 * c], p[2 * c + 1]);
  const o2 = orient(p[2 * a], p[2 * a + 1], p[2 * b], p[2 * b + 1], p[2 * d], p[2 * d + 1]);
  const o3 = orient(p[2 * c], p[2 * c + 1], p[2 * d], p[2 * d + 1], p[2 * a], p[2 * a + 1]);
  const o4 = orient(p[2 * c], p[2 * c + 1], p[2 * d], p[2 * d + 1], p[2 * b], p[2 * b + 1]);
  return o1 * o2 < 0 && o3 * o4 < 0;
}

/** Beyond this many vertices the quadratic self-intersection search is skipped (the polygon is rejected as non-convex all the same). */
const CROSSING_SEARCH_LIMIT = 2000;

/**
 * Validates a clip region and returns it as a counter-clockwise convex
 * polygon, interleaved x, y. A closing vertex equal to the first is
 * dropped; any other repeated vertex, a self-intersecting or non-convex
 * ring, or fewer than 3 distinct vertices is an InputError (field 'clip',
 * index = the offending vertex).
 */
export function readClipRegion(region: ClipRegion): Float64Array {
  if (isRect(region)) {
    const { minX, minY, maxX, maxY } = region;
    for (const [name, v] of [['minX', minX], ['minY', minY], ['maxX', maxX], ['maxY', maxY]] as const) {
      if (typeof v !== 'number' || !Number.isFinite(v)) throw clipError(typeof v === 'number' ? 'not-finite' : 'not-a-number', `${name} is ${v}; rectangle bounds must be finite numbers`);
    }
    const poly = readPoints([minX, minY, maxX, minY, maxX, maxY, minX, maxY]);
    if (!(minX < maxX) || !(minY < maxY)) {
      throw clipError('clip-degenerate', `rectangle [${minX}, ${maxX}] × [${minY}, ${maxY}] is empty; need minX < maxX and minY < maxY`);
    }
    checkWidth(poly, 4);
    return poly;
  }
  let pts: Float64Array;
  try {
    pts = readPoints(region as PointInput);
  } catch (err) {
    if (err instanceof InputError) throw clipError(err.code, err.message.replace(/^point/, 'vertex'), err.index);
    throw err;
  }
  let m = pts.length >> 1;
  if (m > 1 && pts[0] === pts[2 * m - 2] && pts[1] === pts[2 * m - 1]) m--;
  pts = pts.slice(0, 2 * m);
  if (m < 3) throw clipError('clip-too-few', `${m} distinct vertices; a polygon needs at least 3`);
  for (let i = 0; i < m; i++) {
    const j = (i + 1) % m;
    if (pts[2 * i] === pts[2 * j] && pts[2 * i + 1] === pts[2 * j + 1]) {
      throw clipError('clip-repeated', `vertex ${j} repeats vertex ${i}`, j);
    }
  }
  let turns = false;
  for (let i = 2; i < m && !turns; i++) turns = orient(pts[0], pts[1], pts[2], pts[3], pts[2 * i], pts[2 * i + 1]) !== 0;
  if (!turns) throw clipError('clip-degenerate', 'all vertices lie on one line; the polygon has no area');
  let left = 0, right = 0, firstLeft = -1, firstRight = -1;
  let turning = 0;
  for (let i = 0; i < m; i++) {
    const a = (i + m - 1) % m, c = (i + 1) % m;
    const o = orient(pts[2 * a], pts[2 * a + 1], pts[2 * i], pts[2 * i + 1], pts[2 * c], pts[2 * c + 1]);
    const ux = pts[2 * i] - pts[2 * a], uy = pts[2 * i + 1] - pts[2 * a + 1];
    const vx = pts[2 * c] - pts[2 * i], vy = pts[2 * c + 1] - pts[2 * i + 1];
    if (o === 0 && ux * vx + uy * vy < 0) throw clipError('clip-self-intersecting', `the ring doubles back at vertex ${i}`, i);
    if (o > 0) { left++; if (firstLeft < 0) firstLeft = i; }
    if (o < 0) { right++; if (firstRight < 0) firstRight = i; }
    turning += Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  }
  if (left > 0 && right > 0) {
    if (m <= CROSSING_SEARCH_LIMIT) {
      for (let i = 0; i < m; i++) {
        for (let j = i + 2; j < m; j++) {
          if (i === 0 && j === m - 1) continue;
          if (properlyCross(pts, i, i + 1, j, (j + 1) % m)) {
            throw clipError('clip-self-intersecting', `edges ${i}–${i + 1} and ${j}–${(j + 1) % m} cross`, j);
          }
        }
      }
    }
    const reflex = left >= right ? firstRight : firstLeft;
    throw clipError('clip-not-convex', `the polygon is not convex (vertex ${reflex} turns the other way); only convex regions are supported here`, reflex);
  }
  // All turns one way: convex if it winds once, a star polygon if more.
  if (Math.abs(turning) > 3 * Math.PI) throw clipError('clip-self-intersecting', 'the ring winds around more than once');
  checkWidth(pts, m);
  if (right > 0) {
    const ccw = new Float64Array(2 * m);
    for (let i = 0; i < m; i++) {
      ccw[2 * i] = pts[2 * (m - 1 - i)];
      ccw[2 * i + 1] = pts[2 * (m - 1 - i) + 1];
    }
    return ccw;
  }
  return pts;
}

/**
 * A region narrower than this many units in the last place of its
 * coordinates cannot be clipped to meaningfully in double precision: points
 * within a few ulps of a side count as on it (see SNAP_ULPS in clip.ts).
 */
const MIN_WIDTH_ULPS = 64;

/** Rejects a convex polygon thinner, somewhere, than MIN_WIDTH_ULPS of its coordinates. */
function checkWidth(pts: Float64Array, m: number): void {
  let magnitude = 0;
  for (let i = 0; i < 2 * m; i++) magnitude = Math.max(magnitude, Math.abs(pts[i]));
  for (let j = 0; j < m; j++) {
    const k = (j + 1) % m;
    const ex = pts[2 * k] - pts[2 * j], ey = pts[2 * k + 1] - pts[2 * j + 1], el = Math.hypot(ex, ey);
    let far = 0;
    for (let i = 0; i < m; i++) far = Math.max(far, Math.abs(ex * (pts[2 * i + 1] - pts[2 * j + 1]) - ey * (pts[2 * i] - pts[2 * j])) / el);
    if (far < MIN_WIDTH_ULPS * Number.EPSILON * Math.max(magnitude, far)) {
      throw clipError('clip-degenerate', `the polygon is only ${far} wide across side ${j}, too thin to clip to in double precision at coordinates of ${magnitude}`, j);
    }
  }
}

/** The default region: the sites' bounding box padded by 10% of its larger side (1 when that side is 0). */
export function paddedBounds(xy: Float64Array, count: number): Float64Array {
  const { minX, minY, maxX, maxY } = boundingBox(xy, count);
  const side = Math.max(maxX - minX, maxY - minY);
  const pad = side > 0 ? 0.1 * side : 1;
  return Float64Array.of(minX - pad, minY - pad, maxX + pad, minY - pad, maxX + pad, maxY + pad, minX - pad, maxY + pad);
}
