#!/usr/bin/python3
"""The benchmark's peer: the same computations measured on scipy in the same run.

Called by tests/bench/run.ts, which passes the case names on the command line and reads one JSON object
from standard output. Inputs are built exactly as the TypeScript side builds them (same grids, the same
committed data set, start values and tolerances), so the figures can be compared.
Run by hand with:  /usr/bin/python3 tests/bench/peer/peer_bench.py e1 hantush theis-fit
"""
import json
import math
import os
import sys
import time

import numpy as np
import scipy
from scipy import special
from scipy.integrate import quad
from scipy.optimize import least_squares

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__)))))


def best_of(repeats, fn):
    best = math.inf
    result = None
    for _ in range(repeats):
        start = time.perf_counter()
        result = fn()
        best = min(best, time.perf_counter() - start)
    return best, result


def bench_e1():
    n = 1_000_000
    u = np.geomspace(1e-8, 50.0, n)
    seconds, values = best_of(5, lambda: special.exp1(u))
    return {"nsPerEvaluation": seconds / n * 1e9, "checksum": float(np.sum(values)), "evaluations": n}


def hantush_w(u, rb):
    f = lambda x: math.exp(-u * math.exp(x) - rb * rb / (4.0 * u * math.exp(x)))
    upper = max(math.log(800.0 / u), 1.0) if u < 800.0 else 1.0
    return quad(f, 0.0, upper, epsabs=0.0, epsrel=1e-10, limit=200)[0]


def bench_hantush():
    us = np.geomspace(1e-6, 10.0, 100)
    rbs = np.geomspace(1e-3, 3.0, 20)
    grid = [(float(u), float(b)) for u in us for b in rbs]

    def run():
        return sum(hantush_w(u, b) for u, b in grid)

    seconds, checksum = best_of(3, run)
    return {"nsPerEvaluation": seconds / len(grid) * 1e9, "checksum": checksum, "evaluations": len(grid),
            "method": "scipy.integrate.quad of the defining integral (scipy has no Hantush function)"}


def bench_theis_fit():
    with open(os.path.join(ROOT, "tests", "fixtures", "fit", "theis-fits.json")) as handle:
        fixture = json.load(handle)
    case = next(c for c in fixture["datasets"] if c["id"] == "thousand-point")
    well = case["wells"][0]
    t = np.asarray(well["t"], dtype=float)
    s = np.asarray(well["s"], dtype=float)
    r, q = well["r"], well["Q"]
    start = np.log([case["start"]["T"], case["start"]["S"]])
    tol = 1e-10  # the same xtol, ftol and gtol as the TypeScript side (its defaults)

    def residuals(x):
        T, S = np.exp(x)
        u = r * r * S / (4.0 * T * t)
        return q / (4.0 * math.pi * T) * special.exp1(u) - s

    def jacobian(x):
        T, S = np.exp(x)
        u = r * r * S / (4.0 * T * t)
        a = q / (4.0 * math.pi * T)
        model = a * special.exp1(u)
        d_ln_s = -a * np.exp(-u)
        return np.column_stack((-model - d_ln_s, d_ln_s))

    def run():
        return least_squares(residuals, start, jac=jacobian, method="lm",
                             xtol=tol, ftol=tol, gtol=tol)

    seconds, result = best_of(20, run)
    T, S = np.exp(result.x)
    return {"ms": seconds * 1e3, "points": int(t.size), "T": float(T), "S": float(S), "nfev": int(result.nfev),
            "method": "scipy.optimize.least_squares(method='lm') with the analytic Jacobian"}


CASES = {"e1": bench_e1, "hantush": bench_hantush, "theis-fit": bench_theis_fit}


def main():
    names = sys.argv[1:] or list(CASES)
    out = {"scipy": scipy.__version__, "numpy": np.__version__, "python": sys.version.split()[0]}
    for name in names:
        out[name] = CASES[name]()
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
