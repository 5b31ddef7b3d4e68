import { describe, expect, it } from 'vitest';
import { checkMesh, triangulate, type Triangulation } from '../../src/index.js';
import { canonicalTriangles, isStrictlyDelaunay, triangleEdgeKeys } from '../support/brute.js';

/** Twice the signed area of triangle t, by the shoelace formula (exact on small integers). */
function area2(tri: Triangulation, t: number): number {
  const s = tri.triangleSites, xy = tri.siteXY;
  const [a, b, c] = [s[3 * t], s[3 * t + 1], s[3 * t + 2]];
  return (xy[2 * b] - xy[2 * a]) * (xy[2 * c + 1] - xy[2 * a + 1]) - (xy[2 * b + 1] - xy[2 * a + 1]) * (xy[2 * c] - xy[2 * a]);
}

function edgePairs(tri: Triangulation): string[] {
  const e = Array.from(tri.edges());
  const out: string[] = [];
  for (let i = 0; i < e.length; i += 2) out.push(`${e[i]},${e[i + 1]}`);
  return out.sort();
}

/**
 * Neighbours counter-clockwise: walking the list, the direction from the
 * site turns left by less than a full circle in total (any starting point).
 */
function expectCounterClockwise(tri: Triangulation, site: number): void {
  const xy = tri.siteXY;
  const nb = Array.from(tri.neighbors(site));
  const ang = nb.map((u) => Math.atan2(xy[2 * u + 1] - xy[2 * site + 1], xy[2 * u] - xy[2 * site]));
  let total = 0;
  for (let i = 1; i < ang.length; i++) {
    let d = ang[i] - ang[i - 1];
    while (d <= 0) d += 2 * Math.PI;
    total += d;
  }
  expect(total, `neighbors(${site}) = ${nb}`).toBeLessThan(2 * Math.PI);
}

describe('worked examples', () => {
  it('unit square: 2 triangles, 4 hull sites, 5 edges', () => {
    const t = triangulate([[0, 0], [1, 0], [1, 1], [0, 1]]);
    expect(t.dimension).toBe(2);
    expect(t.siteCount).toBe(4);
    expect(t.triangleCount).toBe(2);
    expect(Array.from(t.hull())).toEqual([0, 1, 2, 3]);
    expect(t.edges().length / 2).toBe(5);
    // Either diagonal is Delaunay (4 cocircular points); both triangles are
    // counter-clockwise and together cover the square.
    expect(area2(t, 0)).toBe(1);
    expect(area2(t, 1)).toBe(1);
    expect(checkMesh(t.toMesh(), { delaunay: 'global' })).toEqual({ ok: true, problems: [] });
  });

  it('square with centre: 4 triangles around the centre', () => {
    const t = triangulate([[0, 0], [2, 0], [2, 2], [0, 2], [1, 1]]);
    expect(t.triangleCount).toBe(4);
    expect(canonicalTriangles(t.triangleSites)).toEqual(['0,1,4', '0,3,4', '1,2,4', '2,3,4']);
    expect(Array.from(t.hull())).toEqual([0, 1, 2, 3]);
    expect(edgePairs(t)).toEqual(['0,1', '0,3', '0,4', '1,2', '1,4', '2,3', '2,4', '3,4']);
    // Around the centre, counter-clockwise: a rotation of 0, 1, 2, 3.
    const nb = Array.from(t.neighbors(4));
    const k = nb.indexOf(0);
    expect([...nb.slice(k), ...nb.slice(0, k)]).toEqual([0, 1, 2, 3]);
    for (let s = 0; s < 5; s++) expectCounterClockwise(t, s);
    const mesh = t.toMesh();
    expect(mesh.faceCount).toBe(5);
    expect(mesh.outerFace).toBe(4);
    expect(checkMesh(mesh, { delaunay: 'global' })).toEqual({ ok: true, problems: [] });
  });

  it('3 collinear points: dimension 1, no triangles, hull along the line', () => {
    const t = triangulate([[2, 2], [0, 0], [1, 1]]);
    expect(t.dimension).toBe(1);
    expect(t.triangleCount).toBe(0);
    expect(t.triangleSites.length).toBe(0);
    expect(Array.from(t.hull())).toEqual([1, 2, 0]);
    expect(edgePairs(t)).toEqual(['0,2', '1,2']);
    expect(Array.from(t.neighbors(2)).sort()).toEqual([0, 1]);
    expect(Array.from(t.neighbors(1))).toEqual([2]);
    expect(checkMesh(t.toMesh(), { delaunay: 'local' }).ok).toBe(true);
  });

  it('1 point: dimension 0', () => {
    const t = triangulate([7, -3]);
    expect(t.dimension).toBe(0);
    expect(t.siteCount).toBe(1);
    expect(t.triangleCount).toBe(0);
    expect(Array.from(t.hull())).toEqual([0]);
    expect(t.edges().length).toBe(0);
    expect(t.neighbors(0).length).toBe(0);
    const mesh = t.toMesh();
    expect(mesh.vertexCount).toBe(1);
    expect(mesh.edgeCount).toBe(0);
    expect(Array.from(mesh.faceEdge)).toEqual([-1]);
    expect(checkMesh(mesh).ok).toBe(true);
  });

  it('2 points: dimension 1, one edge, hull from the smaller', () => {
    const t = triangulate([[3, 1], [1, 5]]);
    expect(t.dimension).toBe(1);
    expect(Array.from(t.hull())).toEqual([1, 0]);
    expect(Array.from(t.edges())).toEqual([0, 1]);
    expect(Array.from(t.neighbors(0))).toEqual([1]);
  });

  it('duplicates: merged onto the first, every input mapped', () => {
    const t = triangulate([[0, 0], [1, 0], [0, 0], [0, 1], [1, 0], [0, 0]]);
    expect(t.inputCount).toBe(6);
    expect(t.siteCount).toBe(3);
    expect(t.mergedCount).toBe(3);
    expect(Array.from(t.siteOfInput)).toEqual([0, 1, 0, 2, 1, 0]);
    expect(Array.from(t.siteXY.subarray(0, 6))).toEqual([0, 0, 1, 0, 0, 1]);
    expect(t.triangleCount).toBe(1);
    expect(canonicalTriangles(t.triangleSites)).toEqual(['0,1,2']);
  });

  it('3x3 integer grid: 8 triangles, 8 hull sites, Euler with collinear hull points', () => {
    const pts: [number, number][] = [];
    for (let x = 0; x < 3; x++) for (let y = 0; y < 3; y++) pts.push([x, y]);
    const t = triangulate(pts);
    const n = 9, h = t.hull().length;
    expect(h).toBe(8);
    // Euler's formula for triangulations: T = 2n - 2 - h, E = 3n - 3 - h.
    expect(t.triangleCount).toBe(2 * n - 2 - h);
    expect(t.triangleCount).toBe(8);
    expect(t.edges().length / 2).toBe(3 * n - 3 - h);
    const hullXY = Array.from(t.hull()).map((s) => [t.siteXY[2 * s], t.siteXY[2 * s + 1]]);
    expect(hullXY).toEqual([[0, 0], [1, 0], [2, 0], [2, 1], [2, 2], [1, 2], [0, 2], [0, 1]]);
    // Every Delaunay triangulation of a unit grid is made of half unit squares.
    for (let k = 0; k < 8; k++) expect(area2(t, k)).toBe(1);
    expect(checkMesh(t.toMesh(), { delaunay: 'global' })).toEqual({ ok: true, problems: [] });
  });

  // A pattern in general position: no 4 cocircular points, so its
  // triangulation is unique (checked below, not assumed).
  const pattern: [number, number][] = [[0, 0], [5, 1], [9, 4], [2, 7], [6, 8], [4, 3], [8, -2], [-3, 4], [1, 3]];

  it('large offsets: 1e7 + pattern gives the same triangles as the pattern', () => {
    const base = triangulate(pattern);
    expect(isStrictlyDelaunay(base.siteXY, base.triangleSites)).toBe(true);
    for (const [dx, dy] of [[1e7, 1e7], [-1e7, 3e6], [1e6 + 0.5, -1e7]]) {
      const moved = pattern.map(([x, y]) => [x + dx, y + dy] as [number, number]);
      // The offsets keep every coordinate exact, so this is an exact translation.
      moved.forEach(([x, y], i) => expect([x - dx, y - dy]).toEqual(pattern[i]));
      const t = triangulate(moved);
      expect(canonicalTriangles(t.triangleSites)).toEqual(canonicalTriangles(base.triangleSites));
      expect(Array.from(t.hull())).toEqual(Array.from(base.hull()));
    }
  });

  it('neighbors() are counter-clockwise and match the triangles; edges() count', () => {
    const t = triangulate(pattern);
    const n = t.siteCount, h = t.hull().length;
    expect(t.edges().length / 2).toBe(3 * n - 3 - h);
    expect(edgePairs(t)).toEqual(triangleEdgeKeys(t.triangleSites));
    for (let s = 0; s < n; s++) {
      expectCounterClockwise(t, s);
      const fromEdges = edgePairs(t)
        .map((k) => k.split(',').map(Number))
        .filter(([a, b]) => a === s || b === s)
        .map(([a, b]) => (a === s ? b : a))
        .sort((p, q) => p - q);
      expect(Array.from(t.neighbors(s)).sort((p, q) => p - q)).toEqual(fromEdges);
    }
    expect(() => t.neighbors(n)).toThrow();
  });

  it('insert() returns the sites of new points, merging existing ones', () => {
    const t = triangulate([[0, 0], [4, 0], [0, 4]]);
    const sites = Array.from(t.insert([[1, 1], [4, 0], [5, 5], [1, 1]]));
    expect(sites).toEqual([3, 1, 4, 3]);
    expect(t.siteCount).toBe(5);
    expect(t.inputCount).toBe(7);
    expect(Array.from(t.siteOfInput)).toEqual([0, 1, 2, 3, 1, 4, 3]);
    expect(checkMesh(t.toMesh(), { delaunay: 'global' }).ok).toBe(true);
  });
});
