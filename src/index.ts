export { AmbitError, InputError, FormatError } from './core/errors.js';
export { orient, inCircle } from './core/predicates.js';
export { MAX_COORDINATE, MIN_COORDINATE } from './core/limits.js';
export type { PointInput, XY } from './core/input.js';
export { HalfEdgeMesh } from './mesh/mesh.js';
export type { MeshKind, MeshArrays } from './mesh/mesh.js';
export { triangulate, Triangulation } from './triangulate/triangulation.js';
export type { TriangulateOptions, InsertionOrder } from './triangulate/triangulation.js';
