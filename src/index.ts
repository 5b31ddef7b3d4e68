export { AmbitError, InputError, FormatError } from './core/errors.js';
export { orient, inCircle } from './core/predicates.js';
export { MAX_COORDINATE, MIN_COORDINATE } from './core/limits.js';
export type { PointInput, XY } from './core/input.js';
export { HalfEdgeMesh } from './mesh/mesh.js';
export type { MeshKind, MeshArrays } from './mesh/mesh.js';
export { triangulate, Triangulation } from './triangulate/triangulation.js';
export type { TriangulateOptions, InsertionOrder } from './triangulate/triangulation.js';
export { checkMesh, assertMesh } from './mesh/check.js';
export type { MeshCheckOptions, MeshCheckResult } from './mesh/check.js';
export { writeMeshJSON, readMeshJSON, meshToPlain, MESH_FORMAT, MESH_FORMAT_VERSION } from './mesh/json.js';
export type { MeshPlain } from './mesh/json.js';
export {
  writeTriangulationJSON, readTriangulationJSON, TRIANGULATION_FORMAT, TRIANGULATION_FORMAT_VERSION,
} from './triangulate/json.js';
export type { TriangulationPlain } from './triangulate/json.js';
export { voronoi, VoronoiDiagram } from './diagram/voronoi.js';
export type { VoronoiOptions, VoronoiMethod, CellNeighbors } from './diagram/voronoi.js';
export { MetricVoronoiDiagram } from './diagram/metric/diagram.js';
export type { Metric } from './diagram/metric/options.js';
export type { ExactMetric } from './diagram/metric/bisector.js';
export { readClipRegion } from './diagram/region.js';
export type { ClipRegion, RectRegion } from './diagram/region.js';
export { SiteLocator } from './query/site-locator.js';
export { compareDistance } from './core/distance.js';
export { powerTest, comparePowerDistance, MAX_WEIGHT, MIN_WEIGHT } from './core/power.js';
export { balanceTerritories, type BalanceOptions, type BalanceResult, type BalanceProgress } from './analyze/balance.js';
