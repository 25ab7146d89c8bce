#!/usr/bin/python3
"""The benchmark's peer for the screened-well models (Dougherty-Babu, Moench 1997, Neuman 1974 partial
penetration), the KGS slug model and the transient step-drawdown fit, written independently with numpy and
scipy and measured in the same run.

Called by tests/bench/sections/new-methods.ts with one argument, the path of a JSON input (times, parameters,
geometry, fit data). Prints one JSON object: per case the time per point (or per fit) and the values.
Transform: the vertical-mode series of packages/aquifer/src/models/vertical-modes.ts, every term summed directly
(pumped well: 20,000 terms, whose remainder is about 1e-7 of the sum; elsewhere 2,000 terms), water-table roots
by vectorised Newton iteration; inversion: Gaver-Stehfest (Stehfest 1970) with the same N, vectorised over
times. Step test: Theis (scipy.special.exp1) superposed over the steps plus C Q^n, fitted by
scipy.optimize.least_squares (method "lm") in ln T, ln S, ln C and n.
Run by hand with:  /usr/bin/python3 tests/bench/peer/methods_peer.py INPUT.json
"""
import json
import math
import sys
import time
from fractions import Fraction

import numpy as np
from scipy import optimize, special


def best_of(repeats, fn):
    best, result = math.inf, None
    for _ in range(repeats):
        start = time.perf_counter()
        result = fn()
        best = min(best, time.perf_counter() - start)
    return best, result


def stehfest_weights(n):
    half = n // 2
    out = []
    for k in range(1, n + 1):
        total = Fraction(0)
        for j in range((k + 1) // 2, min(k, half) + 1):
            total += Fraction(j ** half * math.factorial(2 * j), math.factorial(half - j) * math.factorial(j)
                              * math.factorial(j - 1) * math.factorial(k - j) * math.factorial(2 * j - k))
        out.append(float((-1) ** (k + half) * total))
    return np.asarray(out)


def roots(gamma, count):
    k = np.arange(count, dtype=float)
    e = k * np.pi + np.pi / 4
    for _ in range(5):
        e = k * np.pi + np.arctan(gamma / np.maximum(e, 1e-300))
    e[0] = math.sqrt(gamma) if gamma < 1 else 1.0
    for _ in range(60):
        step = (e * np.sin(e) - gamma * np.cos(e)) / (np.sin(e) + e * np.cos(e) + gamma * np.sin(e))
        e = e - step
        if np.all(np.abs(step) <= 1e-15 * np.abs(e)):
            break
    return e


def mode_sum(p, aq, g, rw, r, pumped):
    b = g["b"]
    m2 = (aq["S"] * p + aq["lambda"]) / aq["T"]
    kz = aq["kappa"] / b ** 2
    count = 20_000 if pumped else 2_000
    if aq["Sy"] > 0:
        gamma = aq["Sy"] * b * b * p / (aq["kappa"] * aq["T"])
        if aq["alpha"] is not None:
            gamma *= aq["alpha"] / (aq["alpha"] + p)
        e = roots(gamma, count)
        total = 0.0
    else:
        e = np.arange(1, count, dtype=float) * np.pi
        total = rad(np.sqrt(m2), rw if pumped else r, rw) / b
    za, zb, L = g["zetaA"], g["zetaB"], g["zetaB"] - g["zetaA"]
    with np.errstate(invalid="ignore", divide="ignore", under="ignore"):
        c = 4 * (np.sin(e * zb / b) - np.sin(e * za / b)) / (L * (2 * e + np.sin(2 * e)))
        o = g["observation"]
        if pumped:
            ob = b * (np.sin(e * zb / b) - np.sin(e * za / b)) / (L * e)
        elif "zeta" in o:
            ob = np.cos(e * o["zeta"] / b)
        else:
            ob = b * (np.sin(e * o["zeta2"] / b) - np.sin(e * o["zeta1"] / b)) / ((o["zeta2"] - o["zeta1"]) * e)
        terms = c * ob * rad(np.sqrt(m2 + kz * e * e), rw if pumped else r, rw)
    return total + np.sum(np.where(np.isfinite(terms), terms, 0.0))


def rad(q, r, rw):
    if rw == 0:
        return special.k0(q * r)
    return special.k0e(q * r) * np.exp(-q * (r - rw)) / (q * rw * special.k1e(q * rw))


def transform(p, case):
    aq, g, w = case["aquifer"], case["geometry"], case["well"]
    L = g["zetaB"] - g["zetaA"]
    scale = g["b"] / (2 * np.pi * aq["T"])
    pumped = case["pumped"]
    phi = scale * (mode_sum(p, aq, g, w["rw"], w["rw"], True) + w["skin"] / L) if (pumped or w["rc"] > 0) else 0.0
    if case.get("slug"):
        storage = np.pi * w["rc"] ** 2
        return storage * phi / (1 + storage * p * phi)
    qa = case["Q"] / p / (1 + np.pi * w["rc"] ** 2 * p * phi)
    return qa * phi if pumped else qa * scale * mode_sum(p, aq, g, w["rw"], case["r"], False)


def bench_series(case):
    weights = stehfest_weights(12)
    t = np.asarray(case["t"], dtype=float)

    def run():
        out = np.empty_like(t)
        for i, ti in enumerate(t):
            a = math.log(2) / ti
            out[i] = a * sum(weights[k] * transform((k + 1) * a, case) for k in range(12))
        return out

    seconds, values = best_of(case["repeats"], run)
    return {"usPerPoint": seconds / t.size * 1e6, "values": values.tolist()}


def bench_step_fit(case):
    t = np.asarray(case["t"])
    s_obs = np.asarray(case["s"])
    steps = case["steps"]
    rw = case["rw"]
    rate_now = np.array([[q["rate"] for q in steps if ti >= q["start"]][-1] for ti in t])

    def model(x):
        T, S, C, n = math.exp(x[0]), math.exp(x[1]), math.exp(x[2]), x[3]
        s = np.zeros_like(t)
        previous = 0.0
        for q in steps:
            live = t > q["start"]
            s[live] += (q["rate"] - previous) * special.exp1(rw * rw * S / (4 * T * (t[live] - q["start"]))) / (4 * np.pi * T)
            previous = q["rate"]
        return s + C * rate_now ** n

    start = case["start"]
    x0 = [math.log(start["T"]), math.log(start["S"]), math.log(start["C"]), start["n"]]

    def run():
        return optimize.least_squares(lambda x: model(x) - s_obs, x0, method="lm", xtol=1e-10, ftol=1e-10, gtol=1e-10)

    seconds, res = best_of(case["repeats"], run)
    return {"ms": seconds * 1e3, "estimate": {"T": math.exp(res.x[0]), "S": math.exp(res.x[1]), "C": math.exp(res.x[2]), "n": res.x[3]},
            "nfev": int(res.nfev)}


def bench_closed_form(case):
    """Double porosity (full penetration, Papadopulos-Cooper form with block storage, Stehfest), Papadopulos (1965)
    anisotropy (exp1) and the uniform-flux fracture (closed form on its line with scipy.special.erf)."""
    t = np.asarray(case["t"], dtype=float)
    kind = case["kind"]
    if kind == "double-porosity":
        weights = stehfest_weights(12)
        a = (math.log(2) / t)[:, None]
        p = a * np.arange(1, 13)[None, :]
        eta = np.sqrt(p / case["rate"])
        F = np.tanh(eta) / eta
        def run():
            q = np.sqrt((case["S"] * p + case["Sm"] * p * F) / case["T"])
            return case["Q"] * a[:, 0] * ((special.k0(q * case["r"]) / (2 * np.pi * case["T"] * p)) @ weights)
    elif kind == "anisotropy":
        Tx, Ty, Txy = case["Txx"], case["Tyy"], case["Txy"]
        det = Tx * Ty - Txy ** 2
        x, y = case["x"], case["y"]
        def run():
            u = case["S"] * (Tx * y * y + Ty * x * x - 2 * Txy * x * y) / (4 * t * det)
            return case["Q"] * special.exp1(u) / (4 * np.pi * math.sqrt(det))
    else:
        xf = case["xf"]
        def run():
            c = case["S"] / (4 * case["T"] * t)
            F = xf * special.exp1(c * xf * xf) + np.sqrt(np.pi / c) * special.erf(np.sqrt(c) * xf)
            return case["Q"] * 2 * F / (8 * np.pi * case["T"] * xf)
    seconds, values = best_of(case["repeats"], run)
    return {"usPerPoint": seconds / t.size * 1e6, "values": values.tolist()}


def main():
    with open(sys.argv[1]) as handle:
        cases = json.load(handle)
    out = {}
    for name, case in cases.items():
        if name == "step-fit":
            out[name] = bench_step_fit(case)
        elif name.startswith("closed-"):
            out[name] = bench_closed_form(case)
        else:
            out[name] = bench_series(case)
    print(json.dumps(out))


if __name__ == "__main__":
    main()
