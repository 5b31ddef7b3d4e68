import { maxRelativeError, normaliseWeights, residualNorm, type BalanceControl, type PowerCellMeasure } from './balance-areas.js';
import { exchangeRound } from './demand-exchange.js';
import { radicalCoefficients, solveLaplacian } from './laplacian.js';

/** What the demand balancing needs from one power diagram. */
export interface DemandAssignment extends PowerCellMeasure {
  /** The site of least power distance of every demand point (exact; ties to the smallest index). */
  owner: Int32Array;
  /** Sites that can take over points of `site`'s cell or give it theirs: its neighbours and the hidden sites. */
  competitors(site: number): ArrayLike<number>;
}

export interface DemandBalance<A> {
  weights: Float64Array;
  assignment: A;
  loads: Float64Array;
  iterations: number;
  maxRelativeError: number;
  converged: boolean;
}

/** Quasi-Newton steps give up after this many halvings: past it the loads move by single points. */
const MAX_HALVINGS = 8;
/** Coordinate moves stop after this many rounds without a better worst site (common practice, no source). */
const STALL_ROUNDS = 8;

function loadsOf(owner: Int32Array, mass: Float64Array, n: number): Float64Array {
  const loads = new Float64Array(n);
  for (let k = 0; k < owner.length; k++) loads[owner[k]] += mass[k];
  return loads;
}

function squaredExtent(sites: Float64Array, points: Float64Array): number {
  let lo = Infinity, hi = -Infinity;
  for (const xy of [sites, points]) for (let i = 0; i < xy.length; i++) { lo = Math.min(lo, xy[i]); hi = Math.max(hi, xy[i]); }
  return (hi - lo) ** 2 || 1;
}

/** The largest |load - target| over the sites. */
function spread(loads: Float64Array, targets: Float64Array): number {
  let m = 0;
  for (let i = 0; i < targets.length; i++) m = Math.max(m, Math.abs(loads[i] - targets[i]));
  return m;
}

/**
 * Weights whose power cells hold target amounts of a weighted set of demand
 * points. The concave function of the area mode (Aurenhammer, Hoffmann and
 * Aronov 1998) is piecewise linear here: its gradient t - D(w) jumps by a
 * whole point at a time, so plain Newton steps are not defined. Two phases:
 *
 * 1. Quasi-Newton while it pays: the area-mode Laplacian with each edge
 *    scaled by the demand density around it ((D_i + D_j) / (A_i + A_j),
 *    floored at a thousandth of the mean density), steps damped as in the
 *    area mode (accept the largest 2^-k that cuts |t - D| by the factor
 *    1 - 2^-k / 2). This moves the bulk of the demand in a few diagrams.
 * 2. Exact coordinate moves (see exchangeRound), which settle single points,
 *    until every site is within the tolerance or within half the heaviest
 *    point of its target, no site can get closer on its own, 8 rounds bring
 *    no better worst site, or the iteration cap.
 *
 * The result is the best state seen (smallest largest |load - target|), with
 * loads counted from the exact diagram. `converged` means every site is
 * within `tolerance` of its target or within the weight of the heaviest
 * demand point: indivisible points allow no better in general (with unit
 * points and whole-number targets the loop aims for exact). No bound on the
 * number of rounds is claimed: coordinate moves on a non-smooth function can
 * cycle, which is why stalling ends the loop.
 */
export function balanceDemand<A extends DemandAssignment>(
  sites: Float64Array, targets: Float64Array, points: Float64Array, mass: Float64Array,
  assign: (weights: Float64Array) => A, control: BalanceControl,
): DemandBalance<A> {
  const n = targets.length, count = mass.length;
  let weights: Float64Array = new Float64Array(n);
  let current = assign(weights);
  let loads = loadsOf(current.owner, mass, n);
  let error = maxRelativeError(loads, targets);
  control.onProgress?.({ iteration: 0, maxRelativeError: error, step: 0 });
  let heaviest = 0, total = 0, area = 0;
  for (let k = 0; k < count; k++) { heaviest = Math.max(heaviest, mass[k]); total += mass[k]; }
  for (let i = 0; i < n; i++) area += current.areas[i];
  const floorDensity = 1e-3 * total / area;
  // The best state so far, by the largest |load - target|: coordinate moves can wander once near the end.
  let best = { weights, assignment: current, loads, spread: spread(loads, targets), error };
  let iterations = 0, newton = true, stalled = 0;
  const finished = () => best.error <= control.tolerance || best.spread <= heaviest / 2 || stalled >= STALL_ROUNDS;
  const gradient = new Float64Array(n);
  while (!finished() && iterations < control.maxIterations) {
    let step = 0;
    if (newton) {
      const { areas } = current, held = loads;
      const coef = radicalCoefficients(sites, current.pairs, current.lengths,
        (a, b) => Math.max(floorDensity, (held[a] + held[b]) / (areas[a] + areas[b] || 1)));
      for (let i = 0; i < n; i++) gradient[i] = targets[i] - loads[i];
      const direction = solveLaplacian(n, current.pairs, coef, gradient, 1e-6, 20 * n + 100);
      const residual = residualNorm(loads, targets);
      let tau = 1;
      for (let k = 0; k <= MAX_HALVINGS && step === 0; k++, tau /= 2) {
        const trial = new Float64Array(n);
        for (let i = 0; i < n; i++) trial[i] = weights[i] + tau * direction[i];
        normaliseWeights(trial);
        const a = assign(trial), l = loadsOf(a.owner, mass, n);
        if (residualNorm(l, targets) <= (1 - tau / 2) * residual) { weights = trial; current = a; loads = l; step = tau; }
      }
      newton = step > 0;
    }
    if (!newton) {
      weights = weights.slice();
      step = exchangeRound({
        sites, weights, points, mass, targets, owner: current.owner.slice(), loads: loads.slice(),
        competitors: (i) => current.competitors(i), nudge: 2 ** -40 * squaredExtent(sites, points),
      }, new Float64Array(count), new Int32Array(count));
      if (step === 0) break;
      normaliseWeights(weights);
      current = assign(weights);
      loads = loadsOf(current.owner, mass, n);
    }
    iterations++;
    error = maxRelativeError(loads, targets);
    const sp = spread(loads, targets);
    if (sp < best.spread) { best = { weights, assignment: current, loads, spread: sp, error }; stalled = 0; } else stalled++;
    control.onProgress?.({ iteration: iterations, maxRelativeError: error, step });
  }
  return {
    weights: best.weights, assignment: best.assignment, loads: best.loads, iterations, maxRelativeError: best.error,
    converged: best.error <= control.tolerance || best.spread <= heaviest,
  };
}
