import { incircle, orient2d } from 'robust-predicates';
import { AmbitError, InputError } from '../core/errors.js';
import { comparePowerDistance, powerTest } from '../core/power.js';
import { HalfEdgeMesh } from '../mesh/mesh.js';
import type { Triangulation } from '../triangulate/triangulation.js';
import { ConvexRegion, SNAP_ULPS } from './clip.js';

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

/**
 * The closest two sites may be, relative to the largest coordinate (of the
 * sites and the region), for their cell boundary to be placed in double
 * precision: 2^-40 leaves about a thousand ulps of room for rounding.
 */
export const MIN_SPACING = 2 ** -40;

/** Face number of the outer face while building. */
const OUTER = -2;

/** Whether site i comes before site j by (x, y). */
function before(xy: Float64Array, i: number, j: number): boolean {
  return xy[2 * i] < xy[2 * j] || (xy[2 * i] === xy[2 * j] && xy[2 * i + 1] < xy[2 * j + 1]);
}

/** A growable list of points. */
class Points {
  xy = new Float64Array(1024);
  count = 0;
  reserve(extra: number): void {
    if (2 * (this.count + extra) <= this.xy.length) return;
    const grown = new Float64Array(Math.max(2 * (this.count + extra), 2 * this.xy.length));
    grown.set(this.xy);
    this.xy = grown;
  }
  add(x: number, y: number): number {
    if (2 * this.count + 2 > this.xy.length) this.reserve(this.count + 1);
    this.xy[2 * this.count] = x;
    this.xy[2 * this.count + 1] = y;
    return this.count++;
  }
}

/**
 * The Voronoi diagram of a triangulation's sites, clipped to a convex
 * region, as a half-edge mesh of kind 'voronoi'.
 *
 * Voronoi half-edge x (x < 3T) is the dual of Delaunay half-edge x: it runs
 * from the circumcentre of the triangle across x to the circumcentre of x's
 * own triangle, with x's origin site on its left. Each hull edge adds one
 * half-edge, numbered after, for the far side of its ray. Triangles whose
 * circumcircles coincide (cocircular sites, decided exactly) share one
 * vertex, and the edges between them vanish: no zero-length edges. Where
 * the diagram meets the region's boundary, the boundary is cut; each piece
 * belongs to the cell on the left of the edge arriving at its start.
 */
export function clippedVoronoi(tri: Triangulation, regionXY: Float64Array): { mesh: HalfEdgeMesh; faceOfSite: Int32Array } {
  const b = new DiagramBuilder(tri, new ConvexRegion(regionXY));
  try {
    b.buildEdges();
    b.buildRing();
    b.assignOwners();
    b.linkBoundary();
    return b.compact();
  } catch (err) {
    // Unweighted cells always have room (MIN_SPACING); power cells can be thinner than rounding, and
    // then the floating clip decisions around them disagree before any single cell looks flat.
    if (b.weights === null || err instanceof AmbitError) throw err;
    throw new InputError('too-thin',
      'a power cell is thinner than double precision can draw: some weight leaves its site within rounding of being hidden',
      -1, 'weights');
  }
}

class DiagramBuilder {
  readonly region: ConvexRegion;
  readonly sites: Float64Array;
  readonly siteOfRank: Int32Array | null;
  /** Weights in rank order for a power diagram, else null. */
  readonly weights: Float64Array | null;
  readonly n: number;
  readonly tri: Triangulation;
  readonly points = new Points();
  /** Half-edges of the unclipped diagram; origin -1 marks a dropped one. */
  total = 0;
  origin: Int32Array = new Int32Array(0);
  twin: Int32Array = new Int32Array(0);
  face: Int32Array = new Int32Array(0);
  next: Int32Array = new Int32Array(0);
  /** Voronoi vertices are points 0..vertexCount-1. */
  vertexCount = 0;
  /** Per vertex: 1 strictly inside, 2 inside on the boundary, 0 outside. */
  inside = new Uint8Array(0);
  /** Vertices found on the boundary (state 2), merged ones included. */
  private readonly onBoundary: number[] = [];
  readonly sideEvents: number[][];
  /** One half-edge of every edge with an end on the boundary: all that the ring steps look at. */
  readonly touching: number[] = [];
  clipStart = -1;
  clipEnd = -1;
  /** Squared length of the shortest Delaunay edge seen, and a triangle holding it. */
  closest = Infinity;
  closestTriangle = -1;
  private readonly nearLimit: number;
  // The boundary ring, its owners, and the full arrays with the boundary half-edges.
  ring: number[] = [];
  owner = new Int32Array(0);
  remap = new Int32Array(0);
  cornerBase = 0;
  outgoing = new Map<number, number[]>();
  all = 0;
  fOrigin: Int32Array = new Int32Array(0);
  fTwin: Int32Array = new Int32Array(0);
  fFace: Int32Array = new Int32Array(0);
  fNext: Int32Array = new Int32Array(0);

  constructor(tri: Triangulation, region: ConvexRegion) {
    this.tri = tri;
    this.region = region;
    // Work in the triangulation's rank order (sites that are near are near in memory); faces are
    // mapped to site numbers at the end.
    this.sites = tri.implicitLayout()?.xy ?? tri.siteXY;
    this.siteOfRank = tri.implicitLayout()?.siteOfRank ?? null;
    this.weights = tri.rankWeights();
    this.n = tri.siteCount;
    this.sideEvents = Array.from({ length: region.count }, () => []);
    // Every margin is in units of the region's radius, never absolute: a far end of a clipped segment
    // carries rounding of its own distance from the region into the crossing, so it must stay at the region's scale.
    this.nearLimit = 4 * region.radius;
  }

  /** Room for the diagram's half-edges and, after them, a guess at the boundary's; linkBoundary grows it if short. */
  private allocate(total: number): void {
    this.total = total;
    const room = total + 2 * (this.region.count + 8 * Math.ceil(Math.sqrt(total)) + 64);
    this.origin = new Int32Array(room);
    this.twin = new Int32Array(room);
    this.face = new Int32Array(room);
    // clipEdges writes next for every half-edge it keeps; only the room after them starts at "none".
    this.next = new Int32Array(room).fill(-1, total);
  }

  /** A new point where an edge s→e is cut by side j, at parameter t. */
  private crossing(sx: number, sy: number, ex: number, ey: number, t: number, j: number): number {
    const id = this.points.add(sx + t * (ex - sx), sy + t * (ey - sy));
    this.sideEvents[j].push(id);
    return id;
  }

  private siteOf(rank: number): number {
    return this.siteOfRank ? this.siteOfRank[rank] : rank;
  }

  private isNear(id: number): boolean {
    const P = this.points.xy, r = this.region;
    return id >= 0 && Math.hypot(P[2 * id] - r.cx, P[2 * id + 1] - r.cy) <= this.nearLimit;
  }

  /**
   * Clips the Voronoi edge between sites a and b that runs from point A to
   * point B along u, the left normal of a→b (a is on its left); A = -1 or
   * B = -1 stands for infinity that way. Circumcentres of near-flat
   * triangles can be astronomically far, and a segment to them cannot be
   * clipped in floating point; such ends are replaced by points on the
   * bisector just beyond the region's disk, which changes nothing inside.
   * Sets clipStart / clipEnd (point ids, new crossings where cut); false
   * when nothing of positive length is left.
   */
  private clipBisector(a: number, b: number, A: number, B: number): boolean {
    const P = this.points.xy, sites = this.sites, region = this.region;
    const ax = sites[2 * a], ay = sites[2 * a + 1], bx = sites[2 * b], by = sites[2 * b + 1];
    // The bisector crosses a→b at its middle; with weights, at the radical point, shifted towards the lighter site.
    const w = this.weights;
    const along = w === null ? 0.5 : 0.5 + (w[a] - w[b]) / (2 * ((bx - ax) ** 2 + (by - ay) ** 2));
    const mx = ax + (bx - ax) * along, my = ay + (by - ay) * along;
    const len = Math.hypot(bx - ax, by - ay), ux = -(by - ay) / len, uy = (bx - ax) / len;
    const nearA = this.isNear(A), nearB = this.isNear(B);
    let sx: number, sy: number, ex: number, ey: number;
    const inA = A >= 0 && this.inside[A] !== 0, inB = B >= 0 && this.inside[B] !== 0;
    if (inA !== inB) {
      // One end inside: leave it along the bisector's own direction, known from the sites, to a point
      // surely outside; the other centre may be ill-conditioned (a near-flat triangle) and pull the cut aside.
      const K = inA ? A : B, kx = P[2 * K], ky = P[2 * K + 1];
      const reach = 2 * (Math.hypot(kx - region.cx, ky - region.cy) + region.radius);
      if (inA) { sx = kx; sy = ky; ex = kx + reach * ux; ey = ky + reach * uy; }
      else { sx = kx - reach * ux; sy = ky - reach * uy; ex = kx; ey = ky; }
    } else if (nearA && nearB) {
      sx = P[2 * A]; sy = P[2 * A + 1]; ex = P[2 * B]; ey = P[2 * B + 1];
    } else {
      const sC = (region.cx - mx) * ux + (region.cy - my) * uy;
      const lo = sC - 2 * region.radius, hi = sC + 2 * region.radius;
      const sA = A < 0 ? -Infinity : (P[2 * A] - mx) * ux + (P[2 * A + 1] - my) * uy;
      const sB = B < 0 ? Infinity : (P[2 * B] - mx) * ux + (P[2 * B + 1] - my) * uy;
      if (sB < lo || sA > hi) return false;
      const pS = nearA ? sA : Math.min(lo, sB - region.radius);
      const pE = nearB ? sB : Math.max(hi, sA + region.radius);
      sx = nearA ? P[2 * A] : mx + pS * ux; sy = nearA ? P[2 * A + 1] : my + pS * uy;
      ex = nearB ? P[2 * B] : mx + pE * ux; ey = nearB ? P[2 * B + 1] : my + pE * uy;
    }
    if (!region.clipSegment(sx, sy, ex, ey)) return false;
    const { tIn, tOut, sideIn, sideOut } = region;
    this.clipStart = sideIn < 0 ? A : this.crossing(sx, sy, ex, ey, tIn, sideIn);
    this.clipEnd = sideOut < 0 ? B : this.crossing(sx, sy, ex, ey, tOut, sideOut);
    return true;
  }

  buildEdges(): void {
    const layout = this.tri.implicitLayout();
    if (!layout) { this.buildLines(); return; }
    const { vert, twin: tw, real: T } = layout;
    this.allocate(3 * T + layout.count - T);
    const cocircular = this.centres(vert, tw, T);
    this.checkSpacing(Math.sqrt(this.closest), () => {
      const t = this.closestTriangle, v = [vert[3 * t], vert[3 * t + 1], vert[3 * t + 2]];
      const d = (i: number, j: number) => Math.hypot(this.sites[2 * v[i]] - this.sites[2 * v[j]], this.sites[2 * v[i] + 1] - this.sites[2 * v[j] + 1]);
      const pairs: [number, number, number][] = [[v[0], v[1], d(0, 1)], [v[1], v[2], d(1, 2)], [v[2], v[0], d(2, 0)]];
      pairs.sort((p, q) => p[2] - q[2]);
      const s0 = this.siteOf(pairs[0][0]), s1 = this.siteOf(pairs[0][1]);
      return [Math.min(s0, s1), Math.max(s0, s1)];
    });
    this.vertexCount = T;
    const vertexOf = this.mergeCocircular(cocircular, T);
    for (const v of this.onBoundary) {
      if (vertexOf !== null && vertexOf[v] !== v) continue;
      const x = this.points.xy[2 * v], y = this.points.xy[2 * v + 1];
      for (let j = 0; j < this.region.count; j++) if (this.region.side(j, x, y) === 0) this.sideEvents[j].push(v);
    }
    this.clipEdges(vert, tw, T, vertexOf);
  }

  /**
   * In one pass over the triangles: the circumcentre of each, as points
   * 0..T-1; whether it lies inside the region; and, against each neighbour
   * already computed, whether the two circumcircles coincide. Returns those
   * cocircular pairs of triangles, flat.
   *
   * Centres are computed relative to the first corner, for precision far
   * from the origin; the exact orientation of the true corners gives the
   * sign, which rounded differences could flip for a near-flat triangle.
   * Each centre gets a bound on its rounding error (first-order, with a
   * safety factor of 4): the corner differences carry a relative error of
   * ε, their squared lengths 4ε, the numerator cy·|b|² − by·|c|² then at
   * most 7ε(|cy||b|² + |by||c|²), and the denominator d (robust-predicates'
   * estimate of twice the orientation) 4ε(|bx cy| + |by cx|)/|d| relative;
   * multiplying by the rounded reciprocal of d costs 2ε where a division
   * would cost ε, and adding the corner back rounds once more. Only centres that agree within
   * their bounds are asked the exact incircle question.
   */
  private centres(vert: Int32Array, tw: Int32Array, T: number): number[] {
    const sites = this.sites, eps = Number.EPSILON / 2, region = this.region, m = region.count;
    const points = this.points;
    // Room for the boundary crossings too (a few per hull edge and per boundary cell, O(sqrt T) in practice).
    points.xy = new Float64Array(2 * T + 2 * (16 * Math.ceil(Math.sqrt(T)) + 4096));
    points.count = T;
    const P = points.xy;
    // The error bounds live only through this pass: they borrow the memory of the origin array (3T ints,
    // at least T doubles), which clipEdges fills afterwards, instead of faulting in 8 fresh bytes a triangle.
    const error = new Float64Array(this.origin.buffer, 0, T);
    const inside = (this.inside = new Uint8Array(T));
    const cocircular: number[] = [];
    const w = this.weights;
    // Weights add two roundings to each squared length (the weight difference and its subtraction).
    const lengthErr = w === null ? 7 * eps : 9 * eps;
    for (let t = 0; t < T; t++) {
      let a = vert[3 * t], b = vert[3 * t + 1], c = vert[3 * t + 2];
      // The centre is computed relative to one corner, and its rounding depends on which: start from the corner
      // with the least (x, y), so that every construction of this triangle, in any rotation, gets the same point.
      if (before(sites, b, a) ? before(sites, b, c) : before(sites, c, a)) {
        const x = a;
        if (before(sites, b, c)) { a = b; b = c; c = x; } else { a = c; c = b; b = x; }
      }
      const ax = sites[2 * a], ay = sites[2 * a + 1];
      const bx = sites[2 * b] - ax, by = sites[2 * b + 1] - ay;
      const cx = sites[2 * c] - ax, cy = sites[2 * c + 1] - ay;
      const d = -2 * orient2d(ax, ay, sites[2 * b], sites[2 * b + 1], sites[2 * c], sites[2 * c + 1]);
      // With weights the centre is the power centre: equal power to all three corners.
      const wb = w === null ? 0 : w[b] - w[a], wc = w === null ? 0 : w[c] - w[a];
      const bl = bx * bx + by * by - wb, cl = cx * cx + cy * cy - wc;
      const blMag = bx * bx + by * by + Math.abs(wb), clMag = cx * cx + cy * cy + Math.abs(wc);
      // One division: the reciprocal, then products (divisions dominated this loop).
      const inv = 1 / d, ai = Math.abs(inv);
      const ux = (cy * bl - by * cl) * inv, uy = (bx * cl - cx * bl) * inv;
      const shortest = Math.min(bx * bx + by * by, cx * cx + cy * cy, (cx - bx) ** 2 + (cy - by) ** 2);
      if (shortest < this.closest) { this.closest = shortest; this.closestTriangle = t; }
      const X = ax + ux, Y = ay + uy;
      const rel = 8 * eps * (Math.abs(bx * cy) + Math.abs(by * cx)) * ai;
      const ex = lengthErr * (Math.abs(cy) * blMag + Math.abs(by) * clMag) * ai + Math.abs(ux) * (rel + 3 * eps) + eps * Math.abs(X);
      const ey = lengthErr * (Math.abs(bx) * clMag + Math.abs(cx) * blMag) * ai + Math.abs(uy) * (rel + 3 * eps) + eps * Math.abs(Y);
      P[2 * t] = X;
      P[2 * t + 1] = Y;
      const err = (error[t] = 4 * Math.max(ex, ey));
      let state = 1;
      for (let j = 0; j < m; j++) {
        const f = region.side(j, X, Y);
        if (f < 0) { state = 0; break; }
        if (f === 0) state = 2;
      }
      inside[t] = state;
      if (state === 2) this.onBoundary.push(t);
      for (let k = 0; k < 3; k++) {
        const y = tw[3 * t + k];
        if (y >= 3 * T || y >= 3 * t) continue;
        const u = (y / 3) | 0;
        const dx = Math.abs(X - P[2 * u]), dy = Math.abs(Y - P[2 * u + 1]);
        const slack = err + error[u];
        if (!(dx <= slack && dy <= slack)) continue;
        // Centres that round to the very same point are one vertex too, else their edge would have length zero.
        if (dx !== 0 || dy !== 0) {
          const p = vert[prevOf(y)];
          if ((w === null
            ? incircle(ax, ay, sites[2 * b], sites[2 * b + 1], sites[2 * c], sites[2 * c + 1], sites[2 * p], sites[2 * p + 1])
            : powerTest(ax, ay, w[a], sites[2 * b], sites[2 * b + 1], w[b], sites[2 * c], sites[2 * c + 1], w[c],
              sites[2 * p], sites[2 * p + 1], w[p])) !== 0) continue;
        }
        cocircular.push(t, u);
      }
    }
    return cocircular;
  }

  /**
   * Union–find over the cocircular pairs: each triangle's representative,
   * the smallest of its class, whose centre and inside state the class
   * takes. Null when no circumcircles coincide (the common case), so that
   * the passes after need no lookup.
   */
  private mergeCocircular(pairs: number[], T: number): Int32Array | null {
    if (pairs.length === 0) return null;
    const parent = new Int32Array(T);
    for (let t = 0; t < T; t++) parent[t] = t;
    for (let i = 0; i < pairs.length; i += 2) {
      let ra = pairs[i], rb = pairs[i + 1];
      while (parent[ra] !== ra) ra = parent[ra] = parent[parent[ra]];
      while (parent[rb] !== rb) rb = parent[rb] = parent[parent[rb]];
      if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
    }
    // Parents point to smaller triangles, so one pass in order resolves every chain.
    const inside = this.inside;
    for (let t = 0; t < T; t++) {
      const r = (parent[t] = parent[parent[t]]);
      inside[t] = inside[r];
    }
    return parent;
  }

  private clipEdges(vert: Int32Array, tw: Int32Array, T: number, vertexOf: Int32Array | null): void {
    const { origin, twin, face, inside, next } = this, site = this.siteOfRank;
    // Voronoi half-edge x is dual to Delaunay half-edge x: same twin (but for rays), face = x's site.
    twin.set(tw.subarray(0, 3 * T));
    for (let x = 0; x < 3 * T; x++) {
      const y = tw[x];
      face[x] = site === null ? vert[x] : site[vert[x]];
      if (y < 3 * T) {
        const tx = (x / 3) | 0, ty = (y / 3) | 0;
        const vx = vertexOf === null ? tx : vertexOf[tx], vy = vertexOf === null ? ty : vertexOf[ty];
        if (vx === vy) { origin[x] = -1; continue; }
        // Both ends inside and not both on the boundary (the edge could lie along it): kept whole.
        // Each half-edge of such a pair is written on its own turn, so that writes stay in sequence.
        const ix = inside[vx], iy = inside[vy];
        if (ix !== 0 && iy !== 0 && (ix & iy) !== 2) {
          origin[x] = vy;
          next[x] = ix === 1 ? this.rotate(x, tw, T, vertexOf) : -1;
          if ((ix === 2 || iy === 2) && x < y) this.touching.push(x);
          continue;
        }
        // A pair that meets the boundary is cut once, on the turn of its smaller half-edge.
        if (y < x) continue;
        if (!this.clipBisector(vert[x], vert[nextOf(x)], vy, vx)) { origin[x] = origin[y] = -1; continue; }
        origin[x] = this.clipStart;
        origin[y] = this.clipEnd;
        next[x] = this.clipEnd === vx && ix === 1 ? this.rotate(x, tw, T, vertexOf) : -1;
        next[y] = this.clipStart === vy && iy === 1 ? this.rotate(y, tw, T, vertexOf) : -1;
        this.touching.push(x);
      } else {
        // A hull edge a→b: its Voronoi edge is a ray from the circumcentre, outwards (right of a→b).
        const g = 3 * T + ((y / 3) | 0) - T;
        twin[x] = g; twin[g] = x;
        face[g] = site === null ? vert[nextOf(x)] : site[vert[nextOf(x)]];
        const vx = vertexOf === null ? (x / 3) | 0 : vertexOf[(x / 3) | 0];
        if (!this.clipBisector(vert[x], vert[nextOf(x)], -1, vx)) { origin[x] = origin[g] = -1; continue; }
        origin[x] = this.clipStart;
        origin[g] = this.clipEnd;
        next[g] = -1;
        next[x] = this.clipEnd === vx && inside[vx] === 1 ? this.rotate(x, tw, T, vertexOf) : -1;
        this.touching.push(x);
      }
    }
  }

  /**
   * The half-edge after x, which ends at a vertex strictly inside the region:
   * turn about x's site to the next Delaunay edge whose dual is kept. Around
   * such a vertex only merging (cocircular sites) drops edges, and a ray out
   * of it (numbered after the triangles) is always kept.
   */
  private rotate(x: number, tw: Int32Array, T: number, vertexOf: Int32Array | null): number {
    let z = tw[prevOf(x)];
    if (vertexOf === null) return z >= 3 * T ? 3 * T + ((z / 3) | 0) - T : z;
    for (;;) {
      if (z >= 3 * T) return 3 * T + ((z / 3) | 0) - T;
      if (vertexOf[(z / 3) | 0] !== vertexOf[(tw[z] / 3) | 0]) return z;
      z = tw[prevOf(z)];
    }
  }


  /**
   * Voronoi positions are floating point: two sites closer than MIN_SPACING
   * times the largest coordinate would have a boundary between them that
   * double precision cannot place, so their cells could overlap. Such input
   * is refused with an InputError naming the two sites, not drawn wrong.
   */
  private checkSpacing(shortest: number, which: () => [number, number]): void {
    let magnitude = this.region.size;
    for (let i = 0; i < this.region.xy.length; i++) magnitude = Math.max(magnitude, Math.abs(this.region.xy[i]));
    const xy = this.sites;
    for (let i = 0; i < 2 * this.n; i++) magnitude = Math.max(magnitude, Math.abs(xy[i]));
    if (shortest >= MIN_SPACING * magnitude) return;
    const [a, b] = which();
    throw new InputError('too-close',
      `sites ${a} and ${b} are ${shortest} apart, closer than ${MIN_SPACING} times the largest coordinate (${magnitude}); ` +
      'double precision cannot place the boundary between their cells', a, 'points');
  }

  /** Collinear sites (or one): parallel bisector lines between neighbours along the line. */
  private buildLines(): void {
    const path = this.tri.linearOrder()!;
    const lines = Math.max(0, path.length - 1);
    let shortest = Infinity, at = 0;
    for (let i = 0; i < lines; i++) {
      const a = path[i], b = path[i + 1];
      const d = Math.hypot(this.sites[2 * b] - this.sites[2 * a], this.sites[2 * b + 1] - this.sites[2 * a + 1]);
      if (d < shortest) { shortest = d; at = i; }
    }
    this.checkSpacing(shortest, () => [Math.min(path[at], path[at + 1]), Math.max(path[at], path[at + 1])]);
    if (this.weights !== null && lines > 1) this.checkStrips(path);
    this.allocate(2 * lines);
    this.next.fill(-1);
    const { origin, twin, face } = this;
    for (let i = 0; i < lines; i++) {
      const a = path[i], b = path[i + 1];
      twin[2 * i] = 2 * i + 1; twin[2 * i + 1] = 2 * i;
      face[2 * i] = a; face[2 * i + 1] = b;
      if (!this.clipBisector(a, b, -1, -1)) { origin[2 * i] = origin[2 * i + 1] = -1; continue; }
      origin[2 * i] = this.clipStart;
      origin[2 * i + 1] = this.clipEnd;
      this.touching.push(2 * i);
    }
  }

  /**
   * With weights the parallel lines between collinear sites sit at radical
   * points, not midpoints: each inner site's strip must keep a width that
   * double precision can place (MIN_SPACING of the largest coordinate, as
   * for sites), else the diagram is refused naming that site.
   */
  private checkStrips(path: Int32Array): void {
    const P = this.sites, w = this.weights!, first = path[0], last = path[path.length - 1];
    const ox = P[2 * first], oy = P[2 * first + 1];
    const len = Math.hypot(P[2 * last] - ox, P[2 * last + 1] - oy), ux = (P[2 * last] - ox) / len, uy = (P[2 * last + 1] - oy) / len;
    let magnitude = this.region.size;
    for (let i = 0; i < this.region.xy.length; i++) magnitude = Math.max(magnitude, Math.abs(this.region.xy[i]));
    for (let i = 0; i < 2 * this.n; i++) magnitude = Math.max(magnitude, Math.abs(P[i]));
    let before = -Infinity;
    for (let i = 0; i + 1 < path.length; i++) {
      const a = path[i], b = path[i + 1];
      const dx = P[2 * b] - P[2 * a], dy = P[2 * b + 1] - P[2 * a + 1];
      const along = 0.5 + (w[a] - w[b]) / (2 * (dx * dx + dy * dy));
      const at = (P[2 * a] + along * dx - ox) * ux + (P[2 * a + 1] + along * dy - oy) * uy;
      if (i > 0 && !(at - before > MIN_SPACING * magnitude)) refuseUndrawable(this.siteOf(a), 0);
      before = at;
    }
  }

  /** The boundary ring: corners and every point where the diagram meets the boundary, merged within tolerance. */
  buildRing(): void {
    const region = this.region, points = this.points, m = region.count;
    const cornerBase = (this.cornerBase = points.count);
    for (let j = 0; j < m; j++) points.add(region.xy[2 * j], region.xy[2 * j + 1]);
    const P = points.xy;
    const remap = (this.remap = new Int32Array(points.count));
    for (let i = 0; i < remap.length; i++) remap[i] = i;
    // Points closer along a side than rounding can tell apart are one point (a crossing computed
    // next to a corner it really passes through, say); a corner if one is there, else a Voronoi vertex.
    let magnitude = region.size;
    for (let i = 0; i < 2 * m; i++) magnitude = Math.max(magnitude, Math.abs(region.xy[i]));
    const tol = SNAP_ULPS * Number.EPSILON * magnitude;
    const rank = (id: number): number => (id >= cornerBase ? 0 : id < this.vertexCount ? 1 : 2);
    const perSide: { id: number; at: number }[][] = Array.from({ length: m }, () => []);
    for (let j = 0; j < m; j++) {
      perSide[j].push({ id: cornerBase + j, at: 0 });
      const len = region.sideLength(j);
      for (const id of this.sideEvents[j]) {
        const at = Math.max(region.along(j, P[2 * id], P[2 * id + 1]) * len, 0);
        if (at >= len - tol) perSide[(j + 1) % m].push({ id, at: 0 });
        else perSide[j].push({ id, at });
      }
    }
    const ring: number[] = [];
    for (let j = 0; j < m; j++) {
      const list = perSide[j].sort((p, q) => p.at - q.at || rank(p.id) - rank(q.id) || p.id - q.id);
      let keep = list[0];
      for (let k = 0; k < list.length; k++) {
        const e = list[k];
        if (k > 0 && e.at - keep.at > tol) keep = e;
        if (remap[e.id] === e.id || rank(keep.id) < rank(remap[e.id])) remap[e.id] = remap[keep.id];
        ring.push(keep.id);
      }
    }
    for (let i = 0; i < remap.length; i++) {
      let r = remap[i];
      while (remap[r] !== r) r = remap[r];
      remap[i] = r;
    }
    let kept = 0;
    for (let i = 0; i < ring.length; i++) {
      const id = remap[ring[i]];
      if (kept === 0 || ring[kept - 1] !== id) ring[kept++] = id;
    }
    ring.length = kept;
    while (ring.length > 1 && ring[0] === ring[ring.length - 1]) ring.pop();
    this.ring = ring;
    const origin = this.origin, twin = this.twin;
    for (const x of this.touching) {
      if (origin[x] >= 0) origin[x] = remap[origin[x]];
      if (origin[twin[x]] >= 0) origin[twin[x]] = remap[origin[twin[x]]];
    }
    // Merging may leave an edge with both ends at one point, or joining two neighbours on the ring,
    // which puts it along the boundary with a cell of zero width beside it: drop those.
    const at = new Int32Array(this.points.count).fill(-1);
    ring.forEach((id, i) => { at[id] = i; });
    const R = ring.length;
    for (const x of this.touching) {
      const p = origin[x];
      if (p < 0) continue;
      const q = origin[twin[x]];
      const gap = at[p] >= 0 && at[q] >= 0 ? (at[q] - at[p] + R) % R : 0;
      if (p === q || gap === 1 || gap === R - 1) { origin[twin[x]] = -1; origin[x] = -1; }
    }
  }

  /**
   * The rank of the site nearest to (x, y) (least power distance with
   * weights) among those with a cell, exactly; ties to the smallest site
   * number. Brute force: used once, when one cell covers the whole region.
   */
  private nearestBrute(x: number, y: number): number {
    const P = this.sites, w = this.weights, hidden = new Set<number>();
    for (const s of this.tri.hiddenSites) hidden.add(s);
    let best = -1;
    for (let r = 0; r < this.n; r++) {
      if (hidden.has(this.siteOf(r))) continue;
      if (best < 0) { best = r; continue; }
      const c = comparePowerDistance(x, y, P[2 * r], P[2 * r + 1], w ? w[r] : 0, P[2 * best], P[2 * best + 1], w ? w[best] : 0);
      if (c < 0 || (c === 0 && this.siteOf(r) < this.siteOf(best))) best = r;
    }
    return best;
  }

  /** Each stretch of boundary belongs to the cell on the left of the edge arriving at its start. */
  assignOwners(): void {
    const { ring, origin, twin, face } = this, P = this.points.xy;
    const isEvent = new Uint8Array(this.points.count);
    for (const id of ring) isEvent[id] = 1;
    const arriving = new Map<number, number[]>();
    for (const t of this.touching) {
      for (const x of [t, twin[t]]) {
        if (origin[x] < 0) continue;
        if (isEvent[origin[x]]) listAt(this.outgoing, origin[x]).push(x);
        const end = origin[twin[x]];
        if (isEvent[end]) listAt(arriving, end).push(x);
      }
    }
    const R = ring.length;
    const owner = (this.owner = new Int32Array(R).fill(-1));
    for (let i = 0; i < R; i++) {
      const here = ring[i], ahead = ring[(i + 1) % R];
      const list = arriving.get(here);
      if (!list) continue;
      // Several edges arrive at one point: the first counter-clockwise from the boundary's way on bounds the piece.
      const dx = P[2 * ahead] - P[2 * here], dy = P[2 * ahead + 1] - P[2 * here + 1];
      let best = -1, bestAngle = Infinity;
      for (const x of list) {
        const s = origin[x];
        const ux = P[2 * s] - P[2 * here], uy = P[2 * s + 1] - P[2 * here + 1];
        let angle = Math.atan2(dx * uy - dy * ux, dx * ux + dy * uy);
        if (angle <= 0) angle += 2 * Math.PI;
        if (angle < bestAngle) { bestAngle = angle; best = x; }
      }
      owner[i] = face[best];
    }
    let start = owner.findIndex((o) => o >= 0);
    if (start < 0) {
      // No edge reaches into the region: one cell covers it all, the cell of any interior point.
      owner[0] = this.siteOf(this.nearestBrute(this.region.cx, this.region.cy));
      start = 0;
    }
    for (let k = 1; k < R; k++) {
      const i = (start + k) % R;
      if (owner[i] < 0) owner[i] = owner[(i + R - 1) % R];
    }
  }

  /** Boundary half-edges: inner total+2i (ring[i] → ring[i+1], owned), outer total+2i+1 (back, outer face). */
  linkBoundary(): void {
    const { ring, owner, total } = this;
    const R = ring.length, all = (this.all = total + 2 * R);
    if (all > this.origin.length) {
      const grow = (a: Int32Array, fill: number): Int32Array => { const b = new Int32Array(all).fill(fill); b.set(a.subarray(0, total)); return b; };
      this.origin = grow(this.origin, 0); this.twin = grow(this.twin, 0); this.face = grow(this.face, 0); this.next = grow(this.next, -1);
    }
    const fOrigin = (this.fOrigin = this.origin), fTwin = (this.fTwin = this.twin);
    const fFace = (this.fFace = this.face), fNext = (this.fNext = this.next);
    for (let i = 0; i < R; i++) {
      const inner = total + 2 * i, outer = inner + 1;
      fOrigin[inner] = ring[i];
      fOrigin[outer] = ring[(i + 1) % R];
      fTwin[inner] = outer; fTwin[outer] = inner;
      fFace[inner] = owner[i];
      fFace[outer] = OUTER;
      fNext[outer] = total + 2 * ((i + R - 1) % R) + 1;
      listAt(this.outgoing, ring[i]).push(inner);
    }
    // Everything not linked by rotation ends on the boundary: take the one way on with the same face.
    const pending: number[] = [];
    for (const t of this.touching) pending.push(t, fTwin[t]);
    for (let x = total; x < all; x++) pending.push(x);
    for (const x of pending) {
      if (fOrigin[x] < 0 || fNext[x] >= 0) continue;
      const list = this.outgoing.get(fOrigin[fTwin[x]]);
      if (list) for (const y of list) if (fFace[y] === fFace[x]) { fNext[x] = y; break; }
      if (fNext[x] < 0) throw new Error(`ambit: internal error, no successor for half-edge ${x} of cell ${fFace[x]}`);
    }
  }

  /** Every cell of a power diagram has positive area as drawn (shoelace, relative to its first corner). */
  private checkDrawable(xy: Float64Array, origin: Int32Array, next: Int32Array, faceEdge: Int32Array): void {
    for (let s = 0; s < this.n; s++) {
      const first = faceEdge[s];
      if (first < 0) continue;
      const x0 = xy[2 * origin[first]], y0 = xy[2 * origin[first] + 1];
      let area = 0, magnitude = 0, e = next[first];
      for (let guard = 0; next[e] !== first && guard < origin.length; guard++) {
        const a = origin[e], b = origin[next[e]];
        const p = (xy[2 * a] - x0) * (xy[2 * b + 1] - y0), q = (xy[2 * b] - x0) * (xy[2 * a + 1] - y0);
        area += p - q;
        magnitude += Math.abs(p) + Math.abs(q);
        e = next[e];
      }
      // Positive beyond its own rounding, so that any way of summing it (a validator's, say) agrees.
      if (!(area > 16 * Number.EPSILON * magnitude)) refuseUndrawable(s, area / 2);
    }
  }

  /**
   * Keeps the half-edges and points in use. Dropped half-edges are few
   * (merged vertices, edges outside the region), so each hole below the
   * final count is filled by a kept half-edge from above it, and only the
   * references to those move: no pass of random lookups over every edge.
   * Face s is the cell of site s (empty when it misses the region); face n,
   * the outer face, comes last.
   */
  compact(): { mesh: HalfEdgeMesh; faceOfSite: Int32Array } {
    const { all, fOrigin, fTwin, fNext, fFace, n } = this, P = this.points.xy, pointCount = this.points.count;
    let E = 0;
    for (let x = 0; x < all; x++) if (fOrigin[x] >= 0) E++;
    const moveTo = new Int32Array(all - E);
    let hole = 0;
    for (let y = E; y < all; y++) {
      if (fOrigin[y] < 0) continue;
      while (fOrigin[hole] >= 0) hole++;
      moveTo[y - E] = hole++;
    }
    const relabel = (z: number): number => (z >= E ? moveTo[z - E] : z);
    // The half-edge before each mover on its face points at it: find them all, in one pass, before anything
    // moves (walking a long face, the boundary of a ring of sites say, once per mover would be quadratic).
    const before = new Int32Array(all - E);
    for (let x = 0; x < all; x++) if (fOrigin[x] >= 0 && fNext[x] >= E) before[fNext[x] - E] = x;
    for (let y = E; y < all; y++) {
      if (fOrigin[y] < 0) continue;
      const p = before[y - E];
      const x = moveTo[y - E];
      fOrigin[x] = fOrigin[y];
      fFace[x] = fFace[y];
      fTwin[x] = relabel(fTwin[y]);
      fNext[x] = relabel(fNext[y]);
      fTwin[fTwin[x]] = x;
      fNext[relabel(p)] = x;
    }
    // Points: those in use stay; the few unused ones below the count are filled from above it.
    const used = new Uint8Array(pointCount);
    for (let x = 0; x < E; x++) used[fOrigin[x]] = 1;
    let V = 0;
    for (let q = 0; q < pointCount; q++) V += used[q];
    const pointMove = new Int32Array(pointCount - V);
    let gap = 0;
    for (let q = V; q < pointCount; q++) {
      if (!used[q]) continue;
      while (used[gap]) gap++;
      pointMove[q - V] = gap;
      P[2 * gap] = P[2 * q]; P[2 * gap + 1] = P[2 * q + 1];
      used[gap++] = 1;
    }
    // A view when it wastes little: copying the points costs as much as computing them.
    const vertexXY = 2 * V < 0.9 * P.length ? P.slice(0, 2 * V) : P.subarray(0, 2 * V);
    const origin = fOrigin.subarray(0, E), twin = fTwin.subarray(0, E), next = fNext.subarray(0, E), face = fFace.subarray(0, E);
    const faceEdge = new Int32Array(n + 1).fill(-1), faceSite = new Int32Array(n + 1);
    for (let s = 0; s < n; s++) faceSite[s] = s;
    faceSite[n] = -1;
    for (let x = 0; x < E; x++) {
      if (origin[x] >= V) origin[x] = pointMove[origin[x] - V];
      let f = face[x];
      if (f === OUTER) face[x] = f = n;
      faceEdge[f] = x;
    }
    const faceOfSite = new Int32Array(n);
    for (let s = 0; s < n; s++) faceOfSite[s] = faceEdge[s] >= 0 ? s : -1;
    if (this.weights !== null) this.checkDrawable(vertexXY, origin, next, faceEdge);
    // Views keep the buffers alive; copy only when much of them would be wasted.
    const tight = (a: Int32Array): Int32Array => (E < 0.9 * (a.buffer.byteLength >> 2) ? a.slice() : a);
    const mesh = new HalfEdgeMesh({
      kind: 'voronoi', vertexXY, origin: tight(origin), twin: tight(twin), next: tight(next), face: tight(face),
      faceEdge, faceSite, outerFace: n,
    });
    return { mesh, faceOfSite };
  }
}

/**
 * Power cells have no floor on their size: a site whose lifted point lies a
 * hair below the lower hull (weights within an ulp of hiding it) has a cell
 * thinner than the rounding of its corners. Such a cell cannot be drawn
 * with positive area, so the diagram is refused, naming the site, as sites
 * too close together are, rather than returned wrong.
 */
function refuseUndrawable(site: number, area: number): never {
  throw new InputError('too-thin',
    `the power cell of site ${site} is thinner than double precision can draw (area ${area}): its weight leaves it within rounding of being hidden`,
    site, 'weights');
}

function listAt(map: Map<number, number[]>, id: number): number[] {
  let l = map.get(id);
  if (!l) { l = []; map.set(id, l); }
  return l;
}
