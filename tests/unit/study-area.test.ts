import { describe, expect, it } from 'vitest';
import {
  AreaInputError, clipToStudyArea, InputError, studyAreaBounds, voronoi, type StudyAreaCells,
} from '../../src/index.js';
import { holders, shoelace, signedArea, type Ring } from '../support/study-area-brute.js';

const BOX = { minX: 0, minY: 0, maxX: 4, maxY: 4 };
const SQUARE: Ring = [[0, 0], [4, 0], [4, 4], [0, 4]];
const CORNERS: [number, number][] = [[1, 1], [3, 1], [3, 3], [1, 3]];

function rev(r: Ring): Ring { return r.slice().reverse(); }

function thrown(f: () => unknown): AreaInputError {
  try { f(); } catch (err) { return err as AreaInputError; }
  throw new Error('expected an error');
}

/** Sutherland–Hodgman (1974) clip of a polygon by a convex counter-clockwise one: an independent reference for convex cases. */
function convexClip(subject: Ring, clip: Ring): Ring {
  let out = subject;
  for (let i = 0; i < clip.length && out.length; i++) {
    const [ax, ay] = clip[i], [bx, by] = clip[(i + 1) % clip.length];
    const side = ([x, y]: [number, number]): number => (bx - ax) * (y - ay) - (by - ay) * (x - ax);
    const input = out;
    out = [];
    for (let j = 0; j < input.length; j++) {
      const p = input[j], q = input[(j + 1) % input.length], sp = side(p), sq = side(q);
      if (sp >= 0) out.push(p);
      if ((sp > 0 && sq < 0) || (sp < 0 && sq > 0)) {
        const t = sp / (sp - sq);
        out.push([p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])]);
      }
    }
  }
  return out;
}

const ringOf = (flat: Float64Array): Ring => Array.from({ length: flat.length >> 1 }, (_, i): [number, number] => [flat[2 * i], flat[2 * i + 1]]);

describe('clipToStudyArea: worked examples', () => {
  // Outside check: the Thiessen areal-weighting method of hydrology. A square catchment with a
  // square lake in the middle and four rain gauges placed symmetrically: the symmetry group of
  // the square maps every gauge's area onto every other's, so each weight is exactly 1/4, and the
  // catchment's area is 16 - 1 = 15 by the shoelace formula.
  const hole: Ring = [[1.5, 1.5], [2.5, 1.5], [2.5, 2.5], [1.5, 2.5]];
  for (const [name, shell, lake] of [['ccw/ccw', SQUARE, hole], ['cw/cw', rev(SQUARE), rev(hole)], ['ccw/cw', SQUARE, rev(hole)], ['cw/ccw', rev(SQUARE), hole]] as const) {
    it(`symmetric catchment, rings ${name}: shares 1/4, areas 15/4, weighted mean of gauge values`, () => {
      const d = voronoi(CORNERS, { clip: BOX });
      const c = clipToStudyArea(d, [shell, lake]);
      expect(c.studyAreaSize).toBe(15);
      expect(Array.from(c.clippedAreas())).toEqual([3.75, 3.75, 3.75, 3.75]);
      expect(Array.from(c.areaShares())).toEqual([0.25, 0.25, 0.25, 0.25]);
      expect(c.weightedMean([10, 20, 30, 40])).toBe(25);
      // Each gauge's piece: the quadrant minus a quarter of the lake; centroid (4·1 − 0.25·1.75) / 3.75 = 0.95 from the corner.
      expect(Array.from(c.clippedCentroids()).map((v) => Math.round(v * 1e12) / 1e12)).toEqual([0.95, 0.95, 3.05, 0.95, 3.05, 3.05, 0.95, 3.05]);
      for (let s = 0; s < 4; s++) {
        const ps = c.pieces(s);
        expect(ps.length).toBe(1);
        expect(ps[0].holes.length).toBe(0);
        expect(signedArea(ps[0].outer)).toBe(3.75);
      }
      expect(c.pieceAt(2, 2)).toBe(-1); // in the lake
      expect(c.pieceAt(0.5, 3.9)).toBe(3);
      expect(c.pieceAt(5, 1)).toBe(-1);
    });
  }

  it('reads every ring layout, closing vertices, and an array of polygons', () => {
    const d = voronoi(CORNERS, { clip: BOX });
    const flat = [0, 0, 4, 0, 4, 4, 0, 4, 0, 0];
    const objects = [{ x: 1.5, y: 1.5 }, { x: 2.5, y: 1.5 }, { x: 2.5, y: 2.5 }, { x: 1.5, y: 2.5 }];
    for (const area of [[flat, objects], [[Float64Array.from(flat), objects]], [[...SQUARE, [0, 0]], objects]]) {
      expect(clipToStudyArea(d, area as never).totalArea()).toBe(15);
    }
    // A ring alone is a polygon without holes; two polygons, one an island in the other's lake.
    expect(clipToStudyArea(d, SQUARE).totalArea()).toBe(16);
    const island: Ring = [[1.75, 1.75], [2.25, 1.75], [2.25, 2.25], [1.75, 2.25]];
    const c = clipToStudyArea(d, [[SQUARE, [[1.5, 1.5], [2.5, 1.5], [2.5, 2.5], [1.5, 2.5]]], [island]]);
    expect(c.totalArea()).toBe(15.25);
    expect(Array.from(c.areaShares())).toEqual([0.25, 0.25, 0.25, 0.25]);
    expect(c.pieceAt(2.1, 2.1)).toBe(2);
    expect(c.pieceAt(1.6, 1.6)).toBe(-1);
  });

  it('cuts a cell in two along a hole and keeps both pieces with their site', () => {
    // Cells: x < 1.5, 1.5 < x < 2.5, x > 2.5. The hole crosses the middle cell from side to side.
    const d = voronoi([[1, 2], [2, 2], [3, 2]], { clip: BOX });
    const c = clipToStudyArea(d, [SQUARE, [[1, 1.5], [3, 1.5], [3, 2.5], [1, 2.5]]]);
    expect(c.pieces(1).map((p) => p.area).sort()).toEqual([1.5, 1.5]);
    expect(Array.from(c.pieceSite)).toEqual([0, 1, 1, 2]);
    expect(Array.from(c.clippedAreas())).toEqual([5.5, 3, 5.5]);
    expect(c.pieceAt(2, 3)).toBe(1);
    expect(c.pieceAt(2, 1)).toBe(1);
    expect(c.pieceAt(2, 2)).toBe(-1);
    expect(c.pieceAt(2, 2.5)).toBe(1); // on the hole's edge: inside the closed study area
    expect(Array.from(c.sitesWithoutPiece)).toEqual([]);
  });

  it('a hole with a corner on a cell vertex and sides along cell edges', () => {
    const d = voronoi(CORNERS, { clip: BOX });
    const c = clipToStudyArea(d, [SQUARE, [[2, 2], [3, 2], [3, 3], [2, 3]]]);
    expect(Array.from(c.clippedAreas())).toEqual([4, 4, 3, 4]);
    const [piece] = c.pieces(2);
    expect(piece.holes.length).toBe(0); // an L shape: the hole opens onto the cell's boundary
    expect(shoelace(ringOf(piece.outer))).toBe(3);
  });

  it('a hole touching a cell vertex at one corner only', () => {
    const d = voronoi(CORNERS, { clip: BOX });
    const diamond: Ring = [[2, 2], [3, 2.5], [3.5, 3.5], [2.5, 3]];
    const c = clipToStudyArea(d, [SQUARE, diamond]);
    const want = 4 - shoelace(diamond);
    expect(c.clippedAreas()[2]).toBeCloseTo(want, 14);
    expect(c.totalArea()).toBeCloseTo(16 - shoelace(diamond), 14);
    for (const [x, y, s] of [[2.8, 2.8, -1], [2.1, 2.01, 2], [2.01, 2.1, 2], [1.99, 1.99, 0]] as const) {
      expect(c.pieceAt(x, y)).toBe(s);
      expect(holders(c, x, y).sites).toEqual(s < 0 ? [] : [s]);
    }
  });

  it('a shell vertex on a site, against an independent convex clip', () => {
    const d = voronoi(CORNERS, { clip: BOX });
    const shell: Ring = [[1, 1], [3.9, 0.5], [3.5, 3.5], [0.5, 3.8]];
    const c = clipToStudyArea(d, rev(shell));
    const quadrants: Ring[] = [[[0, 0], [2, 0], [2, 2], [0, 2]], [[2, 0], [4, 0], [4, 2], [2, 2]], [[2, 2], [4, 2], [4, 4], [2, 4]], [[0, 2], [2, 2], [2, 4], [0, 4]]];
    const got = c.clippedAreas();
    quadrants.forEach((q, s) => expect(got[s]).toBeCloseTo(shoelace(convexClip(shell, q)), 13));
    expect(c.pieceAt(1, 1)).toBe(0);
    expect(Math.abs(c.totalArea() - shoelace(shell))).toBeLessThanOrEqual(1e-14 * 16);
  });

  it('reports sites without a piece, and works on metric diagrams', () => {
    const d = voronoi([[1, 1], [3, 3], [0.5, 3.5]], { clip: BOX, metric: 'L1' });
    const small: Ring = [[2.5, 2.5], [3.5, 2.5], [3.5, 3.5], [2.5, 3.5]];
    const c = clipToStudyArea(d, small);
    expect(Array.from(c.sitesWithoutPiece)).toEqual([0, 2]);
    expect(Array.from(c.areaShares())).toEqual([0, 1, 0]);
    expect(c.pieces(0)).toEqual([]);
    expect(Number.isNaN(c.clippedCentroids()[0])).toBe(true);
    // L1, two sites on a diagonal: the tie region is split along the Euclidean bisector, so a
    // square centred on the midpoint is cut into two mirror halves.
    const diag = voronoi([[1, 1], [3, 3]], { clip: BOX, metric: 'L1' });
    expect(Array.from(clipToStudyArea(diag, [[1, 1], [3, 1], [3, 3], [1, 3]]).areaShares())).toEqual([0.5, 0.5]);
  });

  it('a whole multipolygon inside one cell: an island with a lake of its own, in a lake', () => {
    const sq = (a: number, b: number): Ring => [[a, a], [b, a], [b, b], [a, b]];
    const c = clipToStudyArea(voronoi([[4, 4]], { clip: { minX: 0, minY: 0, maxX: 8, maxY: 8 } }), [[sq(0, 8), sq(1, 7)], [rev(sq(2, 6)), sq(3, 5)]]);
    expect(c.totalArea()).toBe(64 - 36 + 16 - 4);
    expect(c.pieces(0).map((p) => [p.area, p.holes.length]).sort()).toEqual([[12, 1], [28, 1]]);
    for (const [x, y, s] of [[4, 4, -1], [2.5, 2.5, 0], [1.5, 1.5, -1], [0.5, 0.5, 0]] as const) {
      expect(c.pieceAt(x, y)).toBe(s);
      expect(holders(c, x, y).sites).toEqual(s < 0 ? [] : [s]);
    }
  });

  it('studyAreaBounds gives a clip box that holds the area', () => {
    const area = [[[1, 1], [5, 2], [3, 6]]];
    expect(studyAreaBounds(area)).toEqual({ minX: 1, minY: 1, maxX: 5, maxY: 6 });
    const c: StudyAreaCells = clipToStudyArea(voronoi([[2, 2], [4, 3]], { clip: studyAreaBounds(area) }), area);
    expect(c.totalArea()).toBeCloseTo(9, 14);
  });
});

describe('clipToStudyArea: cases found by the property test', () => {
  // Grid sites under L1 / L-infinity: several sites tie at one cell vertex, whose rounded copies
  // sit an ulp apart (a spike or a crossing below what doubles can draw), and the shell passes
  // exactly through one of them. Found by tests/property/study-area.property.test.ts.
  const REGION = { minX: -0.25, minY: -0.25, maxX: 1.25, maxY: 1.25 };
  const found: [string, 'L1' | 'Linf', [number, number][], Ring][] = [
    ['a spike in an L1 cell at a shell vertex', 'L1', [[0.6, 0.2], [0.4, 0], [1, 0], [0.2, 0.2], [0, 0]],
      [[0.4, 0.19999999999999998], [0.4000000001263476, 0.19999999937904278], [0.6426433577217903, 0.302092913136341], [0.6626370772719383, 0.5], [0.5261141541693317, 0.7425538981031368], [0.2616351473581209, 0.5519282154326695]]],
    ['two crossings an ulp apart on one cell edge', 'Linf', [[1, 0.2], [0.6, 0.6], [0.6, 0.2], [0, 0]],
      [[0.19999999999999998, 0.39999999999999997], [0.49999999999999994, 0.2628291748464108], [0.8, 0.3999999999999999], [0.6581138834357262, 0.5], [0.5959174980921178, 0.7169097366735365], [0.34041179011364275, 0.6754468682231245]]],
    ['a sliver where three rounded vertices nearly meet', 'Linf', [[0.4, 0.4], [0.6, 0.8], [1, 0.4], [0.2, 0.6]],
      [[0.625, 0.5], [0.6249986727743005, 0.5005760248808322], [0.5713538188452718, 0.6733922793442549], [0.4, 0.6000000000000002], [0.3376202367904177, 0.4062500000000001], [0.5485285709567226, 0.3188889075707997]]],
  ];
  for (const [what, metric, sites, shell] of found) {
    it(what, () => {
      const d = voronoi(sites, { clip: REGION, metric });
      const mv = new Set<string>();
      for (let i = 0; i < d.mesh.vertexXY.length; i += 2) mv.add(`${d.mesh.vertexXY[i]},${d.mesh.vertexXY[i + 1]}`);
      expect(shell.some(([x, y]) => mv.has(`${x},${y}`))).toBe(true); // still the degenerate case
      const c = clipToStudyArea(d, [shell]);
      // 1e-9 relative: the tolerance.
      expect(Math.abs(c.totalArea() - shoelace(shell))).toBeLessThanOrEqual(1e-9 * shoelace(shell));
      for (let s = 0; s < c.siteCount; s++) for (const p of c.pieces(s)) expect(p.area).toBeGreaterThan(0);
    });
  }
});

describe('clipToStudyArea: bad input', () => {
  const d = voronoi(CORNERS, { clip: BOX });
  const cases: [string, unknown, string, number, number, number][] = [
    // [what, area, code, polygon, ring, vertex]
    ['too few vertices', [SQUARE, [[1, 1], [2, 2], [1, 1], [1, 1]]], 'area-too-few', 0, 1, -1],
    ['a bow tie', [[[0, 0], [2, 2], [2, 0], [0, 2]]], 'area-self-intersecting', 0, 0, 2],
    ['a ring doubling back', [[[0, 0], [2, 0], [1, 0], [1, 1]]], 'area-self-intersecting', 0, 0, 1],
    ['a ring touching itself', [[[0, 0], [3, 0], [3, 3], [1.5, 0], [0, 3]]], 'area-self-intersecting', 0, 0, 3],
    ['a hole outside its shell', [[[0, 0], [2, 0], [2, 2], [0, 2]], [[3, 3], [3.5, 3], [3.5, 3.5]]], 'area-hole-outside', 0, 1, 0],
    ['a hole inside a hole', [SQUARE, [[1, 1], [3, 1], [3, 3], [1, 3]], [[1.5, 1.5], [2, 1.5], [2, 2]]], 'area-hole-outside', 0, 2, 0],
    ['a hole crossing its shell', [[[0, 0], [2, 0], [2, 2], [0, 2]], [[1, 1], [3, 1], [3, 1.5]]], 'area-rings-cross', 0, 1, 0],
    ['overlapping polygons', [[SQUARE], [[[1, 1], [2, 1], [2, 2]]]], 'area-overlap', 1, 0, 0],
    ['a vertex outside the region', [[[0, 0], [5, 0], [4, 4]]], 'area-outside-region', 0, 0, 1],
    ['a NaN in a hole', [SQUARE, [[1, 1], [2, NaN], [2, 2]]], 'not-finite', 0, 1, 1],
  ];
  for (const [what, area, code, polygon, ring, vertex] of cases) {
    it(`${what}: ${code} naming polygon ${polygon}, ring ${ring}, vertex ${vertex}`, () => {
      const err = thrown(() => clipToStudyArea(d, area as never));
      expect(err).toBeInstanceOf(AreaInputError);
      expect(err).toBeInstanceOf(InputError);
      expect([err.code, err.polygon, err.ring, err.index, err.field]).toEqual([code, polygon, ring, vertex, 'area']);
      expect(err.message).toContain(`polygon ${polygon}, ring ${ring}`);
    });
  }

  it('a shell vertex touching a hole edge names both rings (found through the command line)', () => {
    const err = thrown(() => clipToStudyArea(d, [[[0, 0], [2, 1.5], [4, 0], [4, 4], [0, 4]], [[1, 1.5], [1, 3], [3, 3], [3, 1.5]]] as never));
    expect([err.code, err.polygon, err.ring, err.index]).toEqual(['area-rings-cross', 0, 0, 1]);
    expect(err.message).toMatch(/edge 0–1 of polygon 0, ring 0 and edge 3–0 of polygon 0, ring 1 cross or touch/);
  });

  it('input that is not a polygon', () => {
    for (const bad of [null, 3, [], [[]], 'square']) {
      const err = thrown(() => clipToStudyArea(d, bad as never));
      expect(err).toBeInstanceOf(InputError);
      expect([err.code, err.field]).toEqual(['bad-area', 'area']);
    }
  });

  it('values of the wrong length or not finite, naming the field', () => {
    const c = clipToStudyArea(d, SQUARE);
    const err = (v: unknown): InputError => thrown(() => c.weightedMean(v as never));
    expect([err([1, 2, 3]).code, err([1, 2, 3]).field]).toEqual(['bad-length', 'values']);
    expect([err([1, 2, NaN, 4]).code, err([1, 2, NaN, 4]).index]).toEqual(['not-finite', 2]);
    expect(err([1, '2', 3, 4]).code).toBe('not-a-number');
    expect(thrown(() => c.pieceAt(NaN, 1)).code).toBe('not-finite');
  });
});
