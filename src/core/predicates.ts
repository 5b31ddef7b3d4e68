import { orient2d, incircle } from 'robust-predicates';

// robust-predicates measures orientation with y pointing down; ambit works
// y-up everywhere, so the sign of orient2d is flipped here, once.

/**
 * Exact orientation of c relative to the directed line a→b, y-up:
 * positive when a, b, c turn counter-clockwise, negative when clockwise,
 * zero exactly when collinear. The magnitude is only an approximation.
 */
export function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return -orient2d(ax, ay, bx, by, cx, cy);
}

/**
 * Exact in-circle test: positive when d lies strictly inside the circle
 * through a, b, c (given counter-clockwise, y-up), negative outside, zero
 * exactly when the four points are cocircular.
 */
export function inCircle(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): number {
  return incircle(ax, ay, bx, by, cx, cy, dx, dy);
}
