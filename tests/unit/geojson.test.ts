import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { clipToStudyArea, studyAreaBounds, voronoi } from '../../src/index.js';
import type { ClippedCells } from '../../src/diagram/cells.js';
import { toGeoJSON, writeGeoJSON } from '../../src/io/geojson.js';
import type { CellPieceList } from '../../src/io/cells-source.js';
import { readGeoJSONPolygons, readGeoJSONSites } from '../../src/io/geojson-read.js';
import { geoJSONProblems, signedArea2 } from '../support/geojson-check.js';
import { uniform } from '../support/generators.js';

const runs = process.env.CI === 'true' ? 1000 : 60;
const box = { minX: -1, minY: -1, maxX: 1, maxY: 1 };

/** A ring as [x, y] pairs, opened (closing position dropped), starting at its smallest position by (x, then y). */
function canonical(ring: number[][]): number[][] {
  const open = ring.slice(0, -1);
  let k = 0;
  open.forEach((p, i) => { if (p[0] < open[k][0] || (p[0] === open[k][0] && p[1] < open[k][1])) k = i; });
  return open.slice(k).concat(open.slice(0, k));
}

const pairs = (flat: ArrayLike<number>): number[][] => Array.from({ length: flat.length / 2 }, (_, i) => [flat[2 * i], flat[2 * i + 1]]);

/** The written features match the diagram: same cells, exact corners, exact measures. */
function expectMatches(d: ClippedCells): void {
  const fcol = JSON.parse(toGeoJSON(d)) as { features: { geometry: { type: string; coordinates: number[][][] }; properties: Record<string, unknown> }[] };
  expect(geoJSONProblems(fcol)).toEqual([]);
  const withCell = Array.from(d.faceOfSite.keys()).filter((s) => d.faceOfSite[s] >= 0);
  expect(fcol.features.map((f) => f.properties.site)).toEqual(withCell);
  const areas = d.cellAreas(), per = d.cellPerimeters(), cen = d.cellCentroids(), nb = d.neighborCounts();
  for (const f of fcol.features) {
    const s = f.properties.site as number;
    expect(f.geometry.type).toBe('Polygon');
    // Shortest round-trip number text: the corners and measures read back as the same doubles.
    expect(canonical(f.geometry.coordinates[0])).toEqual(pairs(d.cellPolygon(s)));
    expect(f.properties.area).toBe(areas[s]);
    expect(f.properties.perimeter).toBe(per[s]);
    expect(f.properties.centroid).toEqual([cen[2 * s], cen[2 * s + 1]]);
    expect(f.properties.neighbors).toBe(nb[s]);
  }
}

describe('toGeoJSON on diagrams: RFC 7946 valid and equal to the mesh', () => {
  for (const metric of ['L2', 'L1', 'Linf'] as const) {
    it(`${metric} diagrams of random sites`, () => {
      fc.assert(fc.property(uniform(12, 2), (pts) => {
        const s = Math.max(...pts.map(Math.abs)) || 1;
        expectMatches(voronoi(pts.map((v) => v / s), { metric, clip: box }));
      }), { numRuns: runs });
    });
  }

  it('power diagrams (with hidden sites, which get no feature) and a weight property', () => {
    fc.assert(fc.property(uniform(20, 2), fc.array(fc.integer({ min: 0, max: 512 }).map((k) => k / 1024), { minLength: 20, maxLength: 20 }), (pts, w) => {
      const s = Math.max(...pts.map(Math.abs)) || 1;
      const n = pts.length / 2;
      let d: ClippedCells;
      try {
        d = voronoi(pts.map((v) => v / s), { clip: box, weights: w.slice(0, n) });
      } catch (err) {
        // A power cell thinner than doubles can draw is refused by the library (README: too-thin); not our concern here.
        if ((err as { code?: string }).code === 'too-thin') return;
        throw err;
      }
      expectMatches(d);
      const fcol = JSON.parse(toGeoJSON(d)) as { features: { properties: { site: number; weight: number } }[] };
      for (const f of fcol.features) expect(f.properties.weight).toBe(d.triangulation.weights![f.properties.site]);
    }), { numRuns: runs });
  });

  it('ids and rounding', () => {
    const d = voronoi([[0.1, 0.2], [0.7, 0.6]], { clip: { minX: 0, minY: 0, maxX: 1, maxY: 1 } });
    const f = JSON.parse(toGeoJSON(d, { ids: ['a"b', 7], decimals: 3 })).features;
    expect(f[0].properties.id).toBe('a"b');
    expect(f[1].properties.id).toBe(7);
    for (const feat of f) for (const p of feat.geometry.coordinates[0]) for (const v of p) expect(Math.round(v * 1000) / 1000).toBe(v);
    expect(() => toGeoJSON(d, { decimals: -1 })).toThrow(/decimals/);
  });

  it('writes in chunks that join to the same text', () => {
    const pts = Array.from({ length: 4000 }, (_, i): [number, number] => [Math.sin(i * 12.9898) * 0.999, Math.cos(i * 78.233) * 0.999]);
    const d = voronoi(pts, { clip: box });
    const chunks: string[] = [];
    writeGeoJSON(d, (c) => chunks.push(c));
    expect(chunks.length).toBeGreaterThan(1);
    expect(chunks.join('')).toBe(toGeoJSON(d));
  });
});

describe('toGeoJSON on piece lists (cells with holes and several pieces)', () => {
  // Site 0: a 4 x 4 square with a 2 x 2 hole, given clockwise outside and counter-clockwise inside (the wrong way
  // round, to be fixed), plus a second piece, a unit square. Site 1: no cell. Site 2: the hole's square.
  const list: CellPieceList = [
    [
      { outer: [0, 0, 0, 4, 4, 4, 4, 0], holes: [[1, 1, 3, 1, 3, 3, 1, 3]] },
      { outer: [10, 0, 11, 0, 11, 1, 10, 1] },
    ],
    [],
    [{ outer: [1, 1, 3, 1, 3, 3, 1, 3] }],
  ];

  it('writes a valid MultiPolygon with oriented rings and measures of the whole cell', () => {
    const fcol = JSON.parse(toGeoJSON(list, { ids: ['outer', 'none', 'inner'] }));
    expect(geoJSONProblems(fcol)).toEqual([]);
    expect(fcol.features).toHaveLength(2);
    const [a, b] = fcol.features;
    expect(a.geometry.type).toBe('MultiPolygon');
    expect(a.geometry.coordinates).toHaveLength(2);
    expect(a.geometry.coordinates[0]).toHaveLength(2);
    expect(signedArea2(a.geometry.coordinates[0][0])).toBe(32);
    expect(signedArea2(a.geometry.coordinates[0][1])).toBe(-8);
    // Area by hand: 16 - 4 + 1. Perimeter: 16 + 8 + 4. Centroid: moments (16 * (2,2) - 4 * (2,2) + 1 * (10.5,0.5)) / 13.
    expect(a.properties).toMatchObject({ site: 0, id: 'outer', area: 13, perimeter: 28 });
    expect(a.properties.centroid[0]).toBeCloseTo((24 + 10.5) / 13, 12);
    expect(a.properties.centroid[1]).toBeCloseTo((24 + 0.5) / 13, 12);
    expect(a.properties.neighbors).toBeUndefined();
    expect(b.geometry.type).toBe('Polygon');
    expect(b.properties).toMatchObject({ site: 2, id: 'inner', area: 4 });
  });

  it('refuses malformed pieces', () => {
    expect(() => toGeoJSON([[{ outer: [0, 0, 1, 0] }]])).toThrow(/at least 3 vertices/);
    expect(() => toGeoJSON([[{ outer: [0, 0, 1, 0, NaN, 1] }]])).toThrow(/NaN/);
  });
});

describe('toGeoJSON on study-area pieces', () => {
  it('a U-shaped study area with a hole: the site in the gap gets a MultiPolygon, areas add up', () => {
    // The U: a 10 x 10 square minus the gap [3, 7] x [3, 10]; a 1 x 1 hole in its base. Area 100 - 28 - 1 = 71.
    const area = [[[0, 0], [10, 0], [10, 10], [7, 10], [7, 3], [3, 3], [3, 10], [0, 10]], [[4.5, 1], [4.5, 2], [5.5, 2], [5.5, 1]]];
    const sites = [[5, 8], [1, 1], [9, 1], [5, 1.5], [1, 9], [9, 9]] as [number, number][];
    const d = voronoi(sites, { clip: studyAreaBounds(area) });
    const cut = clipToStudyArea(d, area);
    const list = Array.from({ length: cut.siteCount }, (_, s) => cut.pieces(s));
    const fcol = JSON.parse(toGeoJSON(list));
    expect(geoJSONProblems(fcol)).toEqual([]);
    const bySite = new Map(fcol.features.map((f: { properties: { site: number } }) => [f.properties.site, f]));
    expect((bySite.get(0) as { geometry: { type: string } }).geometry.type).toBe('MultiPolygon');
    // The site at (5, 1.5) lies in the hole: its piece wraps around it.
    expect((bySite.get(3) as { geometry: { coordinates: unknown[] } }).geometry.coordinates.length).toBe(2);
    const total = fcol.features.reduce((a: number, f: { properties: { area: number } }) => a + f.properties.area, 0);
    expect(total).toBeCloseTo(71, 10); // exact up to rounding of a few dozen products of numbers below 10
    const clipped = cut.clippedAreas();
    for (const f of fcol.features) expect(f.properties.area).toBeCloseTo(clipped[f.properties.site], 12);
  });
});

describe('the checker itself catches what it is meant to', () => {
  const poly = (ring: number[][]) => ({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: null, geometry: { type: 'Polygon', coordinates: [ring] } }] });
  it('flags open, clockwise, short and non-finite rings', () => {
    expect(geoJSONProblems(poly([[0, 0], [1, 0], [0, 1], [0, 0]]))).toEqual([]);
    expect(geoJSONProblems(poly([[0, 0], [1, 0], [0, 1], [0, 0.5]])).join()).toMatch(/not closed/);
    expect(geoJSONProblems(poly([[0, 0], [0, 1], [1, 0], [0, 0]])).join()).toMatch(/counter-clockwise/);
    expect(geoJSONProblems(poly([[0, 0], [1, 0], [0, 0]])).join()).toMatch(/at least 4/);
    expect(geoJSONProblems(poly([[0, 0], [1, NaN], [0, 1], [0, 0]])).join()).toMatch(/finite/);
    expect(geoJSONProblems({ type: 'FeatureCollection', features: [{ type: 'Feature', geometry: { type: 'Polygon', coordinates: [[[0, 0], [1, 0], [0, 1], [0, 0]], [[0, 0], [0.1, 0], [0, 0.1], [0, 0]]] } }] }).join())
      .toMatch(/properties|hole is not clockwise/);
  });
});

describe('GeoJSON reading', () => {
  it('reads Point and MultiPoint features with weight and id properties', () => {
    const t = readGeoJSONSites({ type: 'FeatureCollection', features: [
      { type: 'Feature', geometry: { type: 'Point', coordinates: [1, 2] }, properties: { w: 3, name: 'a' } },
      { type: 'Feature', geometry: { type: 'MultiPoint', coordinates: [[4, 5, 99], [6, 7]] }, properties: { w: 1, name: 2 } },
    ] }, { weight: 'w', id: 'name' });
    expect(Array.from(t.xy)).toEqual([1, 2, 4, 5, 6, 7]);
    expect(Array.from(t.weights!)).toEqual([3, 1, 1]);
    expect(t.ids).toEqual(['a', '2', '2']);
    expect(t.where(2)).toBe('features[1]');
  });

  it('names the feature and field of bad input', () => {
    const fcOf = (...features: unknown[]) => JSON.stringify({ type: 'FeatureCollection', features });
    const pt = (c: unknown) => ({ type: 'Feature', properties: {}, geometry: { type: 'Point', coordinates: c } });
    expect(() => readGeoJSONSites(fcOf(pt([0, 0]), { type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: [[0, 0], [1, 1]] } })))
      .toThrow(/^features\[1\]\.geometry\.type: .*Point/);
    expect(() => readGeoJSONSites(fcOf(pt([0, 0]), pt([1, 'a'])))).toThrow(/^features\[1\]\.geometry\.coordinates\[1\]: expected a number/);
    expect(() => readGeoJSONSites(fcOf(pt([0, 0])), { weight: 'w' })).toThrow(/^features\[0\]\.properties\.w: missing/);
    expect(() => readGeoJSONSites('{"type":')).toThrow(/not valid JSON/);
    expect(() => readGeoJSONSites(fcOf())).toThrow(/no points/);
  });

  it('reads polygons and refuses open or short rings', () => {
    const p = (coords: unknown) => ({ type: 'Feature', properties: null, geometry: { type: 'Polygon', coordinates: coords } });
    const [piece] = readGeoJSONPolygons({ type: 'FeatureCollection', features: [p([[[0, 0], [2, 0], [2, 2], [0, 0]], [[0.5, 0.2], [1.5, 0.2], [1.5, 1], [0.5, 0.2]]])] });
    expect(Array.from(piece.outer)).toEqual([0, 0, 2, 0, 2, 2]);
    expect(piece.holes).toHaveLength(1);
    expect(() => readGeoJSONPolygons(p([[[0, 0], [2, 0], [2, 2], [0, 1]]]))).toThrow(/^geometry\.coordinates\[0\]: .*closed/);
    expect(() => readGeoJSONPolygons(p([[[0, 0], [2, 0], [0, 0]]]))).toThrow(/at least 4 positions/);
    expect(() => readGeoJSONPolygons({ type: 'Point', coordinates: [0, 0] })).toThrow(/geometry type "Point"/);
  });
});
