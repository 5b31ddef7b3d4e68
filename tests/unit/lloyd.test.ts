import { describe, expect, it } from 'vitest';
import { InputError, relax } from '../../src/index.js';
import {
  normalizedSecondMoment, polygonSecondMoment, QUADRATURE, QUADRATURE_DEGREE, DensitySum,
} from '../../src/analyze/second-moment.js';
import { prng } from '../support/live-cases.js';

const UNIT = { minX: 0, minY: 0, maxX: 1, maxY: 1 };
// Conway and Sloane, "Sphere Packings, Lattices and Groups", ch. 2 (Table 2.3): the dimensionless second
// moment of the square lattice's cell is 1/12, of the hexagonal lattice's cell 5 / (36 sqrt 3) = 0.0801875...
const G_SQUARE = 1 / 12;
const G_HEXAGON = 5 / (36 * Math.sqrt(3));

function randomPoints(n: number, seed: number): Float64Array {
  const rnd = prng(seed), out = new Float64Array(2 * n);
  for (let i = 0; i < 2 * n; i++) out[i] = rnd();
  return out;
}

describe('second moments', () => {
  it('gives the published G of a square and of a regular hexagon cell', () => {
    const square = polygonSecondMoment([0, 0, 1, 0, 1, 1, 0, 1], 0.5, 0.5);
    expect(square.area).toBe(1);
    // 1/6 and 1/12 are exact in a few roundings: the tolerance covers them (a few units in the last place).
    expect(normalizedSecondMoment(square.moment, 1, square.area)).toBeCloseTo(G_SQUARE, 15);
    const hex: number[] = [];
    for (let k = 0; k < 6; k++) hex.push(3 + 2 * Math.cos((k * Math.PI) / 3), -1 + 2 * Math.sin((k * Math.PI) / 3));
    const h = polygonSecondMoment(hex, 3, -1);
    expect(h.area).toBeCloseTo(6 * Math.sqrt(3), 13);
    // Cosines and sines are rounded: relative 1e-14 covers them and the dozen operations after.
    expect(Math.abs(normalizedSecondMoment(h.moment, 1, h.area) / G_HEXAGON - 1)).toBeLessThan(1e-14);
  });

  it('relax measures one square cell about its centre as 1/12, and a step moves the site there', () => {
    const still = relax([0.5, 0.5], { clip: UNIT, steps: 0 });
    expect(still.steps).toBe(0);
    expect(still.energy.length).toBe(1);
    expect(still.normalizedMoment).toBeCloseTo(G_SQUARE, 15);
    const moved = relax([0.2, 0.3], { clip: UNIT, steps: 5, tolerance: 1e-12 });
    expect(Array.from(moved.sites)).toEqual([0.5, 0.5]);
    expect(moved.moves[0]).toBeCloseTo(Math.hypot(0.3, 0.2), 15);
    // (0.2, 0.3) off the centre adds |offset|^2 times the area to the centred 1/6 (parallel axis theorem).
    expect(moved.energy[0]).toBeCloseTo(1 / 6 + 0.13, 15);
    expect(moved.energy[1]).toBeCloseTo(1 / 6, 15);
    expect(moved.converged).toBe(true);
    expect(moved.steps).toBe(2);
  });

  it(`integrates every monomial of degree <= ${QUADRATURE_DEGREE} over a triangle exactly, and not degree 6`, () => {
    // Over the unit simplex, the integral of x^a y^b is a! b! / (a + b + 2)! (the Dirichlet integral, a textbook formula).
    const fact = (k: number): number => (k <= 1 ? 1 : k * fact(k - 1));
    const integrate = (a: number, b: number): number => {
      const sum = new DensitySum();
      sum.addTriangle(0, 0, 1, 0, 0, 1, 0, 0, (x, y) => x ** a * y ** b, () => { throw new Error('bad'); });
      return sum.mass;
    };
    for (let deg = 0; deg <= QUADRATURE_DEGREE; deg++) {
      for (let a = 0; a <= deg; a++) {
        const exact = (fact(a) * fact(deg - a)) / fact(deg + 2);
        // Seven weighted terms of size below 1: rounding stays under 1e-15 relative; 1e-13 leaves margin.
        expect(Math.abs(integrate(a, deg - a) / exact - 1)).toBeLessThan(1e-13);
      }
    }
    expect(Math.abs(integrate(6, 0) / (fact(6) / fact(8)) - 1)).toBeGreaterThan(1e-6);
    expect(QUADRATURE.length).toBe(21);
  });
});

describe('relax', () => {
  it('2000 random sites in the unit square converge to G within 1.5% of the hexagon, never raising the energy', () => {
    const n = 2000;
    const tolerance = 1e-5; // about 1/2000 of the mean spacing sqrt(1/2000) = 0.022
    const res = relax(randomPoints(n, 20261202), { clip: UNIT, steps: 6000, tolerance });
    // Measured here: converged after about 2150 steps (6 s). To tolerance 1e-7 it takes about 8500 steps
    // (20 s) and reaches G = 0.080974; this test stops earlier to stay fast, at a stated tolerance.
    expect(res.converged).toBe(true);
    expect(res.moves[res.steps - 1]).toBeLessThanOrEqual(tolerance);
    expect(res.merged.length).toBe(0);
    expect(res.normalizedMoment).toBeLessThan(G_SQUARE);
    expect(Math.abs(res.normalizedMoment / G_HEXAGON - 1)).toBeLessThan(0.015);
    expect(res.normalizedMoment).toBeGreaterThan(G_HEXAGON * 0.999);
    // Lloyd 1982: a step never raises the energy in exact arithmetic. Every fan term of a cell that holds
    // its site is >= 0, so a cell's energy is rounded to within (corners + 10) u relative and the sum of
    // 2000 of them to within about 2000 u = 2.2e-13; the cell corners themselves (circumcentres) are off
    // by a few ulps, moving a cell's energy by about sqrt(n) u relative. 1e-12 relative covers both.
    for (let k = 1; k < res.energy.length; k++) {
      expect(res.energy[k]).toBeLessThanOrEqual(res.energy[k - 1] * (1 + 1e-12));
    }
    for (let i = 0; i < 2 * n; i++) {
      expect(res.sites[i]).toBeGreaterThanOrEqual(0);
      expect(res.sites[i]).toBeLessThanOrEqual(1);
    }
  }, 60_000);

  it('a density higher to the right pulls the sites right, about as the asymptotic point density predicts', () => {
    // Gersho 1979 (from memory): an optimal quantiser for density rho in d dimensions has point density
    // proportional to rho^(d / (d + 2)), rho^(1/2) here. For rho = 1 + 3x on the unit square the mean x of
    // the sites is then (integral x sqrt(1 + 3x)) / (integral sqrt(1 + 3x)) = (116 / 135) / (14 / 9) = 0.55238.
    const predicted = (116 / 135) / (14 / 9);
    // Sites drift to the dense side slowly (measured: 400 sites reach a mean of 0.539 after 300 steps and 0.548
    // after 1000), so few sites and many steps.
    const n = 100;
    const res = relax(randomPoints(n, 77), { clip: UNIT, steps: 1000, density: (x) => 1 + 3 * x });
    let mean = 0;
    for (let i = 0; i < n; i++) mean += res.sites[2 * i] / n;
    // The asymptotic law ignores the boundary row of cells (about 4 sqrt(n) = 40 of 100): 0.01 leaves room
    // for it; uniform density gives 0.5, five times farther off.
    expect(Math.abs(mean - predicted)).toBeLessThan(0.01);
    expect(Number.isNaN(res.normalizedMoment)).toBe(true);
  });

  it('under density 1 the quadrature gives the closed-form energy and the same steps', () => {
    const pts = randomPoints(300, 5);
    const plain = relax(pts, { clip: UNIT, steps: 3, tolerance: 0 });
    const dense = relax(pts, { clip: UNIT, steps: 3, tolerance: 0, density: () => 1 });
    // The degree-5 rule is exact for the degree-2 integrand; the two sums round differently (fans from the
    // site against fans from a corner): 1e-12 relative covers a few hundred cells' rounding.
    for (let k = 0; k < 4; k++) expect(Math.abs(dense.energy[k] / plain.energy[k] - 1)).toBeLessThan(1e-12);
    for (let i = 0; i < pts.length; i++) expect(dense.sites[i]).toBeCloseTo(plain.sites[i], 12);
  });

  it('keeps duplicate input points together, reports progress, and leaves a site without a cell where it is', () => {
    const seen: number[] = [];
    const res = relax([[0.1, 0.1], [0.1, 0.1], [0.9, 0.8], [5, 5]], {
      clip: UNIT, steps: 4, tolerance: 0, onProgress: (p) => seen.push(p.step),
    });
    expect(seen).toEqual([0, 1, 2, 3, 4]);
    expect(res.sites[0]).toBe(res.sites[2]);
    expect(res.sites[1]).toBe(res.sites[3]);
    expect(res.merged.length).toBe(0);
    // The bisector of (5, 5) and (0.9, 0.8) passes far outside the square: (5, 5) has no cell there and stays.
    expect(res.diagram.faceOfSite[res.diagram.triangulation.siteOfInput[3]]).toBe(-1);
    expect([res.sites[6], res.sites[7]]).toEqual([5, 5]);
  });

  it('a site outside the region whose cell reaches in moves inside', () => {
    const res = relax([[0.5, 0.5], [1.2, 0.5]], { clip: UNIT, steps: 10 });
    expect(res.sites[2]).toBeLessThan(1);
    expect(res.sites[2]).toBeGreaterThan(0.5);
  });

  it('inside a study area with a hole: four symmetric sites move to the centroids of their L-shaped quarters', () => {
    // A 4 x 4 square around a 2 x 2 lake, sites at the quarter centres: by symmetry each cell is the quarter's
    // L (the 2 x 2 square minus the lake's 1 x 1 corner), area 3, centroid (4 * 1 - 1 * 1.5) / 3 = 5/6 from
    // its outer corner (worked by hand); the next step finds the same cells, so the run converges.
    const area = [[[0, 0], [4, 0], [4, 4], [0, 4]], [[1, 1], [1, 3], [3, 3], [3, 1]]];
    const res = relax([[1, 1], [3, 1], [3, 3], [1, 3]], { area, steps: 5 });
    const want = [5 / 6, 5 / 6, 4 - 5 / 6, 5 / 6, 4 - 5 / 6, 4 - 5 / 6, 5 / 6, 4 - 5 / 6];
    want.forEach((v, i) => expect(res.sites[i]).toBeCloseTo(v, 12));
    expect(res.converged).toBe(true);
    expect(res.studyArea!.totalArea()).toBeCloseTo(12, 12);
    // Energy of one L about its centroid: the parallel-axis theorem on the 2 x 2 square (J = 8/3 about its
    // centre (1, 1)) minus the 1 x 1 corner (J = 1/6 about (1.5, 1.5)), moved to (5/6, 5/6).
    const d = 1 - 5 / 6, e = 1.5 - 5 / 6;
    const J = 8 / 3 + 4 * 2 * d * d - (1 / 6 + 1 * 2 * e * e);
    expect(res.energy[res.steps]).toBeCloseTo(4 * J, 11);
  });

  it('inside a study area with holes, random sites never raise the energy and their pieces cover the area', () => {
    const rnd = prng(7);
    const pts: [number, number][] = [];
    while (pts.length < 80) {
      const x = 10 * rnd(), y = 6 * rnd();
      if (!(x > 2 && x < 4 && y > 2 && y < 4) && !(x > 6 && x < 9 && y > 1 && y < 2.5)) pts.push([x, y]);
    }
    // A notched shell (non-convex) with two holes.
    const area = [[[0, 0], [10, 0], [10, 6], [6, 6], [5, 3], [4, 6], [0, 6]], [[2, 2], [2, 4], [4, 4], [4, 2]], [[6, 1], [6, 2.5], [9, 2.5], [9, 1]]];
    const res = relax(pts, { area, steps: 40 });
    for (let k = 1; k < res.energy.length; k++) expect(res.energy[k]).toBeLessThanOrEqual(res.energy[k - 1] * (1 + 1e-12));
    expect(res.energy[res.steps]).toBeLessThan(0.8 * res.energy[0]);
    const size = 60 - (2 * 3) / 2 - 4 - 4.5; // shell minus the notch (a triangle of base 2, height 3) minus the holes
    expect(res.studyArea!.studyAreaSize).toBeCloseTo(size, 12);
    expect(Math.abs(res.studyArea!.totalArea() - size)).toBeLessThan(1e-9 * size);
    expect(res.normalizedMoment).toBeGreaterThan(0.0801);
  });

  it('refuses bad options with InputError', () => {
    const bad = (o: unknown, field: string) => {
      let err: unknown;
      try { relax([0.5, 0.5, 0.2, 0.2], o as never); } catch (e) { err = e; }
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).field).toBe(field);
    };
    bad({ steps: 3 }, 'clip');
    bad(null, 'options');
    bad({ clip: UNIT, steps: -1 }, 'steps');
    bad({ clip: UNIT, steps: 1.5 }, 'steps');
    bad({ clip: UNIT, steps: NaN }, 'steps');
    bad({ clip: UNIT, tolerance: NaN }, 'tolerance');
    bad({ clip: UNIT, tolerance: -1 }, 'tolerance');
    bad({ clip: UNIT, tolerance: Infinity }, 'tolerance');
    bad({ clip: UNIT, density: 3 }, 'density');
    bad({ clip: UNIT, density: () => -1 }, 'density');
    bad({ clip: UNIT, density: () => NaN }, 'density');
    bad({ clip: UNIT, onProgress: 'x' }, 'onProgress');
    bad({ clip: [0, 0, 1, 0] }, 'clip');
    expect(() => relax([], { clip: UNIT })).toThrow(InputError);
    expect(() => relax([0, NaN], { clip: UNIT })).toThrow(InputError);
  });
});
