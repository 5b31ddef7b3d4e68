import { MIN_WEIGHT } from '../core/power.js';
import { radicalCoefficients, solveLaplacian } from './laplacian.js';

/** What the area balancing needs from one power diagram. */
export interface PowerCellMeasure {
  /** Area of each site's clipped cell (0 when empty). */
  areas: Float64Array;
  /** Site pairs a, b whose cells share an edge inside the region, interleaved; a pair may repeat (lengths then add). */
  pairs: Int32Array;
  /** Length of each such shared edge. */
  lengths: Float64Array;
}

/** Reported after the first diagram (iteration 0) and after every accepted step. */
export interface BalanceProgress {
  iteration: number;
  /** max over sites of |size - target| / target. */
  maxRelativeError: number;
  /** Area mode: the damping factor of the accepted step (1 = full Newton step); demand mode: sites whose weight moved. */
  step: number;
}

export interface BalanceControl {
  maxIterations: number;
  tolerance: number;
  onProgress?: (info: BalanceProgress) => void;
}

export interface AreaBalance<M> {
  weights: Float64Array;
  measure: M;
  iterations: number;
  maxRelativeError: number;
  converged: boolean;
}

/** Damping gives up after this many halvings (a step of 2^-40 changes nothing measurable). */
const MAX_HALVINGS = 40;

export function maxRelativeError(areas: Float64Array, targets: Float64Array): number {
  let e = 0;
  for (let i = 0; i < targets.length; i++) e = Math.max(e, Math.abs(areas[i] - targets[i]) / targets[i]);
  return e;
}

export function residualNorm(areas: Float64Array, targets: Float64Array): number {
  let s = 0;
  for (let i = 0; i < targets.length; i++) s += (targets[i] - areas[i]) ** 2;
  return Math.sqrt(s);
}

function minimum(a: Float64Array): number {
  let m = Infinity;
  for (let i = 0; i < a.length; i++) if (a[i] < m) m = a[i];
  return m;
}

/**
 * Shifts weights so that the smallest is 0: weights only matter up to a common constant. The exact
 * predicates refuse nonzero weights below MIN_WEIGHT (2^-240), so a difference that small becomes 0;
 * it could only matter for regions near the smallest coordinates (2^-120 across).
 */
export function normaliseWeights(w: Float64Array): Float64Array {
  const m = minimum(w);
  for (let i = 0; i < w.length; i++) {
    w[i] -= m;
    if (w[i] < MIN_WEIGHT) w[i] = 0;
  }
  return w;
}

/**
 * Weights whose power cells (clipped to a region) have the target areas,
 * by damped Newton steps on the concave function of Aurenhammer, Hoffmann
 * and Aronov (1998, "Minkowski-type theorems and least-squares clustering",
 * Algorithmica): f(w) = sum_i [ integral over cell_i of (|x - s_i|^2 - w_i) + w_i t_i ],
 * whose gradient is t - A(w). Its Hessian is minus the Jacobian of the
 * areas, a graph Laplacian on the cells: raising w_j moves the radical line
 * between cells i and j towards s_i by (raise) / (2 |s_i - s_j|), so
 * dA_i/dw_j = -l_ij / (2 |s_i - s_j|) for neighbours (l_ij = shared edge
 * length inside the region) and dA_i/dw_i = the sum of those magnitudes.
 * Each step solves L d = t - A by conjugate gradients.
 *
 * Damping, from memory of Kitagawa, Mérigot and Thibert (2019, "Convergence
 * of a Newton algorithm for semi-discrete optimal transport", JEMS), who
 * prove global convergence and a locally quadratic rate for it: with
 * eps = min(min target, min initial area) / 2, take the largest step 2^-k
 * of the Newton direction after which every cell keeps area >= eps and
 * |t - A| (Euclidean) has fallen by at least a factor (1 - 2^-k / 2).
 */
export function balanceAreas<M extends PowerCellMeasure>(
  sites: Float64Array, targets: Float64Array, measure: (weights: Float64Array) => M, control: BalanceControl,
): AreaBalance<M> {
  const n = targets.length;
  let weights: Float64Array = new Float64Array(n);
  let current = measure(weights);
  let error = maxRelativeError(current.areas, targets);
  let residual = residualNorm(current.areas, targets);
  const floor = Math.min(minimum(targets), minimum(current.areas)) / 2;
  control.onProgress?.({ iteration: 0, maxRelativeError: error, step: 0 });
  let iterations = 0;
  const gradient = new Float64Array(n);
  while (error > control.tolerance && iterations < control.maxIterations) {
    const coef = radicalCoefficients(sites, current.pairs, current.lengths);
    for (let i = 0; i < n; i++) gradient[i] = targets[i] - current.areas[i];
    // Inexact Newton: a relative residual of the order of the current error keeps the local rate
    // quadratic (Dembo, Eisenstat and Steihaug 1982, from memory) at a fraction of an exact solve's cost.
    const direction = solveLaplacian(n, current.pairs, coef, gradient, Math.min(1e-2, Math.max(1e-12, error)), 20 * n + 100);
    let step = 1, accepted: { weights: Float64Array; measure: M } | null = null;
    for (let k = 0; k <= MAX_HALVINGS; k++, step /= 2) {
      const trial = new Float64Array(n);
      for (let i = 0; i < n; i++) trial[i] = weights[i] + step * direction[i];
      normaliseWeights(trial);
      const m = measure(trial);
      if (minimum(m.areas) >= floor && residualNorm(m.areas, targets) <= (1 - step / 2) * residual) {
        accepted = { weights: trial, measure: m };
        break;
      }
    }
    if (accepted === null) break;
    weights = accepted.weights;
    current = accepted.measure;
    iterations++;
    error = maxRelativeError(current.areas, targets);
    residual = residualNorm(current.areas, targets);
    control.onProgress?.({ iteration: iterations, maxRelativeError: error, step });
  }
  return { weights, measure: current, iterations, maxRelativeError: error, converged: error <= control.tolerance };
}
