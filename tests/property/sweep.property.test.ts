import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkMesh, InputError, voronoi, type VoronoiDiagram } from '../../src/index.js';
import { diagramDifferences } from '../support/diagram-compare.js';
import { allGenerators, type NamedGenerator } from '../support/generators.js';
import { boundingBox } from '../support/voronoi-brute.js';

// 1000 runs per property in CI (process.env.CI set), 100 locally so the
// edit-test loop stays quick; the count is common practice, no source.
const NUM_RUNS = process.env.CI ? 1000 : 100;

/** A double uniform in [0, 1) with 53 random bits. */
const unit = fc
  .tuple(fc.integer({ min: 0, max: 2 ** 26 - 1 }), fc.integer({ min: 0, max: 2 ** 27 - 1 }))
  .map(([hi, lo]) => (hi * 2 ** 27 + lo) / 2 ** 53);

/** No clip (the default padded box), or a rectangle around the sites' box, possibly cutting through it. */
const clipArb = fc.option(fc.tuple(unit, unit, unit, unit), { nil: undefined });

function clipFor(input: number[], f: [number, number, number, number] | undefined) {
  if (f === undefined) return undefined;
  const b = boundingBox(input);
  const h = Math.max(b.maxX - b.minX, b.maxY - b.minY, 1);
  const cx = b.minX + (b.maxX - b.minX) / 2, cy = b.minY + (b.maxY - b.minY) / 2;
  return { minX: cx - h * (0.2 + f[0]), maxX: cx + h * (0.2 + f[1]), minY: cy - h * (0.2 + f[2]), maxY: cy + h * (0.2 + f[3]) };
}

/** Both constructions, or the same InputError from both. */
function both(input: number[], clip: ReturnType<typeof clipFor>): { dual: VoronoiDiagram; sweep: VoronoiDiagram } | string {
  let dual: VoronoiDiagram | null = null, err: unknown = null;
  try { dual = voronoi(input, { clip }); } catch (e) { err = e; }
  if (dual === null) {
    if (!(err instanceof InputError)) throw err;
    try {
      voronoi(input, { clip, method: 'sweep' });
    } catch (e2) {
      if (e2 instanceof InputError && e2.code === err.code) return 'same error';
      throw e2;
    }
    throw new Error(`dual route threw ${err.code}, the sweep did not`);
  }
  return { dual, sweep: voronoi(input, { clip, method: 'sweep' }) };
}

const generators: NamedGenerator[] = allGenerators(150);

describe.each(generators.map((g) => [g.name, g] as const))('sweep equals the dual route on %s input', (_name, g) => {
  it('same neighbouring cells, vertices within 1e-9 of the region size, areas to 1e-9, valid meshes', () => {
    fc.assert(
      fc.property(g.arb, clipArb, (input, f) => {
        const r = both(input, clipFor(input, f));
        if (typeof r === 'string') return;
        const problems: string[] = [];
        const tri = checkMesh(r.sweep.triangulation.toMesh(), { delaunay: 'local' });
        problems.push(...tri.problems.map((p) => `sweep triangulation: ${p}`));
        problems.push(...checkMesh(r.sweep.mesh).problems.map((p) => `sweep diagram: ${p}`));
        if (r.sweep.triangulation.triangleCount !== r.dual.triangulation.triangleCount) {
          problems.push(`${r.sweep.triangulation.triangleCount} triangles, the dual route has ${r.dual.triangulation.triangleCount}`);
        }
        problems.push(...diagramDifferences(r.sweep, r.dual));
        expect(problems.slice(0, 20)).toEqual([]);
      }),
      { numRuns: NUM_RUNS },
    );
  });
});
