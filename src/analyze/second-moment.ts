/**
 * Moments of polygons: area, centroid and the polar second moment
 * ∫ |x − o|² dx about a point o, exactly (closed form) for uniform density
 * and by a fixed triangle quadrature under a density function.
 *
 * Closed form: with coordinates relative to o, the polygon splits into a fan
 * of signed triangles (o, p_j, p_{j+1}), and for each
 *   area = c / 2, ∫ x = c (x_j + x_{j+1}) / 6,
 *   ∫ (x² + y²) = c (x_j² + x_j x_{j+1} + x_{j+1}² + y_j² + y_j y_{j+1} + y_{j+1}²) / 12,
 * c = x_j y_{j+1} − x_{j+1} y_j (the standard polygon moment formulas, from
 * memory; tests/unit/lloyd.test.ts checks them on a square and a regular
 * hexagon against the published second moments).
 */

/** Running sums for one polygon, its vertices relative to the reference point. */
export class MomentSum {
  /** Twice the signed area. */
  a2 = 0;
  /** Six times the first moments. */
  mx6 = 0;
  my6 = 0;
  /** Twelve times the polar second moment about the reference point. */
  j12 = 0;

  reset(): void { this.a2 = 0; this.mx6 = 0; this.my6 = 0; this.j12 = 0; }

  /** The fan triangle (reference, p, q), p and q relative to the reference point. */
  add(px: number, py: number, qx: number, qy: number): void {
    const c = px * qy - qx * py;
    this.a2 += c;
    this.mx6 += c * (px + qx);
    this.my6 += c * (py + qy);
    this.j12 += c * (px * px + px * qx + qx * qx + py * py + py * qy + qy * qy);
  }

  get area(): number { return this.a2 / 2; }
  get secondMoment(): number { return this.j12 / 12; }
}

/**
 * The polar second moment ∫ |x − (ox, oy)|² dx of a polygon (interleaved,
 * counter-clockwise; clockwise gives the negative), and its area.
 */
export function polygonSecondMoment(poly: ArrayLike<number>, ox: number, oy: number): { area: number; moment: number } {
  const m = poly.length >> 1, s = new MomentSum();
  for (let j = 0; j < m; j++) {
    const k = j + 1 === m ? 0 : j + 1;
    s.add(poly[2 * j] - ox, poly[2 * j + 1] - oy, poly[2 * k] - ox, poly[2 * k + 1] - oy);
  }
  return { area: s.area, moment: s.secondMoment };
}

/**
 * The dimensionless second moment of n cells tiling a region of area A with
 * total energy E = Σ ∫_cell |x − site|² dx (Conway and Sloane, "Sphere
 * Packings, Lattices and Groups", ch. 2: G = (1/d) ∫|x|² / V^(1 + 2/d), here
 * with d = 2 and the mean cell area V = A / n): G = E n / (2 A²).
 * 1/12 for squares, 5 / (36 √3) ≈ 0.080188 for regular hexagons.
 */
export function normalizedSecondMoment(energy: number, cells: number, area: number): number {
  return (energy * cells) / (2 * area * area);
}

// The 7-point rule of degree 5 on a triangle (Radon 1948; in Dunavant 1985's
// table as the degree-5 rule), from memory; tests/unit/lloyd.test.ts checks
// that it integrates monomials up to degree 5 exactly and misses degree 6.
const R15 = Math.sqrt(15);
const A1 = (6 - R15) / 21, B1 = (9 + 2 * R15) / 21, W1 = (155 - R15) / 1200;
const A2 = (6 + R15) / 21, B2 = (9 - 2 * R15) / 21, W2 = (155 + R15) / 1200;
const W0 = 9 / 40;
/** Barycentric points (weights of the first two vertices; the third is 1 − both) and weights. */
export const QUADRATURE_DEGREE = 5;
export const QUADRATURE = Float64Array.of(
  1 / 3, 1 / 3, W0,
  A1, A1, W1, A1, B1, W1, B1, A1, W1,
  A2, A2, W2, A2, B2, W2, B2, A2, W2,
);

/** Density-weighted sums for one cell: mass, first moments and second moment about a point s. */
export class DensitySum {
  mass = 0;
  mx = 0;
  my = 0;
  moment = 0;

  reset(): void { this.mass = 0; this.mx = 0; this.my = 0; this.moment = 0; }

  /**
   * Adds ∫_T ρ, ∫_T ρ x, ∫_T ρ y and ∫_T ρ |x − s|² over triangle T = (a, b, c)
   * (absolute coordinates, counter-clockwise), by the degree-5 rule. First
   * moments are taken relative to s, so that coordinates far from the origin
   * keep their precision. A density value that is not a finite number >= 0
   * goes to `check`, which throws.
   */
  addTriangle(
    ax: number, ay: number, bx: number, by: number, cx: number, cy: number,
    sx: number, sy: number, density: (x: number, y: number) => number, check: (v: number, x: number, y: number) => void,
  ): void {
    const area = ((bx - ax) * (cy - ay) - (cx - ax) * (by - ay)) / 2;
    const q = QUADRATURE;
    for (let i = 0; i < q.length; i += 3) {
      const u = q[i], v = q[i + 1], w = 1 - u - v;
      const x = u * ax + v * bx + w * cx, y = u * ay + v * by + w * cy;
      const rho = density(x, y);
      if (!(rho >= 0 && rho < Infinity)) check(rho, x, y);
      const wr = q[i + 2] * area * rho;
      const dx = x - sx, dy = y - sy;
      this.mass += wr;
      this.mx += wr * dx;
      this.my += wr * dy;
      this.moment += wr * (dx * dx + dy * dy);
    }
  }
}
