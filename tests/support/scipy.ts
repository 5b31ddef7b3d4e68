import { spawnSync } from 'node:child_process';

/**
 * Runs small Python programs against scipy.spatial from Debian's
 * python3-scipy (the outside reference of the reference tests). Debian's
 * interpreter is used, not whatever `python3` is first on PATH, because that
 * is where the distribution's scipy is installed. AMBIT_PYTHON overrides it.
 *
 * Every op reads one JSON document on stdin and writes one on stdout; JSON
 * numbers round-trip doubles exactly in both languages (shortest repr).
 */
export const PYTHON = process.env.AMBIT_PYTHON ?? '/usr/bin/python3';

const PRELUDE = `
import json, sys
import numpy as np
import scipy
import scipy.spatial
req = json.load(sys.stdin)
def reply(obj):
    obj['scipy'] = scipy.__version__
    obj['numpy'] = np.__version__
    json.dump(obj, sys.stdout)
`;

/** Named Python snippets; later reference tests add their own ops here. */
export const PYTHON_OPS: Record<string, string> = {
  probe: `reply({})`,
  // scipy.spatial.Delaunay with its default Qhull options. simplices index
  // the input rows; 'coplanar' lists input points Qhull left out (duplicates).
  delaunay: `
pts = np.array(req['points'], dtype=np.float64).reshape(-1, 2)
d = scipy.spatial.Delaunay(pts)
reply({'simplices': d.simplices.tolist(), 'coplanar': d.coplanar[:, 0].tolist()})
`,
  // scipy.spatial.Voronoi with its default Qhull options: vertices, and per
  // ridge the two input points it separates and its two vertex indices (-1 =
  // the ridge runs to infinity).
  voronoi: `
pts = np.array(req['points'], dtype=np.float64).reshape(-1, 2)
v = scipy.spatial.Voronoi(pts)
reply({'vertices': v.vertices.tolist(), 'ridgePoints': v.ridge_points.tolist(),
       'ridgeVertices': [list(map(int, r)) for r in v.ridge_vertices]})
`,
  // The regular (weighted Delaunay) triangulation by the lifting map (Aurenhammer 1987): the LOWER faces
  // (outward normal with negative z) of scipy.spatial.ConvexHull of (x, y, x^2 + y^2 - w), default Qhull options.
  regular: `
pts = np.array(req['points'], dtype=np.float64).reshape(-1, 2)
w = np.array(req['weights'], dtype=np.float64)
h = scipy.spatial.ConvexHull(np.column_stack([pts, (pts ** 2).sum(axis=1) - w]))
reply({'triangles': h.simplices[h.equations[:, 2] < 0].tolist()})
`,
  // scipy.spatial.cKDTree nearest neighbour (k=1, p=2) of each query: input point indices.
  kdtreeNearest: `
pts = np.array(req['points'], dtype=np.float64).reshape(-1, 2)
q = np.array(req['queries'], dtype=np.float64).reshape(-1, 2)
_, idx = scipy.spatial.cKDTree(pts).query(q, k=1, p=2)
reply({'nearest': idx.tolist()})
`,
  // cKDTree nearest neighbour under the Minkowski p-norm of each query, for every p in req['ps']
  // (a number, or 'inf'): input point indices per p.
  metricNearest: `
pts = np.array(req['points'], dtype=np.float64).reshape(-1, 2)
q = np.array(req['queries'], dtype=np.float64).reshape(-1, 2)
tree = scipy.spatial.cKDTree(pts)
out = {}
for p in req['ps']:
    _, idx = tree.query(q, k=1, p=(np.inf if p == 'inf' else float(p)))
    out[str(p)] = idx.tolist()
reply({'nearest': out})
`,
};

export interface PythonResult<T> {
  ok: boolean;
  value?: T;
  error?: string;
}

/** Runs op (a key of PYTHON_OPS, or raw code using `req` and `reply`) with `input` as JSON. */
export function runPython<T>(op: string, input: unknown, timeoutMs = 60_000): PythonResult<T> {
  const body = PYTHON_OPS[op] ?? op;
  const r = spawnSync(PYTHON, ['-c', PRELUDE + body], {
    input: JSON.stringify(input),
    encoding: 'utf8',
    timeout: timeoutMs,
    maxBuffer: 256 * 1024 * 1024,
  });
  if (r.error) return { ok: false, error: `${PYTHON}: ${r.error.message}` };
  if (r.status !== 0) return { ok: false, error: `${PYTHON} exited ${r.status}: ${r.stderr.trim().split('\n').slice(-3).join(' | ')}` };
  try {
    return { ok: true, value: JSON.parse(r.stdout) as T };
  } catch (e) {
    return { ok: false, error: `unreadable output from ${PYTHON}: ${(e as Error).message}` };
  }
}

let probed: PythonResult<{ scipy: string; numpy: string }> | undefined;

/** Whether Debian's python3 with scipy and numpy can be run here (cached). */
export function scipyAvailability(): { ok: boolean; reason: string; version?: string } {
  probed ??= runPython<{ scipy: string; numpy: string }>('probe', {}, 30_000);
  if (probed.ok && probed.value) return { ok: true, reason: '', version: probed.value.scipy };
  return { ok: false, reason: `scipy not usable via ${PYTHON} (${probed.error}); install python3-scipy` };
}
