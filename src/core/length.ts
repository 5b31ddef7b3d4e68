/**
 * The Euclidean length of (x, y). Math.hypot guards against overflow and
 * underflow but is slow in V8 and returns a fresh heap number per call,
 * which made it a large share of the garbage in the Minkowski engine's
 * sampling loops; the plain square root is used wherever the sum of squares
 * is far from both ends of the double range, where it is within an ulp or
 * two of hypot.
 */
export function length(x: number, y: number): number {
  const s = x * x + y * y;
  return s > 1e-280 && s < 1e280 ? Math.sqrt(s) : Math.hypot(x, y);
}
