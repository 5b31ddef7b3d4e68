import type { ConvexRegion } from '../clip.js';
import { IntList, PointList } from './lists.js';

/** A place where a cell boundary meets the region's boundary. */
export interface Crossing {
  point: number;
  /** Position along its side (0 at the side's start, 1 at its end). */
  along: number;
  /** Angle of the boundary edge's inward direction from the side's direction: orders crossings at one point. */
  angle: number;
  /** The cells just before and just after the crossing, walking the region's boundary counter-clockwise. */
  before: number;
  after: number;
}

/**
 * The pieces of a diagram before they are linked into a mesh: points, and
 * edges as twin pairs (half-edges 2k, 2k+1) with the face on the left of
 * each; crossings with the region's boundary, per side.
 */
export class MeshParts {
  readonly points = new PointList(4096);
  readonly origin = new IntList(8192);
  readonly face = new IntList(8192);
  /** Runs of edges joined end to start at bends (see bend()), as pairs: first edge, last edge. */
  readonly bends = new IntList(1024);
  readonly crossings: Crossing[][];

  constructor(readonly region: ConvexRegion) {
    this.crossings = Array.from({ length: region.count }, () => []);
  }

  /**
   * Room for this many points and half-edges in all (see IntList.room):
   * lists that end nearly full are handed to the mesh as they are (see
   * linkMesh), where a copy would cost about as much as filling them.
   */
  room(points: number, halfEdges: number): void {
    this.points.room(points);
    this.origin.room(halfEdges);
    this.face.room(halfEdges);
  }

  /** An edge p → q with face `left` on its left and `right` on its right. */
  link(p: number, q: number, left: number, right: number): void {
    this.origin.push(p); this.face.push(left);
    this.origin.push(q); this.face.push(right);
  }

  /**
   * Declares the point where the edge before the last ends and the last one
   * starts a bend: a point made for these two edges, which no other edge
   * touches. Around a bend linkMesh needs no search: each half-edge arriving
   * there goes on along the other edge.
   */
  bend(): void {
    const k = (this.origin.count >> 1) - 1, r = this.bends, c = r.count;
    if (c > 0 && r.a[c - 1] === k - 1) r.a[c - 1] = k;
    else { r.push(k - 1); r.push(k); }
  }

  /** Strictly inside the region (points within rounding of a side count as outside, the same way everywhere). */
  inside(x: number, y: number): boolean {
    const r = this.region;
    for (let j = 0; j < r.count; j++) if (!(r.side(j, x, y) > 0)) return false;
    return true;
  }

  // Results of clip().
  tIn = 0; tOut = 1; sideIn = -1; sideOut = -1;

  /**
   * Cyrus–Beck with the same inside rule as inside(): the part [tIn, tOut]
   * of P→Q in the region; sideIn < 0 exactly when P is inside, sideOut < 0
   * exactly when Q is. False when no part of positive length is inside.
   */
  clip(px: number, py: number, qx: number, qy: number): boolean {
    const r = this.region;
    let tIn = 0, tOut = 1, sideIn = -1, sideOut = -1;
    for (let j = 0; j < r.count; j++) {
      const fp = r.side(j, px, py), fq = r.side(j, qx, qy);
      if (fp <= 0 && fq <= 0) return false;
      if (fp <= 0) {
        const t = fp / (fp - fq);
        if (sideIn < 0 || t > tIn) { tIn = t; sideIn = j; }
      } else if (fq <= 0) {
        const t = fp / (fp - fq);
        if (sideOut < 0 || t < tOut) { tOut = t; sideOut = j; }
      }
    }
    if (sideIn >= 0 && sideOut >= 0) {
      if (!(tIn < tOut)) return false;
      // Entering and leaving within rounding of one point (a line through a corner, touching it only): the
      // part inside must reach strictly inside, by the same rule, or it is a sliver of no length.
      const tm = (tIn + tOut) / 2;
      if (!this.inside(px + tm * (qx - px), py + tm * (qy - py))) return false;
    }
    this.tIn = tIn; this.tOut = tOut; this.sideIn = sideIn; this.sideOut = sideOut;
    return true;
  }

  /** A crossing of side j at P + t (Q − P) by an edge running P→Q with `left` and `right` cells, entering or leaving. */
  cross(j: number, px: number, py: number, qx: number, qy: number, t: number, left: number, right: number, entering: boolean): number {
    const r = this.region.xy, k = j + 1 === this.region.count ? 0 : j + 1;
    const dx = r[2 * k] - r[2 * j], dy = r[2 * k + 1] - r[2 * j + 1];
    // On an axis-parallel side (every side of a box) the crossing takes the side's coordinate exactly: the
    // interpolation can land an ulp off it, and a cell would then miss points of the region's own boundary.
    const x = dx === 0 ? r[2 * j] : px + t * (qx - px), y = dy === 0 ? r[2 * j + 1] : py + t * (qy - py);
    const id = this.points.add(x, y);
    // Inward direction of the edge at the crossing.
    const wx = entering ? qx - px : px - qx, wy = entering ? qy - py : py - qy;
    this.crossings[j].push({
      point: id,
      along: this.region.along(j, x, y),
      angle: Math.atan2(dx * wy - dy * wx, dx * wx + dy * wy),
      // Entering, the cell on the edge's left lies before the crossing; leaving, after it.
      before: entering ? left : right,
      after: entering ? right : left,
    });
    return id;
  }
}
