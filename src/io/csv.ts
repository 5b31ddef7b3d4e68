import { FormatError } from '../core/errors.js';
import { decimalEnd, parseDecimalPrefix } from './decimal-bytes.js';

export interface CSVSiteOptions {
  /** Column of x (default "x"). */
  x?: string;
  /** Column of y (default "y"). */
  y?: string;
  /** Column of weights (optional). */
  weight?: string;
  /** Column of site ids (optional; kept as text). */
  id?: string;
}

/** Sites read from a table: coordinates, optional weights and ids, and where each came from. */
export interface SiteTable {
  xy: Float64Array;
  weights: Float64Array | null;
  ids: string[] | null;
  /** For each point, where it was read: "line 7", "features[3]"... (for error messages). */
  where(index: number): string;
}

// A decimal number, optionally signed, with an optional exponent: what spreadsheets write. Hex, "Infinity" and empty fields are not numbers here.
const NUMBER = /^\s*[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?\s*$/;

function fail(code: string, message: string, path: string): never {
  throw new FormatError(code, `${path}: ${message}`, path);
}

/**
 * Splits CSV text into records (RFC 4180: comma separated, fields may be
 * quoted with "" for a quote and may then hold commas and line breaks; LF
 * or CRLF line ends; a leading byte-order mark is ignored). Calls `row` with
 * each non-blank record and the line it starts on.
 */
export function forEachCSVRecord(text: string, row: (fields: string[], line: number) => void): void {
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  const n = text.length;
  let line = 1;
  while (i < n) {
    const startLine = line, fields: string[] = [];
    for (;;) {
      if (text.charCodeAt(i) === 34 /* " */) {
        let j = i + 1, value = '';
        for (;;) {
          const q = text.indexOf('"', j);
          if (q < 0) fail('bad-quote', 'a quoted field is never closed', `line ${startLine}`);
          value += text.slice(j, q);
          for (let k = j; k < q; k++) if (text.charCodeAt(k) === 10) line++;
          if (text.charCodeAt(q + 1) === 34) { value += '"'; j = q + 2; continue; }
          i = q + 1;
          break;
        }
        fields.push(value);
        const c = text.charCodeAt(i);
        if (i < n && c !== 44 && c !== 10 && c !== 13) fail('bad-quote', `unexpected text after a closing quote in field ${fields.length}`, `line ${line}`);
      } else {
        let j = i;
        for (; j < n; j++) {
          const c = text.charCodeAt(j);
          if (c === 44 || c === 10 || c === 13) break;
        }
        fields.push(text.slice(i, j));
        i = j;
      }
      if (i < n && text.charCodeAt(i) === 44) { i++; continue; }
      break;
    }
    // Line end: CRLF, LF or a lone CR.
    if (i < n && text.charCodeAt(i) === 13) i++;
    if (i < n && text.charCodeAt(i) === 10) i++;
    line++;
    if (fields.length === 1 && fields[0].trim() === '') continue;
    row(fields, startLine);
  }
}

/**
 * Reads sites from CSV text with a header row, taking x, y and optional
 * weight and id from named columns. Untrusted: a missing column, a row with
 * the wrong number of fields, or a value that is not a decimal number is a
 * FormatError whose path names the line and column, e.g. `line 7, column "x"`.
 */
export function readCSVSites(text: string, options: CSVSiteOptions = {}): SiteTable {
  const names = { x: options.x ?? 'x', y: options.y ?? 'y', weight: options.weight, id: options.id };
  let header: string[] | null = null;
  let cx = -1, cy = -1, cw = -1, ci = -1;
  let xy = new Float64Array(1024), count = 0, lines = new Int32Array(512);
  let weights: Float64Array | null = names.weight === undefined ? null : new Float64Array(512);
  const ids: string[] | null = names.id === undefined ? null : [];
  const number = (fields: string[], col: number, line: number): number => {
    const s = fields[col];
    if (!NUMBER.test(s)) {
      fail('not-a-number', s.trim() === '' ? 'the field is empty; expected a number' : `${JSON.stringify(s)} is not a number`, `line ${line}, column "${header![col]}"`);
    }
    return Number(s);
  };
  forEachCSVRecord(text, (fields, line) => {
    if (header === null) {
      header = fields.map((f) => f.trim());
      const col = (name: string, what: string): number => {
        const k = header!.indexOf(name);
        if (k < 0) fail('missing-column', `no column "${name}" for ${what}; the header has ${header!.map((h) => JSON.stringify(h)).join(', ')}`, `line ${line}`);
        return k;
      };
      cx = col(names.x, 'x'); cy = col(names.y, 'y');
      if (names.weight !== undefined) cw = col(names.weight, 'weights');
      if (names.id !== undefined) ci = col(names.id, 'ids');
      return;
    }
    if (fields.length !== header.length) fail('bad-row', `${fields.length} fields, but the header has ${header.length}`, `line ${line}`);
    if (2 * count + 2 > xy.length) {
      const bigger = new Float64Array(2 * xy.length); bigger.set(xy); xy = bigger;
      const l2 = new Int32Array(2 * lines.length); l2.set(lines); lines = l2;
      if (weights) { const w2 = new Float64Array(2 * weights.length); w2.set(weights); weights = w2; }
    }
    xy[2 * count] = number(fields, cx, line);
    xy[2 * count + 1] = number(fields, cy, line);
    if (weights) weights[count] = number(fields, cw, line);
    if (ids) ids.push(fields[ci]);
    lines[count] = line;
    count++;
  });
  if (header === null) fail('empty', 'the file is empty; expected a header row and one row per site', 'line 1');
  if (count === 0) fail('empty', 'no rows after the header', 'line 2');
  return siteTable(xy, weights, ids, lines, count);
}

let utf8Decoder: InstanceType<typeof TextDecoder> | null = null;

/**
 * readCSVSites for the bytes of a UTF-8 file, read in place: no text for
 * the whole file, none per field. Plain files (no quotes, LF or CRLF line
 * ends, ASCII ids, numbers without spaces) take this path; any other file,
 * and every file with an error, is decoded and read by readCSVSites, so the
 * result and the error messages are the same as there.
 */
export function readCSVSiteBytes(bytes: Uint8Array, options: CSVSiteOptions = {}): SiteTable {
  return readPlainCSV(bytes, options) ?? readCSVSites((utf8Decoder ??= new TextDecoder('utf-8')).decode(bytes), options);
}

/** The fast path of readCSVSiteBytes; null when the file needs the careful one. */
function readPlainCSV(b: Uint8Array, options: CSVSiteOptions): SiteTable | null {
  const n = b.length;
  let i = n >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf ? 3 : 0;
  // The header: its own line, no quotes, ASCII.
  let end = i;
  while (end < n && b[end] !== 10) {
    if (b[end] === 34 || b[end] >= 128 || (b[end] === 13 && end + 1 < n && b[end + 1] !== 10)) return null;
    end++;
  }
  const lineEnd = end > i && b[end - 1] === 13 ? end - 1 : end;
  let headerText = '';
  for (let k = i; k < lineEnd; k++) headerText += String.fromCharCode(b[k]);
  if (headerText.trim() === '') return null;
  const header = headerText.split(',').map((f) => f.trim());
  const cx = header.indexOf(options.x ?? 'x'), cy = header.indexOf(options.y ?? 'y');
  const cw = options.weight === undefined ? -2 : header.indexOf(options.weight);
  const ci = options.id === undefined ? -2 : header.indexOf(options.id);
  if (cx < 0 || cy < 0 || cw === -1 || ci === -1) return null;
  // An id column that is also read as a number: rare, left to the careful path.
  if (ci >= 0 && (ci === cx || ci === cy || ci === cw)) return null;
  const width = header.length;
  i = end + 1;
  let line = 2;
  let xy = new Float64Array(1 << 16), lines = new Int32Array(1 << 15), count = 0;
  let weights: Float64Array | null = cw >= 0 ? new Float64Array(1 << 15) : null;
  const ids: string[] | null = ci >= 0 ? [] : null;
  let x = 0, y = 0, w = 0, id = '';
  for (; i < n; line++) {
    // A blank line.
    if (b[i] === 10) { i++; continue; }
    if (b[i] === 13 && i + 1 < n && b[i + 1] === 10) { i += 2; continue; }
    // One line, field by field: numbers are read in place, other fields skipped (a quote anywhere needs the careful path).
    let field = 0;
    for (;;) {
      if (field === cx || field === cy || field === cw) {
        const v = parseDecimalPrefix(b, i, n);
        if (v !== v) return null;
        if (field === cx) x = v;
        if (field === cy) y = v;
        if (field === cw) w = v;
        i = decimalEnd;
      } else if (field === ci) {
        id = '';
        for (; i < n; i++) {
          const c = b[i];
          if (c === 44 || c === 10 || c === 13) break;
          if (c === 34 || c >= 128) return null;
          id += String.fromCharCode(c);
        }
      } else {
        for (; i < n; i++) {
          const c = b[i];
          if (c === 44 || c === 10 || c === 13) break;
          if (c === 34) return null;
        }
      }
      field++;
      if (i >= n) break;
      const c = b[i];
      if (c === 44) { i++; continue; }
      if (c === 10) { i++; break; }
      if (c === 13 && i + 1 < n && b[i + 1] === 10) { i += 2; break; }
      // Anything else after a number (a space, a letter) or a lone CR.
      return null;
    }
    if (field !== width) return null;
    if (2 * count + 2 > xy.length) {
      const bigger = new Float64Array(2 * xy.length); bigger.set(xy); xy = bigger;
      const l2 = new Int32Array(2 * lines.length); l2.set(lines); lines = l2;
      if (weights) { const w2 = new Float64Array(2 * weights.length); w2.set(weights); weights = w2; }
    }
    xy[2 * count] = x;
    xy[2 * count + 1] = y;
    if (weights) weights[count] = w;
    if (ids) ids.push(id);
    lines[count] = line;
    count++;
  }
  if (count === 0) return null;
  return siteTable(xy, weights, ids, lines, count);
}

/** The first `count` rows read, trimmed to size; row k came from file line lines[k]. */
function siteTable(xy: Float64Array, weights: Float64Array | null, ids: string[] | null, lines: Int32Array, count: number): SiteTable {
  return {
    xy: xy.slice(0, 2 * count),
    weights: weights ? weights.slice(0, count) : null,
    ids,
    where: (k) => `line ${lines[k]}`,
  };
}
