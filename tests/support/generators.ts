import fc from 'fast-check';

/**
 * fast-check arbitraries of interleaved point arrays [x0, y0, x1, y1, ...].
 *
 * The degenerate families are built so that their degeneracy is EXACT in
 * binary floating point: collinear points lie on lines with integer (or
 * power-of-two scaled) steps, cocircular points are integer lattice points on
 * x^2 + y^2 = R^2 (cos/sin points are not exactly cocircular), and perturbed
 * grids move coordinates by exactly one ulp. Every nonzero coordinate stays
 * inside ambit's accepted range [2^-120, 2^120].
 *
 * Point arrays use `size: 'max'`: fast-check's default size caps arrays at
 * about 10 elements whatever maxLength says.
 */

export type Pt = [number, number];

export interface NamedGenerator {
  name: string;
  arb: fc.Arbitrary<number[]>;
}

export function flatten(pts: readonly Pt[]): number[] {
  const out = new Array<number>(2 * pts.length);
  for (let i = 0; i < pts.length; i++) {
    out[2 * i] = pts[i][0];
    out[2 * i + 1] = pts[i][1];
  }
  return out;
}

// One shared 8-byte buffer viewed as a double and as a signed 64-bit integer:
// for finite doubles, stepping the integer view steps the value by one ulp.
const f64 = new Float64Array(1);
const i64 = new BigInt64Array(f64.buffer);

/** The next double above x (x finite, not the largest double). */
export function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  f64[0] = x;
  i64[0] += x > 0 ? 1n : -1n;
  return f64[0];
}

/** The next double below x (x finite, not the most negative double). */
export function nextDown(x: number): number {
  return -nextUp(-x);
}

/** All integer points on x^2 + y^2 = R^2, sorted by angle-free integer order. */
export function latticeCircle(R: number): Pt[] {
  const out: Pt[] = [];
  for (let x = -R; x <= R; x++) {
    const y2 = R * R - x * x;
    const y = Math.round(Math.sqrt(y2));
    if (y * y !== y2) continue;
    out.push([x, y]);
    if (y !== 0) out.push([x, -y]);
  }
  return out;
}

/**
 * Radii with many lattice points (products of primes 1 mod 4):
 * 5 -> 12, 25 -> 20, 65 -> 36, 325 -> 60, 1105 -> 108 points.
 */
export const RING_RADII = [5, 25, 65, 325, 1105] as const;

/** Deterministic permutation driven by generated keys (shrinks with them). */
export function permuteBy<T>(items: readonly T[], keys: readonly number[]): T[] {
  const out = items.slice();
  if (keys.length === 0) return out;
  for (let t = out.length - 1; t > 0; t--) {
    const j = keys[t % keys.length] % (t + 1);
    const tmp = out[t];
    out[t] = out[j];
    out[j] = tmp;
  }
  return out;
}

const keysArb = fc.array(fc.nat({ max: 1 << 20 }), { maxLength: 64 });

/**
 * A double uniform in [-2^(s-1), 2^(s-1)) with a full 53-bit mantissa: the
 * 53 random bits are exact, and subtracting 0.5 and scaling by 2^s are exact.
 */
const unit53 = fc
  .tuple(fc.integer({ min: 0, max: 2 ** 26 - 1 }), fc.integer({ min: 0, max: 2 ** 27 - 1 }))
  .map(([hi, lo]) => (hi * 2 ** 27 + lo) / 2 ** 53 - 0.5);

/** Uniform random points at a random power-of-two scale. */
export function uniform(maxN: number, minN = 1): fc.Arbitrary<number[]> {
  return fc
    .record({
      scale: fc.integer({ min: -10, max: 30 }),
      pts: fc.array(fc.tuple(unit53, unit53), { minLength: minN, maxLength: maxN, size: 'max' }),
    })
    .map(({ scale, pts }) => flatten(pts.map(([x, y]) => [x * 2 ** scale, y * 2 ** scale] as Pt)));
}

const smallInt = fc.integer({ min: -8, max: 8 });

/** Few distinct points (1..8), each repeated many times, in random order. */
export function duplicateHeavy(maxN: number): fc.Arbitrary<number[]> {
  const distinct = fc.oneof(
    fc.array(fc.tuple(smallInt, smallInt), { minLength: 1, maxLength: 8 }),
    fc.array(fc.tuple(unit53, unit53), { minLength: 1, maxLength: 8 }),
  );
  return fc
    .record({ distinct, picks: fc.array(fc.nat({ max: 1000 }), { minLength: 1, maxLength: maxN, size: 'max' }) })
    .map(({ distinct, picks }) => flatten(picks.map((k) => distinct[k % distinct.length])));
}

/**
 * Points on one line, all exactly collinear: horizontal, vertical, or slanted
 * through an integer base point with an integer direction, scaled by 2^-e
 * (every product stays below 2^53, so every coordinate is exact).
 */
export function collinear(maxN: number): fc.Arbitrary<number[]> {
  return fc
    .record({
      kind: fc.constantFrom('horizontal', 'vertical', 'slanted'),
      base: fc.tuple(fc.integer({ min: -(2 ** 20), max: 2 ** 20 }), fc.integer({ min: -(2 ** 20), max: 2 ** 20 })),
      dir: fc.tuple(fc.integer({ min: -1024, max: 1024 }), fc.integer({ min: 1, max: 1024 })),
      shift: fc.integer({ min: 0, max: 10 }),
      ks: fc.array(fc.integer({ min: -4096, max: 4096 }), { minLength: 1, maxLength: maxN, size: 'max' }),
    })
    .map(({ kind, base, dir, shift, ks }) => {
      const [dx, dy] = kind === 'horizontal' ? [1, 0] : kind === 'vertical' ? [0, 1] : dir;
      const s = 2 ** -shift;
      return flatten(ks.map((k) => [(base[0] + k * dx) * s, (base[1] + k * dy) * s] as Pt));
    });
}

/** A slanted collinear run (>= 3 points) mixed with other integer points. */
export function collinearMixed(maxN: number): fc.Arbitrary<number[]> {
  return fc
    .record({
      base: fc.tuple(fc.integer({ min: -50, max: 50 }), fc.integer({ min: -50, max: 50 })),
      dir: fc.tuple(fc.integer({ min: -7, max: 7 }), fc.integer({ min: 1, max: 7 })),
      ks: fc.uniqueArray(fc.integer({ min: -20, max: 20 }), { minLength: 3, maxLength: Math.max(3, maxN >> 1), size: 'max' }),
      others: fc.array(fc.tuple(fc.integer({ min: -150, max: 150 }), fc.integer({ min: -150, max: 150 })), {
        maxLength: maxN >> 1,
        size: 'max',
      }),
      keys: keysArb,
    })
    .map(({ base, dir, ks, others, keys }) => {
      const line = ks.map((k) => [base[0] + k * dir[0], base[1] + k * dir[1]] as Pt);
      return flatten(permuteBy([...line, ...others], keys));
    });
}

/** Parameters of a k x m lattice with origin o and spacing step * 2^-shift. */
const gridParams = (maxN: number) =>
  fc
    .record({
      k: fc.integer({ min: 1, max: 14 }),
      m: fc.integer({ min: 1, max: 14 }),
      origin: fc.tuple(fc.integer({ min: -1000, max: 1000 }), fc.integer({ min: -1000, max: 1000 })),
      step: fc.constantFrom(1, 3, 7),
      shift: fc.integer({ min: -3, max: 6 }),
    })
    .map((p) => ({ ...p, m: Math.max(1, Math.min(p.m, Math.floor(maxN / p.k))) }));

function gridPoints(p: { k: number; m: number; origin: Pt; step: number; shift: number }, offset = 0): Pt[] {
  const s = p.step * 2 ** -p.shift;
  const out: Pt[] = [];
  for (let i = 0; i < p.k; i++) {
    for (let j = 0; j < p.m; j++) out.push([offset + (p.origin[0] + i) * s, offset + (p.origin[1] + j) * s]);
  }
  return out;
}

/** A full k x m integer-like lattice (heavily cocircular), or a random part of one, shuffled. */
export function grid(maxN: number): fc.Arbitrary<number[]> {
  return fc
    .record({ p: gridParams(maxN), keys: keysArb, keep: fc.array(fc.boolean(), { maxLength: 64 }) })
    .map(({ p, keys, keep }) => {
      let pts = gridPoints(p);
      // An empty keep mask keeps the full lattice; otherwise it thins it.
      if (keep.length > 0) {
        const kept = pts.filter((_, i) => keep[i % keep.length]);
        if (kept.length > 0) pts = kept;
      }
      return flatten(permuteBy(pts, keys));
    });
}

/**
 * Exactly cocircular points: lattice points on x^2 + y^2 = R^2 around an
 * integer centre, scaled by a power of two, optionally with a second
 * concentric ring and the centre itself.
 */
export function ring(maxN: number): fc.Arbitrary<number[]> {
  return fc
    .record({
      r: fc.constantFrom(...RING_RADII),
      r2: fc.option(fc.constantFrom(...RING_RADII), { nil: undefined }),
      centre: fc.tuple(fc.integer({ min: -5000, max: 5000 }), fc.integer({ min: -5000, max: 5000 })),
      withCentre: fc.boolean(),
      shift: fc.integer({ min: -4, max: 8 }),
      keys: keysArb,
      keep: fc.array(fc.boolean(), { maxLength: 64 }),
    })
    .map(({ r, r2, centre, withCentre, shift, keys, keep }) => {
      let pts = latticeCircle(r);
      if (r2 !== undefined && r2 !== r) pts = pts.concat(latticeCircle(r2));
      if (keep.length > 0) {
        const kept = pts.filter((_, i) => keep[i % keep.length]);
        if (kept.length > 0) pts = kept;
      }
      if (withCentre) pts.push([0, 0]);
      pts = pts.slice(0, maxN);
      const s = 2 ** -shift;
      return flatten(permuteBy(pts, keys).map(([x, y]) => [(centre[0] + x) * s, (centre[1] + y) * s] as Pt));
    });
}

/**
 * A lattice, optionally moved by 1e7 first, whose coordinates are then moved
 * by -1, 0 or +1 ulp each: almost every 4-point set is nearly cocircular and
 * many triples are nearly collinear, which is what breaks inexact code.
 */
export function perturbedGrid(maxN: number, offset = 0): fc.Arbitrary<number[]> {
  return fc
    .record({
      p: gridParams(maxN),
      ulps: fc.array(fc.integer({ min: -1, max: 1 }), { minLength: 1, maxLength: 2 * maxN }),
      keys: keysArb,
    })
    .map(({ p, ulps, keys }) => {
      const flat = flatten(permuteBy(gridPoints(p, offset), keys));
      for (let i = 0; i < flat.length; i++) {
        const u = ulps[i % ulps.length];
        // 0 has no ulp neighbour inside the accepted range; leave it.
        if (flat[i] === 0 || u === 0) continue;
        flat[i] = u > 0 ? nextUp(flat[i]) : nextDown(flat[i]);
      }
      return flat;
    });
}

/** Any generator's points moved by (1e7, 1e7); non-integer coordinates round, which is fine. */
export function translated(arb: fc.Arbitrary<number[]>, dx = 1e7, dy = 1e7): fc.Arbitrary<number[]> {
  return arb.map((flat) => flat.map((v, i) => v + (i % 2 === 0 ? dx : dy)));
}

/** 1, 2 or 3 points, from small integers (collinear and duplicates likely) or uniform doubles. */
export function tiny(): fc.Arbitrary<number[]> {
  return fc.oneof(
    fc.array(fc.tuple(fc.integer({ min: -2, max: 2 }), fc.integer({ min: -2, max: 2 })), { minLength: 1, maxLength: 3 })
      .map(flatten),
    uniform(3),
  );
}

/** Every family, each also translated by 1e7. */
export function allGenerators(maxN: number): NamedGenerator[] {
  const base: NamedGenerator[] = [
    { name: 'uniform', arb: uniform(maxN) },
    { name: 'duplicate-heavy', arb: duplicateHeavy(maxN) },
    { name: 'collinear', arb: collinear(maxN) },
    { name: 'collinear-mixed', arb: collinearMixed(maxN) },
    { name: 'grid', arb: grid(maxN) },
    { name: 'ring', arb: ring(maxN) },
    { name: 'perturbed-grid', arb: perturbedGrid(maxN) },
    { name: 'tiny', arb: tiny() },
  ];
  const shifted = base
    .filter((g) => g.name !== 'perturbed-grid')
    .map((g) => ({ name: `${g.name} +1e7`, arb: translated(g.arb) }));
  // Perturb after translating, or rounding at 1e7 would erase the ulps.
  shifted.push({ name: 'perturbed-grid +1e7', arb: perturbedGrid(maxN, 1e7) });
  return [...base, ...shifted];
}
