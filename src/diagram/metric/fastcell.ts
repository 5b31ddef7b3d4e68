import { meetFloat, needsRefine, SLACK, TINY, U, type Line } from './geometry.js';
import type { ExactMetric } from './bisector.js';

/*
 * The clip of cell.ts, whole cells at a time, in floating point on typed
 * arrays: no Pt, Line or Bisector objects. It computes every line constant
 * and every corner with the same floating-point operations as bisector.ts
 * and geometry.ts (so a corner gets the same double either way) and takes
 * every decision through the same error bounds; a decision the bound cannot
 * settle is not tried exactly here: the clip answers BAIL and the caller
 * builds the cell again on the exact object path. The one exact shortcut
 * kept is Pt.builtOn for cuts: a bend of an earlier bisector lies, by
 * construction, on the cut through the site of every later bisector along
 * the same axis (equal data, so the same line), and that case is common.
 *
 * A corner is PS doubles: x, y, error bound, and the cut it was built on
 * (axis code, 0 for none, and the cut's two terms). A line is LS doubles:
 * a, b, c, their error bounds, and the size of its constant (as in Line).
 * Corners and lines go into tables that only grow while one cell is built;
 * the polygon is lists of indices into them, so a clip moves no doubles.
 */

const PS = 6, LS = 7;
/** "Undecided in floating point": distinct from every side (-1, 0, 1) and place (1..5). */
export const BAIL = -9;
const UNKNOWN = 2;
const NOT_ON_B = -1;
/** Slots of the bisector's lines from `bo`: pieces 0..2, then the two cuts, then the two cuts the bends are built on. */
const CUT = 3, BEND_CUT = 5;

/**
 * geometry.sideOf() for a line with exact coefficients (every bisector
 * line: small integers, ea = eb = 0): the sign of A x + B y + C at a point
 * with error bound e, or 0 when the bound cannot decide.
 */
function sideB(px: number, py: number, e: number, L: Float64Array, o: number): number {
  const a = L[o], b = L[o + 1], c = L[o + 2];
  const ax = a * px, by = b * py;
  const f = ax + by + c;
  const bound = ((Math.abs(a) + Math.abs(b)) * e + L[o + 5] + 4 * U * (Math.abs(ax) + Math.abs(by) + Math.abs(c))) * SLACK + TINY;
  return f > bound ? 1 : f < -bound ? -1 : 0;
}

/** geometry.meet(l1, l2) into corner slot `oo` of `out` (no cut); false where meet would place the point exactly. */
function meetF(L1: Float64Array, o1: number, L2: Float64Array, o2: number, out: Float64Array, oo: number): boolean {
  meetFloat(L1[o1], L1[o1 + 1], L1[o1 + 2], L1[o1 + 3], L1[o1 + 4], L1[o1 + 5],
    L2[o2], L2[o2 + 1], L2[o2 + 2], L2[o2 + 3], L2[o2 + 4], L2[o2 + 5], XYE);
  const x = XYE[0], y = XYE[1], err = XYE[2];
  if (needsRefine(x, y, err, L1[o1 + 6], L2[o2 + 6])) return false;
  out[oo] = x; out[oo + 1] = y; out[oo + 2] = err; out[oo + 3] = 0; out[oo + 4] = 0; out[oo + 5] = 0;
  return true;
}

const XYE = new Float64Array(3);

/** Sign of a sum of doubles: exact for two terms (one rounding keeps the sign), else filtered; UNKNOWN when undecided. */
function signOf(T: Float64Array, len: number): number {
  let s = 0, abs = 0;
  for (let i = 0; i < len; i++) { s += T[i]; abs += Math.abs(T[i]); }
  if (len <= 2) return s > 0 ? 1 : s < 0 ? -1 : 0;
  const bound = len * U * abs * SLACK + TINY;
  return s > bound ? 1 : s < -bound ? -1 : UNKNOWN;
}

/** geometry.specialLine(a, b, T[0..len), scale) into line slot `o`. */
function special(L: Float64Array, o: number, a: number, b: number, T: Float64Array, len: number, scale: number): void {
  let s = 0, abs = 0;
  for (let i = 0; i < len; i++) { s += T[i]; abs += Math.abs(T[i]); }
  L[o] = a; L[o + 1] = b; L[o + 2] = -scale * s;
  L[o + 3] = 0; L[o + 4] = 0; L[o + 5] = len * U * abs * scale * SLACK + TINY; L[o + 6] = abs * scale;
}

function negate(L: Float64Array, o: number): void {
  L[o] = -L[o]; L[o + 1] = -L[o + 1]; L[o + 2] = -L[o + 2];
}

function copyLine(from: Float64Array, f: number, to: Float64Array, o: number): void {
  for (let i = 0; i < LS; i++) to[o + i] = from[f + i];
}

/** Out value of the farthest() methods: the Euclidean radius about the site that the candidate search must cover. */
export const extent = new Float64Array(1);

/**
 * A Euclidean radius about the site s that holds the metric ball B(q, d)
 * of the corner q at (dx, dy) from s (both rounded up), d = d(q, s): |q - s|
 * plus c d, c = 1 (L1) or sqrt 2 (L-infinity), the Euclidean length of the
 * longest vector of metric length 1. The disc then holds the ball of every
 * point of the cell, as the cell is star-shaped about s: for q = (1 - l) a
 * + l b on an edge, d(q, s) <= (1 - l) d(a, s) + l d(b, s) makes B(q, d(q, s))
 * part of (1 - l) B(a) + l B(b), inside the convex hull of the corner balls;
 * a point between s and an edge has the ball of the edge point shrunk
 * towards s (a homothety), and s is in the disc. Padded by 2^-30 relative
 * (a few roundings) and 2^-500 (a square that underflows).
 */
export function ballReach(dx: number, dy: number, d: number, L1: boolean): number {
  return (Math.sqrt(dx * dx + dy * dy) + (L1 ? d : Math.SQRT2 * d)) * (1 + 2 ** -30) + 2 ** -500;
}

/** One cell at a time (reused from cell to cell). */
export class FloatCell {
  /** Corner table (PS doubles each) and its length. */
  C = new Float64Array(256 * PS);
  private nc = 0;
  /** Line table (LS doubles each) and its length. */
  private LT = new Float64Array(128 * LS);
  private nl = 0;
  /** The polygon: n corners (ids into C), the line of the edge from each to the next (ids into LT), and the edge's label. */
  n = 0;
  pc = new Int32Array(32);
  private pl = new Int32Array(32);
  lab = new Int32Array(32);
  private pc2 = new Int32Array(32);
  private pl2 = new Int32Array(32);
  private lab2 = new Int32Array(32);
  private readonly L1: boolean;
  private sx = 0;
  private sy = 0;
  // The bisector in hand.
  /** The box of the corners (x0, x1, y0, y1) with their error bounds, set by farthest(). */
  private readonly box = new Float64Array(4);
  /** Where the bisector in hand starts in the line table (its lines sit just past the table's end until a clip keeps its pieces). */
  private bo = 0;
  private K = 0;
  private cutAxis = 0;
  /** Terms of cut 0 and cut 1 (bend k is built on a line with the same data as cut k). */
  private readonly cutT = new Float64Array(4);
  private readonly T = new Float64Array(8);
  // Per-clip scratch.
  private sv = new Int8Array(32);
  private zv = new Int8Array(32);
  private pv = new Int8Array(96);
  private qRef = new Int32Array(128);
  private qPos = new Int32Array(128);
  private qStat = new Int8Array(128);
  private qEdge = new Int32Array(128);
  private readonly evId = new Int32Array(4);
  private readonly evPos = new Int32Array(4);
  private readonly MID = new Float64Array(PS);

  constructor(metric: ExactMetric) { this.L1 = metric === 'L1'; }

  /** Starts the cell of site (sx, sy) as the region (corners, side lines, labels). */
  start(sx: number, sy: number, pts: readonly { x: number; y: number }[], lines: readonly Line[], labels: readonly number[]): void {
    this.sx = sx; this.sy = sy;
    const m = pts.length;
    this.nc = 0; this.nl = 0;
    this.reserve(m);
    this.room(m, m);
    const C = this.C, L = this.LT;
    for (let i = 0; i < m; i++) {
      const o = i * PS, l = lines[i], q = i * LS;
      C[o] = pts[i].x; C[o + 1] = pts[i].y; C[o + 2] = 0; C[o + 3] = 0; C[o + 4] = 0; C[o + 5] = 0;
      L[q] = l.a; L[q + 1] = l.b; L[q + 2] = l.c; L[q + 3] = l.ea; L[q + 4] = l.eb; L[q + 5] = l.ec; L[q + 6] = l.size;
      this.pc[i] = i; this.pl[i] = i; this.lab[i] = labels[i];
    }
    this.nc = m; this.nl = m;
    this.n = m;
  }

  /** Room in the polygon lists for m corners. */
  private reserve(m: number): void {
    if (this.lab.length >= m) return;
    const size = 2 * m;
    const pc = new Int32Array(size), pl = new Int32Array(size), lab = new Int32Array(size);
    pc.set(this.pc); pl.set(this.pl); lab.set(this.lab);
    this.pc = pc; this.pl = pl; this.lab = lab;
    this.pc2 = new Int32Array(size); this.pl2 = new Int32Array(size); this.lab2 = new Int32Array(size);
  }

  /** Room in the tables for a more corners and b more lines. */
  private room(a: number, b: number): void {
    if ((this.nc + a) * PS > this.C.length) {
      const C = new Float64Array(2 * (this.nc + a) * PS);
      C.set(this.C.subarray(0, this.nc * PS));
      this.C = C;
    }
    if ((this.nl + b) * LS > this.LT.length) {
      const L = new Float64Array(2 * (this.nl + b) * LS);
      L.set(this.LT.subarray(0, this.nl * LS));
      this.LT = L;
    }
  }

  /** As build.ts farthest() (sets extent[0]). */
  farthest(): number {
    const C = this.C, pc = this.pc, L1 = this.L1;
    let r = 0, reach = 0, x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
    for (let i = 0; i < this.n; i++) {
      const o = pc[i] * PS, err = C[o + 2], x = C[o], y = C[o + 1];
      const e = Number.isFinite(err) ? 2 * err : 0;
      const dx = Math.abs(x - this.sx) + e, dy = Math.abs(y - this.sy) + e;
      const d = L1 ? dx + dy : Math.max(dx, dy);
      if (d > r) r = d;
      reach = Math.max(reach, ballReach(dx, dy, d, L1));
      // An infinite bound makes the box the whole plane, as it should.
      x0 = Math.min(x0, x - 2 * err); x1 = Math.max(x1, x + 2 * err); y0 = Math.min(y0, y - 2 * err); y1 = Math.max(y1, y + 2 * err);
    }
    const box = this.box;
    box[0] = x0; box[1] = x1; box[2] = y0; box[3] = y1;
    extent[0] = reach;
    return r;
  }

  /** As build.ts cannotClip(), on the corners here. */
  cannotClip(ux: number, uy: number, R: number): boolean {
    const L1 = this.L1, sx = this.sx, sy = this.sy, C = this.C, pc = this.pc, n = this.n;
    const dsu = L1 ? Math.abs(ux - sx) + Math.abs(uy - sy) : Math.max(Math.abs(ux - sx), Math.abs(uy - sy));
    if (dsu > 2 * R) return true;
    for (let i = 0; i < n; i++) {
      const o = pc[i] * PS, px = C[o], py = C[o + 1];
      const ax = Math.abs(px - sx), ay = Math.abs(py - sy), bx = Math.abs(px - ux), by = Math.abs(py - uy);
      const ds = L1 ? ax + ay : Math.max(ax, ay), du = L1 ? bx + by : Math.max(bx, by);
      if (!(du - ds > 4 * U * (ds + du) + 4 * C[o + 2] + 2 ** -900)) return false;
    }
    if (dsu / 2 > R) return true;
    const Ps = L1 ? sx : sx + sy, Qs = L1 ? sy : sx - sy, Pu = L1 ? ux : ux + uy, Qu = L1 ? uy : ux - uy;
    const dP = Pu - Ps, dQ = Qu - Qs, h = (Math.abs(dP) + Math.abs(dQ)) / 2;
    if (Math.abs(Math.abs(dP) - Math.abs(dQ)) <= 8 * U * (Math.abs(dP) + Math.abs(dQ))) return dP === 0 || dQ === 0;
    const alongP = Math.abs(dQ) > Math.abs(dP);
    const hP = alongP ? 0 : Math.sign(dP) * h, hQ = alongP ? Math.sign(dQ) * h : 0;
    return this.bendOutside(Ps + hP, Qs + hQ) && this.bendOutside(Pu - hP, Qu - hQ);
  }

  private bendOutside(P: number, Q: number): boolean {
    const x = this.L1 ? P : (P + Q) / 2, y = this.L1 ? Q : (P - Q) / 2;
    // Clearly outside the corners' box (the margin is far above the rounding of the bend): outside the cell, without a walk around it.
    const box = this.box, margin = 2 ** -30 * (Math.abs(x) + Math.abs(y) + box[1] - box[0] + box[3] - box[2]);
    if (x < box[0] - margin || x > box[1] + margin || y < box[2] - margin || y > box[3] + margin) return true;
    return this.clearlyOutside(x, y);
  }

  /** As build.ts clearlyOutside(). */
  private clearlyOutside(x: number, y: number): boolean {
    const C = this.C, pc = this.pc, n = this.n;
    let wn = 0;
    for (let i = 0; i < n; i++) {
      const o = pc[i] * PS, q = pc[i + 1 === n ? 0 : i + 1] * PS;
      const ax = C[o], ay = C[o + 1], bx = C[q], by = C[q + 1];
      const ex = bx - ax, ey = by - ay;
      const cross = ex * (y - ay) - ey * (x - ax);
      const len = Math.abs(ex) + Math.abs(ey);
      const scale = len * (Math.abs(x - ax) + Math.abs(y - ay) + len);
      if (Math.abs(cross) <= 2 ** -30 * scale + 2 * len * (C[o + 2] + C[q + 2])) return false;
      if (ay <= y) { if (by > y && cross > 0) wn++; } else if (by <= y && cross < 0) wn--;
    }
    return wn === 0;
  }

  /**
   * bisector.ts bisector(metric, s, t) into the bisector buffer: the number
   * of pieces, or 0 when a sign needed is not settled in floating point
   * (this includes every pair with a two-dimensional tie).
   */
  private bisect(tx: number, ty: number): number {
    const sx = this.sx, sy = this.sy, L1 = this.L1, T = this.T, B = this.LT, bo = this.bo;
    const swap = !(sx < tx || (sx === tx && sy < ty));
    const ax = swap ? tx : sx, ay = swap ? ty : sy, bx = swap ? sx : tx, by = swap ? sy : ty;
    // The frame coordinates of a and b as term lists (one term for L1, two for L-infinity).
    const m = L1 ? 1 : 2;
    const pa0 = ax, pa1 = L1 ? 0 : ay, qa0 = L1 ? ay : ax, qa1 = L1 ? 0 : -ay;
    const pb0 = bx, pb1 = L1 ? 0 : by, qb0 = L1 ? by : bx, qb1 = L1 ? 0 : -by;
    if (m === 1) { T[0] = pb0; T[1] = -pa0; } else { T[0] = pb0; T[1] = pb1; T[2] = -pa0; T[3] = -pa1; }
    const sP = signOf(T, 2 * m);
    if (m === 1) { T[0] = qb0; T[1] = -qa0; } else { T[0] = qb0; T[1] = qb1; T[2] = -qa0; T[3] = -qa1; }
    const sQ = signOf(T, 2 * m);
    if (sP === UNKNOWN || sQ === UNKNOWN) return 0;
    let len = 0;
    if (sP !== 0) {
      if (m === 1) { T[0] = sP * pb0; T[1] = sP * -pa0; len = 2; } else { T[0] = sP * pb0; T[1] = sP * pb1; T[2] = sP * -pa0; T[3] = sP * -pa1; len = 4; }
    }
    if (sQ !== 0) {
      if (m === 1) { T[len] = -sQ * qb0; T[len + 1] = -sQ * -qa0; len += 2; } else {
        T[len] = -sQ * qb0; T[len + 1] = -sQ * qb1; T[len + 2] = -sQ * -qa0; T[len + 3] = -sQ * -qa1; len += 4;
      }
    }
    const cmp = signOf(T, len);
    if (cmp === UNKNOWN || cmp === 0) return 0;
    const alongP = cmp < 0;
    const da0 = alongP ? qa0 : pa0, da1 = alongP ? qa1 : pa1, db0 = alongP ? qb0 : pb0, db1 = alongP ? qb1 : pb1;
    const ka0 = alongP ? pa0 : qa0, ka1 = alongP ? pa1 : qa1, kb0 = alongP ? pb0 : qb0, kb1 = alongP ? pb1 : qb1;
    const sD = alongP ? sQ : sP, sK = alongP ? sP : sQ;
    // Coefficients of line(alpha, beta) in bisector.ts: (alpha, beta) for L1, (alpha + beta, alpha - beta) for L-infinity.
    // dLine is alongP ? line(0, 1) : line(1, 0), kLine the other one.
    const dAx = L1 ? (alongP ? 0 : 1) : 1, dBy = L1 ? (alongP ? 1 : 0) : (alongP ? -1 : 1);
    if (sK === 0) {
      this.fill(da0, da1, db0, db1, 0, 0, 0, 0, m);
      special(B, bo, dAx, dBy, T, 2 * m, 0.5);
      if (!this.orient(bo)) return 0;
      this.K = 1;
      return 1;
    }
    const low = bo, mid = bo + LS, high = bo + 2 * LS;
    this.fill(da0, da1, db0, db1, sD * kb0, sD * kb1, sD * -ka0, sD * -ka1, m);
    special(B, low, dAx, dBy, T, 4 * m, 0.5);
    this.fill(da0, da1, db0, db1, -sD * kb0, -sD * kb1, -sD * -ka0, -sD * -ka1, m);
    special(B, high, dAx, dBy, T, 4 * m, 0.5);
    this.fill(sD * da0, sD * da1, sD * db0, sD * db1, sK * ka0, sK * ka1, sK * kb0, sK * kb1, m);
    // mid: alongP ? line(sK, sD) : line(sD, sK).
    const al = alongP ? sK : sD, be = alongP ? sD : sK;
    special(B, mid, L1 ? al : al + be, L1 ? be : al - be, T, 4 * m, 0.5);
    if (!this.orient(low) || !this.orient(mid) || !this.orient(high)) return 0;
    const cA = L1 ? (alongP ? 1 : 0) : 1, cB = L1 ? (alongP ? 0 : 1) : (alongP ? 1 : -1);
    const lo0 = sK > 0 ? ka0 : kb0, lo1 = sK > 0 ? ka1 : kb1, hi0 = sK > 0 ? kb0 : ka0, hi1 = sK > 0 ? kb1 : ka1;
    const dx = L1 ? (alongP ? 1 : 0) : 1, dy = L1 ? (alongP ? 0 : 1) : (alongP ? 1 : -1);
    const leftDot = B[low] * -dy + B[low + 1] * dx;
    const first0 = leftDot < 0 ? lo0 : hi0, first1 = leftDot < 0 ? lo1 : hi1;
    const second0 = leftDot < 0 ? hi0 : lo0, second1 = leftDot < 0 ? hi1 : lo1;
    T[0] = first0; T[1] = first1;
    special(B, bo + CUT * LS, cA, cB, T, m, 1);
    T[0] = second0; T[1] = second1;
    special(B, bo + (CUT + 1) * LS, cA, cB, T, m, 1);
    copyLine(B, bo + CUT * LS, B, bo + BEND_CUT * LS);
    copyLine(B, bo + (CUT + 1) * LS, B, bo + (BEND_CUT + 1) * LS);
    if (leftDot >= 0) {
      // Pieces high, mid, low; cuts negated.
      for (let i = 0; i < LS; i++) { const v = B[low + i]; B[low + i] = B[high + i]; B[high + i] = v; }
      negate(B, bo + CUT * LS); negate(B, bo + (CUT + 1) * LS);
    }
    this.cutAxis = alongP ? 1 : 2;
    const c = this.cutT;
    c[0] = first0; c[1] = L1 ? 0 : first1; c[2] = second0; c[3] = L1 ? 0 : second1;
    this.K = 3;
    return 3;
  }

  /** The term list of the pairs a, b, c, d in order (one term each for L1; callers use the first 2m or 4m). */
  private fill(a0: number, a1: number, b0: number, b1: number, c0: number, c1: number, d0: number, d1: number, m: number): void {
    const T = this.T;
    if (m === 1) { T[0] = a0; T[1] = b0; T[2] = c0; T[3] = d0; } else {
      T[0] = a0; T[1] = a1; T[2] = b0; T[3] = b1; T[4] = c0; T[5] = c1; T[6] = d0; T[7] = d1;
    }
  }

  /** Orients line slot o so that the site is on its negative side; false when undecided. */
  private orient(o: number): boolean {
    const s = sideB(this.sx, this.sy, 0, this.LT, o);
    if (s === 0) return false;
    if (s > 0) negate(this.LT, o);
    return true;
  }

  /** Side of cut j at corner slot o of Q: exact zero for a bend built on the same cut; BAIL when undecided. */
  private cutSide(Q: Float64Array, o: number, j: number): number {
    const s = sideB(Q[o], Q[o + 1], Q[o + 2], this.LT, this.bo + (CUT + j) * LS);
    if (s !== 0) return s;
    if (Q[o + 3] === this.cutAxis && Q[o + 4] === this.cutT[2 * j] && Q[o + 5] === this.cutT[2 * j + 1]) return 0;
    return BAIL;
  }

  /** Bisector.pos(); BAIL when undecided. */
  private pos(Q: Float64Array, o: number): number {
    if (this.K === 1) return 1;
    const c0 = this.cutSide(Q, o, 0);
    if (c0 === BAIL) return BAIL;
    if (c0 < 0) return 1;
    if (c0 === 0) return 2;
    const c1 = this.cutSide(Q, o, 1);
    if (c1 === BAIL) return BAIL;
    return c1 < 0 ? 3 : c1 === 0 ? 4 : 5;
  }

  /** Bisector.side(), never 0 here: 0 means undecided. */
  private side(Q: Float64Array, o: number): number {
    let k = 0;
    if (this.K === 3) {
      const c0 = this.cutSide(Q, o, 0);
      if (c0 === BAIL) return 0;
      if (c0 > 0) {
        const c1 = this.cutSide(Q, o, 1);
        if (c1 === BAIL) return 0;
        k = c1 <= 0 ? 1 : 2;
      }
    }
    return sideB(Q[o], Q[o + 1], Q[o + 2], this.LT, this.bo + k * LS);
  }

  private reserveClip(n: number): void {
    if (this.sv.length < n) { this.sv = new Int8Array(2 * n); this.zv = new Int8Array(2 * n); this.pv = new Int8Array(6 * n); }
    if (this.qPos.length < 4 * n) {
      const m = 8 * n;
      this.qRef = new Int32Array(m); this.qPos = new Int32Array(m); this.qStat = new Int8Array(m); this.qEdge = new Int32Array(m);
    }
  }

  /**
   * cell.ts clipCell() by site t at (tx, ty): 1 when the cell changed, 0
   * when not, BAIL when some decision is left to exact arithmetic.
   */
  clip(t: number, tx: number, ty: number): number {
    const n = this.n;
    // Room first: at most 3n crossings; at most 4n pieces, so at most 2n runs outside, each adding at most two bends; the bisector's seven lines.
    this.room(7 * n + 4, 7);
    this.reserve(12 * n + 8);
    this.reserveClip(n);
    this.bo = this.nl * LS;
    const K = this.bisect(tx, ty);
    if (K === 0) return BAIL;
    const C = this.C, LT = this.LT, B = this.LT, bo = this.bo, pc = this.pc, pl = this.pl;
    const sv = this.sv, zv = this.zv, pv = this.pv;
    const nc0 = this.nc;
    let out = 0;
    for (let i = 0; i < n; i++) {
      const o = pc[i] * PS;
      let s: number;
      if (K === 1) s = sideB(C[o], C[o + 1], C[o + 2], B, bo);
      else {
        const z = this.pos(C, o);
        if (z === BAIL) return BAIL;
        const k = z <= 2 ? 0 : z <= 4 ? 1 : 2;
        zv[i] = z;
        pv[3 * i] = UNKNOWN; pv[3 * i + 1] = UNKNOWN; pv[3 * i + 2] = UNKNOWN;
        s = pv[3 * i + k] = sideB(C[o], C[o + 1], C[o + 2], B, bo + k * LS);
      }
      if (s === 0) return BAIL;
      sv[i] = s;
      if (s > 0) out++;
    }
    if (out === 0 && K === 1) return 0;
    const qRef = this.qRef, qPos = this.qPos, qStat = this.qStat, qEdge = this.qEdge, evId = this.evId, evPos = this.evPos, MID = this.MID;
    let N = 0, changed = false;
    for (let i = 0; i < n; i++) {
      const j = i + 1 === n ? 0 : i + 1;
      let m = 0;
      for (let k = 0; k < K; k++) {
        if (K === 1) {
          if (sv[i] * sv[j] >= 0) continue;
        } else {
          const zi = zv[i], zj = zv[j];
          if ((zi < 2 * k && zj < 2 * k) || (zi > 2 * k + 2 && zj > 2 * k + 2)) continue;
          if (pv[3 * i + k] === UNKNOWN && (pv[3 * i + k] = sideB(C[pc[i] * PS], C[pc[i] * PS + 1], C[pc[i] * PS + 2], B, bo + k * LS)) === 0) return BAIL;
          if (pv[3 * j + k] === UNKNOWN && (pv[3 * j + k] = sideB(C[pc[j] * PS], C[pc[j] * PS + 1], C[pc[j] * PS + 2], B, bo + k * LS)) === 0) return BAIL;
          if (pv[3 * i + k] * pv[3 * j + k] >= 0) continue;
        }
        const id = this.nc;
        if (!meetF(LT, pl[i] * LS, B, bo + k * LS, C, id * PS)) return BAIL;
        const p = this.pos(C, id * PS);
        // An even place (a crossing at a bend) needs an exact zero: not here.
        if (p === BAIL) return BAIL;
        if (p < 2 * k || p > 2 * k + 2) continue;
        this.nc++;
        // Insertion by place (at most three crossings; odd places are distinct per piece).
        let at = m;
        while (at > 0 && evPos[at - 1] > p) { evId[at] = evId[at - 1]; evPos[at] = evPos[at - 1]; at--; }
        evId[at] = id; evPos[at] = p;
        m++;
      }
      if (m > 0) changed = true;
      for (let q = 0; q <= m; q++) {
        const ref = q === 0 ? pc[i] : evId[q - 1];
        let status: number;
        if (q === 0) status = sv[i];
        else if (q === m) status = sv[j];
        else {
          const so = ref * PS, eo = evId[q] * PS;
          const x = (C[so] + C[eo]) / 2, y = (C[so + 1] + C[eo + 1]) / 2;
          MID[0] = x; MID[1] = y;
          MID[2] = ((C[so + 2] + C[eo + 2]) / 2 + U * Math.max(Math.abs(x), Math.abs(y))) * SLACK + TINY;
          status = this.side(MID, 0);
          if (status === 0) return BAIL;
        }
        qRef[N] = ref;
        qPos[N] = q === 0 ? NOT_ON_B : evPos[q - 1];
        qStat[N] = status; qEdge[N] = i;
        N++;
      }
    }
    if (!changed && out === 0) { this.nc = nc0; return 0; }
    let first = -1;
    for (let q = 0; q < N && first < 0; q++) if (qStat[q] <= 0 && qStat[q === 0 ? N - 1 : q - 1] > 0) first = q;
    if (first < 0) first = 0;
    // The pieces of the bisector stay in the line table.
    const base = this.nl;
    this.nl += K;
    const pc2 = this.pc2, pl2 = this.pl2, lab2 = this.lab2, lab = this.lab;
    let c2 = 0, prevEdge = -1;
    for (let c = 0; c < N; c++) {
      const q = first + c < N ? first + c : first + c - N;
      if (qStat[q] <= 0) {
        if (prevEdge < 0 || prevEdge !== qEdge[q]) { pc2[c2] = qRef[q]; pl2[c2] = pl[qEdge[q]]; lab2[c2] = lab[qEdge[q]]; c2++; }
        prevEdge = qEdge[q];
        continue;
      }
      let d = c;
      while (d + 1 < N && qStat[(first + d + 1) % N] > 0) d++;
      const entry = (first + d + 1) % N;
      const from = qPos[q] === NOT_ON_B ? this.pos(C, qRef[q] * PS) : qPos[q];
      const to = qPos[entry] === NOT_ON_B ? this.pos(C, qRef[entry] * PS) : qPos[entry];
      if (from === BAIL || to === BAIL || to < from) return BAIL;
      pc2[c2] = qRef[q]; pl2[c2] = base + (from >> 1); lab2[c2] = t; c2++;
      for (let pos = from + 1; pos < to; pos++) {
        if ((pos & 1) !== 0) continue;
        const k = pos / 2 - 1, id = this.nc, o = id * PS;
        if (!meetF(B, bo + LS, B, bo + (BEND_CUT + k) * LS, C, o)) return BAIL;
        C[o + 3] = this.cutAxis; C[o + 4] = this.cutT[2 * k]; C[o + 5] = this.cutT[2 * k + 1];
        this.nc++;
        pc2[c2] = id; pl2[c2] = base + (pos >> 1); lab2[c2] = t; c2++;
      }
      prevEdge = -1;
      c = d;
    }
    this.pc2 = pc; this.pl2 = pl; this.lab2 = lab;
    this.pc = pc2; this.pl = pl2; this.lab = lab2;
    this.n = c2;
    return 1;
  }
}

/** Corner stride of FloatCell.C: x of corner id k is C[k * CORNER_STRIDE], y the next. */
export const CORNER_STRIDE = PS;
