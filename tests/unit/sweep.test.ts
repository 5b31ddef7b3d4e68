import { describe, expect, it } from 'vitest';
import { checkMesh, InputError, triangulate, voronoi, type VoronoiDiagram } from '../../src/index.js';
import { breakpointSide, circleVersusCircleExact, circleVersusSiteExact } from '../../src/diagram/sweep/exact-keys.js';
import { diagramDifferences } from '../support/diagram-compare.js';

/**
 * Worked cases for the sweep-line construction (voronoi(..., { method:
 * 'sweep' })). Expected numbers are worked out by hand from perpendicular
 * bisectors (written beside each case), not taken from the library.
 */

function sweep(points: number[][] | number[], clip?: { minX: number; minY: number; maxX: number; maxY: number }): VoronoiDiagram {
  const d = voronoi(points as number[], { clip, method: 'sweep' });
  expect(checkMesh(d.mesh).problems).toEqual([]);
  if (d.triangulation.dimension === 2) expect(checkMesh(d.triangulation.toMesh(), { delaunay: 'global' }).problems).toEqual([]);
  expect(diagramDifferences(d, voronoi(points as number[], { clip }))).toEqual([]);
  return d;
}

/** Vertices not on the region boundary, with their degree. */
function interiorVertices(d: VoronoiDiagram): { x: number; y: number; degree: number }[] {
  const m = d.mesh, on = new Set<number>();
  let e = m.faceEdge[m.outerFace];
  const e0 = e;
  do { on.add(m.origin[e]); e = m.next[e]; } while (e !== e0);
  const deg = new Map<number, number>();
  for (let h = 0; h < m.origin.length; h++) deg.set(m.origin[h], (deg.get(m.origin[h]) ?? 0) + 1);
  const out: { x: number; y: number; degree: number }[] = [];
  for (const [v, k] of deg) if (!on.has(v)) out.push({ x: m.vertexXY[2 * v], y: m.vertexXY[2 * v + 1], degree: k });
  return out;
}

describe("voronoi(..., { method: 'sweep' })", () => {
  it('rejects an unknown method with InputError bad-option on field method', () => {
    for (const method of ['fortune', 42, null, 'Sweep']) {
      let err: unknown = null;
      try { voronoi([0, 0, 1, 1], { method: method as never }); } catch (e) { err = e; }
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).code).toBe('bad-option');
      expect((err as InputError).field).toBe('method');
    }
  });

  it('three sites: one vertex at the circumcentre, cells measured by hand', () => {
    // (0,0), (4,0), (0,4): bisectors x = 2, y = 2 and y = x meet at (2, 2).
    // Region [-2, 6]^2 (area 64): cell 0 = [-2, 2]^2 = 16; cell 1 = {x > 2, y < x} = integral
    // from 2 to 6 of (x + 2) dx = 24; cell 2 the mirror image, 24.
    const d = sweep([[0, 0], [4, 0], [0, 4]], { minX: -2, minY: -2, maxX: 6, maxY: 6 });
    const inner = interiorVertices(d);
    expect(inner.length).toBe(1);
    expect(inner[0].x).toBeCloseTo(2, 12);
    expect(inner[0].y).toBeCloseTo(2, 12);
    const a = d.cellAreas();
    expect(a[0]).toBeCloseTo(16, 10);
    expect(a[1]).toBeCloseTo(24, 10);
    expect(a[2]).toBeCloseTo(24, 10);
    expect(Array.from(d.cellNeighbors(0).sites).sort()).toEqual([1, 2]);
  });

  it('four cocircular sites (a square): one vertex of degree 4, no diagonal neighbours', () => {
    // The square's centre (1, 1) is equidistant from all four; cells are the four 2 x 2 quarters of [-1, 3]^2.
    const d = sweep([[0, 0], [2, 0], [2, 2], [0, 2]], { minX: -1, minY: -1, maxX: 3, maxY: 3 });
    const inner = interiorVertices(d);
    expect(inner.length).toBe(1);
    expect(inner[0]).toEqual({ x: 1, y: 1, degree: 4 });
    expect(Array.from(d.cellAreas())).toEqual([4, 4, 4, 4]);
    expect(Array.from(d.cellNeighbors(0).sites).sort()).toEqual([1, 3]);
  });

  it('a site exactly at the top of a pending circle (the site comes after the event, one rule for ties)', () => {
    // (-4,-3), (4,-3), (0,-5), (0,5) lie on x^2 + y^2 = 25; (0, 5) is the top of that circle, where the
    // event of the first three fires. One Voronoi vertex at (0, 0) where all four cells meet.
    const d = sweep([[-4, -3], [4, -3], [0, -5], [0, 5]], { minX: -10, minY: -10, maxX: 10, maxY: 10 });
    const inner = interiorVertices(d);
    expect(inner.length).toBe(1);
    expect(inner[0].degree).toBe(4);
    expect(Math.abs(inner[0].x)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(inner[0].y)).toBeLessThanOrEqual(1e-12);
  });

  it('a site exactly below a breakpoint of the first row', () => {
    // (0,0), (2,0) share the first row; their breakpoint is x = 1, right below (1, 5).
    // Circumcentre (1, y): 1 + y^2 = (5 - y)^2, so y = 2.4.
    const d = sweep([[0, 0], [2, 0], [1, 5]], { minX: -3, minY: -3, maxX: 5, maxY: 8 });
    const inner = interiorVertices(d);
    expect(inner.length).toBe(1);
    expect(inner[0].x).toBeCloseTo(1, 12);
    expect(inner[0].y).toBeCloseTo(2.4, 12);
  });

  it('a whole first row and rows of a grid (ties between sites and between events)', () => {
    const pts: number[][] = [];
    for (let i = 0; i < 7; i++) for (let j = 0; j < 5; j++) pts.push([i, j]);
    const d = sweep(pts);
    // A 7 x 5 lattice: (7-1)(5-1) = 24 interior vertices, each where four cells meet.
    const inner = interiorVertices(d);
    expect(inner.length).toBe(24);
    expect(inner.every((v) => v.degree === 4)).toBe(true);
  });

  it('collinear sites: dimension 1, strips measured by hand', () => {
    // (0,0), (1,0), (3,0) in [-1, 4] x [-1, 1]: bisectors x = 0.5 and x = 2; strips 1.5, 1.5 and 2 wide, 2 high.
    const d = sweep([[0, 0], [1, 0], [3, 0]], { minX: -1, minY: -1, maxX: 4, maxY: 1 });
    expect(d.triangulation.dimension).toBe(1);
    const a = d.cellAreas();
    [3, 3, 4].forEach((want, s) => expect(a[s]).toBeCloseTo(want, 12));
    expect(Array.from(d.triangulation.edges())).toEqual([0, 1, 1, 2]);
  });

  it('one site: dimension 0, its cell is the region', () => {
    const d = sweep([[3, 4]], { minX: 0, minY: 0, maxX: 10, maxY: 5 });
    expect(d.triangulation.dimension).toBe(0);
    expect(d.cellAreas()[0]).toBe(50);
  });

  it('duplicates are merged exactly as the dual route merges them', () => {
    const pts = [[0, 0], [1, 0], [0, 0], [0, 1], [1, 0], [5, 5]];
    const d = sweep(pts);
    expect(Array.from(d.triangulation.siteOfInput)).toEqual([0, 1, 0, 2, 1, 3]);
    expect(d.triangulation.mergedCount).toBe(2);
  });

  it('from a Triangulation: keeps its site numbering and siteOfInput', () => {
    const tri = triangulate([[2, 2], [0, 0], [2, 2], [4, 1], [1, 3], [3, 5]]);
    const d = voronoi(tri, { method: 'sweep' });
    expect(Array.from(d.triangulation.siteOfInput)).toEqual(Array.from(tri.siteOfInput));
    expect(Array.from(d.triangulation.siteXY)).toEqual(Array.from(tri.siteXY));
    expect(diagramDifferences(d, voronoi(tri))).toEqual([]);
  });

  it('hundreds to thousands of random sites (growth of every internal array): the same diagram as the dual route', () => {
    let state = 12345;
    const rnd = () => (state = (state * 16807) % 2147483647) / 2147483647;
    for (const n of [400, 1500, 5000]) {
      const pts = Array.from({ length: 2 * n }, rnd);
      const d = voronoi(pts, { method: 'sweep' }), ref = voronoi(pts);
      expect(d.triangulation.triangleCount, `${n} sites`).toBe(ref.triangulation.triangleCount);
      expect(checkMesh(d.triangulation.toMesh(), { delaunay: 'local' }).problems, `${n} sites`).toEqual([]);
      expect(diagramDifferences(d, ref).slice(0, 5), `${n} sites`).toEqual([]);
    }
  });

  it('spread-out sites and a crowded column (the beach line tree dropped and built again): the same diagram as the dual route', () => {
    let state = 777;
    const rnd = () => (state = (state * 16807) % 2147483647) / 2147483647;
    const pts: number[] = [];
    for (let i = 0; i < 20000; i++) {
      const y = rnd();
      // A third of the sites in a column 1e-5 wide: walks along the line fail there, elsewhere they serve.
      pts.push(rnd() < 0.3 ? 0.25 + rnd() * 1e-5 : rnd(), y);
    }
    const d = voronoi(pts, { method: 'sweep' }), ref = voronoi(pts);
    expect(d.triangulation.triangleCount).toBe(ref.triangulation.triangleCount);
    expect(checkMesh(d.triangulation.toMesh(), { delaunay: 'local' }).problems).toEqual([]);
    expect(diagramDifferences(d, ref).slice(0, 5)).toEqual([]);
  });

  it('offset by 1e7: the same diagram as the dual route', () => {
    const pts: number[] = [];
    for (let i = 0; i < 40; i++) pts.push(1e7 + ((i * 37) % 23) * 0.25, 1e7 + ((i * 11) % 17) * 0.125);
    sweep(pts);
  });
});

describe('breakpointSide (exact): where the new site is against a breakpoint, by hand', () => {
  it('two sites of one height: the breakpoint is their bisector', () => {
    // (0,0) left, (2,0) right: breakpoint x = 1 at any height of the line.
    expect(breakpointSide(1, 3, 0, 0, 2, 0)).toBe(0);
    expect(breakpointSide(0.5, 3, 0, 0, 2, 0)).toBe(-1);
    expect(breakpointSide(1.5, 3, 0, 0, 2, 0)).toBe(1);
  });

  it('two heights: the breakpoint is the centre of the circle through both, tangent to the line', () => {
    // (-4,-3) and (3,4) lie on x^2 + y^2 = 25, tangent to y = 5 at (0, 5); going counter-clockwise from
    // the touching point (0,5) meets (-4,-3) before (3,4), so that circle's centre is the breakpoint
    // with (-4,-3) on the left.
    expect(breakpointSide(0, 5, -4, -3, 3, 4)).toBe(0);
    expect(breakpointSide(-1, 5, -4, -3, 3, 4)).toBe(-1);
    expect(breakpointSide(1, 5, -4, -3, 3, 4)).toBe(1);
    // With the arcs the other way round it is the other intersection of the parabolas, not at x = 0.
    expect(breakpointSide(0, 5, 3, 4, -4, -3)).not.toBe(0);
  });

  it('a site on the sweep line (a vertical ray for a parabola)', () => {
    // p = (0,1) was just inserted on the line y = 1, s = (0,0) below: both breakpoints are at x = 0.
    expect(breakpointSide(1, 1, 0, 1, 0, 0)).toBe(1);
    expect(breakpointSide(1, 1, 0, 0, 0, 1)).toBe(1);
    expect(breakpointSide(-1, 1, 0, 1, 0, 0)).toBe(-1);
    expect(breakpointSide(-1, 1, 0, 0, 0, 1)).toBe(-1);
  });

  it('one ulp apart: exact where a plain floating evaluation is not decisive', () => {
    const e = 2 ** -52;
    // (0,0) and (2,0): the breakpoint is x = 1; a site one ulp right of it is right of it.
    expect(breakpointSide(1 + e, 1e8, 0, 0, 2, 0)).toBe(1);
    expect(breakpointSide(1 - e / 2, 1e8, 0, 0, 2, 0)).toBe(-1);
  });
});

describe('event order (exact): circle tops against sites and against each other, by hand', () => {
  it('a circle top against a site: above, level (then by x), on it', () => {
    // (4,-3), (-4,-3), (0,-5) counter-clockwise on x^2 + y^2 = 25: the top is (0, 5).
    const c = [4, -3, -4, -3, 0, -5] as const;
    expect(circleVersusSiteExact(...c, 0, 4.9)).toBe(2);
    expect(circleVersusSiteExact(...c, 0, 5.1)).toBe(-2);
    expect(circleVersusSiteExact(...c, 1, 5)).toBe(-1);
    expect(circleVersusSiteExact(...c, -1, 5)).toBe(1);
    expect(circleVersusSiteExact(...c, 0, 5)).toBe(0);
  });

  it('the squares of a lattice: tops tie along a row, then go by x (double path and BigInt path)', () => {
    // The triangle (i,j), (i+1,j), (i+1,j+1) of a unit square has the square's circle: top at
    // (i + 1/2, j + 1/2 + sqrt(2)/2). Scaled by s and moved by o. With o = 2^60 the products pass 2^53,
    // so the exact-or-bail doubles give up and BigInt decides.
    for (const [o, s] of [[0, 1], [1e7, 1 / 64], [2 ** 60, 1024]]) {
      const tri = (i: number, j: number) => [o + i * s, o + j * s, o + (i + 1) * s, o + j * s, o + (i + 1) * s, o + (j + 1) * s];
      for (let i1 = 0; i1 < 3; i1++) for (let j1 = 0; j1 < 3; j1++) for (let i2 = 0; i2 < 3; i2++) for (let j2 = 0; j2 < 3; j2++) {
        const want = j1 !== j2 ? 2 * Math.sign(j1 - j2) : Math.sign(i1 - i2);
        const [a, b, c, d, e, f] = tri(i1, j1), [g, h, k, l, m, n] = tri(i2, j2);
        expect(circleVersusCircleExact(a, b, c, d, e, f, g, h, k, l, m, n), `offset ${o}, (${i1},${j1}) vs (${i2},${j2})`).toBe(want);
      }
    }
  });
});

describe('both routes place a near-flat triangle\'s centre alike', () => {
  it('the same vertices to the bit, whichever corner each construction lists first (found by the sweep property)', () => {
    // Sites 0 and 1 are 1.2e-6 apart, far from site 2: their triangle's centre is ill-conditioned, and computed
    // from different first corners it came out 1.2e-9 apart, beyond the property's 1e-9 of the region.
    const pts = [0.49999813735485077, -0.4999999701976776, 0.4999981224536896, -0.5, -0.5, -0.42334800958633423,
      -0.5, -0.09227922558784485, -0.5, -0.5];
    const sorted = (xy: Float64Array): string[] => {
      const out: string[] = [];
      for (let i = 0; i < xy.length; i += 2) out.push(`${xy[i]},${xy[i + 1]}`);
      return out.sort();
    };
    const dual = voronoi(pts), sweep = voronoi(pts, { method: 'sweep' });
    expect(sorted(sweep.mesh.vertexXY)).toEqual(sorted(dual.mesh.vertexXY));
  });
});
