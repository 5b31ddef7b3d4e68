import { AmbitError } from '../core/errors.js';
import { inCircle, orient } from '../core/predicates.js';
import { powerTest } from '../core/power.js';
import type { HalfEdgeMesh } from './mesh.js';

/**
 * Which empty-circle test to run. 'local': every interior edge is locally
 * Delaunay (the default for kind 'delaunay'); 'global': also, by brute force
 * in O(triangles * vertices), no vertex strictly inside any circumcircle;
 * false: none.
 */
export interface MeshCheckOptions {
  delaunay?: 'local' | 'global' | false;
  /**
   * Weights per vertex, for a regular (weighted Delaunay) triangulation: the
   * empty-circle tests become the exact power test, and vertices with no
   * half-edge are accepted as hidden sites ('global' checks that each is).
   */
  weights?: ArrayLike<number>;
}

export interface MeshCheckResult { ok: boolean; problems: string[] }

/** At most this many problems are listed; one more line says when some were left out. */
export const MAX_MESH_PROBLEMS = 20;

type Ints = ArrayLike<number>;

class Problems {
  readonly list: string[] = [];
  count = 0;
  add(message: string): void {
    if (this.count < MAX_MESH_PROBLEMS) this.list.push(message);
    this.count++;
  }
  /** True once further messages would be dropped: lets expensive loops stop early. */
  get full(): boolean { return this.count > MAX_MESH_PROBLEMS; }
  result(): MeshCheckResult {
    const problems = this.list.slice();
    if (this.count > MAX_MESH_PROBLEMS) problems.push(`... and more problems (listing stopped after ${MAX_MESH_PROBLEMS})`);
    return { ok: this.count === 0, problems };
  }
}

function isArrayLike(x: unknown): x is Ints {
  return Array.isArray(x) || (ArrayBuffer.isView(x) && !(x instanceof DataView));
}

function isIndex(v: unknown, lo: number, hi: number): boolean {
  return typeof v === 'number' && Number.isInteger(v) && v >= lo && v < hi;
}

const ARRAY_FIELDS = ['vertexXY', 'origin', 'twin', 'next', 'face', 'faceEdge', 'faceSite'] as const;

/**
 * Validates a half-edge mesh: array shapes and index ranges, twin and next
 * structure, one next-cycle per face, vertex fans, connectivity and Euler's
 * relation, counter-clockwise bounded faces, and for kind 'delaunay' the
 * triangulation and empty-circle properties. Never throws: corrupt input is
 * reported, and every walk is bounded by the number of half-edges.
 *
 * The checks run in stages; a stage only runs when the earlier ones found
 * nothing, because its walks and predicates rely on their invariants.
 */
export function checkMesh(mesh: HalfEdgeMesh, options: MeshCheckOptions = {}): MeshCheckResult {
  const p = new Problems();
  const m = mesh as unknown as Record<string, unknown>;
  if (m === null || typeof m !== 'object') {
    p.add(`mesh is ${m === null ? 'null' : typeof m}, expected an object`);
    return p.result();
  }
  for (const name of ARRAY_FIELDS) {
    if (!isArrayLike(m[name])) p.add(`mesh.${name} is not an array`);
  }
  const kind = m.kind;
  if (kind !== 'delaunay' && kind !== 'voronoi' && kind !== 'generic') p.add(`mesh.kind is ${String(kind)}, expected 'delaunay', 'voronoi' or 'generic'`);
  if (p.count > 0) return p.result();

  const arrays = {
    xy: m.vertexXY as Ints, origin: m.origin as Ints, twin: m.twin as Ints, next: m.next as Ints,
    face: m.face as Ints, faceEdge: m.faceEdge as Ints, faceSite: m.faceSite as Ints,
  };
  // A Voronoi mesh has a face per site; a site whose cell misses the region has an empty one.
  const emptyFaces = kind === 'voronoi';
  if (!checkShape(arrays, m.outerFace, emptyFaces, p)) return p.result();
  const w = options.weights ?? null;
  if (w !== null && (kind !== 'delaunay' || !isArrayLike(w) || w.length !== arrays.xy.length >> 1)) {
    p.add(`weights must be one number per vertex of a 'delaunay' mesh`);
    return p.result();
  }
  const s: Shape = {
    ...arrays, outer: m.outerFace as number,
    V: arrays.xy.length >> 1, H: arrays.origin.length, F: arrays.faceEdge.length, emptyFaces, w,
  };
  if (!checkPairs(s, p)) return p.result();
  const cycles = checkCycles(s, p);
  if (cycles === null) return p.result();
  checkOrientation(s, cycles, p);
  if (kind === 'delaunay') checkTriangulation(s, cycles, p);
  if (p.count > 0) return p.result();

  const mode = options.delaunay !== undefined ? options.delaunay : (kind === 'delaunay' ? 'local' : false);
  if (mode === 'local' || mode === 'global') checkLocalDelaunay(s, cycles, p);
  if (mode === 'global') checkGlobalDelaunay(s, cycles, p);
  return p.result();
}

/** Throws an AmbitError with code 'invalid-mesh' listing the problems checkMesh finds. */
export function assertMesh(mesh: HalfEdgeMesh, options: MeshCheckOptions = {}): void {
  const r = checkMesh(mesh, options);
  if (!r.ok) throw new AmbitError('invalid-mesh', `invalid mesh:\n  - ${r.problems.join('\n  - ')}`);
}

interface Shape {
  xy: Ints; origin: Ints; twin: Ints; next: Ints; face: Ints; faceEdge: Ints; faceSite: Ints;
  outer: number; V: number; H: number; F: number;
  /** Bounded faces may be empty (faceEdge -1, no half-edges): a Voronoi cell outside the region. */
  emptyFaces: boolean;
  /** Vertex weights of a regular triangulation, or null. */
  w: Ints | null;
}

/** Stage 1: lengths, finite coordinates, every index in range. */
function checkShape(a: Omit<Shape, 'outer' | 'V' | 'H' | 'F' | 'emptyFaces' | 'w'>, outer: unknown, emptyFaces: boolean, p: Problems): boolean {
  const { xy, origin, twin, next, face, faceEdge, faceSite } = a;
  const H = origin.length;
  const F = faceEdge.length;
  if (xy.length % 2 !== 0) p.add(`vertexXY has odd length ${xy.length}`);
  if (xy.length === 0) p.add('mesh has no vertices');
  if (twin.length !== H || next.length !== H || face.length !== H) {
    p.add(`half-edge arrays differ in length: origin ${H}, twin ${twin.length}, next ${next.length}, face ${face.length}`);
  }
  if (H % 2 !== 0) p.add(`odd number of half-edges (${H}); they come in twin pairs`);
  if (faceSite.length !== F) p.add(`face arrays differ in length: faceEdge ${F}, faceSite ${faceSite.length}`);
  if (F === 0) p.add('mesh has no faces (the outer face is always there)');
  if (!isIndex(outer, 0, F)) p.add(`outerFace is ${String(outer)}, expected an integer in [0, ${F})`);
  if (p.count > 0) return false;

  const V = xy.length >> 1;
  for (let v = 0; v < V && !p.full; v++) {
    if (!Number.isFinite(xy[2 * v]) || !Number.isFinite(xy[2 * v + 1])) {
      p.add(`vertex ${v} has non-finite coordinates (${xy[2 * v]}, ${xy[2 * v + 1]})`);
    }
  }
  for (let e = 0; e < H && !p.full; e++) {
    if (!isIndex(origin[e], 0, V)) p.add(`half-edge ${e}: origin ${origin[e]} is not a vertex index in [0, ${V})`);
    if (!isIndex(twin[e], 0, H)) p.add(`half-edge ${e}: twin ${twin[e]} is not a half-edge index in [0, ${H})`);
    if (!isIndex(next[e], 0, H)) p.add(`half-edge ${e}: next ${next[e]} is not a half-edge index in [0, ${H})`);
    if (!isIndex(face[e], 0, F)) p.add(`half-edge ${e}: face ${face[e]} is not a face index in [0, ${F})`);
  }
  for (let f = 0; f < F && !p.full; f++) {
    const fe = faceEdge[f];
    if (H === 0) {
      if (fe !== -1) p.add(`face ${f}: faceEdge ${fe} must be -1 in a mesh with no edges`);
    } else if (fe === -1 && emptyFaces && f !== outer) {
      // an empty cell
    } else if (!isIndex(fe, 0, H)) {
      p.add(`face ${f}: faceEdge ${fe} is not a half-edge index in [0, ${H})`);
    }
    if (!isIndex(faceSite[f], -1, 2 ** 31)) p.add(`face ${f}: faceSite ${faceSite[f]} is not -1 or a site index`);
  }
  return p.count === 0;
}

/** Stage 2: twins pair up, next is a permutation, a half-edge's twin starts where it ends. */
function checkPairs(s: Shape, p: Problems): boolean {
  const { origin, twin, next, H } = s;
  for (let e = 0; e < H && !p.full; e++) {
    const t = twin[e];
    if (t === e) p.add(`half-edge ${e} is its own twin`);
    else if (twin[t] !== e) p.add(`half-edge ${e}: twin ${t} has twin ${twin[t]}, not ${e}`);
  }
  const hits = new Int32Array(H);
  const firstFrom = new Int32Array(H).fill(-1);
  for (let e = 0; e < H; e++) {
    const n = next[e];
    if (hits[n]++ === 0) firstFrom[n] = e;
    else if (!p.full) p.add(`half-edge ${n} is the next of both half-edges ${firstFrom[n]} and ${e} (next must be a permutation)`);
  }
  for (let e = 0; e < H && !p.full; e++) {
    if (hits[e] === 0) p.add(`half-edge ${e} is the next of no half-edge (next must be a permutation)`);
  }
  if (p.count > 0) return false;
  for (let e = 0; e < H && !p.full; e++) {
    const t = twin[e];
    const end = origin[next[e]];
    if (origin[t] !== end) p.add(`half-edge ${e} ends at vertex ${end} (origin of its next, ${next[e]}) but its twin ${t} starts at vertex ${origin[t]}`);
    else if (origin[e] === end) p.add(`half-edge ${e} is a loop at vertex ${end}`);
  }
  return p.count === 0;
}

interface Cycles {
  /** First half-edge of the single next-cycle of each face. */
  start: Int32Array;
  /** Length of that cycle. */
  length: Int32Array;
}

/**
 * Stage 3: next-cycles stay on one face and each face has exactly one,
 * faceEdge lies on it, every vertex has one fan of half-edges, the mesh is
 * connected and V - E + F = 2. With next a permutation every walk closes
 * within H steps; the bound is kept anyway.
 */
function checkCycles(s: Shape, p: Problems): Cycles | null {
  const { origin, twin, next, face, faceEdge, V, H, F } = s;
  const start = new Int32Array(F).fill(-1);
  const length = new Int32Array(F);
  const seen = new Uint8Array(H);
  for (let e = 0; e < H; e++) {
    if (seen[e]) continue;
    const f = face[e];
    let n = 0;
    let x = e;
    do {
      seen[x] = 1;
      if (face[x] !== f && !p.full) p.add(`half-edge ${x} lies on face ${face[x]} but its next-cycle (through ${e}) belongs to face ${f}`);
      x = next[x];
      n++;
    } while (x !== e && n <= H);
    if (start[f] >= 0) {
      if (!p.full) p.add(`face ${f} has more than one next-cycle (through half-edges ${start[f]} and ${e})`);
    } else {
      start[f] = e;
      length[f] = n;
    }
  }
  let empty = 0;
  if (H > 0) {
    for (let f = 0; f < F && !p.full; f++) {
      if (faceEdge[f] === -1 && s.emptyFaces && f !== s.outer) {
        if (start[f] >= 0) p.add(`face ${f} has faceEdge -1 (empty) but half-edges on it, through ${start[f]}`);
        empty++;
      } else if (start[f] < 0) p.add(`face ${f} has no half-edges`);
      else if (face[faceEdge[f]] !== f) p.add(`face ${f}: faceEdge ${faceEdge[f]} lies on face ${face[faceEdge[f]]}`);
    }
  }

  // Fans: stepping e -> next(twin(e)) turns around origin(e) in the same mesh.
  const fan = new Int32Array(V).fill(-1);
  seen.fill(0);
  for (let e = 0; e < H; e++) {
    if (seen[e]) continue;
    const v = origin[e];
    let x = e;
    let n = 0;
    do { seen[x] = 1; x = next[twin[x]]; n++; } while (x !== e && n <= H);
    if (fan[v] >= 0) {
      if (!p.full) p.add(`vertex ${v} has two separate fans of half-edges (through ${fan[v]} and ${e}): the surface is pinched there`);
    } else {
      fan[v] = e;
    }
  }
  // Hidden sites of a regular triangulation are vertices without edges; they take no part below.
  let isolated = 0;
  if (H > 0) {
    for (let v = 0; v < V && !p.full; v++) {
      if (fan[v] >= 0) continue;
      if (s.w !== null) isolated++;
      else p.add(`vertex ${v} is the origin of no half-edge`);
    }
  }

  // Union-find over the edges; halving keeps the finds short without recursion.
  const parent = new Int32Array(V);
  for (let v = 0; v < V; v++) parent[v] = v;
  const find = (v: number): number => {
    while (parent[v] !== v) { parent[v] = parent[parent[v]]; v = parent[v]; }
    return v;
  };
  let components = V - isolated;
  for (let e = 0; e < H; e++) {
    const a = find(origin[e]);
    const b = find(origin[twin[e]]);
    if (a !== b) { parent[a] = b; components--; }
  }
  if (components > 1) p.add(`mesh is not connected: ${components} components`);
  // Empty faces (cells outside the region) are not faces of the surface.
  const euler = V - isolated - H / 2 + (F - empty);
  if (euler !== 2) p.add(`Euler's relation fails: V - E + F = ${V - isolated} - ${H / 2} + ${F - empty} = ${euler}, expected 2`);
  return p.count === 0 ? { start, length } : null;
}

/**
 * Twice the signed area of face f, as a sign: exact for triangles, a
 * floating-point shoelace sum relative to the first vertex otherwise
 * (Voronoi cells have computed, inexact corners anyway).
 */
function faceSign(s: Shape, c: Cycles, f: number): number {
  const { xy, origin, next } = s;
  const n = c.length[f];
  if (n < 3) return 0;
  const e0 = c.start[f];
  const v0 = origin[e0];
  const x0 = xy[2 * v0];
  const y0 = xy[2 * v0 + 1];
  if (n === 3) {
    const e1 = next[e0];
    const v1 = origin[e1];
    const v2 = origin[next[e1]];
    return orient(x0, y0, xy[2 * v1], xy[2 * v1 + 1], xy[2 * v2], xy[2 * v2 + 1]);
  }
  let sum = 0;
  let e = next[e0];
  let v = origin[e];
  let px = xy[2 * v] - x0;
  let py = xy[2 * v + 1] - y0;
  for (let i = 2; i < n; i++) {
    e = next[e];
    v = origin[e];
    const qx = xy[2 * v] - x0;
    const qy = xy[2 * v + 1] - y0;
    sum += px * qy - py * qx;
    px = qx;
    py = qy;
  }
  return sum;
}

function faceLabel(s: Shape, c: Cycles, f: number): string {
  const vs: number[] = [];
  let e = c.start[f];
  for (let i = 0; i < c.length[f] && i < 8; i++) { vs.push(s.origin[e]); e = s.next[e]; }
  return `[${vs.join(', ')}${c.length[f] > 8 ? ', ...' : ''}]`;
}

/** Stage 4: bounded faces counter-clockwise with positive area; the outer face not. */
function checkOrientation(s: Shape, c: Cycles, p: Problems): void {
  for (let f = 0; f < s.F && !p.full; f++) {
    if (c.start[f] < 0) continue;
    const sign = faceSign(s, c, f);
    if (f === s.outer) {
      if (sign > 0) p.add(`outer face ${f} ${faceLabel(s, c, f)} is counter-clockwise with positive area; it must be walked clockwise`);
    } else if (!(sign > 0)) {
      p.add(`face ${f} ${faceLabel(s, c, f)} is not counter-clockwise with positive area`);
    }
  }
}

/** Vertex indices sorted by x, then y. */
function sortedVertices(s: Shape): Int32Array {
  const order = new Int32Array(s.V);
  for (let v = 0; v < s.V; v++) order[v] = v;
  const xy = s.xy;
  return order.sort((a, b) => (xy[2 * a] - xy[2 * b]) || (xy[2 * a + 1] - xy[2 * b + 1]));
}

/**
 * Stage 4, kind 'delaunay': distinct vertices, faceSite -1, triangles only,
 * and either a simple, convex outer boundary winding once (dimension 2) or a
 * path along a line joining consecutive sites (dimension 1).
 */
function checkTriangulation(s: Shape, c: Cycles, p: Problems): void {
  const { xy, origin, twin, next, faceSite, V, H, F, outer } = s;
  const order = sortedVertices(s);
  for (let i = 1; i < V && !p.full; i++) {
    const a = order[i - 1];
    const b = order[i];
    if (xy[2 * a] === xy[2 * b] && xy[2 * a + 1] === xy[2 * b + 1]) p.add(`vertices ${a} and ${b} coincide at (${xy[2 * a]}, ${xy[2 * a + 1]})`);
  }
  for (let f = 0; f < F && !p.full; f++) {
    if (faceSite[f] !== -1) p.add(`face ${f}: faceSite ${faceSite[f]} must be -1 in a Delaunay mesh`);
    if (f !== outer && c.length[f] !== 3) p.add(`face ${f} has ${c.length[f]} sides; a Delaunay mesh has only triangles`);
  }
  if (H === 0 || p.count > 0) return;

  if (F > 1) {
    // The outer face runs clockwise, so going around it every corner must turn
    // right or go straight: a strict left turn is a reflex corner.
    const n = c.length[outer];
    const onBoundary = new Uint8Array(V);
    let turning = 0;
    let e = c.start[outer];
    for (let i = 0; i < n && !p.full; i++) {
      const a = origin[e];
      const b = origin[next[e]];
      const d = origin[next[next[e]]];
      if (onBoundary[b]) p.add(`outer boundary passes vertex ${b} more than once`);
      onBoundary[b] = 1;
      const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1], dx = xy[2 * d], dy = xy[2 * d + 1];
      const o = orient(ax, ay, bx, by, dx, dy);
      if (o > 0) p.add(`outer boundary is not convex: it turns left at vertex ${b} (half-edges ${e}, ${next[e]})`);
      const ux = bx - ax, uy = by - ay, wx = dx - bx, wy = dy - by;
      // The size of the turn from floating point, its direction from the exact sign: at the sharp corners of a
      // sliver (a cross product of 1e-32 against lengths of 1) the float cross product can have either sign,
      // and a turn of almost pi would count the wrong way round (found by the sweep's property test).
      const size = Math.atan2(Math.abs(ux * wy - uy * wx), ux * wx + uy * wy);
      turning += o < 0 ? -size : size;
      e = next[e];
    }
    // Clockwise once around: -2*pi. Tolerance: common practice, no source.
    if (!p.full && Math.abs(turning + 2 * Math.PI) > 1e-6) {
      p.add(`outer boundary winds ${(-turning / (2 * Math.PI)).toFixed(6)} times clockwise, expected once`);
    }
    return;
  }

  // No triangles: the sites must lie on one line, joined in order along it.
  const a = order[0];
  const b = order[V - 1];
  for (let v = 0; v < V && !p.full; v++) {
    if (orient(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * v], xy[2 * v + 1]) !== 0) {
      p.add(`Delaunay mesh has no triangles but vertex ${v} is off the line through vertices ${a} and ${b}`);
    }
  }
  // Hidden sites (weights, no edges) may lie between joined neighbours: rank only the vertices in use.
  const used = new Uint8Array(V);
  for (let e = 0; e < H; e++) used[origin[e]] = 1;
  const rank = new Int32Array(V);
  let r = 0;
  for (let i = 0; i < V; i++) if (s.w === null || used[order[i]]) rank[order[i]] = r++;
  for (let e = 0; e < H && !p.full; e++) {
    const u = origin[e];
    const w = origin[twin[e]];
    if (u < w && Math.abs(rank[u] - rank[w]) !== 1) p.add(`edge ${u}-${w} (half-edge ${e}) skips over other vertices on the line`);
  }
}

function circleLabel(s: Shape, c: Cycles, f: number): string { return `face ${f} ${faceLabel(s, c, f)}`; }

/** Every edge between two triangles: the far vertex is not strictly inside the near triangle's circumcircle. */
function checkLocalDelaunay(s: Shape, c: Cycles, p: Problems): void {
  const { xy, origin, twin, next, face, H, outer } = s;
  for (let e = 0; e < H && !p.full; e++) {
    const t = twin[e];
    if (t < e) continue;
    const f = face[e];
    const g = face[t];
    if (f === outer || g === outer || c.length[f] !== 3 || c.length[g] !== 3) continue;
    const a = origin[e];
    const b = origin[t];
    const cv = origin[next[next[e]]];
    const d = origin[next[next[t]]];
    if (conflicts(s, a, b, cv, d)) {
      p.add(s.w === null
        ? `edge ${a}-${b} (half-edge ${e}) is not locally Delaunay: vertex ${d} lies inside the circumcircle of ${circleLabel(s, c, f)}`
        : `edge ${a}-${b} (half-edge ${e}) is not locally regular: vertex ${d} lifts below the plane of ${circleLabel(s, c, f)}`);
    }
  }
}

/** Brute force, O(triangles * vertices): no vertex strictly inside any triangle's circumcircle. */
function checkGlobalDelaunay(s: Shape, c: Cycles, p: Problems): void {
  const { xy, origin, next, V, F, outer } = s;
  for (let f = 0; f < F && !p.full; f++) {
    if (f === outer || c.length[f] !== 3) continue;
    const e = c.start[f];
    const a = origin[e];
    const b = origin[next[e]];
    const cv = origin[next[next[e]]];
    for (let v = 0; v < V && !p.full; v++) {
      if (v === a || v === b || v === cv) continue;
      if (conflicts(s, a, b, cv, v)) {
        p.add(s.w === null
          ? `vertex ${v} lies strictly inside the circumcircle of ${circleLabel(s, c, f)}`
          : `vertex ${v} lifts strictly below the plane of ${circleLabel(s, c, f)}`);
      }
    }
  }
}

/** d strictly inside the circumcircle of counter-clockwise a, b, c; with weights, lifted strictly below their plane. */
function conflicts(s: Shape, a: number, b: number, c: number, d: number): boolean {
  const { xy, w } = s;
  if (w === null) return inCircle(xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], xy[2 * d], xy[2 * d + 1]) > 0;
  return powerTest(xy[2 * a], xy[2 * a + 1], w[a], xy[2 * b], xy[2 * b + 1], w[b], xy[2 * c], xy[2 * c + 1], w[c],
    xy[2 * d], xy[2 * d + 1], w[d]) > 0;
}
