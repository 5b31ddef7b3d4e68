import type { VoronoiDiagram } from '../../src/index.js';
import { boundingBox, polygonPerimeter, ulp } from './voronoi-brute.js';

/**
 * How far apart two constructions of the same diagram may be. `size` is the
 * larger side of the region's bounding box. Positions: 1e-9 * size (the
 * issue's tolerance) plus 4 ulps of the largest region coordinate, because
 * where four or more sites are cocircular the two constructions may compute
 * the shared vertex from different triples of them, which round differently,
 * and at an offset of 1e7 with a region 1e-2 wide an ulp (1.9e-9) is more
 * than 1e-9 * size: nothing finer is representable there.
 */
export function diagramTolerance(d: VoronoiDiagram): { size: number; slack: number; tol: number } {
  const rb = boundingBox(d.region);
  const size = Math.max(rb.maxX - rb.minX, rb.maxY - rb.minY);
  const M = Math.max(Math.abs(rb.minX), Math.abs(rb.maxX), Math.abs(rb.minY), Math.abs(rb.maxY));
  const slack = 4 * ulp(M);
  return { size, slack, tol: 1e-9 * size + slack };
}

/** Site pairs whose cells share a boundary of nonzero length, as "a,b" (a < b) mapped to that length. */
export function cellPairs(d: VoronoiDiagram): Map<string, number> {
  const m = d.mesh, xy = m.vertexXY, out = new Map<string, number>();
  for (let e = 0; e < m.origin.length; e++) {
    const f = m.face[e], g = m.face[m.twin[e]];
    if (f === m.outerFace || g === m.outerFace) continue;
    const a = m.faceSite[f], b = m.faceSite[g];
    if (a >= b) continue;
    const u = m.origin[e], v = m.origin[m.twin[e]];
    const k = `${a},${b}`;
    out.set(k, (out.get(k) ?? 0) + Math.hypot(xy[2 * v] - xy[2 * u], xy[2 * v + 1] - xy[2 * u + 1]));
  }
  return out;
}

/** Vertices of `a` with no vertex of `b` within `tol` (max norm), found through a hash grid of b's vertices. */
function unmatchedVertices(a: Float64Array, b: Float64Array, tol: number): string[] {
  const cell = 2 * tol, grid = new Map<string, number[]>();
  for (let j = 0; j < b.length; j += 2) {
    const k = `${Math.floor(b[j] / cell)},${Math.floor(b[j + 1] / cell)}`;
    const list = grid.get(k);
    if (list) list.push(j); else grid.set(k, [j]);
  }
  const out: string[] = [];
  for (let i = 0; i < a.length; i += 2) {
    const gx = Math.floor(a[i] / cell), gy = Math.floor(a[i + 1] / cell);
    let hit = false;
    for (let dx = -1; dx <= 1 && !hit; dx++) {
      for (let dy = -1; dy <= 1 && !hit; dy++) {
        for (const j of grid.get(`${gx + dx},${gy + dy}`) ?? []) {
          if (Math.abs(a[i] - b[j]) <= tol && Math.abs(a[i + 1] - b[j + 1]) <= tol) { hit = true; break; }
        }
      }
    }
    if (!hit) out.push(`(${a[i]}, ${a[i + 1]}) has none within ${tol}`);
  }
  return out;
}

/**
 * Everything in which two diagrams of the same input differ beyond the
 * tolerances: site numbering, region, the set of neighbouring cells, vertex
 * positions (both ways), and each cell's area. Empty when they agree.
 *
 * Neighbours: every pair must be in both, except a pair whose shared
 * boundary, in the diagram that has it, is no longer than 2 tol. Both
 * constructions merge Voronoi vertices of exactly cocircular sites, and also
 * centres that round to the very same point (src/diagram/dual.ts); a centre
 * is computed from one triple of sites relative to its first corner, so two
 * valid triangulations that list a triangle from another corner, or fan a
 * cocircular polygon differently, can round a one-ulp edge of nearly
 * cocircular sites to zero in one and not in the other. Such an edge is
 * within the position tolerance of nothing, so either answer is right.
 * Areas: 1e-9 relative, plus the cell's perimeter times tol, which is what
 * moving its vertices by the position tolerance can change. `placement` is
 * added to the position tolerance where a construction promises less than
 * a few ulps.
 */
export function diagramDifferences(got: VoronoiDiagram, want: VoronoiDiagram, label = 'sweep', placement = 0): string[] {
  const out: string[] = [];
  const tg = got.triangulation, tw = want.triangulation;
  if (tg.siteCount !== tw.siteCount) return [`${label}: ${tg.siteCount} sites, expected ${tw.siteCount}`];
  if (tg.dimension !== tw.dimension) out.push(`${label}: dimension ${tg.dimension}, expected ${tw.dimension}`);
  if (tg.siteOfInput.join() !== tw.siteOfInput.join()) out.push(`${label}: siteOfInput differs`);
  if (tg.siteXY.subarray(0, 2 * tg.siteCount).join() !== tw.siteXY.subarray(0, 2 * tw.siteCount).join()) out.push(`${label}: site coordinates differ`);
  if (got.region.join() !== want.region.join()) out.push(`${label}: region ${got.region} vs ${want.region}`);
  if (out.length > 0) return out;
  const pg = cellPairs(got), pw = cellPairs(want);
  const tol = diagramTolerance(want).tol + placement;
  for (const [k, len] of pg) if (!pw.has(k) && len > 2 * tol) out.push(`${label}: cells ${k} share ${len}, not neighbours in the reference`);
  for (const [k, len] of pw) if (!pg.has(k) && len > 2 * tol) out.push(`${label}: cells ${k} are not neighbours, the reference has them share ${len}`);
  for (const p of unmatchedVertices(got.mesh.vertexXY, want.mesh.vertexXY, tol)) out.push(`${label}: vertex ${p} of the reference's`);
  for (const p of unmatchedVertices(want.mesh.vertexXY, got.mesh.vertexXY, tol)) out.push(`${label}: reference vertex ${p} of ours`);
  const ag = got.cellAreas(), aw = want.cellAreas();
  for (let s = 0; s < tg.siteCount; s++) {
    const per = polygonPerimeter(want.cellPolygon(s));
    if (Math.abs(ag[s] - aw[s]) > 1e-9 * Math.abs(aw[s]) + per * tol) out.push(`${label}: cell ${s} has area ${ag[s]}, reference ${aw[s]}`);
  }
  return out;
}
