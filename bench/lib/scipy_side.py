"""
The scipy side of bench/scipy.ts: times the same workloads on the same numbers (read from a float64 file
written by the TypeScript side) and prints one JSON object. Never used by tests.

Usage: python3 scipy_side.py <workload> <file.f64> [args...]
"""
import json
import sys
import time
import warnings

import numpy as np
import scipy
from scipy import stats

warnings.filterwarnings("ignore")


def best_of(f, reps):
    best = float("inf")
    out = None
    for _ in range(reps):
        t0 = time.perf_counter()
        out = f()
        best = min(best, time.perf_counter() - t0)
    return best * 1e3, out


def shifted(x):
    """The data moved above zero: lognorm.fit keeps its own fast path only when the minimum is positive."""
    return x - x.min() + 1.0, -x.min() + 1.0


def lognorm_fit(x):
    y, shift = shifted(x)
    s, loc, scale = stats.lognorm.fit(y)
    ll = float(np.sum(stats.lognorm.logpdf(y, s, loc, scale)))
    return {"s": s, "loc": loc - shift, "scale": scale, "ll": ll}


def main():
    work = sys.argv[1]
    x = np.fromfile(sys.argv[2], dtype=np.float64)
    reps = int(sys.argv[3]) if len(sys.argv) > 3 else 3
    out = {"scipy": scipy.__version__, "numpy": np.__version__}
    if work == "fit":
        ms, r = best_of(lambda: lognorm_fit(x), reps)
        out.update(ms=ms, **r)
        if len(x) <= 5000:
            # the same call on the raw (partly negative) data: scipy leaves its fast path; reported for the note
            ms_raw, raw = best_of(lambda: stats.lognorm.fit(x), 1)
            out.update(rawMs=ms_raw, rawLl=float(np.sum(stats.lognorm.logpdf(x, *raw))))
    elif work == "compare":
        y, shift = shifted(x)
        fams = {
            "normal": lambda: stats.norm.fit(x),
            "student-t": lambda: stats.t.fit(x),
            "asymmetric-laplace": lambda: stats.laplace_asymmetric.fit(x),
            "johnson-su": lambda: stats.johnsonsu.fit(x),
        }
        dists = {"normal": stats.norm, "student-t": stats.t, "asymmetric-laplace": stats.laplace_asymmetric, "johnson-su": stats.johnsonsu}
        total = 0.0
        lls = {}
        times = {}
        for name, f in fams.items():
            ms, p = best_of(f, reps)
            total += ms
            times[name] = ms
            lls[name] = float(np.sum(dists[name].logpdf(x, *p)))
        ms, r = best_of(lambda: lognorm_fit(x), reps)
        total += ms
        times["lognormal"] = ms
        lls["lognormal"] = r["ll"]
        out.update(ms=total, times=times, ll=lls)
    elif work == "gof":
        y, shift = shifted(x)
        n_mc = int(sys.argv[4]) if len(sys.argv) > 4 else 199
        res = {}
        total = 0.0
        for stat in ("ks", "ad"):
            ms, r = best_of(lambda: stats.goodness_of_fit(stats.lognorm, y, statistic=stat, n_mc_samples=n_mc, rng=np.random.default_rng(7)), reps)
            total += ms
            res[stat] = {"ms": ms, "statistic": float(r.statistic), "p": float(r.pvalue)}
        out.update(ms=total, stats=res)
    elif work == "roll":
        window = int(sys.argv[4])
        count = int(sys.argv[5])  # number of windows timed (the loop is long; per-window time is what is compared)

        def loop():
            v = []
            for j in range(window, window + count):
                v.append(lognorm_fit(x[j - window:j])["ll"])
            return v

        ms, _ = best_of(loop, 1)
        out.update(ms=ms, windows=count, perWindowMs=ms / count)
    else:
        raise SystemExit(f"unknown workload {work}")
    print(json.dumps(out))


if __name__ == "__main__":
    main()
