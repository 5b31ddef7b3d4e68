import { AmbitError } from '../../core/errors.js';
import { HalfEdgeMesh } from '../../mesh/mesh.js';
import type { MeshParts } from './parts.js';
import { OUTER } from './ring.js';

/**
 * Links the pieces into one half-edge mesh of kind 'voronoi'. Around every
 * point, each face appears on the left of at most one outgoing half-edge
 * (a Voronoi vertex sees each of its cells once; a bend, a crossing, a
 * region corner sees two or three different faces), so the half-edge after
 * e is the one leaving e's end with e's face on its left; no angles are
 * compared. Where a face comes twice (a cell pinched at a point), the
 * first of them clockwise from e's twin is taken, as in any planar map.
 * At a bend (see MeshParts.bend: most points, the inside of each edge's
 * polyline) there is nothing to search: the successor is the next edge of
 * the run, so the search, and its index, covers the other points only.
 *
 * A caller that knows successors itself (the L1/L-infinity dual route, at
 * Voronoi vertices, from the triangles) passes them in `known` (length the
 * half-edge count, -1 where unknown): those half-edges are not searched.
 * At any point, either every half-edge arriving is known or none is, since
 * the search at a point needs every half-edge leaving it.
 *
 * Faces are renumbered from ranks to input sites (`siteOf`); the outer
 * face, OUTER while building, becomes n, the site count. A face whose edges form more than one
 * cycle (a cell meeting the region in separate pieces) is refused.
 */
export function linkMesh(
  parts: MeshParts, n: number, siteOf: Int32Array, isOutside: (rank: number) => boolean, known: Int32Array | null = null,
): { mesh: HalfEdgeMesh; faceOfSite: Int32Array } {
  const H = parts.origin.count, V = parts.points.count;
  // The lists become the mesh's arrays: views when they are nearly full (see MeshParts.room), since copying
  // costs about as much as filling them; `face` is renumbered in place below, so `parts` is spent.
  const tight = <A extends Int32Array | Float64Array>(a: A, k: number): A => (k < 0.9 * a.length ? a.slice(0, k) : a.subarray(0, k)) as A;
  const origin = tight(parts.origin.a, H), rankFace = tight(parts.face.a, H);
  const xy = tight(parts.points.xy, 2 * V);
  const next = known ?? new Int32Array(H), twin = new Int32Array(H);
  for (let e = 0; e < H; e++) twin[e] = e ^ 1;
  // At a bend the successor is known (edges k and k + 1 of a run: 2k goes on to 2k + 2, 2k + 3 back to 2k + 1).
  const runs = parts.bends.a, R = parts.bends.count;
  for (let i = 0; i < R; i += 2) {
    const last = runs[i + 1];
    for (let k = runs[i]; k < last; k++) {
      if (origin[2 * k + 1] !== origin[2 * k + 2]) throw new AmbitError('internal', `minkowski diagram: edges ${k} and ${k + 1} meet at no bend`);
      next[2 * k] = 2 * k + 2; next[2 * k + 3] = 2 * k + 1;
    }
  }
  // The rest end at the other points; their twins are the half-edges leaving those, by which the points are
  // indexed: `slot` (1 + a point's index) is touched only at them.
  const ends = endingElsewhere(runs, R, H >> 1, known), G = ends.length;
  const slot = new Int32Array(V), off = new Int32Array(G + 1), out = new Int32Array(G);
  let used = 0;
  for (let i = 0; i < G; i++) {
    const v = origin[ends[i] ^ 1];
    if (slot[v] === 0) slot[v] = ++used;
    off[slot[v]]++;
  }
  for (let c = 0; c < used; c++) off[c + 1] += off[c];
  // Each point's list in increasing half-edge order (ends[i] ^ 1 only swaps the two of one edge, which leave
  // different points).
  const fill = off.slice(0, used);
  for (let i = 0; i < G; i++) { const g = ends[i] ^ 1; out[fill[slot[origin[g]] - 1]++] = g; }
  for (let i = 0; i < G; i++) {
    const e = ends[i];
    const t = e ^ 1, v = origin[t], f = rankFace[e], c = slot[v] - 1, lo = off[c], hi = off[c + 1];
    let found = -1, count = 0;
    for (let k = lo; k < hi; k++) {
      const g = out[k];
      if (g !== t && rankFace[g] === f) { found = g; count++; }
    }
    if (count > 1) found = clockwiseFrom(xy, origin, out, lo, hi, rankFace, t, f);
    if (found < 0) {
      const around: string[] = [];
      for (let k = lo; k < hi; k++) around.push(`${out[k]}:${rankFace[out[k]]}/${rankFace[out[k] ^ 1]}`);
      throw new AmbitError('internal', `minkowski diagram: half-edge ${e} of face ${f} has no successor at point ${v} (${xy[2 * v]}, ${xy[2 * v + 1]}); leaving it: ${around.join(' ')}`);
    }
    next[e] = found;
  }
  const N = siteOf.length;
  for (let e = 0; e < H; e++) {
    const f = rankFace[e];
    if (f !== OUTER && siteOf[f] < 0) throw new AmbitError('internal', `minkowski diagram: a guard site's cell reached the region`);
  }
  // One cycle per face, walked by rank (N for the outer face): ranks follow the curve, so the first half-edge
  // of each face is recorded in nearby memory, where the input's numbering would scatter it.
  const edgeOfRank = new Int32Array(N + 1).fill(-1);
  const seen = new Int32Array((H + 31) >> 5);
  for (let e = 0; e < H; e++) {
    if (seen[e >> 5] & (1 << (e & 31))) continue;
    const rank = rankFace[e], r = rank === OUTER ? N : rank;
    if (edgeOfRank[r] >= 0) {
      const f = rank === OUTER ? n : siteOf[rank];
      throw new AmbitError('unsupported-geometry', isOutside(rank)
        ? `the cell of site ${f}, which lies outside the clip region, meets the region in separate pieces; this is not supported yet`
        : `the cell of site ${f} came out in separate pieces (a rounding problem in the Minkowski diagram)`);
    }
    edgeOfRank[r] = e;
    let x = e;
    do {
      const w = x >> 5, bit = 1 << (x & 31);
      if (seen[w] & bit) throw new AmbitError('internal', `minkowski diagram: the walk around face ${rank === OUTER ? n : siteOf[rank]} from half-edge ${e} ran into another cycle at ${x}`);
      seen[w] |= bit;
      x = next[x];
    } while (x !== e);
  }
  const face = rankFace;
  for (let e = 0; e < H; e++) { const f = face[e]; face[e] = f === OUTER ? n : siteOf[f]; }
  const faceEdge = new Int32Array(n + 1).fill(-1), faceSite = new Int32Array(n + 1);
  for (let s = 0; s < n; s++) faceSite[s] = s;
  faceSite[n] = -1;
  for (let r = 0; r < N; r++) if (siteOf[r] >= 0) faceEdge[siteOf[r]] = edgeOfRank[r];
  faceEdge[n] = edgeOfRank[N];
  const faceOfSite = new Int32Array(n);
  for (let s = 0; s < n; s++) faceOfSite[s] = faceEdge[s] >= 0 ? s : -1;
  const mesh = new HalfEdgeMesh({ kind: 'voronoi', vertexXY: xy, origin, twin, next, face, faceEdge, faceSite, outerFace: n });
  return { mesh, faceOfSite };
}

/**
 * The half-edges, in increasing order, that end at a point other than a
 * bend, given the runs (first and last edge, in increasing order, apart).
 * Edge k of a run [f, l] ends at a bend when k < l and starts at one when
 * k > f: so 2k (along) ends elsewhere only at k = l, 2k + 1 (back) only at
 * k = f; both half-edges of an edge outside every run do.
 */
function endingElsewhere(runs: Int32Array, R: number, E: number, known: Int32Array | null): Int32Array {
  let inRuns = 0;
  for (let i = 0; i < R; i += 2) inRuns += runs[i + 1] - runs[i] + 1;
  const ends = new Int32Array(2 * (E - inRuns) + R);
  let c = 0, k = 0;
  // Half-edges whose successor is known are left out.
  const add = (e: number): void => { if (known === null || known[e] < 0) ends[c++] = e; };
  for (let i = 0; i <= R; i += 2) {
    const f = i < R ? runs[i] : E;
    for (; k < f; k++) { add(2 * k); add(2 * k + 1); }
    if (i === R) break;
    const l = runs[i + 1];
    add(2 * f + 1);
    add(2 * l);
    k = l + 1;
  }
  return ends.subarray(0, c);
}

/** Among the half-edges out[lo..hi) leaving e's end with face f on the left, the first clockwise from e's twin t. */
function clockwiseFrom(xy: Float64Array, origin: Int32Array, out: Int32Array, lo: number, hi: number, face: Int32Array, t: number, f: number): number {
  const v = origin[t], x = xy[2 * v], y = xy[2 * v + 1];
  const angle = (g: number): number => { const w = origin[g ^ 1]; return Math.atan2(xy[2 * w + 1] - y, xy[2 * w] - x); };
  const base = angle(t);
  let best = -1, bestTurn = Infinity;
  for (let k = lo; k < hi; k++) {
    const g = out[k];
    if (g === t || face[g] !== f) continue;
    let turn = base - angle(g);
    while (turn <= 0) turn += 2 * Math.PI;
    if (turn < bestTurn) { bestTurn = turn; best = g; }
  }
  return best;
}
