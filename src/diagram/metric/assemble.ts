import { HalfEdgeMesh } from '../../mesh/mesh.js';

/**
 * Finished cells, flat: cell s has corners start[s]..start[s]+size[s]-1
 * (none when it misses the region), corner i at xy[2i], xy[2i+1], and edge
 * i (from corner i to the next) has label[i]: the cell across, or negative
 * for the region's boundary. Cells are numbered by the rank of their site
 * (see assembleCells) and may be added in any order.
 */
export class CellStore {
  readonly start: Int32Array;
  readonly size: Int32Array;
  xy: Float64Array;
  label: Int32Array;
  count = 0;
  constructor(n: number, corners = 512) {
    this.start = new Int32Array(n); this.size = new Int32Array(n);
    this.xy = new Float64Array(2 * corners); this.label = new Int32Array(corners);
  }
  /** Adds cell s (pass no corners for an empty cell). */
  add(s: number, pts: readonly { x: number; y: number }[], labels: readonly number[]): void {
    const m = pts.length;
    this.reserve(m);
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

  /** Adds cell s from corners ids[0..m) of a flat table (x, y of corner k at xy[stride k], xy[stride k + 1]). */
  addFlat(s: number, xy: Float64Array, stride: number, ids: Int32Array, labels: Int32Array, m: number): void {
    this.reserve(m);
    const at = this.count;
    for (let i = 0; i < m; i++) {
      const o = stride * ids[i];
      this.xy[2 * (at + i)] = xy[o] + 0;
      this.xy[2 * (at + i) + 1] = xy[o + 1] + 0;
      this.label[at + i] = labels[i];
    }
    this.start[s] = at;
    this.size[s] = m;
    this.count += m;
  }

  private reserve(m: number): void {
    if (this.count + m <= this.label.length) return;
    const size = Math.max(2 * this.label.length, this.count + m);
    const xy = new Float64Array(2 * size), label = new Int32Array(size);
    xy.set(this.xy); label.set(this.label);
    this.xy = xy; this.label = label;
  }
}

/**
 * One half-edge mesh from cells built independently. Every cell is exact,
 * so the boundary a cell shares with site t, seen from t, is the same
 * polyline walked backwards: runs of edges with the same neighbour are
 * paired up, their half-edges become twins, and their corners are merged
 * into shared vertices (union-find over corners), each placed where the
 * first cell that reached it computed it. Edges on the region's boundary
 * get twins on the outer face, which walks the boundary clockwise. Cell k
 * and label k are the site order[k]: neighbours have nearby ranks, so the
 * pairing reads nearby memory; the mesh's faces are numbered by site.
 */
export function assembleCells(store: CellStore, n: number, kind: 'voronoi', order: ArrayLike<number>): { mesh: HalfEdgeMesh; faceOfSite: Int32Array } {
  const { start: base, size: sz, xy: cxy, label } = store;
  const rank = new Int32Array(n);
  for (let k = 0; k < n; k++) rank[order[k]] = k;
  const H = store.count;
  // Runs: maximal stretches of one cell's boundary with the same neighbouring site; those of cell s are cellRun[s]..cellRun[s+1]-1.
  const runCell = new Int32Array(H), runStart = new Int32Array(H), runLen = new Int32Array(H), runOther = new Int32Array(H);
  const cellRun = new Int32Array(n + 1);
  let R = 0, regionEdges = 0;
  for (let s = 0; s < n; s++) {
    cellRun[s] = R;
    const m = sz[s], b = base[s];
    if (m === 0) continue;
    let first = 0;
    while (first < m && label[b + first] === label[b + (first + m - 1) % m]) first++;
    if (first === m) throw new Error(`metric cells: cell ${order[s]} has one label all around`);
    for (let i = 0; i < m;) {
      const at = (first + i) % m, lab = label[b + at];
      let len = 1;
      while (i + len < m && label[b + (first + i + len) % m] === lab) len++;
      if (lab >= 0) { runCell[R] = s; runStart[R] = at; runLen[R] = len; runOther[R] = lab; R++; }
      else regionEdges += len;
      i += len;
    }
  }
  cellRun[n] = R;

  // For a pair with more than one shared stretch (rare), a float key along their bisector, in terms of site ids: cells
  // lo and hi are the pair's smaller and larger site id, and the key of a run compares the cell's site id with the
  // offset of lo's corners, as the sort this replaces did (so that results stay as they were).
  function along(r: number): number {
    const c = order[runCell[r]], o = order[runOther[r]];
    const p = base[runCell[r]] + runStart[r], pa = base[rank[Math.min(c, o)]], pb = base[rank[Math.max(c, o)]];
    const dx = cxy[2 * pb] - cxy[2 * pa], dy = cxy[2 * pb + 1] - cxy[2 * pa + 1];
    const t = -dy * cxy[2 * p] + dx * cxy[2 * p + 1];
    return c === pa ? t : -t;
  }

  const twin = new Int32Array(H + regionEdges).fill(-1);
  const parent = new Int32Array(H);
  for (let i = 0; i < H; i++) parent[i] = i;
  const find = (v: number): number => {
    while (parent[v] !== v) { parent[v] = parent[parent[v]]; v = parent[v]; }
    return v;
  };
  // Roots are the smallest corner of their class, whatever the order of the unions.
  const union = (a: number, b: number): void => {
    const ra = find(a), rb = find(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  };
  const slot = (s: number, i: number): number => base[s] + (i % sz[s]);
  let paired = 0;
  /** Makes twins of run r1 of one cell and run r2 of the other, walked backwards, and merges their corners. */
  const pair = (r1: number, r2: number): void => {
    const len = runLen[r1];
    if (runLen[r2] !== len) throw new Error(`metric cells: the boundary of sites ${order[runCell[r1]]} and ${order[runCell[r2]]} has ${len} and ${runLen[r2]} edges seen from either side`);
    const s1 = runCell[r1], s2 = runCell[r2];
    for (let i = 0; i < len; i++) {
      const e = slot(s1, runStart[r1] + i), f = slot(s2, runStart[r2] + len - 1 - i);
      twin[e] = f; twin[f] = e;
      union(e, slot(s2, runStart[r2] + len - i));
      union(slot(s1, runStart[r1] + i + 1), f);
    }
    paired += 2;
  };
  // Each pair of sites once, from the first run of the smaller one: a cell has a handful of runs, so scanning them beats sorting all runs.
  const mine: number[] = [], theirs: number[] = [];
  for (let r = 0; r < R; r++) {
    const s = runCell[r], t = runOther[r];
    if (t < s) continue;
    let firstRun = true, count = 0, other = -1, countOther = 0;
    for (let q = cellRun[s]; q < cellRun[s + 1]; q++) if (runOther[q] === t) { if (q < r) firstRun = false; count++; }
    if (!firstRun) continue;
    for (let q = cellRun[t]; q < cellRun[t + 1]; q++) if (runOther[q] === s) { other = q; countOther++; }
    if (count === 1 && countOther === 1) { pair(r, other); continue; }
    if (count !== countOther) throw new Error(`metric cells: sites ${order[s]} and ${order[t]} share ${count} and ${countOther} stretches seen from either side`);
    // Several stretches: the runs of the cell with the smaller site id in order along the bisector (a stable
    // sort), paired with those of the other in reverse order.
    mine.length = 0; theirs.length = 0;
    const first = order[s] < order[t] ? s : t, second = first === s ? t : s;
    for (let q = cellRun[first]; q < cellRun[first + 1]; q++) if (runOther[q] === second) mine.push(q);
    for (let q = cellRun[second]; q < cellRun[second + 1]; q++) if (runOther[q] === first) theirs.push(q);
    const byAlong = (x: number, y: number): number => along(x) - along(y);
    mine.sort(byAlong); theirs.sort(byAlong);
    for (let k = 0; k < count; k++) pair(mine[k], theirs[count - 1 - k]);
  }
  if (paired !== R) {
    for (let r = 0; r < R; r++) {
      const s = runCell[r], t = runOther[r];
      let has = false;
      for (let q = cellRun[t]; q < cellRun[t + 1]; q++) if (runOther[q] === s) has = true;
      if (!has) throw new Error(`metric cells: sites ${order[s]} and ${order[t]} share a stretch seen from one side only`);
    }
  }

  // Vertices: one per class of corners.
  const vertexOf = new Int32Array(H).fill(-1);
  const xy = new Float64Array(2 * H);
  const origin = new Int32Array(H + regionEdges), next = new Int32Array(H + regionEdges), face = new Int32Array(H + regionEdges);
  let V = 0;
  // Vertices numbered along the sites in input order.
  for (let s = 0; s < n; s++) {
    const k = rank[s], m = sz[k];
    for (let i = 0; i < m; i++) {
      const e = base[k] + i, r = find(e);
      if (vertexOf[r] < 0) {
        xy[2 * V] = cxy[2 * r]; xy[2 * V + 1] = cxy[2 * r + 1];
        vertexOf[r] = V++;
      }
      origin[e] = vertexOf[r];
      next[e] = base[k] + ((i + 1) % m);
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
    // Cells that disagree about a shared boundary can leave two region edges at one vertex: refuse, as for unpaired runs.
    if (outerFrom[origin[o]] >= 0) throw new Error(`metric cells: two edges along the region boundary leave vertex ${origin[o]}`);
    outerFrom[origin[o]] = o;
    o++;
  }
  for (let k = H; k < o; k++) next[k] = outerFrom[origin[twin[k]]];
  const faceEdge = new Int32Array(n + 1).fill(-1), faceSite = new Int32Array(n + 1).fill(-1);
  const faceOfSite = new Int32Array(n).fill(-1);
  for (let s = 0; s < n; s++) {
    faceSite[s] = s;
    if (sz[rank[s]] > 0) { faceEdge[s] = base[rank[s]]; faceOfSite[s] = s; }
  }
  if (o > H) faceEdge[n] = H;
  const mesh = new HalfEdgeMesh({
    kind, vertexXY: xy.slice(0, 2 * V), origin: origin.subarray(0, o), twin: twin.subarray(0, o),
    next: next.subarray(0, o), face: face.subarray(0, o), faceEdge, faceSite, outerFace: n,
  });
  return { mesh, faceOfSite };
}
