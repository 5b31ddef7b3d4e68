import type { Triangulation } from '../triangulate/triangulation.js';
import { ChunkedText, collectText, numberFormat, type TextSink } from './text-sink.js';

/**
 * Writes a triangulation's triangles as an RFC 7946 FeatureCollection: one
 * Polygon per triangle (closed ring, counter-clockwise), properties
 * `triangle` and `sites` (its three site indices).
 */
export function writeTrianglesGeoJSON(tri: Triangulation, sink: TextSink, options: { decimals?: number } = {}): void {
  const fmt = numberFormat(options.decimals), xy = tri.siteXY, ts = tri.triangleSites;
  const out = new ChunkedText(sink);
  const pos = (s: number): string => '[' + fmt(xy[2 * s]) + ',' + fmt(xy[2 * s + 1]) + ']';
  out.add('{"type":"FeatureCollection","features":[');
  for (let t = 0; t < tri.triangleCount; t++) {
    const a = ts[3 * t], b = ts[3 * t + 1], c = ts[3 * t + 2];
    out.add((t === 0 ? '' : ',') + '\n{"type":"Feature","geometry":{"type":"Polygon","coordinates":[[' +
      pos(a) + ',' + pos(b) + ',' + pos(c) + ',' + pos(a) + ']]},"properties":{"triangle":' + t + ',"sites":[' + a + ',' + b + ',' + c + ']}}');
  }
  out.add('\n]}\n');
  out.end();
}

/** The triangles as GeoJSON text (see writeTrianglesGeoJSON). */
export function trianglesToGeoJSON(tri: Triangulation, options: { decimals?: number } = {}): string {
  return collectText((sink) => writeTrianglesGeoJSON(tri, sink, options));
}
