"""Reference timings from scipy.spatial for bench/run.mjs.

Usage:
  python3 scipy_ref.py --probe
  python3 scipy_ref.py --op delaunay --file POINTS.f64 --repeats 5 [--budget SECONDS]

POINTS.f64 holds interleaved x,y as native-endian float64 (written by the runner on the
same machine). The script times the named operation (one warm-up run, then --repeats
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


def op_delaunay(spatial, pts):
    tri = spatial.Delaunay(pts)
    # Qhull may leave points out as "coplanar" (numerically on a facet); report how
    # many so that the runner can say when scipy did less work than we did.
    return {"size": int(tri.simplices.shape[0]), "skipped": int(tri.coplanar.shape[0])}


# name -> function(scipy.spatial, points (n x 2 float64)) -> dict of facts about the result.
# Add an operation with one entry here and name it in the case table of bench/cases.mjs.
OPS = {
    "delaunay": op_delaunay,
}


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--probe", action="store_true")
    ap.add_argument("--op")
    ap.add_argument("--file")
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
    fn = OPS[args.op]
    pts = np.fromfile(args.file, dtype=np.float64).reshape(-1, 2)

    t0 = time.perf_counter()
    info = fn(spatial, pts)  # warm-up, also gives the result facts
    warm = time.perf_counter() - t0
    runs = max(1, args.repeats)
    left = args.budget - (time.perf_counter() - _STARTED)
    if warm * runs > left:
        runs = max(0, int(left // warm))
    times = [] if runs > 0 else [warm * 1000.0]
    for _ in range(runs):
        gc.collect()
        t0 = time.perf_counter()
        result = fn(spatial, pts)
        times.append((time.perf_counter() - t0) * 1000.0)
        del result
    out = {"op": args.op, "n": int(pts.shape[0]), "ms": statistics.median(times), "runs": times,
           "reduced": runs < max(1, args.repeats), "warmupOnly": runs == 0}
    out.update(info)
    print(json.dumps(out))


if __name__ == "__main__":
    main()
