// Benchmark cases. Each entry:
//   name   - the --case name
//   run    - (points: Float64Array, interleaved x,y) => result; this is what gets timed,
//            and the result is what bytesPerPoint measures while it is still referenced
//   scipy  - name of the matching operation in bench/scipy_ref.py (its OPS table), or
//            null when scipy does not do the same work
//   size   - optional (result) => number comparable to the "size" scipy_ref.py reports
//            (e.g. the triangle count); a mismatch is noted on stderr, never fatal
// Adding a case is one more object here (plus an OPS entry in scipy_ref.py if scipy can
// do the same work).
import { triangulate } from '../dist/index.js';

export const cases = [
  {
    name: 'triangulate',
    run: (points) => triangulate(points),
    scipy: 'delaunay',
    size: (t) => t.triangleCount,
  },
  {
    // The same build in BRIO order, to keep the choice of default insertion order measured.
    name: 'triangulate-brio',
    run: (points) => triangulate(points, { order: 'brio' }),
    scipy: null,
    size: (t) => t.triangleCount,
  },
];
