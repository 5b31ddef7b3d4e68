import { orient, inCircle } from '../../src/core/predicates.js';

/**
 * Brute-force Delaunay checks with the exact predicates, independent of the
 * triangulation code: they only read site coordinates and triangle triples.
 *
 * The empty-circle characterisation (B. Delaunay, "Sur la sphère vide", 1934):
 * a triangulation of a point set is Delaunay iff no site lies strictly inside
 * the circumcircle of any triangle. Local version (Lawson 1977, and Delaunay's
 * lemma): for a triangulation of the convex hull, it suffices that every
 * interior edge is locally Delaunay, i.e. the vertex opposite across the edge
 * is not strictly inside the circle of the triangle on this side.
 */

export interface Violation {
  triangle: [number, number, number];
  site: number;
  message: string;
}

/** Triangles with non-positive exact orientation (not counter-clockwise or degenerate). */
export function orientationViolations(xy: ArrayLike<number>, tri: ArrayLike<number>): string[] {
  const out: string[] = [];
  for (let t = 0; 3 * t < tri.length; t++) {
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    const o = orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1]);
    if (!(o > 0)) out.push(`triangle ${t} (${a},${b},${c}) has orient ${o}, expected > 0`);
  }
  return out;
}

/** O(T * n): every site against every triangle's circle. */
export function globalEmptyCircleViolations(xy: ArrayLike<number>, tri: ArrayLike<number>): Violation[] {
  const n = xy.length >> 1;
  const out: Violation[] = [];
  for (let t = 0; 3 * t < tri.length; t++) {
    const a = tri[3 * t], b = tri[3 * t + 1], c = tri[3 * t + 2];
    for (let s = 0; s < n; s++) {
      if (s === a || s === b || s === c) continue;
      const v = inCircle(
        xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], xy[2 * s], xy[2 * s + 1],
      );
      if (v > 0) {
        out.push({ triangle: [a, b, c], site: s, message: `site ${s} strictly inside circle of triangle (${a},${b},${c})` });
      }
    }
  }
  return out;
}

/**
 * Interior edges as (a, b, c, d): triangle (a, b, c) on the left of a->b and
 * (b, a, d) on the other side. Also reports edges used by more than one
 * triangle in the same direction (not a manifold), which a caller must treat
 * as a failure.
 */
export function interiorEdges(tri: ArrayLike<number>): { quads: [number, number, number, number][]; problems: string[] } {
  const apex = new Map<string, number>();
  const problems: string[] = [];
  for (let t = 0; 3 * t < tri.length; t++) {
    for (let k = 0; k < 3; k++) {
      const a = tri[3 * t + k], b = tri[3 * t + ((k + 1) % 3)], c = tri[3 * t + ((k + 2) % 3)];
      const key = `${a},${b}`;
      if (apex.has(key)) problems.push(`directed edge ${a}->${b} appears in two triangles`);
      apex.set(key, c);
    }
  }
  const quads: [number, number, number, number][] = [];
  for (const [key, c] of apex) {
    const [a, b] = key.split(',').map(Number);
    if (a > b) continue; // each interior edge once
    const d = apex.get(`${b},${a}`);
    if (d !== undefined) quads.push([a, b, c, d]);
  }
  return { quads, problems };
}

/** Interior edges whose opposite vertex is strictly inside the neighbouring circle. */
export function localDelaunayViolations(xy: ArrayLike<number>, tri: ArrayLike<number>): string[] {
  const { quads, problems } = interiorEdges(tri);
  const out = problems.slice();
  for (const [a, b, c, d] of quads) {
    const v = inCircle(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], xy[2 * d], xy[2 * d + 1]);
    if (v > 0) out.push(`edge (${a},${b}): site ${d} strictly inside circle of (${a},${b},${c})`);
  }
  return out;
}

/**
 * True when the Delaunay triangulation is unique: every interior edge is
 * STRICTLY locally Delaunay (no 4 cocircular sites on an empty circle).
 */
export function isStrictlyDelaunay(xy: ArrayLike<number>, tri: ArrayLike<number>): boolean {
  const { quads, problems } = interiorEdges(tri);
  if (problems.length > 0) return false;
  for (const [a, b, c, d] of quads) {
    const v = inCircle(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], xy[2 * d], xy[2 * d + 1]);
    if (!(v < 0)) return false;
  }
  return true;
}

/** The triangles as sorted "a,b,c" keys of sorted index triples (orientation ignored). */
export function canonicalTriangles(tri: ArrayLike<number>, map?: ArrayLike<number>): string[] {
  const keys: string[] = [];
  for (let t = 0; 3 * t < tri.length; t++) {
    const v = [tri[3 * t], tri[3 * t + 1], tri[3 * t + 2]].map((i) => (map ? map[i] : i));
    v.sort((p, q) => p - q);
    keys.push(v.join(','));
  }
  return keys.sort();
}

/** The triangles as sorted keys of their corner coordinates (numbering-free). */
export function triangleCoordinateKeys(xy: ArrayLike<number>, tri: ArrayLike<number>): string[] {
  const keys: string[] = [];
  for (let t = 0; 3 * t < tri.length; t++) {
    const corners = [tri[3 * t], tri[3 * t + 1], tri[3 * t + 2]].map((s) => `${xy[2 * s]} ${xy[2 * s + 1]}`);
    corners.sort();
    keys.push(corners.join('|'));
  }
  return keys.sort();
}

/** Undirected edges of a set of triangles as sorted "a,b" keys (a < b). */
export function triangleEdgeKeys(tri: ArrayLike<number>): string[] {
  const set = new Set<string>();
  for (let t = 0; 3 * t < tri.length; t++) {
    for (let k = 0; k < 3; k++) {
      const a = tri[3 * t + k], b = tri[3 * t + ((k + 1) % 3)];
      set.add(a < b ? `${a},${b}` : `${b},${a}`);
    }
  }
  return [...set].sort();
}

/** Number of distinct points of an interleaved array (-0 equals 0). */
export function distinctCount(xy: ArrayLike<number>): number {
  const set = new Set<string>();
  for (let i = 0; i + 1 < xy.length; i += 2) set.add(`${xy[i] + 0},${xy[i + 1] + 0}`);
  return set.size;
}
