/**
 * The Minkowski norm ||v||_p = (|vx|^p + |vy|^p)^(1/p) for 1 < p < ∞,
 * without overflow for any p: computed from the ratio r = min/max of the
 * two magnitudes, so no power of a large number is ever formed.
 */

/** ||(vx, vy)||_p. */
export function lpLength(p: number, vx: number, vy: number): number {
  const ax = Math.abs(vx), ay = Math.abs(vy);
  const big = ax >= ay ? ax : ay;
  if (big === 0) return 0;
  const r = (ax >= ay ? ay : ax) / big;
  return r === 0 ? big : big * Math.pow(1 + Math.pow(r, p), 1 / p);
}

/**
 * The largest Euclidean length of a vector of p-norm 1: 1 for p <= 2 (the
 * p-ball lies inside the Euclidean disk), 2^(1/2 - 1/p) for p > 2 (reached
 * on the diagonals). Hölder's inequality; from memory.
 */
export function euclideanReach(p: number): number {
  return p <= 2 ? 1 : Math.pow(2, 0.5 - 1 / p);
}

/**
 * x^p for x >= 0, by multiplication when p is a small integer (exact to
 * within the same rounding, several times faster than Math.pow).
 */
export function powP(x: number, p: number, integer: number): number {
  switch (integer) {
    case 3: return x * x * x;
    case 4: { const y = x * x; return y * y; }
    case 5: { const y = x * x; return y * y * x; }
    case 6: { const y = x * x * x; return y * y; }
    case 8: { const y = x * x; const z = y * y; return z * z; }
    default: return Math.pow(x, p);
  }
}

/** The integer powP multiplies out for p, or 0. */
export function smallInteger(p: number): number {
  return p === 3 || p === 4 || p === 5 || p === 6 || p === 8 ? p : 0;
}
