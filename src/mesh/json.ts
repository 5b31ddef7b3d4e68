import { FormatError } from '../core/errors.js';
import { MAX_COORDINATE, MIN_COORDINATE } from '../core/limits.js';
import { parseJSONInput } from '../core/untrusted.js';
import { checkMesh } from './check.js';
import { HalfEdgeMesh, type MeshKind } from './mesh.js';

/** The `format` tag of a serialised mesh. */
export const MESH_FORMAT = 'ambit.mesh';
/** The schema version this module writes and the only one it reads. */
export const MESH_FORMAT_VERSION = 1;

/** A mesh as plain JSON-ready data (schema version 1). */
export interface MeshPlain {
  format: typeof MESH_FORMAT;
  version: typeof MESH_FORMAT_VERSION;
  kind: MeshKind;
  /** Interleaved x, y per vertex. */
  vertices: number[];
  halfEdges: { origin: number[]; twin: number[]; next: number[]; face: number[] };
  faces: { edge: number[]; site: number[] };
  outerFace: number;
}

/**
 * FormatError codes readMeshJSON uses: 'bad-json' (not JSON text),
 * 'bad-type' (wrong JSON type), 'bad-format', 'bad-version', 'bad-kind',
 * 'bad-length', 'not-a-number', 'not-finite', 'not-integer', 'out-of-range',
 * 'bad-twin', 'bad-next', 'bad-face', 'bad-origin', 'invalid-mesh' (the
 * structure is sound but checkMesh finds problems; path 'mesh').
 */
export type MeshFormatErrorCode =
  | 'bad-json' | 'bad-type' | 'bad-format' | 'bad-version' | 'bad-kind' | 'bad-length'
  | 'not-a-number' | 'not-finite' | 'not-integer' | 'out-of-range'
  | 'bad-twin' | 'bad-next' | 'bad-face' | 'bad-origin' | 'invalid-mesh';

/** The mesh as plain arrays; -0 coordinates come out as written by the mesh. */
export function meshToPlain(mesh: HalfEdgeMesh): MeshPlain {
  return {
    format: MESH_FORMAT,
    version: MESH_FORMAT_VERSION,
    kind: mesh.kind,
    vertices: Array.from(mesh.vertexXY),
    halfEdges: {
      origin: Array.from(mesh.origin),
      twin: Array.from(mesh.twin),
      next: Array.from(mesh.next),
      face: Array.from(mesh.face),
    },
    faces: { edge: Array.from(mesh.faceEdge), site: Array.from(mesh.faceSite) },
    outerFace: mesh.outerFace,
  };
}

/**
 * Serialises a mesh. JSON.stringify writes each double in the shortest form
 * that parses back to the same double (ECMAScript Number::toString), so the
 * round trip is exact, except that -0 is written as 0.
 * The mesh is not validated here; readMeshJSON does that.
 */
export function writeMeshJSON(mesh: HalfEdgeMesh): string {
  return JSON.stringify(meshToPlain(mesh));
}

function fail(code: MeshFormatErrorCode, message: string, path: string): never {
  throw new FormatError(code, `${path === '' ? 'mesh JSON' : path}: ${message}`, path);
}

function typeName(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'an array';
  return typeof v;
}

function objectAt(v: unknown, path: string): Record<string, unknown> {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) fail('bad-type', `expected an object, got ${typeName(v)}`, path);
  return v as Record<string, unknown>;
}

function arrayAt(v: unknown, path: string): ArrayLike<unknown> {
  if (Array.isArray(v) || (ArrayBuffer.isView(v) && !(v instanceof DataView))) return v as ArrayLike<unknown>;
  return fail('bad-type', `expected an array, got ${v === undefined ? 'nothing' : typeName(v)}`, path);
}

function numberAt(v: unknown, path: string): number {
  if (typeof v !== 'number') fail('not-a-number', `expected a number, got ${typeName(v)}${typeof v === 'string' ? ` ${JSON.stringify(v)}` : ''}`, path);
  if (!Number.isFinite(v)) fail('not-finite', `${v} is not finite`, path);
  return v;
}

/** Integers in [lo, hi) copied into an Int32Array. */
function indexArray(list: ArrayLike<unknown>, path: string, lo: number, hi: number, what: string): Int32Array {
  const out = new Int32Array(list.length);
  for (let i = 0; i < list.length; i++) {
    const at = `${path}[${i}]`;
    const v = numberAt(list[i], at);
    if (!Number.isInteger(v)) fail('not-integer', `${v} is not an integer`, at);
    if (v < lo || v >= hi) {
      fail('out-of-range', `${v} is not ${hi <= lo ? `valid (there are no ${what}s)` : `${lo === -1 ? '-1 or ' : ''}a ${what} index in [${Math.max(lo, 0)}, ${hi})`}`, at);
    }
    out[i] = v;
  }
  return out;
}

/**
 * Reads a mesh from JSON text or from an already parsed value, treating it
 * as untrusted: every field is type-, length- and range-checked, twins,
 * next-cycles and origins are checked for consistency, and finally
 * checkMesh runs (with the local empty-circle test for kind 'delaunay').
 * Any failure throws a FormatError whose `path` names the field, e.g.
 * "halfEdges.twin[17]", or "mesh" for problems checkMesh finds.
 * Unknown extra fields are ignored. -0 coordinates are read as 0.
 */
export function readMeshJSON(input: string | unknown): HalfEdgeMesh {
  const root = objectAt(parseJSONInput(input, 'mesh JSON'), '');
  if (root.format !== MESH_FORMAT) {
    fail('bad-format', `format is ${root.format === undefined ? 'missing' : JSON.stringify(root.format)}, expected "${MESH_FORMAT}"`, 'format');
  }
  if (root.version === undefined) fail('bad-version', 'version is missing', 'version');
  if (root.version !== MESH_FORMAT_VERSION) {
    fail('bad-version', `unsupported version ${JSON.stringify(root.version)}; this reader knows version ${MESH_FORMAT_VERSION}`, 'version');
  }
  const kind = root.kind;
  if (kind !== 'delaunay' && kind !== 'voronoi' && kind !== 'generic') {
    fail('bad-kind', `unknown kind ${kind === undefined ? '(missing)' : JSON.stringify(kind)}; expected "delaunay", "voronoi" or "generic"`, 'kind');
  }

  const verts = arrayAt(root.vertices, 'vertices');
  if (verts.length % 2 !== 0) fail('bad-length', `odd length ${verts.length}; expected x, y pairs`, 'vertices');
  if (verts.length === 0) fail('bad-length', 'no vertices', 'vertices');
  const vertexXY = new Float64Array(verts.length);
  for (let i = 0; i < verts.length; i++) {
    const at = `vertices[${i}]`;
    const v = numberAt(verts[i], at);
    // Delaunay vertices are input sites: keep them where the exact predicates
    // stay exact, or the empty-circle check below could be fooled.
    const a = Math.abs(v);
    if (kind === 'delaunay' && (a > MAX_COORDINATE || (a !== 0 && a < MIN_COORDINATE))) {
      fail('out-of-range', `${v} is outside the exact range (0 or 2^-120 <= |v| <= 2^120)`, at);
    }
    vertexXY[i] = v + 0;
  }
  const V = verts.length >> 1;

  const he = objectAt(root.halfEdges, 'halfEdges');
  const rawOrigin = arrayAt(he.origin, 'halfEdges.origin');
  const rawTwin = arrayAt(he.twin, 'halfEdges.twin');
  const rawNext = arrayAt(he.next, 'halfEdges.next');
  const rawFace = arrayAt(he.face, 'halfEdges.face');
  const H = rawOrigin.length;
  for (const [name, arr] of [['twin', rawTwin], ['next', rawNext], ['face', rawFace]] as const) {
    if (arr.length !== H) fail('bad-length', `length ${arr.length} differs from halfEdges.origin's ${H}`, `halfEdges.${name}`);
  }
  if (H % 2 !== 0) fail('bad-length', `odd number of half-edges (${H}); they come in twin pairs`, 'halfEdges.origin');

  const fc = objectAt(root.faces, 'faces');
  const rawEdge = arrayAt(fc.edge, 'faces.edge');
  const rawSite = arrayAt(fc.site, 'faces.site');
  const F = rawEdge.length;
  if (F === 0) fail('bad-length', 'no faces; the outer face is always there', 'faces.edge');
  if (rawSite.length !== F) fail('bad-length', `length ${rawSite.length} differs from faces.edge's ${F}`, 'faces.site');

  const outerFace = numberAt(root.outerFace, 'outerFace');
  if (!Number.isInteger(outerFace)) fail('not-integer', `${outerFace} is not an integer`, 'outerFace');
  if (outerFace < 0 || outerFace >= F) fail('out-of-range', `${outerFace} is not a face index in [0, ${F})`, 'outerFace');

  const origin = indexArray(rawOrigin, 'halfEdges.origin', 0, V, 'vertex');
  const twin = indexArray(rawTwin, 'halfEdges.twin', 0, H, 'half-edge');
  const next = indexArray(rawNext, 'halfEdges.next', 0, H, 'half-edge');
  const face = indexArray(rawFace, 'halfEdges.face', 0, F, 'face');
  // faces.edge is -1 only when there are no half-edges at all, or for an empty Voronoi cell (not the outer face).
  const faceEdge = H === 0 ? indexArray(rawEdge, 'faces.edge', -1, 0, 'half-edge')
    : indexArray(rawEdge, 'faces.edge', kind === 'voronoi' ? -1 : 0, H, 'half-edge');
  if (H > 0 && faceEdge[outerFace] < 0) fail('out-of-range', 'the outer face has no half-edge', `faces.edge[${outerFace}]`);
  const faceSite = indexArray(rawSite, 'faces.site', -1, 2 ** 31, 'site');

  for (let e = 0; e < H; e++) {
    const t = twin[e];
    if (t === e) fail('bad-twin', `half-edge ${e} is its own twin`, `halfEdges.twin[${e}]`);
    if (twin[t] !== e) fail('bad-twin', `half-edge ${e} has twin ${t}, whose twin is ${twin[t]}, not ${e}`, `halfEdges.twin[${e}]`);
  }
  const prev = new Int32Array(H).fill(-1);
  for (let e = 0; e < H; e++) {
    const n = next[e];
    if (prev[n] >= 0) fail('bad-next', `half-edge ${n} is already the next of half-edge ${prev[n]}; next must be a permutation`, `halfEdges.next[${e}]`);
    prev[n] = e;
  }
  // next is now a permutation, so every next-cycle closes; each must stay on one face.
  for (let e = 0; e < H; e++) {
    const n = next[e];
    if (face[n] !== face[e]) {
      fail('bad-face', `half-edge ${n} follows half-edge ${e} in a next-cycle but lies on face ${face[n]}, not ${face[e]}`, `halfEdges.face[${n}]`);
    }
  }
  for (let f = 0; f < F && H > 0; f++) {
    if (faceEdge[f] < 0) continue;
    if (face[faceEdge[f]] !== f) fail('bad-face', `half-edge ${faceEdge[f]} lies on face ${face[faceEdge[f]]}, not ${f}`, `faces.edge[${f}]`);
  }
  for (let e = 0; e < H; e++) {
    const t = twin[e];
    const end = origin[next[e]];
    if (origin[t] !== end) {
      fail('bad-origin', `half-edge ${e} ends at vertex ${end} but its twin ${t} starts at vertex ${origin[t]}`, `halfEdges.origin[${t}]`);
    }
  }

  const mesh = new HalfEdgeMesh({ kind, vertexXY, origin, twin, next, face, faceEdge, faceSite, outerFace });
  const r = checkMesh(mesh, { delaunay: kind === 'delaunay' ? 'local' : false });
  if (!r.ok) fail('invalid-mesh', `not a valid ${kind} mesh:\n  - ${r.problems.join('\n  - ')}`, 'mesh');
  return mesh;
}
