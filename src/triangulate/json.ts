import { FormatError, InputError } from '../core/errors.js';
import { parseJSONInput } from '../core/untrusted.js';
import { orient } from '../core/predicates.js';
import { meshToPlain, readMeshJSON, type MeshPlain } from '../mesh/json.js';
import { Triangulation } from './triangulation.js';

/** The `format` tag of a serialised triangulation. */
export const TRIANGULATION_FORMAT = 'ambit.triangulation';
export const TRIANGULATION_FORMAT_VERSION = 1;

/** A triangulation as plain JSON-ready data (schema version 1). */
export interface TriangulationPlain {
  format: typeof TRIANGULATION_FORMAT;
  version: typeof TRIANGULATION_FORMAT_VERSION;
  /** For every input point, its site (a vertex of the mesh). */
  siteOfInput: number[];
  /** The triangulation as an "ambit.mesh" of kind "delaunay". */
  mesh: MeshPlain;
}

/** Serialises a triangulation: its mesh plus the map from input points to sites. */
export function writeTriangulationJSON(tri: Triangulation): string {
  if (tri.weights !== null) {
    // Version 1 has no place for weights; writing the mesh alone would lose them and read back wrong.
    throw new InputError('bad-option', 'a weighted triangulation has no JSON form in version 1: keep its points and weights instead', -1, 'weights');
  }
  const plain: TriangulationPlain = {
    format: TRIANGULATION_FORMAT,
    version: TRIANGULATION_FORMAT_VERSION,
    siteOfInput: Array.from(tri.siteOfInput),
    mesh: meshToPlain(tri.toMesh()),
  };
  return JSON.stringify(plain);
}

function fail(code: string, message: string, path: string): never {
  throw new FormatError(code, `${path || 'triangulation JSON'}: ${message}`, path);
}

/**
 * Reads a triangulation written by writeTriangulationJSON, treating it as
 * untrusted: the mesh goes through readMeshJSON (structure, twins, cycles,
 * orientation, local empty circles) and the site map is checked. Errors are
 * FormatErrors whose path names the field ("mesh.halfEdges.twin[3]",
 * "siteOfInput[12]", ...).
 */
export function readTriangulationJSON(input: string | unknown): Triangulation {
  const data = parseJSONInput(input, 'triangulation JSON');
  if (data === null || typeof data !== 'object' || Array.isArray(data)) fail('bad-type', 'expected an object', '');
  const root = data as Record<string, unknown>;
  if (root.format !== TRIANGULATION_FORMAT) {
    fail('bad-format', `format is ${root.format === undefined ? 'missing' : JSON.stringify(root.format)}, expected "${TRIANGULATION_FORMAT}"`, 'format');
  }
  if (root.version !== TRIANGULATION_FORMAT_VERSION) {
    fail('bad-version', `unsupported version ${JSON.stringify(root.version)}; this reader knows version ${TRIANGULATION_FORMAT_VERSION}`, 'version');
  }
  let mesh;
  try {
    mesh = readMeshJSON(root.mesh);
  } catch (err) {
    if (err instanceof FormatError) {
      const path = err.path === '' || err.path === 'mesh' ? 'mesh' : `mesh.${err.path}`;
      throw new FormatError(err.code, `triangulation JSON, ${err.message}`, path);
    }
    throw err;
  }
  if (mesh.kind !== 'delaunay') fail('bad-kind', `the mesh is of kind "${mesh.kind}", expected "delaunay"`, 'mesh.kind');
  const n = mesh.vertexCount;
  if (mesh.faceCount === 1) {
    // No triangles: only right when the sites are collinear.
    const xy = mesh.vertexXY;
    for (let i = 2; i < n; i++) {
      if (orient(xy[0], xy[1], xy[2], xy[3], xy[2 * i], xy[2 * i + 1]) !== 0) {
        fail('invalid-mesh', `no triangles, but vertex ${i} is off the line of vertices 0 and 1`, 'mesh');
      }
    }
  }
  const list = root.siteOfInput;
  if (!Array.isArray(list)) fail('bad-type', 'expected an array', 'siteOfInput');
  if (list.length < n) fail('bad-length', `${list.length} entries for ${n} sites; every site comes from some input point`, 'siteOfInput');
  const siteOfInput = new Int32Array(list.length);
  let seen = 0;
  for (let i = 0; i < list.length; i++) {
    const v = list[i];
    const at = `siteOfInput[${i}]`;
    if (typeof v !== 'number' || !Number.isInteger(v)) fail('not-integer', `${JSON.stringify(v)} is not an integer`, at);
    if (v < 0 || v >= n) fail('out-of-range', `${v} is not a site index in [0, ${n})`, at);
    // Sites are numbered by first appearance: a new site must be the next number.
    if (v > seen) fail('bad-site-map', `site ${v} appears before site ${seen}`, at);
    if (v === seen) seen++;
    siteOfInput[i] = v;
  }
  if (seen !== n) fail('bad-site-map', `sites ${seen}..${n - 1} have no input point`, 'siteOfInput');
  return Triangulation.fromMesh(mesh, siteOfInput);
}
