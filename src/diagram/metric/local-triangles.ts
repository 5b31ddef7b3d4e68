import type { TriangleStore } from '../../triangulate/store.js';

/**
 * The real triangles of a finished store (ghosts dropped), renumbered so
 * that neighbours sit near each other in memory: by the least vertex of
 * each, vertices being numbered along a space-filling curve. The store's
 * own numbering follows the insertions and their flips, and the edge pass
 * of the dual route, which reads the triangle across every edge, spent much
 * of its time waiting on memory with it.
 *
 * Layout as the store's: half-edges 3t, 3t + 1, 3t + 2 of triangle t,
 * counter-clockwise, `vert` their origins, `twin` their opposites, -1
 * across the hull (where the store had a ghost).
 */
export interface LocalTriangles { count: number; vert: Int32Array; twin: Int32Array }

export function localTriangles(store: TriangleStore, vertexCount: number): LocalTriangles {
  const sv = store.vert, st = store.twin, total = store.count;
  // Counting sort by least vertex: slot[t] = new number of store triangle t, -1 for a ghost.
  const start = new Int32Array(vertexCount + 1);
  const key = new Int32Array(total);
  for (let t = 0; t < total; t++) {
    const a = sv[3 * t], b = sv[3 * t + 1], c = sv[3 * t + 2];
    if (a < 0 || b < 0 || c < 0) { key[t] = -1; continue; }
    const k = a < b ? (a < c ? a : c) : b < c ? b : c;
    key[t] = k;
    start[k + 1]++;
  }
  for (let k = 0; k < vertexCount; k++) start[k + 1] += start[k];
  const count = start[vertexCount];
  const slot = key;
  for (let t = 0; t < total; t++) if (key[t] >= 0) slot[t] = start[key[t]]++;
  const vert = new Int32Array(3 * count), twin = new Int32Array(3 * count);
  for (let t = 0; t < total; t++) {
    const s = slot[t];
    if (s < 0) continue;
    for (let j = 0; j < 3; j++) {
      const y = st[3 * t + j], u = slot[(y / 3) | 0];
      vert[3 * s + j] = sv[3 * t + j];
      twin[3 * s + j] = u < 0 ? -1 : 3 * u + (y % 3);
    }
  }
  return { count, vert, twin };
}
