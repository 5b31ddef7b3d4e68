import { InputError } from '../../core/errors.js';

/** A regular grid of sample points over a rectangle. */
export interface GridSpec { minX: number; minY: number; maxX: number; maxY: number; columns: number; rows: number }

/** Most samples one grid may have (2^27: a 1 GiB Float64Array). */
export const MAX_GRID_SAMPLES = 2 ** 27;

/**
 * Samples sit at cell centres: column j at x = minX + (j + 0.5) * ((maxX - minX) / columns),
 * row i at y = minY + (i + 0.5) * ((maxY - minY) / rows); the result is row-major, row 0 at minY.
 */
export interface GridSamples { minX: number; minY: number; dx: number; dy: number; columns: number; rows: number }

const gridError = (message: string, field: string) => new InputError('bad-grid', message, -1, `grid.${field}`);

/** Checks a grid spec: finite bounds with min < max, whole positive counts, at most MAX_GRID_SAMPLES samples. */
export function readGrid(spec: GridSpec): GridSamples {
  if (spec === null || typeof spec !== 'object') throw gridError('grid must be { minX, minY, maxX, maxY, columns, rows }', 'spec');
  for (const k of ['minX', 'minY', 'maxX', 'maxY'] as const) {
    const v = spec[k];
    if (typeof v !== 'number' || !Number.isFinite(v)) throw gridError(`${k} is ${String(v)}; bounds must be finite numbers`, k);
  }
  for (const k of ['columns', 'rows'] as const) {
    const v = spec[k];
    if (typeof v !== 'number' || !Number.isInteger(v) || v < 1) throw gridError(`${k} is ${String(v)}; it must be a whole number >= 1`, k);
  }
  const { minX, minY, maxX, maxY, columns, rows } = spec;
  if (!(minX < maxX)) throw gridError(`minX ${minX} must be below maxX ${maxX}`, 'maxX');
  if (!(minY < maxY)) throw gridError(`minY ${minY} must be below maxY ${maxY}`, 'maxY');
  if (columns * rows > MAX_GRID_SAMPLES) throw gridError(`${columns} x ${rows} samples is more than ${MAX_GRID_SAMPLES}`, 'columns');
  const dx = (maxX - minX) / columns, dy = (maxY - minY) / rows;
  if (!Number.isFinite(dx) || !Number.isFinite(dy)) throw gridError('the grid is wider than double precision can span', 'maxX');
  return { minX, minY, dx, dy, columns, rows };
}

/** x of column j (see GridSamples). */
export const sampleX = (g: GridSamples, j: number): number => g.minX + (j + 0.5) * g.dx;
/** y of row i. */
export const sampleY = (g: GridSamples, i: number): number => g.minY + (i + 0.5) * g.dy;
