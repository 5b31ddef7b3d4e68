import { describe, expect, it } from 'vitest';
import {
  checkMesh, comparePowerDistance, inCircle, InputError, MAX_WEIGHT, powerTest, triangulate, voronoi, writeTriangulationJSON,
} from '../../src/index.js';

function inputError(fn: () => unknown): InputError {
  try {
    fn();
  } catch (err) {
    if (err instanceof InputError) return err;
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('powerTest (the weighted in-circle test)', () => {
  it('has the sign of inCircle when every weight is zero', () => {
    const cases = [
      [0, 0, 1, 0, 0, 1, 0.25, 0.25], [0, 0, 1, 0, 0, 1, 2, 2], [0, 0, 1, 0, 0, 1, 1, 1], [3, 1, 5, 4, -2, 7, 1.5, 3.2],
    ];
    for (const [ax, ay, bx, by, cx, cy, dx, dy] of cases) {
      expect(Math.sign(powerTest(ax, ay, 0, bx, by, 0, cx, cy, 0, dx, dy, 0)))
        .toBe(Math.sign(inCircle(ax, ay, bx, by, cx, cy, dx, dy)));
    }
  });

  it('follows the lifting map on a worked example', () => {
    // Worked by hand: a = (0,0), b = (1,0), c = (0,1) unweighted lift to heights 0, 1, 1, the plane z = x + y,
    // which is 0.5 over d = (0.25, 0.25); d lifts to 0.125 - w. Below the plane (conflict, > 0) iff w > -0.375.
    const at = (w: number) => powerTest(0, 0, 0, 1, 0, 0, 0, 1, 0, 0.25, 0.25, w);
    expect(at(0)).toBeGreaterThan(0);
    expect(at(-0.375)).toBe(0);
    expect(at(-1)).toBeLessThan(0);
    // Counter-clockwise order matters: the same triangle clockwise flips the sign.
    expect(powerTest(0, 0, 0, 0, 1, 0, 1, 0, 0, 0.25, 0.25, 0)).toBeLessThan(0);
  });

  it('is exact where the lift rounds: a weight one ulp either side of coplanar', () => {
    // Lattice points of x^2 + y^2 = 25 are exactly cocircular; a fourth weight of +-1 ulp tips it.
    const base = [3, 4, 0, -3, 4, 0, -5, 0, 0] as const;
    expect(powerTest(...base, 4, -3, 0)).toBe(0);
    expect(powerTest(...base, 4, -3, 2 ** -1074)).toBeGreaterThan(0);
    expect(powerTest(...base, 4, -3, -(2 ** -1074))).toBeLessThan(0);
  });

  it('compares power distances exactly, ties included', () => {
    // |q-a|^2 - wa against |q-b|^2 - wb at q = (1.25, 0), a = (0,0,1), b = (2,0,0): 0.5625 against 0.5625.
    expect(comparePowerDistance(1.25, 0, 0, 0, 1, 2, 0, 0)).toBe(0);
    expect(comparePowerDistance(1.2, 0, 0, 0, 1, 2, 0, 0)).toBeLessThan(0);
    expect(comparePowerDistance(1.3, 0, 0, 0, 1, 2, 0, 0)).toBeGreaterThan(0);
  });
});

describe('triangulate with weights', () => {
  it('hides a site whose lifted point is on or above its neighbours\' plane, and reports it', () => {
    // Square corners lift to 0, 4, 8, 4: the plane z = 2x + 2y, 4 over the centre (1, 1), which lifts to 2 - w.
    const corners: [number, number][] = [[0, 0], [2, 0], [2, 2], [0, 2]];
    const build = (w: number) => triangulate([...corners, [1, 1]], { weights: [0, 0, 0, 0, w] });
    expect(build(0).triangleCount).toBe(4);
    expect(Array.from(build(0).hiddenSites)).toEqual([]);
    expect(Array.from(build(-2).hiddenSites)).toEqual([4]); // on the plane: no area of its own
    const hidden = build(-3);
    expect(Array.from(hidden.hiddenSites)).toEqual([4]);
    expect(hidden.triangleCount).toBe(2);
    expect(checkMesh(hidden.toMesh(), { weights: hidden.weights!, delaunay: 'global' }).ok).toBe(true);
  });

  it('lets a heavy site hide lighter ones around it, removing them after they were inserted', () => {
    const pts: [number, number, number][] = [];
    for (let i = 0; i < 8; i++) for (let j = 0; j < 8; j++) pts.push([i, j, 0]);
    pts.push([3.5, 3.5, 6]);
    const tri = triangulate(pts);
    expect(tri.hiddenSites.length).toBeGreaterThan(0);
    expect(checkMesh(tri.toMesh(), { weights: tri.weights!, delaunay: 'global' }).ok).toBe(true);
    // Every hidden site lifts on or above the plane of the triangle holding it (the global check says so too).
    expect(tri.hiddenSites).not.toContain(64);
  });

  it('keeps the largest weight when duplicates are merged', () => {
    const tri = triangulate([[0, 0], [1, 0], [0, 1], [1, 0]], { weights: [0, 0.5, 0, 2] });
    expect(tri.siteCount).toBe(3);
    expect(Array.from(tri.weights!)).toEqual([0, 2, 0]);
  });

  it('hides the middle of three collinear sites by the one-dimensional lower hull', () => {
    // Lifts 0, 1 - w, 4 over x = 0, 1, 2: the chord is 2 at x = 1, so the middle hides iff 1 - w >= 2.
    expect(Array.from(triangulate([[0, 0], [1, 0], [2, 0]], { weights: [0, -1, 0] }).hiddenSites)).toEqual([1]);
    expect(Array.from(triangulate([[0, 0], [1, 0], [2, 0]], { weights: [0, -0.5, 0] }).hiddenSites)).toEqual([]);
  });

  it('reads weights from [x, y, w] triples and {x, y, w} objects as from the option', () => {
    const a = triangulate([[0, 0, 1], [3, 0, 0], [0, 3, 2], [1, 1, 0]]);
    const b = triangulate([{ x: 0, y: 0, w: 1 }, { x: 3, y: 0, w: 0 }, { x: 0, y: 3, w: 2 }, { x: 1, y: 1, w: 0 }]);
    const c = triangulate([0, 0, 3, 0, 0, 3, 1, 1], { weights: [1, 0, 2, 0] });
    expect(Array.from(b.triangleSites)).toEqual(Array.from(a.triangleSites));
    expect(Array.from(c.triangleSites)).toEqual(Array.from(a.triangleSites));
    expect(Array.from(c.weights!)).toEqual([1, 0, 2, 0]);
  });

  it('rejects bad weights with a typed error naming the point', () => {
    const pts: [number, number][] = [[0, 0], [1, 0], [0, 1]];
    expect(inputError(() => triangulate(pts, { weights: [0, NaN, 0] }))).toMatchObject({ code: 'not-finite', index: 1, field: 'w' });
    expect(inputError(() => triangulate(pts, { weights: [0, 0, Infinity] }))).toMatchObject({ code: 'not-finite', index: 2 });
    expect(inputError(() => triangulate(pts, { weights: [0, 0] }))).toMatchObject({ code: 'bad-option', field: 'weights' });
    expect(inputError(() => triangulate(pts, { weights: [0, 2 * MAX_WEIGHT, 0] }))).toMatchObject({ code: 'out-of-range', index: 1 });
    expect(inputError(() => triangulate(pts, { weights: [0, '1' as unknown as number, 0] }))).toMatchObject({ code: 'not-a-number', index: 1 });
    expect(inputError(() => triangulate([[0, 0, 1], [1, 0, 1], [0, 1, 1]], { weights: [1, 1, 1] }))).toMatchObject({ code: 'bad-option' });
    expect(inputError(() => triangulate([[0, 0, 1], [1, 0], [0, 1, 1]] as unknown as [number, number][]))).toMatchObject({ code: 'bad-point', index: 1, field: 'w' });
    expect(inputError(() => triangulate(pts, { weights: [1, 2, 3] }).insert([[5, 5]]))).toMatchObject({ code: 'bad-option' });
  });
});

describe('power diagrams', () => {
  it('puts the boundary of two sites at the radical line (worked example)', () => {
    // |x - (0,0)|^2 - 1 = |x - (2,0)|^2  =>  x = 1.25.  Clip [-1, 3] x [-1, 1]: areas 2.25 * 2 and 1.75 * 2.
    const d = voronoi([[0, 0], [2, 0]], { weights: [1, 0], clip: { minX: -1, minY: -1, maxX: 3, maxY: 1 } });
    expect(checkMesh(d.mesh).ok).toBe(true);
    // Positions are floating point (crossings with the region round): to 1e-12.
    const areas = d.cellAreas();
    expect(areas[0]).toBeCloseTo(4.5, 12);
    expect(areas[1]).toBeCloseTo(3.5, 12);
    expect(d.nearest(1.2, 0)).toBe(0);
    expect(d.nearest(1.3, 0)).toBe(1);
    expect(d.nearest(1.25, 0)).toBe(0); // an exact tie: the smaller index
  });

  it('gives a hidden site no cell, lists it, and never answers it as nearest', () => {
    const d = voronoi([[0, 0], [2, 0], [2, 2], [0, 2], [1, 1]], { weights: [0, 0, 0, 0, -3] });
    expect(d.faceOfSite[4]).toBe(-1);
    expect(Array.from(d.sitesWithoutCell)).toContain(4);
    expect(d.nearest(1, 1)).not.toBe(4);
    // kNearest ranks every site by power distance, hidden ones too: at (1,1) the corners have 2, the centre 3.
    expect(Array.from(d.kNearest(1, 1, 5))).toEqual([0, 1, 2, 3, 4]);
  });

  it('with equal weights is the Voronoi diagram', () => {
    const pts: [number, number][] = [[0, 0], [3, 1], [1, 4], [5, 5], [2, 2]];
    const plain = voronoi(pts), equal = voronoi(pts, { weights: [7, 7, 7, 7, 7] });
    expect(Array.from(equal.mesh.vertexXY)).toEqual(Array.from(plain.mesh.vertexXY));
    expect(Array.from(equal.cellAreas())).toEqual(Array.from(plain.cellAreas()));
  });

  it('refuses weights with other metrics or the sweep, and weights beside a triangulation', () => {
    const pts: [number, number][] = [[0, 0], [1, 0], [0, 1]];
    expect(inputError(() => voronoi(pts, { weights: [0, 1, 0], metric: 'L1' }))).toMatchObject({ code: 'bad-option', field: 'weights' });
    expect(inputError(() => voronoi(pts, { weights: [0, 1, 0], method: 'sweep' }))).toMatchObject({ code: 'bad-option', field: 'weights' });
    expect(inputError(() => voronoi(triangulate(pts), { weights: [0, 1, 0] }))).toMatchObject({ code: 'bad-option', field: 'weights' });
  });

  it('refuses a cell too thin to draw rather than drawing it wrong', () => {
    // Three sites a hair off one line, the middle one just light enough to keep a sliver of area (about 1e-16).
    const err = inputError(() => voronoi([2, -1, 0, -1, 1, -1.0000000000000002], { weights: [1, 1, 0] }));
    expect(err.code).toBe('too-thin');
    expect(err.field).toBe('weights');
  });
});

describe('weighted triangulations and JSON', () => {
  it('refuses to write a weighted triangulation rather than drop its weights', () => {
    const tri = triangulate([[0, 0, 1], [1, 0, 0], [0, 1, 0]]);
    expect(inputError(() => writeTriangulationJSON(tri))).toMatchObject({ code: 'bad-option', field: 'weights' });
  });
});
