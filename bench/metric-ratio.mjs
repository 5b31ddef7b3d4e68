// One-off measurement (not a test): the cost of a metric diagram over the Euclidean one on the same sites, with
// the two builds interleaved (Euclidean, metric, metric, Euclidean, ...), so that both see
// the machine in the same state; the harness (run.mjs) times one case after the other, and on a shared machine
// the Euclidean rows alone moved by a factor of two between runs. With `gc` last, a full GC precedes every build
// (each then starts from a shrunk heap and pays for fresh memory, as a one-off build in a new process does);
// without it the heap stays warm (as in the harness without --gc-each), which favours the build that allocates
// less: the metric diagram writes about twice the Euclidean one's memory (three times the vertices). Reports, per metric and n, the median of the
// per-round ratios, their range, and the ratio of the minima (CPU time too: user + system of this process).
// Usage: npm run build && node --expose-gc bench/metric-ratio.mjs [n=1e5] [metrics=L1,Linf,3] [rounds=7] [gc]
import { uniform } from './distributions.mjs';
import { voronoi } from '../dist/index.js';

const sizes = (process.argv[2] ?? '1e5').split(',').map(Number);
const metrics = (process.argv[3] ?? 'L1,Linf,3').split(',').map((m) => (Number.isNaN(Number(m)) ? m : Number(m)));
const rounds = Number(process.argv[4] ?? 7);
const forceGc = process.argv[5] === 'gc';
if (forceGc && typeof global.gc !== 'function') { console.error('`gc` needs node --expose-gc'); process.exit(2); }

const median = (xs) => { const s = [...xs].sort((a, b) => a - b), h = s.length >> 1; return s.length % 2 ? s[h] : (s[h - 1] + s[h]) / 2; };
const measure = (f) => {
  if (forceGc) global.gc();
  const c0 = process.cpuUsage(), t0 = performance.now();
  f();
  const c = process.cpuUsage(c0);
  return { wall: performance.now() - t0, cpu: (c.user + c.system) / 1000 };
};

for (const n of sizes) {
  const points = uniform(n, 1);
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < points.length; i += 2) {
    minX = Math.min(minX, points[i]); maxX = Math.max(maxX, points[i]);
    minY = Math.min(minY, points[i + 1]); maxY = Math.max(maxY, points[i + 1]);
  }
  // The bounding box of the sites, as the harness's voronoi and metric cases clip.
  const clip = { minX, minY, maxX, maxY };
  for (const metric of metrics) {
    const opts = { clip, metric };
    voronoi(points, { clip }); voronoi(points, opts); // warm-up
    const ratios = [], cpuRatios = [];
    let eMin = Infinity, mMin = Infinity;
    for (let r = 0; r < rounds; r++) {
      // The order alternates between rounds: in same-process A/B runs the first build of a pair measured slower.
      let e, m;
      if (r % 2 === 0) { e = measure(() => voronoi(points, { clip })); m = measure(() => voronoi(points, opts)); }
      else { m = measure(() => voronoi(points, opts)); e = measure(() => voronoi(points, { clip })); }
      ratios.push(m.wall / e.wall); cpuRatios.push(m.cpu / e.cpu);
      eMin = Math.min(eMin, e.wall); mMin = Math.min(mMin, m.wall);
    }
    const lo = Math.min(...ratios), hi = Math.max(...ratios);
    console.log(`n=${n} metric=${metric}: median ratio ${median(ratios).toFixed(2)} (range ${lo.toFixed(2)}-${hi.toFixed(2)}, ` +
      `CPU ${median(cpuRatios).toFixed(2)}), minima ${mMin.toFixed(0)} / ${eMin.toFixed(0)} ms = ${(mMin / eMin).toFixed(2)}, ${rounds} rounds` +
      (forceGc ? ', GC before each build' : ', warm heap'));
  }
}
