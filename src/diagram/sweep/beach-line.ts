import { breakpointSide } from './exact-keys.js';

/**
 * The beach line: arcs left to right, as a treap (a binary search tree kept
 * balanced by random heap priorities) threaded by a doubly linked list, all
 * on typed arrays. The order is implicit: an arc's place is fixed when it is
 * inserted next to another, and the search compares a site with breakpoints
 * computed from the neighbours (exact, see exact-keys.ts). Priorities come
 * from a fixed-seed generator, so the shape, like everything else, depends
 * only on the input.
 *
 * The tree is kept only while searches need it. The sweep finds most arcs
 * by walking the list from a nearby arc (walk()); for spread-out sites it
 * never needs locate(), and keeping a tree nobody searches would cost a
 * rotation or two on every insertion and removal. So locate() builds the
 * tree from the list when there is none (linear, as the Cartesian tree of
 * the priorities: a treap again, the same one when priorities differ), and the
 * owner drops it (dropTree) once walks have served long enough to pay for
 * that build. Searches give the same arc either way.
 */
export class BeachLine {
  /** Site of each arc. */
  site: Int32Array;
  /** Neighbouring arcs (-1 at the ends). */
  prev: Int32Array;
  next: Int32Array;
  /** Per arc, the Delaunay edge record traced by the breakpoint on its right (-1: none). */
  rightEdge: Int32Array;
  /** Per arc, the pending circle event in which it vanishes (-1: none). */
  event: Int32Array;
  private left: Int32Array;
  private right: Int32Array;
  private parent: Int32Array;
  private prio: Uint32Array;
  root = -1;
  /** Whether the tree (left, right, parent, root) is kept up to date. */
  private treeKept = true;
  /** The leftmost arc (-1: none). */
  private head = -1;
  count = 0;
  /**
   * Arcs removed, for reuse: the live arcs (about the square root of the
   * sites for spread-out input) then keep to a few small ranges of ids that
   * stay in cache, instead of drifting across arrays sized for every arc
   * ever made. Ids are never compared, so reuse changes no decision. For
   * the same reason the arrays start small and grow on demand.
   */
  private free: Int32Array;
  private freeCount = 0;
  private seed = 0x9e3779b9;

  constructor(capacity: number) {
    this.site = new Int32Array(capacity);
    this.prev = new Int32Array(capacity);
    this.next = new Int32Array(capacity);
    this.rightEdge = new Int32Array(capacity);
    this.event = new Int32Array(capacity);
    this.left = new Int32Array(capacity);
    this.right = new Int32Array(capacity);
    this.parent = new Int32Array(capacity);
    this.prio = new Uint32Array(capacity);
    this.free = new Int32Array(capacity);
  }

  /** Doubles every per-arc array. */
  private grow(): void {
    const cap = 2 * this.site.length;
    const g = <T extends Int32Array | Uint32Array>(a: T, b: T): T => { b.set(a); return b; };
    this.site = g(this.site, new Int32Array(cap));
    this.prev = g(this.prev, new Int32Array(cap));
    this.next = g(this.next, new Int32Array(cap));
    this.rightEdge = g(this.rightEdge, new Int32Array(cap));
    this.event = g(this.event, new Int32Array(cap));
    this.left = g(this.left, new Int32Array(cap));
    this.right = g(this.right, new Int32Array(cap));
    this.parent = g(this.parent, new Int32Array(cap));
    this.prio = g(this.prio, new Uint32Array(cap));
    this.free = g(this.free, new Int32Array(cap));
  }

  private newArc(site: number): number {
    if (this.freeCount === 0 && this.count === this.site.length) this.grow();
    const z = this.freeCount > 0 ? this.free[--this.freeCount] : this.count++;
    // xorshift32: cheap, fixed seed, good enough to balance a treap.
    let s = this.seed;
    s ^= s << 13; s ^= s >>> 17; s ^= s << 5;
    this.seed = s >>> 0;
    this.prio[z] = this.seed;
    this.site[z] = site;
    this.prev[z] = this.next[z] = -1;
    this.left[z] = this.right[z] = this.parent[z] = -1;
    this.rightEdge[z] = -1;
    this.event[z] = -1;
    return z;
  }

  /** The first arc of an empty beach line. */
  first(site: number): number {
    const z = this.newArc(site);
    this.root = z;
    this.head = z;
    this.treeKept = true;
    return z;
  }

  /** Arcs on the line. */
  get live(): number { return this.count - this.freeCount; }

  /** Whether the tree is kept (see the class comment). */
  get hasTree(): boolean { return this.treeKept; }

  /** Stops keeping the tree; locate() builds it again when next needed. */
  dropTree(): void { this.treeKept = false; }

  /**
   * The tree of the arcs in list order with min-heap priorities (a
   * Cartesian tree), built with a stack of the rightmost path in one pass.
   */
  private buildTree(): void {
    const L = this.left, R = this.right, P = this.parent, prio = this.prio, next = this.next;
    const stack = new Int32Array(this.live);
    let sp = 0;
    for (let z = this.head; z >= 0; z = next[z]) {
      let last = -1;
      while (sp > 0 && prio[stack[sp - 1]] > prio[z]) last = stack[--sp];
      L[z] = last;
      R[z] = -1;
      if (last >= 0) P[last] = z;
      if (sp > 0) { R[stack[sp - 1]] = z; P[z] = stack[sp - 1]; } else P[z] = -1;
      stack[sp++] = z;
    }
    this.root = sp > 0 ? stack[0] : -1;
    this.treeKept = true;
  }

  /** A new arc of `site` right after arc x. */
  insertAfter(x: number, site: number): number {
    const z = this.newArc(site);
    const s = this.next[x];
    this.prev[z] = x;
    this.next[z] = s;
    this.next[x] = z;
    if (s >= 0) this.prev[s] = z;
    if (!this.treeKept) return z;
    // In the tree, z becomes the leftmost node of x's right subtree: x's
    // right child if it has none, else the left child of x's old successor.
    if (this.right[x] < 0) {
      this.right[x] = z;
      this.parent[z] = x;
    } else {
      this.left[s] = z;
      this.parent[z] = s;
    }
    while (this.parent[z] >= 0 && this.prio[z] < this.prio[this.parent[z]]) this.rotateUp(z);
    return z;
  }

  /** Removes arc z from the line. */
  remove(z: number): void {
    if (this.treeKept) this.removeFromTree(z);
    const a = this.prev[z], b = this.next[z];
    if (z === this.head) this.head = b;
    if (a >= 0) this.next[a] = b;
    if (b >= 0) this.prev[b] = a;
    // No site: a hint still naming this arc is seen to be stale (see walk()).
    this.site[z] = -1;
    this.free[this.freeCount++] = z;
  }

  private removeFromTree(z: number): void {
    const L = this.left, R = this.right;
    // Rotate z down until it is a leaf, keeping the heap order of the others.
    for (;;) {
      const l = L[z], r = R[z];
      if (l < 0 && r < 0) break;
      this.rotateUp(l < 0 ? r : r < 0 ? l : this.prio[l] < this.prio[r] ? l : r);
    }
    const p = this.parent[z];
    if (p < 0) this.root = -1;
    else if (L[p] === z) L[p] = -1;
    else R[p] = -1;
  }

  private rotateUp(z: number): void {
    const L = this.left, R = this.right, P = this.parent;
    const p = P[z], g = P[p];
    if (L[p] === z) {
      const m = R[z];
      L[p] = m;
      if (m >= 0) P[m] = p;
      R[z] = p;
    } else {
      const m = L[z];
      R[p] = m;
      if (m >= 0) P[m] = p;
      L[z] = p;
    }
    P[p] = z;
    P[z] = g;
    if (g < 0) this.root = z;
    else if (L[g] === p) L[g] = z;
    else R[g] = z;
  }

  /**
   * The arc above site (qx, qy), found by walking along the line from arc z
   * (a live arc near it), or -1 after `steps` breakpoints without finding
   * it. The breakpoints are in order along the line and each test is exact,
   * so the walk ends at the arc locate() finds, by the same tie rule.
   */
  walk(z: number, qx: number, qy: number, xy: Float64Array, steps: number): number {
    const site = this.site, prev = this.prev, next = this.next;
    let s = site[z], sx = xy[2 * s], sy = xy[2 * s + 1];
    let l = prev[z];
    if (l >= 0) {
      let t = site[l];
      if (breakpointSide(qx, qy, xy[2 * t], xy[2 * t + 1], sx, sy) < 0) {
        // Left of z: go left until the breakpoint on the left is not right of q.
        for (;;) {
          z = l; s = t; sx = xy[2 * s]; sy = xy[2 * s + 1];
          l = prev[z];
          if (l < 0) return z;
          t = site[l];
          if (breakpointSide(qx, qy, xy[2 * t], xy[2 * t + 1], sx, sy) >= 0) return z;
          if (--steps === 0) return -1;
        }
      }
    }
    for (;;) {
      const r = next[z];
      if (r < 0) return z;
      const t = site[r];
      if (breakpointSide(qx, qy, sx, sy, xy[2 * t], xy[2 * t + 1]) < 0) return z;
      if (--steps === 0) return -1;
      z = r; sx = xy[2 * t]; sy = xy[2 * t + 1];
    }
  }

  /**
   * The arc above site (qx, qy) as the sweep line reaches it. A site exactly
   * below a breakpoint goes to the arc on the right (one rule for all ties;
   * the sweep then closes the empty arc left of it with a circle event).
   */
  locate(qx: number, qy: number, xy: Float64Array): number {
    if (!this.treeKept) this.buildTree();
    const site = this.site, prev = this.prev, next = this.next, L = this.left, R = this.right;
    let z = this.root;
    for (;;) {
      const s = site[z];
      const sx = xy[2 * s], sy = xy[2 * s + 1];
      // Only a breakpoint with a subtree behind it is tested: a neighbour
      // without one is an ancestor whose test already placed the site.
      if (L[z] >= 0) {
        const t = site[prev[z]];
        if (breakpointSide(qx, qy, xy[2 * t], xy[2 * t + 1], sx, sy) < 0) { z = L[z]; continue; }
      }
      if (R[z] >= 0) {
        const t = site[next[z]];
        if (breakpointSide(qx, qy, sx, sy, xy[2 * t], xy[2 * t + 1]) >= 0) { z = R[z]; continue; }
      }
      return z;
    }
  }
}
