import { HalfEdgeMesh, type MeshKind } from '../../src/mesh/mesh.js';

/**
 * Builds a mesh by hand from face cycles given as vertex lists; the last
 * cycle is the outer face. Twins are matched by their (from, to) vertex pair;
 * a half-edge with no partner gets twin -1, which the validator must catch.
 */
export function meshFromCycles(kind: MeshKind, xy: number[], cycles: number[][], faceSite?: number[]): HalfEdgeMesh {
  const origin: number[] = [];
  const next: number[] = [];
  const face: number[] = [];
  const faceEdge: number[] = [];
  cycles.forEach((cyc, f) => {
    const base = origin.length;
    faceEdge.push(cyc.length > 0 ? base : -1);
    cyc.forEach((v, i) => {
      origin.push(v);
      next.push(base + ((i + 1) % cyc.length));
      face.push(f);
    });
  });
  const byPair = new Map<string, number>();
  origin.forEach((v, e) => byPair.set(`${v},${origin[next[e]]}`, e));
  const twin = origin.map((v, e) => byPair.get(`${origin[next[e]]},${v}`) ?? -1);
  return new HalfEdgeMesh({
    kind,
    vertexXY: Float64Array.from(xy),
    origin: Int32Array.from(origin),
    twin: Int32Array.from(twin),
    next: Int32Array.from(next),
    face: Int32Array.from(face),
    faceEdge: Int32Array.from(faceEdge),
    faceSite: Int32Array.from(faceSite ?? cycles.map(() => -1)),
    outerFace: cycles.length - 1,
  });
}
