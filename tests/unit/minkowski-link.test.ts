import { describe, expect, it } from 'vitest';
import { checkMesh } from '../../src/index.js';
import { ConvexRegion } from '../../src/diagram/clip.js';
import { linkMesh } from '../../src/diagram/minkowski/link.js';
import { IntList, PointList } from '../../src/diagram/minkowski/lists.js';
import { MeshParts } from '../../src/diagram/minkowski/parts.js';
import { addRing, OUTER } from '../../src/diagram/minkowski/ring.js';

/**
 * Two cells of a 4 x 4 square split by a zigzag from below the bottom side to
 * above the top one, walked as clipLine walks a polyline: a crossing in, made
 * points at the three bends, a crossing out. Cell 0 lies west of the zigzag.
 */
function zigzag(declareBends: boolean, parts = new MeshParts(new ConvexRegion(Float64Array.of(0, 0, 4, 0, 4, 4, 0, 4)))) {
  const P = [2, -1, 2.2, 1, 1.8, 2, 2.2, 3, 2, 5];
  let cur = parts.cross(0, P[0], P[1], P[2], P[3], 0.5, 0, 1, true);
  // Edge k runs from point k to point k + 1 of P (the first from the crossing, the last to the crossing out).
  for (let k = 0; k < 4; k++) {
    const next = k === 3 ? parts.cross(2, P[6], P[7], P[8], P[9], 0.5, 0, 1, false) : parts.points.add(P[2 * k + 2], P[2 * k + 3]);
    parts.link(cur, next, 0, 1);
    if (declareBends && k > 0) parts.bend();
    cur = next;
  }
  addRing(parts, OUTER, () => 0);
  return linkMesh(parts, 2, Int32Array.of(0, 1), () => false).mesh;
}

describe('linkMesh at bends', () => {
  it('links edges declared to meet at bends as the search around every point does', () => {
    const searched = zigzag(false), declared = zigzag(true);
    expect(checkMesh(declared).problems).toEqual([]);
    for (const key of ['vertexXY', 'origin', 'twin', 'next', 'face', 'faceEdge', 'faceSite'] as const) {
      expect(Array.from(declared[key])).toEqual(Array.from(searched[key]));
    }
    // Three bends in one run: edges 1, 2 and 3 each start where the one before ends, and go on from it.
    expect(Array.from(declared.next.subarray(0, 6))).toEqual([2, declared.next[1], 4, 1, 6, 3]);
  });

  it('refuses a bend between edges that do not meet', () => {
    const parts = new MeshParts(new ConvexRegion(Float64Array.of(0, 0, 4, 0, 4, 4, 0, 4)));
    const a = parts.points.add(1, 1), b = parts.points.add(2, 2), c = parts.points.add(3, 1), d = parts.points.add(3, 3);
    parts.link(a, b, 0, 1);
    parts.link(c, d, 0, 1);
    parts.bend();
    expect(() => linkMesh(parts, 2, Int32Array.of(0, 1), () => false)).toThrow(/meet at no bend/);
  });
});

describe('list room', () => {
  it('keeps the contents and never drops below the count', () => {
    const ints = new IntList(16), pts = new PointList(16);
    for (let i = 0; i < 100; i++) { ints.push(3 * i); pts.add(i, -i); }
    ints.room(10); pts.room(10);
    expect(ints.a.length).toBe(100);
    expect(pts.xy.length).toBe(200);
    ints.room(1000); pts.room(1000);
    expect(ints.a.length).toBe(1000);
    expect(pts.xy.length).toBe(2000);
    expect(Array.from(ints.view())).toEqual(Array.from({ length: 100 }, (_, i) => 3 * i));
    expect(Array.from(pts.xy.subarray(0, 200))).toEqual(Array.from({ length: 200 }, (_, k) => (k & 1 ? -(k >> 1) : k >> 1)));
  });
});
