/*
 * The L1 or L-infinity circle through three sites in closed form, for the
 * dual route (dual.ts): its edge tests during insertion and the triangles'
 * centres. The general construction (pair.ts) finds a centre as the root of
 * a piecewise-linear function along one bisector, after setting that
 * bisector up; this one reads it off the three sites' bounding box (the
 * route took 0.80 to 0.88 of its time at 10^5 sites with it), and settles
 * only the clear cases: whenever it is unsure it says so, and the caller
 * takes the general construction.
 *
 * In the frame W = (u, v), with (u, v) = (x + y, x - y) for L1 and (x, y)
 * for L-infinity, the metric is the L-infinity distance (|dx| + |dy| =
 * max(|du|, |dv|)), so circles are axis-parallel squares. Let the three
 * sites span U along u and V along v, and say U > V. Every side of a square
 * through them is at least U long and a side of 2r > U touches at most one
 * of the sites of least and largest u; the other two would then lie on the
 * sides across u, whose gap in v (at most V) would have to be 2r: so r = U/2,
 * the extreme sites lie on the left and right sides and the middle one, M,
 * on the top or bottom side. That is possible exactly when M is the highest
 * or the lowest of the three in v (the square then reaches U down or up
 * from M, past the others, as V < U); when M lies between the others in v
 * there is no circle through the three (derived here). V > U is the same
 * with u and v exchanged. Ties (U close to V, M close to the others in u or
 * v) are left to the general construction.
 *
 * Rounding: W is exact for L-infinity and within 2^-53 of |x| + |y| for L1;
 * the centre and radius take a few more roundings, so they are within about
 * 16 u m of exact (u = 2^-53, m the largest W magnitude involved), far
 * inside the margin 2^-45 m (256 u m) every decision here must clear.
 */
/** Results of SquareCircle.through. */
export const FOUND = 1, NONE = 0, UNSURE = -1;

export class SquareCircle {
  /** The last circle found, in W: centre and radius. */
  cu = 0; cv = 0; r = 0;
  /** Largest W magnitude of its sites: the scale of its rounding. */
  m = 0;

  constructor(
    /** The sites, interleaved (x, y) by index. */
    private readonly xy: Float64Array,
    /** True for L1: W = (x + y, x - y); else W = (x, y). */
    private readonly l1: boolean,
  ) {}

  /**
   * The circle through sites a, b and c into (cu, cv, r): FOUND; NONE when
   * there is none, one of the three lying clearly inside the bounding box
   * of the other two (that site, in `inner`); UNSURE when neither is clear-cut.
   */
  through(a: number, b: number, c: number): number {
    const xy = this.xy;
    let ua = xy[2 * a], va = xy[2 * a + 1], ub = xy[2 * b], vb = xy[2 * b + 1], uc = xy[2 * c], vc = xy[2 * c + 1];
    if (this.l1) {
      let t = ua; ua = t + va; va = t - va;
      t = ub; ub = t + vb; vb = t - vb;
      t = uc; uc = t + vc; vc = t - vc;
    }
    const m = Math.max(Math.max(Math.abs(ua), Math.abs(va)), Math.max(Math.abs(ub), Math.abs(vb)), Math.max(Math.abs(uc), Math.abs(vc)));
    this.m = m;
    const eps = 2 ** -45 * m;
    const ulo = Math.min(ua, ub, uc), uhi = Math.max(ua, ub, uc), vlo = Math.min(va, vb, vc), vhi = Math.max(va, vb, vc);
    const U = uhi - ulo, V = vhi - vlo;
    if (U > V + eps) return this.spanned(a, b, c, ua, va, ub, vb, uc, vc, ulo, uhi, eps, false);
    if (V > U + eps) return this.spanned(a, b, c, va, ua, vb, ub, vc, uc, vlo, vhi, eps, true);
    return UNSURE;
  }

  /** Set by through() when it returns NONE: the site inside the others' bounding box. */
  inner = -1;

  /**
   * The square whose left and right sides (along p, from lo to hi) hold the
   * two sites of extreme p, and whose top or bottom side (along q) the
   * middle one: centre and r (`swap`: p is v, q is u). NONE when the middle
   * site lies clearly between the others in q too; UNSURE when it is not
   * clearly strictly between them in p, or is near one of them in q.
   */
  private spanned(a: number, b: number, c: number, p1: number, q1: number, p2: number, q2: number, p3: number, q3: number,
    lo: number, hi: number, eps: number, swap: boolean): number {
    // The middle site in p (pm, qm), and the other two's q. Exact comparisons: lo and hi are two of p1, p2, p3.
    let pm: number, qm: number, qa: number, qb: number, mid: number;
    if (p1 !== lo && p1 !== hi) { pm = p1; qm = q1; qa = q2; qb = q3; mid = a; }
    else if (p2 !== lo && p2 !== hi) { pm = p2; qm = q2; qa = q1; qb = q3; mid = b; }
    else { pm = p3; qm = q3; qa = q1; qb = q2; mid = c; }
    if (!(pm - lo > eps && hi - pm > eps)) return UNSURE;
    const r = (hi - lo) / 2, qlo = Math.min(qa, qb), qhi = Math.max(qa, qb);
    let cq: number;
    if (qm - qhi > eps) cq = qm - r;
    else if (qlo - qm > eps) cq = qm + r;
    else if (qm - qlo > eps && qhi - qm > eps) { this.inner = mid; return NONE; }
    else return UNSURE;
    const cp = (lo + hi) / 2;
    if (swap) { this.cu = cq; this.cv = cp; } else { this.cu = cp; this.cv = cq; }
    this.r = r;
    return FOUND;
  }

  private u(i: number): number { return this.l1 ? this.xy[2 * i] + this.xy[2 * i + 1] : this.xy[2 * i]; }
  private v(i: number): number { return this.l1 ? this.xy[2 * i] - this.xy[2 * i + 1] : this.xy[2 * i + 1]; }

  /**
   * Whether site d lies inside every circle through sites a and b: their
   * common part is the pair's bounding box (a box holding two points holds
   * theirs, and the pair's own circles come down to it). 1 clearly inside,
   * -1 clearly outside, 0 unsure.
   */
  insideBox(a: number, b: number, d: number): number {
    const ua = this.u(a), va = this.v(a), ub = this.u(b), vb = this.v(b), ud = this.u(d), vd = this.v(d);
    const eps = 2 ** -45 * Math.max(Math.abs(ua), Math.abs(va), Math.abs(ub), Math.abs(vb), Math.abs(ud), Math.abs(vd));
    const uIn = Math.min(ud - Math.min(ua, ub), Math.max(ua, ub) - ud);
    const vIn = Math.min(vd - Math.min(va, vb), Math.max(va, vb) - vd);
    const least = Math.min(uIn, vIn);
    return least > eps ? 1 : least < -eps ? -1 : 0;
  }

  /**
   * Where site d lies against the last circle: 1 clearly outside, -1
   * clearly inside, 0 unsure, by 4 margins (each side's rounding is within
   * one: the centre and radius, and d's own coordinates).
   */
  outside(d: number): number {
    const ud = this.u(d), vd = this.v(d);
    const g = Math.max(Math.abs(ud - this.cu), Math.abs(vd - this.cv)) - this.r;
    const slack = 4 * 2 ** -45 * Math.max(this.m, Math.abs(ud), Math.abs(vd));
    return g > slack ? 1 : g < -slack ? -1 : 0;
  }
}
