import type { Triangulation } from '../../triangulate/triangulation.js';

/** Compressed adjacency of the Delaunay graph: the neighbours of s are adj[off[s]..off[s+1]). */
export function adjacency(tri: Triangulation): { off: Int32Array; adj: Int32Array } {
  const n = tri.siteCount, edges = tri.edges();
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
