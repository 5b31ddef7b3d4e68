import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { voronoi } from '../../src/index.js';
import type { ClippedCells } from '../../src/diagram/cells.js';
import { CELL_PALETTE, svgFrame, toSVG } from '../../src/io/svg.js';
import { cellAdjacency, greedyColoring } from '../../src/io/coloring.js';
import { findAll, parseXml } from '../support/xml-check.js';
import { uniform } from '../support/generators.js';

const runs = process.env.CI === 'true' ? 1000 : 50;

/** Checks the drawing against the diagram: valid XML, one path per cell matching cellPolygon, neighbours in different colours. */
function expectDrawing(d: ClippedCells, decimals = 2): void {
  const svg = toSVG(d, { decimals, triangulation: true, title: 'a <b> & "c"' });
  const root = parseXml(svg);
  expect(root.name).toBe('svg');
  expect(findAll(root, 'title')[0].text).toBe('a <b> & "c"');
  const fr = svgFrame(d.region);
  expect(root.attributes.get('viewBox')).toBe(`0 0 ${root.attributes.get('width')} ${root.attributes.get('height')}`);
  // Written picture coordinates are rounded to `decimals` places: half a unit in the last place, mapped back through
  // the scale, plus a relative 1e-9 for the double arithmetic of the mapping and its inverse.
  const tol = 0.5 * 10 ** -decimals / fr.scale * (1 + 1e-9) + 1e-9 * (Math.abs(fr.minX) + Math.abs(fr.maxY) + 1);
  const fill = new Map<number, string>();
  const cells = findAll(root, 'path').filter((p) => p.attributes.has('data-site'));
  expect(cells.map((p) => Number(p.attributes.get('data-site')))).toEqual(Array.from(d.faceOfSite.keys()).filter((s) => d.faceOfSite[s] >= 0));
  for (const p of cells) {
    const s = Number(p.attributes.get('data-site'));
    fill.set(s, p.attributes.get('fill')!);
    const dAttr = p.attributes.get('d')!;
    expect(dAttr).toMatch(/^M[-\d. ]+(L[-\d. ]+)*Z$/);
    const nums = dAttr.slice(1, -1).split(/[ML ]/).map(Number);
    const drawn = Array.from({ length: nums.length / 2 }, (_, i) => [
      fr.minX + (nums[2 * i] - fr.margin) / fr.scale, fr.maxY - (nums[2 * i + 1] - fr.margin) / fr.scale]);
    const poly = d.cellPolygon(s), m = poly.length / 2;
    expect(drawn.length).toBe(m);
    // The path starts where the mesh face does; cellPolygon starts at its smallest corner: align them by the
    // rotation with the least worst error (corners closer than a picture unit round to the same point).
    let k = 0, best = Infinity;
    for (let r = 0; r < m; r++) {
      let worst = 0;
      for (let i = 0; i < m; i++) {
        const [x, y] = drawn[(r + i) % m];
        worst = Math.max(worst, Math.abs(x - poly[2 * i]), Math.abs(y - poly[2 * i + 1]));
      }
      if (worst < best) { best = worst; k = r; }
    }
    for (let i = 0; i < m; i++) {
      const [x, y] = drawn[(k + i) % m];
      expect(Math.abs(x - poly[2 * i])).toBeLessThanOrEqual(tol);
      expect(Math.abs(y - poly[2 * i + 1])).toBeLessThanOrEqual(tol);
    }
  }
  for (const [s, c] of fill) {
    expect(CELL_PALETTE).toContain(c);
    for (const t of d.cellNeighbors(s).sites) expect(fill.get(t)).not.toBe(c);
  }
}

describe('toSVG', () => {
  for (const metric of ['L2', 'L1'] as const) {
    it(`${metric}: well-formed, each cell drawn where the mesh has it, neighbours in different colours`, () => {
      fc.assert(fc.property(uniform(12, 2), fc.integer({ min: 0, max: 6 }), (pts, decimals) => {
        const s = Math.max(...pts.map(Math.abs)) || 1;
        expectDrawing(voronoi(pts.map((v) => v / s), { metric, clip: { minX: -1, minY: -1, maxX: 1, maxY: 1 } }), decimals);
      }), { numRuns: runs });
    });
  }

  it('fits a tall region and a region far from the origin, north up', () => {
    const d = voronoi([[500010, 6000010], [500030, 6000080]], { clip: { minX: 500000, minY: 6000000, maxX: 500040, maxY: 6000100 } });
    expectDrawing(d);
    const root = parseXml(toSVG(d, { size: 500, margin: 10 }));
    expect(Number(root.attributes.get('height'))).toBe(500);
    expect(Number(root.attributes.get('width'))).toBe(40 * 4.8 + 20);
    const [c0, c1] = findAll(root, 'circle');
    expect(Number(c0.attributes.get('cy'))).toBeGreaterThan(Number(c1.attributes.get('cy'))); // the southern site is drawn lower
  });

  it('greedy colouring in smallest-last order uses at most 6 colours on planar adjacency (5-degenerate graphs)', () => {
    const pts = Array.from({ length: 3000 }, (_, i): [number, number] => [Math.sin(i * 12.9898) * 0.999, Math.cos(i * 78.233) * 0.999]);
    const d = voronoi(pts, { clip: { minX: -1, minY: -1, maxX: 1, maxY: 1 } });
    const { start, list } = cellAdjacency(d);
    const color = greedyColoring(start, list);
    expect(Math.max(...color)).toBeLessThan(6);
    for (let s = 0; s < d.triangulation.siteCount; s++) {
      for (let i = start[s]; i < start[s + 1]; i++) expect(color[list[i]]).not.toBe(color[s]);
    }
  });

  it('refuses a size smaller than its margins', () => {
    const d = voronoi([[0, 0], [1, 1]]);
    expect(() => toSVG(d, { size: 10, margin: 5 })).toThrow(/margin/);
  });
});

describe('the XML checker', () => {
  it('accepts well-formed text and rejects the usual faults', () => {
    expect(parseXml('<?xml version="1.0"?>\n<a x="1"><b/><c y=\'&amp;\'>t&lt;</c></a>\n').children).toHaveLength(2);
    for (const bad of ['<a><b></a></b>', '<a x="1" x="2"/>', '<a x="<"/>', '<a>&nope;</a>', '<a/><b/>', '<a>', 'text<a/>', '<a x=1/>']) {
      expect(() => parseXml(bad), bad).toThrow();
    }
  });
});
