import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readMeshJSON } from '../../src/index.js';
import { geoJSONProblems } from '../support/geojson-check.js';
import { parseXml } from '../support/xml-check.js';

// The built command (npm test runs tsup before vitest). Spawned as a user would run it.
const CLI = fileURLToPath(new URL('../../dist/cli.js', import.meta.url));
let dir = '';

function ambit(...args: string[]): { code: number | null; out: string; err: string } {
  // A time limit turns a hung child into a failed test instead of a stalled run.
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: dir, encoding: 'utf8', env: { ...process.env, CI: '' }, timeout: 120_000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

const write = (name: string, text: string): string => { writeFileSync(join(dir, name), text); return name; };
const fc = (...features: unknown[]): string => JSON.stringify({ type: 'FeatureCollection', features });
const point = (x: unknown, y: unknown, properties: object = {}) => ({ type: 'Feature', properties, geometry: { type: 'Point', coordinates: [x, y] } });
const polygon = (ring: number[][]) => ({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [ring] } });

beforeAll(() => {
  if (!existsSync(CLI)) throw new Error('dist/cli.js is missing: build first (npx tsup; npm test does it)');
  dir = mkdtempSync(join(tmpdir(), 'ambit-cli-'));
  write('sites.csv', 'name,x,y,cap\r\n"Depot, north",1,8,3\r\nMill,2,2,1\r\nQuay,8,3,2\r\nYard,7,8,1\r\nKiln,5,5,2\r\n');
});
afterAll(() => { if (dir !== '') rmSync(dir, { recursive: true, force: true }); });

/** A failed run: its exit code, a message matching `message` on stderr, and no output or temporary file left. */
function expectFailure(r: ReturnType<typeof ambit>, code: number, message: RegExp, out = 'out.geojson'): void {
  expect(r.code, r.err).toBe(code);
  expect(r.err).toMatch(/^ambit: /);
  expect(r.err).toMatch(message);
  expect(existsSync(join(dir, out))).toBe(false);
  expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
}

describe('bad input: clear message, non-zero exit, no output file', () => {
  it('a missing sites file (I/O, exit 3)', () => expectFailure(ambit('cells', 'nope.csv', '--out', 'out.geojson'), 3, /cannot read nope\.csv: no such file/));
  it('an empty file', () => {
    expectFailure(ambit('cells', write('empty.csv', ''), '--out', 'out.geojson'), 1, /empty\.csv: line 1: the file is empty/);
    expectFailure(ambit('cells', write('empty.geojson', ' \n'), '--out', 'out.geojson'), 1, /empty\.geojson: .*empty/);
    expectFailure(ambit('cells', write('header.csv', 'x,y\n'), '--out', 'out.geojson'), 1, /header\.csv: line 2: no rows/);
  });
  it('a CSV without the named column', () => {
    expectFailure(ambit('cells', 'sites.csv', '--weight', 'capacity', '--out', 'out.geojson'), 1, /sites\.csv: line 1: no column "capacity".*"cap"/);
    expectFailure(ambit('cells', write('xz.csv', 'x,z\n1,2\n'), '--out', 'out.geojson'), 1, /xz\.csv: line 1: no column "y"/);
  });
  it('a CSV with a non-numeric or empty value, or a short row', () => {
    expectFailure(ambit('cells', write('word.csv', 'x,y\n1,2\n3,north\n'), '--out', 'out.geojson'), 1, /word\.csv: line 3, column "y": "north" is not a number/);
    expectFailure(ambit('cells', write('blank.csv', 'x,y\n1,2\n,4\n'), '--out', 'out.geojson'), 1, /blank\.csv: line 3, column "x": the field is empty/);
    expectFailure(ambit('cells', write('short.csv', 'x,y\n1,2\n3\n'), '--out', 'out.geojson'), 1, /short\.csv: line 3: 1 fields, but the header has 2/);
    expectFailure(ambit('cells', write('huge.csv', 'x,y\n1,2\n3,1e300\n'), '--out', 'out.geojson'), 1, /huge\.csv, line 3: point 1: y = 1e\+300 is outside the exact range/);
  });
  it('GeoJSON that is not points, or not GeoJSON', () => {
    const line = { type: 'Feature', properties: {}, geometry: { type: 'LineString', coordinates: [[0, 0], [1, 1]] } };
    expectFailure(ambit('cells', write('line.geojson', fc(point(0, 0), line)), '--out', 'out.geojson'), 1, /line\.geojson: features\[1\]\.geometry\.type: geometry type "LineString"; sites must be Point/);
    expectFailure(ambit('cells', write('str.geojson', fc(point(0, 0), point(1, '2'))), '--out', 'out.geojson'), 1, /features\[1\]\.geometry\.coordinates\[1\]: expected a number, got string/);
    expectFailure(ambit('cells', write('broken.json', '{"type": "Feature'), '--out', 'out.geojson'), 1, /broken\.json: JSON: not valid JSON/);
  });
  it('a clip file with an invalid polygon', () => {
    const open = write('open.geojson', fc(polygon([[0, 0], [10, 0], [10, 10], [0, 10]])));
    expectFailure(ambit('cells', 'sites.csv', '--clip-file', open, '--out', 'out.geojson'), 1, /open\.geojson: features\[0\]\.geometry\.coordinates\[0\]: .*rings must be closed/);
    const bowtie = write('bowtie.geojson', fc(polygon([[0, 0], [10, 10], [10, 0], [0, 10], [0, 0]])));
    expectFailure(ambit('cells', 'sites.csv', '--clip-file', bowtie, '--out', 'out.geojson'), 1, /bowtie\.geojson: clip region: .*cross/);
    const hole = { type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [[[0, 0], [10, 0], [10, 10], [0, 10], [0, 0]], [[20, 20], [21, 20], [21, 21], [20, 20]]] } };
    expectFailure(ambit('cells', 'sites.csv', '--clip-file', write('stray.geojson', fc(hole)), '--out', 'out.geojson'), 1, /stray\.geojson: study area: polygon 0, ring 1 \(hole 1\)/);
    const pts = write('pts.geojson', fc(point(0, 0)));
    expectFailure(ambit('cells', 'sites.csv', '--clip-file', pts, '--out', 'out.geojson'), 1, /pts\.geojson: features\[0\]\.geometry\.type: .*expected Polygon/);
  });
  it('unknown options and commands (usage, exit 2)', () => {
    expectFailure(ambit('cells', 'sites.csv', '--colour', 'red', '--out', 'out.geojson'), 2, /unknown option --colour; see 'ambit cells --help'/);
    expectFailure(ambit('cells', 'sites.csv', '--metric', 'L7', '--out', 'out.geojson'), 2, /--metric takes L2, L1, Linf or a number p >= 1/);
    expectFailure(ambit('cells', 'sites.csv', '--out', 'out.txt'), 2, /cannot tell the output format/, 'out.txt');
    expectFailure(ambit('cells', 'sites.csv'), 2, /needs --out/);
    expectFailure(ambit('cells', 'sites.csv', '--out'), 2, /--out needs a value/);
    expectFailure(ambit('draw', 'sites.csv'), 2, /unknown command 'draw'/);
  });
  it('conflicting options (usage, exit 2)', () => {
    write('box.geojson', fc(polygon([[0, 0], [10, 0], [10, 10], [0, 10], [0, 0]])));
    expectFailure(ambit('cells', 'sites.csv', '--clip', '0,0,10,10', '--clip-file', 'box.geojson', '--out', 'out.geojson'), 2, /--clip and --clip-file cannot be used together/);
    expectFailure(ambit('cells', 'sites.csv', '--weight', 'cap', '--metric', 'L1', '--out', 'out.geojson'), 2, /--weight and --metric cannot be used together/);
    expectFailure(ambit('cells', 'sites.csv', '--triangulation', '--out', 'out.geojson'), 2, /SVG output only/);
    expectFailure(ambit('cells', 'sites.csv', '--out', 'out.geojson', '--out', 'b.geojson'), 2, /--out is given twice/);
  });
  it('an output folder that does not exist (I/O, exit 3)', () => {
    expectFailure(ambit('cells', 'sites.csv', '--out', join('no-such-folder', 'out.geojson')), 3, /cannot write no-such-folder.*no such file or folder/);
  });
});

describe('happy paths', () => {
  it('the README\'s command on the example town runs as written (output sent to a temporary folder)', () => {
    const readme = readFileSync(new URL('../../README.md', import.meta.url), 'utf8');
    const block = readme.split('## From a fresh clone')[1].split('```sh')[1].split('```')[0];
    const line = block.replace(/\\\n\s*/g, ' ').split('\n').find((l) => l.startsWith('npx ambit '));
    expect(line, 'the README shows an npx ambit command').toBeDefined();
    const words = line!.replace(/#.*$/, '').trim().split(/\s+/).slice(2);
    const outAt = words.indexOf('--out');
    const out = join(dir, 'readme-' + words[outAt + 1].split('/').pop());
    words[outAt + 1] = out;
    const root = fileURLToPath(new URL('../..', import.meta.url));
    const r = spawnSync(process.execPath, [CLI, ...words], { cwd: root, encoding: 'utf8', env: { ...process.env, CI: '' } });
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/13 cells from 14 points \(1 repeated points merged\)/);
    expect(parseXml(readFileSync(out, 'utf8')).name).toBe('svg');
  });
  it('GeoJSON with ids, a clip rectangle and weights (power cells)', () => {
    const r = ambit('cells', 'sites.csv', '--id', 'name', '--weight', 'cap', '--clip', '0,0,10,10', '--out', 'power.geojson');
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/wrote power\.geojson: \d cells from 5 points/);
    const g = JSON.parse(readFileSync(join(dir, 'power.geojson'), 'utf8'));
    expect(geoJSONProblems(g)).toEqual([]);
    expect(g.features[0].properties).toMatchObject({ site: 0, id: 'Depot, north', weight: 3 });
    const total = g.features.reduce((a: number, f: { properties: { area: number } }) => a + f.properties.area, 0);
    expect(total).toBeCloseTo(100, 9); // the clip rectangle's area, up to rounding of the cell sums
  });
  it('a Minkowski exponent as the metric (p = 3), written as GeoJSON', () => {
    const r = ambit('cells', 'sites.csv', '--metric', '3', '--clip', '0,0,10,10', '--out', 'p3.geojson');
    expect(r.code, r.err).toBe(0);
    const g = JSON.parse(readFileSync(join(dir, 'p3.geojson'), 'utf8'));
    expect(geoJSONProblems(g)).toEqual([]);
    const total = g.features.reduce((a: number, f: { properties: { area: number } }) => a + f.properties.area, 0);
    expect(total).toBeCloseTo(100, 9);
  });
  it('SVG with the triangulation, L1 metric, clip polygon from a file', () => {
    write('hex.geojson', fc(polygon([[0, 0], [10, 0], [12, 5], [10, 10], [0, 10], [-2, 5], [0, 0]])));
    const r = ambit('cells', 'sites.csv', '--metric', 'L1', '--clip-file', 'hex.geojson', '--triangulation', '--out', 'cells.svg');
    expect(r.code, r.err).toBe(0);
    const svg = parseXml(readFileSync(join(dir, 'cells.svg'), 'utf8'));
    expect(svg.name).toBe('svg');
  });
  it('the ambit mesh JSON and the CSV table, from GeoJSON points', () => {
    write('pts.geojson', fc(point(0, 0, { n: 'a' }), point(4, 0, { n: 'b' }), point(0, 3, { n: 'c' }), point(4, 3, { n: 'd' })));
    let r = ambit('cells', 'pts.geojson', '--out', 'cells.json');
    expect(r.code, r.err).toBe(0);
    expect(readMeshJSON(readFileSync(join(dir, 'cells.json'), 'utf8')).kind).toBe('voronoi');
    r = ambit('cells', 'pts.geojson', '--id', 'n', '--clip', '0,0,4,3', '--out', 'table.csv');
    expect(r.code, r.err).toBe(0);
    const rows = readFileSync(join(dir, 'table.csv'), 'utf8').trim().split('\n');
    expect(rows[0]).toBe('site,id,x,y,area,perimeter,centroid_x,centroid_y,neighbors');
    expect(rows[1]).toBe('0,a,0,0,3,7,1,0.75,2');
  });
  it('balanced territories from a weight column', () => {
    const r = ambit('cells', 'sites.csv', '--balance', '--weight', 'cap', '--clip', '0,0,10,10', '--out', 'balanced.csv');
    expect(r.code, r.err).toBe(0);
    const [head, ...rows] = readFileSync(join(dir, 'balanced.csv'), 'utf8').trim().split('\n').map((l) => l.split(','));
    // Shares 3:1:2:1:2 of the 10 x 10 box, to the library's default tolerance 1e-6 relative.
    const areaCol = head.indexOf('area');
    expect(head).toContain('weight');
    [3, 1, 2, 1, 2].forEach((share, i) => expect(Math.abs(Number(rows[i][areaCol]) / (100 * share / 9) - 1)).toBeLessThan(1e-6));
  });
  it('balanced territories merge records at one place and add their weights', () => {
    // The Depot row repeated with weight 2 more: one site of weight 5 against 1, 2, 1, 2 (shares 5:1:2:1:2 of 11).
    write('twice.csv', 'name,x,y,cap\nDepot,1,8,3\nMill,2,2,1\nQuay,8,3,2\nYard,7,8,1\nKiln,5,5,2\nDepot annex,1,8,2\n');
    const r = ambit('cells', 'twice.csv', '--id', 'name', '--balance', '--weight', 'cap', '--clip', '0,0,10,10', '--out', 'twice.csv.out.csv');
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/5 cells from 6 points \(1 repeated points merged\)/);
    const [head, ...rows] = readFileSync(join(dir, 'twice.csv.out.csv'), 'utf8').trim().split('\n').map((l) => l.split(','));
    const areaCol = head.indexOf('area');
    expect(rows.map((row) => row[head.indexOf('id')])).toEqual(['Depot', 'Mill', 'Quay', 'Yard', 'Kiln']);
    [5, 1, 2, 1, 2].forEach((share, i) => expect(Math.abs(Number(rows[i][areaCol]) / (100 * share / 11) - 1)).toBeLessThan(1e-6));
  });
  it('a study area with a hole and a dent: cells in pieces, GeoJSON only', () => {
    // A 10 x 10 square with a triangular notch cut from its east side (base 2, depth 3) and a 2 x 2 hole: area 100 - 3 - 4 = 93.
    const area = { type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [
      [[0, 0], [10, 0], [10, 4], [7, 5], [10, 6], [10, 10], [0, 10], [0, 0]], [[4, 4], [4, 6], [6, 6], [6, 4], [4, 4]]] } };
    write('notched.geojson', fc(area));
    const r = ambit('cells', 'sites.csv', '--id', 'name', '--clip-file', 'notched.geojson', '--out', 'pieces.geojson');
    expect(r.code, r.err).toBe(0);
    const g = JSON.parse(readFileSync(join(dir, 'pieces.geojson'), 'utf8'));
    expect(geoJSONProblems(g)).toEqual([]);
    const total = g.features.reduce((a: number, f: { properties: { area: number } }) => a + f.properties.area, 0);
    expect(total).toBeCloseTo(93, 9); // the study area's size, up to rounding of the piece sums
    expect(g.features.some((f: { geometry: { coordinates: unknown[][] } }) => f.geometry.coordinates.length > 1 || f.geometry.coordinates[0].length > 1)).toBe(true);
    expectFailure(ambit('cells', 'sites.csv', '--clip-file', 'notched.geojson', '--out', 'out.svg'), 2, /GeoJSON only/, 'out.svg');
  });
  it('mesh: the triangulation as an ambit mesh and as GeoJSON', () => {
    let r = ambit('mesh', 'sites.csv', '--out', 'tri.json');
    expect(r.code, r.err).toBe(0);
    expect(readMeshJSON(readFileSync(join(dir, 'tri.json'), 'utf8')).kind).toBe('delaunay');
    r = ambit('mesh', 'sites.csv', '--out', 'tri.geojson');
    expect(r.code, r.err).toBe(0);
    expect(geoJSONProblems(JSON.parse(readFileSync(join(dir, 'tri.geojson'), 'utf8')))).toEqual([]);
  });
  it('demo writes its nine files and the caution', () => {
    const r = ambit('demo', '--out', 'demo');
    expect(r.code, r.err).toBe(0);
    expect(readdirSync(join(dir, 'demo')).sort()).toEqual(
      ['balanced', 'city-block', 'straight-line'].flatMap((b) => [`${b}.csv`, `${b}.geojson`, `${b}.svg`]).sort());
    for (const b of ['balanced', 'city-block', 'straight-line']) {
      expect(geoJSONProblems(JSON.parse(readFileSync(join(dir, 'demo', `${b}.geojson`), 'utf8')))).toEqual([]);
      parseXml(readFileSync(join(dir, 'demo', `${b}.svg`), 'utf8'));
    }
    expect(r.out).toMatch(/not travel-time service areas/);
    expect(r.out).toMatch(/defer to local codes and licensed practice/);
  });
});

describe('help and version', () => {
  it('top-level help lists the commands and exit codes', () => {
    for (const args of [['--help'], []]) {
      const r = ambit(...args);
      expect(r.code).toBe(0);
      expect(r.out).toMatch(/Commands:[\s\S]*cells[\s\S]*mesh[\s\S]*demo/);
      expect(r.out).toMatch(/Exit codes:[\s\S]*1 {2}bad input[\s\S]*2 {2}bad usage[\s\S]*3 {2}a file/);
    }
    expect(ambit('--version').out.trim()).toBe(JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')).version);
  });
  it('every subcommand has help with an example', () => {
    for (const cmd of ['cells', 'mesh', 'demo']) {
      const r = ambit(cmd, '--help');
      expect(r.code).toBe(0);
      expect(r.out).toMatch(new RegExp(`^ambit ${cmd}: `));
      expect(r.out).toMatch(/Usage: ambit/);
      expect(r.out).toMatch(/Example:\n {2}ambit /);
    }
    expect(ambit('cells', '-h').out).toMatch(/not travel-time service areas/);
  });
});
