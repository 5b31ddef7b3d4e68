import { InputError } from '../core/errors.js';
import type { ClippedCells } from '../diagram/cells.js';
import { cellAdjacency, greedyColoring } from './coloring.js';
import { ChunkedText, collectText, numberFormat, type TextSink } from './text-sink.js';

/** ambit's own cell palette: soft, distinct fills that keep dark site dots and edges readable. */
export const CELL_PALETTE: readonly string[] = [
  '#f3c969', '#8fc1a9', '#e99a83', '#9fb7dc', '#c8a9dc', '#d8c8a0', '#a9d17a', '#efaec6',
];

export interface SVGOptions {
  /** Largest side of the picture in SVG units (pixels), margins included. Default 800. */
  size?: number;
  /** Empty space around the region, in the same units. Default 16. */
  margin?: number;
  /** Draw the sites as small circles. Default true. */
  sites?: boolean;
  /** Draw the Delaunay triangulation's edges. Default false. */
  triangulation?: boolean;
  /** Decimals of the written picture coordinates. Default 2. */
  decimals?: number;
  /** Fill colours, used in turn by the greedy colouring. Default CELL_PALETTE. */
  palette?: readonly string[];
  /** A title (escaped), shown by viewers as the picture's name. */
  title?: string;
}

/** How region coordinates map to the picture: px = margin + (x - minX) * scale, py = margin + (maxY - y) * scale (north up). */
export interface SVGFrame { minX: number; maxY: number; scale: number; margin: number; width: number; height: number }

/** The frame that fits a region's bounding box into a size × size picture with the margin. */
export function svgFrame(region: ArrayLike<number>, size = 800, margin = 16): SVGFrame {
  if (!(Number.isFinite(size) && Number.isFinite(margin) && margin >= 0 && size > 2 * margin)) {
    throw new InputError('bad-option', `size (${size}) must exceed twice the margin (${margin})`, -1, 'size');
  }
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < region.length; i += 2) {
    minX = Math.min(minX, region[i]); maxX = Math.max(maxX, region[i]);
    minY = Math.min(minY, region[i + 1]); maxY = Math.max(maxY, region[i + 1]);
  }
  const inner = size - 2 * margin, scale = inner / Math.max(maxX - minX, maxY - minY);
  return { minX, maxY, scale, margin, width: (maxX - minX) * scale + 2 * margin, height: (maxY - minY) * scale + 2 * margin };
}

/** Text safe inside an XML element or a double-quoted attribute. */
export function escapeXML(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c]!);
}

/**
 * Writes a diagram as SVG, in chunks: one filled path per cell (data-site
 * holds its site), neighbouring cells in different colours (greedy colouring
 * of the adjacency graph), the sites as dots and optionally the
 * triangulation. The viewBox fits the region with a margin, north up.
 */
export function writeSVG(d: ClippedCells, sink: TextSink, options: SVGOptions = {}): void {
  const fr = svgFrame(d.region, options.size ?? 800, options.margin ?? 16);
  const fmt = numberFormat(options.decimals ?? 2);
  const palette = options.palette ?? CELL_PALETTE;
  if (!Array.isArray(palette) || palette.length === 0) throw new InputError('bad-option', 'palette must be a non-empty array of colours', -1, 'palette');
  const px = (x: number): string => fmt(fr.margin + (x - fr.minX) * fr.scale);
  const py = (y: number): string => fmt(fr.margin + (fr.maxY - y) * fr.scale);
  const { start, list } = cellAdjacency(d);
  const color = greedyColoring(start, list);
  const out = new ChunkedText(sink);
  const w = fmt(fr.width), h = fmt(fr.height);
  out.add(`<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}">\n`);
  if (options.title !== undefined) out.add(`<title>${escapeXML(String(options.title))}</title>\n`);
  out.add(`<rect width="${w}" height="${h}" fill="#fbfaf6"/>\n<g stroke="#4a4a48" stroke-width="0.6" stroke-linejoin="round">\n`);
  const m = d.mesh, xy = m.vertexXY, n = d.triangulation.siteCount;
  for (let s = 0; s < n; s++) {
    const f = d.faceOfSite[s];
    if (f < 0) continue;
    let path = '', e = m.faceEdge[f];
    const first = e;
    do {
      const v = m.origin[e];
      path += (e === first ? 'M' : 'L') + px(xy[2 * v]) + ' ' + py(xy[2 * v + 1]);
      e = m.next[e];
    } while (e !== first);
    out.add(`<path data-site="${s}" fill="${escapeXML(palette[color[s] % palette.length])}" d="${path}Z"/>\n`);
  }
  out.add('</g>\n');
  const sxy = d.triangulation.siteXY;
  if (options.triangulation) {
    const edges = d.triangulation.edges();
    out.add('<path fill="none" stroke="#6b6b8f" stroke-width="0.4" stroke-dasharray="2 2" d="');
    for (let i = 0; i < edges.length; i += 2) {
      const a = edges[i], b = edges[i + 1];
      out.add('M' + px(sxy[2 * a]) + ' ' + py(sxy[2 * a + 1]) + 'L' + px(sxy[2 * b]) + ' ' + py(sxy[2 * b + 1]));
    }
    out.add('"/>\n');
  }
  if (options.sites ?? true) {
    out.add('<g fill="#2b2b2b">\n');
    for (let s = 0; s < n; s++) {
      if (d.faceOfSite[s] < 0) continue;
      out.add(`<circle cx="${px(sxy[2 * s])}" cy="${py(sxy[2 * s + 1])}" r="2"/>\n`);
    }
    out.add('</g>\n');
  }
  out.add('</svg>\n');
  out.end();
}

/** The diagram as SVG text (see writeSVG). */
export function toSVG(d: ClippedCells, options: SVGOptions = {}): string {
  return collectText((sink) => writeSVG(d, sink, options));
}
