import { orient } from '../../core/predicates.js';
import { centre, lpCentre } from './centre.js';
import { length } from '../../core/length.js';

const nextOf = (e: number): number => (e % 3 === 2 ? e - 2 : e + 1);
const prevOf = (e: number): number => (e % 3 === 0 ? e + 2 : e - 1);

/** An Lp-Delaunay triangulation in the implicit layout (half-edge 3t+k), with each triangle's Lp centre. */
export interface LpTriangles {
  vert: Int32Array;
  twin: Int32Array;
  /** Triangles 0..real-1 are real; real..count-1 are ghosts (one per hull edge). */
  real: number;
  cx: Float64Array;
  cy: Float64Array;
  /** 1 for a centre beyond the horizon: at infinity, on the side its placeholder position shows. */
  far: Uint8Array;
  /** Flips made, and whether the cap stopped them. */
  flips: number;
  capped: boolean;
}

/**
 * Where the Voronoi edge dual to half-edge x (a→b, triangle t on its left)
 * would run: from the centre of the triangle across x to the centre of t,
 * along the left normal û of a→b. Returns s(centre of t) - s(centre across),
 * the edge's signed length in the bisector's parameter (see PairFrame), and
 * sets `slack` to its rounding allowance.
 */
export function edgeSpan(xy: Float64Array, vert: Int32Array, twin: Int32Array, cx: Float64Array, cy: Float64Array, far: Uint8Array, x: number): number {
  const a = vert[x], b = vert[nextOf(x)];
  const ax = xy[2 * a], ay = xy[2 * a + 1], bx = xy[2 * b], by = xy[2 * b + 1];
  const len = length(bx - ax, by - ay), ux = -(by - ay) / len, uy = (bx - ax) / len;
  const mx = ax + (bx - ax) / 2, my = ay + (by - ay) / 2;
  const t = (x / 3) | 0, u = (twin[x] / 3) | 0;
  let st = (cx[t] - mx) * ux + (cy[t] - my) * uy, su = (cx[u] - mx) * ux + (cy[u] - my) * uy;
  if (far[t] || far[u]) {
    // Centres at infinity: only their side counts, and two on the same side are as one.
    if (far[t]) st = st < 0 ? -Infinity : Infinity;
    if (far[u]) su = su < 0 ? -Infinity : Infinity;
    span.slack = 0;
    return st === su ? 0 : st - su;
  }
  // Rounding allowance (a rule of thumb, no source): centres converge to a residual of a few ulps, which a
  // poorly conditioned triangle can magnify about a thousandfold, plus the ulps of the coordinates themselves.
  span.slack = 1e-12 * (Math.abs(st) + Math.abs(su) + len) + 16 * Number.EPSILON * (Math.abs(mx) + Math.abs(my));
  return st - su;
}
export const span = { slack: 0 };

/**
 * Turns the Euclidean Delaunay triangulation (implicit layout, ranks) into
 * the Lp-Delaunay one by Lawson flips: an interior edge is flipped when the
 * Voronoi edge dual to it would run backwards by more than its rounding
 * allowance (the far corner is inside the near triangle's Lp circle: the Lp
 * circles through the edge's two corners are nested on each side of it, so
 * the order of the two centres along the bisector says which circle holds
 * which corner), and the quadrilateral is strictly convex (exact orient), so
 * every step keeps a valid triangulation of the same convex hull. Hull edges
 * are Lp-Delaunay already (a huge Lp circle through their ends is nearly a
 * half-plane, empty of sites), so only interior edges are tested.
 *
 * Termination: for the Euclidean metric the lifting map proves Lawson flips
 * terminate; for general p we know no such proof, so flips are capped at
 * 16 per triangle (plus 1000). Past the cap the triangulation is kept as it
 * is (still a valid triangulation); the edges still running backwards are
 * then merged like co-circular ones (see the assembly), so the mesh stays
 * valid and only the cells near them are off.
 *
 * Centres farther than `horizon` along their bisector are placed there (see
 * lpCentre): decisions between two such centres are arbitrary but harmless,
 * as the edges between them lie far outside the region.
 */
export function lpDelaunay(p: number, xy: Float64Array, vertIn: Int32Array, twinIn: Int32Array, real: number, count: number, horizon: number): LpTriangles {
  const vert = vertIn.slice(0, 3 * count), twin = twinIn.slice(0, 3 * count);
  const cx = new Float64Array(real), cy = new Float64Array(real), far = new Uint8Array(real);
  const place = (t: number): void => {
    const a = vert[3 * t], b = vert[3 * t + 1], c = vert[3 * t + 2];
    lpCentre(p, xy[2 * a], xy[2 * a + 1], xy[2 * b], xy[2 * b + 1], xy[2 * c], xy[2 * c + 1], horizon);
    cx[t] = centre.x;
    cy[t] = centre.y;
    far[t] = centre.far ? 1 : 0;
  };
  for (let t = 0; t < real; t++) place(t);
  const limit = 3 * real;
  const stack: number[] = [];
  for (let x = 0; x < limit; x++) if (twin[x] < limit && x < twin[x]) stack.push(x);
  const cap = 16 * real + 1000;
  let flips = 0;
  while (stack.length > 0 && flips < cap) {
    const x = stack.pop()!;
    const y = twin[x];
    if (y >= limit) continue;
    if (-edgeSpan(xy, vert, twin, cx, cy, far, x) <= span.slack) continue;
    const x1 = nextOf(x), x2 = prevOf(x), y1 = nextOf(y), y2 = prevOf(y);
    const a = vert[x], b = vert[x1], c = vert[x2], d = vert[y2];
    if (orient(xy[2 * d], xy[2 * d + 1], xy[2 * c], xy[2 * c + 1], xy[2 * a], xy[2 * a + 1]) <= 0) continue;
    if (orient(xy[2 * c], xy[2 * c + 1], xy[2 * d], xy[2 * d + 1], xy[2 * b], xy[2 * b + 1]) <= 0) continue;
    // t = (a, b, c), u = (b, a, d) become t = (d, c, a) and u = (c, d, b); the outer twins move with their edges.
    const tx1 = twin[x1], tx2 = twin[x2], ty1 = twin[y1], ty2 = twin[y2];
    vert[x] = d; vert[x1] = c; vert[x2] = a;
    vert[y] = c; vert[y1] = d; vert[y2] = b;
    twin[x1] = tx2; twin[tx2] = x1;
    twin[x2] = ty1; twin[ty1] = x2;
    twin[y1] = ty2; twin[ty2] = y1;
    twin[y2] = tx1; twin[tx1] = y2;
    place((x / 3) | 0);
    place((y / 3) | 0);
    flips++;
    stack.push(x1, x2, y1, y2);
  }
  return { vert, twin, real, cx, cy, far, flips, capped: stack.length > 0 };
}
