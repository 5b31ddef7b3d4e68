import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMesh, orient, triangulate, type Triangulation } from '../../src/index.js';
import {
  canonicalTriangles,
  distinctCount,
  globalEmptyCircleViolations,
  isStrictlyDelaunay,
  localDelaunayViolations,
  orientationViolations,
  triangleEdgeKeys,
} from '../support/brute.js';
import { allGenerators, uniform, type NamedGenerator } from '../support/generators.js';
import { affineDimension, monotoneChainHull } from '../support/hull.js';

// 1000 runs per property in CI (process.env.CI set), 150 locally so the
// edit-test loop stays quick; the count is common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 150;

/**
 * Every check of one triangulation against the input it was built from.
 * Returns the problems found (empty when all hold), so a failing property
 * prints all of them next to fast-check's shrunk counterexample.
 */
function triangulationProblems(input: readonly number[], tri: Triangulation): string[] {
  const out: string[] = [];
  const n = tri.siteCount;
  const xy = tri.siteXY;
  const sites = Array.from(tri.triangleSites);

  // Duplicates merged, every input index kept, sites numbered by first appearance.
  if (n !== distinctCount(input)) out.push(`siteCount ${n}, but the input has ${distinctCount(input)} distinct points`);
  if (tri.inputCount !== input.length / 2) out.push(`inputCount ${tri.inputCount}, expected ${input.length / 2}`);
  if (tri.mergedCount !== tri.inputCount - n) out.push(`mergedCount ${tri.mergedCount} != inputCount - siteCount`);
  let nextNew = 0;
  for (let i = 0; i < input.length / 2; i++) {
    const s = tri.siteOfInput[i];
    if (!(s >= 0 && s < n)) { out.push(`input ${i} maps to site ${s}, out of range`); continue; }
    if (xy[2 * s] !== input[2 * i] || xy[2 * s + 1] !== input[2 * i + 1]) {
      out.push(`input ${i} (${input[2 * i]}, ${input[2 * i + 1]}) maps to site ${s} at (${xy[2 * s]}, ${xy[2 * s + 1]})`);
    }
    if (s === nextNew) nextNew++;
    else if (s > nextNew) out.push(`input ${i} maps to site ${s} before site ${nextNew} appeared`);
  }

  const dim = affineDimension(input);
  if (tri.dimension !== dim) out.push(`dimension ${tri.dimension}, expected ${dim}`);

  // Hull against Andrew's monotone chain (1979), compared as coordinates.
  const hull = Array.from(tri.hull());
  const ours = JSON.stringify(hull.map((s) => [xy[2 * s], xy[2 * s + 1]]));
  const expected = JSON.stringify(monotoneChainHull(input));
  if (ours !== expected) out.push(`hull ${ours} != monotone chain ${expected}`);
  const h = hull.length;

  const edges = Array.from(tri.edges());
  const edgeKeys: string[] = [];
  for (let i = 0; i < edges.length; i += 2) {
    if (!(edges[i] < edges[i + 1])) out.push(`edge (${edges[i]}, ${edges[i + 1]}) not ordered a < b`);
    edgeKeys.push(`${Math.min(edges[i], edges[i + 1])},${Math.max(edges[i], edges[i + 1])}`);
  }
  edgeKeys.sort();
  if (new Set(edgeKeys).size !== edgeKeys.length) out.push('edges() lists an edge twice');

  if (sites.length !== 3 * tri.triangleCount) out.push(`triangleSites has ${sites.length} entries for ${tri.triangleCount} triangles`);
  if (dim === 2) {
    // Euler's formula for a triangulation of n points with h on the hull boundary.
    if (tri.triangleCount !== 2 * n - 2 - h) out.push(`Euler: ${tri.triangleCount} triangles, expected 2n-2-h = ${2 * n - 2 - h}`);
    if (edgeKeys.length !== 3 * n - 3 - h) out.push(`Euler: ${edgeKeys.length} edges, expected 3n-3-h = ${3 * n - 3 - h}`);
    if (JSON.stringify(edgeKeys) !== JSON.stringify(triangleEdgeKeys(sites))) out.push('edges() differ from the triangle edges');
    out.push(...orientationViolations(xy, sites));
    // Every interior edge locally Delaunay by the exact incircle (Delaunay 1934, Lawson 1977).
    out.push(...localDelaunayViolations(xy, sites));
  } else {
    if (tri.triangleCount !== 0) out.push(`dimension ${dim} but ${tri.triangleCount} triangles`);
    if (edgeKeys.length !== Math.max(0, n - 1)) out.push(`dimension ${dim}: ${edgeKeys.length} edges, expected ${n - 1}`);
    if (h !== n) out.push(`dimension ${dim}: hull has ${h} sites, expected all ${n}`);
  }

  // neighbors(): the same adjacency as edges(), counter-clockwise.
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (let i = 0; i < edges.length; i += 2) { adj[edges[i]].push(edges[i + 1]); adj[edges[i + 1]].push(edges[i]); }
  const triKeys = new Set<string>();
  for (let t = 0; t < sites.length; t += 3) {
    for (let k = 0; k < 3; k++) triKeys.add(`${sites[t + k]},${sites[t + (k + 1) % 3]},${sites[t + (k + 2) % 3]}`);
  }
  const onHull = new Set(hull);
  for (let s = 0; s < n && out.length < 40; s++) {
    const nb = Array.from(tri.neighbors(s));
    if (JSON.stringify([...nb].sort((a, b) => a - b)) !== JSON.stringify([...adj[s]].sort((a, b) => a - b))) {
      out.push(`neighbors(${s}) = ${nb} but edges give ${adj[s]}`);
      continue;
    }
    if (dim === 2 && nb.length > 1) {
      // Consecutive neighbours (u, w) must close a counter-clockwise triangle (s, u, w):
      // all of them around an interior site, all but the gap at a hull site.
      let fans = 0;
      for (let i = 0; i < nb.length; i++) if (triKeys.has(`${s},${nb[i]},${nb[(i + 1) % nb.length]}`)) fans++;
      const want = onHull.has(s) ? nb.length - 1 : nb.length;
      if (fans !== want) out.push(`neighbors(${s}) = ${nb} not counter-clockwise (${fans} of ${want} consecutive pairs are triangles)`);
    }
  }

  // checkMesh, the shared validator, on the explicit half-edge mesh.
  const res = checkMesh(tri.toMesh(), { delaunay: 'local' });
  if (!res.ok) out.push(...res.problems.map((p) => `checkMesh: ${p}`));
  return out;
}

function expectNoProblems(problems: string[]): void {
  if (problems.length > 0) throw new Error(`${problems.length} problem(s):\n  ${problems.slice(0, 25).join('\n  ')}`);
}

const generators: NamedGenerator[] = allGenerators(200);
const small: NamedGenerator[] = allGenerators(60);

describe.each(generators.map((g) => [g.name, g] as const))('triangulate on %s input', (_name, g) => {
  it('is a valid Delaunay triangulation with the right hull, counts and site mapping, deterministically', () => {
    fc.assert(
      fc.property(g.arb, (input) => {
        const tri = triangulate(input);
        expectNoProblems(triangulationProblems(input, tri));
        const again = triangulate(input);
        expect(Array.from(again.triangleSites)).toEqual(Array.from(tri.triangleSites));
        expect(Array.from(again.hull())).toEqual(Array.from(tri.hull()));
        expect(Array.from(again.siteOfInput)).toEqual(Array.from(tri.siteOfInput));
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

describe.each(small.map((g) => [g.name, g] as const))('triangulate on %s input of <= 60 points', (_name, g) => {
  it('has no site strictly inside any triangle circle (global empty circle, brute force)', () => {
    fc.assert(
      fc.property(g.arb, (input) => {
        const tri = triangulate(input);
        const bad = globalEmptyCircleViolations(tri.siteXY, tri.triangleSites);
        expectNoProblems(bad.map((v) => v.message));
        const res = checkMesh(tri.toMesh(), { delaunay: 'global' });
        expectNoProblems(res.problems.map((p) => `checkMesh global: ${p}`));
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

describe('insertion order', () => {
  it('gives the same set of triangles for every order when no 4 sites are cocircular', () => {
    fc.assert(
      fc.property(uniform(200, 3), (input) => {
        const tri = triangulate(input);
        expectNoProblems(localDelaunayViolations(tri.siteXY, tri.triangleSites));
        // Unique Delaunay triangulation iff every interior edge is strictly locally Delaunay.
        fc.pre(isStrictlyDelaunay(tri.siteXY, tri.triangleSites));
        const want = canonicalTriangles(tri.triangleSites);
        for (const order of ['input', 'brio', 'hilbert'] as const) {
          const other = triangulate(input, { order });
          expect(canonicalTriangles(other.triangleSites), `order '${order}'`).toEqual(want);
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('gives a valid Delaunay triangulation for every order on degenerate input', () => {
    const degenerate = fc.oneof(...generators.map((g) => g.arb));
    fc.assert(
      fc.property(degenerate, fc.constantFrom('input', 'brio', 'hilbert'), (input, order) => {
        expectNoProblems(triangulationProblems(input, triangulate(input, { order })));
      }),
      { numRuns: NUM_RUNS },
    );
  });
});

describe('insert()', () => {
  const family = fc.oneof(...allGenerators(100).map((g) => g.arb));
  it('triangulating A then inserting B gives a valid Delaunay triangulation of A and B', () => {
    fc.assert(
      fc.property(family, family, (a, b) => {
        const tri = triangulate(a);
        const added = tri.insert(b);
        if (added.length !== b.length / 2) throw new Error(`insert returned ${added.length} sites for ${b.length / 2} points`);
        const union = [...a, ...b];
        for (let i = 0; i < added.length; i++) {
          const s = added[i];
          if (tri.siteXY[2 * s] !== b[2 * i] || tri.siteXY[2 * s + 1] !== b[2 * i + 1]) {
            throw new Error(`inserted point ${i} (${b[2 * i]}, ${b[2 * i + 1]}) went to site ${s}`);
          }
        }
        expectNoProblems(triangulationProblems(union, tri));
        if (union.length <= 120) {
          expectNoProblems(globalEmptyCircleViolations(tri.siteXY, tri.triangleSites).map((v) => v.message));
        }
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('inserting points one at a time keeps every check true', () => {
    fc.assert(
      fc.property(fc.oneof(...allGenerators(40).map((g) => g.arb)), (input) => {
        const tri = triangulate(input.slice(0, 2));
        for (let i = 2; i < input.length; i += 2) {
          tri.insert([input[i], input[i + 1]]);
          expectNoProblems(triangulationProblems(input.slice(0, i + 2), tri));
        }
      }),
      { numRuns: Math.ceil(NUM_RUNS / 3) },
    );
  });
});

// Guard the helpers themselves: they must be able to fail.
describe('the property checks can fail', () => {
  it('catch a flipped (non-Delaunay) diagonal and a wrong hull', () => {
    // Square (0,0),(4,0),(4,4),(0,4) with (2,3) inside: a hand-made triangle
    // list that ignores (2,3) has it inside the circle of (0,0),(4,0),(4,4).
    const xy = [0, 0, 4, 0, 4, 4, 0, 4, 2, 3];
    const good = triangulate(xy);
    expect(triangulationProblems(xy, good)).toEqual([]);
    const bad = [0, 1, 2, 0, 2, 3, 0, 3, 4, 1, 2, 4]; // (0,1,2)/(0,2,3) with 4 inside
    expect(orient(0, 0, 4, 0, 4, 4)).toBeGreaterThan(0);
    expect(globalEmptyCircleViolations(good.siteXY, bad).length).toBeGreaterThan(0);
    expect(monotoneChainHull([0, 0, 4, 0, 4, 4, 0, 4, 2, 3])).toEqual([[0, 0], [4, 0], [4, 4], [0, 4]]);
  });

  it('catch a non-Delaunay interior edge locally: exactly one diagonal of a non-cocircular quad passes', () => {
    const xy = [0, 0, 4, 0, 4, 4, 0, 5];
    const diag02 = [0, 1, 2, 0, 2, 3];
    const diag13 = [0, 1, 3, 1, 2, 3];
    expect(orientationViolations(xy, diag02)).toEqual([]);
    expect(orientationViolations(xy, diag13)).toEqual([]);
    const bad = [localDelaunayViolations(xy, diag02).length, localDelaunayViolations(xy, diag13).length];
    expect(bad.filter((k) => k === 0).length).toBe(1);
    expect(isStrictlyDelaunay(xy, bad[0] === 0 ? diag02 : diag13)).toBe(true);
  });

  it('monotone chain keeps points on hull edges and orders collinear sets along the line', () => {
    expect(monotoneChainHull([2, 0, 0, 0, 1, 0, 1, 1, 0, 2, 0, 1])).toEqual([[0, 0], [1, 0], [2, 0], [1, 1], [0, 2], [0, 1]]);
    expect(monotoneChainHull([2, 2, 0, 0, 1, 1, 1, 1])).toEqual([[0, 0], [1, 1], [2, 2]]);
    expect(monotoneChainHull([-0, 3])).toEqual([[0, 3]]);
  });
});
