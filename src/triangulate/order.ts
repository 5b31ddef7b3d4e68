import { mulberry32 } from '../core/random.js';

/**
 * BRIO, the biased randomised insertion order (Amenta, Choi, Rote 2003):
 * each site goes to the last round with probability 1/2, to the one before
 * with 1/4, and so on; rounds run first to last, each along the curve. The
 * random rounds bound the expected flipping work as a random order does,
 * while the curve keeps each walk short.
 */


/**
 * BRIO rounds over n sites already numbered along the Hilbert curve: the
 * numbers 0..n-1 in insertion order, each round in increasing (curve) order.
 */
export function brioOrder(n: number, seed = 0x2545f491, minRound = 64): Uint32Array {
  if (n <= minRound) return identityOrder(n);
  const random = mulberry32(seed);
  let rounds = 1;
  while ((n >>> rounds) > minRound) rounds++;
  const round = new Uint8Array(n);
  const start = new Uint32Array(rounds + 1);
  for (let i = 0; i < n; i++) {
    // Trailing zeros of a random word: r with probability 2^-(r+1); r = 0 is the last round.
    const u = random();
    const r = Math.min(u === 0 ? 32 : 31 - Math.clz32(u & -u), rounds - 1);
    round[i] = rounds - 1 - r;
    start[round[i] + 1]++;
  }
  for (let r = 1; r <= rounds; r++) start[r] += start[r - 1];
  const out = new Uint32Array(n);
  for (let i = 0; i < n; i++) out[start[round[i]]++] = i;
  return out;
}

/** 0, 1, ..., n-1. */
export function identityOrder(n: number): Uint32Array {
  const ids = new Uint32Array(n);
  for (let i = 0; i < n; i++) ids[i] = i;
  return ids;
}
