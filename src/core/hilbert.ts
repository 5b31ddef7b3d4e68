import { boundingBox } from './bounds.js';

/**
 * Sorting points along a Hilbert curve. Points close on the curve are close
 * in the plane, so visiting them in this order keeps every walk short; equal
 * points get equal keys, which is how duplicates are found.
 */

const BITS = 16;
const MASK = (1 << BITS) - 1;

function spreadBits(x: number): number {
  x = (x | (x << 8)) & 0x00ff00ff;
  x = (x | (x << 4)) & 0x0f0f0f0f;
  x = (x | (x << 2)) & 0x33333333;
  return (x | (x << 1)) & 0x55555555;
}

/**
 * Index of cell (x, y), 0 <= x, y < 2^16, along a Hilbert curve. Branch-free:
 * the orientation changes of the curve are combined for all levels at once
 * by a parallel prefix over the bits (a log-depth form of the usual
 * level-by-level rotation); tested against curve adjacency.
 */
export function hilbertIndex(x: number, y: number): number {
  let a = x ^ y, b = MASK ^ a, c = MASK ^ (x | y), d = x & (y ^ MASK);
  let A = a | (b >> 1), B = (a >> 1) ^ a;
  let C = ((c >> 1) ^ (b & (d >> 1))) ^ c, D = ((a & (c >> 1)) ^ (d >> 1)) ^ d;
  a = A; b = B; c = C; d = D;
  A = (a & (a >> 2)) ^ (b & (b >> 2));
  B = (a & (b >> 2)) ^ (b & ((a ^ b) >> 2));
  C ^= (a & (c >> 2)) ^ (b & (d >> 2));
  D ^= (b & (c >> 2)) ^ ((a ^ b) & (d >> 2));
  a = A; b = B; c = C; d = D;
  A = (a & (a >> 4)) ^ (b & (b >> 4));
  B = (a & (b >> 4)) ^ (b & ((a ^ b) >> 4));
  C ^= (a & (c >> 4)) ^ (b & (d >> 4));
  D ^= (b & (c >> 4)) ^ ((a ^ b) & (d >> 4));
  a = A; b = B; c = C; d = D;
  C ^= (a & (c >> 8)) ^ (b & (d >> 8));
  D ^= (b & (c >> 8)) ^ ((a ^ b) & (d >> 8));
  a = C ^ (C >> 1);
  b = D ^ (D >> 1);
  const i0 = x ^ y, i1 = b | (MASK ^ (i0 | a));
  return ((spreadBits(i1) << 1) | spreadBits(i0)) >>> 0;
}

/**
 * Stable LSD radix sort of `ids` by 32-bit `keys`, in two 16-bit passes;
 * sorts both. Optional scratch arrays (n entries each) save allocating the
 * pass buffers; the two passes leave the result in `ids` and `keys`.
 */
export function radixSort(
  ids: Uint32Array, keys: Uint32Array, scratchIds?: Uint32Array, scratchKeys?: Uint32Array,
): { ids: Uint32Array; keys: Uint32Array } {
  const n = ids.length;
  let srcIds: Uint32Array = ids, srcKeys: Uint32Array = keys;
  let dstIds: Uint32Array = scratchIds ?? new Uint32Array(n), dstKeys: Uint32Array = scratchKeys ?? new Uint32Array(n);
  const counts = new Uint32Array(65537);
  for (let shift = 0; shift < 32; shift += 16) {
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[((srcKeys[i] >>> shift) & 0xffff) + 1]++;
    for (let b = 1; b <= 65536; b++) counts[b] += counts[b - 1];
    for (let i = 0; i < n; i++) {
      const pos = counts[(srcKeys[i] >>> shift) & 0xffff]++;
      dstIds[pos] = srcIds[i];
      dstKeys[pos] = srcKeys[i];
    }
    const ti = srcIds; srcIds = dstIds; dstIds = ti;
    const tk = srcKeys; srcKeys = dstKeys; dstKeys = tk;
  }
  return { ids: srcIds, keys: srcKeys };
}

/**
 * The indices 0..n-1 of the points in `xy` sorted by their Hilbert index over
 * the points' bounding square, with the sorted keys.
 */
export function hilbertSort(xy: Float64Array): { ids: Uint32Array; keys: Uint32Array } {
  const n = xy.length >> 1;
  const { minX, minY, maxX, maxY } = boundingBox(xy, n);
  const side = Math.max(maxX - minX, maxY - minY);
  // Slightly under 2^16 so that the largest coordinate still maps inside the grid.
  const scale = side > 0 ? (MASK + 0.999) / side : 0;
  const ids = new Uint32Array(n);
  const keys = new Uint32Array(n);
  for (let i = 0; i < n; i++) {
    ids[i] = i;
    const gx = Math.min(MASK, Math.floor((xy[2 * i] - minX) * scale));
    const gy = Math.min(MASK, Math.floor((xy[2 * i + 1] - minY) * scale));
    keys[i] = hilbertIndex(gx, gy);
  }
  return n < 2 ? { ids, keys } : radixSort(ids, keys);
}
