// One-off measurement (not a test): the command line on a CSV of n uniform sites, end to end (node start, reading,
// parsing, the diagram, measures, writing), against the library call voronoi() on the same sites in this process.
// Usage: npm run build && node bench/cli-vs-library.mjs [n=1000000] [format=geojson|csv|svg|json]
import { spawnSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { voronoi, writeCellTable, writeGeoJSON, writeSVG } from '../dist/index.js';

const n = Number(process.argv[2] ?? 1e6), format = process.argv[3] ?? 'geojson';
const cli = fileURLToPath(new URL('../dist/cli.js', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'ambit-bench-'));
try {
  // A fixed linear congruential generator: the same sites every run.
  let state = 12345;
  const rand = () => ((state = (Math.imul(state, 1103515245) + 12345) >>> 0) / 2 ** 32);
  const xy = new Float64Array(2 * n), lines = ['x,y'];
  for (let i = 0; i < n; i++) { xy[2 * i] = rand(); xy[2 * i + 1] = rand(); lines.push(`${xy[2 * i]},${xy[2 * i + 1]}`); }
  const csv = join(dir, 'sites.csv');
  writeFileSync(csv, lines.join('\n') + '\n');

  const clip = { minX: 0, minY: 0, maxX: 1, maxY: 1 };
  voronoi(xy.subarray(0, 2e4), { clip }); // warm-up
  // The machine is shared: report process CPU time (user + system, all threads) beside wall time; read the ratios.
  const measure = (f) => {
    const c0 = process.cpuUsage(), t0 = performance.now();
    f();
    const c = process.cpuUsage(c0);
    return { wall: performance.now() - t0, cpu: (c.user + c.system) / 1000 };
  };
  const median = (runs, key) => runs.map((r) => r[key]).sort((a, b) => a - b)[runs.length >> 1];
  const lib = [0, 1, 2].map(() => measure(() => voronoi(xy, { clip })));
  const libOut = join(dir, `lib.${format}`);
  const write = { geojson: writeGeoJSON, csv: writeCellTable, svg: writeSVG }[format];
  const libWrite = measure(() => {
    const d = voronoi(xy, { clip });
    const fd = openSync(libOut, 'w');
    write(d, (chunk) => writeSync(fd, chunk));
    closeSync(fd);
  });

  const out = join(dir, `cells.${format}`);
  const r = spawnSync('bash', ['-c', 'TIMEFORMAT="%U %S %R"; time "$@"', 'bash', process.execPath, cli, 'cells', csv, '--clip', '0,0,1,1', '--out', out], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`cli failed (${r.status}): ${r.stderr}`);
  const [u, sys, real] = r.stderr.trim().split('\n').pop().split(' ').map(Number);
  const cliRun = { wall: real * 1000, cpu: (u + sys) * 1000 };
  const row = (name, m, base) => `  ${name.padEnd(34)} wall ${m.wall.toFixed(0).padStart(6)} ms  cpu ${m.cpu.toFixed(0).padStart(6)} ms` +
    (base ? `   x${(m.wall / base.wall).toFixed(2)} wall, x${(m.cpu / base.cpu).toFixed(2)} cpu` : '');
  const base = { wall: median(lib, 'wall'), cpu: median(lib, 'cpu') };
  console.log(`n=${n}, output ${format}; csv ${(statSync(csv).size / 1e6).toFixed(1)} MB, output ${(statSync(out).size / 1e6).toFixed(1)} MB`);
  console.log(row('library voronoi() (median of 3)', base));
  console.log(row('library voronoi() + writer + file', libWrite, base));
  console.log(row('ambit cells (new process, end to end)', cliRun, base));
} finally {
  rmSync(dir, { recursive: true, force: true });
}
