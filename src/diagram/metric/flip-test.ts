import { orient } from '../../core/predicates.js';
import type { PairBisector } from './pair.js';
import { FOUND, NONE, type SquareCircle } from './square.js';
import { Undecided } from './undecided.js';

/**
 * The edge test of the metric Delaunay triangulation (dual.ts, step 2), for
 * TriangleStore: the edge a→b with the new site p on its left and d across
 * goes when d lies inside the metric circle through a, b and p. The clear
 * cases in closed form (square.ts), the rest along the bisector (pair.ts);
 * Undecided within the margins.
 */
export class MetricFlipTest {
  constructor(
    private readonly xy: Float64Array,
    private readonly square: SquareCircle,
    private readonly pair: PairBisector,
  ) {}

  mustFlip(a: number, b: number, p: number, d: number): boolean {
    const square = this.square, found = square.through(a, b, p);
    if (found === FOUND) {
      // d outside the circle through a, b and p, or inside.
      const side = square.outside(d);
      if (side > 0) return false;
      if (side < 0) return this.convexAt(a, b, p, d);
    } else if (found === NONE) {
      // No circle through the three: p inside the pair's bounding box lies inside every circle through a
      // and b, and the edge goes; else (a or b inside the others' box) p lies outside every one, and the
      // edge goes only when d lies inside every one, i.e. inside the pair's box.
      if (square.inner === p) return this.convexAt(a, b, p, d);
      const inside = square.insideBox(a, b, d);
      if (inside < 0) return false;
      if (inside > 0) return this.convexAt(a, b, p, d);
    }
    return this.byRoots(a, b, p, d);
  }

  /** The general test, along the bisector of a and b, where the closed form is unsure. */
  private byRoots(a: number, b: number, p: number, d: number): boolean {
    const pair = this.pair;
    if (!pair.set(a, b)) throw new Undecided();
    // The edge stays when d is outside the circle through a, b and p. With rp where that circle is centred
    // and rd where d's is, that is rd < rp (the Voronoi edge dual to a→b runs forwards): d's side of the
    // circles grows with s, so the sign of d's distance beyond the circle at rp says the same, for one root.
    const rp = pair.root(p, 1);
    if (Number.isNaN(rp)) throw new Undecided();
    if (Number.isFinite(rp)) {
      const g = pair.beyond(rp, d);
      // G (within ~180 u m) at a root placed within ~200 u m, G's slope at most 4: within ~980 u m, under 4 allowances.
      const slack = Math.max(pair.allowance(p, 4), pair.allowance(d, 4));
      if (g > slack) return false;
      if (!(g < -slack)) throw new Undecided();
    } else {
      // p outside every circle through a and b (+Infinity): the edge stays unless d is inside every one.
      // p inside every one (-Infinity): the edge goes.
      const rd = rp > 0 ? pair.root(d, -1) : -Infinity;
      if (Number.isNaN(rd)) throw new Undecided();
      if (rp > 0 && rd < Infinity) return false;
    }
    return this.convexAt(a, b, p, d);
  }

  /**
   * A corner inside the circle across makes the quadrilateral convex (the
   * chord meets the circle in ab alone, as the pair is not on a flat side);
   * checked all the same, as a flip across a reflex corner would fold the
   * triangulation.
   */
  private convexAt(a: number, b: number, p: number, d: number): boolean {
    const xy = this.xy;
    if (orient(xy[2 * d], xy[2 * d + 1], xy[2 * p], xy[2 * p + 1], xy[2 * a], xy[2 * a + 1]) <= 0 ||
      orient(xy[2 * p], xy[2 * p + 1], xy[2 * d], xy[2 * d + 1], xy[2 * b], xy[2 * b + 1]) <= 0) throw new Undecided();
    return true;
  }
}
