#!/usr/bin/python3
"""The benchmark's peer for Boulton (1963), Jacob-Lohman (1952), Hantush (1964) leaky partial penetration, the
underdamped slug model and the barometric response regression, written independently with numpy and scipy and
measured in the same run.

Called by tests/bench/sections/classic-models.ts with one argument, the path of a JSON input. Prints one JSON
object: per case the time per point (or per regression) and the values.
- boulton: Q/(2 pi T p) K0(r m), m^2 = (S p + Sy alpha p/(alpha + p))/T, Gaver-Stehfest N = 16 vectorised over times;
- jacob-lohman: the discharge 2 pi T sw q rw K1(q rw)/(p K0(q rw)), Stehfest N = 14 with scipy.special.k0e, k1e;
- leaky-penetration: Hantush's series with W(u, beta) by scipy.integrate.quad of its definition per term (slow by
  design: it checks the library's leaky-function routes);
- underdamped: the closed-form damped oscillation;
- brf: numpy.linalg.lstsq of level differences on lagged pressure differences and a constant.
Run by hand with:  /usr/bin/python3 tests/bench/peer/classic_peer.py INPUT.json
"""
import json
import math
import sys
import time
from fractions import Fraction

import numpy as np
from scipy import integrate, special


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


def boulton(c):
    t = np.asarray(c["t"])
    w = stehfest_weights(16)
    a = (math.log(2) / t)[:, None]
    p = a * np.arange(1, 17)[None, :]
    def run():
        m = np.sqrt((c["S"] * p + c["Sy"] * c["alpha"] * p / (c["alpha"] + p)) / c["T"])
        return c["Q"] / (2 * math.pi * c["T"]) * a[:, 0] * ((special.k0(c["r"] * m) / p) @ w)
    return t.size, run


def jacob_lohman(c):
    t = np.asarray(c["t"])
    w = stehfest_weights(14)
    a = (math.log(2) / t)[:, None]
    p = a * np.arange(1, 15)[None, :]
    def run():
        x = np.sqrt(c["S"] * p / c["T"]) * c["rw"]
        return 2 * math.pi * c["T"] * c["sw"] * a[:, 0] * ((x * special.k1e(x) / (p * special.k0e(x))) @ w)
    return t.size, run


def leaky_w(u, beta):
    f = lambda y: math.exp(-y - beta * beta / (4 * y)) / y
    peak = max(u, beta / 2)
    if peak > u:
        return integrate.quad(f, u, peak, epsrel=1e-12, limit=200)[0] + integrate.quad(f, peak, np.inf, epsrel=1e-12, limit=200)[0]
    return integrate.quad(f, u, np.inf, epsrel=1e-12, limit=200)[0]


def leaky_penetration(c):
    t = np.asarray(c["t"])
    b, d, l, z = c["b"], c["d"], c["l"], c["z"]
    r, K = c["r"], c["KzKr"]
    rB = r / c["B"]
    scale = 2 * b / (math.pi * (l - d))
    def run():
        out = []
        for ti in t:
            u = r * r * c["S"] / (4 * c["T"] * ti)
            total = leaky_w(u, rB)
            n = 0
            while True:
                n += 1
                beta = math.sqrt(rB * rB + (n * math.pi * r * math.sqrt(K) / b) ** 2)
                w = leaky_w(u, beta)
                total += scale / n * (math.sin(n * math.pi * l / b) - math.sin(n * math.pi * d / b)) * math.cos(n * math.pi * z / b) * w
                if 2 * scale / n * w < 1e-13 * abs(total):
                    break
            out.append(c["Q"] / (4 * math.pi * c["T"]) * total)
        return np.asarray(out)
    return t.size, run


def underdamped(c):
    t = np.asarray(c["t"])
    def run():
        omega = math.sqrt(9.80665 * 86400 * 86400 / c["Le"])
        CD = c["rc"] ** 2 * c["lnReRw"] * omega / (2 * c["K"] * c["Ls"])
        w = math.sqrt(1 - CD * CD / 4)
        td = t * omega
        return np.exp(-CD * td / 2) * (np.cos(w * td) + CD / (2 * w) * np.sin(w * td))
    return t.size, run


def brf(c):
    dw = np.diff(np.asarray(c["levels"]))
    dB = np.diff(np.asarray(c["pressures"]) * 100.0 / 9806.65)
    m = c["lags"]
    def run():
        y = dw[m:]
        X = np.column_stack([dB[m - k: dB.size - k] for k in range(m + 1)] + [np.ones(y.size)])
        beta = np.linalg.lstsq(X, y, rcond=None)[0]
        return np.cumsum(beta[: m + 1])
    return 1, run


KINDS = {"boulton": boulton, "jacob-lohman": jacob_lohman, "leaky-penetration": leaky_penetration, "underdamped": underdamped, "brf": brf}


def main():
    with open(sys.argv[1]) as handle:
        cases = json.load(handle)
    out = {}
    for name, case in cases.items():
        count, run = KINDS[case["kind"]](case)
        seconds, values = best_of(case.get("repeats", 3), run)
        out[name] = {"usPerPoint": seconds / count * 1e6, "values": values.tolist()}
    print(json.dumps(out))


if __name__ == "__main__":
    main()
