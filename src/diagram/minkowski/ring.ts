import type { MeshParts } from './parts.js';

/**
 * Walks the region's boundary counter-clockwise, corners and crossings in
 * order, and adds its pieces as edges: each piece belongs to the cell just
 * after the crossing before it (`owner` when no cell boundary reaches the
 * region), the outer face lies on its other side. Crossings at one point
 * are ordered by the direction of their edges, so the cells between them
 * follow each other as around the point.
 */
/** Face label of the region's outside while building (faces are ranks until linkMesh). */
export const OUTER = -1;

export function addRing(parts: MeshParts, outer: number, owner: () => number): void {
  const r = parts.region, m = r.count;
  const ring: number[] = [];
  const after: number[] = [];
  for (let j = 0; j < m; j++) {
    ring.push(parts.points.add(r.xy[2 * j], r.xy[2 * j + 1]));
    after.push(-1);
    const list = parts.crossings[j].sort((u, v) => (u.along - v.along) || (v.angle - u.angle));
    for (const c of list) { ring.push(c.point); after.push(c.after); }
  }
  let cell = -1;
  for (let i = after.length - 1; i >= 0 && cell < 0; i--) cell = after[i];
  if (cell < 0) cell = owner();
  for (let i = 0; i < ring.length; i++) {
    if (after[i] >= 0) cell = after[i];
    parts.link(ring[i], ring[i + 1 === ring.length ? 0 : i + 1], cell, outer);
  }
}
