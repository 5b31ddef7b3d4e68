import { boundingBox } from '../../core/bounds.js';
import { orient } from '../../core/predicates.js';
import type { StudyArea } from './area-input.js';
import { compareAlongExact, type AlongKey } from './exact-order.js';

// Status of a fragment of a cell edge against the area (or of a ring segment against the cell).
const UNKNOWN = 0, IN = 1, OUT = 2, ON_SAME = 3, ON_OPP = 4;

/**
 * Where direction o→d points relative to the open wedge swept
 * counter-clockwise from o→s to o→e (exact): IN, OUT, ON_SAME (along s)
 * or ON_OPP (along e).
 */
function wedge(ox: number, oy: number, sx: number, sy: number, ex: number, ey: number, dx: number, dy: number): number {
  const os = orient(ox, oy, sx, sy, dx, dy), oe = orient(ox, oy, ex, ey, dx, dy);
  if (os === 0 && (sx - ox) * (dx - ox) + (sy - oy) * (dy - oy) > 0) return ON_SAME;
  if (oe === 0 && (ex - ox) * (dx - ox) + (ey - oy) * (dy - oy) > 0) return ON_OPP;
  if (orient(ox, oy, sx, sy, ex, ey) > 0) return os > 0 && oe < 0 ? IN : OUT;
  return oe >= 0 && os <= 0 ? OUT : IN;
}

/** Position of (x, y) along the segment a→b, by its dominant axis (monotone; exact for points on it). */
function along(ax: number, ay: number, bx: number, by: number, x: number, y: number): number {
  return Math.abs(bx - ax) >= Math.abs(by - ay) ? (x - ax) * Math.sign(bx - ax) : (y - ay) * Math.sign(by - ay);
}

/**
 * Intersects one cell (a simple counter-clockwise polygon, convex or not)
 * with the study area, by an overlay of the cell's edges with the ring
 * segments near it. Every topological decision is an exact orient test on
 * input coordinates (cell vertices and ring vertices), never on a computed
 * crossing: each crossing point is a symbol (which cell edge, which ring
 * segment), and the side a fragment leaves it on is read off those two
 * segments' endpoints. Rounded coordinates of crossings only order points
 * along a segment and are what the output rings show. A crossing is
 * computed from the ring segment and the cell edge with its endpoints in a
 * canonical order, so the two cells sharing that edge get the same point
 * and their areas add up to the area's.
 *
 * Kept: cell-edge fragments inside the area, or along a ring edge running
 * the same way (the area lies left of every ring segment); ring-segment
 * fragments strictly inside the cell. Linked at each point by the smallest
 * clockwise turn, so that pieces touching at a point come out separate.
 */
export class CellClipper {
  private readonly area: StudyArea;
  private readonly cand: Int32Array;
  private cx: Float64Array = new Float64Array(0);
  private k = 0;
  private px: number[] = [];
  private py: number[] = [];
  /** Ring feature at a point: -1 none, 2g ring vertex g, 2j + 1 inside ring segment j. */
  private rf: number[] = [];
  /** Cell feature at a point: -1 none, 2i cell vertex i, 2i + 1 inside cell edge i. */
  private cf: number[] = [];
  private vid = new Map<number, number>();
  private cellEv: number[][] = [];
  private segEv: number[][] = [];
  private eFrom: number[] = [];
  private eTo: number[] = [];

  constructor(area: StudyArea) {
    this.area = area;
    this.cand = new Int32Array(area.next.length);
  }

  /**
   * The rings of cell ∩ area: counter-clockwise outer rings and clockwise
   * holes, interleaved x, y, in no particular grouping (see assemblePieces).
   */
  clip(cell: Float64Array, k: number): Float64Array[] {
    const { minX, minY, maxX, maxY } = boundingBox(cell, k);
    const n = this.area.grid.query(minX, minY, maxX, maxY, this.cand);
    if (n === 0) return this.area.locate(cell[0], cell[1]) > 0 ? [cell.slice(0, 2 * k)] : [];
    this.reset(cell, k, n);
    for (let i = 0; i < k; i++) for (let l = 0; l < n; l++) this.meet(i, l);
    this.eFrom.length = 0;
    this.eTo.length = 0;
    this.keepCellFragments();
    for (let l = 0; l < n; l++) this.keepRingFragments(l);
    return this.link();
  }

  private reset(cell: Float64Array, k: number, n: number): void {
    this.cx = cell;
    this.k = k;
    this.px.length = 0; this.py.length = 0; this.rf.length = 0; this.cf.length = 0;
    for (let i = 0; i < k; i++) {
      this.px.push(cell[2 * i]); this.py.push(cell[2 * i + 1]);
      this.rf.push(-1); this.cf.push(2 * i);
    }
    this.vid.clear();
    while (this.cellEv.length < k) this.cellEv.push([]);
    while (this.segEv.length < n) this.segEv.push([]);
    for (let i = 0; i < k; i++) this.cellEv[i].length = 0;
    for (let l = 0; l < n; l++) this.segEv[l].length = 0;
  }

  private newPoint(x: number, y: number, rf: number, cf: number): number {
    this.px.push(x); this.py.push(y); this.rf.push(rf); this.cf.push(cf);
    return this.px.length - 1;
  }

  /** The point of ring vertex g: a cell vertex at the same place, or its own. */
  private ringVertex(g: number): number {
    const known = this.vid.get(g);
    if (known !== undefined) return known;
    const x = this.area.xy[2 * g], y = this.area.xy[2 * g + 1], c = this.cx;
    let id = -1;
    for (let i = 0; i < this.k; i++) if (c[2 * i] === x && c[2 * i + 1] === y) { id = i; break; }
    if (id < 0) id = this.newPoint(x, y, 2 * g, -1);
    else this.rf[id] = 2 * g;
    this.vid.set(g, id);
    return id;
  }

  /** Records where cell edge i and candidate segment l meet, if they do. */
  private meet(i: number, l: number): void {
    const c = this.cx, xy = this.area.xy, k = this.k;
    const j = this.cand[l], b = this.area.next[j], q = i + 1 === k ? 0 : i + 1;
    const pX = c[2 * i], pY = c[2 * i + 1], qX = c[2 * q], qY = c[2 * q + 1];
    const aX = xy[2 * j], aY = xy[2 * j + 1], bX = xy[2 * b], bY = xy[2 * b + 1];
    if (Math.max(pX, qX) < Math.min(aX, bX) || Math.min(pX, qX) > Math.max(aX, bX) ||
        Math.max(pY, qY) < Math.min(aY, bY) || Math.min(pY, qY) > Math.max(aY, bY)) return;
    const oa = orient(pX, pY, qX, qY, aX, aY), ob = orient(pX, pY, qX, qY, bX, bY);
    if ((oa > 0 && ob > 0) || (oa < 0 && ob < 0)) return;
    const op = orient(aX, aY, bX, bY, pX, pY), oq = orient(aX, aY, bX, bY, qX, qY);
    if ((op > 0 && oq > 0) || (op < 0 && oq < 0)) return;
    const cev = this.cellEv[i], sev = this.segEv[l];
    if (oa !== 0 && ob !== 0 && op !== 0 && oq !== 0) {
      // A proper crossing. Canonical order of the edge's ends: both cells get the same point.
      const flip = pX > qX || (pX === qX && pY > qY);
      const sX = flip ? qX : pX, sY = flip ? qY : pY, lx = (flip ? pX : qX) - sX, ly = (flip ? pY : qY) - sY;
      const dx = bX - aX, dy = bY - aY;
      const t = Math.min(1, Math.max(0, ((sX - aX) * ly - (sY - aY) * lx) / (dx * ly - dy * lx)));
      // Kept in both segments' boxes: a crossing with an axis-parallel edge lands exactly on it.
      const x = clamp(aX + t * dx, Math.max(Math.min(pX, qX), Math.min(aX, bX)), Math.min(Math.max(pX, qX), Math.max(aX, bX)));
      const y = clamp(aY + t * dy, Math.max(Math.min(pY, qY), Math.min(aY, bY)), Math.min(Math.max(pY, qY), Math.max(aY, bY)));
      const id = this.newPoint(x, y, 2 * j + 1, 2 * i + 1);
      cev.push(id);
      sev.push(id);
      return;
    }
    // Touching: an end of one lies on the other (boxes are exact for collinear points).
    if (oa === 0 && inBox(aX, aY, pX, pY, qX, qY)) this.touchRing(j, i, cev, sev);
    if (ob === 0 && inBox(bX, bY, pX, pY, qX, qY)) this.touchRing(b, i, cev, sev);
    if (op === 0 && inBox(pX, pY, aX, aY, bX, bY)) this.touchCell(i, j, pX, pY, aX, aY, bX, bY, cev, sev);
    if (oq === 0 && inBox(qX, qY, aX, aY, bX, bY)) this.touchCell(q, j, qX, qY, aX, aY, bX, bY, cev, sev);
  }

  private touchRing(g: number, i: number, cev: number[], sev: number[]): void {
    const id = this.ringVertex(g);
    if (this.cf[id] === -1) this.cf[id] = 2 * i + 1;
    addOnce(cev, id);
    addOnce(sev, id);
  }

  private touchCell(v: number, j: number, x: number, y: number, aX: number, aY: number, bX: number, bY: number, cev: number[], sev: number[]): void {
    // On a ring vertex: that case is the ring vertex's (touchRing), which maps it onto this cell vertex.
    if ((x === aX && y === aY) || (x === bX && y === bY)) return;
    this.rf[v] = 2 * j + 1;
    addOnce(cev, v);
    addOnce(sev, v);
  }

  /** Which way a cell-edge fragment leaving point id towards (dx, dy) lies relative to the area. */
  private ringStatus(id: number, dx: number, dy: number): number {
    const f = this.rf[id], xy = this.area.xy;
    if (f & 1) {
      const j = f >> 1, b = this.area.next[j];
      const o = orient(xy[2 * j], xy[2 * j + 1], xy[2 * b], xy[2 * b + 1], dx, dy);
      if (o !== 0) return o > 0 ? IN : OUT;
      const dot = (xy[2 * b] - xy[2 * j]) * (dx - this.px[id]) + (xy[2 * b + 1] - xy[2 * j + 1]) * (dy - this.py[id]);
      return dot > 0 ? ON_SAME : ON_OPP;
    }
    const g = f >> 1, s = this.area.next[g], e = this.area.prev[g];
    return wedge(xy[2 * g], xy[2 * g + 1], xy[2 * s], xy[2 * s + 1], xy[2 * e], xy[2 * e + 1], dx, dy);
  }

  /** Which way a ring fragment leaving point id towards (dx, dy) lies relative to the cell. */
  private cellStatus(id: number, dx: number, dy: number): number {
    const f = this.cf[id], c = this.cx, k = this.k, i = f >> 1;
    if (f & 1) {
      const q = i + 1 === k ? 0 : i + 1;
      const o = orient(c[2 * i], c[2 * i + 1], c[2 * q], c[2 * q + 1], dx, dy);
      return o > 0 ? IN : o < 0 ? OUT : ON_SAME;
    }
    const s = i + 1 === k ? 0 : i + 1, e = i === 0 ? k - 1 : i - 1;
    return wedge(c[2 * i], c[2 * i + 1], c[2 * s], c[2 * s + 1], c[2 * e], c[2 * e + 1], dx, dy);
  }

  /**
   * Sorts points on segment P→Q by position. Rounded positions decide when
   * they differ by more than NEAR_TIE of the segment's extent (a crossing
   * is placed within a few ulps unless its segments meet at an angle below
   * about 1e-7); closer ones are compared exactly, a crossing by the line
   * it is the crossing with (the ring segment on a cell edge, the cell edge
   * on a ring segment).
   */
  private sortAlong(pts: number[], pX: number, pY: number, qX: number, qY: number, onCellEdge: boolean): void {
    const extent = Math.max(Math.abs(qX - pX), Math.abs(qY - pY)), near = NEAR_TIE * extent;
    pts.sort((u, v) => {
      const d = along(pX, pY, qX, qY, this.px[u], this.py[u]) - along(pX, pY, qX, qY, this.px[v], this.py[v]);
      if (Math.abs(d) > near) return d;
      return compareAlongExact(pX, pY, qX, qY, this.alongKey(u, onCellEdge, keyU), this.alongKey(v, onCellEdge, keyV));
    });
  }

  private alongKey(id: number, onCellEdge: boolean, key: AlongKey): AlongKey {
    const rf = this.rf[id], cf = this.cf[id];
    key.line = rf >= 0 && cf >= 0 && (rf & 1) === 1 && (cf & 1) === 1;
    if (!key.line) {
      key.ax = key.bx = this.px[id];
      key.ay = key.by = this.py[id];
    } else if (onCellEdge) {
      const xy = this.area.xy, j = rf >> 1, b = this.area.next[j];
      key.ax = xy[2 * j]; key.ay = xy[2 * j + 1]; key.bx = xy[2 * b]; key.by = xy[2 * b + 1];
    } else {
      const c = this.cx, i = cf >> 1, q = i + 1 === this.k ? 0 : i + 1;
      key.ax = c[2 * i]; key.ay = c[2 * i + 1]; key.bx = c[2 * q]; key.by = c[2 * q + 1];
    }
    return key;
  }

  private keepCellFragments(): void {
    const k = this.k, c = this.cx, from: number[] = [], to: number[] = [], status: number[] = [];
    for (let i = 0; i < k; i++) {
      const q = i + 1 === k ? 0 : i + 1;
      const pX = c[2 * i], pY = c[2 * i + 1], qX = c[2 * q], qY = c[2 * q + 1];
      const pts = this.cellEv[i].filter((id) => id !== i && id !== q);
      if (pts.length > 1) this.sortAlong(pts, pX, pY, qX, qY, true);
      pts.unshift(i);
      pts.push(q);
      for (let m = 0; m + 1 < pts.length; m++) {
        from.push(pts[m]);
        to.push(pts[m + 1]);
        status.push(m === 0 && this.rf[i] === -1 ? UNKNOWN : this.ringStatus(pts[m], qX, qY));
      }
    }
    const f = from.length;
    let known = status.findIndex((s) => s !== UNKNOWN);
    if (known < 0) {
      // No cell vertex nor edge meets a ring: the whole boundary is inside or outside.
      status.fill(this.area.locate(c[0], c[1]) > 0 ? IN : OUT);
      known = 0;
    }
    // A fragment starting at a cell vertex off the rings continues the one before it.
    for (let m = 1; m < f; m++) {
      const at = (known + m) % f, before = status[(at + f - 1) % f];
      if (status[at] === UNKNOWN) status[at] = before === IN || before === ON_SAME ? IN : OUT;
    }
    for (let m = 0; m < f; m++) {
      if (status[m] === IN || status[m] === ON_SAME) { this.eFrom.push(from[m]); this.eTo.push(to[m]); }
    }
  }

  private keepRingFragments(l: number): void {
    const xy = this.area.xy, j = this.cand[l], b = this.area.next[j];
    const aX = xy[2 * j], aY = xy[2 * j + 1], bX = xy[2 * b], bY = xy[2 * b + 1];
    const ia = this.vid.get(j), ib = this.vid.get(b);
    const pts = this.segEv[l].filter((id) => id !== ia && id !== ib);
    if (pts.length > 1) this.sortAlong(pts, aX, aY, bX, bY, false);
    let status = ia !== undefined && this.cf[ia] !== -1 ? this.cellStatus(ia, bX, bY) : this.insideCell(aX, aY) ? IN : OUT;
    let start = -1;
    for (let m = 0; m <= pts.length; m++) {
      const end = m < pts.length ? pts[m] : this.ringVertex(b);
      if (status === IN) {
        this.eFrom.push(start < 0 ? this.ringVertex(j) : start);
        this.eTo.push(end);
      }
      if (m < pts.length) { start = end; status = this.cellStatus(end, bX, bY); }
    }
  }

  /** Crossing parity against the cell; (x, y) is off its boundary. */
  private insideCell(x: number, y: number): boolean {
    const c = this.cx, k = this.k;
    let inside = false;
    for (let i = 0, h = k - 1; i < k; h = i++) {
      const ay = c[2 * h + 1], by = c[2 * i + 1];
      if ((ay > y) === (by > y)) continue;
      const o = orient(c[2 * h], ay, c[2 * i], by, x, y);
      if (by > ay ? o > 0 : o < 0) inside = !inside;
    }
    return inside;
  }

  /** Links kept edges into rings, at each point by the smallest clockwise turn. */
  private link(): Float64Array[] {
    const from = this.eFrom, to = this.eTo, E = from.length, P = this.px.length, px = this.px, py = this.py;
    const head = new Int32Array(P).fill(-1), nextOut = new Int32Array(E), degree = new Int32Array(P);
    for (let e = E - 1; e >= 0; e--) { nextOut[e] = head[from[e]]; head[from[e]] = e; degree[from[e]]++; }
    const used = new Uint8Array(E), rings: Float64Array[] = [], ring: number[] = [];
    for (let e0 = 0; e0 < E; e0++) {
      if (used[e0]) continue;
      ring.length = 0;
      let e = e0;
      for (;;) {
        used[e] = 1;
        ring.push(px[from[e]], py[from[e]]);
        const v = to[e];
        let best = -1;
        if (degree[v] === 1) best = head[v];
        else {
          const rx = px[from[e]] - px[v], ry = py[from[e]] - py[v];
          let bestTurn = Infinity;
          for (let f = head[v]; f >= 0; f = nextOut[f]) {
            if (used[f] && f !== e0) continue;
            const dx = px[to[f]] - px[v], dy = py[to[f]] - py[v];
            let turn = -Math.atan2(rx * dy - ry * dx, rx * dx + ry * dy);
            if (turn <= 0) turn += 2 * Math.PI;
            if (turn < bestTurn) { bestTurn = turn; best = f; }
          }
        }
        if (best < 0 || best === e0 || used[best]) break;
        e = best;
      }
      const out = dedupeRing(ring);
      if (out) rings.push(out);
    }
    return rings;
  }
}

function inBox(x: number, y: number, ax: number, ay: number, bx: number, by: number): boolean {
  return x >= Math.min(ax, bx) && x <= Math.max(ax, bx) && y >= Math.min(ay, by) && y <= Math.max(ay, by);
}

/** Relative gap below which positions along a segment are compared exactly (see sortAlong). */
const NEAR_TIE = 1e-9;
const keyU: AlongKey = { line: false, ax: 0, ay: 0, bx: 0, by: 0 };
const keyV: AlongKey = { line: false, ax: 0, ay: 0, bx: 0, by: 0 };

const clamp = (v: number, lo: number, hi: number): number => (v < lo ? lo : v > hi ? hi : v);

function addOnce(list: number[], id: number): void {
  if (!list.includes(id)) list.push(id);
}

/** The ring without repeated consecutive points; null when fewer than 3 remain. */
function dedupeRing(r: number[]): Float64Array | null {
  const out: number[] = [];
  for (let i = 0; i < r.length; i += 2) {
    const n = out.length;
    if (n && out[n - 2] === r[i] && out[n - 1] === r[i + 1]) continue;
    out.push(r[i], r[i + 1]);
  }
  while (out.length > 2 && out[0] === out[out.length - 2] && out[1] === out[out.length - 1]) out.length -= 2;
  return out.length >= 6 ? Float64Array.from(out) : null;
}
