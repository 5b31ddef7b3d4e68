import type { ClippedCells } from '../diagram/cells.js';

/**
 * The cell adjacency graph of a diagram (cells sharing a mesh edge), as
 * compressed rows: neighbours of site s are list[start[s] .. start[s + 1]).
 */
export function cellAdjacency(d: ClippedCells): { start: Int32Array; list: Int32Array } {
  const n = d.triangulation.siteCount, m = d.mesh, H = m.origin.length;
  const keys: number[] = [];
  for (let e = 0; e < H; e++) {
    const a = m.faceSite[m.face[e]], b = m.faceSite[m.face[m.twin[e]]];
    if (a >= 0 && b >= 0 && a < b) keys.push(a * n + b);
  }
  const sorted = Float64Array.from(keys).sort();
  const start = new Int32Array(n + 1), pairs: number[] = [];
  for (let i = 0; i < sorted.length; i++) {
    if (i > 0 && sorted[i] === sorted[i - 1]) continue;
    const a = Math.floor(sorted[i] / n), b = sorted[i] - a * n;
    pairs.push(a, b);
    start[a + 1]++; start[b + 1]++;
  }
  for (let s = 0; s < n; s++) start[s + 1] += start[s];
  const list = new Int32Array(start[n]), fill = start.slice(0, n);
  for (let i = 0; i < pairs.length; i += 2) {
    list[fill[pairs[i]]++] = pairs[i + 1];
    list[fill[pairs[i + 1]]++] = pairs[i];
  }
  return { start, list };
}

/**
 * Greedy colouring in smallest-last order: repeatedly set aside a vertex of
 * least remaining degree, then colour in reverse, each vertex taking the
 * smallest colour no coloured neighbour has. A planar graph always has a
 * vertex of degree at most 5 (Euler's formula), so this uses at most 6
 * colours on the adjacency graph of a planar subdivision.
 */
export function greedyColoring(start: Int32Array, list: Int32Array): Int32Array {
  const n = start.length - 1;
  const degree = new Int32Array(n);
  let maxDeg = 0;
  for (let v = 0; v < n; v++) { degree[v] = start[v + 1] - start[v]; maxDeg = Math.max(maxDeg, degree[v]); }
  // Buckets by degree as doubly linked lists in typed arrays.
  const head = new Int32Array(maxDeg + 1).fill(-1), nextV = new Int32Array(n), prevV = new Int32Array(n);
  const link = (v: number): void => {
    const d = degree[v];
    prevV[v] = -1; nextV[v] = head[d];
    if (head[d] >= 0) prevV[head[d]] = v;
    head[d] = v;
  };
  const unlink = (v: number): void => {
    if (prevV[v] >= 0) nextV[prevV[v]] = nextV[v]; else head[degree[v]] = nextV[v];
    if (nextV[v] >= 0) prevV[nextV[v]] = prevV[v];
  };
  for (let v = n - 1; v >= 0; v--) link(v);
  const removed = new Uint8Array(n), order = new Int32Array(n);
  let low = 0;
  for (let k = 0; k < n; k++) {
    while (head[low] < 0) low++;
    const v = head[low];
    unlink(v);
    removed[v] = 1;
    order[k] = v;
    for (let i = start[v]; i < start[v + 1]; i++) {
      const w = list[i];
      if (removed[w]) continue;
      unlink(w); degree[w]--; link(w);
    }
    low = Math.max(0, low - 1);
  }
  const color = new Int32Array(n).fill(-1), used = new Int32Array(maxDeg + 2).fill(-1);
  for (let k = n - 1; k >= 0; k--) {
    const v = order[k];
    for (let i = start[v]; i < start[v + 1]; i++) if (color[list[i]] >= 0) used[color[list[i]]] = v;
    let c = 0;
    while (used[c] === v) c++;
    color[v] = c;
  }
  return color;
}
