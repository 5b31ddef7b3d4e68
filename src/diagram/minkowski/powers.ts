import { powP } from './norm.js';

/** (|v_k|/M)^(p-1) sign(v_k) from pk = (|v_k|/M)^p and uk = |v_k|/M: the gradient of (|v_k|/M)^p, up to the factor p / M. */
export function powerSlope(pk: number, uk: number, vk: number): number {
  return uk > 0 ? (vk < 0 ? -pk : pk) / uk : 0;
}

/**
 * The p-th powers of the p-norms of three vectors, ||v_i||^p / M^p, and
 * their gradients up to the common factor p / M (see powerSlope), M the
 * largest coordinate magnitude among them: rescaled so that no power
 * overflows or loses every digit, whatever p. For solvers that compare
 * distances from one point (the equations ||v_0||^p = ||v_i||^p have the
 * roots of the norms' and need no p-th root).
 */
export class PowerPoint {
  M = 1;
  p0 = 0; p1 = 0; p2 = 0;
  g0x = 0; g0y = 0; g1x = 0; g1y = 0; g2x = 0; g2y = 0;

  set(p: number, pi: number, x0: number, y0: number, x1: number, y1: number, x2: number, y2: number): void {
    const a0 = Math.abs(x0), b0 = Math.abs(y0), a1 = Math.abs(x1), b1 = Math.abs(y1), a2 = Math.abs(x2), b2 = Math.abs(y2);
    const M = Math.max(a0, b0, a1, b1, a2, b2), inv = 1 / M;
    this.M = M;
    const u0 = a0 * inv, w0 = b0 * inv, u1 = a1 * inv, w1 = b1 * inv, u2 = a2 * inv, w2 = b2 * inv;
    const pu0 = powP(u0, p, pi), pw0 = powP(w0, p, pi), pu1 = powP(u1, p, pi), pw1 = powP(w1, p, pi);
    const pu2 = powP(u2, p, pi), pw2 = powP(w2, p, pi);
    this.p0 = pu0 + pw0; this.p1 = pu1 + pw1; this.p2 = pu2 + pw2;
    this.g0x = powerSlope(pu0, u0, x0); this.g0y = powerSlope(pw0, w0, y0);
    this.g1x = powerSlope(pu1, u1, x1); this.g1y = powerSlope(pw1, w1, y1);
    this.g2x = powerSlope(pu2, u2, x2); this.g2y = powerSlope(pw2, w2, y2);
  }
}
