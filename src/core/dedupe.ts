/** Distinct sites of a point set, and where every input point went. */
export interface SiteSet {
  /** Interleaved x, y of the distinct sites, in order of first appearance. */
  xy: Float64Array;
  /** Number of distinct sites. */
  count: number;
  /** For input point i, the site it was merged onto. */
  siteOfInput: Int32Array;
}

/**
 * Merges exactly equal points (bit for bit, after -0 became 0) in linear
 * expected time with an open-addressing hash table. Site numbers follow the
 * first appearance of each point, so the result depends only on the input.
 */
export function mergeDuplicates(points: Float64Array): SiteSet {
  const n = points.length >> 1;
  const words = new Uint32Array(points.buffer, points.byteOffset, points.length * 2);
  let size = 1;
  while (size < 2 * n) size <<= 1;
  const mask = size - 1;
  const table = new Int32Array(size).fill(-1);
  const siteOfInput = new Int32Array(n);
  const firstInput = new Int32Array(n);
  let count = 0;
  for (let i = 0; i < n; i++) {
    const w = 4 * i;
    let h = Math.imul(words[w] ^ Math.imul(words[w + 1], 0x27d4eb2d), 0x9e3779b1);
    h ^= Math.imul(words[w + 2] ^ Math.imul(words[w + 3], 0x165667b1), 0x85ebca77);
    h ^= h >>> 15;
    let slot = h & mask;
    for (;;) {
      const s = table[slot];
      if (s < 0) {
        table[slot] = count;
        firstInput[count] = i;
        siteOfInput[i] = count++;
        break;
      }
      const j = 2 * firstInput[s];
      if (points[j] === points[2 * i] && points[j + 1] === points[2 * i + 1]) {
        siteOfInput[i] = s;
        break;
      }
      slot = (slot + 1) & mask;
    }
  }
  if (count === n) return { xy: points, count, siteOfInput };
  const xy = new Float64Array(2 * count);
  for (let s = 0; s < count; s++) {
    xy[2 * s] = points[2 * firstInput[s]];
    xy[2 * s + 1] = points[2 * firstInput[s] + 1];
  }
  return { xy, count, siteOfInput };
}
