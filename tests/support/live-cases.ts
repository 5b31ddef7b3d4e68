import { it } from 'vitest';
import { mulberry32 } from '../../src/core/random.js';
import { scipyAvailability } from './scipy.js';

/** Uniform numbers in [0, 1) from a seed, so a failing live case can be replayed. */
export function prng(seed: number): () => number {
  const words = mulberry32(seed);
  return () => words() / 4294967296;
}

export interface LiveCase { name: string; points: [number, number][]; shift: [number, number] }

/**
 * Fresh random inputs for the live comparisons with scipy: uniform,
 * Gaussian clusters, optionally duplicate-heavy, and points near 1e7. Qhull
 * merges points near 1e7, so scipy is given them moved back by `shift`, an
 * offset whose subtraction is exact (Sterbenz); a translation changes neither
 * the triangulation nor the diagram's combinatorics.
 */
export function liveCases(seed: number, minPoints: number, withDuplicates: boolean): LiveCase[] {
  const rnd = prng(seed);
  const n = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1));
  const cases: LiveCase[] = [];
  cases.push({ name: 'uniform', points: Array.from({ length: n(minPoints, 2000) }, () => [rnd(), rnd()] as [number, number]), shift: [0, 0] });
  const centres = Array.from({ length: n(1, 8) }, () => [rnd() * 200 - 100, rnd() * 200 - 100]);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());
  const clustered = Array.from({ length: n(Math.max(minPoints, 10), 1000) }, () => {
    const c = centres[n(0, centres.length - 1)];
    return [c[0] + gauss(), c[1] + gauss()] as [number, number];
  });
  cases.push({ name: 'clusters', points: clustered, shift: [0, 0] });
  if (withDuplicates) {
    const distinct = Array.from({ length: n(3, 200) }, () => [rnd() * 50, rnd() * 50] as [number, number]);
    const dups = Array.from({ length: 3 * distinct.length }, () => distinct[n(0, distinct.length - 1)]);
    cases.push({ name: 'duplicates', points: dups, shift: [0, 0] });
  }
  const big = Array.from({ length: n(minPoints, 800) }, () => [1e7 + rnd() * 100, 1e7 + rnd() * 100] as [number, number]);
  cases.push({ name: 'offset 1e7', points: big, shift: [1e7, 1e7] });
  return cases;
}

/** The seed of a live run: AMBIT_SEED replays one, else the clock picks it. */
export function liveSeed(): number {
  return Number(process.env.AMBIT_SEED ?? Date.now() % 2 ** 31);
}

/**
 * Call inside a describe block of a live scipy comparison. Without Debian's
 * scipy it registers one test that fails under CI (CI installs
 * python3-scipy, so a missing reference there is a failure) or is skipped
 * with the reason elsewhere, and returns null; with scipy it returns scipy's version.
 */
export function scipyOrSkip(title: string): string | null {
  const avail = scipyAvailability();
  if (avail.ok) return avail.version ?? 'unknown';
  if (process.env.CI) {
    it(title, () => {
      throw new Error(`${avail.reason}; CI requires the live scipy comparison`);
    });
  } else {
    it.skip(`${title}: SKIPPED because ${avail.reason}`, () => {});
  }
  return null;
}
