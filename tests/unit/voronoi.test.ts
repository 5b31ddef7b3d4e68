import { describe, expect, it } from 'vitest';
import { checkMesh, InputError, voronoi } from '../../src/index.js';

/**
 * Worked examples: every expected number below was worked out by hand from
 * the perpendicular bisectors of the sites (written next to each case), not
 * taken from the library's output.
 */

type Diagram = ReturnType<typeof voronoi>;
const EPS = 1e-12;

/** Asserts that poly (interleaved) lists `want` ([x, y] corners, counter-clockwise) up to a cyclic shift. */
function expectCycle(poly: ArrayLike<number>, want: [number, number][], label = ''): void {
  const got: [number, number][] = [];
  for (let i = 0; i + 1 < poly.length; i += 2) got.push([poly[i], poly[i + 1]]);
  const n = want.length;
  const close = (a: [number, number], b: [number, number]) => Math.abs(a[0] - b[0]) <= EPS * 100 && Math.abs(a[1] - b[1]) <= EPS * 100;
  let match = got.length === n;
  if (match) {
    match = false;
    for (let r = 0; r < n && !match; r++) match = want.every((w, i) => close(got[(i + r) % n], w));
  }
  expect(match, `${label}: got ${JSON.stringify(got)}, want a rotation of ${JSON.stringify(want)}`).toBe(true);
}

/** Asserts a cyclic sequence of site indices up to rotation (counter-clockwise order has no fixed start). */
function expectCyclicSites(got: ArrayLike<number>, want: number[], label = ''): void {
  const g = Array.from(got);
  const ok = g.length === want.length && want.some((_, r) => want.every((w, i) => g[(i + r) % g.length] === w));
  expect(ok, `${label}: got ${g}, want a rotation of ${want}`).toBe(true);
}

function neighborMap(d: Diagram, s: number): Map<number, number> {
  const nb = d.cellNeighbors(s);
  expect(nb.sites.length).toBe(nb.lengths.length);
  return new Map(Array.from(nb.sites, (t, i) => [t, nb.lengths[i]] as [number, number]));
}

function expectValid(d: Diagram): void {
  const r = checkMesh(d.mesh);
  expect(r.problems).toEqual([]);
  expect(d.mesh.kind).toBe('voronoi');
}

function vertexDegrees(d: Diagram): Map<string, number> {
  const m = d.mesh;
  const out = new Map<string, number>();
  for (let e = 0; e < m.origin.length; e++) {
    const v = m.origin[e];
    const k = `${m.vertexXY[2 * v]},${m.vertexXY[2 * v + 1]}`;
    out.set(k, (out.get(k) ?? 0) + 1);
  }
  return out;
}

describe('voronoi: worked examples', () => {
  it('two sites split a rectangle into two half-planes', () => {
    // Sites (1,1), (3,1); bisector x = 2; region [0,6] x [0,2].
    const d = voronoi([[1, 1], [3, 1]], { clip: { minX: 0, minY: 0, maxX: 6, maxY: 2 } });
    expectValid(d);
    expectCycle(d.cellPolygon(0), [[0, 0], [2, 0], [2, 2], [0, 2]], 'cell 0');
    expectCycle(d.cellPolygon(1), [[2, 0], [6, 0], [6, 2], [2, 2]], 'cell 1');
    const a = d.cellAreas();
    expect(a[0]).toBeCloseTo(4, 12);
    expect(a[1]).toBeCloseTo(8, 12);
    const p = d.cellPerimeters();
    expect(p[0]).toBeCloseTo(8, 12);
    expect(p[1]).toBeCloseTo(12, 12);
    const c = d.cellCentroids();
    expect(Array.from(c).map((v) => +v.toFixed(12))).toEqual([1, 1, 4, 1]);
    expect(d.totalArea()).toBeCloseTo(12, 12);
    expect(d.totalPerimeter()).toBeCloseTo(16, 12);
    const nb = neighborMap(d, 0);
    expect([...nb.keys()]).toEqual([1]);
    expect(nb.get(1)).toBeCloseTo(2, 12);
    expect(Array.from(d.neighborCounts())).toEqual([1, 1]);
    // 6 vertices (4 corners, 2 ends of the bisector), 7 edges, 3 faces.
    expect(d.mesh.vertexXY.length / 2).toBe(6);
    expect(d.mesh.origin.length / 2).toBe(7);
    expect(d.mesh.faceEdge.length).toBe(3);
    expect(Array.from(d.sitesWithoutCell)).toEqual([]);
  });

  it('four sites at the corners of a square, clipped to that square: four quarters around one vertex of degree 4', () => {
    // Bisectors x = 1 and y = 1 meet at (1,1), equidistant from all four sites.
    const d = voronoi([[0, 0], [2, 0], [2, 2], [0, 2]], { clip: [[0, 0], [2, 0], [2, 2], [0, 2]] });
    expectValid(d);
    expectCycle(d.cellPolygon(0), [[0, 0], [1, 0], [1, 1], [0, 1]], 'cell 0');
    expectCycle(d.cellPolygon(1), [[1, 0], [2, 0], [2, 1], [1, 1]], 'cell 1');
    expectCycle(d.cellPolygon(2), [[1, 1], [2, 1], [2, 2], [1, 2]], 'cell 2');
    expectCycle(d.cellPolygon(3), [[0, 1], [1, 1], [1, 2], [0, 2]], 'cell 3');
    for (const a of d.cellAreas()) expect(a).toBeCloseTo(1, 12);
    expect(vertexDegrees(d).get('1,1')).toBe(4);
    // 9 vertices (centre, 4 side midpoints, 4 corners), 12 edges, 5 faces: V - E + F = 2.
    expect(d.mesh.vertexXY.length / 2).toBe(9);
    expect(d.mesh.origin.length / 2).toBe(12);
    // Opposite corners touch only at the centre: not neighbours (zero length).
    const nb = neighborMap(d, 0);
    expect([...nb.keys()].sort()).toEqual([1, 3]);
    expect(nb.get(1)).toBeCloseTo(1, 12);
    expect(nb.get(3)).toBeCloseTo(1, 12);
    expect(Array.from(d.neighborCounts())).toEqual([2, 2, 2, 2]);
  });

  it('three collinear sites give three strips', () => {
    // Sites x = 1, 3, 7 on y = 1; bisectors x = 2 and x = 5; region [0,10] x [0,2].
    const d = voronoi([1, 1, 3, 1, 7, 1], { clip: { minX: 0, minY: 0, maxX: 10, maxY: 2 } });
    expectValid(d);
    expect(d.triangulation.dimension).toBe(1);
    expectCycle(d.cellPolygon(0), [[0, 0], [2, 0], [2, 2], [0, 2]], 'cell 0');
    expectCycle(d.cellPolygon(1), [[2, 0], [5, 0], [5, 2], [2, 2]], 'cell 1');
    expectCycle(d.cellPolygon(2), [[5, 0], [10, 0], [10, 2], [5, 2]], 'cell 2');
    expect(Array.from(d.cellAreas()).map((v) => +v.toFixed(12))).toEqual([4, 6, 10]);
    expect(Array.from(d.cellPerimeters()).map((v) => +v.toFixed(12))).toEqual([8, 10, 14]);
    const nb = neighborMap(d, 1);
    expect([...nb.keys()].sort()).toEqual([0, 2]);
    expect(nb.get(0)).toBeCloseTo(2, 12);
    expect(nb.get(2)).toBeCloseTo(2, 12);
    expect(Array.from(d.neighborCounts())).toEqual([1, 2, 1]);
  });

  it('one site owns the whole region (default clip: padded by 1 on every side)', () => {
    const d = voronoi([{ x: 3, y: 4 }]);
    expectValid(d);
    expectCycle(d.region, [[2, 3], [4, 3], [4, 5], [2, 5]], 'default region');
    expectCycle(d.cellPolygon(0), [[2, 3], [4, 3], [4, 5], [2, 5]], 'cell 0');
    expect(d.cellAreas()[0]).toBe(4);
    expect(d.cellPerimeters()[0]).toBe(8);
    expect(Array.from(d.cellCentroids())).toEqual([3, 4]);
    expect(d.cellNeighbors(0).sites.length).toBe(0);
    expect(d.nearest(100, -7)).toBe(0);
    expect(d.cellAt(100, -7)).toBe(-1);
    expect(d.cellAt(2.5, 4.5)).toBe(0);
  });

  it('default clip: the bounding box padded by 10% of its larger side', () => {
    // Box [0,10] x [0,4]: larger side 10, pad 1.
    const d = voronoi([[0, 0], [10, 4], [5, 1]]);
    expectValid(d);
    expectCycle(d.region, [[-1, -1], [11, -1], [11, 5], [-1, 5]], 'default region');
    expect(d.totalArea()).toBeCloseTo(72, 10);
  });

  it('a site outside the region has no cell and is reported in sitesWithoutCell', () => {
    // Sites x = 1, 3, 20 on y = 1; bisectors x = 2 and x = 11.5; region [0,4] x [0,2].
    const d = voronoi([[1, 1], [3, 1], [20, 1]], { clip: { minX: 0, minY: 0, maxX: 4, maxY: 2 } });
    expectValid(d);
    expect(Array.from(d.sitesWithoutCell)).toEqual([2]);
    expect(d.faceOfSite[2]).toBe(-1);
    expect(d.cellPolygon(2).length).toBe(0);
    expect(d.cellAreas()[2]).toBe(0);
    expect(Number.isNaN(d.cellCentroids()[4]) && Number.isNaN(d.cellCentroids()[5])).toBe(true);
    expect(d.cellNeighbors(2).sites.length).toBe(0);
    expect(Array.from(d.neighborCounts())).toEqual([1, 1, 0]);
    expect(Array.from(d.cellAreas()).map((v) => +v.toFixed(12))).toEqual([4, 4, 0]);
    // Face s is the cell of site s; site 2's face is empty; face 3 is the outer face.
    expect(d.mesh.faceEdge.length).toBe(4);
    expect(d.mesh.faceEdge[2]).toBe(-1);
    expect(d.mesh.outerFace).toBe(3);
    expect(d.nearest(20, 1)).toBe(2);
    expect(d.cellAt(20, 1)).toBe(-1);
    expect(d.cellAt(3.9, 1)).toBe(1);
  });

  it('duplicated input points share one site and one cell', () => {
    const d = voronoi([[1, 1], [3, 1], [1, 1], [3, 1], [1, 1]], { clip: { minX: 0, minY: 0, maxX: 6, maxY: 2 } });
    expectValid(d);
    expect(d.triangulation.siteCount).toBe(2);
    expect(Array.from(d.triangulation.siteOfInput)).toEqual([0, 1, 0, 1, 0]);
    expect(d.faceOfSite[d.triangulation.siteOfInput[4]]).toBe(d.faceOfSite[0]);
    expect(Array.from(d.cellAreas()).map((v) => +v.toFixed(12))).toEqual([4, 8]);
    expect(d.mesh.faceEdge.length).toBe(3);
  });

  it('measures every cell of an uneven 3 x 2 grid', () => {
    // Sites x in {1, 3, 7}, y in {1, 5}; bisectors x = 2, x = 5, y = 3; region [0,10] x [0,8].
    // Cells are the rectangles between them (columns [0,2], [2,5], [5,10]; rows [0,3], [3,8]).
    const sites: [number, number][] = [[1, 1], [3, 1], [7, 1], [1, 5], [3, 5], [7, 5]];
    const d = voronoi(sites, { clip: { minX: 0, minY: 0, maxX: 10, maxY: 8 } });
    expectValid(d);
    const area = [6, 9, 15, 10, 15, 25];
    const perimeter = [10, 12, 16, 14, 16, 20];
    const centroid = [[1, 1.5], [3.5, 1.5], [7.5, 1.5], [1, 5.5], [3.5, 5.5], [7.5, 5.5]];
    const a = d.cellAreas(), p = d.cellPerimeters(), c = d.cellCentroids();
    for (let s = 0; s < 6; s++) {
      expect(a[s], `area ${s}`).toBeCloseTo(area[s], 11);
      expect(p[s], `perimeter ${s}`).toBeCloseTo(perimeter[s], 11);
      expect(c[2 * s], `centroid x ${s}`).toBeCloseTo(centroid[s][0], 11);
      expect(c[2 * s + 1], `centroid y ${s}`).toBeCloseTo(centroid[s][1], 11);
    }
    expect(d.totalArea()).toBeCloseTo(80, 11);
    expect(d.totalPerimeter()).toBeCloseTo(36, 11);
    expect(Array.from(d.neighborCounts())).toEqual([2, 3, 2, 2, 3, 2]);
    // Site 4 at (3,5): right 5 (shared x = 5, y in [3,8], length 5), left 3 (x = 2, length 5), below 1 (y = 3, x in [2,5], length 3).
    const nb4 = d.cellNeighbors(4);
    expectCyclicSites(nb4.sites, [5, 3, 1], 'neighbours of 4, counter-clockwise');
    const len4 = neighborMap(d, 4);
    expect(len4.get(5)).toBeCloseTo(5, 11);
    expect(len4.get(3)).toBeCloseTo(5, 11);
    expect(len4.get(1)).toBeCloseTo(3, 11);
    // Site 1 at (3,1): right 2 (length 3), up 4 (length 3), left 0 (length 3).
    expectCyclicSites(d.cellNeighbors(1).sites, [2, 4, 0], 'neighbours of 1, counter-clockwise');
    for (const l of d.cellNeighbors(1).lengths) expect(l).toBeCloseTo(3, 11);
    // Rectangle corners are cocircular: (2,3) and (5,3) are vertices of degree 4.
    const deg = vertexDegrees(d);
    expect(deg.get('2,3')).toBe(4);
    expect(deg.get('5,3')).toBe(4);
    expect(d.cellNeighbors(0).sites).not.toContain(4);
  });

  it('a triangular region given clockwise', () => {
    // Triangle (0,0), (0,6), (6,0) listed clockwise; sites (1,1), (3,1); bisector x = 2.
    // Cell 0: (0,0), (2,0), (2,4), (0,6): area 10; cell 1: (2,0), (6,0), (2,4): area 8.
    const d = voronoi([[1, 1], [3, 1]], { clip: [[0, 0], [0, 6], [6, 0]] });
    expectValid(d);
    expectCycle(d.region, [[0, 0], [6, 0], [0, 6]], 'region, counter-clockwise');
    expectCycle(d.cellPolygon(0), [[0, 0], [2, 0], [2, 4], [0, 6]], 'cell 0');
    expectCycle(d.cellPolygon(1), [[2, 0], [6, 0], [2, 4]], 'cell 1');
    const a = d.cellAreas();
    expect(a[0]).toBeCloseTo(10, 12);
    expect(a[1]).toBeCloseTo(8, 12);
    const p = d.cellPerimeters();
    expect(p[0]).toBeCloseTo(12 + 2 * Math.SQRT2, 12);
    expect(p[1]).toBeCloseTo(8 + 4 * Math.SQRT2, 12);
    const c = d.cellCentroids();
    // Cell 0 = rectangle [0,2] x [0,4] (area 8, centroid (1,2)) + triangle (0,4),(2,4),(0,6) (area 2, centroid (2/3, 14/3)).
    expect(c[0]).toBeCloseTo(14 / 15, 12);
    expect(c[1]).toBeCloseTo(38 / 15, 12);
    expect(c[2]).toBeCloseTo(10 / 3, 12);
    expect(c[3]).toBeCloseTo(4 / 3, 12);
    expect(d.totalArea()).toBeCloseTo(18, 12);
    expect(d.totalPerimeter()).toBeCloseTo(12 + 6 * Math.SQRT2, 12);
    expect(neighborMap(d, 0).get(1)).toBeCloseTo(4, 12);
  });

  it('a hexagonal region given clockwise', () => {
    // Hexagon (2,0), (6,0), (8,3), (6,6), (2,6), (0,3), given in reverse (clockwise); area 24 + 2 * 6 = 36.
    // Sites (3,3), (5,3): bisector x = 4 splits it into mirror halves of area 18.
    const hex: [number, number][] = [[2, 0], [6, 0], [8, 3], [6, 6], [2, 6], [0, 3]];
    const d = voronoi([[3, 3], [5, 3]], { clip: hex.slice().reverse().flat() });
    expectValid(d);
    expectCycle(d.region, hex, 'region, counter-clockwise');
    expectCycle(d.cellPolygon(0), [[2, 0], [4, 0], [4, 6], [2, 6], [0, 3]], 'cell 0');
    expectCycle(d.cellPolygon(1), [[4, 0], [6, 0], [8, 3], [6, 6], [4, 6]], 'cell 1');
    for (const a of d.cellAreas()) expect(a).toBeCloseTo(18, 12);
    for (const p of d.cellPerimeters()) expect(p).toBeCloseTo(10 + 2 * Math.sqrt(13), 12);
    // Cell 0 = rectangle [2,4] x [0,6] (area 12, centroid (3,3)) + triangle (2,0),(2,6),(0,3) (area 6, centroid (4/3,3)).
    const c = d.cellCentroids();
    expect(c[0]).toBeCloseTo(22 / 9, 12);
    expect(c[1]).toBeCloseTo(3, 12);
    expect(c[2]).toBeCloseTo(50 / 9, 12);
    expect(c[3]).toBeCloseTo(3, 12);
    expect(d.totalArea()).toBeCloseTo(36, 12);
    expect(d.totalPerimeter()).toBeCloseTo(8 + 4 * Math.sqrt(13), 12);
  });

  it('a bisector lying on a region edge: the region belongs to the site on its side', () => {
    // Sites (0,0), (2,0): the bisector x = 1 is the left edge of [1,3] x [-1,1], which lies on site 1's side.
    const clip = { minX: 1, minY: -1, maxX: 3, maxY: 1 };
    const d = voronoi([[0, 0], [2, 0]], { clip });
    expectValid(d);
    expect(Array.from(d.sitesWithoutCell)).toEqual([0]);
    expect(Array.from(d.cellAreas()).map((v) => +v.toFixed(12))).toEqual([0, 4]);
    // The same with a third site far off the line (dimension 2).
    const e = voronoi([[0, 0], [2, 0], [1, 50]], { clip });
    expectValid(e);
    expect(Array.from(e.sitesWithoutCell)).toEqual([0, 2]);
    expect(Array.from(e.cellAreas()).map((v) => +v.toFixed(12))).toEqual([0, 4, 0]);
    // Mirrored: the bisector is the right edge of [-3,1] x [-1,1], on site 0's side.
    const f = voronoi([[0, 0], [2, 0], [1, 50]], { clip: { minX: -3, minY: -1, maxX: 1, maxY: 1 } });
    expect(Array.from(f.cellAreas()).map((v) => +v.toFixed(12))).toEqual([8, 0, 0]);
  });

  it('a sliver cell along a region edge is kept: its site has a cell of positive area', () => {
    // Sites (0,0), (100,0): bisector x = 50; region [0, 50 + w] x [0, 1] with w = 1e-11 (rounded).
    // Site 1's cell is the strip [50, 50 + w] x [0, 1], sharing the whole segment x = 50 (length 1) with cell 0.
    const maxX = 50.00000000001;
    const w = maxX - 50;
    const d = voronoi([[0, 0], [100, 0]], { clip: { minX: 0, minY: 0, maxX, maxY: 1 } });
    expectValid(d);
    expect(d.faceOfSite[1]).not.toBe(-1);
    expect(Math.abs(d.cellAreas()[1] - w)).toBeLessThan(1e-3 * w);
    expect(neighborMap(d, 1).get(0)).toBeCloseTo(1, 9);
  });

  it('every site outside the region: their cells still tile it (found by the property test)', () => {
    const clip = { minX: 1.5 - 7 * 0.2, maxX: 1.5 + 7 * 0.2, minY: -1.4, maxY: 1.4 };
    const d = voronoi([[4, 2], [6, -1], [8, 7], [3, -4], [-5, -7]], { clip });
    expectValid(d);
    expect(d.totalArea()).toBeCloseTo((clip.maxX - clip.minX) * 2.8, 12);
  });

  it('a region 1e-8 wide at 0.25 from the origin: boundary crossings stay on its sides (found by the property test)', () => {
    // Far ends of clipped bisectors used to sit about 1 unit away whatever the region's size, and their
    // rounding moved the crossings 17 ulps off the sides; the cells then over-covered the region by 5.5e-7 of
    // its area. With margins in units of the region's radius the sum is within one ulp of movement per side.
    const sites = [-0.25, -0.24999999805579992, -0.24999999972728143, -0.24999999348119945];
    const clip = [
      -0.24999999909837073, -0.24999999548573118, -0.24999999757282537, -0.24999999919944998,
      -0.24999999706111384, -0.24999999783169882,
    ];
    const d = voronoi(sites, { clip });
    expectValid(d);
    let sum = 0;
    for (const a of d.cellAreas()) sum += a;
    const r = d.region;
    const area = ((r[2] - r[0]) * (r[5] - r[1]) - (r[4] - r[0]) * (r[3] - r[1])) / 2;
    let perimeter = 0;
    for (let i = 0; i < 3; i++) perimeter += Math.hypot(r[(2 * i + 2) % 6] - r[2 * i], r[(2 * i + 3) % 6] - r[2 * i + 1]);
    const ulp = 2 ** -55; // of coordinates in [1/8, 1/4)
    expect(Math.abs(sum - area)).toBeLessThan(perimeter * ulp);
  });

  it('accepts an existing triangulation and keeps its numbering', () => {
    const d1 = voronoi([[1, 1], [3, 1], [2, 5]]);
    const d2 = voronoi(d1.triangulation);
    expect(d2.triangulation).toBe(d1.triangulation);
    expect(Array.from(d2.cellAreas())).toEqual(Array.from(d1.cellAreas()));
  });

  it('queries: nearest ties go to the smallest site index, kNearest orders by (distance, index)', () => {
    const d = voronoi([[0, 0], [2, 0], [2, 2], [0, 2]]);
    // (1,1) is equidistant from all four sites.
    expect(d.nearest(1, 1)).toBe(0);
    expect(Array.from(d.kNearest(1, 1, 4))).toEqual([0, 1, 2, 3]);
    // (2,1): sites 1 and 2 at distance 1, sites 0 and 3 at sqrt(5).
    expect(d.nearest(2, 1)).toBe(1);
    expect(Array.from(d.kNearest(2, 1, 3))).toEqual([1, 2, 0]);
    expect(Array.from(d.nearestMany([1, 1, 2, 1, 0.1, 1.9, 3, 3]))).toEqual([0, 1, 3, 2]);
    expect(d.cellAt(1.9, 0.1)).toBe(1);
  });
});

/** Runs fn, expecting an InputError; returns it for further checks. */
function inputError(fn: () => unknown): InputError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('expected an InputError, nothing was thrown');
}

describe('voronoi: bad clip regions', () => {
  const sites = [[1, 1], [3, 1], [2, 3]] as [number, number][];

  it('a polygon with fewer than 3 vertices', () => {
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [4, 0]] }));
    expect(e.code).toBe('clip-too-few');
    expect(e.field).toBe('clip');
    expect(e.message).toMatch(/3/);
  });

  it('a polygon whose closing vertex repeats the first leaves fewer than 3 vertices', () => {
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [4, 0], [0, 0]] }));
    expect(e.code).toBe('clip-too-few');
    expect(e.field).toBe('clip');
  });

  it('a repeated vertex', () => {
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [4, 0], [4, 0], [4, 4], [0, 4]] }));
    expect(e.code).toBe('clip-repeated');
    expect(e.field).toBe('clip');
    expect(e.index).toBe(2);
    expect(e.message).toMatch(/repeat/);
  });

  it('a non-finite polygon vertex', () => {
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [4, Number.NaN], [4, 4]] }));
    expect(e.code).toBe('not-finite');
    expect(e.field).toBe('clip');
    expect(e.index).toBe(1);
    expect(e.message).toMatch(/NaN/);
  });

  it('a non-finite rectangle bound', () => {
    const e = inputError(() => voronoi(sites, { clip: { minX: 0, minY: 0, maxX: Number.POSITIVE_INFINITY, maxY: 4 } }));
    expect(e.code).toBe('not-finite');
    expect(e.field).toBe('clip');
    expect(e.message).toMatch(/Infinity/);
  });

  it('a self-intersecting bow-tie', () => {
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [4, 4], [4, 0], [0, 4]] }));
    expect(e.code).toBe('clip-self-intersecting');
    expect(e.field).toBe('clip');
    expect(Number.isInteger(e.index) && e.index >= 0 && e.index < 4).toBe(true);
  });

  it('a pentagram (every turn the same way, winding twice)', () => {
    const star: [number, number][] = [];
    for (let i = 0; i < 5; i++) {
      const a = (2 * Math.PI * 2 * i) / 5;
      star.push([2 + 3 * Math.cos(a), 2 + 3 * Math.sin(a)]);
    }
    const e = inputError(() => voronoi(sites, { clip: star }));
    expect(e.code).toBe('clip-self-intersecting');
    expect(e.field).toBe('clip');
  });

  it('a non-convex L-shape', () => {
    // Counter-clockwise; the reflex corner is (2,2), vertex 3.
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [4, 0], [4, 2], [2, 2], [2, 4], [0, 4]] }));
    expect(e.code).toBe('clip-not-convex');
    expect(e.field).toBe('clip');
    expect(e.index).toBe(3);
    expect(e.message).toMatch(/convex/);
  });

  it('a non-convex dart', () => {
    // (0,0), (2,1), (4,0), (2,4): the reflex corner is (2,1), vertex 1.
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [2, 1], [4, 0], [2, 4]] }));
    expect(e.code).toBe('clip-not-convex');
    expect(e.field).toBe('clip');
    expect(e.index).toBe(1);
  });

  it('an empty rectangle (minX = maxX)', () => {
    const e = inputError(() => voronoi(sites, { clip: { minX: 2, minY: 0, maxX: 2, maxY: 4 } }));
    expect(e.code).toBe('clip-degenerate');
    expect(e.field).toBe('clip');
    expect(e.message).toMatch(/minX/);
  });

  it('an inverted rectangle (minY > maxY)', () => {
    const e = inputError(() => voronoi(sites, { clip: { minX: 0, minY: 4, maxX: 4, maxY: 0 } }));
    expect(e.code).toBe('clip-degenerate');
    expect(e.field).toBe('clip');
  });

  it('a polygon of collinear vertices (zero area)', () => {
    const e = inputError(() => voronoi(sites, { clip: [[0, 0], [1, 1], [3, 3]] }));
    expect(e.code).toBe('clip-degenerate');
    expect(e.field).toBe('clip');
  });
});

describe('voronoi: bad queries', () => {
  const d = voronoi([[1, 1], [3, 1], [2, 3]]);

  it('nearest with NaN', () => {
    const e = inputError(() => d.nearest(Number.NaN, 1));
    expect(e.code).toBe('not-finite');
    expect(e.field).toBe('x');
    expect(e.message).toMatch(/NaN/);
  });

  it('cellAt with NaN', () => {
    const e = inputError(() => d.cellAt(1, Number.NaN));
    expect(e.code).toBe('not-finite');
    expect(e.field).toBe('y');
  });

  it('nearestMany with NaN names the query', () => {
    const e = inputError(() => d.nearestMany([0, 0, 1, Number.NaN]));
    expect(e.code).toBe('not-finite');
    expect(e.field).toBe('y');
    expect(e.index).toBe(1);
    expect(e.message).toMatch(/1/);
  });

  it('kNearest with NaN', () => {
    const e = inputError(() => d.kNearest(Number.NaN, 0, 1));
    expect(e.code).toBe('not-finite');
    expect(e.field).toBe('x');
  });

  it('kNearest with k below 1', () => {
    const e = inputError(() => d.kNearest(0, 0, 0));
    expect(e.field).toBe('k');
    expect(typeof e.code).toBe('string');
    expect(e.message).toMatch(/k = 0/);
  });

  it('kNearest with k above the number of sites', () => {
    const e = inputError(() => d.kNearest(0, 0, 4));
    expect(e.field).toBe('k');
    expect(e.code).toBe(inputError(() => d.kNearest(0, 0, 0)).code);
    expect(e.message).toMatch(/3/);
  });

  it('kNearest with a fractional k', () => {
    const e = inputError(() => d.kNearest(0, 0, 1.5));
    expect(e.field).toBe('k');
  });

  it('a single query names its coordinate without a made-up index', () => {
    // A single query has no position in a list; the message should not number it.
    const e = inputError(() => d.nearest(0, Number.POSITIVE_INFINITY));
    expect(e.message).toMatch(/y/);
    expect(e.message).not.toMatch(/-1/);
  });
});

describe('voronoi: the precision limit', () => {
  it('refuses sites too close for their boundary to be placed, naming them', () => {
    // At 1e7 one ulp is about 1.9e-9: sites 1 ulp apart cannot have a boundary placed between them.
    const x = 1e7;
    const near = x + 2 ** -29; // the next double above 1e7 (ulp(1e7) = 2^-29)
    let err: unknown;
    try { voronoi([[x, x], [near, x], [x + 5, x + 7]]); } catch (e) { err = e; }
    expect(err).toBeInstanceOf(InputError);
    expect((err as InputError).code).toBe('too-close');
    expect((err as InputError).message).toMatch(/sites 0 and 1/);
    // The same pattern a million times wider is fine.
    const d = voronoi([[x, x], [x + 2 ** -9, x], [x + 5, x + 7]]);
    expect(checkMesh(d.mesh).ok).toBe(true);
  });
});
