import { hilbertSort } from './hilbert.js';

/** Distinct sites of a point set, and where every input point went. */
export interface SiteSet {
  /** Interleaved x, y of the distinct sites, numbered by first appearance. */
  xy: Float64Array;
  /** Number of distinct sites. */
  count: number;
  /** For input point i, the site it was merged onto. */
  siteOfInput: Int32Array;
  /** Every site once, in Hilbert-curve order: a good insertion order. */
  curveOrder: Uint32Array;
}

/**
 * Merges exactly equal points (bit for bit, after -0 became 0). Equal points
 * have equal Hilbert keys, so after the curve sort duplicates sit in the same
 * run of equal keys; only those short runs are compared. Site numbers follow
 * the first appearance of each point, so the result depends only on the input.
 */
export function mergeDuplicates(points: Float64Array): SiteSet {
  const n = points.length >> 1;
  const { ids, keys } = hilbertSort(points);
  // rep[i]: the first input point equal to point i.
  const rep = new Int32Array(n);
  const byPosition = (a: number, b: number): number =>
    points[2 * a] - points[2 * b] || points[2 * a + 1] - points[2 * b + 1] || a - b;
  for (let lo = 0; lo < n;) {
    let hi = lo + 1;
    while (hi < n && keys[hi] === keys[lo]) hi++;
    if (hi - lo === 1) {
      rep[ids[lo]] = ids[lo];
    } else {
      const run = ids.subarray(lo, hi).sort(byPosition);
      let first = run[0];
      rep[first] = first;
      for (let k = 1; k < run.length; k++) {
        const i = run[k];
        if (points[2 * i] !== points[2 * first] || points[2 * i + 1] !== points[2 * first + 1]) first = i;
        rep[i] = first;
      }
    }
    lo = hi;
  }
  const siteOfInput = new Int32Array(n);
  let count = 0;
  for (let i = 0; i < n; i++) siteOfInput[i] = rep[i] === i ? count++ : siteOfInput[rep[i]];
  const curveOrder = new Uint32Array(count);
  let m = 0;
  for (let k = 0; k < n; k++) {
    const i = ids[k];
    if (rep[i] === i) curveOrder[m++] = siteOfInput[i];
  }
  if (count === n) return { xy: points, count, siteOfInput, curveOrder };
  const xy = new Float64Array(2 * count);
  for (let i = 0; i < n; i++) {
    if (rep[i] !== i) continue;
    const s = siteOfInput[i];
    xy[2 * s] = points[2 * i];
    xy[2 * s + 1] = points[2 * i + 1];
  }
  return { xy, count, siteOfInput, curveOrder };
}
