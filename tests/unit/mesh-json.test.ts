import { describe, it, expect } from 'vitest';
import { FormatError } from '../../src/core/errors.js';
import { checkMesh } from '../../src/mesh/check.js';
import { MESH_FORMAT, MESH_FORMAT_VERSION, meshToPlain, readMeshJSON, writeMeshJSON } from '../../src/mesh/json.js';
import { meshFromCycles } from '../support/meshes.js';
import { HalfEdgeMesh, type MeshKind } from '../../src/mesh/mesh.js';

// Invented coordinates throughout.


// Triangle (0,0) (1,0) (0,1), counter-clockwise; outer face walks it backwards.
// Half-edges: 0: 0->1, 1: 1->2, 2: 2->0, 3: 0->2, 4: 2->1, 5: 1->0.
const triangle = (xy = [0, 0, 1, 0, 0, 1]) => meshFromCycles('delaunay', xy, [[0, 1, 2], [0, 2, 1]]);

// Rhombus (0,0) (2,-1) (4,0) (2,1) split along its short, Delaunay diagonal
// 1-3 (circle through 0,1,3: centre (1.25,0), radius 1.25; vertex 2 is 2.75 away).
const RHOMBUS_XY = [0, 0, 2, -1, 4, 0, 2, 1];
const rhombus = () => meshFromCycles('delaunay', RHOMBUS_XY, [[0, 1, 3], [1, 2, 3], [0, 3, 2, 1]]);

function plainTriangle(): any {
  return JSON.parse(writeMeshJSON(triangle()));
}

function sameMesh(a: HalfEdgeMesh, b: HalfEdgeMesh): void {
  expect(b.kind).toBe(a.kind);
  expect(b.outerFace).toBe(a.outerFace);
  for (const k of ['origin', 'twin', 'next', 'face', 'faceEdge', 'faceSite'] as const) {
    expect(b[k]).toBeInstanceOf(Int32Array);
    expect(Array.from(b[k])).toEqual(Array.from(a[k]));
  }
  expect(b.vertexXY).toBeInstanceOf(Float64Array);
  // Bit-for-bit: Object.is per coordinate (toEqual would also accept this, but be explicit).
  expect(b.vertexXY.length).toBe(a.vertexXY.length);
  for (let i = 0; i < a.vertexXY.length; i++) expect(Object.is(b.vertexXY[i], a.vertexXY[i])).toBe(true);
}

function expectFormatError(fn: () => unknown, path: string, code: string, message?: RegExp): void {
  let caught: unknown;
  try { fn(); } catch (err) { caught = err; }
  expect(caught).toBeInstanceOf(FormatError);
  const e = caught as FormatError;
  expect({ path: e.path, code: e.code }).toEqual({ path, code });
  if (message) expect(e.message).toMatch(message);
}

describe('writeMeshJSON', () => {
  it('writes the documented schema', () => {
    const text = writeMeshJSON(triangle());
    expect(text).toBe(
      '{"format":"ambit.mesh","version":1,"kind":"delaunay","vertices":[0,0,1,0,0,1],' +
      '"halfEdges":{"origin":[0,1,2,0,2,1],"twin":[5,4,3,2,1,0],"next":[1,2,0,4,5,3],"face":[0,0,0,1,1,1]},' +
      '"faces":{"edge":[0,3],"site":[-1,-1]},"outerFace":1}',
    );
    expect(MESH_FORMAT).toBe('ambit.mesh');
    expect(MESH_FORMAT_VERSION).toBe(1);
  });

  it('meshToPlain gives plain arrays', () => {
    const plain = meshToPlain(rhombus());
    expect(Array.isArray(plain.vertices)).toBe(true);
    expect(plain.vertices).toEqual(RHOMBUS_XY);
    expect(Array.isArray(plain.halfEdges.origin)).toBe(true);
  });
});

describe('readMeshJSON: round trip', () => {
  it('is exact for awkward doubles', () => {
    // 0.1 + 0.2 = 0.30000000000000004, 1e7 + 1e-9, neighbours one ulp apart,
    // and the ends of the accepted range 2^-120 .. 2^120.
    const a = 0.1 + 0.2;
    const up = (x: number) => { const f = new Float64Array([x]); const u = new BigUint64Array(f.buffer); u[0] += 1n; return f[0]; };
    const b = 1e7 + 1e-9;
    const xy = [a, 1 / 3, b, up(1 / 3), up(a), 2 ** 120, -(2 ** -120), -up(b)];
    // P0 (0.3, 1/3), P1 (1e7, 1/3), P2 (0.3, 2^120), P3 (-2^-120, -1e7): going
    // P3 -> P1 -> P2 -> P0 turns counter-clockwise (a dart, P0 is the reflex
    // corner); checkMesh confirms it below.
    const order = [3, 1, 2, 0];
    const m = meshFromCycles('generic', xy, [order, [...order].reverse()]);
    expect(checkMesh(m).ok).toBe(true);
    expect(up(a)).not.toBe(a);
    const back = readMeshJSON(writeMeshJSON(m));
    sameMesh(m, back);
    expect(writeMeshJSON(back)).toBe(writeMeshJSON(m));
  });

  it('is exact for Delaunay meshes, Voronoi-like meshes with sites, and a single vertex', () => {
    sameMesh(rhombus(), readMeshJSON(writeMeshJSON(rhombus())));
    const cell = meshFromCycles('voronoi', [0.1, 0.2, 3.3, 0.25, 3.1, 2.7, 0.15, 2.9], [[0, 1, 2, 3], [0, 3, 2, 1]], [7, -1]);
    sameMesh(cell, readMeshJSON(writeMeshJSON(cell)));
    const single = new HalfEdgeMesh({
      kind: 'delaunay', vertexXY: Float64Array.of(1.5, -2.25), origin: new Int32Array(0), twin: new Int32Array(0),
      next: new Int32Array(0), face: new Int32Array(0), faceEdge: Int32Array.of(-1), faceSite: Int32Array.of(-1), outerFace: 0,
    });
    sameMesh(single, readMeshJSON(writeMeshJSON(single)));
  });

  it('accepts an already parsed object, and typed arrays in it', () => {
    sameMesh(rhombus(), readMeshJSON(meshToPlain(rhombus())));
    const p = meshToPlain(rhombus());
    sameMesh(rhombus(), readMeshJSON({ ...p, vertices: Float64Array.from(p.vertices) }));
  });

  it('writes -0 as 0 and reads it back as +0', () => {
    const m = triangle([-0, 0, 1, 0, 0, 1]);
    const back = readMeshJSON(writeMeshJSON(m));
    expect(Object.is(back.vertexXY[0], 0)).toBe(true);
    expect(Object.is(readMeshJSON(meshToPlain(m)).vertexXY[0], 0)).toBe(true);
  });
});

describe('readMeshJSON: untrusted input gives FormatError with the field path', () => {
  const good = plainTriangle;

  it('malformed JSON text', () => {
    expectFormatError(() => readMeshJSON('{"format": "ambit.mesh",'), '', 'bad-json', /not valid JSON/);
    expectFormatError(() => readMeshJSON(''), '', 'bad-json');
  });

  it('root of the wrong type', () => {
    expectFormatError(() => readMeshJSON('[1, 2]'), '', 'bad-type', /expected an object, got an array/);
    expectFormatError(() => readMeshJSON('null'), '', 'bad-type');
    expectFormatError(() => readMeshJSON(42), '', 'bad-type');
  });

  it('wrong or missing format', () => {
    expectFormatError(() => readMeshJSON({ ...good(), format: 'other.mesh' }), 'format', 'bad-format', /"other.mesh"/);
    const { format: _f, ...noFormat } = good();
    expectFormatError(() => readMeshJSON(noFormat), 'format', 'bad-format', /missing/);
  });

  it('missing or wrong version', () => {
    const { version: _v, ...noVersion } = good();
    expectFormatError(() => readMeshJSON(noVersion), 'version', 'bad-version', /missing/);
    expectFormatError(() => readMeshJSON({ ...good(), version: 2 }), 'version', 'bad-version', /unsupported version 2/);
    expectFormatError(() => readMeshJSON({ ...good(), version: '1' }), 'version', 'bad-version');
  });

  it('unknown kind', () => {
    expectFormatError(() => readMeshJSON({ ...good(), kind: 'quadtree' }), 'kind', 'bad-kind', /"quadtree"/);
    const { kind: _k, ...noKind } = good();
    expectFormatError(() => readMeshJSON(noKind), 'kind', 'bad-kind');
  });

  it('wrong types of containers', () => {
    expectFormatError(() => readMeshJSON({ ...good(), vertices: { 0: 1 } }), 'vertices', 'bad-type');
    expectFormatError(() => readMeshJSON({ ...good(), vertices: undefined }), 'vertices', 'bad-type', /got nothing/);
    expectFormatError(() => readMeshJSON({ ...good(), halfEdges: [] }), 'halfEdges', 'bad-type');
    expectFormatError(() => readMeshJSON({ ...good(), faces: 'none' }), 'faces', 'bad-type');
    const g = good();
    g.halfEdges.next = '1,2,0';
    expectFormatError(() => readMeshJSON(g), 'halfEdges.next', 'bad-type', /got string/);
  });

  it('wrong lengths', () => {
    expectFormatError(() => readMeshJSON({ ...good(), vertices: [0, 0, 1, 0, 0] }), 'vertices', 'bad-length', /odd length 5/);
    expectFormatError(() => readMeshJSON({ ...good(), vertices: [] }), 'vertices', 'bad-length');
    let g = good(); g.halfEdges.twin.pop();
    expectFormatError(() => readMeshJSON(g), 'halfEdges.twin', 'bad-length', /length 5 differs/);
    g = good(); g.halfEdges.face.push(0);
    expectFormatError(() => readMeshJSON(g), 'halfEdges.face', 'bad-length');
    g = good();
    for (const k of ['origin', 'twin', 'next', 'face']) g.halfEdges[k].pop();
    expectFormatError(() => readMeshJSON(g), 'halfEdges.origin', 'bad-length', /odd number of half-edges/);
    g = good(); g.faces.site.push(-1);
    expectFormatError(() => readMeshJSON(g), 'faces.site', 'bad-length');
    g = good(); g.faces.edge = []; g.faces.site = [];
    expectFormatError(() => readMeshJSON(g), 'faces.edge', 'bad-length', /no faces/);
  });

  it('non-numbers, non-finite numbers and non-integers', () => {
    let g = good(); g.vertices[3] = '0';
    expectFormatError(() => readMeshJSON(g), 'vertices[3]', 'not-a-number', /got string "0"/);
    g = good(); g.vertices[4] = null;
    expectFormatError(() => readMeshJSON(g), 'vertices[4]', 'not-a-number', /got null/);
    // JSON text cannot hold NaN or Infinity, but an object passed directly can.
    g = good(); g.vertices[1] = NaN;
    expectFormatError(() => readMeshJSON(g), 'vertices[1]', 'not-finite');
    g = good(); g.vertices[2] = -Infinity;
    expectFormatError(() => readMeshJSON(g), 'vertices[2]', 'not-finite');
    g = good(); g.halfEdges.origin[2] = 1.5;
    expectFormatError(() => readMeshJSON(g), 'halfEdges.origin[2]', 'not-integer');
    g = good(); g.halfEdges.twin[4] = '1';
    expectFormatError(() => readMeshJSON(g), 'halfEdges.twin[4]', 'not-a-number');
    g = good(); g.faces.site[0] = Infinity;
    expectFormatError(() => readMeshJSON(g), 'faces.site[0]', 'not-finite');
    g = good(); g.outerFace = '1';
    expectFormatError(() => readMeshJSON(g), 'outerFace', 'not-a-number');
    g = good(); g.outerFace = 0.5;
    expectFormatError(() => readMeshJSON(g), 'outerFace', 'not-integer');
  });

  it('out-of-range indices', () => {
    const cases: [string, (g: any) => void][] = [
      ['halfEdges.origin[1]', (g) => { g.halfEdges.origin[1] = 3; }],
      ['halfEdges.origin[0]', (g) => { g.halfEdges.origin[0] = -1; }],
      ['halfEdges.twin[5]', (g) => { g.halfEdges.twin[5] = 6; }],
      ['halfEdges.next[2]', (g) => { g.halfEdges.next[2] = -1; }],
      ['halfEdges.face[3]', (g) => { g.halfEdges.face[3] = 2; }],
      ['faces.edge[1]', (g) => { g.faces.edge[1] = -1; }],
      ['faces.edge[0]', (g) => { g.faces.edge[0] = 6; }],
      ['faces.site[1]', (g) => { g.faces.site[1] = -2; }],
      ['faces.site[0]', (g) => { g.faces.site[0] = 2 ** 31; }],
      ['outerFace', (g) => { g.outerFace = 2; }],
    ];
    for (const [path, change] of cases) {
      const g = good();
      change(g);
      expectFormatError(() => readMeshJSON(g), path, 'out-of-range');
    }
  });

  it('Delaunay vertices outside the exact coordinate range', () => {
    let g = good(); g.vertices[2] = 2 ** 121;
    expectFormatError(() => readMeshJSON(g), 'vertices[2]', 'out-of-range', /exact range/);
    g = good(); g.vertices[1] = 1e-300;
    expectFormatError(() => readMeshJSON(g), 'vertices[1]', 'out-of-range');
    // Other kinds only need finite coordinates (Voronoi corners are computed).
    g = good(); g.kind = 'generic'; g.vertices[2] = 2 ** 121;
    expect(readMeshJSON(g).vertexXY[2]).toBe(2 ** 121);
  });

  it('broken twin pairs', () => {
    let g = good(); g.halfEdges.twin[0] = 0;
    expectFormatError(() => readMeshJSON(g), 'halfEdges.twin[0]', 'bad-twin', /its own twin/);
    g = good(); g.halfEdges.twin[0] = 4; // twin[4] is 1
    expectFormatError(() => readMeshJSON(g), 'halfEdges.twin[0]', 'bad-twin', /whose twin is 1, not 0/);
  });

  it('next that is not a permutation', () => {
    const g = good(); g.halfEdges.next[1] = 1; // half-edge 1 is then next of 0 and of 1
    expectFormatError(() => readMeshJSON(g), 'halfEdges.next[1]', 'bad-next', /already the next of half-edge 0/);
  });

  it('next-cycles that change face, and faces.edge on the wrong face', () => {
    let g = good(); g.halfEdges.face[1] = 1; // cycle 0 -> 1 -> 2 crosses into face 1
    expectFormatError(() => readMeshJSON(g), 'halfEdges.face[1]', 'bad-face');
    g = good(); g.faces.edge[0] = 3;
    expectFormatError(() => readMeshJSON(g), 'faces.edge[0]', 'bad-face', /lies on face 1, not 0/);
  });

  it('origin(twin(e)) different from target(e)', () => {
    // Move the origin of half-edge 4 (2->1) to vertex 0. Half-edge 1 (1->2)
    // still ends at 2, but its twin 4 now starts at 0; half-edge 1 is the
    // first one checked that sees it.
    const g = good(); g.halfEdges.origin[4] = 0;
    expectFormatError(() => readMeshJSON(g), 'halfEdges.origin[4]', 'bad-origin', /half-edge 1 ends at vertex 2 but its twin 4 starts at vertex 0/);
  });

  it('structurally sound but invalid meshes fail checkMesh with path "mesh"', () => {
    // Clockwise triangle: swap the roles of the two faces.
    const g = good(); g.outerFace = 0;
    expectFormatError(() => readMeshJSON(g), 'mesh', 'invalid-mesh', /outer face 0 \[0, 1, 2\] is counter-clockwise/);
    // Non-Delaunay split of the rhombus (vertex 3 inside the circle through 0, 1, 2).
    const bad = meshFromCycles('delaunay', RHOMBUS_XY, [[0, 1, 2], [0, 2, 3], [0, 3, 2, 1]]);
    expectFormatError(() => readMeshJSON(writeMeshJSON(bad)), 'mesh', 'invalid-mesh', /not locally Delaunay/);
    // The same faces as a generic mesh are fine: no empty-circle test.
    expect(readMeshJSON(writeMeshJSON(new HalfEdgeMesh({ ...bad, kind: 'generic' }))).kind).toBe('generic');
  });

  it('random corruptions of valid JSON never escape as anything but FormatError', () => {
    // Deterministic LCG (Numerical Recipes constants, from memory).
    let seed = 987654321;
    const rand = () => { seed = (seed * 1664525 + 1013904223) >>> 0; return seed / 2 ** 32; };
    const sources = [writeMeshJSON(triangle()), writeMeshJSON(rhombus())];
    const junk = ['-1', '0', '1', '2', '7', '1.5', 'null', '"x"', '[]', '{}', '1e309', ',', ']', ''];
    let rejected = 0;
    for (let trial = 0; trial < 2000; trial++) {
      const src = sources[trial % sources.length];
      // Replace one number token with junk.
      const tokens = [...src.matchAll(/-?\d+(\.\d+)?(e-?\d+)?/g)];
      const t = tokens[Math.floor(rand() * tokens.length)];
      const text = src.slice(0, t.index) + junk[Math.floor(rand() * junk.length)] + src.slice(t.index! + t[0].length);
      try {
        const m = readMeshJSON(text);
        // Anything accepted must be a valid mesh.
        expect(checkMesh(m).ok).toBe(true);
      } catch (err) {
        expect(err).toBeInstanceOf(FormatError);
        rejected++;
      }
    }
    expect(rejected).toBeGreaterThan(1500);
  });
});
