/**
 * Insertion orders. A spatially coherent order keeps each point-location
 * walk short; BRIO (Amenta, Choi, Rote 2003) adds random rounds of doubling
 * size so that the expected amount of flipping stays that of a random order.
 */

const HILBERT_BITS = 16;

/** Index of (x, y) along a Hilbert curve over a 2^16 × 2^16 grid. */
function hilbertIndex(x: number, y: number): number {
  let d = 0;
  for (let s = 1 << (HILBERT_BITS - 1); s > 0; s >>>= 1) {
    const rx = (x & s) > 0 ? 1 : 0;
    const ry = (y & s) > 0 ? 1 : 0;
    d += s * s * ((3 * rx) ^ ry);
    if (ry === 0) {
      if (rx === 1) {
        x = s - 1 - x;
        y = s - 1 - y;
      }
      const t = x; x = y; y = t;
    }
  }
  return d;
}

/** Hilbert keys (unsigned 32-bit) of the sites listed in `ids`. */
function hilbertKeys(xy: Float64Array, ids: Uint32Array): Uint32Array {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < ids.length; i++) {
    const x = xy[2 * ids[i]], y = xy[2 * ids[i] + 1];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  const side = Math.max(maxX - minX, maxY - minY);
  const scale = side > 0 ? ((1 << HILBERT_BITS) - 1) / side : 0;
  const keys = new Uint32Array(ids.length);
  for (let i = 0; i < ids.length; i++) {
    const gx = Math.floor((xy[2 * ids[i]] - minX) * scale);
    const gy = Math.floor((xy[2 * ids[i] + 1] - minY) * scale);
    keys[i] = hilbertIndex(gx, gy) >>> 0;
  }
  return keys;
}

/** Stable LSD radix sort of `ids` by 32-bit `keys`, two 16-bit passes. */
function radixSortByKey(ids: Uint32Array, keys: Uint32Array): Uint32Array {
  const n = ids.length;
  let srcIds: Uint32Array = ids, srcKeys: Uint32Array = keys;
  let dstIds: Uint32Array = new Uint32Array(n), dstKeys: Uint32Array = new Uint32Array(n);
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
  return srcIds;
}

/** Sorts the sites in `ids` along a Hilbert curve over their bounding box. */
export function hilbertSort(xy: Float64Array, ids: Uint32Array): Uint32Array {
  if (ids.length < 2) return ids;
  return radixSortByKey(ids, hilbertKeys(xy, ids));
}

/** A small seeded generator (mulberry32): the order must be deterministic. */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (t ^ (t >>> 14)) >>> 0;
  };
}

/**
 * BRIO: each site goes to the last round with probability 1/2, to the one
 * before with 1/4, and so on; rounds run first to last, each in Hilbert
 * order. Rounds smaller than `minRound` sites are merged into one.
 */
export function brioOrder(xy: Float64Array, ids: Uint32Array, seed = 0x2545f491, minRound = 64): Uint32Array {
  const n = ids.length;
  if (n <= minRound) return hilbertSort(xy, ids);
  const random = mulberry32(seed);
  let rounds = 1;
  while ((n >>> rounds) > minRound) rounds++;
  const round = new Uint8Array(n);
  const counts = new Uint32Array(rounds + 1);
  for (let i = 0; i < n; i++) {
    // Trailing zeros of a random word: r with probability 2^-(r+1); r = 0 is the last round.
    const u = random();
    const r = Math.min(u === 0 ? 32 : 31 - Math.clz32(u & -u), rounds - 1);
    round[i] = rounds - 1 - r;
    counts[round[i] + 1]++;
  }
  for (let r = 1; r <= rounds; r++) counts[r] += counts[r - 1];
  const out = new Uint32Array(n);
  const start = counts.slice();
  for (let i = 0; i < n; i++) out[start[round[i]]++] = ids[i];
  for (let r = 0; r < rounds; r++) {
    const part = out.subarray(counts[r], counts[r + 1]);
    part.set(hilbertSort(xy, part.slice()));
  }
  return out;
}
