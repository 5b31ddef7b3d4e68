import { commonIntegers } from '../../core/exact.js';
import { dyAdd, dyInt, dyMul, dyNeg, dyRatio, dySign, dySub, dyadic, dyScale, type Dyadic } from './dyadic.js';

/*
 * Filtered exact geometry for the L1 and L-infinity engines. A line is
 * A x + B y + C = 0 and a point is homogeneous (X : Y : W); both keep a
 * floating-point value with a rigorous bound on its absolute error, so the
 * sign of A x + B y + C is decided in floating point unless it lies within
 * that bound, and then exactly from the dyadic definition (nothing is
 * divided, so the dyadic values are exact). The error model is the
 * standard one, fl(a op b) = (a op b)(1 + d) with |d| <= u = 2^-53; every
 * bound below is padded (SLACK, TINY) so that underflow and the second-order
 * terms the running bounds drop are covered.
 */

export const U = 2 ** -53;
/** Relative padding of every derived error bound (covers the dropped second-order terms). */
export const SLACK = 1 + 2 ** -20;
/** Absolute padding: far above any accumulated underflow error, far below any coordinate ambit accepts squared. */
export const TINY = 2 ** -900;
/**
 * A computed point whose error bound exceeds this fraction of the size of
 * its coordinates and of its lines' constants is placed exactly instead:
 * 2^8 below the closest two sites may be (MIN_SPACING, 2^-40 of the coordinates).
 */
const REFINE = 2 ** -48;

type Exact3 = [Dyadic, Dyadic, Dyadic];

const SPECIAL = 0, THROUGH = 1, EUCLID = 2;

/**
 * A x + B y + C = 0, with float values, error bounds and the data of its
 * exact definition (no closure: lines are made once per candidate site).
 */
export class Line {
  private exactValue: Exact3 | null = null;
  constructor(
    readonly a: number, readonly b: number, readonly c: number,
    readonly ea: number, readonly eb: number, readonly ec: number,
    /** The size of the numbers the constant was computed from: the scale of its rounding. */
    readonly size: number,
    private readonly kind: number,
    /** SPECIAL: the terms; THROUGH: px, py, qx, qy; EUCLID: lx, ly, tx, ty. */
    private readonly data: readonly number[],
    /** SPECIAL: the scale (a power of two) and the integer coefficients. */
    private readonly scale: number,
    private readonly flip: number,
  ) {}

  exact(): Exact3 {
    if (this.exactValue) return this.exactValue;
    const d = this.data;
    let r: Exact3;
    if (this.kind === SPECIAL) {
      // a and b are the (small integer) coefficients as flipped; the constant is -scale * sum, flipped.
      const C = dyScale(exactSum(d), Math.log2(this.scale));
      r = [dyInt(this.a), dyInt(this.b), this.flip > 0 ? dyNeg(C) : C];
    } else if (this.kind === THROUGH) {
      const A = dySub(dyadic(d[1]), dyadic(d[3])), B = dySub(dyadic(d[2]), dyadic(d[0]));
      r = [A, B, dyNeg(dyAdd(dyMul(A, dyadic(d[0])), dyMul(B, dyadic(d[1]))))];
    } else {
      const LX = dyadic(d[0]), LY = dyadic(d[1]), TX = dyadic(d[2]), TY = dyadic(d[3]);
      const C = dySub(dyAdd(dyMul(LX, LX), dyMul(LY, LY)), dyAdd(dyMul(TX, TX), dyMul(TY, TY)));
      r = [dyScale(dySub(TX, LX), 1), dyScale(dySub(TY, LY), 1), C];
    }
    if (this.kind !== SPECIAL && this.flip < 0) r = [dyNeg(r[0]), dyNeg(r[1]), dyNeg(r[2])];
    return (this.exactValue = r);
  }

  /**
   * Whether o is certainly this line (either orientation), from the data of
   * the two definitions alone: equal data defines the same set, so true is
   * exact; false only means "not known".
   */
  sameAs(o: Line): boolean {
    if (o === this) return true;
    const d = this.data, e = o.data;
    if (this.kind !== o.kind || d.length !== e.length) return false;
    // SPECIAL: the stored coefficients are the defining ones times flip.
    if (this.kind === SPECIAL && (this.scale !== o.scale || this.a * this.flip !== o.a * o.flip || this.b * this.flip !== o.b * o.flip)) return false;
    for (let i = 0; i < d.length; i++) if (d[i] !== e[i]) return false;
    return true;
  }

  /** The same line with the sides swapped. */
  negated(): Line {
    return new Line(-this.a, -this.b, -this.c, this.ea, this.eb, this.ec, this.size, this.kind, this.data, this.scale, -this.flip);
  }
}

/** Exact sum of doubles. */
function exactSum(terms: readonly number[]): Dyadic {
  // Zeros would drag the common exponent down to -1074 for nothing.
  const nonzero = terms.filter((v) => v !== 0);
  if (nonzero.length === 0) return { m: 0n, e: 0 };
  const ints: bigint[] = [];
  const e = commonIntegers(nonzero, ints);
  let m = 0n;
  for (const v of ints) m += v;
  return { m, e };
}

/** Sign of a sum of doubles, exactly (the float sum decides unless it is within its error bound). */
export function sumSign(terms: readonly number[]): number {
  let s = 0, abs = 0;
  for (const v of terms) { s += v; abs += Math.abs(v); }
  const bound = terms.length * U * abs * SLACK + TINY;
  if (s > bound) return 1;
  if (s < -bound) return -1;
  return dySign(exactSum(terms));
}

/**
 * The line a x + b y = scale * (sum of terms), a and b small integers,
 * scale a power of two: every bisector piece of L1 and L-infinity has this
 * form (directions 0, 45, 90 and 135 degrees).
 */
export function specialLine(a: number, b: number, terms: readonly number[], scale: number): Line {
  let s = 0, abs = 0;
  for (let i = 0; i < terms.length; i++) { s += terms[i]; abs += Math.abs(terms[i]); }
  const ec = terms.length * U * abs * scale * SLACK + TINY;
  return new Line(a, b, -scale * s, 0, 0, ec, abs * scale, SPECIAL, terms, scale, 1);
}

/** The line through p and q, positive on its left (the inside of a counter-clockwise region). */
export function throughLine(px: number, py: number, qx: number, qy: number): Line {
  const a = py - qy, b = qx - px;
  const ea = U * Math.abs(a) * SLACK, eb = U * Math.abs(b) * SLACK;
  const c = -(a * px + b * py);
  const ec = (Math.abs(px) * ea + Math.abs(py) * eb + 3 * U * (Math.abs(a * px) + Math.abs(b * py))) * SLACK + TINY;
  return new Line(a, b, c, ea, eb, ec, Math.max(Math.abs(px), Math.abs(py), Math.abs(qx), Math.abs(qy)), THROUGH, [px, py, qx, qy], 1, 1);
}

/** |q - l|^2 - |q - t|^2 = 0: negative on l's side (l strictly closer in the Euclidean metric). */
export function euclidLine(lx: number, ly: number, tx: number, ty: number): Line {
  const a = 2 * (tx - lx), b = 2 * (ty - ly);
  const c = lx * lx + ly * ly - tx * tx - ty * ty;
  const ec = 4 * U * (lx * lx + ly * ly + tx * tx + ty * ty) * SLACK + TINY;
  return new Line(a, b, c, U * Math.abs(a) * SLACK, U * Math.abs(b) * SLACK, ec,
    Math.max(Math.abs(lx), Math.abs(ly), Math.abs(tx), Math.abs(ty)), EUCLID, [lx, ly, tx, ty], 1, 1);
}

const CORNER = 0, MEET_KIND = 1, MID = 2;

/** A point: float position, a bound on the error of both coordinates, and the data of an exact homogeneous definition. */
export class Pt {
  private exactValue: Exact3 | null;
  constructor(
    readonly x: number, readonly y: number, readonly err: number,
    private readonly kind: number,
    /** MEET_KIND: the two lines; MID: the two points; CORNER: unused. */
    private readonly r1: Line | Pt | null, private readonly r2: Line | Pt | null,
    exact: Exact3 | null = null,
  ) {
    this.exactValue = exact;
  }

  /** Whether the point is by construction on line l (true is exact; false means "not known"). */
  builtOn(l: Line): boolean {
    return this.kind === MEET_KIND && ((this.r1 as Line).sameAs(l) || (this.r2 as Line).sameAs(l));
  }

  exact(): Exact3 {
    if (this.exactValue) return this.exactValue;
    let r: Exact3;
    if (this.kind === CORNER) r = [dyadic(this.x), dyadic(this.y), dyInt(1)];
    else if (this.kind === MEET_KIND) r = meetExact(this.r1 as Line, this.r2 as Line);
    else {
      const [X1, Y1, W1] = (this.r1 as Pt).exact(), [X2, Y2, W2] = (this.r2 as Pt).exact();
      r = [dyAdd(dyMul(X1, W2), dyMul(X2, W1)), dyAdd(dyMul(Y1, W2), dyMul(Y2, W1)), dyScale(dyMul(W1, W2), 1)];
    }
    return (this.exactValue = r);
  }
}

export function corner(x: number, y: number): Pt {
  return new Pt(x, y, 0, CORNER, null, null);
}

function meetExact(l1: Line, l2: Line): Exact3 {
  const [A1, B1, C1] = l1.exact(), [A2, B2, C2] = l2.exact();
  return [dySub(dyMul(B1, C2), dyMul(B2, C1)), dySub(dyMul(C1, A2), dyMul(C2, A1)), dySub(dyMul(A1, B2), dyMul(A2, B1))];
}

/**
 * The float part of meet(): x, y and a bound on their error into out[0..2]
 * (an infinite bound when the lines are too close to parallel to say).
 * Running error bounds of the products: |a| eb + |b| ea + ea eb + u |ab|, for each of the six.
 */
export function meetFloat(a1: number, b1: number, c1: number, ea1: number, eb1: number, ec1: number,
  a2: number, b2: number, c2: number, ea2: number, eb2: number, ec2: number, out: Float64Array): void {
  const p1 = b1 * c2, p2 = b2 * c1, p3 = c1 * a2, p4 = c2 * a1, p5 = a1 * b2, p6 = a2 * b1;
  const X = p1 - p2, Y = p3 - p4, W = p5 - p6;
  const eX = Math.abs(b1) * ec2 + Math.abs(c2) * eb1 + eb1 * ec2 + U * Math.abs(p1) +
    Math.abs(b2) * ec1 + Math.abs(c1) * eb2 + eb2 * ec1 + U * Math.abs(p2) + U * Math.abs(X);
  const eY = Math.abs(c1) * ea2 + Math.abs(a2) * ec1 + ec1 * ea2 + U * Math.abs(p3) +
    Math.abs(c2) * ea1 + Math.abs(a1) * ec2 + ec2 * ea1 + U * Math.abs(p4) + U * Math.abs(Y);
  const eW = Math.abs(a1) * eb2 + Math.abs(b2) * ea1 + ea1 * eb2 + U * Math.abs(p5) +
    Math.abs(a2) * eb1 + Math.abs(b1) * ea2 + ea2 * eb1 + U * Math.abs(p6) + U * Math.abs(W);
  const x = X / W, y = Y / W;
  const den = Math.abs(W) - eW;
  const big = Math.max(Math.abs(x), Math.abs(y));
  out[0] = x; out[1] = y;
  out[2] = den > 0 ? (Math.max(eX + Math.abs(x) * eW, eY + Math.abs(y) * eW) / den + U * big) * SLACK + TINY : Infinity;
}

/** Whether a point computed by meetFloat at (x, y) with bound err is too poorly placed to keep (see meet()). */
export function needsRefine(x: number, y: number, err: number, size1: number, size2: number): boolean {
  return !(err <= REFINE * Math.max(Math.abs(x), Math.abs(y), size1, size2) + TINY);
}

const MEET = new Float64Array(3);

/** The intersection of two lines that are not parallel (exactly). */
export function meet(l1: Line, l2: Line): Pt {
  meetFloat(l1.a, l1.b, l1.c, l1.ea, l1.eb, l1.ec, l2.a, l2.b, l2.c, l2.ea, l2.eb, l2.ec, MEET);
  const x = MEET[0], y = MEET[1], err = MEET[2];
  // Cancellation (nearly parallel lines, or constants far larger than the
  // point) can leave the float position far off: then it is placed from the
  // exact value, within about an ulp, so the mesh gets it where it belongs.
  if (needsRefine(x, y, err, l1.size, l2.size)) {
    const e = meetExact(l1, l2);
    const rx = dyRatio(e[0], e[2]), ry = dyRatio(e[1], e[2]);
    return new Pt(rx, ry, 2 * U * Math.max(Math.abs(rx), Math.abs(ry)) + TINY, MEET_KIND, l1, l2, e);
  }
  return new Pt(x, y, err, MEET_KIND, l1, l2);
}

/** The midpoint of two points. */
export function midpoint(p: Pt, q: Pt): Pt {
  const x = (p.x + q.x) / 2, y = (p.y + q.y) / 2;
  const err = ((p.err + q.err) / 2 + U * Math.max(Math.abs(x), Math.abs(y))) * SLACK + TINY;
  return new Pt(x, y, err, MID, p, q);
}

/** Sign of A x + B y + C at p: exact. */
export function sideOf(p: Pt, l: Line): number {
  const ax = l.a * p.x, by = l.b * p.y;
  const f = ax + by + l.c;
  const e = p.err;
  const bound = (Math.abs(l.a) * e + Math.abs(l.b) * e + l.ea * (Math.abs(p.x) + e) + l.eb * (Math.abs(p.y) + e) + l.ec +
    4 * U * (Math.abs(ax) + Math.abs(by) + Math.abs(l.c))) * SLACK + TINY;
  if (f > bound) return 1;
  if (f < -bound) return -1;
  // Often the case here: a bend of an earlier bisector tested against a cut through the same site.
  if (p.builtOn(l)) return 0;
  const [A, B, C] = l.exact(), [X, Y, W] = p.exact();
  return dySign(dyAdd(dyAdd(dyMul(A, X), dyMul(B, Y)), dyMul(C, W))) * dySign(W);
}

/** Whether two lines are parallel, exactly. */
export function parallel(l1: Line, l2: Line): boolean {
  const d = l1.a * l2.b - l2.a * l1.b;
  const bound = (Math.abs(l1.a) * l2.eb + Math.abs(l2.b) * l1.ea + Math.abs(l2.a) * l1.eb + Math.abs(l1.b) * l2.ea +
    l1.ea * l2.eb + l2.ea * l1.eb + 2 * U * (Math.abs(l1.a * l2.b) + Math.abs(l2.a * l1.b))) * SLACK + TINY;
  if (Math.abs(d) > bound) return false;
  const [A1, B1] = l1.exact(), [A2, B2] = l2.exact();
  return dySign(dySub(dyMul(A1, B2), dyMul(A2, B1))) === 0;
}
