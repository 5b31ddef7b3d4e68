import type { Triangulation } from '../../triangulate/triangulation.js';

/** Compressed adjacency of the Delaunay graph: the neighbours of s are adj[off[s]..off[s+1]). */
export function adjacency(tri: Triangulation, edges: Int32Array = tri.edges()): { off: Int32Array; adj: Int32Array } {
  const n = tri.siteCount;
  const off = new Int32Array(n + 1);
  for (let e = 0; e < edges.length; e++) off[edges[e] + 1]++;
  for (let i = 0; i < n; i++) off[i + 1] += off[i];
  const fill = off.slice(0, n), adj = new Int32Array(edges.length);
  for (let e = 0; e < edges.length; e += 2) {
    const a = edges[e], b = edges[e + 1];
    adj[fill[a]++] = b;
    adj[fill[b]++] = a;
  }
  return { off, adj };
}

/**
 * The sites' coordinates and Delaunay adjacency with site order[k] renamed
 * k; each site's neighbours stay in the same order, so a search over the
 * graph visits them in the same order as before. `edges` is tri.edges(),
 * passed in by callers that already have it (it is not cached).
 */
export function renumbered(tri: Triangulation, order: ArrayLike<number>, edges: Int32Array = tri.edges()): { xy: Float64Array; off: Int32Array; adj: Int32Array } {
  const n = tri.siteCount, src = tri.siteXY, { off: o, adj: a } = adjacency(tri, edges);
  const rank = new Int32Array(n);
  for (let k = 0; k < n; k++) rank[order[k]] = k;
  const xy = new Float64Array(2 * n), off = new Int32Array(n + 1), adj = new Int32Array(a.length);
  for (let k = 0; k < n; k++) {
    const s = order[k];
    xy[2 * k] = src[2 * s]; xy[2 * k + 1] = src[2 * s + 1];
    let e = off[k];
    for (let f = o[s]; f < o[s + 1]; f++) adj[e++] = rank[a[f]];
    off[k + 1] = e;
  }
  return { xy, off, adj };
}
