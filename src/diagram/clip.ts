import { orient } from '../core/predicates.js';

/** How many units in the last place of the region's coordinates count as "on" a side. */
export const SNAP_ULPS = 4;

/**
 * A convex clip polygon, counter-clockwise, with the side functions every
 * clipping decision uses. Each decision about a point is made from the
 * same floating-point values wherever it is asked, so a Voronoi vertex and
 * the edges that end at it always agree on whether it is inside.
 */
export class ConvexRegion {
  readonly xy: Float64Array;
  readonly count: number;
  /** Centre (vertex mean) and a radius: every region point is within `radius` of the centre. */
  readonly cx: number;
  readonly cy: number;
  readonly radius: number;
  /** The larger side of the bounding box: the unit of every tolerance. */
  readonly size: number;

  constructor(polygon: Float64Array) {
    const xy = (this.xy = withoutStraightCorners(polygon));
    const m = (this.count = xy.length >> 1);
    let sx = 0, sy = 0;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (let i = 0; i < m; i++) {
      sx += xy[2 * i];
      sy += xy[2 * i + 1];
      minX = Math.min(minX, xy[2 * i]); maxX = Math.max(maxX, xy[2 * i]);
      minY = Math.min(minY, xy[2 * i + 1]); maxY = Math.max(maxY, xy[2 * i + 1]);
    }
    this.cx = sx / m;
    this.cy = sy / m;
    let r = 0;
    for (let i = 0; i < m; i++) r = Math.max(r, Math.hypot(xy[2 * i] - this.cx, xy[2 * i + 1] - this.cy));
    this.radius = r;
    this.size = Math.max(maxX - minX, maxY - minY);
    let magnitude = this.size;
    for (let i = 0; i < 2 * m; i++) magnitude = Math.max(magnitude, Math.abs(xy[i]));
    this.snap = new Float64Array(m);
    for (let j = 0; j < m; j++) this.snap[j] = SNAP_ULPS * Number.EPSILON * magnitude * this.sideLength(j);
  }

  /** Per side: |side value| up to which a point counts as on the side's line. */
  private readonly snap: Float64Array;

  /**
   * Positive left of side j (inside), zero on its line: cross(side direction,
   * p − side start). Points closer to the line than rounding can tell (a
   * few units in the last place of the region's coordinates) count as on it,
   * so that a Voronoi vertex computed a hair off the boundary is treated as
   * on it, the same way by every decision.
   */
  side(j: number, x: number, y: number): number {
    const xy = this.xy, k = j + 1 === this.count ? 0 : j + 1;
    const ax = xy[2 * j], ay = xy[2 * j + 1];
    const f = (xy[2 * k] - ax) * (y - ay) - (xy[2 * k + 1] - ay) * (x - ax);
    return Math.abs(f) <= this.snap[j] ? 0 : f;
  }

  /** Where p lies along side j: 0 at its start, 1 at its end. */
  along(j: number, x: number, y: number): number {
    const xy = this.xy, k = j + 1 === this.count ? 0 : j + 1;
    const ax = xy[2 * j], ay = xy[2 * j + 1];
    const dx = xy[2 * k] - ax, dy = xy[2 * k + 1] - ay;
    return ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy);
  }

  /** Length of side j. */
  sideLength(j: number): number {
    const xy = this.xy, k = j + 1 === this.count ? 0 : j + 1;
    return Math.hypot(xy[2 * k] - xy[2 * j], xy[2 * k + 1] - xy[2 * j + 1]);
  }

  /** Length of the boundary. */
  perimeter(): number {
    let s = 0;
    for (let j = 0; j < this.count; j++) s += this.sideLength(j);
    return s;
  }

  /** Area by the shoelace formula, relative to the first vertex. */
  area(): number {
    const xy = this.xy, m = this.count;
    let s = 0;
    for (let i = 1; i + 1 < m; i++) {
      s += (xy[2 * i] - xy[0]) * (xy[2 * i + 3] - xy[1]) - (xy[2 * i + 2] - xy[0]) * (xy[2 * i + 1] - xy[1]);
    }
    return s / 2;
  }

  // Results of clipSegment.
  tIn = 0;
  tOut = 1;
  sideIn = -1;
  sideOut = -1;

  /**
   * Cyrus–Beck: the part [tIn, tOut] of the segment s→e inside the region;
   * false when nothing of positive length is. A segment lying on a side's
   * line counts as outside, so that no cell gets a sliver of zero width.
   */
  clipSegment(sx: number, sy: number, ex: number, ey: number): boolean {
    let tIn = 0, tOut = 1, sideIn = -1, sideOut = -1;
    for (let j = 0; j < this.count; j++) {
      const fs = this.side(j, sx, sy), fe = this.side(j, ex, ey);
      if (fs < 0 && fe < 0) return false;
      if (fs === 0 && fe === 0) return false;
      if (fs >= 0 && fe >= 0) continue;
      const t = fs / (fs - fe);
      // An end outside any side always gets a crossing, even if t rounds to 0 or 1:
      // sideIn < 0 must mean "s itself is inside", as the vertex test says.
      if (fs < 0) {
        if (t > tIn || sideIn < 0) { tIn = t; sideIn = j; }
      } else if (t < tOut || sideOut < 0) { tOut = t; sideOut = j; }
    }
    if (tIn >= tOut) return false;
    this.tIn = tIn; this.tOut = tOut; this.sideIn = sideIn; this.sideOut = sideOut;
    return true;
  }
}

/**
 * The polygon without its vertices where the boundary runs straight on
 * (exactly collinear with both neighbours). Such a vertex would split one
 * side into two on the same line, and a crossing of that line near it could
 * be filed under either half, out of order along the boundary.
 */
function withoutStraightCorners(xy: Float64Array): Float64Array {
  const m = xy.length >> 1, keep: number[] = [];
  for (let i = 0; i < m; i++) {
    const a = i === 0 ? m - 1 : i - 1, c = i + 1 === m ? 0 : i + 1;
    if (orient(xy[2 * a], xy[2 * a + 1], xy[2 * i], xy[2 * i + 1], xy[2 * c], xy[2 * c + 1]) !== 0) keep.push(i);
  }
  if (keep.length === m) return xy;
  const out = new Float64Array(2 * keep.length);
  keep.forEach((i, k) => { out[2 * k] = xy[2 * i]; out[2 * k + 1] = xy[2 * i + 1]; });
  return out;
}
