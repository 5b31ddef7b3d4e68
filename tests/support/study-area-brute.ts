import { orient, type StudyAreaCells } from '../../src/index.js';

/**
 * Brute-force references for study-area clipping. Orientation signs come from the library's exact
 * orient (Shewchuk's adaptive predicates, tested on its own in tests/unit/predicates.test.ts): the
 * BigInt version in voronoi-brute.ts gives the same signs but made 1000 runs too slow for CI.
 */

export type Ring = [number, number][];

/** Shoelace formula (Gauss's area formula), the reference area; absolute value. */
export function shoelace(ring: Ring): number {
  let a2 = 0;
  for (let i = 0, h = ring.length - 1; i < ring.length; h = i++) a2 += ring[h][0] * ring[i][1] - ring[i][0] * ring[h][1];
  return Math.abs(a2 / 2);
}

/** 1 strictly inside the ring, 0 on it, -1 outside: exact crossing parity (rings as flat or pair lists). */
export function locateInRing(ring: ArrayLike<number>, x: number, y: number): number {
  const m = ring.length >> 1;
  let inside = false;
  for (let i = 0, h = m - 1; i < m; h = i++) {
    const ax = ring[2 * h], ay = ring[2 * h + 1], bx = ring[2 * i], by = ring[2 * i + 1];
    const o = orient(ax, ay, bx, by, x, y);
    if (o === 0 && x >= Math.min(ax, bx) && x <= Math.max(ax, bx) && y >= Math.min(ay, by) && y <= Math.max(ay, by)) return 0;
    if ((ay > y) !== (by > y) && (by > ay ? o > 0 : o < 0)) inside = !inside;
  }
  return inside ? 1 : -1;
}

/** 1 inside the polygons-with-holes, 0 on a ring, -1 outside. */
export function locateInArea(polygons: Ring[][], x: number, y: number): number {
  let inside = false;
  for (const poly of polygons) {
    for (const ring of poly) {
      const at = locateInRing(ring.flat(), x, y);
      if (at === 0) return 0;
      if (at > 0) inside = !inside;
    }
  }
  return inside ? 1 : -1;
}

/** Distance from (x, y) to the nearest edge of a flat ring (floating point). */
export function distanceToRing(ring: ArrayLike<number>, x: number, y: number): number {
  const m = ring.length >> 1;
  let best = Infinity;
  for (let i = 0, h = m - 1; i < m; h = i++) {
    const ax = ring[2 * h], ay = ring[2 * h + 1], dx = ring[2 * i] - ax, dy = ring[2 * i + 1] - ay;
    const len2 = dx * dx + dy * dy;
    const t = len2 > 0 ? Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / len2)) : 0;
    best = Math.min(best, Math.hypot(x - ax - t * dx, y - ay - t * dy));
  }
  return best;
}

/** Every piece holding (x, y) strictly (inside its outer ring, outside its holes), as [site, piece]. */
export function holders(c: StudyAreaCells, x: number, y: number): { sites: number[]; nearBoundary: number } {
  const sites: number[] = [];
  let near = Infinity;
  for (let s = 0; s < c.siteCount; s++) {
    for (const p of c.pieces(s)) {
      near = Math.min(near, distanceToRing(p.outer, x, y), ...p.holes.map((h) => distanceToRing(h, x, y)));
      if (locateInRing(p.outer, x, y) > 0 && p.holes.every((h) => locateInRing(h, x, y) < 0)) sites.push(s);
    }
  }
  return { sites, nearBoundary: near };
}

/** Signed area of a flat ring (floating point, shoelace relative to its first vertex). */
export function signedArea(ring: ArrayLike<number>): number {
  const m = ring.length >> 1, ox = ring[0], oy = ring[1];
  let a2 = 0;
  for (let i = 0, h = m - 1; i < m; h = i++) a2 += (ring[2 * h] - ox) * (ring[2 * i + 1] - oy) - (ring[2 * i] - ox) * (ring[2 * h + 1] - oy);
  return a2 / 2;
}
