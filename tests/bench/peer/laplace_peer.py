#!/usr/bin/python3
"""The benchmark's peer for the Laplace-domain models: the same transforms, inverted by the same Stehfest
sums, written independently with numpy and scipy.special and measured in the same run.

Called by tests/bench/sections/laplace-models.ts with one argument, the path of a JSON file holding every
input (times, parameters, geometry, the synthetic fit data, start values and tolerances), so both sides work
on identical numbers. Prints one JSON object: per case the time per point (or per fit) and the computed
values, which the TypeScript side compares with its own.

Transforms (p the Laplace variable; sources as in the model modules of packages/aquifer/src/models):
  Papadopulos and Cooper (1967), skin of Agarwal et al. (1970), physical p in 1/d, q = sqrt(S p / T), x = q rw:
      A = Q / (p [2 pi T x K1(x) + pi rc^2 p (K0(x) + Sk x K1(x))]),
      s_w = A (K0(x) + Sk x K1(x)) in the pumped well, s = A K0(q r) at r > rw.
  Neuman (1974) in the Laplace form of Moench (1997), p conjugate to t_s = T t / (S r^2):
      F = (2/p) sum_n w_n K0(sqrt(p + beta eps_n^2)),  eps_n tan eps_n = c = p / (sigma beta),
      w_n = 2 c^2 / (eps_n^2 (eps_n^2 + c^2 + c)); truncated by the tail bound K0(x_m)(1 - sum w) <= tol * sum.
  Hantush (1960) with aquitard storage in the Laplace form of Moench (1985), p conjugate to t_D = T t / (S r^2):
      F = (2/p) K0(sqrt(p + rho^2 y coth y)),  y = sqrt(p gamma) / rho,  rho = r/B,  gamma = S'/S.
Inversion: Gaver-Stehfest (Stehfest 1970, Comm. ACM 13(1) 47-49), weights computed here in exact rational
arithmetic. Vectorised over every (time, Stehfest term) pair with numpy.

Run by hand with:  /usr/bin/python3 tests/bench/peer/laplace_peer.py INPUT.json
"""
import json
import math
import sys
import time
from fractions import Fraction

import numpy as np
import scipy
from scipy import special
from scipy.optimize import least_squares

NEUMAN_MAX_TERMS = 100000


def best_of(repeats, fn):
    best = math.inf
    result = None
    for _ in range(repeats):
        start = time.perf_counter()
        result = fn()
        best = min(best, time.perf_counter() - start)
    return best, result


def stehfest_weights(n):
    """V_1..V_n of Stehfest (1970), exact rationals rounded once to double."""
    half = n // 2
    weights = []
    for k in range(1, n + 1):
        total = Fraction(0)
        for j in range((k + 1) // 2, min(k, half) + 1):
            total += Fraction(
                j ** half * math.factorial(2 * j),
                math.factorial(half - j) * math.factorial(j) * math.factorial(j - 1)
                * math.factorial(k - j) * math.factorial(2 * j - k),
            )
        weights.append(float((-1) ** (k + half) * total))
    return np.asarray(weights)


def stehfest_grid(t, n):
    """a = ln 2 / t (shape (m, 1)) and the Laplace variables p = k a (shape (m, n))."""
    a = (math.log(2.0) / np.asarray(t, dtype=float))[:, None]
    return a, a * np.arange(1, n + 1, dtype=float)[None, :]


# ---------------------------------------------------------------------------------------------------------
# Papadopulos-Cooper


def papadopulos_cooper(T, S, Q, r, pumped, well, t, n):
    rc, rw, skin = well["rc"], well["rw"], well["skin"]
    weights = stehfest_weights(n)
    a, p = stehfest_grid(t, n)
    q = np.sqrt(S / T * p)
    x = q * rw
    k1 = special.k1e(x)
    face = special.k0e(x) + skin * x * k1
    denominator = p * (2.0 * math.pi * T * x * k1 + math.pi * rc * rc * p * face)
    numerator = face if pumped else special.k0e(q * r) * np.exp(-q * (r - rw))
    return Q * a[:, 0] * ((numerator / denominator) @ weights)


def bench_papadopulos_cooper(case):
    T, S = case["parameters"]
    n = case["stehfestTerms"]
    grids = [(g["r"], g["pumped"], np.asarray(g["t"], dtype=float)) for g in case["geometries"]]
    points = sum(g[2].size for g in grids)

    def run():
        return [papadopulos_cooper(T, S, case["Q"], r, pumped, case["well"], t, n) for r, pumped, t in grids]

    seconds, values = best_of(case["repeats"], run)
    return {"usPerPoint": seconds / points * 1e6, "points": points,
            "values": [v.tolist() for v in values],
            "method": f"numpy, scipy.special.k0e/k1e, Stehfest N = {n}, vectorised over times and terms"}


# ---------------------------------------------------------------------------------------------------------
# Neuman


def neuman_roots(n, c, guess):
    """Roots of eps tan eps = c in (n pi, n pi + pi/2): Newton on eps - n pi - atan(c/eps), kept in the bracket."""
    base = n * math.pi
    top = base + math.pi / 2
    lo = np.full(c.shape, base)
    hi = np.full(c.shape, top)
    e = np.where((guess > lo) & (guess < hi), guess, 0.5 * (lo + hi))
    out = np.empty_like(c)
    index = np.arange(c.size)
    for _ in range(100):
        h = e - base - np.arctan(c / e)
        lo = np.where(h < 0, e, lo)
        hi = np.where(h > 0, e, hi)
        step = h / (1.0 + c / (e * e + c * c))
        exact = h == 0
        small = ~exact & (np.abs(step) <= 1e-15 * e)
        out[index[exact]] = e[exact]
        out[index[small]] = e[small] - step[small]
        keep = ~(exact | small)
        if not keep.any():
            return out
        nxt = e - step
        e = np.where((nxt > lo) & (nxt < hi), nxt, 0.5 * (lo + hi))
        e, c, lo, hi, index = e[keep], c[keep], lo[keep], hi[keep], index[keep]
    out[index] = e
    return out


def neuman_transform(p, sigma, beta, tol, derivatives):
    """F(p) and, with derivatives, dF/dp, dF/dsigma, dF/dbeta (flat arrays of the same length as p)."""
    p = np.asarray(p, dtype=float).ravel()
    sigma = np.broadcast_to(sigma, p.shape).astype(float)
    beta = np.broadcast_to(beta, p.shape).astype(float)
    c = p / (sigma * beta)
    total = np.zeros_like(p)
    weight_sum = np.zeros_like(p)
    sum_dc = np.zeros_like(p)
    sum_dp = np.zeros_like(p)
    sum_db = np.zeros_like(p)
    e = np.where(c < 2, np.sqrt(c / (1 + c / 3)), math.pi / 2 * (c / (1 + c)))
    active = np.arange(p.size)
    n = 0
    while active.size and n < NEUMAN_MAX_TERMS:
        ca = c[active]
        guess = e[active] if n == 0 else n * math.pi + np.arctan(ca / (e[active] + math.pi))
        ea = neuman_roots(n, ca, guess)
        e[active] = ea
        e2 = ea * ea
        den = e2 + ca * ca + ca
        w = 2 * ca * ca / (e2 * den)
        ba = beta[active]
        x = np.sqrt(p[active] + ba * e2)
        k0 = special.k0(x)
        total[active] += w * k0
        weight_sum[active] += w
        if derivatives:
            k1 = special.k1(x)
            de_dc = ea / den
            dlnw_dc = 2 / ca - (2 / ea) * de_dc - (2 * ea * de_dc + 2 * ca + 1) / den
            sum_dc[active] += w * (k0 * dlnw_dc - k1 * ba * ea * de_dc / x)
            sum_dp[active] += -w * k1 / (2 * x)
            sum_db[active] += -w * k1 * e2 / (2 * x)
            bound = np.maximum(k0, k1) * np.maximum(0.0, 1 - weight_sum[active])
        else:
            bound = k0 * np.maximum(0.0, 1 - weight_sum[active])
        if n >= 1:
            active = active[bound > tol * total[active]]
        n += 1
    scale = 2 / p
    value = scale * total
    if not derivatives:
        return value, None, None, None
    dp = -value / p + scale * (sum_dp + sum_dc * c / p)
    dsigma = scale * (-sum_dc * c) / sigma
    dbeta = scale * (sum_db - sum_dc * c / beta)
    return value, dp, dsigma, dbeta


def neuman_dimensionless(ts, sigma, beta, n, tol, derivatives=False):
    """s_D(t_s) by Stehfest; with derivatives also t_s ds_D/dt_s, ds_D/dsigma, ds_D/dbeta."""
    weights = stehfest_weights(n)
    a, p = stehfest_grid(ts, n)
    value, dp, dsigma, dbeta = neuman_transform(p, sigma, beta, tol, derivatives)
    shape = p.shape
    s_d = a[:, 0] * (value.reshape(shape) @ weights)
    if not derivatives:
        return s_d
    ts_dt = -a[:, 0] * ((value + p.ravel() * dp).reshape(shape) @ weights)
    return s_d, ts_dt, a[:, 0] * (dsigma.reshape(shape) @ weights), a[:, 0] * (dbeta.reshape(shape) @ weights)


def neuman_drawdown(params, r, Q, b, t, n, tol):
    T, S, Sy, kappa = params
    ts = T * np.asarray(t, dtype=float) / (S * r * r)
    return Q / (4 * math.pi * T) * neuman_dimensionless(ts, S / Sy, kappa * r * r / (b * b), n, tol)


def neuman_ln_jacobian(params, r, Q, b, t, n, tol):
    """Columns d s / d ln(T, S, Sy, Kz/Kr) by the chain rule through t_s, sigma and beta."""
    T, S, Sy, kappa = params
    coef = Q / (4 * math.pi * T)
    sigma = S / Sy
    beta = kappa * r * r / (b * b)
    s_d, ts_dt, d_sigma, d_beta = neuman_dimensionless(T * np.asarray(t) / (S * r * r), sigma, beta, n, tol, True)
    return np.column_stack((coef * (ts_dt - s_d), coef * (sigma * d_sigma - ts_dt), -coef * sigma * d_sigma,
                            coef * beta * d_beta))


def bench_neuman(case):
    params = case["parameters"]
    n, tol, b = case["stehfestTerms"], case["seriesTolerance"], case["b"]
    wells = [(w["r"], w["Q"], np.asarray(w["t"], dtype=float)) for w in case["wells"]]
    points = sum(w[2].size for w in wells)

    def run():
        return [neuman_drawdown(params, r, Q, b, t, n, tol) for r, Q, t in wells]

    seconds, values = best_of(case["repeats"], run)
    return {"usPerPoint": seconds / points * 1e6, "points": points, "values": [v.tolist() for v in values],
            "method": f"numpy, scipy.special.k0, vectorised Newton roots, Stehfest N = {n}"}


def bench_neuman_fit(case):
    n, tol, b = case["stehfestTerms"], case["seriesTolerance"], case["b"]
    wells = [(w["r"], w["Q"], np.asarray(w["t"], dtype=float), np.asarray(w["s"], dtype=float)) for w in case["wells"]]
    names = case["parameterNames"]
    start = np.log([case["start"][name] for name in names])

    def residuals(x):
        params = np.exp(x)
        return np.concatenate([neuman_drawdown(params, r, Q, b, t, n, tol) - s for r, Q, t, s in wells])

    def jacobian(x):
        params = np.exp(x)
        return np.vstack([neuman_ln_jacobian(params, r, Q, b, t, n, tol) for r, Q, t, _ in wells])

    def run():
        return least_squares(residuals, start, jac=jacobian, method="lm",
                             xtol=case["xtol"], ftol=case["ftol"], gtol=case["gtol"])

    seconds, result = best_of(case["repeats"], run)
    estimate = np.exp(result.x)
    return {"ms": seconds * 1e3, "points": int(sum(w[2].size for w in wells)),
            "estimate": dict(zip(names, map(float, estimate))), "nfev": int(result.nfev),
            "njev": int(result.njev) if result.njev is not None else None,
            "ssr": float(2 * result.cost), "status": int(result.status),
            "method": "scipy.optimize.least_squares(method='lm') in ln parameters with the analytic Jacobian"}


# ---------------------------------------------------------------------------------------------------------
# Hantush (1960) with aquitard storage


def hantush_storage_dimensionless(t_d, rho, gamma, n):
    weights = stehfest_weights(n)
    a, p = stehfest_grid(t_d, n)
    y = np.sqrt(p * gamma) / rho
    y2 = y * y
    with np.errstate(invalid="ignore", divide="ignore"):
        coth_term = np.where(y < 1e-3, 1 + y2 / 3 - y2 * y2 / 45, np.where(y > 20, y, y / np.tanh(y)))
    x = np.sqrt(p + rho * rho * coth_term)
    return a[:, 0] * ((2 * special.k0(x) / p) @ weights)


def bench_hantush_storage(case):
    T, S, B, Sa = case["parameters"]
    n = case["stehfestTerms"]
    wells = [(w["r"], w["Q"], np.asarray(w["t"], dtype=float)) for w in case["wells"]]
    points = sum(w[2].size for w in wells)

    def run():
        return [Q / (4 * math.pi * T) * hantush_storage_dimensionless(T * t / (S * r * r), r / B, Sa / S, n)
                for r, Q, t in wells]

    seconds, values = best_of(case["repeats"], run)
    return {"usPerPoint": seconds / points * 1e6, "points": points, "values": [v.tolist() for v in values],
            "method": f"numpy, scipy.special.k0, Stehfest N = {n}, vectorised over times and terms"}


CASES = {
    "papadopulos-cooper": bench_papadopulos_cooper,
    "neuman": bench_neuman,
    "neuman-fit": bench_neuman_fit,
    "hantush-aquitard-storage": bench_hantush_storage,
}


def main():
    if len(sys.argv) != 2:
        sys.exit("usage: laplace_peer.py INPUT.json  (the input file is written by tests/bench/sections/laplace-models.ts)")
    with open(sys.argv[1]) as handle:
        inputs = json.load(handle)
    out = {"scipy": scipy.__version__, "numpy": np.__version__, "python": sys.version.split()[0]}
    for name, case in inputs.items():
        if name not in CASES:
            sys.exit(f"laplace_peer.py: unknown case {name!r}; known cases are {', '.join(CASES)}")
        out[name] = CASES[name](case)
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
