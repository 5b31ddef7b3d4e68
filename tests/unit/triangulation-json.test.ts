import { describe, it, expect } from 'vitest';
import {
  triangulate, writeTriangulationJSON, readTriangulationJSON, writeMeshJSON, checkMesh, FormatError,
} from '../../src/index.js';

// Invented point sets: a house-shaped pentagon with a duplicate record, a
// collinear row, one site, and a 4 x 4 integer grid (cocircular quads).
const cases: Record<string, number[]> = {
  house: [0, 0, 4, 0, 4, 3, 2, 5, 0, 3, 2, 2, 4, 0],
  row: [0, 0, 2, 1, 4, 2, 6, 3],
  single: [7, -3],
  grid: Array.from({ length: 16 }, (_, i) => [i % 4, Math.floor(i / 4)]).flat(),
  awkward: [0.1 + 0.2, 1e7 + 1e-9, 1e7, 1e7, 1e7 + 3, 1e7 - 0.5, 0.30000000000000004, 1e7 + 2],
};

function expectFormatError(run: () => unknown, path: string, code?: string): void {
  try {
    run();
  } catch (err) {
    expect(err).toBeInstanceOf(FormatError);
    expect((err as FormatError).path).toBe(path);
    if (code) expect((err as FormatError).code).toBe(code);
    return;
  }
  throw new Error(`expected a FormatError at ${path}`);
}

describe('triangulation JSON', () => {
  for (const [name, pts] of Object.entries(cases)) {
    it(`round-trips ${name} exactly`, () => {
      const tri = triangulate(pts);
      const text = writeTriangulationJSON(tri);
      const back = readTriangulationJSON(text);
      expect(writeTriangulationJSON(back)).toBe(text);
      expect(Array.from(back.siteXY)).toEqual(Array.from(tri.siteXY));
      expect(Array.from(back.siteOfInput)).toEqual(Array.from(tri.siteOfInput));
      expect(Array.from(back.triangleSites)).toEqual(Array.from(tri.triangleSites));
      expect(Array.from(back.hull())).toEqual(Array.from(tri.hull()));
      expect(writeMeshJSON(back.toMesh())).toBe(writeMeshJSON(tri.toMesh()));
      expect(back.dimension).toBe(tri.dimension);
      // What was read can grow like what was built.
      expect(Array.from(back.insert([[1, 1], [9, 9]]))).toEqual(Array.from(tri.insert([[1, 1], [9, 9]])));
      expect(checkMesh(back.toMesh(), { delaunay: 'global' }).ok).toBe(true);
      expect(back.triangleCount).toBe(tri.triangleCount);
    });
  }

  const good = () => JSON.parse(writeTriangulationJSON(triangulate(cases.house)));

  it('rejects text that is not JSON', () => expectFormatError(() => readTriangulationJSON('{"format":'), '', 'bad-json'));
  it('rejects a wrong root type', () => expectFormatError(() => readTriangulationJSON('[1,2]'), '', 'bad-type'));
  it('rejects a wrong format tag', () => {
    const d = good(); d.format = 'ambit.mesh';
    expectFormatError(() => readTriangulationJSON(d), 'format', 'bad-format');
  });
  it('rejects a wrong or missing version', () => {
    const d = good(); d.version = 2;
    expectFormatError(() => readTriangulationJSON(d), 'version', 'bad-version');
    delete d.version;
    expectFormatError(() => readTriangulationJSON(d), 'version', 'bad-version');
  });
  it('names the field of a broken mesh, below "mesh."', () => {
    const d = good(); d.mesh.halfEdges.twin[0] = 0; // its own twin: the first broken pair
    expectFormatError(() => readTriangulationJSON(d), 'mesh.halfEdges.twin[0]', 'bad-twin');
    const e = good(); e.mesh.vertices[2] = 'x';
    expectFormatError(() => readTriangulationJSON(e), 'mesh.vertices[2]', 'not-a-number');
    const f = good(); f.mesh.halfEdges.origin[0] = 99;
    expectFormatError(() => readTriangulationJSON(f), 'mesh.halfEdges.origin[0]', 'out-of-range');
    const g = good(); g.mesh.vertices.pop();
    expectFormatError(() => readTriangulationJSON(g), 'mesh.vertices', 'bad-length');
  });
  it('rejects a mesh that is not of kind delaunay', () => {
    const d = good(); d.mesh.kind = 'generic';
    expectFormatError(() => readTriangulationJSON(d), 'mesh.kind', 'bad-kind');
  });
  it('rejects a non-Delaunay triangulation (a site moved into a circumcircle)', () => {
    // Kite (0,0) (2,-1) (4,0) (2,1): the short diagonal (2,-1)-(2,1) is Delaunay. Moved to (2,5), the
    // apex makes (4,0) fall inside the circle through (0,0), (2,-1), (2,5) (centre (2.25, 2),
    // r^2 = 9.0625; (4,0) is at squared distance 7.0625; worked by hand), so the kept diagonal is illegal.
    const d = JSON.parse(writeTriangulationJSON(triangulate([0, 0, 2, -1, 4, 0, 2, 1])));
    expect(d.mesh.vertices[7]).toBe(1);
    d.mesh.vertices[7] = 5;
    expectFormatError(() => readTriangulationJSON(d), 'mesh', 'invalid-mesh');
  });
  it('rejects a mesh with no triangles over sites that are not collinear', () => {
    const d = JSON.parse(writeTriangulationJSON(triangulate(cases.row)));
    d.mesh.vertices[3] = 1.5;
    expectFormatError(() => readTriangulationJSON(d), 'mesh');
  });
  it('checks the site map', () => {
    const d = good(); d.siteOfInput = 'all';
    expectFormatError(() => readTriangulationJSON(d), 'siteOfInput', 'bad-type');
    const e = good(); e.siteOfInput[1] = 1.5;
    expectFormatError(() => readTriangulationJSON(e), 'siteOfInput[1]', 'not-integer');
    const f = good(); f.siteOfInput[2] = 40;
    expectFormatError(() => readTriangulationJSON(f), 'siteOfInput[2]', 'out-of-range');
    const g = good(); g.siteOfInput.length = 3;
    expectFormatError(() => readTriangulationJSON(g), 'siteOfInput', 'bad-length');
    // Sites are numbered by first appearance: 0, 2, ... skips site 1.
    const h = good(); h.siteOfInput[1] = 2;
    expectFormatError(() => readTriangulationJSON(h), 'siteOfInput[1]', 'bad-site-map');
    // Every site must come from some input point.
    const k = good(); k.siteOfInput[5] = 0; k.siteOfInput[6] = 0;
    expectFormatError(() => readTriangulationJSON(k), 'siteOfInput', 'bad-site-map');
  });
});
