// Point distributions for the benchmark. Every generator is deterministic for a given
// (n, seed) and returns interleaved x,y in a Float64Array.

// Small seeded PRNG: a Weyl sequence (golden-ratio increment) fed through an
// xor-shift/multiply finaliser. The mixing constants are the widely circulated
// 32-bit integer-hash ones (common practice, no source); statistical quality is
// plenty for placing benchmark points, it is not meant for anything else.
export function makeRng(seed) {
  let state = (seed ^ 0x5bd1e995) >>> 0;
  const u32 = () => {
    state = (state + 0x9e3779b9) >>> 0;
    let z = state;
    z = Math.imul(z ^ (z >>> 16), 0x21f0aaad);
    z = Math.imul(z ^ (z >>> 15), 0x735a2d97);
    return (z ^ (z >>> 15)) >>> 0;
  };
  // 53 random bits -> uniform double in [0, 1), every value exactly representable.
  const next = () => ((u32() >>> 5) * 67108864 + (u32() >>> 6)) / 9007199254740992;
  return { u32, next };
}

/** Unit square, independent uniform coordinates. */
export function uniform(n, seed = 1) {
  const rng = makeRng(seed);
  const out = new Float64Array(2 * n);
  for (let i = 0; i < 2 * n; i++) out[i] = rng.next();
  return out;
}

/**
 * Clustered: Gaussian blobs around ~sqrt(n)/4 random centres in the unit square, each
 * blob with its own spread so that densities differ by up to 5x between clusters.
 */
export function gauss(n, seed = 1) {
  const rng = makeRng(seed);
  const k = Math.max(1, Math.round(Math.sqrt(n) / 4));
  const cx = new Float64Array(k);
  const cy = new Float64Array(k);
  const sigma = new Float64Array(k);
  // Centre spacing is about 1/sqrt(k); sigmas of 2%..10% of that keep blobs mostly apart.
  for (let c = 0; c < k; c++) {
    cx[c] = rng.next();
    cy[c] = rng.next();
    sigma[c] = (0.02 + 0.08 * rng.next()) / Math.sqrt(k);
  }
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const c = rng.u32() % k;
    // Box-Muller; 1 - next() lies in (0, 1], so the log is finite.
    const r = Math.sqrt(-2 * Math.log(1 - rng.next())) * sigma[c];
    const a = 2 * Math.PI * rng.next();
    out[2 * i] = cx[c] + r * Math.cos(a);
    out[2 * i + 1] = cy[c] + r * Math.sin(a);
  }
  return out;
}

/**
 * Integer lattice, side ceil(sqrt(n)), filled row by row (the last row may be partial
 * when n is not a square). Exact integers, so every unit square is four cocircular points.
 * The seed is unused: the lattice is the lattice.
 */
export function grid(n) {
  const side = Math.ceil(Math.sqrt(n));
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    out[2 * i] = i % side;
    out[2 * i + 1] = Math.floor(i / side);
  }
  return out;
}

/**
 * Halton sequence, base 2 for x and base 3 for y, indices seed+1 .. seed+n (index 0 is
 * the origin and is skipped). The radical inverse is built as an integer numerator over
 * b^digits and divided once, so every coordinate is the correctly rounded double.
 */
export function halton(n, seed = 0) {
  const out = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    out[2 * i] = radicalInverse(seed + i + 1, 2);
    out[2 * i + 1] = radicalInverse(seed + i + 1, 3);
  }
  return out;
}

function radicalInverse(index, base) {
  let num = 0;
  let den = 1;
  for (let k = index; k > 0; k = Math.floor(k / base)) {
    num = num * base + (k % base);
    den *= base;
  }
  return num / den;
}

// ---------------------------------------------------------------------------------------
// ring: exactly cocircular points.
//
// Points from cos/sin are not exactly on one circle, so we use lattice points of
// x^2 + y^2 = R^2. Number theory (sum of two squares theorem; the count is
// r2(R^2) = 4 * prod over primes p = 1 mod 4 of (2e_p + 1) for R = prod p^e_p, from memory
// of the standard result) tells how many there are, and Gaussian integers construct
// them: with p = a^2 + b^2 and pi = a + bi, every z with |z| = R is a unit times
// prod_p pi^j * conj(pi)^(2e_p - j), j = 0..2e_p. All of them are distinct.
//
// Coordinates must be exact doubles, so |x|, |y| <= R <= 2^53. The richest such circle
// has R = 5^2*13*17*29*37*41*53*61*73*89 (about 2^52.2) with 393,660 lattice points; no
// circle with R <= 2^53 has more. Requests for more points than that get all 393,660
// (the benchmark row then reports the n it actually ran). For smaller n we take the
// smallest R that has at least n points and keep n of them evenly spaced by angle.
// Finally everything is scaled by a power of two into [-1, 1], which is exact.
// ---------------------------------------------------------------------------------------

const PRIMES_1_MOD_4 = [5, 13, 17, 29, 37, 41, 53, 61, 73, 89, 97, 101, 109, 113, 137, 149];
const MAX_R = 2n ** 53n;

/** Largest number of exactly representable cocircular lattice points (see above). */
export const RING_MAX_POINTS = 393660;

// All R <= 2^53 built from the primes above with non-increasing exponents (any other
// exponent pattern has the same count with a larger R), as [count, R, factors].
function ringRadii() {
  const found = [];
  const walk = (i, r, count, factors, maxExp) => {
    found.push({ count: 4 * count, r, factors });
    if (i >= PRIMES_1_MOD_4.length) return;
    const p = BigInt(PRIMES_1_MOD_4[i]);
    let rr = r * p;
    for (let e = 1; e <= maxExp && rr <= MAX_R; e++, rr *= p) {
      walk(i + 1, rr, count * (2 * e + 1), [...factors, [PRIMES_1_MOD_4[i], e]], e);
    }
  };
  walk(0, 1n, 1, [], 64);
  return found;
}

function chooseRadius(n) {
  const radii = ringRadii();
  const enough = radii.filter((c) => c.count >= n);
  if (enough.length > 0) return enough.reduce((a, c) => (c.r < a.r ? c : a));
  return radii.reduce((a, c) => (c.count > a.count ? c : a));
}

function twoSquares(p) {
  for (let a = 1; a * a < p; a++) {
    const b = Math.round(Math.sqrt(p - a * a));
    if (a * a + b * b === p) return [BigInt(a), BigInt(b)];
  }
  throw new Error(`${p} is not a sum of two squares`);
}

/** Exactly cocircular points on a circle centred at the origin, radius <= 1. */
export function ring(n) {
  const { r, factors } = chooseRadius(n);
  // Gaussian integer products, one factor per prime: start from 1 + 0i.
  let xs = [1n];
  let ys = [0n];
  for (const [p, e] of factors) {
    const [a, b] = twoSquares(p);
    const opts = [];
    for (let j = 0; j <= 2 * e; j++) {
      let ox = 1n;
      let oy = 0n;
      for (let t = 0; t < j; t++) [ox, oy] = [ox * a - oy * b, ox * b + oy * a];
      for (let t = 0; t < 2 * e - j; t++) [ox, oy] = [ox * a + oy * b, oy * a - ox * b];
      opts.push([ox, oy]);
    }
    const nx = [];
    const ny = [];
    for (let k = 0; k < xs.length; k++) {
      for (const [ox, oy] of opts) {
        nx.push(xs[k] * ox - ys[k] * oy);
        ny.push(xs[k] * oy + ys[k] * ox);
      }
    }
    xs = nx;
    ys = ny;
  }
  const total = 4 * xs.length;
  const px = new Float64Array(total);
  const py = new Float64Array(total);
  const r2 = r * r;
  for (let k = 0; k < xs.length; k++) {
    const x = xs[k];
    const y = ys[k];
    if (x * x + y * y !== r2) throw new Error('ring: lattice point off the circle');
    const fx = Number(x);
    const fy = Number(y);
    if (BigInt(fx) !== x || BigInt(fy) !== y) throw new Error('ring: coordinate not exact');
    // The four unit multiples: 1, i, -1, -i.
    px[4 * k] = fx; py[4 * k] = fy;
    px[4 * k + 1] = -fy; py[4 * k + 1] = fx;
    px[4 * k + 2] = -fx; py[4 * k + 2] = -fy;
    px[4 * k + 3] = fy; py[4 * k + 3] = -fx;
  }
  const byAngle = new Uint32Array(total);
  const angle = new Float64Array(total);
  for (let k = 0; k < total; k++) {
    byAngle[k] = k;
    angle[k] = Math.atan2(py[k], px[k]);
  }
  byAngle.sort((i, j) => angle[i] - angle[j]);
  const m = Math.min(n, total);
  // Power of two at or above R: scaling by its inverse is exact and lands in [-1, 1].
  const scale = 2 ** -Number(r).toString(2).length;
  const out = new Float64Array(2 * m);
  for (let i = 0; i < m; i++) {
    const k = byAngle[Math.floor((i * total) / m)];
    // "+ 0" turns the -0 that the unit multiples produce from a zero coordinate into +0.
    out[2 * i] = px[k] * scale + 0;
    out[2 * i + 1] = py[k] * scale + 0;
  }
  return out;
}

/** Registry: name -> (n, seed) => Float64Array. Add a distribution with one line here. */
export const distributions = {
  uniform,
  gauss,
  grid,
  ring,
  halton,
};
