import { meet, midpoint, sideOf, type Line, type Pt } from './geometry.js';
import type { Bisector, ExactMetric } from './bisector.js';
import { splitShared } from './beyond.js';

/**
 * A cell under construction: a polygon star-shaped about its site, counter-
 * clockwise. Edge i runs from pts[i] to pts[i+1] on lines[i]; labels[i] is
 * the site across it, or -1-j for side j of the region.
 */
export interface Cell { pts: Pt[]; lines: Line[]; labels: number[] }

/** What the clip needs to know about sites besides the bisector in hand. */
export interface ClipContext {
  /** The cell's own site. */
  site: number;
  /** The bisector of the cell's site and another. */
  bisectorWith(other: number): Bisector;
  metric: ExactMetric;
  x(site: number): number;
  y(site: number): number;
}

interface Piece { start: Pt; pos: number; status: number; label: number; line: Line; edge: number }

const notOnB = -1;
/** Side signs of one clip (clips do not nest): reused, as allocating typed arrays per clip is slow. */
let scratch = new Int8Array(256);
const UNKNOWN = 2;
/** Shared empty list: most edges have no crossing, and this runs for every edge of every clip. */
const NO_EVENTS: { p: Pt; pos: number }[] = [];

/**
 * Clips the cell by site t, whose bisector with the cell's site is `bis`
 * (s on its left). Both the cell and the side of the bisector that the site
 * keeps are star-shaped about the site, and the bisector, like every edge of
 * the cell, turns counter-clockwise around it, so the crossings along an
 * edge come in the order of their place along the bisector. Every decision
 * is an exact predicate. Returns whether the cell changed.
 */
export function clipCell(cell: Cell, bis: Bisector, t: number, ctx: ClipContext): boolean {
  const { pts, lines, labels } = cell;
  const n = pts.length, K = bis.pieces.length;
  if (scratch.length < n * (K + 2)) scratch = new Int8Array(2 * n * (K + 2));
  // sv[i] = scratch[i] is corner i's side of the bisector. With three
  // pieces, scratch[n + i] is its place across the cuts (as Bisector.pos
  // numbers it, 1..5) and scratch[2n + 3i + k] its side of piece k's line,
  // found when first needed (UNKNOWN until then): an edge can only cross
  // piece k inside the cell where the closed slab of k meets the edge.
  const sv = scratch, Z = n, P = 2 * n;
  let out = 0, on = 0;
  for (let i = 0; i < n; i++) {
    if (K === 1) sv[i] = sideOf(pts[i], bis.pieces[0]);
    else {
      const z = bis.pos(pts[i]), k = z <= 2 ? 0 : z <= 4 ? 1 : 2;
      sv[Z + i] = z;
      sv[P + 3 * i] = UNKNOWN; sv[P + 3 * i + 1] = UNKNOWN; sv[P + 3 * i + 2] = UNKNOWN;
      sv[i] = sv[P + 3 * i + k] = sideOf(pts[i], bis.pieces[k]);
    }
    if (sv[i] > 0) out++;
    else if (sv[i] === 0) on++;
  }
  // A straight bisector with no corner on its far side or on it cannot cross the cell.
  if (out === 0 && on === 0 && K === 1) return false;
  const pieces: Piece[] = [];
  let changed = false;
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const a = pts[i], b = pts[j];
    let events: { p: Pt; pos: number }[] = NO_EVENTS;
    for (let k = 0; k < K; k++) {
      if (K === 1) {
        if (sv[i] * sv[j] >= 0) continue;
      } else {
        // Both corners strictly before the slab of piece k, or both strictly after: the edge is too.
        const zi = sv[Z + i], zj = sv[Z + j];
        if ((zi < 2 * k && zj < 2 * k) || (zi > 2 * k + 2 && zj > 2 * k + 2)) continue;
        if (sv[P + 3 * i + k] === UNKNOWN) sv[P + 3 * i + k] = sideOf(a, bis.pieces[k]);
        if (sv[P + 3 * j + k] === UNKNOWN) sv[P + 3 * j + k] = sideOf(b, bis.pieces[k]);
        if (sv[P + 3 * i + k] * sv[P + 3 * j + k] >= 0) continue;
      }
      if (events === NO_EVENTS) events = [];
      const x = meet(lines[i], bis.pieces[k]);
      const pos = bis.pos(x);
      if (pos < 2 * k || pos > 2 * k + 2) continue;
      if (events.some((e) => e.pos === pos)) continue;
      events.push({ p: (pos & 1) === 0 ? bis.bend(pos / 2 - 1) : x, pos });
    }
    if (events.length > 1) events.sort((e, f) => e.pos - f.pos);
    const m = events.length;
    if (m > 0) changed = true;
    for (let q = 0; q <= m; q++) {
      const start = q === 0 ? a : events[q - 1].p, end = q === m ? b : events[q].p;
      const pos = q === 0 ? (sv[i] === 0 ? 0 : notOnB) : events[q - 1].pos;
      let status: number;
      if (q === 0 && sv[i] !== 0) status = sv[i];
      else if (q === m && sv[j] !== 0) status = sv[j];
      else status = bis.side(midpoint(start, end));
      pieces.push({ start, pos, status, label: labels[i], line: lines[i], edge: i });
    }
  }
  // Unchanged only if nothing lies beyond: an edge with both ends on a bent bisector can still bulge past it
  // (the bend inside the cell), which only its midpoint's status shows.
  if (!changed && !pieces.some((p) => p.status > 0 || (p.status === 0 && p.label >= 0))) return false;
  const relabelled = relabelShared(pieces, t, ctx);
  const N = pieces.length;
  let first = -1;
  for (let q = 0; q < N && first < 0; q++) if (pieces[q].status <= 0 && pieces[(q + N - 1) % N].status > 0) first = q;
  if (first < 0) first = 0;
  const nPts: Pt[] = [], nLines: Line[] = [], nLabels: number[] = [];
  let prev: Piece | null = null;
  for (let c = 0; c < N; c++) {
    const p = pieces[(first + c) % N];
    if (p.status <= 0) {
      if (prev === null || prev.edge !== p.edge || prev.label !== p.label) {
        nPts.push(p.start); nLines.push(p.line); nLabels.push(p.label);
      }
      prev = p;
      continue;
    }
    // A run outside: follow the bisector from where the boundary leaves the site's side to where it comes back.
    let d = c;
    while (d + 1 < N && pieces[(first + d + 1) % N].status > 0) d++;
    const exit = p, entry = pieces[(first + d + 1) % N];
    const from = exit.pos === notOnB || exit.pos === 0 ? bis.pos(exit.start) : exit.pos;
    const to = entry.pos === notOnB || entry.pos === 0 ? bis.pos(entry.start) : entry.pos;
    if (to < from) throw new Error(`metric clip: the bisector is re-entered behind its exit (${from} > ${to})`);
    nPts.push(exit.start); nLines.push(bis.pieces[from >> 1]); nLabels.push(t);
    for (let pos = from + 1; pos < to; pos++) {
      if ((pos & 1) !== 0) continue;
      nPts.push(bis.bend(pos / 2 - 1)); nLines.push(bis.pieces[pos >> 1]); nLabels.push(t);
    }
    prev = null;
    c = d;
  }
  cell.pts = nPts; cell.lines = nLines; cell.labels = nLabels;
  if (relabelled) dropStraightCorners(cell, bis, t, ctx);
  return true;
}

/**
 * After a relabelling, a corner between two edges with the same neighbour
 * may sit inside one straight piece of their bisector (it was a corner of
 * an older boundary): the neighbour's cell has no corner there, so it goes.
 * Corners at bends stay.
 */
function dropStraightCorners(cell: Cell, bis: Bisector, t: number, ctx: ClipContext): void {
  const { pts, lines, labels } = cell;
  for (let i = pts.length - 1; i >= 0 && pts.length > 3; i--) {
    const p = i === 0 ? pts.length - 1 : i - 1;
    const l = labels[i];
    if (l < 0 || labels[p] !== l) continue;
    const b = l === t ? bis : ctx.bisectorWith(l);
    const pos = b.pos(pts[i]);
    if ((pos & 1) === 0) continue;
    lines[p] = b.pieces[pos >> 1];
    pts.splice(i, 1); lines.splice(i, 1); labels.splice(i, 1);
  }
}

/**
 * Boundary lying along the new bisector (status 0) that belonged to another
 * site l: beyond it both l and t beat the cell's site, and the cell across
 * is whichever wins there (see beyond.ts); it may change along the stretch.
 * Region sides stay.
 */
function relabelShared(pieces: Piece[], t: number, ctx: ClipContext): boolean {
  let changed = false;
  for (let q = 0; q < pieces.length; q++) {
    const p = pieces[q];
    if (p.status !== 0 || p.label < 0 || p.label === t) continue;
    changed = true;
    const end = pieces[(q + 1) % pieces.length].start;
    const parts = splitShared(ctx.metric, p.start, end, p.line, p.label, t, ctx.x, ctx.y);
    p.label = parts[0].label;
    for (let k = 1; k < parts.length; k++) {
      pieces.splice(q + k, 0, { start: parts[k].start, pos: 0, status: 0, label: parts[k].label, line: p.line, edge: p.edge });
    }
    q += parts.length - 1;
  }
  return changed;
}
