import { bigSign, commonIntegers } from '../../core/exact.js';

/**
 * A point on a segment P→Q, for ordering along it: either a point given by
 * its exact coordinates (lying on the segment), or the crossing of the
 * segment with the line through A and B (`line` true), kept symbolic.
 */
export interface AlongKey { line: boolean; ax: number; ay: number; bx: number; by: number }

const vals = new Float64Array(12);
const ints: bigint[] = [];

/**
 * Exact sign of position(u) − position(v) along P→Q. Each position is a
 * ratio of polynomials in the coordinates, of equal degree above and below
 * (so the common power of two of commonIntegers cancels): for a point, its
 * offset from P over Q − P on the dominant axis; for a crossing with line
 * AB, cross(B − A, P − A) / cross(B − A, P − Q).
 */
export function compareAlongExact(px: number, py: number, qx: number, qy: number, u: AlongKey, v: AlongKey): number {
  vals.set([px, py, qx, qy, u.ax, u.ay, u.bx, u.by, v.ax, v.ay, v.bx, v.by]);
  commonIntegers(vals, ints);
  const [P, PY, Q, QY] = ints;
  const xAxis = Math.abs(qx - px) >= Math.abs(py - qy);
  const ratio = (k: AlongKey, o: number): [bigint, bigint] => {
    const ax = ints[o], ay = ints[o + 1], bx = ints[o + 2], by = ints[o + 3];
    if (!k.line) return xAxis ? [ax - P, Q - P] : [ay - PY, QY - PY];
    const num = (bx - ax) * (PY - ay) - (by - ay) * (P - ax);
    return [num, num - ((bx - ax) * (QY - ay) - (by - ay) * (Q - ax))];
  };
  const [n1, d1] = ratio(u, 4), [n2, d2] = ratio(v, 8);
  return bigSign(n1 * d2 - n2 * d1) * bigSign(d1) * bigSign(d2);
}
