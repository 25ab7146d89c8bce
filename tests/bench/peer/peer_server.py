"""The benchmark's persistent scipy peer: one process that answers measurement requests, one per line.

tests/bench/python-peer.ts starts it once per `npm run bench` (with the Python of the virtual environment the bench
made, or Debian's) and sends one JSON request per line; each answer is one JSON line. A request names a case and
asks for one round; the TypeScript side runs its own round of the same case just before or after (alternating), so
both sides are measured in the same time window. Inputs are built exactly as the TypeScript side builds them (same
grids, the same committed data set, start values and tolerances).

Requests:  {"case": "versions"} | {"case": "e1", "n": 1000000, "lo": 1e-10, "hi": 50} | {"case": "theis-fit", "repeats": 5}
Answers:   {"wallMs": ..., "cpuMs": ..., ...the case's result for the check...}
"""
import json
import math
import os
import sys
import time

import numpy as np
import scipy
from scipy import special
from scipy.optimize import least_squares

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__)))))


def timed(fn):
    wall0, cpu0 = time.perf_counter(), time.process_time()
    result = fn()
    return (time.perf_counter() - wall0) * 1e3, (time.process_time() - cpu0) * 1e3, result


_E1_GRID = {}


def e1_round(request):
    key = (request["n"], request["lo"], request["hi"])
    if key not in _E1_GRID:
        _E1_GRID[key] = np.geomspace(request["lo"], request["hi"], request["n"])
    u = _E1_GRID[key]
    wall, cpu, values = timed(lambda: special.exp1(u))
    return {"wallMs": wall, "cpuMs": cpu, "checksum": float(np.sum(values)), "evaluations": int(u.size)}


def _theis_problem():
    with open(os.path.join(ROOT, "tests", "fixtures", "fit", "theis-fits.json")) as handle:
        fixture = json.load(handle)
    case = next(c for c in fixture["datasets"] if c["id"] == "thousand-point")
    well = case["wells"][0]
    t = np.asarray(well["t"], dtype=float)
    s = np.asarray(well["s"], dtype=float)
    r, q = well["r"], well["Q"]
    start = np.log([case["start"]["T"], case["start"]["S"]])

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

    return t.size, start, residuals, jacobian


_THEIS = []


def theis_fit_round(request):
    if not _THEIS:
        _THEIS.append(_theis_problem())
    points, start, residuals, jacobian = _THEIS[0]
    tol = 1e-10  # the same xtol, ftol and gtol as the TypeScript side

    def run():
        result = None
        for _ in range(request["repeats"]):
            result = least_squares(residuals, start, jac=jacobian, method="lm", xtol=tol, ftol=tol, gtol=tol)
        return result

    wall, cpu, result = timed(run)
    T, S = np.exp(result.x)
    return {"wallMs": wall / request["repeats"], "cpuMs": cpu / request["repeats"], "T": float(T), "S": float(S),
            "nfev": int(result.nfev), "points": int(points)}


def versions(_request):
    return {"scipy": scipy.__version__, "numpy": np.__version__, "python": sys.version.split()[0], "executable": sys.executable}


CASES = {"versions": versions, "e1": e1_round, "theis-fit": theis_fit_round}


def main():
    for line in sys.stdin:
        request = json.loads(line)
        try:
            answer = CASES[request["case"]](request)
        except Exception as error:  # the bench reports the failure and stops using the peer
            answer = {"error": f"{type(error).__name__}: {error}"}
        sys.stdout.write(json.dumps(answer) + "\n")
        sys.stdout.flush()


if __name__ == "__main__":
    main()
