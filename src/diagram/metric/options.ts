import { InputError } from '../../core/errors.js';
import type { ExactMetric } from './bisector.js';

/** A distance for the diagram: 'L2' (Euclidean, the default), 'L1', 'Linf' (also 'L∞'), or the exponent p >= 1 of a Minkowski distance. */
export type Metric = 'L2' | 'L1' | 'Linf' | 'L∞' | number;

/** The metric an options object asks for, validated: p = 1, 2 and Infinity route to the exact engines, any other p >= 1 is returned as the number. */
export function readMetric(metric: unknown, tolerance: unknown): 'L2' | ExactMetric | number {
  if (tolerance !== undefined && (typeof tolerance !== 'number' || !(tolerance > 0) || !Number.isFinite(tolerance))) {
    throw new InputError('bad-option', `tolerance must be a positive finite number, got ${String(tolerance)}`, -1, 'tolerance');
  }
  if (metric === undefined || metric === 'L2' || metric === 2) return 'L2';
  if (metric === 'L1' || metric === 1) return 'L1';
  if (metric === 'Linf' || metric === 'L∞' || metric === Infinity) return 'Linf';
  if (typeof metric !== 'number' || Number.isNaN(metric) || metric < 1) {
    throw new InputError('bad-option', `metric must be 'L2', 'L1', 'Linf' or a number p >= 1, got ${typeof metric === 'string' ? `'${metric}'` : String(metric)}`, -1, 'metric');
  }
  return metric;
}
