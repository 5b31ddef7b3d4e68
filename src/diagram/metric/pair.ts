/*
 * The L1 bisector of two sites in floating point, for the dual route
 * (dual.ts), in the frame of bisector.ts: (P, Q) = (x, y) for L1 and
 * (x + y, x - y) for L-infinity, where the metric is L1 (times 2 for
 * L-infinity, which keeps every order). Only pairs in general position are
 * taken: the sites differ along both axes, and by clearly different amounts
 * (no two-dimensional tie); anything closer than the margin is refused, and
 * the caller then builds the diagram on the exact path.
 *
 * With D the axis along which the sites differ more and K the other, the
 * bisector is a graph over K (bisector.ts): D = Dlo for K at or below both
 * sites, D = Dhi at or above both, and a 45 degree piece between, with bends
 * at K = Klo and K = Khi (the sites' own K values). So K is the bisector's
 * parameter; `tau` is the sign of ds/dK, s the signed distance along the left
 * normal of a→b in (x, y) (the parameter of the Euclidean and Minkowski
 * engines), so that tau * K orders points along the bisector the way the
 * Voronoi edge dual to a→b runs.
 */

/** Refusal: a decision the margin cannot settle (the caller falls back to exact arithmetic). */
export const UNDECIDED = Number.NaN;

export class PairBisector {
  /** True when K is the Q axis (the sites differ more in P). */
  kIsQ = true;
  Dlo = 0; Dhi = 0; Klo = 0; Khi = 0;
  /** dD/dK on the middle piece (+1 or -1). */
  slope = 0;
  tau = 0;
  /** Site a in (D, K). */
  Da = 0; Ka = 0;
  /** Result of point(): (x, y). */
  x = 0; y = 0;

  constructor(
    /** The sites, interleaved (x, y) by index: frame coordinates are taken from them as they are read. */
    private readonly xy: Float64Array,
    /** True for L-infinity: the frame is (x + y, x - y), a map that reverses orientation; point() maps back. */
    private readonly rotated: boolean,
  ) {}

  /** Site i's frame coordinates into (fP, fQ): computed where read, so L-infinity keeps no second array. */
  private frame(i: number): void {
    const x = this.xy[2 * i], y = this.xy[2 * i + 1];
    if (this.rotated) { this.fP = x + y; this.fQ = x - y; } else { this.fP = x; this.fQ = y; }
  }
  private fP = 0;
  private fQ = 0;

  /** |dP| + |dQ| of the pair (set by set()): the L1 distance, or twice the L-infinity one. */
  gap = 0;

  /** Largest frame coordinate magnitude of the pair: the scale of every rounding error here. */
  m = 0;

  /**
   * The rounding allowance of decisions about the pair and site c, derived
   * for this file's arithmetic: every quantity here combines at most about
   * eight frame coordinates (each within one rounding of exact for
   * L-infinity, exact for L1) with coefficients 1 or 1/2, and a value of G
   * at a breakpoint is within about 180 u m of exact (u = 2^-53, m the largest
   * magnitude involved), a root within about 200 u m in K. Returned: 2^-45 m
   * (256 u m) for signs of G, times `k` for sums of such values.
   */
  allowance(c: number, k: number): number {
    this.frame(c);
    const mc = Math.max(this.m, Math.abs(this.fP), Math.abs(this.fQ));
    return k * 2 ** -45 * mc;
  }

  /** Sets up the bisector of sites a and b; false when the pair is not clearly in general position. */
  set(a: number, b: number): boolean {
    this.frame(a);
    const Pa = this.fP, Qa = this.fQ;
    this.frame(b);
    const Pb = this.fP, Qb = this.fQ;
    this.m = Math.max(Math.abs(Pa), Math.abs(Qa), Math.abs(Pb), Math.abs(Qb));
    const eps = 2 ** -45 * this.m;
    const dP = Pb - Pa, dQ = Qb - Qa;
    const aP = Math.abs(dP), aQ = Math.abs(dQ);
    this.gap = aP + aQ;
    if (!(aP > eps && aQ > eps && Math.abs(aP - aQ) > eps)) return false;
    const kIsQ = (this.kIsQ = aP > aQ);
    const Da = kIsQ ? Pa : Qa, Db = kIsQ ? Pb : Qb, Ka = kIsQ ? Qa : Pa, Kb = kIsQ ? Qb : Pb;
    const sD = Db > Da ? 1 : -1, sK = Kb > Ka ? 1 : -1, dK = Kb - Ka;
    this.Da = Da; this.Ka = Ka;
    this.Dlo = (Da + Db + sD * dK) / 2;
    this.Dhi = (Da + Db - sD * dK) / 2;
    this.Klo = sK > 0 ? Ka : Kb;
    this.Khi = sK > 0 ? Kb : Ka;
    this.slope = -sD * sK;
    // The left normal of a→b is (-dQ, dP) in the frame: its component along K decides (derived in the
    // header); the L-infinity frame map is a reflection, so left and right trade places there.
    const sigma = this.rotated ? -1 : 1;
    this.tau = kIsQ ? sigma * Math.sign(dP) : -sigma * Math.sign(dQ);
    return true;
  }

  /** D on the bisector at parameter k. */
  D(k: number): number {
    return k <= this.Klo ? this.Dlo : k >= this.Khi ? this.Dhi : this.Dlo + this.slope * (k - this.Klo);
  }

  private readonly ks = new Float64Array(4);

  /**
   * Where along the bisector (as s = tau K) the metric circle through a, b
   * and c has its centre: the root of G. For c on the left of a→b (`left`
   * = 1) G does not increase with s, for c on the right (-1) it does not
   * decrease (the circles through a and b are nested on each side of
   * them). When G keeps one sign there is no such circle: the answer is
   * then +Infinity when the circles far along +s hold c no more than the
   * others (left: c outside every circle), -Infinity otherwise.
   * UNDECIDED when G comes within the margin of zero at a breakpoint or
   * runs the wrong way.
   *
   * G is piecewise linear in K with breakpoints at the bends, at Kc, and
   * where D = Dc on the middle piece (|D - Da| keeps its sign along the whole
   * bisector, as |dD| > |dK|), and constant beyond the outer breakpoints.
   */
  root(c: number, left: number): number {
    const kIsQ = this.kIsQ;
    this.frame(c);
    const Pc = this.fP, Qc = this.fQ, Dc = kIsQ ? Pc : Qc, Kc = kIsQ ? Qc : Pc;
    const ks = this.ks, Klo = this.Klo, Khi = this.Khi;
    // The breakpoints in order, without a sort: Klo < Khi, Kc anywhere, kD (if any) strictly between the bends.
    let m = 0;
    if (Kc < Klo) ks[m++] = Kc;
    ks[m++] = Klo;
    const kD = Klo + this.slope * (Dc - this.Dlo);
    const hasD = kD > Klo && kD < Khi, midC = Kc >= Klo && Kc <= Khi;
    if (hasD && midC) {
      if (kD < Kc) { ks[m++] = kD; ks[m++] = Kc; } else { ks[m++] = Kc; ks[m++] = kD; }
    } else if (hasD) ks[m++] = kD;
    else if (midC) ks[m++] = Kc;
    ks[m++] = Khi;
    if (Kc > Khi) ks[m++] = Kc;
    const eps = this.allowance(c, 1), falls = this.tau * left > 0;
    const Dlo = this.Dlo, Dhi = this.Dhi, slope = this.slope, Da = this.Da, Ka = this.Ka;
    let prevK = 0, prevG = 0, found = UNDECIDED, crossings = 0;
    for (let i = 0; i < m; i++) {
      const k = ks[i];
      // G(k), written out (this runs for every edge test).
      const D = k <= Klo ? Dlo : k >= Khi ? Dhi : Dlo + slope * (k - Klo);
      const g = Math.abs(D - Dc) + Math.abs(k - Kc) - Math.abs(D - Da) - Math.abs(k - Ka);
      if (!(Math.abs(g) > eps)) return UNDECIDED;
      if (i > 0 && (g > 0) !== (prevG > 0)) {
        crossings++;
        // Along increasing k, G goes from + to - exactly when it falls with s = tau k (left) ...
        if ((prevG > 0) !== falls) return UNDECIDED;
        found = this.tau * (prevK + (k - prevK) * (prevG / (prevG - g)));
      }
      prevK = k; prevG = g;
    }
    if (crossings > 1) return UNDECIDED;
    if (crossings === 1) return found;
    // No root: the last value is G far along +k, i.e. far along s = tau k for tau > 0.
    return (prevG > 0) === (left > 0) ? Infinity : -Infinity;
  }

  /**
   * d(q, c) - d(q, a) at the bisector point q of parameter s (c's metric
   * distance beyond the circle centred there through a and b; negative
   * when c is inside).
   */
  beyond(s: number, c: number): number {
    const k = this.tau * s, D = this.D(k);
    this.frame(c);
    const Pc = this.fP, Qc = this.fQ, Dc = this.kIsQ ? Pc : Qc, Kc = this.kIsQ ? Qc : Pc;
    return Math.abs(D - Dc) + Math.abs(k - Kc) - Math.abs(D - this.Da) - Math.abs(k - this.Ka);
  }

  /**
   * The parameter s of a point (x, y) on the bisector: tau times its K
   * coordinate in the frame (the bisector is a graph over K).
   */
  sAt(x: number, y: number): number {
    const P = this.rotated ? x + y : x, Q = this.rotated ? x - y : y;
    return this.tau * (this.kIsQ ? Q : P);
  }

  /** The bisector point at s = tau k into (x, y). */
  point(s: number): void {
    const k = this.tau * s, D = this.D(k);
    const P = this.kIsQ ? D : k, Q = this.kIsQ ? k : D;
    if (this.rotated) { this.x = (P + Q) / 2; this.y = (P - Q) / 2; } else { this.x = P; this.y = Q; }
  }
}
