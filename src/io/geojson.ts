import { ClippedCells } from '../diagram/cells.js';
import { measuresOf, ringArea2, type CellSource } from './cells-source.js';
import { ChunkedText, collectText, numberFormat, type TextSink } from './text-sink.js';

export interface GeoJSONOptions {
  /** One id per site, written as the `id` property (strings or numbers). */
  ids?: ArrayLike<string | number>;
  /** Round coordinates and measures to this many decimals; default: exact (shortest round-trip text). */
  decimals?: number;
}

/**
 * Writes cells as an RFC 7946 FeatureCollection, in chunks: one Feature per
 * site that has a cell, in site order; a Polygon, or a MultiPolygon when the
 * cell has several pieces; rings closed (last position = first), exterior
 * rings counter-clockwise and holes clockwise (y up), positions [x, y].
 * Properties: `site`, `id` (when ids are given), `area`, `perimeter`,
 * `centroid` [x, y], `neighbors` (diagrams only) and `weight` (power
 * diagrams). Rounding with `decimals` can flatten a ring thinner than the
 * rounding step; the default writes every coordinate exactly.
 */
export function writeGeoJSON(source: CellSource, sink: TextSink, options: GeoJSONOptions = {}): void {
  const fmt = numberFormat(options.decimals);
  const ms = measuresOf(source);
  const ids = options.ids;
  const out = new ChunkedText(sink);
  out.add('{"type":"FeatureCollection","features":[');
  let first = true;
  const diagram = source instanceof ClippedCells ? source : null;
  const list = diagram === null ? (source as Exclude<CellSource, ClippedCells>) : null;

  // A ring as GeoJSON positions, closed, oriented as asked (ccw for exteriors).
  const ring = (r: ArrayLike<number>, ccw: boolean): string => {
    const m = r.length >> 1, flip = (ringArea2(r) > 0) !== ccw;
    let s = '[';
    for (let k = 0; k <= m; k++) {
      const i = k === m ? 0 : (flip ? (m - k) % m : k);
      s += (k === 0 ? '[' : ',[') + fmt(r[2 * i]) + ',' + fmt(r[2 * i + 1]) + ']';
    }
    return s + ']';
  };
  // A diagram face walked straight from the mesh: bounded faces are counter-clockwise already. Each vertex is
  // formatted once and its text reused by the (usually three) cells around it: number formatting is most of the cost.
  // Filled by push: a large `new Array(n)` would start out sparse (slow dictionary elements in V8).
  const pos = (v: number): string => {
    const xy = diagram!.mesh.vertexXY;
    return '[' + fmt(xy[2 * v]) + ',' + fmt(xy[2 * v + 1]) + ']';
  };
  const faceRing = (f: number): string => {
    const m = diagram!.mesh, start = m.faceEdge[f];
    let s = '[', e = start;
    do {
      s += pos(m.origin[e]) + ',';
      e = m.next[e];
    } while (e !== start);
    return s + pos(m.origin[start]) + ']';
  };

  for (let s = 0; s < ms.count; s++) {
    let geometry: string;
    if (diagram !== null) {
      const f = diagram.faceOfSite[s];
      if (f < 0) continue;
      geometry = '{"type":"Polygon","coordinates":[' + faceRing(f) + ']}';
    } else {
      const pieces = list![s];
      if (pieces.length === 0) continue;
      const polys = pieces.map((p) => '[' + [ring(p.outer, true), ...(p.holes ?? []).map((h) => ring(h, false))].join(',') + ']');
      geometry = polys.length === 1 ? '{"type":"Polygon","coordinates":' + polys[0] + '}'
        : '{"type":"MultiPolygon","coordinates":[' + polys.join(',') + ']}';
    }
    let props = '"site":' + s;
    if (ids !== undefined && ids[s] !== undefined) props += ',"id":' + (typeof ids[s] === 'number' ? fmt(ids[s] as number) : JSON.stringify(String(ids[s])));
    props += ',"area":' + fmt(ms.area[s]) + ',"perimeter":' + fmt(ms.perimeter[s]) +
      ',"centroid":[' + fmt(ms.centroid[2 * s]) + ',' + fmt(ms.centroid[2 * s + 1]) + ']';
    if (ms.neighbors !== null) props += ',"neighbors":' + ms.neighbors[s];
    if (ms.weights !== null) props += ',"weight":' + fmt(ms.weights[s]);
    out.add((first ? '' : ',') + '\n{"type":"Feature","geometry":' + geometry + ',"properties":{' + props + '}}');
    first = false;
  }
  out.add('\n]}\n');
  out.end();
}

/** The cells as RFC 7946 GeoJSON text (see writeGeoJSON; use that for outputs too large for one string). */
export function toGeoJSON(source: CellSource, options: GeoJSONOptions = {}): string {
  return collectText((sink) => writeGeoJSON(source, sink, options));
}
