import type { PointList } from '../minkowski/lists.js';
import type { PairBisector } from './pair.js';
import { FOUND, type SquareCircle } from './square.js';
import { Undecided } from './undecided.js';

/** Per triangle, how its centre is known (see TriangleCentres.state). */
const UNMET = 0, ROOT_FINITE = 1, ROOT_INFINITE = 2, ROOTS_PENDING = 3, CLOSED = 4;

/**
 * The centres of the metric circles of the dual route's triangles (dual.ts),
 * each computed once, and each one strictly inside the region made a mesh
 * point. A centre comes from the closed form (square.ts) where that is
 * clear-cut, else from the root along the bisector of the edge that meets
 * the triangle first, and the other two edges' roots must then agree on
 * whether the circle exists.
 */
export class TriangleCentres {
  /** Per triangle: UNMET, ROOT_FINITE, ROOT_INFINITE, ROOTS_PENDING (the closed form was unsure) or CLOSED. */
  private readonly state: Uint8Array;
  /** The centres, (x, y) by triangle (finite ones only). */
  readonly xy: Float64Array;
  /** The mesh point of each centre strictly inside the region, else -1. */
  readonly pointOf: Int32Array;

  constructor(
    count: number,
    private readonly vert: Int32Array,
    private readonly pair: PairBisector,
    private readonly square: SquareCircle,
    /** True for L-infinity (the frame of pair.ts is rotated, and the closed form's is (x, y) itself). */
    private readonly rotated: boolean,
    /** The region's side test: positive strictly inside by the margin, Undecided near a side. */
    private readonly sides: { least(x: number, y: number): number },
    private readonly points: PointList,
  ) {
    this.state = new Uint8Array(count);
    this.xy = new Float64Array(2 * count);
    this.pointOf = new Int32Array(count).fill(-1);
  }

  /**
   * Where along the pair's bisector (as s, pair.ts) triangle t's centre lies,
   * c its corner off the pair, on the `left` (1) or right (-1) of the pair:
   * from the closed form, the centre's K coordinate in the pair's frame (the
   * bisector is a graph over K); else the bisector's root, possibly
   * infinite. The pair must be set.
   */
  along(t: number, c: number, left: number): number {
    const state = this.state, pair = this.pair;
    if (state[t] === UNMET) {
      const v = this.vert, square = this.square;
      if (square.through(v[3 * t], v[3 * t + 1], v[3 * t + 2]) === FOUND) {
        state[t] = CLOSED;
        // Back from the closed form's frame: (x, y) = ((u + v) / 2, (u - v) / 2) for L1, (u, v) for L-infinity.
        if (this.rotated) this.place(t, square.cu, square.cv);
        else this.place(t, (square.cu + square.cv) / 2, (square.cu - square.cv) / 2);
      } else state[t] = ROOTS_PENDING;
    }
    if (state[t] === CLOSED) return pair.sAt(this.xy[2 * t], this.xy[2 * t + 1]);
    const s = pair.root(c, left);
    if (Number.isNaN(s)) throw new Undecided();
    const finite = Number.isFinite(s);
    if (state[t] !== ROOTS_PENDING) {
      // Three bisectors of one triangle agree on whether its circle exists.
      if ((state[t] === ROOT_FINITE) !== finite) throw new Undecided();
      return s;
    }
    state[t] = finite ? ROOT_FINITE : ROOT_INFINITE;
    if (finite) {
      pair.point(s);
      this.place(t, pair.x, pair.y);
    }
    return s;
  }

  private place(t: number, x: number, y: number): void {
    this.xy[2 * t] = x; this.xy[2 * t + 1] = y;
    if (this.sides.least(x, y) > 0) this.pointOf[t] = this.points.add(x, y);
  }
}
