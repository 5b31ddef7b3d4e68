import { describe, expect, it } from 'vitest';
import { balanceTerritories, checkMesh, InputError, type BalanceProgress } from '../../src/index.js';
import { balanceAreas } from '../../src/analyze/balance-areas.js';
import { balanceDemand } from '../../src/analyze/balance-demand.js';
import { prng } from '../support/live-cases.js';
import { brutePowerCellArea, brutePowerCells, brutePowerNearest } from '../support/power-brute.js';

/**
 * Balanced territories. Every size the solver claims is checked against the
 * brute-force power cells of tests/support/power-brute.ts (the region cut by
 * one radical-line half-plane per other site; Aurenhammer 1987), computed
 * from the returned weights, so no test trusts the diagram code it drives.
 */

const UNIT_SQUARE = { minX: 0, minY: 0, maxX: 1, maxY: 1 };
const SQUARE_RING = Float64Array.of(0, 0, 1, 0, 1, 1, 0, 1);

function randomSites(seed: number, n: number, lo = 0, hi = 1): Float64Array {
  const rnd = prng(seed);
  return new Float64Array(2 * n).map(() => lo + (hi - lo) * rnd());
}

function randomShares(seed: number, n: number): Float64Array {
  const rnd = prng(seed);
  return new Float64Array(n).map(() => 0.2 + rnd());
}

function expectInputError(f: () => unknown, code: string, field?: string, index?: number): void {
  let caught: unknown;
  try { f(); } catch (e) { caught = e; }
  expect(caught, `expected InputError ${code}`).toBeInstanceOf(InputError);
  const e = caught as InputError;
  expect(e.code).toBe(code);
  if (field !== undefined) expect(e.field).toBe(field);
  if (index !== undefined) expect(e.index).toBe(index);
}

describe('Newton solver on brute-force power cells (independent of the diagram code)', () => {
  it('reaches random target areas for 150 sites within 1e-9 relative, quadratically at the end', () => {
    const n = 150, xy = randomSites(11, n), shares = randomShares(12, n);
    let sum = 0;
    for (const s of shares) sum += s;
    const targets = shares.map((s) => s / sum);
    const errors: number[] = [];
    const r = balanceAreas(xy, targets, (w) => brutePowerCells(xy, w, SQUARE_RING), {
      maxIterations: 50, tolerance: 1e-9, onProgress: (p) => errors.push(p.maxRelativeError),
    });
    expect(r.converged).toBe(true);
    expect(r.maxRelativeError).toBeLessThanOrEqual(1e-9);
    const final = brutePowerCells(xy, r.weights, SQUARE_RING).areas;
    for (let i = 0; i < n; i++) expect(Math.abs(final[i] - targets[i]) / targets[i]).toBeLessThanOrEqual(1e-9);
    // Newton near the solution: the last step squares the error (up to a constant); one order of magnitude at least.
    const k = errors.length - 1;
    expect(errors[k]).toBeLessThan(errors[k - 1] * 1e-1);
    expect(Math.min(...r.weights)).toBe(0);
  });

  it('demand mode brings every site within one unit point of its target on skewed demand', () => {
    const n = 40, count = 4000, xy = randomSites(21, n);
    const rnd = prng(22);
    // Demand crowded into one corner: most sites start far from their targets.
    const pts = new Float64Array(2 * count).map(() => rnd() ** 2);
    const mass = new Float64Array(count).fill(1);
    const targets = new Float64Array(n).fill(count / n);
    const all = Int32Array.from({ length: n }, (_, i) => i);
    const r = balanceDemand(xy, targets, pts, mass, (w) => ({
      ...brutePowerCells(xy, w, SQUARE_RING),
      owner: Int32Array.from({ length: count }, (_, k) => brutePowerNearest(xy, w, pts[2 * k], pts[2 * k + 1])),
      competitors: (i: number) => all.filter((j) => j !== i),
    }), { maxIterations: 200, tolerance: 1e-6 });
    console.info(`demand, brute force: ${n} sites, ${count} points, ${r.iterations} rounds, max relative error ${r.maxRelativeError}`);
    expect(r.converged).toBe(true);
    // Within one point of every target (the documented guarantee); counted again here by brute force.
    const loads = new Float64Array(n);
    for (let k = 0; k < count; k++) loads[brutePowerNearest(xy, r.weights, pts[2 * k], pts[2 * k + 1])]++;
    for (let i = 0; i < n; i++) expect(Math.abs(loads[i] - targets[i]), `site ${i}`).toBeLessThanOrEqual(1);
    expect(Array.from(loads)).toEqual(Array.from(r.loads));
  });
});

describe('balanceTerritories: area mode', () => {
  it('1000 sites in a square reach random target shares within 1e-6 relative in at most 50 iterations', () => {
    const n = 1000, xy = randomSites(101, n), shares = randomShares(102, n);
    const progress: BalanceProgress[] = [];
    const r = balanceTerritories(xy, { clip: UNIT_SQUARE, shares, onProgress: (p) => progress.push(p) });
    console.info(`balance 1000 sites, random shares: ${r.iterations} iterations, max relative error ${r.maxRelativeError}`);
    expect(r.converged).toBe(true);
    expect(r.iterations).toBeLessThanOrEqual(50);
    expect(r.maxRelativeError).toBeLessThanOrEqual(1e-6);
    expect(progress.map((p) => p.iteration)).toEqual(Array.from({ length: r.iterations + 1 }, (_, i) => i));
    expect(progress[progress.length - 1].maxRelativeError).toBe(r.maxRelativeError);
    expect(checkMesh(r.diagram.mesh).ok).toBe(true);
    let sum = 0;
    for (const s of shares) sum += s;
    const areas = r.diagram.cellAreas();
    let total = 0;
    for (let i = 0; i < n; i++) {
      total += areas[i];
      expect(Math.abs(areas[i] - shares[i] / sum) / (shares[i] / sum), `site ${i}`).toBeLessThanOrEqual(1e-6);
      expect(r.sizes[i]).toBe(areas[i]);
    }
    expect(total).toBeCloseTo(1, 12);
    // An independent look at 40 cells: brute-force clipping with the returned weights.
    const rnd = prng(103);
    for (let k = 0; k < 40; k++) {
      const i = Math.floor(rnd() * n), want = shares[i] / sum;
      expect(Math.abs(brutePowerCellArea(xy, r.weights, SQUARE_RING, i) - want) / want, `site ${i}, brute force`).toBeLessThanOrEqual(2e-6);
    }
  });

  it('equal targets on a square lattice of sites give equal areas from the first diagram', () => {
    const k = 12, xy: number[] = [];
    for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) xy.push((i + 0.5) / k, (j + 0.5) / k);
    const progress: BalanceProgress[] = [];
    const r = balanceTerritories(xy, { clip: UNIT_SQUARE, onProgress: (p) => progress.push(p) });
    expect(progress[0].iteration).toBe(0);
    expect(progress[0].maxRelativeError).toBeLessThanOrEqual(1e-12);
    expect(r.iterations).toBe(0);
    expect(Array.from(r.weights)).toEqual(new Array(k * k).fill(0));
    for (const a of r.diagram.cellAreas()) expect(Math.abs(a - 1 / (k * k)) * k * k).toBeLessThanOrEqual(1e-12);
  });

  it('a lattice in a polygon region with unequal targets: absolute targets, any orientation of the region', () => {
    const region = [[0, 0], [0, 4], [2, 5], [4, 4], [4, 0]] as [number, number][]; // clockwise, area 18
    const xy: number[] = [];
    for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) xy.push(0.3 + 0.65 * i, 0.3 + 0.65 * j);
    const n = xy.length / 2, rnd = prng(7);
    const raw = Array.from({ length: n }, () => 1 + 3 * rnd());
    const s = raw.reduce((a, b) => a + b, 0);
    const targets = raw.map((v) => (18 * v) / s);
    const r = balanceTerritories(xy, { clip: region, targets, tolerance: 1e-9 });
    expect(r.converged).toBe(true);
    const ring = Float64Array.from(r.diagram.region);
    for (let i = 0; i < n; i++) {
      expect(Math.abs(brutePowerCellArea(Float64Array.from(xy), r.weights, ring, i) - targets[i]) / targets[i]).toBeLessThanOrEqual(1e-8);
    }
  });

  it('stops at maxIterations and says it did not converge', () => {
    const xy = randomSites(5, 300), shares = randomShares(6, 300).map((v) => v ** 4);
    const seen: number[] = [];
    const r = balanceTerritories(xy, { clip: UNIT_SQUARE, shares, maxIterations: 1, onProgress: (p) => seen.push(p.iteration) });
    expect(r.iterations).toBe(1);
    expect(seen).toEqual([0, 1]);
    expect(r.converged).toBe(false);
    expect(r.maxRelativeError).toBeGreaterThan(1e-6);
    const zero = balanceTerritories(xy, { clip: UNIT_SQUARE, shares, maxIterations: 0 });
    expect(zero.iterations).toBe(0);
    expect(Array.from(zero.weights)).toEqual(new Array(300).fill(0));
  });

  it('one site gets the whole region', () => {
    const r = balanceTerritories([[0.3, 0.4]], { clip: UNIT_SQUARE });
    expect(r.converged).toBe(true);
    expect(r.sizes[0]).toBeCloseTo(1, 14);
  });
});

describe('balanceTerritories: demand mode', () => {
  it('weighted demand points: every site within one point of its target, recounted by brute force', () => {
    const n = 25, count = 2500, xy = randomSites(31, n, 0, 10);
    const rnd = prng(32);
    const pts = new Float64Array(2 * count).map(() => 10 * Math.sqrt(rnd()));
    const weights = Array.from({ length: count }, () => 1 + Math.floor(3 * rnd()));
    const shares = randomShares(33, n);
    const r = balanceTerritories(xy, { clip: { minX: 0, minY: 0, maxX: 10, maxY: 10 }, shares, demand: { points: pts, weights }, maxIterations: 200 });
    console.info(`demand: ${n} sites, ${count} points of weight 1..3, ${r.iterations} iterations, max relative error ${r.maxRelativeError}`);
    expect(r.converged).toBe(true);
    const total = weights.reduce((a, b) => a + b, 0), sum = shares.reduce((a, b) => a + b, 0);
    const loads = new Float64Array(n);
    for (let k = 0; k < count; k++) loads[brutePowerNearest(xy, r.weights, pts[2 * k], pts[2 * k + 1])] += weights[k];
    for (let i = 0; i < n; i++) {
      expect(loads[i], `site ${i}`).toBe(r.sizes[i]);
      expect(Math.abs(loads[i] - (total * shares[i]) / sum), `site ${i}`).toBeLessThanOrEqual(3);
    }
  });

  it('needs no clip region, and keeps site numbering', () => {
    const xy: [number, number][] = [[0, 0], [1, 0], [0, 1], [1, 1]];
    const pts: [number, number][] = [[0.1, 0.1], [0.2, 0.1], [0.1, 0.2], [0.9, 0.9]];
    const r = balanceTerritories(xy, { demand: { points: pts } });
    expect(r.converged).toBe(true);
    expect(Array.from(r.sizes)).toEqual([1, 1, 1, 1]);
  });
});

describe('balanceTerritories: typed errors', () => {
  const xy: [number, number][] = [[0.2, 0.2], [0.8, 0.3], [0.5, 0.8]];
  it('targets that are not positive finite numbers', () => {
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [0.5, 0.5, 0] }), 'not-positive', 'targets', 2);
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [1.5, -0.5, 0] }), 'not-positive', 'targets', 1);
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, shares: [1, NaN, 1] }), 'not-positive', 'shares', 1);
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, shares: [1, 1, Infinity] }), 'not-positive', 'shares', 2);
  });
  it('targets that do not add up to the region area (shares are scaled instead)', () => {
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [0.5, 0.5, 0.5] }), 'targets-sum', 'targets');
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [0.3, 0.3, 0.3] }), 'targets-sum', 'targets');
    expect(balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [0.25, 0.25, 0.5] }).converged).toBe(true);
    expect(balanceTerritories(xy, { clip: UNIT_SQUARE, shares: [1, 1, 2] }).converged).toBe(true);
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [1, 1, 1], shares: [1, 1, 1] }), 'bad-option', 'targets');
  });
  it('wrong lengths', () => {
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, shares: [1, 1] }), 'bad-length', 'shares');
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, targets: [0.25, 0.25, 0.25, 0.25] }), 'bad-length', 'targets');
    expectInputError(() => balanceTerritories(xy, { demand: { points: [[0, 0], [1, 1]], weights: [1] } }), 'bad-length', 'demand.weights');
  });
  it('sites outside the region, or repeated', () => {
    expectInputError(() => balanceTerritories([...xy, [1.5, 0.5]], { clip: UNIT_SQUARE }), 'site-outside', 'sites', 3);
    expectInputError(() => balanceTerritories([...xy, [0.5, -1e-30]], { clip: UNIT_SQUARE }), 'site-outside', 'sites', 3);
    expectInputError(() => balanceTerritories([...xy, [0.8, 0.3]], { clip: UNIT_SQUARE }), 'duplicate-site', 'sites', 3);
    // On the boundary is inside (the cell is not empty).
    expect(balanceTerritories([...xy, [1, 0.5], [0, 0]], { clip: UNIT_SQUARE }).converged).toBe(true);
  });
  it('bad options and demand', () => {
    expectInputError(() => balanceTerritories(xy, {}), 'bad-option', 'clip');
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, maxIterations: 2.5 }), 'bad-option', 'maxIterations');
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, tolerance: 0 }), 'bad-option', 'tolerance');
    expectInputError(() => balanceTerritories(xy, { clip: UNIT_SQUARE, tolerance: NaN }), 'bad-option', 'tolerance');
    expectInputError(() => balanceTerritories(xy, { demand: { points: [[0, 0], [1, NaN]] } }), 'not-finite', 'demand.points', 1);
    expectInputError(() => balanceTerritories(xy, { demand: { points: [[0, 0], [1, 1]], weights: [1, 0] } }), 'not-positive', 'demand.weights', 1);
    expectInputError(() => balanceTerritories(xy, { clip: { minX: 0, minY: 0, maxX: 1, maxY: NaN } }), 'not-finite', 'clip');
    expectInputError(() => balanceTerritories([[0, NaN]], { clip: UNIT_SQUARE }), 'not-finite', 'y', 0);
  });
});
