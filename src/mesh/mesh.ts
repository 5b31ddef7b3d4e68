/**
 * What a mesh describes. Validators use it to pick the extra, kind-specific
 * checks (empty circles for "delaunay", cells holding their sites for
 * "voronoi", and so on).
 */
export type MeshKind = 'delaunay' | 'voronoi' | 'generic';

/** The arrays a mesh is made of; see {@link HalfEdgeMesh}. */
export interface MeshArrays {
  kind: MeshKind;
  vertexXY: Float64Array;
  origin: Int32Array;
  twin: Int32Array;
  next: Int32Array;
  face: Int32Array;
  faceEdge: Int32Array;
  faceSite: Int32Array;
  outerFace: number;
}

/**
 * The one planar half-edge mesh every construction in ambit returns.
 *
 * - Vertex v is at (vertexXY[2v], vertexXY[2v+1]).
 * - Half-edge e runs from origin[e] to origin[next[e]]; twin[e] runs back.
 *   Every half-edge has a twin: the boundary is walked by the outer face.
 * - face[e] is the face on the left of e. Bounded faces are counter-clockwise
 *   (y-up); the outer face, numbered outerFace, is walked clockwise.
 * - faceEdge[f] is one half-edge of face f; -1 for the outer face of a mesh
 *   with no edges (a single site), and in a Voronoi mesh for the empty cell
 *   of a site whose cell does not reach into the region.
 * - faceSite[f] is the site a face belongs to (a Voronoi cell: face s is the
 *   cell of site s), or -1 (triangles, the outer face).
 */
export class HalfEdgeMesh implements MeshArrays {
  readonly kind: MeshKind;
  readonly vertexXY: Float64Array;
  readonly origin: Int32Array;
  readonly twin: Int32Array;
  readonly next: Int32Array;
  readonly face: Int32Array;
  readonly faceEdge: Int32Array;
  readonly faceSite: Int32Array;
  readonly outerFace: number;

  constructor(a: MeshArrays) {
    this.kind = a.kind;
    this.vertexXY = a.vertexXY;
    this.origin = a.origin;
    this.twin = a.twin;
    this.next = a.next;
    this.face = a.face;
    this.faceEdge = a.faceEdge;
    this.faceSite = a.faceSite;
    this.outerFace = a.outerFace;
  }

  get vertexCount(): number { return this.vertexXY.length >> 1; }
  get halfEdgeCount(): number { return this.origin.length; }
  /** Undirected edges: half-edges come in twin pairs. */
  get edgeCount(): number { return this.origin.length >> 1; }
  /** Faces, the outer face included. */
  get faceCount(): number { return this.faceEdge.length; }

  /** The vertex half-edge e points to. */
  target(e: number): number { return this.origin[this.next[e]]; }

  /** The half-edge before e around its face (walks the face: O(face size)). */
  prev(e: number): number {
    let p = e;
    for (;;) {
      const q = this.next[p];
      if (q === e) return p;
      p = q;
    }
  }

  /** The half-edges around face f, in order. */
  faceEdges(f: number): number[] {
    const out: number[] = [];
    const start = this.faceEdge[f];
    if (start < 0) return out;
    let e = start;
    do { out.push(e); e = this.next[e]; } while (e !== start && out.length <= this.origin.length);
    return out;
  }

  /** The vertices around face f, in order (counter-clockwise for bounded faces). */
  faceVertices(f: number): number[] {
    return this.faceEdges(f).map((e) => this.origin[e]);
  }
}
