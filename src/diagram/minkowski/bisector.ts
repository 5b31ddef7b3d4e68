import { powP, smallInteger } from './norm.js';
import { powerSlope as g } from './powers.js';
import { length } from '../../core/length.js';

/**
 * The Lp bisector of two sites a, b (1 < p < ∞) in the frame of the pair:
 * origin the midpoint m, ê the unit vector from a to b, û its left normal
 * (a lies on the left of û). A point is m + s û + t ê.
 *
 * For a strictly convex norm, F(t) = ||q - a|| - ||q - b|| along any line
 * parallel to ab is continuous and strictly increasing (a difference
 * g(t) - g(t - 1) of a strictly convex g), from -|ab| to +|ab|; so every
 * such line meets the bisector exactly once, and the bisector is the graph
 * t(s) over the whole s axis. Both facts follow from strict convexity
 * (derived here). The edge between two Voronoi vertices is the piece
 * between their s values, and s is the parameter everything in this engine
 * orders by.
 */
export class PairFrame {
  p = 3;
  private pi = 3;
  mx = 0; my = 0; ex = 1; ey = 0; ux = 0; uy = 1; h = 0;
  /** Point found by at(): coordinates, its t, and the unit tangent there (pointing towards larger s). */
  x = 0; y = 0; t = 0; tx = 0; ty = 1;

  set(p: number, ax: number, ay: number, bx: number, by: number): this {
    this.p = p;
    this.pi = smallInteger(p);
    this.mx = ax + (bx - ax) / 2;
    this.my = ay + (by - ay) / 2;
    const dx = bx - ax, dy = by - ay, len = length(dx, dy);
    this.ex = dx / len; this.ey = dy / len;
    this.ux = -this.ey; this.uy = this.ex;
    this.h = len / 2;
    return this;
  }

  /** The s coordinate of a point: its signed Euclidean distance from the line ab, positive on the left of a→b. */
  sOf(x: number, y: number): number {
    return (x - this.mx) * this.ux + (y - this.my) * this.uy;
  }

  /**
   * The bisector point at parameter s (into x, y, t), starting Newton from
   * t = guess, safeguarded by bisection. The root lies in |t| < |s| + h
   * (derived here): for t >= |s| + h the vector q - b is within 45° of ê,
   * and so is every point of the segment from q - b to q - a = q - b + 2hê;
   * an Lp gradient lies within 45° of its point's direction (both in one
   * quadrant, the gradient between the point and the diagonal for p < 2,
   * between the point and the nearer axis for p > 2), so the norm grows
   * along that segment and F(t) > 0; likewise F < 0 for t <= -(|s| + h). So
   * the bracket starts at twice that. Far out, F is a difference of two
   * nearly equal norms, and its rounding can hide its sign: the bracket
   * keeps t bounded whatever the noise.
   */
  at(s: number, guess: number): void {
    const p = this.p, pi = this.pi, h = this.h, ex = this.ex, ey = this.ey;
    const sx = s * this.ux, sy = s * this.uy;
    const cap = 2 * (Math.abs(s) + h);
    let lo = -cap, hi = cap, t = guess > lo && guess < hi ? guess : 0;
    const scale = Math.abs(s) + h;
    let gx = 0, gy = 0;
    for (let it = 0; it < 200; it++) {
      // F(t) = ||q-a||^p - ||q-b||^p (same root as the difference of norms), divided by M^p, M the
      // largest coordinate, so no power overflows; its derivative in t likewise (times M).
      const ax = sx + (t + h) * ex, ay = sy + (t + h) * ey, bx = sx + (t - h) * ex, by = sy + (t - h) * ey;
      const M = Math.max(Math.abs(ax), Math.abs(ay), Math.abs(bx), Math.abs(by));
      const inv = 1 / M;
      const u1 = Math.abs(ax) * inv, u2 = Math.abs(ay) * inv, w1 = Math.abs(bx) * inv, w2 = Math.abs(by) * inv;
      const pu1 = powP(u1, p, pi), pu2 = powP(u2, p, pi), pw1 = powP(w1, p, pi), pw2 = powP(w2, p, pi);
      const f = pu1 + pu2 - pw1 - pw2;
      // The gradient of F in x, y, up to the factor p / M: d/dv_k of (|v_k|/M)^p is (p / M) (|v_k|/M)^(p-1) sign(v_k).
      gx = g(pu1, u1, ax) - g(pw1, w1, bx);
      gy = g(pu2, u2, ay) - g(pw2, w2, by);
      if (f === 0) break;
      if (f < 0) lo = t; else hi = t;
      const df = (p * inv) * (gx * ex + gy * ey);
      let next = t - f / df;
      // A step below half an ulp of t: t is the root to rounding. (f's rounding can have moved a bracket end
      // onto t, and the step would then leave the bracket and bisect, half a step back from the root.)
      if (next === t) break;
      if (!(next > lo && next < hi)) next = lo + (hi - lo) / 2;
      const moved = Math.abs(next - t);
      t = next;
      // Newton converges quadratically: a step below 1e-8 of the scale leaves an error near 1e-16 of it,
      // so the step is taken without another evaluation to confirm it.
      if (moved <= 1e-8 * scale || hi - lo <= 4 * Number.EPSILON * scale) break;
    }
    this.t = t;
    this.x = this.mx + sx + t * ex;
    this.y = this.my + sy + t * ey;
    // The tangent is normal to the gradient (from the last evaluation, within a Newton step of the point),
    // pointed the way s grows.
    let tx = -gy, ty = gx;
    if (tx * this.ux + ty * this.uy < 0) { tx = -tx; ty = -ty; }
    const len = length(tx, ty);
    this.tx = len > 0 ? tx / len : this.ux;
    this.ty = len > 0 ? ty / len : this.uy;
  }
}
