/**
 * Independent oracles for the Voronoi tests. Nothing here uses ambit's
 * diagram code: nearest sites come from exact distance comparisons on the
 * raw coordinates, dual edges from the triangulation's topology and the
 * bisector of each Delaunay edge, polygon measures from the shoelace formula.
 */

// ---------------------------------------------------------------------------
// Exact arithmetic on doubles. Every finite double is m * 2^e with an integer
// m of at most 53 bits; scaling a handful of them to their smallest exponent
// gives BigInts whose sums and products are exact.

const f64 = new Float64Array(1);
const u64 = new BigUint64Array(f64.buffer);

function decompose(x: number): { m: bigint; e: number } {
  if (x === 0) return { m: 0n, e: 0 };
  f64[0] = x;
  const bits = u64[0];
  const negative = bits >> 63n === 1n;
  const expBits = Number((bits >> 52n) & 0x7ffn);
  const frac = bits & ((1n << 52n) - 1n);
  const m = expBits === 0 ? frac : frac | (1n << 52n);
  const e = expBits === 0 ? -1074 : expBits - 1075;
  return { m: negative ? -m : m, e };
}

/** The doubles xs, all multiplied by the same power of two so that every one is an exact BigInt. */
export function toScaledIntegers(xs: readonly number[]): bigint[] {
  const parts = xs.map(decompose);
  let emin = Infinity;
  for (const p of parts) if (p.m !== 0n && p.e < emin) emin = p.e;
  if (emin === Infinity) return parts.map(() => 0n);
  return parts.map((p) => (p.m === 0n ? 0n : p.m << BigInt(p.e - emin)));
}

function sign(v: bigint): number {
  return v > 0n ? 1 : v < 0n ? -1 : 0;
}

/** Exact sign of |p - a|^2 - |p - b|^2. */
export function compareDistanceExact(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const [PX, PY, AX, AY, BX, BY] = toScaledIntegers([px, py, ax, ay, bx, by]);
  const da = (PX - AX) * (PX - AX) + (PY - AY) * (PY - AY);
  const db = (PX - BX) * (PX - BX) + (PY - BY) * (PY - BY);
  return sign(da - db);
}

/**
 * Sign of |p - a|^2 - |p - b|^2, exact: a floating-point filter decides when
 * the difference is far above its rounding error, BigInts decide the rest.
 * Each squared distance is computed with relative error below 3 * 2^-53
 * (two subtractions, two squares, one sum), so a gap above 1e-14 of the sum
 * cannot be a rounding artefact. Tiny sums go exact to stay clear of underflow.
 */
export function compareDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dax = px - ax, day = py - ay, dbx = px - bx, dby = py - by;
  const da = dax * dax + day * day;
  const db = dbx * dbx + dby * dby;
  const sum = da + db;
  if (Number.isFinite(sum) && sum > 1e-280) {
    const diff = da - db;
    const bound = 1e-14 * sum;
    if (diff > bound) return 1;
    if (diff < -bound) return -1;
  }
  return compareDistanceExact(px, py, ax, ay, bx, by);
}

/** The nearest site to (px, py) by exact distance; ties go to the smallest index. */
export function nearestSiteExact(xy: ArrayLike<number>, px: number, py: number): number {
  const n = xy.length >> 1;
  let best = 0;
  for (let s = 1; s < n; s++) {
    // Strictly closer only: an exact tie keeps the earlier (smaller) index.
    if (compareDistance(px, py, xy[2 * s], xy[2 * s + 1], xy[2 * best], xy[2 * best + 1]) < 0) best = s;
  }
  return best;
}

/** All sites sorted by (exact distance to p, index). */
export function sitesByDistanceExact(xy: ArrayLike<number>, px: number, py: number): number[] {
  const n = xy.length >> 1;
  const order = Array.from({ length: n }, (_, i) => i);
  return order.sort((a, b) => compareDistance(px, py, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1]) || a - b);
}

/** Exact orientation sign of (a, b, c) in BigInts: > 0 counter-clockwise (y-up). */
export function orientExact(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const [AX, AY, BX, BY, CX, CY] = toScaledIntegers([ax, ay, bx, by, cx, cy]);
  return sign((BX - AX) * (CY - AY) - (BY - AY) * (CX - AX));
}

// ---------------------------------------------------------------------------
// Polygons, interleaved x, y.

/** Signed shoelace area (positive counter-clockwise), relative to the first vertex to limit cancellation. */
export function polygonArea(p: ArrayLike<number>): number {
  const n = p.length >> 1;
  if (n < 3) return 0;
  const x0 = p[0], y0 = p[1];
  let s = 0;
  for (let i = 1; i + 1 < n; i++) {
    s += (p[2 * i] - x0) * (p[2 * i + 3] - y0) - (p[2 * i + 2] - x0) * (p[2 * i + 1] - y0);
  }
  return s / 2;
}

export function polygonPerimeter(p: ArrayLike<number>): number {
  const n = p.length >> 1;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    s += Math.hypot(p[2 * j] - p[2 * i], p[2 * j + 1] - p[2 * i + 1]);
  }
  return s;
}

/** Area centroid of a simple polygon (fan from the first vertex). */
export function polygonCentroid(p: ArrayLike<number>): [number, number] {
  const n = p.length >> 1;
  const x0 = p[0], y0 = p[1];
  let a = 0, cx = 0, cy = 0;
  for (let i = 1; i + 1 < n; i++) {
    const ux = p[2 * i] - x0, uy = p[2 * i + 1] - y0, vx = p[2 * i + 2] - x0, vy = p[2 * i + 3] - y0;
    const w = ux * vy - uy * vx;
    a += w;
    cx += w * (ux + vx);
    cy += w * (uy + vy);
  }
  return [x0 + cx / (3 * a), y0 + cy / (3 * a)];
}

export interface Box { minX: number; minY: number; maxX: number; maxY: number }

export function boundingBox(p: ArrayLike<number>): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i + 1 < p.length; i += 2) {
    minX = Math.min(minX, p[i]); maxX = Math.max(maxX, p[i]);
    minY = Math.min(minY, p[i + 1]); maxY = Math.max(maxY, p[i + 1]);
  }
  return { minX, minY, maxX, maxY };
}

/**
 * The smallest signed distance from (x, y) to the lines of a counter-clockwise
 * convex polygon's edges: positive inside, negative outside, near zero on the
 * boundary. Edges not longer than minEdge are ignored: the line through a
 * rounding-sized edge has an arbitrary direction and would cut the polygon.
 */
export function convexDepth(poly: ArrayLike<number>, x: number, y: number, minEdge = 0): number {
  const n = poly.length >> 1;
  // A convex polygon lies in its bounding box, so the box's signed distance
  // bounds the depth from above; it keeps a polygon whose edges are all
  // skipped (a rounding-sized cell) from containing the whole plane.
  const b = boundingBox(poly);
  let depth = Math.min(x - b.minX, b.maxX - x, y - b.minY, b.maxY - y);
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const ax = poly[2 * i], ay = poly[2 * i + 1];
    const ex = poly[2 * j] - ax, ey = poly[2 * j + 1] - ay;
    const len = Math.hypot(ex, ey);
    if (len <= minEdge) continue;
    const d = (ex * (y - ay) - ey * (x - ax)) / len;
    if (d < depth) depth = d;
  }
  return depth;
}

/**
 * Cyrus–Beck clipping (M. Cyrus and J. Beck, "Generalized two- and
 * three-dimensional clipping", Computers & Graphics 3, 1978), written here
 * from the method: the part of the line p + t d, t in [t0, t1] (either may be
 * infinite), inside a counter-clockwise convex polygon. Returns the clipped
 * parameter range, empty when t0 >= t1.
 */
export function clipLine(
  poly: ArrayLike<number>, px: number, py: number, dx: number, dy: number, t0: number, t1: number,
): [number, number] {
  const n = poly.length >> 1;
  let lo = t0, hi = t1;
  for (let i = 0; i < n && lo < hi; i++) {
    const j = (i + 1) % n;
    const ax = poly[2 * i], ay = poly[2 * i + 1];
    // Inward normal of a counter-clockwise edge: the edge direction turned left.
    const nx = -(poly[2 * j + 1] - ay), ny = poly[2 * j] - ax;
    const num = nx * (px - ax) + ny * (py - ay);
    const den = nx * dx + ny * dy;
    if (den === 0) {
      if (num < 0) return [0, 0];
      continue;
    }
    const t = -num / den;
    if (den > 0) lo = Math.max(lo, t);
    else hi = Math.min(hi, t);
  }
  return [lo, hi];
}

/** Length of the part of the segment or ray p + t d, t in [t0, t1], inside the convex polygon. */
export function clippedLength(
  poly: ArrayLike<number>, px: number, py: number, dx: number, dy: number, t0: number, t1: number,
): number {
  const [lo, hi] = clipLine(poly, px, py, dx, dy, t0, t1);
  return hi > lo ? (hi - lo) * Math.hypot(dx, dy) : 0;
}

// ---------------------------------------------------------------------------
// Dual edges of a Delaunay triangulation.

/**
 * Where the circumcentre of (a, b, c) lies on the bisector of a and b,
 * written m + t n with m the midpoint of ab and n = (b - a) turned left:
 * t = ((c - a) . (c - b)) / (2 cross(b - a, c - a)). Along the exact bisector
 * only the position t is rounded, so the dual edge keeps its direction even
 * for slivers. The cross product falls back to BigInts when it is small
 * against its terms (cancellation).
 */
export function bisectorParameter(
  ax: number, ay: number, bx: number, by: number, cx: number, cy: number,
): number {
  const ux = bx - ax, uy = by - ay, wx = cx - ax, wy = cy - ay;
  const cross = ux * wy - uy * wx;
  const dot = (cx - ax) * (cx - bx) + (cy - ay) * (cy - by);
  if (Math.abs(cross) > 1e-10 * (Math.abs(ux * wy) + Math.abs(uy * wx))) return dot / (2 * cross);
  const [AX, AY, BX, BY, CX, CY] = toScaledIntegers([ax, ay, bx, by, cx, cy]);
  const D = 2n * ((BX - AX) * (CY - AY) - (BY - AY) * (CX - AX));
  const N = (CX - AX) * (CX - BX) + (CY - AY) * (CY - BY);
  if (D === 0n) return N > 0n ? Infinity : -Infinity;
  // Both are scaled by the same square of a power of two; the ratio is exact before rounding.
  return Number(N) / Number(D);
}

export interface DualEdge {
  a: number;
  b: number;
  /** The clipped edge runs along a region side, within the tolerance given (see dualEdges). */
  alongSide: boolean;
  /** Length of the Voronoi edge of a and b inside the region (0 when it misses it). */
  clipped: number;
  /**
   * Sines of the angles at which the clipped edge meets the region's sides
   * at its ends (1 at an end that is a Voronoi vertex, not a cut): where an
   * edge crosses a side at a shallow angle, a rounding-sized move of the side
   * moves the crossing by that much divided by the sine.
   */
  endSines: [number, number];
}

/** Sine of the angle between direction (dx, dy) and the region side nearest to (x, y). */
function sineAtSide(region: ArrayLike<number>, x: number, y: number, dx: number, dy: number): number {
  const n = region.length >> 1;
  let best = Infinity, sine = 1;
  const dl = Math.hypot(dx, dy);
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const ax = region[2 * i], ay = region[2 * i + 1];
    const ex = region[2 * j] - ax, ey = region[2 * j + 1] - ay;
    const el = Math.hypot(ex, ey);
    const dist = Math.abs(ex * (y - ay) - ey * (x - ax)) / el;
    if (dist < best) { best = dist; sine = Math.abs(ex * dy - ey * dx) / (el * dl); }
  }
  return sine;
}

/**
 * The Voronoi edge dual to every Delaunay edge (a, b), clipped to a convex
 * counter-clockwise region. The edge lies on the bisector m + t n between the
 * circumcentre parameters of the triangles on its right and left; a side with
 * no triangle (hull edge) makes it a ray, a triangulation with no triangles
 * (collinear sites) a full line.
 */
export function dualEdges(
  siteXY: ArrayLike<number>, triangleSites: ArrayLike<number>, edges: ArrayLike<number>, region: ArrayLike<number>,
  sideTolerance = 0,
): DualEdge[] {
  const apex = new Map<number, number>();
  const n = siteXY.length >> 1;
  for (let t = 0; 3 * t < triangleSites.length; t++) {
    for (let k = 0; k < 3; k++) {
      const a = triangleSites[3 * t + k], b = triangleSites[3 * t + ((k + 1) % 3)], c = triangleSites[3 * t + ((k + 2) % 3)];
      apex.set(a * n + b, c);
    }
  }
  const out: DualEdge[] = [];
  for (let i = 0; i + 1 < edges.length; i += 2) {
    const a = edges[i], b = edges[i + 1];
    const ax = siteXY[2 * a], ay = siteXY[2 * a + 1], bx = siteXY[2 * b], by = siteXY[2 * b + 1];
    const left = apex.get(a * n + b);
    const right = apex.get(b * n + a);
    const hi = left === undefined ? Infinity
      : bisectorParameter(ax, ay, bx, by, siteXY[2 * left], siteXY[2 * left + 1]);
    const lo = right === undefined ? -Infinity
      : bisectorParameter(ax, ay, bx, by, siteXY[2 * right], siteXY[2 * right + 1]);
    const mx = ax + (bx - ax) / 2, my = ay + (by - ay) / 2;
    const dx = -(by - ay), dy = bx - ax;
    let clipped = 0;
    const endSines: [number, number] = [1, 1];
    if (hi > lo) {
      const [cl, ch] = clipLine(region, mx, my, dx, dy, lo, hi);
      if (ch > cl) {
        clipped = (ch - cl) * Math.hypot(dx, dy);
        if (cl !== lo) endSines[0] = sineAtSide(region, mx + cl * dx, my + cl * dy, dx, dy);
        if (ch !== hi) endSines[1] = sineAtSide(region, mx + ch * dx, my + ch * dy, dx, dy);
      }
    }
    // Both clipped ends within `sideTolerance` of one side's line: the edge runs along the boundary,
    // where the library counts it as lying on the side (a sliver of no width beside it).
    let alongSide = false;
    if (clipped > 0 && sideTolerance > 0) {
      const [cl, ch] = clipLine(region, mx, my, dx, dy, lo, hi);
      const p0x = mx + cl * dx, p0y = my + cl * dy, p1x = mx + ch * dx, p1y = my + ch * dy;
      const m = region.length >> 1;
      for (let j = 0; j < m && !alongSide; j++) {
        const k = (j + 1) % m;
        const sx = region[2 * j], sy = region[2 * j + 1], ex = region[2 * k] - sx, ey = region[2 * k + 1] - sy;
        const el = Math.hypot(ex, ey);
        const d0 = Math.abs(ex * (p0y - sy) - ey * (p0x - sx)) / el, d1 = Math.abs(ex * (p1y - sy) - ey * (p1x - sx)) / el;
        alongSide = d0 <= sideTolerance && d1 <= sideTolerance;
      }
    }
    out.push({ a: Math.min(a, b), b: Math.max(a, b), clipped, endSines, alongSide });
  }
  return out;
}

/** One unit in the last place of |x| (the spacing of doubles there). */
export function ulp(x: number): number {
  const a = Math.abs(x);
  if (a === 0) return Number.MIN_VALUE;
  f64[0] = a;
  u64[0] += 1n;
  return f64[0] - a;
}
