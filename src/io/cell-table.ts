import type { ClippedCells } from '../diagram/cells.js';
import { measuresOf } from './cells-source.js';
import { ByteText, collectText, type TextSink } from './text-sink.js';

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
  const ms = measuresOf(d), xy = d.triangulation.siteXY, neighbors = ms.neighbors!;
  const out = new ByteText(sink);
  out.ascii('site' + (ids ? ',id' : '') + ',x,y' + (ms.weights ? ',weight' : '') + ',area,perimeter,centroid_x,centroid_y,neighbors\n');
  for (let s = 0; s < ms.count; s++) {
    out.int(s);
    if (ids) {
      out.char(44);
      if (ids[s] !== undefined) out.text(csvField(String(ids[s])));
    }
    out.char(44); out.numOrEmpty(xy[2 * s]);
    out.char(44); out.numOrEmpty(xy[2 * s + 1]);
    if (ms.weights) { out.char(44); out.numOrEmpty(ms.weights[s]); }
    out.char(44); out.numOrEmpty(ms.area[s]);
    out.char(44); out.numOrEmpty(ms.perimeter[s]);
    out.char(44); out.numOrEmpty(ms.centroid[2 * s]);
    out.char(44); out.numOrEmpty(ms.centroid[2 * s + 1]);
    out.char(44); out.int(neighbors[s]);
    out.char(10);
    out.row();
  }
  out.end();
}

/** The per-cell table as CSV text (see writeCellTable). */
export function cellTableCSV(d: ClippedCells, ids?: ArrayLike<string | number>): string {
  return collectText((sink) => writeCellTable(d, sink, ids));
}
