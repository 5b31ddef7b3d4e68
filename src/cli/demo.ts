import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { balanceTerritories } from '../analyze/balance.js';
import type { ClippedCells } from '../diagram/cells.js';
import { voronoi } from '../diagram/voronoi.js';
import { triangulate } from '../triangulate/triangulation.js';
import { writeCellTable } from '../io/cell-table.js';
import { writeGeoJSON } from '../io/geojson.js';
import { writeSVG } from '../io/svg.js';
import { optionHelp, parseArgs, stringOption, type OptionSpec } from './args.js';
import { CAUTION } from './cells.js';
import { BOUNDARY, FACILITIES, TOWN_NAME } from './demo-data.js';
import { CliError, EXIT, usageError } from './exit.js';
import { writeAtomically } from './files.js';

const OPTIONS: OptionSpec[] = [
  { name: 'out', value: 'folder', help: 'where to write the files (default out/demo)' },
  { name: 'help', help: 'show this help' },
];

export const DEMO_HELP = `ambit demo: service areas and balanced territories for ${TOWN_NAME}, an invented town

Usage: ambit demo [--out folder]

Builds, for the town's ${FACILITIES.length} facility records (one repeats another's location and is merged):
  straight-line  the Voronoi cells (Euclidean distance) inside the town limit
  city-block     the cells under city-block (L1) distance
  balanced       territories sized by each facility's capacity (a power diagram)
and writes each as .svg, .geojson and .csv (a per-cell table) into the folder, then prints a summary.

Options:
${optionHelp(OPTIONS)}

Example:
  ambit demo --out demo-output

${CAUTION}`;

export function runDemo(argv: readonly string[]): number {
  const args = parseArgs(argv, OPTIONS, 'demo');
  if (args.values.has('help')) { console.log(DEMO_HELP); return 0; }
  if (args.positional.length > 0) throw usageError(`demo takes no arguments, got '${args.positional[0]}'; see 'ambit demo --help'`);
  const folder = stringOption(args, 'out') ?? join('out', 'demo');

  const tri = triangulate(FACILITIES.map((f) => [f.x, f.y] as [number, number]));
  const n = tri.siteCount, name: string[] = [], ids: string[] = [], capacity = new Float64Array(n);
  FACILITIES.forEach((f, i) => {
    const s = tri.siteOfInput[i];
    name[s] ??= f.name;
    ids[s] ??= f.id;
    capacity[s] += f.capacity;
  });
  const straight = voronoi(tri, { clip: BOUNDARY });
  const cityBlock = voronoi(tri, { clip: BOUNDARY, metric: 'L1' });
  const plan = balanceTerritories(tri.siteXY, { clip: BOUNDARY, shares: capacity });
  const layers: [string, string, ClippedCells][] = [
    ['straight-line', 'straight-line service areas', straight],
    ['city-block', 'city-block service areas', cityBlock],
    ['balanced', 'territories balanced by capacity', plan.diagram],
  ];

  try {
    mkdirSync(folder, { recursive: true });
  } catch (err) {
    throw new CliError(EXIT.io, `cannot create ${folder}: ${(err as Error).message}`);
  }
  const written: string[] = [];
  for (const [file, title, d] of layers) {
    writeAtomically(join(folder, `${file}.svg`), (sink) => writeSVG(d, sink, { title: `${TOWN_NAME}: ${title}`, triangulation: file === 'straight-line' }));
    writeAtomically(join(folder, `${file}.geojson`), (sink) => writeGeoJSON(d, sink, { ids }));
    writeAtomically(join(folder, `${file}.csv`), (sink) => writeCellTable(d, sink, ids));
    written.push(`${file}.svg`, `${file}.geojson`, `${file}.csv`);
  }

  const km2 = (a: number): string => (a / 1e6).toFixed(2).padStart(7);
  const total = straight.totalArea();
  const areas = layers.map(([, , d]) => d.cellAreas());
  const capTotal = capacity.reduce((a, b) => a + b, 0);
  console.log(`ambit demo: ${TOWN_NAME} (an invented town), ${FACILITIES.length} facility records -> ${n} sites (${tri.mergedCount} repeated location merged)`);
  console.log(`town limit ${km2(total).trim()} km²; areas in km²; the balanced target is the capacity's share of the town`);
  console.log(`  ${'facility'.padEnd(26)} ${'capacity'.padStart(8)} ${'straight'.padStart(8)} ${'city-blk'.padStart(8)} ${'balanced'.padStart(8)} ${'target'.padStart(8)}`);
  for (let s = 0; s < n; s++) {
    console.log(`  ${name[s].padEnd(26)} ${String(capacity[s]).padStart(8)} ${km2(areas[0][s]).padStart(8)} ${km2(areas[1][s]).padStart(8)} ${km2(areas[2][s]).padStart(8)} ${km2(total * capacity[s] / capTotal).padStart(8)}`);
  }
  console.log(`balanced territories: ${plan.converged ? 'converged' : 'did not converge'} in ${plan.iterations} steps, largest relative error ${plan.maxRelativeError.toExponential(1)}`);
  console.log(`wrote ${written.length} files to ${folder}: ${written.join(', ')}`);
  console.log(CAUTION);
  return 0;
}
