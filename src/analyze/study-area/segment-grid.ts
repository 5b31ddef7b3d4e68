import { orient } from '../../core/predicates.js';

/**
 * A uniform grid over the segments of a set of closed rings (segment j runs
 * from vertex j to vertex next[j]), each segment listed in every grid cell
 * its bounding box covers. It answers "which segments can meet this box"
 * and the exact point-in-area test (crossing parity along a ray to +x).
 *
 * Grid indices come from one monotone function of each coordinate, used for
 * segments and points alike, so a point whose grid cell lists no segment
 * lies in a connected piece of the plane that no segment touches: its
 * in/out status is the cell's, computed once and cached.
 */
export class SegmentGrid {
  private readonly xy: Float64Array;
  private readonly next: Int32Array;
  private readonly x0: number;
  private readonly y0: number;
  private readonly invW: number;
  private readonly invH: number;
  readonly cols: number;
  readonly rows: number;
  /** Segments of grid cell c: items[start[c] .. start[c + 1]). */
  private readonly start: Int32Array;
  private readonly items: Int32Array;
  /** Cached status of segment-free grid cells: 0 unknown, 1 inside, -1 outside. */
  private readonly emptyStatus: Int8Array;
  private readonly stamp: Int32Array;
  /** Scratch for the segments a ray meets. */
  private readonly ray: Int32Array;
  private stampNow = 0;

  constructor(xy: Float64Array, next: Int32Array) {
    this.xy = xy;
    this.next = next;
    const m = next.length;
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
    for (let i = 0; i < m; i++) {
      minX = Math.min(minX, xy[2 * i]); maxX = Math.max(maxX, xy[2 * i]);
      minY = Math.min(minY, xy[2 * i + 1]); maxY = Math.max(maxY, xy[2 * i + 1]);
    }
    // About two segments per grid cell along a ring: fine enough that a small
    // query box meets few segments, coarse enough that a segment covers few cells.
    const side = Math.max(1, Math.ceil(Math.sqrt(m)));
    this.cols = side;
    this.rows = side;
    this.x0 = minX;
    this.y0 = minY;
    this.invW = maxX > minX ? side / (maxX - minX) : 0;
    this.invH = maxY > minY ? side / (maxY - minY) : 0;
    const cells = side * side;
    const count = new Int32Array(cells + 1);
    for (let j = 0; j < m; j++) this.visit(j, (c) => { count[c + 1]++; });
    for (let c = 0; c < cells; c++) count[c + 1] += count[c];
    this.start = count.slice();
    this.items = new Int32Array(count[cells]);
    const fill = count.subarray(0, cells).slice();
    for (let j = 0; j < m; j++) this.visit(j, (c) => { this.items[fill[c]++] = j; });
    this.emptyStatus = new Int8Array(cells);
    this.stamp = new Int32Array(m);
    this.ray = new Int32Array(m);
  }

  col(x: number): number {
    const c = Math.floor((x - this.x0) * this.invW);
    return c >= 0 ? (c >= this.cols ? this.cols - 1 : c) : 0;
  }

  row(y: number): number {
    const r = Math.floor((y - this.y0) * this.invH);
    return r >= 0 ? (r >= this.rows ? this.rows - 1 : r) : 0;
  }

  private visit(j: number, f: (cell: number) => void): void {
    const xy = this.xy, k = this.next[j];
    const c0 = this.col(Math.min(xy[2 * j], xy[2 * k])), c1 = this.col(Math.max(xy[2 * j], xy[2 * k]));
    const r0 = this.row(Math.min(xy[2 * j + 1], xy[2 * k + 1])), r1 = this.row(Math.max(xy[2 * j + 1], xy[2 * k + 1]));
    for (let r = r0; r <= r1; r++) for (let c = c0; c <= c1; c++) f(r * this.cols + c);
  }

  private freshStamp(): number {
    if (++this.stampNow === 0x7fffffff) { this.stamp.fill(0); this.stampNow = 1; }
    return this.stampNow;
  }

  /**
   * Writes into `out` (from index 0) every segment whose bounding box meets
   * the closed box; returns how many. `out` must hold all segments.
   */
  query(minX: number, minY: number, maxX: number, maxY: number, out: Int32Array): number {
    const xy = this.xy, next = this.next, s = this.freshStamp();
    const c0 = this.col(minX), c1 = this.col(maxX), r0 = this.row(minY), r1 = this.row(maxY);
    let n = 0;
    for (let r = r0; r <= r1; r++) {
      for (let c = c0; c <= c1; c++) {
        const cell = r * this.cols + c;
        for (let i = this.start[cell]; i < this.start[cell + 1]; i++) {
          const j = this.items[i];
          if (this.stamp[j] === s) continue;
          this.stamp[j] = s;
          const k = next[j];
          if (Math.max(xy[2 * j], xy[2 * k]) < minX || Math.min(xy[2 * j], xy[2 * k]) > maxX ||
              Math.max(xy[2 * j + 1], xy[2 * k + 1]) < minY || Math.min(xy[2 * j + 1], xy[2 * k + 1]) > maxY) continue;
          out[n++] = j;
        }
      }
    }
    return n;
  }

  /** Whether no segment is listed in the grid cell of (x, y). */
  isEmptyAt(x: number, y: number): boolean {
    const cell = this.row(y) * this.cols + this.col(x);
    return this.start[cell] === this.start[cell + 1];
  }

  /** Exactly: 1 when (x, y) is inside the area, 0 on a ring, -1 outside. */
  locate(x: number, y: number): number {
    const cell = this.row(y) * this.cols + this.col(x);
    if (this.start[cell] === this.start[cell + 1]) {
      if (this.emptyStatus[cell] === 0) this.emptyStatus[cell] = this.parity(x, y) ? 1 : -1;
      return this.emptyStatus[cell];
    }
    const xy = this.xy, next = this.next;
    for (let i = this.start[cell]; i < this.start[cell + 1]; i++) {
      const j = this.items[i], k = next[j];
      if (onSegment(xy[2 * j], xy[2 * j + 1], xy[2 * k], xy[2 * k + 1], x, y)) return 0;
    }
    return this.parity(x, y) ? 1 : -1;
  }

  /** Crossing parity of the ray from (x, y) to +x; (x, y) must not lie on a segment. */
  private parity(x: number, y: number): boolean {
    const xy = this.xy, next = this.next, n = this.query(x, y, Infinity, y, this.ray);
    let inside = false;
    for (let i = 0; i < n; i++) {
      const j = this.ray[i], k = next[j];
      const ay = xy[2 * j + 1], by = xy[2 * k + 1];
      if ((ay > y) === (by > y)) continue;
      const o = orient(xy[2 * j], ay, xy[2 * k], by, x, y);
      if (by > ay ? o > 0 : o < 0) inside = !inside;
    }
    return inside;
  }
}

/** Whether (x, y) lies on the closed segment a–b (exact). */
export function onSegment(ax: number, ay: number, bx: number, by: number, x: number, y: number): boolean {
  if (x < Math.min(ax, bx) || x > Math.max(ax, bx) || y < Math.min(ay, by) || y > Math.max(ay, by)) return false;
  return orient(ax, ay, bx, by, x, y) === 0;
}
