import type { PairFrame } from './bisector.js';
import { powerSlope } from './powers.js';

/**
 * The s values, strictly between s0 and s1 and in increasing order, where
 * the bisector of the frame's pair a, b crosses one of the four
 * axis-parallel lines through a or b, each with its t (into `out` as
 * pairs s, t; returns their count).
 *
 * Each such line meets the whole bisector exactly once, or never (derived
 * here): on the line x = c the bisector's equation is
 * |c - ax|^p + |y - ay|^p = |c - bx|^p + |y - by|^p, and
 * ψ(y) = |y - ay|^p - |y - by|^p is strictly monotone (a difference
 * g(y - ay) - g(y - by) of the strictly convex g = |.|^p, whose derivative
 * grows) and unbounded both ways when ay ≠ by (p > 1); when ay = by it is 0
 * and the equation holds nowhere (the line is a's or b's own, so exactly
 * one side is 0 and the other not). So an edge crosses the line iff its
 * ends lie on opposite sides of it, and the crossing is the one root of ψ,
 * found by Newton safeguarded with bisection.
 */
export function siteLineCrossings(f: PairFrame, s0: number, x0: number, y0: number, s1: number, x1: number, y1: number, out: Float64Array): number {
  const ax = f.mx - f.h * f.ex, ay = f.my - f.h * f.ey, bx = f.mx + f.h * f.ex, by = f.my + f.h * f.ey;
  let n = 0;
  // Vertical lines x = c: the unknown is y; horizontal ones swap the roles of the coordinates.
  for (let k = 0; k < 4; k++) {
    const vertical = k < 2, c = vertical ? (k === 0 ? ax : bx) : (k === 2 ? ay : by);
    const e0 = vertical ? x0 : y0, e1 = vertical ? x1 : y1;
    if ((e0 - c) * (e1 - c) >= 0) continue;
    // The chord's own crossing with the line starts Newton.
    const q = (c - e0) / (e1 - e0);
    const w = vertical ? root(f.p, c - ax, c - bx, ay, by, y0, y1, y0 + q * (y1 - y0), f.h) :
      root(f.p, c - ay, c - by, ax, bx, x0, x1, x0 + q * (x1 - x0), f.h);
    if (w !== w) continue;
    const x = vertical ? c : w, y = vertical ? w : c;
    const s = f.sOf(x, y);
    if (!(s > s0 && s < s1)) continue;
    const t = (x - f.mx) * f.ex + (y - f.my) * f.ey;
    let i = n++;
    while (i > 0 && out[2 * i - 2] > s) { out[2 * i] = out[2 * i - 2]; out[2 * i + 1] = out[2 * i - 1]; i--; }
    out[2 * i] = s; out[2 * i + 1] = t;
  }
  return n;
}

/**
 * The w with da^p + |w - pa|^p = db^p + |w - pb|^p (da, db the offsets of
 * the line from the sites across it, pa, pb the sites' coordinates along
 * it), by Newton from `guess`, safeguarded by bisection in the bracket of
 * the edge's ends w0, w1 (widened until the sign changes); NaN if none
 * (pa = pb). Only called for p < 2, so lengths are measured in units of h
 * and no power of them overflows.
 */
function root(p: number, da: number, db: number, pa: number, pb: number, w0: number, w1: number, guess: number, h: number): number {
  if (pa === pb) return NaN;
  const sign = pb > pa ? 1 : -1; // ψ grows with w when pb > pa
  const inv = 1 / h, K = Math.pow(Math.abs(da) * inv, p) - Math.pow(Math.abs(db) * inv, p);
  let lo = Math.min(w0, w1), hi = Math.max(w0, w1);
  let width = Math.max(hi - lo, h);
  for (let i = 0; i < 60 && sign * (K + psi(p, (lo - pa) * inv, (lo - pb) * inv)) > 0; i++) { lo -= width; width *= 2; }
  width = Math.max(hi - lo, h);
  for (let i = 0; i < 60 && sign * (K + psi(p, (hi - pa) * inv, (hi - pb) * inv)) < 0; i++) { hi += width; width *= 2; }
  let w = guess > lo && guess < hi ? guess : lo + (hi - lo) / 2;
  for (let it = 0; it < 100; it++) {
    const u = (w - pa) * inv, v = (w - pb) * inv, au = Math.abs(u), av = Math.abs(v);
    const pu = Math.pow(au, p), pv = Math.pow(av, p);
    const val = sign * (K + pu - pv);
    if (val === 0) return w;
    if (val < 0) lo = w; else hi = w;
    // d/dw of the value: (p / h) (sign(u) |u|^(p-1) - sign(v) |v|^(p-1)).
    const d = sign * (p * inv) * (powerSlope(pu, au, u) - powerSlope(pv, av, v));
    let next = w - val / d;
    if (!(next > lo && next < hi)) next = lo + (hi - lo) / 2;
    const moved = Math.abs(next - w);
    w = next;
    // As in PairFrame.at: Newton converges quadratically, so a step below 1e-8 of the scale leaves an error
    // near 1e-16 of it.
    if (moved <= 1e-8 * (Math.abs(w - pa) + h) || hi - lo <= 4 * Number.EPSILON * (Math.abs(w) + h)) return w;
  }
  return w;
}

/** |u|^p - |v|^p. */
function psi(p: number, u: number, v: number): number {
  return Math.pow(Math.abs(u), p) - Math.pow(Math.abs(v), p);
}
