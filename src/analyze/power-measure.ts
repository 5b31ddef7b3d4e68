import type { VoronoiDiagram } from '../diagram/voronoi.js';
import type { PowerCellMeasure } from './balance-areas.js';

/**
 * Cell areas and the edges cells share inside the region, read off a
 * (power) diagram's mesh: every half-edge whose two faces are both cells
 * gives one shared edge, seen once from the side with the smaller index.
 */
export function measureCells(d: VoronoiDiagram): PowerCellMeasure {
  const m = d.mesh, xy = m.vertexXY, edges = m.origin.length;
  const pairs: number[] = [], lengths: number[] = [];
  for (let h = 0; h < edges; h++) {
    const t = m.twin[h];
    if (h > t) continue;
    const f = m.face[h], g = m.face[t];
    if (f === m.outerFace || g === m.outerFace) continue;
    const p = m.origin[h], q = m.origin[t];
    pairs.push(m.faceSite[f], m.faceSite[g]);
    lengths.push(Math.hypot(xy[2 * q] - xy[2 * p], xy[2 * q + 1] - xy[2 * p + 1]));
  }
  return { areas: d.cellAreas(), pairs: Int32Array.from(pairs), lengths: Float64Array.from(lengths) };
}
