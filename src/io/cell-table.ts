import type { ClippedCells } from '../diagram/cells.js';
import { measuresOf } from './cells-source.js';
import { ChunkedText, collectText, numberFormat, type TextSink } from './text-sink.js';

/** A CSV field, quoted when it holds a comma, quote or line break (RFC 4180 style). */
export function csvField(v: string): string {
  return /[",\r\n]/.test(v) ? '"' + v.replace(/"/g, '""') + '"' : v;
}

/**
 * Writes one CSV row per site: site, id (when ids are given), x, y, weight
 * (power diagrams), area, perimeter, centroid_x, centroid_y, neighbors.
 * Sites without a cell have area 0 and empty centroid fields. Numbers are
 * exact (shortest round-trip text).
 */
export function writeCellTable(d: ClippedCells, sink: TextSink, ids?: ArrayLike<string | number>): void {
  const ms = measuresOf(d), xy = d.triangulation.siteXY, fmt = numberFormat(undefined);
  const num = (v: number): string => (Number.isFinite(v) ? fmt(v) : '');
  const out = new ChunkedText(sink);
  out.add('site' + (ids ? ',id' : '') + ',x,y' + (ms.weights ? ',weight' : '') + ',area,perimeter,centroid_x,centroid_y,neighbors\n');
  for (let s = 0; s < ms.count; s++) {
    let row = String(s);
    if (ids) row += ',' + (ids[s] === undefined ? '' : csvField(String(ids[s])));
    row += ',' + num(xy[2 * s]) + ',' + num(xy[2 * s + 1]);
    if (ms.weights) row += ',' + num(ms.weights[s]);
    row += ',' + num(ms.area[s]) + ',' + num(ms.perimeter[s]) + ',' + num(ms.centroid[2 * s]) + ',' + num(ms.centroid[2 * s + 1]) + ',' + ms.neighbors![s] + '\n';
    out.add(row);
  }
  out.end();
}

/** The per-cell table as CSV text (see writeCellTable). */
export function cellTableCSV(d: ClippedCells, ids?: ArrayLike<string | number>): string {
  return collectText((sink) => writeCellTable(d, sink, ids));
}
