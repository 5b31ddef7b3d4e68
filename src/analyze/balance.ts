import { InputError } from '../core/errors.js';
import { readPoints, type PointInput } from '../core/input.js';
import { orient } from '../core/predicates.js';
import { readClipRegion, type ClipRegion } from '../diagram/region.js';
import { voronoi, type VoronoiDiagram } from '../diagram/voronoi.js';
import { balanceAreas, type BalanceProgress } from './balance-areas.js';
import { balanceDemand } from './balance-demand.js';
import { measureCells } from './power-measure.js';
import { checkOptionNames } from '../core/options.js';

export type { BalanceProgress } from './balance-areas.js';

export interface BalanceOptions {
  /** The region to divide: a rectangle or a convex polygon (as for voronoi). Required unless `demand` is given. */
  clip?: ClipRegion;
  /** The size each site's cell should have: areas (or demand amounts) summing to the total, within 1e-9 relative. */
  targets?: ArrayLike<number>;
  /** Relative sizes, any positive scale: normalised to the region's area (or the total demand). */
  shares?: ArrayLike<number>;
  /** Balance demand instead of area: the size of a cell is the total weight of the demand points in it. */
  demand?: { points: PointInput; weights?: ArrayLike<number> };
  /** Cap on improving steps (diagram rebuilds with a new weight vector accepted). Default 50. */
  maxIterations?: number;
  /** Stop when every |size - target| / target is at most this. Default 1e-6. */
  tolerance?: number;
  /** Called after the first diagram (iteration 0) and after every accepted step. */
  onProgress?: (info: BalanceProgress) => void;
}

export interface BalanceResult {
  /** One weight per site (power distance |p - s|^2 - w), the smallest 0: weights matter only up to a common constant. */
  weights: Float64Array;
  /** The power diagram of the sites with those weights, clipped to the region. */
  diagram: VoronoiDiagram;
  /** Each site's size in the final diagram: its cell's area, or the demand its cell holds. */
  sizes: Float64Array;
  iterations: number;
  maxRelativeError: number;
  /** Area mode: every site within the tolerance. Demand mode: within the tolerance or within one demand point's weight. */
  converged: boolean;
}

const optionError = (code: string, message: string, field: string, index = -1) => new InputError(code, message, index, field);

function readCount(v: unknown, field: string, fallback: number): number {
  if (v === undefined) return fallback;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 0) throw optionError('bad-option', `${field} must be a whole number >= 0, got ${String(v)}`, field);
  return v;
}

function readPositive(values: ArrayLike<number>, count: number, field: string, what: string): Float64Array {
  if (values === null || typeof values !== 'object' || typeof values.length !== 'number') {
    throw optionError('bad-option', `${field} must be an array of numbers`, field);
  }
  if (values.length !== count) throw optionError('bad-length', `${field} has length ${values.length}, expected one per ${what} (${count})`, field);
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const v = values[i];
    if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0)) {
      throw optionError('not-positive', `${field}[${i}] is ${String(v)}; every entry must be a finite number > 0`, field, i);
    }
    out[i] = v;
  }
  return out;
}

/** Tolerated mismatch between the sum of `targets` and the total: rounding in the caller's own sums, far below the default tolerance. */
const SUM_SLACK = 1e-9;

function readTargets(options: BalanceOptions, n: number, total: number, unit: string): Float64Array {
  if (options.targets !== undefined && options.shares !== undefined) {
    throw optionError('bad-option', 'give targets or shares, not both', 'targets');
  }
  const field = options.targets !== undefined ? 'targets' : 'shares';
  const raw = readPositive(options.targets ?? options.shares ?? new Float64Array(n).fill(1), n, field, 'site');
  let sum = 0;
  for (let i = 0; i < n; i++) sum += raw[i];
  if (field === 'targets' && !(Math.abs(sum - total) <= SUM_SLACK * total)) {
    throw optionError('targets-sum', `targets add up to ${sum}, but the ${unit} is ${total}; use shares to have them scaled`, 'targets');
  }
  // Scaled to sum to the total (a no-op up to rounding for targets): the sizes of a tiling add up exactly to it.
  for (let i = 0; i < n; i++) raw[i] *= total / sum;
  return raw;
}

/** Shoelace area of a counter-clockwise polygon, relative to its first vertex (far from the origin, absolute coordinates cancel). */
function polygonArea(p: Float64Array): number {
  let a = 0;
  for (let i = 2; i + 2 < p.length; i += 2) {
    a += (p[i] - p[0]) * (p[i + 3] - p[1]) - (p[i + 2] - p[0]) * (p[i + 1] - p[1]);
  }
  return a / 2;
}

function checkSites(xy: Float64Array, region: Float64Array | null): void {
  const n = xy.length >> 1, seen = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    const key = `${xy[2 * i]},${xy[2 * i + 1]}`;
    const first = seen.get(key);
    if (first !== undefined) throw new InputError('duplicate-site', `site ${i} repeats site ${first}; each site needs its own cell`, i, 'sites');
    seen.set(key, i);
    if (region === null) continue;
    const m = region.length >> 1;
    for (let j = 0; j < m; j++) {
      const k = j + 1 === m ? 0 : j + 1;
      if (orient(region[2 * j], region[2 * j + 1], region[2 * k], region[2 * k + 1], xy[2 * i], xy[2 * i + 1]) < 0) {
        throw new InputError('site-outside', `site ${i} (${xy[2 * i]}, ${xy[2 * i + 1]}) lies outside the region`, i, 'sites');
      }
    }
  }
}

/**
 * The sites that can trade demand points with site i: its neighbours in the
 * regular triangulation, plus the hidden sites (removing i can uncover
 * them). A hidden site itself trades with the site whose cell covers it and
 * that site's neighbours.
 */
function competitors(d: VoronoiDiagram, xy: Float64Array, i: number): Int32Array {
  const tri = d.triangulation, hidden = tri.hiddenSites;
  const near = tri.neighbors(i);
  const list = near.length > 0 ? Array.from(near) : [d.nearest(xy[2 * i], xy[2 * i + 1]), ...tri.neighbors(d.nearest(xy[2 * i], xy[2 * i + 1]))];
  for (let k = 0; k < hidden.length; k++) list.push(hidden[k]);
  return Int32Array.from(new Set(list)).filter((j) => j !== i);
}

/**
 * Balanced territories: the weights that give every site's power cell,
 * clipped to a convex region, a prescribed area (or, with `demand`, a
 * prescribed amount of weighted demand points), with the power diagram they
 * make. Area mode runs damped Newton steps on the concave function of
 * Aurenhammer, Hoffmann and Aronov (1998); demand mode is described at
 * balanceDemand. Throws InputError for bad sites (duplicate-site,
 * site-outside: every site must lie in the closed region), targets
 * (bad-length, not-positive, targets-sum) or options (bad-option).
 */
export function balanceTerritories(sites: PointInput, options: BalanceOptions): BalanceResult {
  if (options === null || typeof options !== 'object') throw optionError('bad-option', 'options must be an object', 'options');
  checkOptionNames(options, ['clip', 'targets', 'shares', 'demand', 'maxIterations', 'tolerance', 'onProgress'], 'balanceTerritories');
  const xy = readPoints(sites), n = xy.length >> 1;
  const maxIterations = readCount(options.maxIterations, 'maxIterations', 50);
  const tolerance = options.tolerance ?? 1e-6;
  if (typeof tolerance !== 'number' || !(tolerance > 0) || !Number.isFinite(tolerance)) {
    throw optionError('bad-option', `tolerance must be a finite number > 0, got ${String(tolerance)}`, 'tolerance');
  }
  if (options.onProgress !== undefined && typeof options.onProgress !== 'function') {
    throw optionError('bad-option', 'onProgress must be a function', 'onProgress');
  }
  const control = { maxIterations, tolerance, onProgress: options.onProgress };
  const region = options.clip === undefined ? null : readClipRegion(options.clip);
  if (options.demand === undefined) {
    if (region === null) throw optionError('bad-option', 'area balancing needs a clip region', 'clip');
    checkSites(xy, region);
    const targets = readTargets(options, n, polygonArea(region), "region's area");
    const r = balanceAreas(xy, targets, (weights) => {
      const diagram = voronoi(xy, { weights, clip: region });
      return { ...measureCells(diagram), diagram };
    }, control);
    return { weights: r.weights, diagram: r.measure.diagram, sizes: r.measure.areas, iterations: r.iterations, maxRelativeError: r.maxRelativeError, converged: r.converged };
  }
  const demand = options.demand;
  if (demand === null || typeof demand !== 'object') throw optionError('bad-option', 'demand must be { points, weights? }', 'demand');
  let points: Float64Array;
  try {
    points = readPoints(demand.points);
  } catch (err) {
    if (err instanceof InputError) throw new InputError(err.code, `demand ${err.message}`, err.index, 'demand.points');
    throw err;
  }
  const count = points.length >> 1;
  const mass = demand.weights === undefined ? new Float64Array(count).fill(1) : readPositive(demand.weights, count, 'demand.weights', 'demand point');
  checkSites(xy, region);
  let total = 0;
  for (let k = 0; k < count; k++) total += mass[k];
  const targets = readTargets(options, n, total, 'total demand');
  const clip = region ?? undefined;
  const r = balanceDemand(xy, targets, points, mass, (weights) => {
    const diagram = voronoi(xy, { weights, clip });
    return {
      ...measureCells(diagram),
      diagram,
      owner: diagram.nearestMany(points),
      competitors: (i: number) => competitors(diagram, xy, i),
    };
  }, control);
  return { weights: r.weights, diagram: r.assignment.diagram, sizes: r.loads, iterations: r.iterations, maxRelativeError: r.maxRelativeError, converged: r.converged };
}
