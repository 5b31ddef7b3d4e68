// Benchmark cases. Each entry:
//   name   - the --case name
//   run    - (points: Float64Array, interleaved x,y; input) => result; this is what gets
//            timed, and the result is what bytesPerPoint measures while it is still referenced
//   scipy  - name of the matching operation in bench/scipy_ref.py (its OPS table), or
//            null when scipy does not do the same work
//   size   - optional (result) => number comparable to the "size" scipy_ref.py reports
//            (e.g. the triangle count); a mismatch is noted on stderr, never fatal
// Optional hooks, for cases that need more than the points:
//   setup(points, seed) => input     made once per row outside the timed region, passed to run
//   refInput(input) => Float64Array  query points handed to scipy in a second file
//   retain(result) => part           the part of the result bytesPerPoint counts (default: all)
//   keep(result, input) => facts     taken from the untimed warm-up result, for compare
//   compare(facts, ref, points, input) => string | null   a note on stderr after scipy ran
// Adding a case is one more object here (plus an OPS entry in scipy_ref.py if scipy can
// do the same work).
import {
  SiteLocator, balanceTerritories, clipToStudyArea, compareDistance, naturalNeighbor, relax, triangulate, voronoi,
} from '../dist/index.js';
import { makeRng } from './distributions.mjs';

/** Number of query points of the `nearest` case, whatever the number of sites. */
export const NEAREST_QUERIES = 1e6;

/** Steps of the `lloyd` case. */
export const LLOYD_STEPS = 50;

/** Columns (and rows) of the `interpolate` case's grid. */
export const INTERPOLATION_GRID = 1000;

/** The exact bounding box of interleaved points. */
function boundingBox(points) {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < points.length; i += 2) {
    const x = points[i], y = points[i + 1];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}

/**
 * Random weights for the `regular` case: uniform in [0, area / n] of the points' bounding box, the
 * squared mean spacing, so that a weight can outweigh a neighbour's distance and some sites hide.
 */
function weightsSetup(points, seed) {
  const { minX, minY, maxX, maxY } = boundingBox(points);
  const n = points.length / 2, scale = ((maxX - minX) * (maxY - minY)) / n;
  const rng = makeRng(seed + 15485863);
  return { weights: Float64Array.from({ length: n }, () => scale * rng.next()) };
}

/** Random target shares in [0.5, 1.5) for the `balance` case, and the points' bounding box as the region. */
function balanceSetup(points, seed) {
  const rng = makeRng(seed + 32452843);
  return { clip: boundingBox(points), shares: Float64Array.from({ length: points.length / 2 }, () => 0.5 + rng.next()) };
}

/** Query points uniform over the sites' bounding box, seeded apart from the sites themselves. */
function nearestSetup(points, seed) {
  const { minX, minY, maxX, maxY } = boundingBox(points);
  const rng = makeRng(seed + 104729);
  const queries = new Float64Array(2 * NEAREST_QUERIES);
  for (let i = 0; i < queries.length; i += 2) {
    queries[i] = minX + (maxX - minX) * rng.next();
    queries[i + 1] = minY + (maxY - minY) * rng.next();
  }
  return { queries };
}

/**
 * Checks the sampled cKDTree answers against ours. scipy answers with input indices,
 * we with site numbers (duplicates merged), so its answer goes through siteOfInput.
 * Where the two differ, the exact distance comparison says whether it is a tie
 * (both right) or which side picked a farther site.
 */
function compareNearest(facts, ref, points, input) {
  if (!facts || !ref || !Array.isArray(ref.sample)) return 'nearest: no answers to compare';
  const { answers, siteOfInput, siteXY } = facts;
  const q = input.queries, stride = ref.sampleStride;
  let same = 0, ties = 0, oursFarther = 0, theirsFarther = 0;
  for (let k = 0; k < ref.sample.length; k++) {
    const i = k * stride;
    const ours = answers[i], theirs = siteOfInput[ref.sample[k]];
    if (ours === theirs) { same++; continue; }
    const c = compareDistance(q[2 * i], q[2 * i + 1], siteXY[2 * ours], siteXY[2 * ours + 1],
      siteXY[2 * theirs], siteXY[2 * theirs + 1]);
    if (c === 0) ties++;
    else if (c > 0) oursFarther++;
    else theirsFarther++;
  }
  const bad = oursFarther + theirsFarther;
  return `${bad ? 'WARNING: ' : ''}nearest vs cKDTree on ${ref.sample.length} sampled queries (every ${stride}th): ` +
    `${same} same site, ${ties} exact ties, ${oursFarther} where ours is farther, ` +
    `${theirsFarther} where cKDTree's is farther (exact distances)`;
}

/** A ring of `m` vertices about (cx, cy), radius r times a deterministic wobble (star-shaped, so simple). */
function wobblyRing(cx, cy, r, m, phase, rng) {
  const ring = [];
  for (let i = 0; i < m; i++) {
    const a = (2 * Math.PI * i) / m;
    const f = 1 + 0.08 * Math.sin(5 * a + phase) + 0.04 * Math.sin(13 * a + 2 * phase) + 0.02 * (rng.next() - 0.5);
    ring.push([cx + r * f * Math.cos(a), cy + r * f * Math.sin(a)]);
  }
  return ring;
}

/**
 * The `clip-holes` study area: a shell of 800 vertices over the points' bounding box and 8 holes
 * of 25 vertices (1000 in all). The diagram (clipped to the box) is built here, untimed; so that
 * the row can be read as a ratio, the build and the clip are also timed here (median of 5) and
 * their ratio logged. The timed run is the clip alone.
 */
function clipHolesSetup(points, seed) {
  const box = boundingBox(points), rng = makeRng(seed + 49979687);
  const w = Math.min(box.maxX - box.minX, box.maxY - box.minY);
  const cx = (box.minX + box.maxX) / 2, cy = (box.minY + box.maxY) / 2;
  // Shell radius in 0.42 w (1 ± 0.13): inside the box, and beyond the holes (0.25 w + 0.06 w from the centre).
  const area = [wobblyRing(cx, cy, 0.42 * w, 800, 0, rng)];
  for (let k = 0; k < 8; k++) {
    const a = (2 * Math.PI * k) / 8;
    area.push(wobblyRing(cx + 0.25 * w * Math.cos(a), cy + 0.25 * w * Math.sin(a), 0.05 * w, 25, k, rng));
  }
  // One untimed warm-up each, then 5 runs each, interleaved so that both see the same machine load.
  let diagram = voronoi(points, { clip: box });
  clipToStudyArea(diagram, area);
  const build = [], clip = [];
  for (let i = 0; i < 5; i++) {
    let t0 = performance.now();
    diagram = voronoi(points, { clip: box });
    build.push(performance.now() - t0);
    t0 = performance.now();
    clipToStudyArea(diagram, area);
    clip.push(performance.now() - t0);
  }
  const med = (xs) => xs.sort((a, b) => a - b)[2];
  const buildMs = med(build), clipMs = med(clip);
  process.stderr.write(`clip-holes: n ${points.length / 2}, voronoi build ${buildMs.toFixed(1)} ms, clip ${clipMs.toFixed(1)} ms, ` +
    `ratio clip/build ${(clipMs / buildMs).toFixed(2)} (medians of 5, this run)\n`);
  return { diagram, area };
}

export const cases = [
  {
    name: 'triangulate',
    run: (points) => triangulate(points),
    scipy: 'delaunay',
    size: (t) => t.triangleCount,
  },
  {
    // The same build in plain Hilbert-curve order (the default is BRIO), to keep that choice measured.
    name: 'triangulate-hilbert',
    run: (points) => triangulate(points, { order: 'hilbert' }),
    scipy: null,
    size: (t) => t.triangleCount,
  },
  {
    // Voronoi diagram clipped to the exact bounding box of the points (so that the box is
    // known in advance; the default would pad it by 10%). Includes the triangulation it
    // is the dual of. scipy's Voronoi is unclipped: it does slightly less work.
    name: 'voronoi',
    setup: (points) => ({ clip: boundingBox(points) }),
    run: (points, input) => voronoi(points, input),
    scipy: 'voronoi',
    // Faces with a site are the cells; the one face without is the outer face.
    size: (d) => d.mesh.faceCount - 1,
  },
  {
    // The same diagram with the topology from Fortune's sweep line instead of the incremental
    // triangulation (voronoi's method option); clipping and measures are the shared code.
    name: 'sweep',
    setup: (points) => ({ clip: boundingBox(points), method: 'sweep' }),
    run: (points, input) => voronoi(points, input),
    scipy: 'voronoi',
    size: (d) => d.mesh.faceCount - 1,
  },
  {
    // The city-block (L1) diagram, built and clipped to the bounding box as the `voronoi`
    // case is, so that the ratio between the two rows of one run is the metric's cost.
    // scipy has no L1 Voronoi diagram to compare with.
    name: 'metric-l1',
    setup: (points) => ({ clip: boundingBox(points), metric: 'L1' }),
    run: (points, input) => voronoi(points, input),
    scipy: null,
    size: (d) => d.mesh.faceCount - 1,
  },
  {
    // The Minkowski p = 3 diagram (curved edges as polylines, default tolerance), built and
    // clipped to the bounding box as the `voronoi` case is: run both in one run for the ratio.
    // scipy has no Lp Voronoi diagram to compare with.
    name: 'metric-p3',
    setup: (points) => ({ clip: boundingBox(points), metric: 3 }),
    run: (points, input) => voronoi(points, input),
    scipy: null,
    size: (d) => d.mesh.faceCount - 1,
  },
  {
    // The chessboard (L-infinity) diagram, likewise.
    name: 'metric-linf',
    setup: (points) => ({ clip: boundingBox(points), metric: 'Linf' }),
    run: (points, input) => voronoi(points, input),
    scipy: null,
    size: (d) => d.mesh.faceCount - 1,
  },
  {
    // NEAREST_QUERIES query points on n sites: triangulation + locator + batch query.
    // bytesPerPoint counts the locator alone (per site), not the triangulation it was
    // built from nor the answer array (4 bytes per query).
    name: 'nearest',
    setup: nearestSetup,
    run: (points, input) => {
      const tri = triangulate(points);
      const locator = new SiteLocator(tri);
      const answers = locator.nearestMany(input.queries);
      return { locator, answers, siteOfInput: tri.siteOfInput, siteXY: tri.siteXY };
    },
    scipy: 'kdtree-nearest',
    refInput: (input) => input.queries,
    retain: (r) => r.locator,
    keep: (r) => ({ answers: r.answers, siteOfInput: r.siteOfInput, siteXY: r.siteXY }),
    compare: compareNearest,
  },
  {
    // The regular (weighted Delaunay) triangulation with random weights (weightsSetup): compare
    // with the `triangulate` row of the same run. scipy has no weighted Delaunay (the lifted
    // convex hull is the reference in tests/reference, not a like-for-like timing).
    name: 'regular',
    setup: weightsSetup,
    run: (points, input) => triangulate(points, input),
    scipy: null,
    size: (t) => t.triangleCount,
  },
  {
    // Study-area clipping: every cell of a Voronoi diagram cut to a polygon of 1000 vertices with
    // 8 holes (clipHolesSetup, which also logs the clip's time as a ratio to the diagram's build).
    // Meant for --dist uniform. scipy has no polygon clipping of Voronoi cells to compare with.
    name: 'clip-holes',
    setup: clipHolesSetup,
    run: (points, input) => clipToStudyArea(input.diagram, input.area),
    scipy: null,
    size: (c) => c.pieceCount,
  },
  {
    // Balanced territories: weights giving every power cell, clipped to the bounding box, a random
    // target share (balanceSetup) to the default tolerance 1e-6. Meant for n = 1e3 and 1e4
    // (each iteration builds one or more power diagrams). The iteration count and the error
    // reached are logged from the untimed warm-up run.
    name: 'balance',
    setup: balanceSetup,
    run: (points, input) => balanceTerritories(points, input),
    scipy: null,
    retain: (r) => r.weights,
    keep: (r) => {
      process.stderr.write(`balance: ${r.iterations} iterations, max relative error ${r.maxRelativeError.toExponential(2)}, ` +
        `converged ${r.converged}\n`);
      return null;
    },
  },
  {
    // Lloyd relaxation: LLOYD_STEPS steps (tolerance 0, so every step runs) in the points' bounding
    // box; each step builds one clipped diagram, so compare with the `voronoi` row of the same run
    // (one build at the same n). Meant for n = 1e4. The energy drop is logged from the warm-up run.
    name: 'lloyd',
    setup: (points) => ({ clip: boundingBox(points), steps: LLOYD_STEPS, tolerance: 0 }),
    run: (points, input) => relax(points, input),
    scipy: null,
    retain: (r) => r.sites,
    keep: (r) => {
      process.stderr.write(`lloyd: ${r.steps} steps, energy ${r.energy[0].toExponential(4)} -> ` +
        `${r.energy[r.steps].toExponential(4)}, G ${r.normalizedMoment.toFixed(6)}\n`);
      return null;
    },
  },
  {
    // Natural-neighbour interpolation of smooth values at the n sites onto an INTERPOLATION_GRID
    // square grid over their bounding box, triangulation included: compare with the `voronoi` row
    // of the same run. Meant for n = 1e4.
    name: 'interpolate',
    setup: (points) => {
      const values = new Float64Array(points.length / 2);
      for (let i = 0; i < values.length; i++) values[i] = Math.sin(3 * points[2 * i]) + Math.cos(2 * points[2 * i + 1]);
      return { values, grid: { ...boundingBox(points), columns: INTERPOLATION_GRID, rows: INTERPOLATION_GRID } };
    },
    run: (points, input) => naturalNeighbor(points, input.values).grid(input.grid),
    scipy: null,
  },
];
