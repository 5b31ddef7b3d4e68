import { HalfEdgeMesh } from '../../mesh/mesh.js';

/**
 * Finished cells, flat: cell s has corners start[s]..start[s]+size[s]-1
 * (none when it misses the region), corner i at xy[2i], xy[2i+1], and edge
 * i (from corner i to the next) has label[i]: the site across, or negative
 * for the region's boundary. Cells may be added in any order.
 */
export class CellStore {
  readonly start: Int32Array;
  readonly size: Int32Array;
  xy = new Float64Array(1024);
  label = new Int32Array(512);
  count = 0;
  constructor(n: number) { this.start = new Int32Array(n); this.size = new Int32Array(n); }
  /** Adds cell s (pass no corners for an empty cell). */
  add(s: number, pts: readonly { x: number; y: number }[], labels: readonly number[]): void {
    const m = pts.length;
    if (this.count + m > this.label.length) {
      const size = Math.max(2 * this.label.length, this.count + m);
      const xy = new Float64Array(2 * size), label = new Int32Array(size);
      xy.set(this.xy); label.set(this.label);
      this.xy = xy; this.label = label;
    }
    for (let i = 0; i < m; i++) {
      // + 0 turns -0 into 0, as input coordinates are read.
      this.xy[2 * (this.count + i)] = pts[i].x + 0;
      this.xy[2 * (this.count + i) + 1] = pts[i].y + 0;
      this.label[this.count + i] = labels[i];
    }
    this.start[s] = this.count;
    this.size[s] = m;
    this.count += m;
  }
}

/**
 * One half-edge mesh from cells built independently. Every cell is exact,
 * so the boundary a cell shares with site t, seen from t, is the same
 * polyline walked backwards: runs of edges with the same neighbour are
 * paired up, their half-edges become twins, and their corners are merged
 * into shared vertices (union-find over corners), each placed where the
 * first cell that reached it computed it. Edges on the region's boundary
 * get twins on the outer face, which walks the boundary clockwise.
 */
export function assembleCells(store: CellStore, n: number, kind: 'voronoi'): { mesh: HalfEdgeMesh; faceOfSite: Int32Array } {
  const { start: base, xy: cxy, label } = store;
  const H = store.count;
  const size = (s: number): number => store.size[s];
  // Runs: maximal stretches of one cell's boundary with the same neighbouring site.
  const runCell = new Int32Array(H), runStart = new Int32Array(H), runLen = new Int32Array(H), runOther = new Int32Array(H);
  let R = 0, regionEdges = 0;
  for (let s = 0; s < n; s++) {
    const m = size(s), b = base[s];
    if (m === 0) continue;
    let first = 0;
    while (first < m && label[b + first] === label[b + (first + m - 1) % m]) first++;
    if (first === m) throw new Error(`metric cells: cell ${s} has one label all around`);
    for (let i = 0; i < m;) {
      const at = (first + i) % m, lab = label[b + at];
      let len = 1;
      while (i + len < m && label[b + (first + i + len) % m] === lab) len++;
      if (lab >= 0) { runCell[R] = s; runStart[R] = at; runLen[R] = len; runOther[R] = lab; R++; }
      else regionEdges += len;
      i += len;
    }
  }
  const lo = (r: number): number => Math.min(runCell[r], runOther[r]), hi = (r: number): number => Math.max(runCell[r], runOther[r]);
  const order = sortRuns(R, n, lo, (a, b) => hi(a) - hi(b) || runCell[a] - runCell[b] || along(a) - along(b));

  // For a pair with more than one shared stretch (rare), orders them along the bisector.
  function along(r: number): number {
    const p = base[runCell[r]] + runStart[r], a = base[lo(r)], b = base[hi(r)];
    const dx = cxy[2 * b] - cxy[2 * a], dy = cxy[2 * b + 1] - cxy[2 * a + 1];
    const t = -dy * cxy[2 * p] + dx * cxy[2 * p + 1];
    return runCell[r] === a ? t : -t;
  }

  const twin = new Int32Array(H + regionEdges).fill(-1);
  const parent = new Int32Array(H);
  for (let i = 0; i < H; i++) parent[i] = i;
  const find = (v: number): number => {
    while (parent[v] !== v) { parent[v] = parent[parent[v]]; v = parent[v]; }
    return v;
  };
  const union = (a: number, b: number): void => {
    const ra = find(a), rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  };
  const slot = (s: number, i: number): number => base[s] + (i % size(s));
  for (let q = 0; q < R;) {
    let end = q;
    while (end < R && lo(order[end]) === lo(order[q]) && hi(order[end]) === hi(order[q])) end++;
    let mid = q;
    while (mid < end && runCell[order[mid]] === lo(order[q])) mid++;
    if (mid - q !== end - mid) {
      throw new Error(`metric cells: sites ${lo(order[q])} and ${hi(order[q])} share ${mid - q} and ${end - mid} stretches seen from either side`);
    }
    for (let k = 0; q + k < mid; k++) {
      const r1 = order[q + k], r2 = order[end - 1 - k];
      const len = runLen[r1];
      if (runLen[r2] !== len) throw new Error(`metric cells: the boundary of sites ${runCell[r1]} and ${runCell[r2]} has ${len} and ${runLen[r2]} edges seen from either side`);
      const s1 = runCell[r1], s2 = runCell[r2];
      for (let i = 0; i < len; i++) {
        const e = slot(s1, runStart[r1] + i), f = slot(s2, runStart[r2] + len - 1 - i);
        twin[e] = f; twin[f] = e;
        union(e, slot(s2, runStart[r2] + len - i));
        union(slot(s1, runStart[r1] + i + 1), f);
      }
    }
    q = end;
  }

  // Vertices: one per class of corners.
  const vertexOf = new Int32Array(H).fill(-1);
  const xy = new Float64Array(2 * H);
  const origin = new Int32Array(H + regionEdges), next = new Int32Array(H + regionEdges), face = new Int32Array(H + regionEdges);
  let V = 0;
  for (let s = 0; s < n; s++) {
    const m = size(s);
    for (let i = 0; i < m; i++) {
      const e = base[s] + i, r = find(e);
      if (vertexOf[r] < 0) {
        xy[2 * V] = cxy[2 * r]; xy[2 * V + 1] = cxy[2 * r + 1];
        vertexOf[r] = V++;
      }
      origin[e] = vertexOf[r];
      next[e] = base[s] + ((i + 1) % m);
      face[e] = s;
    }
  }
  // The outer face: a twin for every edge on the region's boundary, linked around it.
  const outerFrom = new Int32Array(V).fill(-1);
  let o = H;
  for (let e = 0; e < H; e++) {
    if (twin[e] >= 0) continue;
    twin[e] = o; twin[o] = e;
    origin[o] = origin[next[e]];
    face[o] = n;
    outerFrom[origin[o]] = o;
    o++;
  }
  for (let k = H; k < o; k++) next[k] = outerFrom[origin[twin[k]]];
  const faceEdge = new Int32Array(n + 1).fill(-1), faceSite = new Int32Array(n + 1).fill(-1);
  const faceOfSite = new Int32Array(n).fill(-1);
  for (let s = 0; s < n; s++) {
    faceSite[s] = s;
    if (size(s) > 0) { faceEdge[s] = base[s]; faceOfSite[s] = s; }
  }
  if (o > H) faceEdge[n] = H;
  const mesh = new HalfEdgeMesh({
    kind, vertexXY: xy.slice(0, 2 * V), origin: origin.subarray(0, o), twin: twin.subarray(0, o),
    next: next.subarray(0, o), face: face.subarray(0, o), faceEdge, faceSite, outerFace: n,
  });
  return { mesh, faceOfSite };
}

/**
 * The runs 0..R-1 in a stable order by lo, then by `rest`: a counting sort
 * by lo (keys below n), then an insertion sort of each bucket, which holds
 * the few runs of one cell's neighbourhood. Same order as a stable
 * comparison sort, in linear time.
 */
function sortRuns(R: number, n: number, lo: (r: number) => number,
  rest: (a: number, b: number) => number): Int32Array {
  const start = new Int32Array(n + 1);
  for (let r = 0; r < R; r++) start[lo(r) + 1]++;
  for (let i = 0; i < n; i++) start[i + 1] += start[i];
  const fill = start.slice(0, n), order = new Int32Array(R);
  for (let r = 0; r < R; r++) order[fill[lo(r)]++] = r;
  for (let k = 0; k < n; k++) {
    for (let i = start[k] + 1; i < start[k + 1]; i++) {
      const r = order[i];
      let j = i - 1;
      while (j >= start[k] && rest(order[j], r) > 0) { order[j + 1] = order[j]; j--; }
      order[j + 1] = r;
    }
  }
  return order;
}
