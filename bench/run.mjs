// Benchmark runner: `npm run bench -- [--case NAME]... [--dist NAME]... [--n N]... [--json]`
// (also --quick, --no-ref, --seed S, --help). See bench/README.md for the fields.
// Needs `node --expose-gc` (npm run bench passes it) and a built dist/.
import { spawnSync } from 'node:child_process';
import { unlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { performance } from 'node:perf_hooks';
import { distributions, makeRng } from './distributions.mjs';

const USAGE = `usage: npm run bench -- [--case NAME]... [--dist NAME]... [--n N]... [--json]
                             [--quick] [--no-ref] [--ref-timeout S] [--seed S] [--gc-each]
  --case NAME   benchmark case (repeatable; default: triangulate)
  --dist NAME   point distribution (repeatable; default: all)
  --n N         point count, e.g. 10000 or 1e5 (repeatable; default: 1e4 1e5 1e6)
  --json        one JSON object per (case, dist, n) on stdout instead of a table
  --quick       smoke run: default n 1e4 only, 3 timed runs
  --no-ref      skip the scipy reference (refMs/ratioToRef null)
  --ref-timeout S  seconds one scipy row may take before it is abandoned (default 120);
                the same case and dist is then not tried at larger n
  --seed S      seed for the random distributions and sort keys (default 1)
  --gc-each     force a full GC before every timed run (see bench/README.md)`;

// The Debian interpreter is the one that carries scipy 1.10 on the project machines;
// AMBIT_BENCH_PYTHON overrides it for other setups.
const PYTHON = process.env.AMBIT_BENCH_PYTHON || '/usr/bin/python3';
const SCIPY_SCRIPT = fileURLToPath(new URL('./scipy_ref.py', import.meta.url));

const log = (msg) => process.stderr.write(`${msg}\n`);

function fail(msg) {
  log(`bench: ${msg}`);
  log(USAGE);
  process.exit(2);
}

function parseArgs(argv) {
  const opts = { cases: [], dists: [], ns: [], json: false, quick: false, ref: true, refTimeout: 120, seed: 1, gcEach: false };
  for (let i = 0; i < argv.length; i++) {
    let arg = argv[i];
    let value;
    const eq = arg.indexOf('=');
    if (arg.startsWith('--') && eq > 0) {
      value = arg.slice(eq + 1);
      arg = arg.slice(0, eq);
    }
    const take = () => {
      if (value !== undefined) return value;
      if (i + 1 >= argv.length) fail(`${arg} needs a value`);
      return argv[++i];
    };
    switch (arg) {
      case '--case': opts.cases.push(...take().split(',')); break;
      case '--dist': opts.dists.push(...take().split(',')); break;
      case '--n':
        for (const s of take().split(',')) {
          const n = Number(s.replace(/_/g, ''));
          if (!Number.isInteger(n) || n < 3) fail(`--n wants an integer >= 3, got ${s}`);
          opts.ns.push(n);
        }
        break;
      case '--seed': {
        const s = Number(take());
        if (!Number.isInteger(s)) fail('--seed wants an integer');
        opts.seed = s;
        break;
      }
      case '--ref-timeout': {
        const s = Number(take());
        if (!(s > 0)) fail('--ref-timeout wants a positive number of seconds');
        opts.refTimeout = s;
        break;
      }
      case '--json': opts.json = true; break;
      case '--quick': opts.quick = true; break;
      case '--gc-each': opts.gcEach = true; break;
      case '--no-ref': opts.ref = false; break;
      case '--help': case '-h': process.stdout.write(`${USAGE}\n`); process.exit(0); break;
      default: fail(`unknown argument ${argv[i]}`);
    }
  }
  return opts;
}

// Timed runs by size: enough repeats for a stable median at small n without making
// the 1e6 rows take minutes (common practice, no source).
function repeatsFor(n, quick) {
  const r = n <= 30000 ? 7 : n <= 300000 ? 5 : 3;
  return quick ? Math.min(r, 3) : r;
}

function median(xs) {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

// Results are parked here so that neither the optimiser nor the collector can drop
// them before we are done looking (timing) or measuring (memory).
const holder = { value: null };

/**
 * One warm-up, then `reps` timed runs of fn(). No forced collection between runs by
 * default: a full gc() also throws away optimised code that embeds objects which died,
 * so forcing one before every run measures re-optimisation, not steady state. With
 * gcEach (--gc-each) it is forced anyway, to show what a major GC between calls costs.
 */
function timeRuns(fn, reps, before, gcEach, onWarmup) {
  const times = [];
  for (let r = -1; r < reps; r++) {
    const arg = before ? before() : undefined;
    holder.value = null;
    if (gcEach) globalThis.gc();
    const t0 = performance.now();
    holder.value = fn(arg);
    const t1 = performance.now();
    if (r >= 0) times.push(t1 - t0);
    else if (onWarmup) onWarmup(holder.value);
  }
  holder.value = null;
  return times;
}

// Node's `external` already includes `arrayBuffers` (Node docs for process.memoryUsage(),
// from memory; checked on Node 20 here: a 8 MB Float64Array moves both by 8 MB), so
// adding arrayBuffers again would count every typed array twice. heapUsed + external is
// the total of JS heap, typed arrays and other native memory held by JS objects.
function retainedBytes() {
  const m = process.memoryUsage();
  return m.heapUsed + m.external;
}

// Node lowers `external` for collected ArrayBuffers only once the event loop turns
// (checked on Node 20 here: right after gc() the 16 MB of temporaries of a 1e6-query
// nearestMany still counted, about 420 B per site at 1e4 sites; after one setImmediate
// they did not), so each reading waits for one turn first.
const turn = () => new Promise((resolve) => setImmediate(resolve));

// retain(result) picks the part of the result whose memory is counted (the rest dies
// before the second reading); facts are taken from what is retained.
async function bytesRetained(fn, points, inspect, retain) {
  holder.value = null;
  globalThis.gc();
  await turn();
  globalThis.gc();
  globalThis.gc();
  const before = retainedBytes();
  holder.value = retain ? retain(fn(points)) : fn(points);
  globalThis.gc();
  await turn();
  globalThis.gc();
  globalThis.gc();
  const after = retainedBytes();
  const facts = inspect ? inspect(holder.value) : null;
  holder.value = null;
  return { bytes: after - before, facts };
}

function probeScipy() {
  const res = spawnSync(PYTHON, [SCIPY_SCRIPT, '--probe'], { encoding: 'utf8' });
  if (res.error && res.error.code === 'ENOENT') {
    log(`bench: ${PYTHON} not found; refMs and ratioToRef will be null`);
    return null;
  }
  if (res.status !== 0) {
    log(`bench: scipy not usable under ${PYTHON} (${(res.stderr || res.error || '').toString().trim()}); refMs null`);
    return null;
  }
  return JSON.parse(res.stdout.trim().split('\n').pop());
}

function runScipy(op, points, reps, timeoutS, queries) {
  const file = path.join(os.tmpdir(), `ambit-bench-${process.pid}-${Date.now()}.f64`);
  const qfile = queries ? `${file.slice(0, -4)}-queries.f64` : null;
  // Native byte order on both sides: same machine, python reads it as numpy float64.
  writeFileSync(file, new Uint8Array(points.buffer, points.byteOffset, points.byteLength));
  if (qfile) writeFileSync(qfile, new Uint8Array(queries.buffer, queries.byteOffset, queries.byteLength));
  try {
    // The script plans its runs to end by 80% of the limit, leaving a margin for noise.
    const args = [SCIPY_SCRIPT, '--op', op, '--file', file, '--repeats', String(reps), '--budget', String(0.8 * timeoutS)];
    if (qfile) args.push('--queries', qfile);
    const res = spawnSync(PYTHON, args, {
      encoding: 'utf8',
      stdio: ['ignore', 'pipe', 'inherit'],
      maxBuffer: 1 << 24,
      timeout: timeoutS * 1000,
    });
    if (res.error && res.error.code === 'ETIMEDOUT') return { timedOut: true };
    if (res.status !== 0) {
      log(`bench: scipy ${op} failed (exit ${res.status}${res.error ? `, ${res.error.message}` : ''}); refMs null`);
      return null;
    }
    return JSON.parse(res.stdout.trim().split('\n').pop());
  } finally {
    unlinkSync(file);
    if (qfile) unlinkSync(qfile);
  }
}

const round = (x, digits) => (x === null ? null : Number(x.toFixed(digits)));
const sig = (x) => (x === null ? null : Number(x.toPrecision(4)));

const COLUMNS = [
  ['case', 12, (r) => r.case],
  ['dist', 8, (r) => r.dist],
  ['n', 9, (r) => String(r.n)],
  ['ms', 10, (r) => fmtMs(r.ms)],
  ['sort ms', 10, (r) => fmtMs(r.sortMs)],
  ['x sort', 8, (r) => r.ratioToSort.toFixed(2)],
  ['scipy ms', 10, (r) => (r.refMs === null ? '-' : fmtMs(r.refMs))],
  ['x scipy', 8, (r) => (r.ratioToRef === null ? '-' : r.ratioToRef.toFixed(3))],
  ['B/point', 8, (r) => r.bytesPerPoint.toFixed(1)],
];

function fmtMs(ms) {
  return ms < 10 ? ms.toFixed(3) : ms < 100 ? ms.toFixed(2) : ms.toFixed(1);
}

function tableLine(cells) {
  return cells.map((c, i) => (i < 2 ? c.padEnd(COLUMNS[i][1]) : c.padStart(COLUMNS[i][1]))).join(' ');
}

async function main() {
  const opts = parseArgs(process.argv.slice(2));
  if (typeof globalThis.gc !== 'function') {
    fail('run with `node --expose-gc bench/run.mjs` (npm run bench does): bytesPerPoint needs gc()');
  }
  let cases;
  try {
    ({ cases } = await import('./cases.mjs'));
  } catch (err) {
    log(`bench: cannot load the cases (is dist/ built? \`npm run bench\` runs tsup first): ${err.message}`);
    process.exit(2);
  }

  const caseNames = opts.cases.length ? opts.cases : ['triangulate'];
  const distNames = opts.dists.length ? opts.dists : Object.keys(distributions);
  const ns = opts.ns.length ? opts.ns : opts.quick ? [1e4] : [1e4, 1e5, 1e6];
  const chosen = caseNames.map((name) => cases.find((c) => c.name === name) ?? fail(
    `unknown case ${name}; known: ${cases.map((c) => c.name).join(', ')}`));
  for (const d of distNames) {
    if (!Object.hasOwn(distributions, d)) fail(`unknown dist ${d}; known: ${Object.keys(distributions).join(', ')}`);
  }

  const needRef = opts.ref && chosen.some((c) => c.scipy);
  const scipy = needRef ? probeScipy() : null;
  log(`bench: node ${process.version}, ${os.cpus().length} cpus, ` +
    (scipy ? `scipy ${scipy.scipy} / numpy ${scipy.numpy} / python ${scipy.python}` : 'no scipy reference') +
    (process.env.OPENBLAS_CORETYPE ? `, OPENBLAS_CORETYPE=${process.env.OPENBLAS_CORETYPE}` : ''));

  if (!opts.json) {
    process.stdout.write(`${tableLine(COLUMNS.map((c) => c[0]))}\n`);
  }

  const total = ns.length * distNames.length * chosen.length;
  let done = 0;
  let failures = 0;
  // "case/dist" -> smallest n at which scipy ran out of time; larger n are not tried.
  const refTimedOut = new Map();
  for (const n of ns) {
    for (const distName of distNames) {
      const points = distributions[distName](n, opts.seed);
      const actualN = points.length / 2;
      if (actualN !== n) {
        log(`bench: ${distName} cannot make ${n} points; it made ${actualN} and the row reports that n`);
      }
      const reps = repeatsFor(actualN, opts.quick);
      for (const c of chosen) {
        done++;
        const label = `[${done}/${total}] ${c.name} ${distName} n=${actualN}`;
        log(`${label}: ${reps} runs after a warm-up...`);
        let row;
        try {
          // Per-case input made outside the timed region (query points, the clip box...).
          const input = c.setup ? c.setup(points, opts.seed) : undefined;
          const run = (pts) => c.run(pts, input);
          // Facts the case compares with scipy's answer later, taken from the warm-up result.
          let kept = null;
          const times = timeRuns(() => run(points), reps, null, opts.gcEach,
            c.keep ? (result) => { kept = c.keep(result, input); } : undefined);
          const ms = median(times);

          // Sort baseline on fresh random keys, copied outside the timed region.
          const keys = new Float64Array(actualN);
          const rng = makeRng(opts.seed + 7919);
          for (let i = 0; i < actualN; i++) keys[i] = rng.next();
          const sortTimes = timeRuns((copy) => copy.sort(), reps, () => keys.slice(), opts.gcEach);
          const sortMs = median(sortTimes);

          // Median over as many builds as timed runs: the heap readings jitter by a few
          // hundred kB (GC bookkeeping, compiled code), which matters below ~1e4 points.
          const retained = [];
          let size = null;
          for (let r = 0; r < reps; r++) {
            const m = await bytesRetained(run, points, r === 0 ? c.size : null, c.retain);
            if (r === 0 && c.size) size = m.facts;
            retained.push(m.bytes);
          }
          const bytesPerPoint = median(retained) / actualN;

          let refMs = null;
          if (scipy && c.scipy) {
            if (!scipy.ops.includes(c.scipy)) {
              log(`bench: scipy_ref.py has no op ${c.scipy}; refMs null`);
            } else {
              const key = `${c.name}/${distName}`;
              const skip = refTimedOut.get(key) <= actualN;
              const ref = skip ? null : runScipy(c.scipy, points, reps, opts.refTimeout,
                c.refInput ? c.refInput(input) : null);
              if (skip) {
                log(`${label}: scipy skipped: it ran out of time at n=${refTimedOut.get(key)}; refMs null`);
              } else if (ref && ref.timedOut) {
                refTimedOut.set(key, actualN);
                log(`${label}: scipy did not finish within ${opts.refTimeout} s; refMs null`);
              } else if (ref) {
                if (ref.reduced) {
                  log(`${label}: scipy is slow here: ` + (ref.warmupOnly
                    ? `its warm-up run is the only sample (instead of ${reps} runs)`
                    : `median of ${ref.runs.length} run(s) instead of ${reps}`));
                }
                refMs = ref.ms;
                if (size !== null && (ref.size !== size || ref.skipped)) {
                  log(`${label}: note: scipy ${c.scipy} size ${ref.size}` +
                    (ref.skipped ? ` with ${ref.skipped} input points left out as coplanar` : '') +
                    `, ours ${size}`);
                }
                if (c.compare) {
                  const note = c.compare(kept, ref, points, input);
                  if (note) log(`${label}: ${note}`);
                }
              }
            }
          }

          row = {
            case: c.name,
            dist: distName,
            n: actualN,
            ms: round(ms, 3),
            sortMs: round(sortMs, 3),
            ratioToSort: sig(ms / sortMs),
            refMs: round(refMs, 3),
            ratioToRef: refMs === null ? null : sig(ms / refMs),
            bytesPerPoint: round(bytesPerPoint, 1),
          };
          log(`${label}: ${fmtMs(ms)} ms [${times.map(fmtMs).join(' ')}], sort ${fmtMs(sortMs)} ms, ` +
            `${row.bytesPerPoint} B/point, scipy ${refMs === null ? '-' : `${fmtMs(refMs)} ms`}`);
        } catch (err) {
          failures++;
          log(`${label}: FAILED: ${err && err.stack ? err.stack : err}`);
          continue;
        }
        process.stdout.write(opts.json ? `${JSON.stringify(row)}\n` : `${tableLine(COLUMNS.map((col) => col[2](row)))}\n`);
      }
    }
  }
  if (failures) {
    log(`bench: ${failures} of ${total} rows failed`);
    process.exit(1);
  }
}

await main();
