import { describe, it, expect } from 'vitest';
import { AmbitError } from '../../src/core/errors.js';
import { assertMesh, checkMesh, MAX_MESH_PROBLEMS } from '../../src/mesh/check.js';
import { meshFromCycles } from '../support/meshes.js';
import { HalfEdgeMesh, type MeshArrays, type MeshKind } from '../../src/mesh/mesh.js';

// Invented coordinates throughout; every expectation below is worked out by
// hand in the comment beside it.


type Field = Exclude<keyof MeshArrays, 'kind' | 'outerFace'>;

/** A copy of the mesh with one array entry replaced. */
function mutate(mesh: HalfEdgeMesh, field: Field, index: number, value: number): HalfEdgeMesh {
  const copy = (mesh[field] as Int32Array | Float64Array).slice();
  copy[index] = value;
  return new HalfEdgeMesh({ ...fields(mesh), [field]: copy });
}

function fields(mesh: HalfEdgeMesh): MeshArrays {
  return {
    kind: mesh.kind, vertexXY: mesh.vertexXY, origin: mesh.origin, twin: mesh.twin, next: mesh.next,
    face: mesh.face, faceEdge: mesh.faceEdge, faceSite: mesh.faceSite, outerFace: mesh.outerFace,
  };
}

function with_(mesh: HalfEdgeMesh, change: Partial<MeshArrays>): HalfEdgeMesh {
  return new HalfEdgeMesh({ ...fields(mesh), ...change });
}

function problemsOf(mesh: HalfEdgeMesh, options = {}): string {
  const r = checkMesh(mesh, options);
  expect(r.ok).toBe(false);
  return r.problems.join('\n');
}

// Triangle A(0,0) B(1,0) C(0,1): counter-clockwise as listed.
const TRI_XY = [0, 0, 1, 0, 0, 1];
const triangle = (kind: MeshKind = 'delaunay') => meshFromCycles(kind, TRI_XY, [[0, 1, 2], [0, 2, 1]]);

// Rhombus P0(0,0) P1(2,-1) P2(4,0) P3(2,1). Circle through P0,P1,P3 has centre
// (1.25,0), radius 1.25, so P2 at distance 2.75 is outside: the short
// diagonal P1-P3 is Delaunay. Circle through P0,P1,P2 has centre (2,1.5),
// radius 2.5, and P3 at distance 0.5 is inside: the long diagonal P0-P2 is not.
const RHOMBUS_XY = [0, 0, 2, -1, 4, 0, 2, 1];
const rhombusGood = () => meshFromCycles('delaunay', RHOMBUS_XY, [[0, 1, 3], [1, 2, 3], [0, 3, 2, 1]]);
const rhombusBad = () => meshFromCycles('delaunay', RHOMBUS_XY, [[0, 1, 2], [0, 2, 3], [0, 3, 2, 1]]);

// Unit square: its four corners are cocircular, so either diagonal is
// Delaunay (the fourth corner lies ON the circle, not strictly inside).
const SQUARE_XY = [0, 0, 1, 0, 1, 1, 0, 1];
const squareA = () => meshFromCycles('delaunay', SQUARE_XY, [[0, 1, 2], [0, 2, 3], [0, 3, 2, 1]]);
const squareB = () => meshFromCycles('delaunay', SQUARE_XY, [[0, 1, 3], [1, 2, 3], [0, 3, 2, 1]]);

// Three collinear sites on y = x, listed out of line order on purpose:
// v0 (0,0), v1 (2,2), v2 (1,1). The path runs v0 - v2 - v1.
const PATH_XY = [0, 0, 2, 2, 1, 1];
const path = () => meshFromCycles('delaunay', PATH_XY, [[0, 2, 1, 2]]);

// One site, no edges, one face with faceEdge -1.
const single = () => new HalfEdgeMesh({
  kind: 'delaunay', vertexXY: Float64Array.of(3, 4), origin: new Int32Array(0), twin: new Int32Array(0),
  next: new Int32Array(0), face: new Int32Array(0), faceEdge: Int32Array.of(-1), faceSite: Int32Array.of(-1), outerFace: 0,
});

// Triangle (0,0) (4,0) (0,4) with an interior vertex (1,1): three triangles.
const FAN_XY = [0, 0, 4, 0, 0, 4, 1, 1];
const fan = () => meshFromCycles('delaunay', FAN_XY, [[0, 1, 3], [1, 2, 3], [2, 0, 3], [0, 2, 1]]);

// Centre (0,0) and six rim vertices at angles 0, 120, 240, 360, 480, 600
// degrees, radius 1 on the first lap and 2 on the second so they are distinct
// points. The six triangles (centre, r_i, r_i+1) each span 120 degrees
// counter-clockwise, so the rim winds twice around the centre.
function doublyWound(): HalfEdgeMesh {
  const xy = [0, 0];
  for (let i = 0; i < 6; i++) {
    const r = i < 3 ? 1 : 2;
    const t = (2 * Math.PI * i) / 3;
    xy.push(r * Math.cos(t), r * Math.sin(t));
  }
  const tris = [0, 1, 2, 3, 4, 5].map((i) => [0, 1 + i, 1 + ((i + 1) % 6)]);
  return meshFromCycles('delaunay', xy, [...tris, [1, 6, 5, 4, 3, 2]]);
}

describe('meshFromCycles (test helper)', () => {
  it('builds the single triangle exactly as written by hand', () => {
    const m = triangle();
    // Inner 0:A->B 1:B->C 2:C->A; outer 3:A->C 4:C->B 5:B->A.
    expect(Array.from(m.origin)).toEqual([0, 1, 2, 0, 2, 1]);
    expect(Array.from(m.next)).toEqual([1, 2, 0, 4, 5, 3]);
    expect(Array.from(m.twin)).toEqual([5, 4, 3, 2, 1, 0]);
    expect(Array.from(m.face)).toEqual([0, 0, 0, 1, 1, 1]);
    expect(Array.from(m.faceEdge)).toEqual([0, 3]);
  });
});

describe('checkMesh: valid meshes pass', () => {
  const cases: [string, () => HalfEdgeMesh][] = [
    ['single triangle', triangle],
    ['rhombus, Delaunay diagonal', rhombusGood],
    ['unit square, diagonal 0-2 (cocircular)', squareA],
    ['unit square, diagonal 1-3 (cocircular)', squareB],
    ['triangle with an interior vertex', fan],
    ['path of 3 collinear sites', path],
    ['one vertex, no edges', single],
  ];
  for (const [name, make] of cases) {
    it(name, () => {
      for (const delaunay of ['local', 'global', false] as const) {
        expect(checkMesh(make(), { delaunay })).toEqual({ ok: true, problems: [] });
      }
      expect(checkMesh(make())).toEqual({ ok: true, problems: [] });
      expect(() => assertMesh(make())).not.toThrow();
    });
  }

  it('a generic quad face (shoelace) with a non-convex outline passes as generic', () => {
    // Dart: A(0,0) B(2,1) C(4,0) D(2,3), reflex at B; one bounded quad face.
    const m = meshFromCycles('generic', [0, 0, 2, 1, 4, 0, 2, 3], [[0, 1, 2, 3], [0, 3, 2, 1]]);
    expect(checkMesh(m)).toEqual({ ok: true, problems: [] });
  });

  it('a non-Delaunay split passes as generic', () => {
    const m = with_(rhombusBad(), { kind: 'generic' });
    // Not Delaunay, but generic meshes skip the empty-circle test by default.
    expect(checkMesh(m).ok).toBe(true);
  });
});

describe('checkMesh: Delaunay-specific failures', () => {
  it('a non-Delaunay diagonal fails the local test, naming the edge and the vertex', () => {
    const text = problemsOf(rhombusBad());
    // Edge 0-2 is shared; vertex 3 is inside the circle of triangle [0, 1, 2], or 1 inside [0, 2, 3].
    expect(text).toMatch(/edge (0-2|2-0) \(half-edge \d+\) is not locally Delaunay: vertex [13] lies inside/);
  });

  it('global mode also reports vertices inside circumcircles', () => {
    const text = problemsOf(rhombusBad(), { delaunay: 'global' });
    expect(text).toMatch(/vertex 3 lies strictly inside the circumcircle of face 0 \[0, 1, 2\]/);
    expect(text).toMatch(/vertex 1 lies strictly inside the circumcircle of face 1 \[0, 2, 3\]/);
  });

  it('delaunay: false skips the empty-circle tests', () => {
    expect(checkMesh(rhombusBad(), { delaunay: false }).ok).toBe(true);
  });

  it('generic meshes can opt into the empty-circle test', () => {
    expect(problemsOf(with_(rhombusBad(), { kind: 'generic' }), { delaunay: 'local' })).toMatch(/not locally Delaunay/);
  });

  it('a non-triangle bounded face is rejected for kind delaunay', () => {
    const m = meshFromCycles('delaunay', SQUARE_XY, [[0, 1, 2, 3], [0, 3, 2, 1]]);
    expect(problemsOf(m)).toMatch(/face 0 has 4 sides; a Delaunay mesh has only triangles/);
    expect(checkMesh(with_(m, { kind: 'generic' })).ok).toBe(true);
  });

  it('a non-convex outer boundary is rejected for kind delaunay', () => {
    // Dart A(0,0) B(2,1) C(4,0) D(2,3) split into triangles ABD, BCD: walking
    // the outer face clockwise (A, D, C, B) turns left at the reflex corner B.
    const m = meshFromCycles('delaunay', [0, 0, 2, 1, 4, 0, 2, 3], [[0, 1, 3], [1, 2, 3], [0, 3, 2, 1]]);
    expect(problemsOf(m)).toMatch(/outer boundary is not convex: it turns left at vertex 1/);
    expect(checkMesh(with_(m, { kind: 'generic' })).ok).toBe(true);
  });

  it('collinear sites on the hull are fine (straight corners)', () => {
    // Triangle (0,0) (2,0) (0,2) with (1,0) on the bottom edge: 2 triangles.
    const m = meshFromCycles('delaunay', [0, 0, 2, 0, 0, 2, 1, 0], [[0, 3, 2], [3, 1, 2], [0, 2, 1, 3]]);
    expect(checkMesh(m, { delaunay: 'global' })).toEqual({ ok: true, problems: [] });
  });

  it('an outer boundary winding twice is rejected', () => {
    const m = doublyWound();
    const text = problemsOf(m, { delaunay: false });
    expect(text).toMatch(/outer boundary winds 2\.000000 times clockwise, expected once/);
  });

  it('coincident vertices are rejected for kind delaunay', () => {
    const m = with_(triangle(), { vertexXY: Float64Array.of(0, 0, 1, 0, 1, 0) }); // C moves onto B
    expect(problemsOf(m)).toMatch(/vertices 1 and 2 coincide at \(1, 0\)/);
  });

  it('faceSite must be -1 in a Delaunay mesh', () => {
    expect(problemsOf(mutate(triangle(), 'faceSite', 0, 5))).toMatch(/face 0: faceSite 5 must be -1/);
    expect(checkMesh(mutate(triangle('voronoi'), 'faceSite', 0, 5)).ok).toBe(true);
  });

  it('a path with a vertex off the line is rejected', () => {
    const m = mutate(path(), 'vertexXY', 5, 1.5); // v2 moves to (1, 1.5)
    expect(problemsOf(m)).toMatch(/no triangles but vertex 2 is off the line/);
  });

  it('a path that skips over a site is rejected', () => {
    // Same sites, path v0 - v1 - v2: the edge v0-v1 passes over v2 at (1,1).
    const m = meshFromCycles('delaunay', PATH_XY, [[0, 1, 2, 1]]);
    expect(problemsOf(m)).toMatch(/edge 0-1 \(half-edge \d+\) skips over other vertices/);
  });

  it('a pinched outer boundary (two triangles sharing one vertex) is rejected', () => {
    // Bow tie: triangles [0,1,2] and [0,3,4] share only vertex 0, and one
    // outer cycle visits vertex 0 twice (so vertex 0 keeps a single fan).
    const xy = [0, 0, 1, -1, 1, 1, -1, 1, -1, -1];
    const m = meshFromCycles('delaunay', xy, [[0, 1, 2], [0, 3, 4], [0, 2, 1, 0, 4, 3]]);
    const text = problemsOf(m, { delaunay: false });
    expect(text).toMatch(/outer boundary passes vertex 0 more than once/);
  });
});

describe('checkMesh: structural corruption is caught with the index named', () => {
  it('twin pointing at itself', () => {
    expect(problemsOf(mutate(triangle(), 'twin', 0, 0))).toMatch(/half-edge 0 is its own twin/);
  });

  it('twin not an involution', () => {
    // twin[0] = 4 but twin[4] = 1.
    expect(problemsOf(mutate(triangle(), 'twin', 0, 4))).toMatch(/half-edge 0: twin 4 has twin 1, not 0/);
  });

  it('next not a permutation', () => {
    // next[0] = 2 makes half-edge 2 the next of both 1 and 0, and 1 the next of none.
    const text = problemsOf(mutate(triangle(), 'next', 0, 2));
    expect(text).toMatch(/half-edge 2 is the next of both half-edges 0 and 1/);
    expect(text).toMatch(/half-edge 1 is the next of no half-edge/);
  });

  it('origin(twin(e)) differs from the target of e', () => {
    // Outer triangle: move origin of half-edge 3 (A->C) to B.
    const text = problemsOf(mutate(triangle(), 'origin', 3, 1));
    expect(text).toMatch(/half-edge \d+ ends at vertex \d+ \(origin of its next, \d+\) but its twin \d+ starts at vertex \d+/);
  });

  it('a next-cycle crossing two faces', () => {
    expect(problemsOf(mutate(triangle(), 'face', 1, 1))).toMatch(/half-edge 1 lies on face 1 but its next-cycle \(through 0\) belongs to face 0/);
  });

  it('faceEdge on the wrong face', () => {
    expect(problemsOf(mutate(triangle(), 'faceEdge', 0, 4))).toMatch(/face 0: faceEdge 4 lies on face 1/);
  });

  it('a face with two cycles and a face with none', () => {
    // Relabel the outer cycle as face 0: face 0 gets two cycles, face 1 none.
    let m = triangle();
    for (const e of [3, 4, 5]) m = mutate(m, 'face', e, 0);
    const text = problemsOf(m);
    expect(text).toMatch(/face 0 has more than one next-cycle \(through half-edges 0 and 3\)/);
    expect(text).toMatch(/face 1 has no half-edges/);
  });

  it('indices out of range and non-integers', () => {
    expect(problemsOf(mutate(triangle(), 'origin', 2, 3))).toMatch(/half-edge 2: origin 3 is not a vertex index in \[0, 3\)/);
    expect(problemsOf(mutate(triangle(), 'twin', 5, -1))).toMatch(/half-edge 5: twin -1 is not a half-edge index/);
    expect(problemsOf(mutate(triangle(), 'next', 5, 6))).toMatch(/half-edge 5: next 6 is not a half-edge index/);
    expect(problemsOf(mutate(triangle(), 'face', 4, 2))).toMatch(/half-edge 4: face 2 is not a face index in \[0, 2\)/);
    expect(problemsOf(mutate(triangle(), 'faceEdge', 1, -1))).toMatch(/face 1: faceEdge -1 is not a half-edge index/);
    expect(problemsOf(mutate(triangle(), 'faceSite', 1, -2))).toMatch(/face 1: faceSite -2 is not -1 or a site index/);
    expect(problemsOf(with_(triangle(), { outerFace: 2 }))).toMatch(/outerFace is 2, expected an integer in \[0, 2\)/);
    const plain = with_(triangle(), { origin: [0, 1, 2, 0, 2, 1.5] as unknown as Int32Array });
    expect(problemsOf(plain)).toMatch(/half-edge 5: origin 1.5 is not a vertex index/);
  });

  it('array lengths', () => {
    const m = triangle();
    expect(problemsOf(with_(m, { twin: m.twin.subarray(0, 5) }))).toMatch(/half-edge arrays differ in length: origin 6, twin 5/);
    expect(problemsOf(with_(m, { faceSite: Int32Array.of(-1) }))).toMatch(/face arrays differ in length: faceEdge 2, faceSite 1/);
    expect(problemsOf(with_(m, { vertexXY: Float64Array.of(0, 0, 1, 0, 0) }))).toMatch(/vertexXY has odd length 5/);
    expect(problemsOf(with_(m, { faceEdge: new Int32Array(0), faceSite: new Int32Array(0) }))).toMatch(/no faces/);
  });

  it('non-finite coordinates', () => {
    expect(problemsOf(mutate(triangle(), 'vertexXY', 3, NaN))).toMatch(/vertex 1 has non-finite coordinates \(1, NaN\)/);
    expect(problemsOf(mutate(triangle(), 'vertexXY', 0, Infinity))).toMatch(/vertex 0 has non-finite/);
  });

  it('a vertex with no half-edge breaks Euler and is named', () => {
    const m = with_(triangle(), { vertexXY: Float64Array.of(...TRI_XY, 5, 5) });
    const text = problemsOf(m);
    expect(text).toMatch(/vertex 3 is the origin of no half-edge/);
    expect(text).toMatch(/mesh is not connected: 2 components/);
    expect(text).toMatch(/V - E \+ F = 4 - 3 \+ 2 = 3, expected 2/);
  });

  it('two disjoint triangles: not connected, Euler fails', () => {
    const xy = [...TRI_XY, 10, 0, 11, 0, 10, 1];
    // Both outer cycles on face 2 would give it two cycles, so the second
    // outer cycle is its own face 3 (clockwise, so also an orientation error).
    const m = meshFromCycles('generic', xy, [[0, 1, 2], [3, 4, 5], [3, 5, 4], [0, 2, 1]]);
    const text = problemsOf(m);
    expect(text).toMatch(/not connected: 2 components/);
    expect(text).toMatch(/Euler's relation fails: V - E \+ F = 6 - 6 \+ 4 = 4/);
  });

  it('a pinched vertex (two fans) is named', () => {
    // Bow tie through vertex 0 where the outer face is split into two
    // cycles, one per triangle: vertex 0 then has two separate fans.
    const xy = [0, 0, 1, -1, 1, 1, -1, 1, -1, -1];
    const m = meshFromCycles('generic', xy, [[0, 1, 2], [0, 3, 4], [0, 4, 3], [0, 2, 1]]);
    expect(problemsOf(m)).toMatch(/vertex 0 has two separate fans/);
  });

  it('a loop half-edge is named', () => {
    // Change the single vertex mesh into one with a loop: two half-edges at vertex 0.
    const m = new HalfEdgeMesh({
      kind: 'generic', vertexXY: Float64Array.of(0, 0), origin: Int32Array.of(0, 0), twin: Int32Array.of(1, 0),
      next: Int32Array.of(0, 1), face: Int32Array.of(0, 1), faceEdge: Int32Array.of(0, 1), faceSite: Int32Array.of(-1, -1), outerFace: 1,
    });
    expect(problemsOf(m)).toMatch(/half-edge 0 is a loop at vertex 0/);
  });

  it('one vertex: faceEdge must be -1 and only one face is allowed', () => {
    expect(problemsOf(mutate(single(), 'faceEdge', 0, 0))).toMatch(/face 0: faceEdge 0 must be -1 in a mesh with no edges/);
    const two = with_(single(), { faceEdge: Int32Array.of(-1, -1), faceSite: Int32Array.of(-1, -1) });
    expect(problemsOf(two)).toMatch(/V - E \+ F = 1 - 0 \+ 2 = 3/);
  });
});

describe('checkMesh: orientation', () => {
  it('a clockwise bounded triangle is rejected by the exact test', () => {
    // Swap the roles: faces listed clockwise inside, counter-clockwise outside.
    const m = meshFromCycles('generic', TRI_XY, [[0, 2, 1], [0, 1, 2]]);
    const text = problemsOf(m);
    expect(text).toMatch(/face 0 \[0, 2, 1\] is not counter-clockwise with positive area/);
    expect(text).toMatch(/outer face 1 \[0, 1, 2\] is counter-clockwise with positive area/);
  });

  it('a degenerate triangle (collinear, zero area) is rejected', () => {
    const m = meshFromCycles('generic', [0, 0, 1, 1, 2, 2], [[0, 1, 2], [0, 2, 1]]);
    expect(problemsOf(m)).toMatch(/face 0 \[0, 1, 2\] is not counter-clockwise with positive area/);
  });

  it('the exact predicate decides a triangle whose naive float orientation has the wrong sign', () => {
    // a sits a few ulps off the line y = x through b and c (found by a search
    // over ulp offsets). The exact sign is recomputed here with BigInt on the
    // coordinates scaled by 2^60 (all are multiples of 2^-53, so exactly).
    const u = 2 ** -53;
    const xy = [0.5 + 41 * u, 0.5 + 48 * u, 12, 12, 24, 24];
    const [ax, ay, bx, by, cx, cy] = xy.map((v) => BigInt(v * 2 ** 60));
    const exact = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
    const naive = (xy[2] - xy[0]) * (xy[5] - xy[1]) - (xy[3] - xy[1]) * (xy[4] - xy[0]);
    expect(exact > 0n).toBe(true); // counter-clockwise
    expect(naive).toBeLessThan(0); // what plain doubles would claim
    expect(checkMesh(meshFromCycles('generic', xy, [[0, 1, 2], [0, 2, 1]])).ok).toBe(true);
    expect(problemsOf(meshFromCycles('generic', xy, [[0, 2, 1], [0, 1, 2]]))).toMatch(/face 0 \[0, 2, 1\] is not counter-clockwise/);
  });

  it('a clockwise quad face is rejected by the shoelace sum', () => {
    const m = meshFromCycles('generic', SQUARE_XY, [[0, 3, 2, 1], [0, 1, 2, 3]]);
    expect(problemsOf(m)).toMatch(/face 0 \[0, 3, 2, 1\] is not counter-clockwise/);
  });

  it('a 2-cycle bounded face has zero area and is rejected', () => {
    // Vertices 0 (0,0) and 1 (1,0); half-edges 0: 0->1, 1: 1->0 form bounded
    // face 0; 2: 1->0, 3: 0->1 form the outer face 1. Twins 0-2 and 1-3.
    // Every structural check passes (V - E + F = 2 - 2 + 2 = 2, one fan per
    // vertex); only the zero area of face 0 is wrong.
    const m = new HalfEdgeMesh({
      kind: 'generic', vertexXY: Float64Array.of(0, 0, 1, 0), origin: Int32Array.of(0, 1, 1, 0), twin: Int32Array.of(2, 3, 0, 1),
      next: Int32Array.of(1, 0, 3, 2), face: Int32Array.of(0, 0, 1, 1), faceEdge: Int32Array.of(0, 2), faceSite: Int32Array.of(-1, -1), outerFace: 1,
    });
    expect(checkMesh(m).problems).toEqual(['face 0 [0, 1] is not counter-clockwise with positive area']);
    // Making face 0 the outer face moves the complaint to face 1.
    expect(checkMesh(with_(m, { outerFace: 0 })).problems).toEqual(['face 1 [1, 0] is not counter-clockwise with positive area']);
  });
});

describe('checkMesh: robustness to garbage', () => {
  it('never throws, never hangs, on random single and multiple corruptions', () => {
    // Deterministic LCG (Numerical Recipes constants, from memory).
    let seed = 12345;
    const rand = () => { seed = (seed * 1664525 + 1013904223) >>> 0; return seed / 2 ** 32; };
    const makers = [triangle, rhombusGood, rhombusBad, squareA, fan, path, single];
    const intFields: Field[] = ['origin', 'twin', 'next', 'face', 'faceEdge', 'faceSite'];
    const values = [-5, -1, 0, 1, 2, 3, 7, 100, 2 ** 31 - 1];
    let invalid = 0;
    for (let trial = 0; trial < 3000; trial++) {
      let m = makers[Math.floor(rand() * makers.length)]();
      const k = 1 + Math.floor(rand() * 3);
      for (let j = 0; j < k; j++) {
        const field = intFields[Math.floor(rand() * intFields.length)];
        const len = m[field].length;
        if (len === 0) continue;
        m = mutate(m, field, Math.floor(rand() * len), values[Math.floor(rand() * values.length)]);
      }
      const r = checkMesh(m, { delaunay: 'global' });
      expect(r.problems.length).toBeLessThanOrEqual(MAX_MESH_PROBLEMS + 1);
      expect(r.ok).toBe(r.problems.length === 0);
      if (!r.ok) invalid++;
    }
    // Most random corruptions must be noticed (a few can be harmless, e.g.
    // faceEdge moved to another half-edge of the same face).
    expect(invalid).toBeGreaterThan(2000);
  });

  it('reports non-objects and missing arrays instead of throwing', () => {
    expect(checkMesh(null as unknown as HalfEdgeMesh).problems).toEqual(['mesh is null, expected an object']);
    const r = checkMesh({ kind: 'delaunay', vertexXY: [0, 0] } as unknown as HalfEdgeMesh);
    expect(r.ok).toBe(false);
    expect(r.problems).toContain('mesh.origin is not an array');
    expect(checkMesh(with_(triangle(), { kind: 'weird' as MeshKind })).problems[0]).toMatch(/mesh.kind is weird/);
  });

  it('caps the list of problems', () => {
    // Every twin pointing at itself: one problem per half-edge (24 of them).
    const m = doublyWound();
    const bad = with_(m, { twin: Int32Array.from(m.twin, (_, e) => e) });
    const r = checkMesh(bad);
    expect(r.problems.length).toBe(MAX_MESH_PROBLEMS + 1);
    expect(r.problems[MAX_MESH_PROBLEMS]).toMatch(/and more problems/);
  });
});

describe('assertMesh', () => {
  it('throws AmbitError with code invalid-mesh listing the problems', () => {
    let caught: unknown;
    try { assertMesh(rhombusBad()); } catch (err) { caught = err; }
    expect(caught).toBeInstanceOf(AmbitError);
    expect((caught as AmbitError).code).toBe('invalid-mesh');
    expect((caught as AmbitError).message).toMatch(/not locally Delaunay/);
    expect(() => assertMesh(rhombusBad(), { delaunay: false })).not.toThrow();
  });
});

describe('checkMesh on slivers', () => {
  it('a triangle 1e-32 thin winds once, whichever construction built it (found by the sweep property test)', async () => {
    const { triangulate, voronoi } = await import('../../src/index.js');
    // orient of these three is +4.9e-32: a real, counter-clockwise triangle with two corners of almost pi.
    const pts = [1, 2.9999999999999996, -0.9999999999999999, 3.0000000000000004, 0, 3];
    expect(checkMesh(triangulate(pts).toMesh()).problems).toEqual([]);
    expect(checkMesh(voronoi(pts, { method: 'sweep' }).triangulation.toMesh()).problems).toEqual([]);
  });
});
