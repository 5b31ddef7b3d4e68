"""Reference timings from scipy.spatial for bench/run.mjs.

Usage:
  python3 scipy_ref.py --probe
  python3 scipy_ref.py --op delaunay --file POINTS.f64 --repeats 5 [--budget SECONDS]
  python3 scipy_ref.py --op kdtree-nearest --file POINTS.f64 --queries QUERIES.f64 ...

POINTS.f64 (and QUERIES.f64, for the ops that take query points) hold interleaved x,y as
native-endian float64 (written by the runner on the same machine). Only the operation is
timed; the facts reported about its result are taken from the warm-up run, outside the
timed region. The script times the named operation (one warm-up run, then --repeats
timed runs, median reported) and prints one JSON object on stdout. When the warm-up shows
that the timed runs would not finish within --budget seconds of the script's start, fewer
runs are made (at least one: if even one
more does not fit, the warm-up itself is the sample) and "reduced" is true: Qhull is far
slower than n log n on cocircular input. Exit code 3 means numpy/scipy could not be imported.
"""

import time

_STARTED = time.perf_counter()  # the budget counts from here, imports included

import argparse
import gc
import json
import statistics
import sys


def run_delaunay(spatial, pts, queries):
    return spatial.Delaunay(pts)


def facts_delaunay(tri, pts, queries):
    # Qhull may leave points out as "coplanar" (numerically on a facet); report how
    # many so that the runner can say when scipy did less work than we did.
    return {"size": int(tri.simplices.shape[0]), "skipped": int(tri.coplanar.shape[0])}


def run_voronoi(spatial, pts, queries):
    # scipy.spatial.Voronoi (Qhull, from Debian's scipy 1.10) builds the unclipped
    # diagram: unbounded regions keep a vertex at infinity (-1). It has no clipping.
    return spatial.Voronoi(pts)


def facts_voronoi(vor, pts, queries):
    # Cells: distinct non-empty regions that some input point owns (duplicates share one).
    regions = {int(r) for r in vor.point_region.tolist() if r >= 0 and len(vor.regions[r]) > 0}
    return {"size": len(regions)}


def run_kdtree_nearest(spatial, pts, queries):
    # Defaults of scipy 1.10's cKDTree (leafsize 16, balanced, compact nodes) and of
    # query (workers=1: one thread, like the JS side). k=1, p=2: the Euclidean nearest.
    tree = spatial.cKDTree(pts)
    _, idx = tree.query(queries, k=1, p=2)
    return idx


# At most this many answers go back to the runner for its agreement check.
SAMPLE = 10000


def facts_kdtree_nearest(idx, pts, queries):
    stride = max(1, -(-idx.shape[0] // SAMPLE))
    return {"sampleStride": stride, "sample": [int(i) for i in idx[::stride]]}


# name -> (run, facts, needs_queries). run(scipy.spatial, points (n x 2 float64), queries
# (m x 2 float64 or None)) is the timed work; facts(result, points, queries) -> dict
# describes the warm-up result. Add an operation with one entry here and name it in the
# case table of bench/cases.mjs.
OPS = {
    "delaunay": (run_delaunay, facts_delaunay, False),
    "voronoi": (run_voronoi, facts_voronoi, False),
    "kdtree-nearest": (run_kdtree_nearest, facts_kdtree_nearest, True),
}


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--probe", action="store_true")
    ap.add_argument("--op")
    ap.add_argument("--file")
    ap.add_argument("--queries")
    ap.add_argument("--repeats", type=int, default=5)
    ap.add_argument("--budget", type=float, default=float("inf"))
    args = ap.parse_args()

    try:
        import numpy as np
        import scipy
        from scipy import spatial
    except Exception as exc:  # missing or broken install: the runner reports refMs null
        print(f"scipy_ref: cannot import numpy/scipy: {exc}", file=sys.stderr)
        sys.exit(3)

    if args.probe:
        print(json.dumps({"python": sys.version.split()[0], "numpy": np.__version__,
                          "scipy": scipy.__version__, "ops": sorted(OPS)}))
        return

    if args.op not in OPS:
        print(f"scipy_ref: unknown op {args.op!r}; known: {sorted(OPS)}", file=sys.stderr)
        sys.exit(2)
    run, facts, needs_queries = OPS[args.op]
    pts = np.fromfile(args.file, dtype=np.float64).reshape(-1, 2)
    queries = None
    if needs_queries:
        if not args.queries:
            print(f"scipy_ref: op {args.op} needs --queries FILE", file=sys.stderr)
            sys.exit(2)
        queries = np.fromfile(args.queries, dtype=np.float64).reshape(-1, 2)

    t0 = time.perf_counter()
    result = run(spatial, pts, queries)  # warm-up
    warm = time.perf_counter() - t0
    info = facts(result, pts, queries)
    del result
    runs = max(1, args.repeats)
    left = args.budget - (time.perf_counter() - _STARTED)
    if warm * runs > left:
        runs = max(0, int(left // warm))
    times = [] if runs > 0 else [warm * 1000.0]
    for _ in range(runs):
        gc.collect()
        t0 = time.perf_counter()
        result = run(spatial, pts, queries)
        times.append((time.perf_counter() - t0) * 1000.0)
        del result
    out = {"op": args.op, "n": int(pts.shape[0]), "ms": statistics.median(times), "runs": times,
           "reduced": runs < max(1, args.repeats), "warmupOnly": runs == 0}
    out.update(info)
    print(json.dumps(out))


if __name__ == "__main__":
    main()
