import type { HalfEdgeMesh } from '../../mesh/mesh.js';

/** Units in the last place within which a corner counts as on a line: the diagrams' own snap rule (SNAP_ULPS in src/diagram/clip.ts). */
const SPIKE_ULPS = 4;

/**
 * Reads face f of a diagram mesh into `out` (interleaved, counter-clockwise)
 * and returns its corner count, cleaned for the overlay, which needs a
 * simple polygon: repeated corners (metric meshes can hold distinct
 * vertices at one place) are merged, and spikes are cut off: a corner where
 * the boundary turns back (more than a right angle) with the shorter side's
 * far end within SPIKE_ULPS ulps of the longer side's line. Such a spike is
 * where rounded vertices of a degenerate diagram (several sites tied at
 * one vertex) cross over, below what double precision can draw; cutting it
 * changes the cell by less than that. Returns 0 when fewer than 3 corners remain.
 */
export function readCell(mesh: HalfEdgeMesh, f: number, out: { xy: Float64Array }): number {
  const xy = mesh.vertexXY, e0 = mesh.faceEdge[f];
  let k = 0, e = e0, c = out.xy, magnitude = 0;
  do {
    if (2 * k + 2 > c.length) { const bigger = new Float64Array(2 * c.length); bigger.set(c); c = out.xy = bigger; }
    const v = mesh.origin[e], x = xy[2 * v], y = xy[2 * v + 1];
    if (k === 0 || x !== c[2 * k - 2] || y !== c[2 * k - 1]) { c[2 * k] = x; c[2 * k + 1] = y; k++; }
    magnitude = Math.max(magnitude, Math.abs(x), Math.abs(y));
    e = mesh.next[e];
  } while (e !== e0);
  while (k > 1 && c[0] === c[2 * k - 2] && c[1] === c[2 * k - 1]) k--;
  const tol = SPIKE_ULPS * Number.EPSILON * magnitude;
  for (let i = 0; k >= 3 && i < k;) {
    const h = (i + k - 1) % k, j = (i + 1) % k;
    const ux = c[2 * i] - c[2 * h], uy = c[2 * i + 1] - c[2 * h + 1], wx = c[2 * j] - c[2 * i], wy = c[2 * j + 1] - c[2 * i + 1];
    const cross = ux * wy - uy * wx;
    const spike = ux * wx + uy * wy < 0 && cross * cross <= tol * tol * Math.max(ux * ux + uy * uy, wx * wx + wy * wy);
    const same = wx === 0 && wy === 0;
    if (!spike && !same) { i++; continue; }
    c.copyWithin(2 * i, 2 * i + 2, 2 * k);
    k--;
    i = Math.max(0, i - 1);
  }
  return k >= 3 ? k : 0;
}
