import { describe, expect, it } from 'vitest';
import { checkMesh, voronoi, type VoronoiDiagram } from '../../src/index.js';
import { diagramDifferences } from '../support/diagram-compare.js';

/**
 * The sweep on large degenerate inputs: valid meshes, a triangulation with
 * exactly 2n - 2 - h triangles (Euler's relation for n sites, h of them on
 * the hull boundary), and the same diagram as the dual route. The 10^6
 * lattice of the issue is run by hand (see the README), not here: it takes
 * too long for the test loop.
 */

function expectValid(d: VoronoiDiagram, label: string): void {
  const tri = d.triangulation;
  expect(checkMesh(d.mesh).problems.slice(0, 5), `${label}: diagram`).toEqual([]);
  expect(checkMesh(tri.toMesh(), { delaunay: 'local' }).problems.slice(0, 5), `${label}: triangulation`).toEqual([]);
  expect(tri.triangleCount, `${label}: 2n - 2 - h`).toBe(2 * tri.siteCount - 2 - tri.hull().length);
  expect(diagramDifferences(d, voronoi(tri.siteXY)).slice(0, 5), label).toEqual([]);
}

describe('sweep on large degenerate inputs', () => {
  it('10^5 exactly cocircular lattice points (the benchmark ring): one vertex where all cells meet', async () => {
    // The benchmark's construction of exactly cocircular lattice points (bench/distributions.mjs).
    const { ring } = (await import(new URL('../../bench/distributions.mjs', import.meta.url).href)) as { ring: (n: number) => Float64Array };
    const pts = ring(1e5);
    expect(pts.length).toBe(2e5);
    const d = voronoi(pts, { method: 'sweep' });
    expectValid(d, 'lattice ring');
    // Every site is on the hull and every cell meets every other at the centre: n - 2 triangles.
    expect(d.triangulation.triangleCount).toBe(1e5 - 2);
  });

  it('10^4 points of cos/sin on a circle (nearly, not exactly, cocircular)', () => {
    const n = 1e4, pts = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      pts[2 * i] = Math.cos((2 * Math.PI * i) / n);
      pts[2 * i + 1] = Math.sin((2 * Math.PI * i) / n);
    }
    expectValid(voronoi(pts, { method: 'sweep' }), 'cos/sin circle');
  });

  it('a 300 x 300 integer lattice: every interior vertex of degree 4', () => {
    const k = 300, pts = new Float64Array(2 * k * k);
    for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) { pts[2 * (i * k + j)] = i; pts[2 * (i * k + j) + 1] = j; }
    const d = voronoi(pts, { method: 'sweep' });
    expectValid(d, '300 x 300 lattice');
    // (k-1)^2 Voronoi vertices inside: the cell corners of a lattice, each shared by four cells.
    const m = d.mesh, deg = new Int32Array(m.vertexXY.length >> 1);
    for (let e = 0; e < m.origin.length; e++) deg[m.origin[e]]++;
    let four = 0;
    for (let v = 0; v < deg.length; v++) if (deg[v] === 4) four++;
    expect(four).toBeGreaterThanOrEqual((k - 1) * (k - 1));
  });
});
