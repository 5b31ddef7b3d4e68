import { Line, Pt, corner, meet, sideOf, specialLine, sumSign } from './geometry.js';

/** The exact metrics: 'L1' (city block) and 'Linf' (chessboard). */
export type ExactMetric = 'L1' | 'Linf';

/*
 * Bisectors under the ordering rule: a point q prefers site s to site t when
 * d(q,s) < d(q,t), or the distances tie and |q-s| < |q-t| (Euclidean), or
 * those tie too and s is smaller by (x, then y).
 *
 * L1 is worked out in a frame (P, Q) = (x, y). L-infinity is L1 in the frame
 * (P, Q) = (x + y, x - y): max(|a|, |b|) = (|a + b| + |a - b|) / 2. That map
 * is a similarity (a rotation by 45 degrees, a reflection and a factor
 * sqrt(2)), so Euclidean bisectors, and with them the tie rule, carry over.
 * Coordinates in the frame are kept as lists of doubles whose exact sum is
 * the coordinate, so nothing is rounded before a line is formed.
 *
 * In the frame, with D the axis along which the sites differ more and K the
 * other (|dD| > |dK|), the L1 bisector is three pieces in order of K: for
 * K below both sites, the line D = (Da + Db + sD dK)/2; between them the 45
 * degree segment sD D + sK K = (sD (Da + Db) + sK (Ka + Kb))/2; above both,
 * D = (Da + Db - sD dK)/2 (sD, sK the signs of dD, dK). Within each slab of
 * K the L1 difference d(q,a) - d(q,b) has the sign of that piece's linear
 * function, which is how side() decides. With dK = 0 the three pieces are
 * one line. With |dD| = |dK| the L1 distances tie on two quadrants, and the
 * Euclidean bisector (a 45 degree line) takes over as the whole boundary
 * (worked out by hand: on the middle strip the L1 difference has the sign of
 * the same 45 degree line, elsewhere it is zero).
 */

type Terms = number[];


/**
 * The boundary between the cells of s and t, oriented so that s's side is
 * on the left (walking it forwards goes counter-clockwise around s). Piece
 * lines are negative on s's side; cut k is negative before bend k.
 */
export class Bisector {
  readonly pieces: Line[];
  readonly cuts: Line[];
  /** True when the metric distances of s and t tie on a two-dimensional set (the Euclidean rule decides). */
  readonly degenerate: boolean;
  /** Bend k is where the middle piece meets bendCuts[k]; placed on first use (most clips never reach a bend). */
  private readonly mid: Line | null;
  private readonly bendCuts: Line[];
  private bendPts: (Pt | null)[] = [null, null];

  constructor(pieces: Line[], cuts: Line[], degenerate: boolean, mid: Line | null = null, bendCuts: Line[] = []) {
    this.pieces = pieces; this.cuts = cuts; this.degenerate = degenerate; this.mid = mid; this.bendCuts = bendCuts;
  }

  /** Bend k, between pieces k and k+1. */
  bend(k: number): Pt {
    return (this.bendPts[k] ??= meet(this.mid as Line, this.bendCuts[k]));
  }

  /** Negative on s's side, positive on t's, zero on the bisector. */
  side(q: Pt): number {
    return sideOf(q, this.pieces[this.slab(q)]);
  }

  /** The piece whose line decides side(q): the slab of the cuts that q is in (a cut itself goes with the piece before it). */
  slab(q: Pt): number {
    if (this.pieces.length === 1 || sideOf(q, this.cuts[0]) <= 0) return 0;
    return sideOf(q, this.cuts[1]) <= 0 ? 1 : 2;
  }

  /**
   * Where a point known to lie on the bisector is along it: 2k+1 inside
   * piece k, 2k+2 at bend k (between pieces k and k+1).
   */
  pos(q: Pt): number {
    if (this.pieces.length === 1) return 1;
    const c0 = sideOf(q, this.cuts[0]);
    if (c0 < 0) return 1;
    if (c0 === 0) return 2;
    const c1 = sideOf(q, this.cuts[1]);
    return c1 < 0 ? 3 : c1 === 0 ? 4 : 5;
  }
}

/** (x, then y) order of two points. */
const before = (ax: number, ay: number, bx: number, by: number): boolean => ax < bx || (ax === bx && ay < by);

/**
 * The bisector of sites s and t under an exact metric. It is built from the
 * pair in (x, then y) order, so both cells compute the same lines the same
 * way, then oriented for s.
 */
export function bisector(metric: ExactMetric, sx: number, sy: number, tx: number, ty: number): Bisector {
  // No array destructuring or spreading here: this runs once per candidate, and both are slow in V8.
  const swapPair = !before(sx, sy, tx, ty);
  const ax = swapPair ? tx : sx, ay = swapPair ? ty : sy, bx = swapPair ? sx : tx, by = swapPair ? sy : ty;
  const L1 = metric === 'L1';
  const Pa: Terms = L1 ? [ax] : [ax, ay], Qa: Terms = L1 ? [ay] : [ax, -ay];
  const Pb: Terms = L1 ? [bx] : [bx, by], Qb: Terms = L1 ? [by] : [bx, -by];
  const dP = join(Pb, Pa, -1), dQ = join(Qb, Qa, -1);
  const sP = sumSign(dP), sQ = sumSign(dQ);
  const cmp = sumSign(join(scaled(dP, sP), dQ, -sQ));
  const s = corner(sx, sy);
  const orient = (l: Line): Line => (sideOf(s, l) > 0 ? l.negated() : l);
  const line = (alpha: number, beta: number, terms: Terms, scale: number): Line =>
    specialLine(L1 ? alpha : alpha + beta, L1 ? beta : alpha - beta, terms, scale);
  if (cmp === 0) {
    // |dP| = |dQ|: the Euclidean bisector P + sigma Q = (Pa + Pb + sigma (Qa + Qb)) / 2.
    const sigma = sP * sQ;
    return new Bisector([orient(line(1, sigma, join(join(Pa, Pb, 1), join(Qa, Qb, 1), sigma), 0.5))], [], true);
  }
  // D is the dominant axis, K the cut axis; `alongP` says K is P (the roles swapped).
  const alongP = cmp < 0;
  const Da = alongP ? Qa : Pa, Db = alongP ? Qb : Pb, Ka = alongP ? Pa : Qa, Kb = alongP ? Pb : Qb;
  const sD = alongP ? sQ : sP, sK = alongP ? sP : sQ;
  const dLine = (terms: Terms, scale: number): Line => (alongP ? line(0, 1, terms, scale) : line(1, 0, terms, scale));
  const kLine = (terms: Terms): Line => (alongP ? line(1, 0, terms, 1) : line(0, 1, terms, 1));
  const dSum = join(Da, Db, 1);
  if (sK === 0) return new Bisector([orient(dLine(dSum, 0.5))], [], false);
  const dK = join(Kb, Ka, -1);
  const low = orient(dLine(join(dSum, dK, sD), 0.5));
  const high = orient(dLine(join(dSum, dK, -sD), 0.5));
  const midTerms = join(scaled(dSum, sD), join(Ka, Kb, 1), sK);
  const mid = orient(alongP ? line(sK, sD, midTerms, 0.5) : line(sD, sK, midTerms, 0.5));
  const cutLo = kLine(sK > 0 ? Ka : Kb), cutHi = kLine(sK > 0 ? Kb : Ka);
  // Walking in the direction of increasing K, is s's side on the left? The low
  // piece runs along that direction (+Q or +P in x, y), so its normal decides.
  const dx = L1 ? (alongP ? 1 : 0) : 1, dy = L1 ? (alongP ? 0 : 1) : (alongP ? 1 : -1);
  const leftDot = low.a * -dy + low.b * dx;
  if (leftDot < 0) return new Bisector([low, mid, high], [cutLo, cutHi], false, mid, [cutLo, cutHi]);
  return new Bisector([high, mid, low], [cutHi.negated(), cutLo.negated()], false, mid, [cutHi, cutLo]);
}

/** The terms of a followed by those of b times k (k = 1, -1 or 0). */
function join(a: Terms, b: Terms, k: number): Terms {
  // Sized once: growing by push costs more than the copy (this runs several times per candidate).
  const m = a.length, out = new Array<number>(m + (k !== 0 ? b.length : 0));
  for (let i = 0; i < m; i++) out[i] = a[i];
  if (k !== 0) for (let i = 0; i < b.length; i++) out[m + i] = k * b[i];
  return out;
}

/** The terms times k (1, -1 or 0: none). */
function scaled(a: Terms, k: number): Terms {
  if (k === 0) return [];
  const out = new Array<number>(a.length);
  for (let i = 0; i < a.length; i++) out[i] = k * a[i];
  return out;
}
