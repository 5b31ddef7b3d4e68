import { FormatError } from '../core/errors.js';
import { parseJSONInput } from '../core/untrusted.js';
import type { CellPiece } from './cells-source.js';
import type { SiteTable } from './csv.js';

export interface GeoJSONSiteOptions {
  /** Property holding each point's weight (a number). */
  weight?: string;
  /** Property holding each point's id (a string or number, kept as text). */
  id?: string;
}

function fail(code: string, message: string, path: string): never {
  throw new FormatError(code, `${path === '' ? 'GeoJSON' : path}: ${message}`, path);
}

const kind = (v: unknown): string => (v === null ? 'null' : Array.isArray(v) ? 'an array' : typeof v);

function objectAt(v: unknown, path: string): Record<string, unknown> {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) fail('bad-type', `expected an object, got ${kind(v)}`, path);
  return v as Record<string, unknown>;
}

function arrayAt(v: unknown, path: string): unknown[] {
  if (!Array.isArray(v)) fail('bad-type', `expected an array, got ${v === undefined ? 'nothing' : kind(v)}`, path);
  return v;
}

/** An RFC 7946 position: [x, y] or [x, y, altitude]; the altitude is ignored. */
function position(v: unknown, path: string): [number, number] {
  const p = arrayAt(v, path);
  if (p.length < 2 || p.length > 3) fail('bad-position', `a position has 2 or 3 numbers, got ${p.length}`, path);
  for (let k = 0; k < p.length; k++) {
    if (typeof p[k] !== 'number') fail('not-a-number', `expected a number, got ${kind(p[k])}`, `${path}[${k}]`);
    if (!Number.isFinite(p[k])) fail('not-finite', `${String(p[k])} is not finite`, `${path}[${k}]`);
  }
  return [p[0] as number, p[1] as number];
}

/** Features of a FeatureCollection, a single Feature, or a bare geometry, with their paths. */
function features(root: Record<string, unknown>): { geometry: unknown; properties: unknown; path: string }[] {
  if (root.type === 'FeatureCollection') {
    return arrayAt(root.features, 'features').map((f, i) => {
      const o = objectAt(f, `features[${i}]`);
      if (o.type !== 'Feature') fail('bad-type', `type is ${JSON.stringify(o.type)}, expected "Feature"`, `features[${i}].type`);
      return { geometry: o.geometry, properties: o.properties, path: `features[${i}]` };
    });
  }
  if (root.type === 'Feature') return [{ geometry: root.geometry, properties: root.properties, path: '' }];
  return [{ geometry: root, properties: null, path: '' }];
}

const join = (base: string, field: string): string => (base === '' ? field : `${base}.${field}`);

/**
 * Reads sites from GeoJSON (RFC 7946): Point and MultiPoint features, with
 * optional weight and id properties. Untrusted: anything else (another
 * geometry type, a bad position, a missing or non-numeric weight) is a
 * FormatError whose path names the feature, e.g.
 * `features[3].geometry.coordinates`.
 */
export function readGeoJSONSites(input: string | unknown, options: GeoJSONSiteOptions = {}): SiteTable {
  const root = objectAt(parseJSONInput(input, 'GeoJSON'), '');
  const xy: number[] = [], weights: number[] | null = options.weight === undefined ? null : [];
  const ids: string[] | null = options.id === undefined ? null : [];
  const from: string[] = [];
  for (const f of features(root)) {
    const gpath = join(f.path, 'geometry');
    const g = objectAt(f.geometry, gpath);
    let pts: [number, number][];
    if (g.type === 'Point') pts = [position(g.coordinates, `${gpath}.coordinates`)];
    else if (g.type === 'MultiPoint') pts = arrayAt(g.coordinates, `${gpath}.coordinates`).map((p, k) => position(p, `${gpath}.coordinates[${k}]`));
    else fail('not-points', `geometry type ${JSON.stringify(g.type)}; sites must be Point or MultiPoint features`, `${gpath}.type`);
    let w = 0, id = '';
    if (options.weight !== undefined || options.id !== undefined) {
      const props = objectAt(f.properties, join(f.path, 'properties'));
      if (options.weight !== undefined) {
        const v = props[options.weight], at = join(f.path, `properties.${options.weight}`);
        if (typeof v !== 'number') fail(v === undefined ? 'missing-property' : 'not-a-number', v === undefined ? 'missing; every site needs a weight' : `expected a number, got ${kind(v)}`, at);
        if (!Number.isFinite(v)) fail('not-finite', `${v} is not finite`, at);
        w = v;
      }
      if (options.id !== undefined) {
        const v = props[options.id], at = join(f.path, `properties.${options.id}`);
        if (typeof v !== 'string' && typeof v !== 'number') fail(v === undefined ? 'missing-property' : 'bad-type', v === undefined ? 'missing; every site needs an id' : `expected a string or number, got ${kind(v)}`, at);
        id = String(v);
      }
    }
    for (const p of pts) {
      xy.push(p[0], p[1]);
      weights?.push(w);
      ids?.push(id);
      from.push(f.path === '' ? 'the feature' : f.path);
    }
  }
  if (xy.length === 0) fail('empty', 'no points', root.type === 'FeatureCollection' ? 'features' : '');
  return { xy: Float64Array.from(xy), weights: weights && Float64Array.from(weights), ids, where: (i) => from[i] };
}

/** An RFC 7946 linear ring: an array of at least 4 positions whose last equals its first; returned open (closing position dropped). */
function linearRing(v: unknown, path: string): Float64Array {
  const r = arrayAt(v, path);
  if (r.length < 4) fail('bad-ring', `a linear ring needs at least 4 positions (closed), got ${r.length}`, path);
  const out = new Float64Array(2 * (r.length - 1));
  for (let k = 0; k < r.length; k++) {
    const p = position(r[k], `${path}[${k}]`);
    if (k < r.length - 1) { out[2 * k] = p[0]; out[2 * k + 1] = p[1]; } else if (p[0] !== out[0] || p[1] !== out[1]) {
      fail('ring-not-closed', `the last position [${p[0]}, ${p[1]}] differs from the first [${out[0]}, ${out[1]}]; rings must be closed`, path);
    }
  }
  return out;
}

function polygon(v: unknown, path: string): CellPiece {
  const rings = arrayAt(v, path);
  if (rings.length === 0) fail('bad-polygon', 'a polygon needs an exterior ring', path);
  return { outer: linearRing(rings[0], `${path}[0]`), holes: rings.slice(1).map((r, k) => linearRing(r, `${path}[${k + 1}]`)) };
}

/**
 * Reads polygons (Polygon and MultiPolygon features or geometries) from
 * GeoJSON as pieces: outer ring and holes, open, as written (RFC 7946 asks
 * readers not to reject either winding). Other geometry types, and rings
 * that are not closed or have fewer than 4 positions, are FormatErrors.
 */
export function readGeoJSONPolygons(input: string | unknown): CellPiece[] {
  const root = objectAt(parseJSONInput(input, 'GeoJSON'), '');
  const out: CellPiece[] = [];
  for (const f of features(root)) {
    const gpath = join(f.path, 'geometry');
    const g = objectAt(f.geometry, gpath);
    const cpath = `${gpath}.coordinates`;
    if (g.type === 'Polygon') out.push(polygon(g.coordinates, cpath));
    else if (g.type === 'MultiPolygon') arrayAt(g.coordinates, cpath).forEach((p, k) => out.push(polygon(p, `${cpath}[${k}]`)));
    else fail('not-polygon', `geometry type ${JSON.stringify(g.type)}; expected Polygon or MultiPolygon`, `${gpath}.type`);
  }
  if (out.length === 0) fail('empty', 'no polygons', root.type === 'FeatureCollection' ? 'features' : '');
  return out;
}
