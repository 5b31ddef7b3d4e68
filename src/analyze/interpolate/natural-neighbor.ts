import type { PointInput } from '../../core/input.js';
import { orient } from '../../core/predicates.js';
import type { Triangulation } from '../../triangulate/triangulation.js';
import { readGrid, sampleX, sampleY, type GridSpec } from './grid.js';
import { checkCoordinate, readSites, type Interpolator } from './interpolator.js';
import { SibsonKernel, alongEdge } from './sibson.js';
import { valuesBySite } from './values.js';

/**
 * Natural-neighbour (Sibson 1981) interpolation of values at the sites:
 * one value per input point (merged duplicates must agree). Inside the
 * convex hull the interpolant reproduces linear functions and equals the
 * data at the sites; on the hull boundary it is linear along the hull edge;
 * strictly outside the hull it is NaN. Collinear sites: linear between
 * neighbours along the line, NaN off it; a single site: its value there only.
 */
export function naturalNeighbor(input: PointInput | Triangulation, values: ArrayLike<number>): Interpolator {
  const tri = readSites(input);
  const f = valuesBySite(tri, values);
  if (tri.dimension === 2) return new NaturalNeighbor(new SibsonKernel(tri, f));
  return new AlongLine(tri, f);
}

/** Fills a grid from a point evaluator, row by row. */
function fillGrid(spec: GridSpec, value: (x: number, y: number) => number, rowStart?: () => void): Float64Array {
  const g = readGrid(spec), out = new Float64Array(g.columns * g.rows);
  for (let i = 0, k = 0; i < g.rows; i++) {
    const y = sampleY(g, i);
    rowStart?.();
    for (let j = 0; j < g.columns; j++, k++) out[k] = value(sampleX(g, j), y);
  }
  return out;
}

class NaturalNeighbor implements Interpolator {
  constructor(private readonly kernel: SibsonKernel) {}

  at(x: number, y: number): number {
    return this.kernel.value(checkCoordinate(x, 'x'), checkCoordinate(y, 'y'));
  }

  grid(spec: GridSpec): Float64Array {
    // Each row starts its walk where the previous row started; along a row, from the previous sample.
    const k = this.kernel;
    let start = k.last, first = true;
    return fillGrid(spec, (x, y) => {
      const v = k.value(x, y);
      if (first) { start = k.last; first = false; }
      return v;
    }, () => { k.last = start; first = true; });
  }
}

/** Sites all on one line (or one site): linear between neighbours along it, NaN elsewhere. */
class AlongLine implements Interpolator {
  private readonly xy: Float64Array;
  private readonly path: Int32Array;
  private readonly f: Float64Array;

  constructor(tri: Triangulation, f: Float64Array) {
    this.xy = tri.siteXY;
    this.path = tri.linearOrder()!;
    this.f = f;
  }

  at(x: number, y: number): number {
    return this.value(checkCoordinate(x, 'x'), checkCoordinate(y, 'y'));
  }

  grid(spec: GridSpec): Float64Array {
    return fillGrid(spec, (x, y) => this.value(x, y));
  }

  /** Before, after or at site p[i] along the path's (x, then y) order. */
  private compare(i: number, x: number, y: number): number {
    const s = this.path[i], sx = this.xy[2 * s], sy = this.xy[2 * s + 1];
    return x < sx || (x === sx && y < sy) ? -1 : x === sx && y === sy ? 0 : 1;
  }

  private value(x: number, y: number): number {
    const p = this.path, xy = this.xy, n = p.length;
    const a = p[0], b = p[n - 1];
    if (n === 1) return xy[2 * a] === x && xy[2 * a + 1] === y ? this.f[a] : NaN;
    if (orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], x, y) !== 0) return NaN;
    if (this.compare(0, x, y) < 0 || this.compare(n - 1, x, y) > 0) return NaN;
    // The last site at or before q along the line.
    let lo = 0, hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (this.compare(mid, x, y) >= 0) lo = mid; else hi = mid;
    }
    const s = p[lo], t = p[hi];
    if (this.compare(lo, x, y) === 0) return this.f[s];
    if (this.compare(hi, x, y) === 0) return this.f[t];
    return alongEdge(xy[2 * s], xy[2 * s + 1], this.f[s], xy[2 * t], xy[2 * t + 1], this.f[t], x, y);
  }
}
