import { polygonArea } from './voronoi-brute.js';

/**
 * Power cells by brute force, independent of ambit's diagram code: the cell
 * of site i is the region cut by the half-plane
 *   |x - s_i|^2 - w_i <= |x - s_j|^2 - w_j
 *   <=>  2 x . (s_j - s_i) <= |s_j|^2 - |s_i|^2 - w_j + w_i
 * for every other site j (Aurenhammer 1987: power cells are convex polygons
 * bounded by such radical lines). O(n^2) polygon clipping in floating point
 * (Sutherland–Hodgman), fine for a few hundred sites; every edge remembers the
 * site whose half-plane made it, which gives neighbours and shared lengths.
 */

export interface BrutePowerCells {
  /** Per site: the cell polygon, counter-clockwise, interleaved (empty when the cell is empty). */
  polygons: Float64Array[];
  areas: Float64Array;
  /** Site pairs (a < b) whose cells share an edge, with its length. */
  pairs: Int32Array;
  lengths: Float64Array;
}

/** Clips a polygon (with per-edge labels) to a.x*X + a.y*Y <= c; the new edge along the line gets `label`. */
function clip(poly: number[], labels: number[], ax: number, ay: number, c: number, label: number): [number[], number[]] {
  const m = poly.length >> 1;
  const out: number[] = [], outLabels: number[] = [];
  for (let i = 0; i < m; i++) {
    const j = (i + 1) % m;
    const px = poly[2 * i], py = poly[2 * i + 1], qx = poly[2 * j], qy = poly[2 * j + 1];
    const fp = ax * px + ay * py - c, fq = ax * qx + ay * qy - c;
    if (fp <= 0) {
      out.push(px, py);
      outLabels.push(labels[i]);
    }
    if ((fp <= 0) !== (fq <= 0)) {
      const t = fp / (fp - fq);
      out.push(px + t * (qx - px), py + t * (qy - py));
      // Entering the kept side along the old edge; leaving it, the cut line follows.
      outLabels.push(fp <= 0 ? label : labels[i]);
    }
  }
  return [out, outLabels];
}

/** Sites and region moved so the region's first corner is the origin (power distances do not change). */
function localFrame(xyIn: ArrayLike<number>, regionIn: ArrayLike<number>) {
  // Without it, the radical lines' constants |s_j|^2 - |s_i|^2 lose the digits that place them far from the origin.
  const ox = regionIn[0], oy = regionIn[1];
  const move = (v: number, k: number) => v - (k % 2 === 0 ? ox : oy);
  return { ox, oy, xy: Float64Array.from(xyIn, move), region: Float64Array.from(regionIn, move) };
}

/** The power cell of site i, and per edge the site whose half-plane made it (-1: the region's side); local frame. */
function cellOf(xy: Float64Array, w: ArrayLike<number>, region: Float64Array, i: number): { poly: number[]; labels: number[] } {
  let poly = Array.from(region);
  let labels = new Array<number>(poly.length >> 1).fill(-1);
  const xi = xy[2 * i], yi = xy[2 * i + 1];
  for (let j = 0; j < xy.length >> 1 && poly.length > 0; j++) {
    if (j === i) continue;
    const xj = xy[2 * j], yj = xy[2 * j + 1];
    const c = xj * xj + yj * yj - xi * xi - yi * yi - w[j] + w[i];
    [poly, labels] = clip(poly, labels, 2 * (xj - xi), 2 * (yj - yi), c, j);
  }
  return { poly, labels };
}

/** The area of site i's power cell alone (O(n)). */
export function brutePowerCellArea(xyIn: ArrayLike<number>, w: ArrayLike<number>, regionIn: ArrayLike<number>, i: number): number {
  const { xy, region } = localFrame(xyIn, regionIn);
  const { poly } = cellOf(xy, w, region, i);
  return poly.length >= 6 ? Math.max(0, polygonArea(poly)) : 0;
}

/** Power cells of sites (interleaved) with weights, clipped to a counter-clockwise convex region. */
export function brutePowerCells(xyIn: ArrayLike<number>, w: ArrayLike<number>, regionIn: ArrayLike<number>): BrutePowerCells {
  const n = xyIn.length >> 1;
  const { ox, oy, xy, region } = localFrame(xyIn, regionIn);
  const polygons: Float64Array[] = [];
  const areas = new Float64Array(n);
  const shared = new Map<number, number>();
  for (let i = 0; i < n; i++) {
    const { poly, labels } = cellOf(xy, w, region, i);
    const area = poly.length >= 6 ? polygonArea(poly) : 0;
    if (!(area > 0)) { polygons.push(new Float64Array(0)); continue; }
    polygons.push(Float64Array.from(poly, (v, k) => v + (k % 2 === 0 ? ox : oy)));
    areas[i] = area;
    const m = poly.length >> 1;
    for (let k = 0; k < m; k++) {
      const j = labels[k];
      if (j < 0) continue;
      const q = (k + 1) % m;
      const len = Math.hypot(poly[2 * q] - poly[2 * k], poly[2 * q + 1] - poly[2 * k + 1]);
      if (len === 0) continue;
      const key = i < j ? i * n + j : j * n + i;
      // Each shared edge is seen from both cells; keep the larger of the two float lengths once.
      shared.set(key, Math.max(shared.get(key) ?? 0, len));
    }
  }
  const keys = [...shared.keys()].sort((a, b) => a - b);
  const pairs = new Int32Array(2 * keys.length), lengths = new Float64Array(keys.length);
  keys.forEach((key, e) => { pairs[2 * e] = Math.floor(key / n); pairs[2 * e + 1] = key % n; lengths[e] = shared.get(key)!; });
  return { polygons, areas, pairs, lengths };
}

/** The site of least power distance |p - s|^2 - w to (x, y), ties to the smallest index (floating point). */
export function brutePowerNearest(xy: ArrayLike<number>, w: ArrayLike<number>, x: number, y: number): number {
  let best = -1, bestD = Infinity;
  for (let i = 0; i < xy.length >> 1; i++) {
    const dx = x - xy[2 * i], dy = y - xy[2 * i + 1];
    const d = dx * dx + dy * dy - w[i];
    if (d < bestD) { bestD = d; best = i; }
  }
  return best;
}

// ---------------------------------------------------------------------------
// Exact power test in BigInts, for the uniqueness checks of the reference
// tests. Every double is an integer multiple of 2^-1074, so a coordinate
// times 2^1074 and a weight (a squared length) times 2^2148 are exact BigInts.

const f64 = new Float64Array(1);
const u64 = new BigUint64Array(f64.buffer);

/** x * 2^shift as an exact BigInt (shift >= 1074 makes every double an integer). */
function scaled(x: number, shift: number): bigint {
  if (x === 0) return 0n;
  f64[0] = x;
  const bits = u64[0];
  const expBits = Number((bits >> 52n) & 0x7ffn);
  const frac = bits & ((1n << 52n) - 1n);
  const m = expBits === 0 ? frac : frac | (1n << 52n);
  const e = (expBits === 0 ? -1074 : expBits - 1075) + shift;
  const v = e >= 0 ? m << BigInt(e) : m >> BigInt(-e);
  return bits >> 63n === 1n ? -v : v;
}

/**
 * Exact sign: > 0 when the lifted point of d = (x, y, w) lies below the plane
 * through the lifted counter-clockwise a, b, c (lifting p to x^2 + y^2 - w;
 * Aurenhammer 1987), i.e. d is in conflict with triangle a, b, c.
 */
export function powerTestExact(a: readonly number[], b: readonly number[], c: readonly number[], d: readonly number[]): number {
  const rows = [a, b, c].map((p) => {
    const dx = scaled(p[0], 1074) - scaled(d[0], 1074), dy = scaled(p[1], 1074) - scaled(d[1], 1074);
    return [dx, dy, dx * dx + dy * dy - (scaled(p[2], 2148) - scaled(d[2], 2148))];
  });
  const [[a0, a1, a2], [b0, b1, b2], [c0, c1, c2]] = rows;
  const det = a2 * (b0 * c1 - c0 * b1) + b2 * (c0 * a1 - a0 * c1) + c2 * (a0 * b1 - b0 * a1);
  return det > 0n ? 1 : det < 0n ? -1 : 0;
}

function orientBig(a: readonly number[], b: readonly number[], c: readonly number[]): number {
  const [ax, ay, bx, by, cx, cy] = [a[0], a[1], b[0], b[1], c[0], c[1]].map((v) => scaled(v, 1074));
  const o = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
  return o > 0n ? 1 : o < 0n ? -1 : 0;
}

/**
 * Null when triangles (counter-clockwise site triples) with these hidden
 * sites are the UNIQUE regular triangulation (decided exactly), else why not:
 * every interior edge strictly locally regular (the lifted surface is
 * strictly convex across it; Edelsbrunner and Shah 1996 for local => global, cited from memory)
 * and every hidden site strictly above the surface over its position.
 */
export function regularUniqueness(xy: ArrayLike<number>, w: ArrayLike<number>, tri: ArrayLike<number>, hidden: ArrayLike<number>): string | null {
  const p = (i: number) => [xy[2 * i], xy[2 * i + 1], w[i]];
  const apex = new Map<string, number>();
  for (let t = 0; 3 * t < tri.length; t++) {
    for (let k = 0; k < 3; k++) apex.set(`${tri[3 * t + k]},${tri[3 * t + (k + 1) % 3]}`, tri[3 * t + (k + 2) % 3]);
  }
  for (const [key, c] of apex) {
    const [a, b] = key.split(',').map(Number);
    const d = apex.get(`${b},${a}`);
    if (a > b || d === undefined) continue;
    const s = powerTestExact(p(a), p(b), p(c), p(d));
    if (s >= 0) return `edge (${a}, ${b}): apex ${d} ${s === 0 ? 'coplanar with' : 'below'} the lifted plane of (${a}, ${b}, ${c})`;
  }
  for (let h = 0; h < hidden.length; h++) {
    const i = hidden[h];
    let t = 0;
    for (; 3 * t < tri.length; t++) {
      const [a, b, c] = [tri[3 * t], tri[3 * t + 1], tri[3 * t + 2]].map(p);
      if (orientBig(a, b, p(i)) >= 0 && orientBig(b, c, p(i)) >= 0 && orientBig(c, a, p(i)) >= 0) break;
    }
    if (3 * t >= tri.length) return `hidden site ${i} lies in no triangle`;
    const s = powerTestExact(p(tri[3 * t]), p(tri[3 * t + 1]), p(tri[3 * t + 2]), p(i));
    if (s >= 0) return `hidden site ${i} is ${s === 0 ? 'on' : 'below'} the lifted surface`;
  }
  return null;
}
