import { FormatError, InputError } from '../core/errors.js';
import { readPoints } from '../core/input.js';
import { readClipRegion, type ClipRegion } from '../diagram/region.js';
import { studyAreaBounds } from '../analyze/study-area/study-area-cells.js';
import { readMeshJSON } from '../mesh/json.js';
import { readTriangulationJSON } from '../triangulate/json.js';
import { readCSVSiteBytes, type SiteTable } from '../io/csv.js';
import { readGeoJSONPolygons, readGeoJSONSites } from '../io/geojson-read.js';
import { parseJSONInput } from '../core/untrusted.js';
import { CliError, EXIT, usageError } from './exit.js';
import { readBytes, readText } from './files.js';

export interface SiteColumns { x?: string; y?: string; weight?: string; id?: string }

const extension = (path: string): string => (/\.([A-Za-z0-9]+)$/.exec(path)?.[1] ?? '').toLowerCase();

/** Runs a reader; its FormatError or InputError becomes a data error (exit 1) naming the file. */
export function asDataError<T>(file: string, read: () => T): T {
  try {
    return read();
  } catch (err) {
    if (err instanceof FormatError || err instanceof InputError) throw new CliError(EXIT.data, `${file}: ${err.message}`);
    throw err;
  }
}

/** Plain JSON sites: an array of [x, y] / [x, y, w] or {x, y, w?, id?}. */
function plainSites(value: unknown, cols: SiteColumns): SiteTable {
  if (!Array.isArray(value)) throw new FormatError('bad-type', 'expected GeoJSON, an ambit.triangulation or ambit.mesh, or an array of points', '');
  if (value.length === 0) throw new FormatError('empty', 'no points', '');
  const xy = readPoints(value as never);
  const pick = (i: number, key: string): unknown => {
    const p = value[i] as unknown;
    return Array.isArray(p) ? (key === 'w' ? p[2] : undefined) : (p as Record<string, unknown>)[key];
  };
  let weights: Float64Array | null = null, ids: string[] | null = null;
  if (cols.weight !== undefined) {
    weights = new Float64Array(value.length);
    for (let i = 0; i < value.length; i++) {
      const w = pick(i, cols.weight);
      if (typeof w !== 'number') throw new FormatError('not-a-number', `[${i}].${cols.weight}: expected a number, got ${w === undefined ? 'nothing' : typeof w}`, `[${i}].${cols.weight}`);
      weights[i] = w;
    }
  }
  if (cols.id !== undefined) ids = value.map((_, i) => String(pick(i, cols.id!) ?? ''));
  return { xy, weights, ids, where: (i) => `[${i}]` };
}

/**
 * Reads sites from a CSV file (.csv), GeoJSON points (.geojson, or .json
 * holding a GeoJSON object), an ambit.triangulation or ambit.mesh (its
 * sites or vertices), or a JSON array of points.
 */
export function loadSites(file: string, cols: SiteColumns): SiteTable {
  const ext = extension(file);
  if (ext !== 'csv' && ext !== 'geojson' && ext !== 'json') {
    throw usageError(`cannot tell the format of ${file}: sites come from .csv, .geojson or .json files`);
  }
  if (ext !== 'csv' && (cols.x !== undefined || cols.y !== undefined)) {
    throw usageError('--x and --y name CSV columns; GeoJSON and JSON points carry their own coordinates');
  }
  // CSV is read from its bytes: most files never become text.
  if (ext === 'csv') {
    const bytes = readBytes(file);
    return asDataError(file, () => readCSVSiteBytes(bytes, cols));
  }
  const text = readText(file);
  return asDataError(file, () => {
    if (text.trim() === '') throw new FormatError('empty', 'the file is empty', '');
    const value = parseJSONInput(text, 'JSON');
    if (ext === 'geojson') return readGeoJSONSites(value, cols);
    const root = value as Record<string, unknown> | null;
    if (root !== null && typeof root === 'object' && !Array.isArray(root)) {
      if (root.format === 'ambit.triangulation' || root.format === 'ambit.mesh') {
        if (cols.weight !== undefined || cols.id !== undefined) throw usageError('--weight and --id do not apply to ambit JSON input (it holds only coordinates)');
        const xy = root.format === 'ambit.triangulation' ? readTriangulationJSON(root).siteXY : readMeshJSON(root).vertexXY;
        return { xy: Float64Array.from(xy), weights: null, ids: null, where: (i: number) => `vertex ${i}` };
      }
      return readGeoJSONSites(value, cols);
    }
    return plainSites(value, cols);
  });
}

/** `--clip minX,minY,maxX,maxY`. */
export function parseClipBox(text: string): ClipRegion {
  const parts = text.split(',');
  const nums = parts.map((p) => (/^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/.test(p) ? Number(p) : NaN));
  if (parts.length !== 4 || nums.some((v) => Number.isNaN(v))) throw usageError(`--clip takes minX,minY,maxX,maxY (four numbers), got '${text}'`);
  const box = { minX: nums[0], minY: nums[1], maxX: nums[2], maxY: nums[3] };
  if (!(box.minX < box.maxX && box.minY < box.maxY)) throw usageError(`--clip ${text}: need minX < maxX and minY < maxY`);
  return box;
}

/** A clip region read from a GeoJSON file: a convex polygon for the diagram itself, or a study area for pieces. */
export type ClipFile = { kind: 'convex'; ring: Float64Array } | { kind: 'study-area'; polygons: Float64Array[][] };

/**
 * A clip region from a GeoJSON file. One polygon without holes that is
 * convex clips the diagram directly; anything else (holes, a non-convex
 * ring, several polygons) is a study area the cells are cut to afterwards,
 * validated by the library (errors name the polygon, ring and vertex).
 */
export function loadClipFile(file: string): ClipFile {
  const text = readText(file);
  return asDataError(file, () => {
    if (text.trim() === '') throw new FormatError('empty', 'the file is empty', '');
    const pieces = readGeoJSONPolygons(text);
    if (pieces.length === 1 && (pieces[0].holes ?? []).length === 0) {
      const ring = Float64Array.from(pieces[0].outer);
      try {
        readClipRegion(ring);
        return { kind: 'convex', ring };
      } catch (err) {
        // A ring that fails only by not being convex is a study area; other faults stand.
        if (!(err instanceof InputError) || err.code !== 'clip-not-convex') throw err;
      }
    }
    const polygons = pieces.map((p) => [Float64Array.from(p.outer), ...(p.holes ?? []).map((h) => Float64Array.from(h))]);
    studyAreaBounds(polygons);
    return { kind: 'study-area', polygons };
  });
}
