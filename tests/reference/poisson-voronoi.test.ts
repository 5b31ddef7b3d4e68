import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../src/core/random.js';
import { voronoi } from '../../src/index.js';

/**
 * Published statistics of the Poisson–Voronoi tessellation of the plane with
 * intensity λ (values from memory, not looked up again for this test):
 *
 * - mean number of sides of the typical cell: exactly 6 (Euler's relation
 *   for a random tessellation with vertices of degree 3; Meijering 1953);
 * - mean perimeter of the typical cell: 4 / √λ (Meijering 1953);
 * - mean edge length: 2 / (3 √λ) (Meijering 1953; Okabe, Boots, Sugihara and
 *   Chiu, "Spatial Tessellations", 2nd ed., 2000, table 5.5.1);
 * - variance of the cell area: 0.280 / λ² (Gilbert 1962, numerically);
 * - variance of the number of sides: 1.781 (Okabe et al. 2000, table 5.5.1);
 * - share of hexagons: 0.295 (Okabe et al. 2000, from the simulated
 *   distribution of the number of sides).
 *
 * The edge length. Edges are counted once per cell they bound, i.e. the
 * statistic is (total of all sides of the sampled cells) / (number of those
 * sides) = E[perimeter] / E[sides] = (4/√λ) / 6 = 2/(3√λ). It equals the mean
 * length of the typical edge counted once (edge length per unit area 2√λ
 * over 3λ edges per unit area), because every interior edge bounds exactly
 * two cells. It is NOT the mean over cells of each cell's average side.
 *
 * Sample: n = 2·10^5 uniform sites in the unit square (a binomial process;
 * with n this large it is Poisson of intensity λ = n for these purposes),
 * and the cells whose SITE lies farther than 0.05 from the square's
 * boundary. Selecting cells by their site, not by their shape, is a fair
 * sample of the typical cell (the site of the typical cell is a uniform
 * point; the cells of the ~162000 selected sites are the whole population
 * of cells with a site in the inner square). 0.05 is about 22 typical cell
 * diameters (1/√λ ≈ 0.0022), so none of these cells reaches the clip
 * boundary: they are the cells of the unclipped tessellation (checked below).
 *
 * Tolerances are those of the task; each is several standard errors of the
 * sample (rough estimates, in comments) so the seeded test is not flaky.
 */

const N = 200_000;
const MARGIN = 0.05;
const SEED = 20250611;

describe('Poisson–Voronoi statistics of 2·10^5 uniform sites (seeded)', () => {
  const words = mulberry32(SEED);
  const xy = new Float64Array(2 * N);
  for (let i = 0; i < xy.length; i++) xy[i] = words() / 4294967296;
  const d = voronoi(xy, { clip: { minX: 0, minY: 0, maxX: 1, maxY: 1 } });
  const m = d.mesh;
  const sites = d.triangulation.siteXY;
  const areas = d.cellAreas();
  const lambda = N;

  // Sides and perimeters walked on the mesh: a cell's sides are the
  // half-edges of its face cycle (merged vertices of degree > 3 give fewer).
  const sides: number[] = [];
  const perimeters: number[] = [];
  const cellAreas: number[] = [];
  let touchesBoundary = 0;
  for (let s = 0; s < d.triangulation.siteCount; s++) {
    const x = sites[2 * s], y = sites[2 * s + 1];
    if (x <= MARGIN || x >= 1 - MARGIN || y <= MARGIN || y >= 1 - MARGIN) continue;
    const f = d.faceOfSite[s];
    let k = 0, per = 0;
    const e0 = m.faceEdge[f];
    let e = e0;
    do {
      const u = m.origin[e], v = m.origin[m.next[e]];
      per += Math.hypot(m.vertexXY[2 * v] - m.vertexXY[2 * u], m.vertexXY[2 * v + 1] - m.vertexXY[2 * u + 1]);
      if (m.face[m.twin[e]] === m.outerFace) touchesBoundary++;
      k++;
      e = m.next[e];
    } while (e !== e0);
    sides.push(k);
    perimeters.push(per);
    cellAreas.push(areas[s]);
  }
  const count = sides.length;
  const mean = (a: number[]) => a.reduce((p, q) => p + q, 0) / a.length;
  const variance = (a: number[]) => {
    const mu = mean(a);
    return a.reduce((p, q) => p + (q - mu) * (q - mu), 0) / (a.length - 1);
  };

  it('samples about 0.81 n inner cells, none touching the clip boundary', () => {
    expect(d.triangulation.siteCount).toBe(N);
    expect(count).toBeGreaterThan(0.8 * N);
    expect(count).toBeLessThan(0.82 * N);
    expect(touchesBoundary).toBe(0);
    const hex = sides.filter((k) => k === 6).length / count;
    const edgeMean = perimeters.reduce((p, q) => p + q, 0) / sides.reduce((p, q) => p + q, 0);
    console.info(`${count} cells: sides ${mean(sides).toFixed(4)} (var ${variance(sides).toFixed(4)}, hexagons ${hex.toFixed(4)}), ` +
      `perimeter ${(mean(perimeters) * Math.sqrt(lambda)).toFixed(4)}/√λ, edge ${(edgeMean * Math.sqrt(lambda)).toFixed(4)}/√λ, ` +
      `area variance ${(variance(cellAreas) * lambda * lambda).toFixed(4)}/λ²`);
  });

  it('mean number of sides is 6 within 0.02 (Meijering 1953; SE ≈ 1.33/√162000 ≈ 0.003)', () => {
    expect(Math.abs(mean(sides) - 6)).toBeLessThan(0.02);
  });

  it('mean perimeter is 4/√λ within 1% (Meijering 1953; relative SE ≈ 0.0005)', () => {
    const want = 4 / Math.sqrt(lambda);
    expect(Math.abs(mean(perimeters) / want - 1)).toBeLessThan(0.01);
  });

  it('mean edge length, each cell\'s edges counted in that cell, is 2/(3√λ) within 1% (Meijering 1953)', () => {
    const total = perimeters.reduce((p, q) => p + q, 0);
    const edges = sides.reduce((p, q) => p + q, 0);
    const want = 2 / (3 * Math.sqrt(lambda));
    expect(Math.abs(total / edges / want - 1)).toBeLessThan(0.01);
  });

  it('variance of the cell area is 0.280/λ² within 3% (Gilbert 1962; relative SE ≈ 0.005)', () => {
    const v = variance(cellAreas) * lambda * lambda;
    expect(Math.abs(v / 0.28 - 1)).toBeLessThan(0.03);
    // The mean area of a selected cell is 1/λ (sanity of the sample).
    expect(Math.abs(mean(cellAreas) * lambda - 1)).toBeLessThan(0.01);
  });

  it('variance of the number of sides is 1.781 within 3% (Okabe et al. 2000; relative SE ≈ 0.005)', () => {
    expect(Math.abs(variance(sides) / 1.781 - 1)).toBeLessThan(0.03);
  });

  it('share of hexagons is 0.295 within 0.01 (Okabe et al. 2000; SE ≈ 0.0011)', () => {
    const share = sides.filter((k) => k === 6).length / count;
    expect(Math.abs(share - 0.295)).toBeLessThan(0.01);
  });
});
