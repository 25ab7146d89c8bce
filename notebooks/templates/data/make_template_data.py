#!/usr/bin/python3
"""Writes the invented data sets of the worked site templates in notebooks/templates/.

Everything here is invented: sites, wells, rates, aquifers and noise. Each template gets two data sets made
by the same model with other parameters:

* the demonstration set, which the template holds (notebooks/templates/data/), and
* a second set (tests/fixtures/templates/), which tests/templates.test.ts gives to `conebook new` to check
  that a document made from the template runs and recovers that set's parameters within its 95 % intervals.

The drawdowns are computed here with numpy, scipy and mpmath, independently of Conebook's own code:

* Theis (1935): s = Q/(4 pi T) E1(u), u = r^2 S/(4 T t) (scipy.special.exp1);
* Hantush (1960) leaky aquifer with aquitard storage, far side of the aquitard at constant head, in the
  Laplace form of Moench (1985): s(p) = Q/(2 pi T p) K0(r sqrt(p S/T + sigma coth(sigma)/B^2)),
  sigma = sqrt(p S' B^2/T), inverted by mpmath.invertlaplace (fixed Talbot contour, 20 digits);
* Neuman (1974) unconfined aquifer, fully penetrating wells, in the Laplace form of Moench (1997) with
  instantaneous drainage: s_D(p) = (2/p) sum_n w_n K0(sqrt(p + beta e_n^2)), e_n tan e_n = p/(sigma beta),
  w_n = 4 sin^2 e_n/(e_n (2 e_n + sin 2 e_n)), t_s = T t/(S r^2), sigma = S/Sy, beta = (Kz/Kr) r^2/b^2,
  inverted by the Stehfest (1970) algorithm with 16 terms in double precision (real p, so the roots are real
  and bracketed); the linear drawdown s' so found is turned into the drawdown of a thinning water-table
  aquifer by inverting Jacob's (1944) correction, s = b - sqrt(b^2 - 2 b s');
* Papadopulos and Cooper (1967) with the skin of Agarwal et al. (1970), in the pumped well:
  s_w(p) = Q (K0(x) + Sk x K1(x)) / (p [2 pi T x K1(x) + pi rc^2 p (K0(x) + Sk x K1(x))]), x = rw sqrt(S p/T),
  inverted by mpmath.invertlaplace (Talbot, 20 digits);
* Cooper, Bredehoeft and Papadopulos (1967) slug test: H/H0 = (8 a/pi^2) int_0^inf exp(-b u^2/a)/(u f(u)) du,
  f(u) = (u J0(u) - 2 a J1(u))^2 + (u Y0(u) - 2 a Y1(u))^2, a = rw^2 S/rc^2, b = T t/rc^2 (scipy.integrate.quad
  in ln u);
* superposition in time (step test, recovery) and one image well for a straight no-flow boundary (Ferris et
  al. 1962) on Theis.

Noise: white Gaussian noise, or logger-like noise: white sensor noise of standard deviation sd plus a drift,
an Ornstein-Uhlenbeck process (the continuous form of AR(1)) of standard deviation sd/2 and correlation time
tau, sampled at the reading times, so that readings close in time share part of their error. Readings are written with 1 mm resolution, as loggers report them.

Rerun with:  /usr/bin/python3 notebooks/templates/data/make_template_data.py
It rewrites every CSV and the two JSON files byte for byte (fixed seeds).
"""
import csv
import json
import math
import os
from datetime import datetime, timedelta, timezone

import mpmath as mp
import numpy as np
from scipy import integrate, optimize, special

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.normpath(os.path.join(HERE, "..", "..", ".."))
DEMO_DIR = HERE
SECOND_DIR = os.path.join(ROOT, "tests", "fixtures", "templates")
MIN_PER_DAY = 1440.0

mp.mp.dps = 20


# ---------------------------------------------------------------- models (base units m, d, m3/d, m2/d)

def theis(T, S, Q, r, t_d):
    t = np.asarray(t_d, dtype=float)
    out = np.zeros_like(t)
    pos = t > 0
    out[pos] = Q / (4 * math.pi * T) * special.exp1(r * r * S / (4 * T * t[pos]))
    return out


def superposed(unit_response, steps, t_d):
    """Drawdown for rate steps [(start_d, rate)] from the unit-rate response s1(tau) (0 for tau <= 0)."""
    t = np.asarray(t_d, dtype=float)
    total = np.zeros_like(t)
    previous = 0.0
    for start, rate in steps:
        total += (rate - previous) * unit_response(t - start)
        previous = rate
    return total


def hantush_storage(T, S, B, Sa, Q, r, t_d):
    T, S, B, Sa, Q, r = (mp.mpf(v) for v in (T, S, B, Sa, Q, r))

    def F(p):
        sigma = mp.sqrt(p * Sa * B * B / T)
        return Q / (2 * mp.pi * T * p) * mp.besselk(0, r * mp.sqrt(p * S / T + sigma * mp.coth(sigma) / (B * B)))

    return np.array([float(mp.invertlaplace(F, mp.mpf(t), method="talbot")) for t in t_d])


def stehfest_weights(n):
    v = []
    for i in range(1, n + 1):
        total = 0.0
        for k in range((i + 1) // 2, min(i, n // 2) + 1):
            total += (k ** (n // 2) * math.factorial(2 * k)) / (
                math.factorial(n // 2 - k) * math.factorial(k) * math.factorial(k - 1) * math.factorial(i - k) * math.factorial(2 * k - i)
            )
        v.append((-1) ** (i + n // 2) * total)
    return v


STEHFEST16 = stehfest_weights(16)


def neuman_transform(p, sigma, beta):
    """(2/p) sum_n w_n K0(sqrt(p + beta e_n^2)) for real p > 0, roots of e tan e = c bracketed in (n pi, n pi + pi/2)."""
    c = p / (sigma * beta)
    total = 0.0
    n = 0
    while True:
        lo = n * math.pi + 1e-15
        hi = n * math.pi + math.pi / 2 - 1e-15
        e = optimize.brentq(lambda x: x * math.sin(x) - c * math.cos(x), lo, hi, xtol=1e-15, rtol=1e-15, maxiter=200)
        w = 4 * math.sin(e) ** 2 / (e * (2 * e + math.sin(2 * e)))
        k0 = special.k0(math.sqrt(p + beta * e * e))
        total += w * k0
        n += 1
        if n > 3 and k0 < 1e-17 * total:
            break
        if n > 5000:
            raise RuntimeError("Neuman series did not converge")
    return 2 * total / p


def neuman(T, S, Sy, KzKr, b, Q, r, t_d):
    sigma = S / Sy
    beta = KzKr * r * r / (b * b)
    out = []
    for t in t_d:
        ts = T * t / (S * r * r)
        a = math.log(2) / ts
        sD = a * sum(STEHFEST16[i] * neuman_transform((i + 1) * a, sigma, beta) for i in range(16))
        out.append(Q / (4 * math.pi * T) * sD)
    return np.array(out)


def papadopulos_cooper_pumped(T, S, rc, rw, skin, Q, t_d):
    T, S, rc, rw, skin, Q = (mp.mpf(v) for v in (T, S, rc, rw, skin, Q))

    def F(p):
        x = rw * mp.sqrt(S * p / T)
        k0 = mp.besselk(0, x)
        k1 = mp.besselk(1, x)
        face = k0 + skin * x * k1
        return Q * face / (p * (2 * mp.pi * T * x * k1 + mp.pi * rc * rc * p * face))

    return np.array([float(mp.invertlaplace(F, mp.mpf(t), method="talbot")) for t in t_d])


def cbp_ratio(alpha, beta):
    """H/H0 of Cooper, Bredehoeft and Papadopulos (1967), integrated in v = ln u."""
    def integrand(v):
        u = math.exp(v)
        f = (u * special.j0(u) - 2 * alpha * special.j1(u)) ** 2 + (u * special.y0(u) - 2 * alpha * special.y1(u)) ** 2
        return math.exp(-beta * u * u / alpha) / f  # (1/(u f)) du = (1/f) dv
    upper = math.sqrt(alpha / beta * 50.0) if beta > 0 else 1e3
    lo = math.log(1e-8 * min(1.0, math.sqrt(alpha)))
    points = sorted(set(v for v in (math.log(math.sqrt(alpha)), 0.0, math.log(8.0)) if lo < v < math.log(upper)))
    edges = [lo] + points + [math.log(upper)]
    total = 0.0
    for a, b in zip(edges[:-1], edges[1:]):
        value, _ = integrate.quad(integrand, a, b, epsabs=0.0, epsrel=1e-11, limit=400)
        total += value
    return 8 * alpha / math.pi ** 2 * total


# ---------------------------------------------------------------- noise and writing

def white(rng, sd, n):
    return rng.normal(0.0, sd, n)


def logger_noise(rng, sd, tau_min, t_min):
    """Logger-like noise at times t (min): sensor noise (white, standard deviation sd) plus a drift, an
    Ornstein-Uhlenbeck process (the continuous AR(1)) of standard deviation sd/2 and correlation time tau (min),
    so that readings close in time share part of their error."""
    t = np.asarray(t_min, dtype=float)
    drift = np.empty_like(t)
    drift[0] = rng.normal(0.0, sd / 2)
    for k in range(1, len(t)):
        rho = math.exp(-(t[k] - t[k - 1]) / tau_min)
        drift[k] = rho * drift[k - 1] + (sd / 2) * math.sqrt(1 - rho * rho) * rng.normal()
    return drift + rng.normal(0.0, sd, len(t))


def log_times(first, last, n, decimals=2):
    return np.unique(np.round(np.geomspace(first, last, n), decimals))


def write_csv(path, header, rows):
    os.makedirs(os.path.dirname(path), exist_ok=True)
    with open(path, "w", newline="") as handle:
        writer = csv.writer(handle, lineterminator="\n")
        writer.writerow(header)
        writer.writerows(rows)
    return os.path.relpath(path, ROOT).replace(os.sep, "/")


def depth_rows(t_min, depth, time_decimals=2):
    return [(f"{t:.{time_decimals}f}", f"{d:.3f}") for t, d in zip(t_min, depth)]


def folder(which):
    return DEMO_DIR if which == "demo" else SECOND_DIR


# ---------------------------------------------------------------- 1. constant rate, one observation well

def constant_rate(which, p, rng):
    t_min = log_times(0.5, p["duration"], 64)
    s = theis(p["T"], p["S"], p["rate"], p["distance"], t_min / MIN_PER_DAY) + white(rng, p["noise"], len(t_min))
    file = write_csv(os.path.join(folder(which), f"constant-rate-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + s))
    return {"data": {"obs": file}}


# ---------------------------------------------------------------- 2. several observation wells

def multi_well(which, p, rng):
    t_min = log_times(1.0, p["duration"], 46)
    files = {}
    for k, (name, r, static) in enumerate(p["wells"], start=1):
        s = theis(p["T"], p["S"], p["rate"], r, t_min / MIN_PER_DAY) + logger_noise(rng, p["noise"], p["tau"], t_min)
        files[f"obs{k}"] = write_csv(os.path.join(folder(which), f"multi-well-{name.lower()}.csv"),
                                     ["elapsed_min", "depth_to_water_m"], depth_rows(t_min, static + s))
    return {"data": files}


# ---------------------------------------------------------------- 3. leaky aquifer with aquitard storage

def leaky(which, p, rng):
    t_min = log_times(0.5, p["duration"], 56)
    s = hantush_storage(p["T"], p["S"], p["B"], p["Sa"], p["rate"], p["distance"], t_min / MIN_PER_DAY)
    s = s + white(rng, p["noise"], len(t_min))
    file = write_csv(os.path.join(folder(which), f"leaky-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + s))
    return {"data": {"obs": file}}


# ---------------------------------------------------------------- 4. unconfined, delayed yield

def unconfined(which, p, rng):
    t_min = log_times(0.2, p["duration"], 52)
    linear = neuman(p["T"], p["S"], p["Sy"], p["KzKr"], p["thickness"], p["rate"], p["distance"], t_min / MIN_PER_DAY)
    b = p["thickness"]
    observed = b - np.sqrt(b * b - 2 * b * linear)  # inverse of Jacob's s' = s - s^2/(2b)
    observed = observed + white(rng, p["noise"], len(t_min))
    file = write_csv(os.path.join(folder(which), f"unconfined-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + observed))
    return {"data": {"obs": file}, "largestLinearDrawdown": float(np.max(linear))}


# ---------------------------------------------------------------- 5. pumped well, well-bore storage and skin

def wellbore(which, p, rng):
    t_min = log_times(0.1, p["duration"], 60)
    s = papadopulos_cooper_pumped(p["T"], p["S"], p["casing_radius"], p["well_radius"], p["skin"], p["rate"], t_min / MIN_PER_DAY)
    s = s + logger_noise(rng, p["noise"], p["tau"], t_min)
    file = write_csv(os.path.join(folder(which), f"wellbore-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + s))
    return {"data": {"pumped": file}}


# ---------------------------------------------------------------- 6. recovery after a constant-rate test

def recovery(which, p, rng):
    tp = p["pumping_duration"]
    pumping = log_times(0.5, tp, 34)
    after = log_times(0.5, p["recovery_duration"], 34)
    t_min = np.concatenate([pumping, tp + after])
    unit = lambda tau: theis(p["T"], p["S"], 1.0, p["distance"], tau)
    s = superposed(unit, [(0.0, p["rate"]), (tp / MIN_PER_DAY, 0.0)], t_min / MIN_PER_DAY) + white(rng, p["noise"], len(t_min))
    file = write_csv(os.path.join(folder(which), f"recovery-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + s))
    return {"data": {"obs": file}}


# ---------------------------------------------------------------- 7. step-drawdown test

def step_test(which, p, rng):
    dur = p["step_duration"]
    within = np.array([1, 2, 3, 4, 6, 8, 10, 13, 16, 20, 25, 30, 40, 50, 60, 70, 80, 90, 100, 110, 120], dtype=float)
    within = within[within <= dur]
    if within[-1] != dur:
        within = np.append(within, dur)
    rates = p["rates"]
    t_min = np.concatenate([k * dur + within for k in range(len(rates))])
    steps = [(k * dur / MIN_PER_DAY, q) for k, q in enumerate(rates)]
    unit = lambda tau: theis(p["T"], p["S"], 1.0, p["well_radius"], tau)
    formation = superposed(unit, steps, t_min / MIN_PER_DAY)
    rate_now = np.array([rates[min(int((t - 1e-9) // dur), len(rates) - 1)] for t in t_min])
    s = formation + p["C"] * rate_now ** 2 + white(rng, p["noise"], len(t_min))
    file = write_csv(os.path.join(folder(which), f"step-test-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + s))
    # The formation-loss coefficient at dt of pumping (Theis at the well face, per m3/d), the B of
    # Hantush-Bierschenk with dt = one step.
    B_dt = float(theis(p["T"], p["S"], 1.0, p["well_radius"], [dur / MIN_PER_DAY])[0])
    return {"data": {"levels": file}, "B_dt": B_dt}


# ---------------------------------------------------------------- 8. slug test

def slug(which, p, rng):
    t_s = log_times(0.5, p["duration_s"], 58, decimals=1)
    alpha = p["well_radius"] ** 2 * p["S"] / p["casing_radius"] ** 2
    ratio = np.array([cbp_ratio(alpha, p["T"] * (t / 86400.0) / p["casing_radius"] ** 2) for t in t_s])
    H = p["initial_displacement"] * ratio + white(rng, p["noise"], len(t_s))
    file = write_csv(os.path.join(folder(which), f"slug-{p['slug']}.csv"), ["elapsed_s", "displacement_m"],
                     [(f"{t:.1f}", f"{h:.3f}") for t, h in zip(t_s, H)])
    return {"data": {"slug": file}, "K": p["T"] / p["thickness"], "alpha": alpha}


# ---------------------------------------------------------------- 9. barrier boundary

def barrier(which, p, rng):
    t_min = log_times(0.5, p["duration"], 60)
    ox, oy = p["obs_x"], p["obs_y"]
    theta = math.radians(p["boundary_angle"])
    # Image of the pumped well (at the origin) across the line at perpendicular distance d along theta.
    ix, iy = 2 * p["boundary_distance"] * math.cos(theta), 2 * p["boundary_distance"] * math.sin(theta)
    r = math.hypot(ox, oy)
    ri = math.hypot(ix - ox, iy - oy)
    t_d = t_min / MIN_PER_DAY
    s = theis(p["T"], p["S"], p["rate"], r, t_d) + theis(p["T"], p["S"], p["rate"], ri, t_d)
    s = s + logger_noise(rng, p["noise"], p["tau"], t_min)
    file = write_csv(os.path.join(folder(which), f"barrier-{p['slug']}.csv"), ["elapsed_min", "depth_to_water_m"],
                     depth_rows(t_min, p["static_depth"] + s))
    return {"data": {"obs": file}, "r": r, "ri": ri}


# ---------------------------------------------------------------- 10. raw logger with a barometric record

def iso(moment):
    return moment.strftime("%Y-%m-%dT%H:%M:%SZ")


def raw_logger(which, p, rng):
    # Sensor noise of 4 mm: about 0.05 % of the full scale of a 10 m pressure transducer, a common
    # specification (common practice, no source).
    start = datetime.fromisoformat(p["pump_on"]).replace(tzinfo=timezone.utc)
    pre_min = p["pre_test_hours"] * 60.0
    # Water-level logger: every 15 min before the test, then a logarithmic schedule once the pump starts.
    before = np.arange(-pre_min, 0.0, 15.0)
    during = np.concatenate([np.arange(0.5, 10.0, 0.5), np.arange(10.0, 60.0, 1.0), np.arange(60.0, p["duration"] + 1e-9, 5.0)])
    t_min = np.concatenate([before, [0.0], during])
    # Barometer: every 15 min over the whole record, a daily swing and a weather front.
    baro_t = np.arange(-pre_min, p["duration"] + 15.0, 15.0)

    def pressure(t):
        hours = np.asarray(t, dtype=float) / 60.0
        daily = p["baro_daily_kpa"] * np.sin(2 * math.pi * (hours + p["baro_phase_h"]) / 24.0)
        fronts = sum(change * 0.5 * (1 + np.tanh((hours - at) / width)) for change, at, width in p["baro_fronts"])
        return p["baro_mean_kpa"] + daily + fronts

    # The barometer reports to 0.01 kPa; its rounding is its only noise here.
    baro = np.round(pressure(baro_t), 2)
    # The aquifer sees the barometer's pressure; the water level falls by BE times its rise as a water
    # column (1 kPa = 1000 / 9806.65 m of water), relative to the pressure at the first reading.
    w = pressure(t_min) * 1000.0 / 9806.65
    w0 = pressure(t_min[:1])[0] * 1000.0 / 9806.65
    drawdown = theis(p["T"], p["S"], p["rate"], p["distance"], np.maximum(t_min, 0.0) / MIN_PER_DAY)
    trend = p["trend_m_per_day"] * (t_min / MIN_PER_DAY)
    depth = p["static_depth"] + trend + p["BE"] * (w - w0) + drawdown + logger_noise(rng, p["noise"], p["tau"], t_min)
    rows = []
    missing = set(p["missing_rows"])
    for k, (t, d) in enumerate(zip(t_min, depth)):
        moment = start + timedelta(minutes=float(t))
        rows.append((iso(moment), "" if k in missing else f"{d:.3f}"))
    files = {
        "levels": write_csv(os.path.join(folder(which), f"raw-logger-{p['slug']}-levels.csv"), ["timestamp", "depth_to_water_m"], rows),
        "baro": write_csv(os.path.join(folder(which), f"raw-logger-{p['slug']}-barometer.csv"), ["timestamp", "pressure_kPa"],
                          [(iso(start + timedelta(minutes=float(t))), f"{v:.2f}") for t, v in zip(baro_t, baro)]),
    }
    # Flow meter readings from the field sheet: pump on, readings through the test, pump off (rate 0).
    meter_t = np.concatenate([[0.0], np.arange(30.0, p["duration"], 180.0)])
    meter = p["rate"] * (1 + white(rng, 0.004, len(meter_t)))
    meter_rows = [(iso(start + timedelta(minutes=float(t))), f"{q:.0f}") for t, q in zip(meter_t, meter)]
    meter_rows.append((iso(start + timedelta(minutes=float(p["duration"]))), "0"))
    files["pumping"] = write_csv(os.path.join(folder(which), f"raw-logger-{p['slug']}-pumping.csv"), ["timestamp", "rate_m3_per_d"], meter_rows)
    return {"data": files, "meanMeteredRate": float(np.mean(np.round(meter)))}


# ---------------------------------------------------------------- the scenarios (all invented)

SCENARIOS = {
    "constant-rate-test": (constant_rate, {
        "demo": {"slug": "wrenfield-wf-ob1", "site": "Wrenfield Common (invented)", "pumped_well": "WF-PW1", "observation_well": "WF-OB1",
                 "rate": 1150.0, "distance": 32.0, "static_depth": 9.84, "duration": 1440.0,
                 "T": 410.0, "S": 1.6e-4, "noise": 0.003, "seed": 1401},
        "second": {"slug": "harrow-lea-hl-ob2", "site": "Harrow Lea (invented)", "pumped_well": "HL-PW1", "observation_well": "HL-OB2",
                   "rate": 680.0, "distance": 55.0, "static_depth": 21.37, "duration": 2000.0,
                   "T": 150.0, "S": 4.5e-4, "noise": 0.004, "seed": 1402},
    }),
    "multi-well-test": (multi_well, {
        "demo": {"site": "Saltcote Levels (invented)", "pumped_well": "SL-PW1", "rate": 2100.0, "duration": 2880.0, "T": 890.0, "S": 3.1e-4,
                 "wells": [("SL-OB1", 18.0, 6.21), ("SL-OB2", 62.0, 6.48), ("SL-OB3", 150.0, 6.95)],
                 "noise": 0.003, "tau": 4.0, "seed": 1403},
        "second": {"site": "Pell Green (invented)", "pumped_well": "PG-PW2", "rate": 950.0, "duration": 1800.0, "T": 260.0, "S": 8.0e-5,
                   "wells": [("PG-OB1", 12.0, 14.02), ("PG-OB2", 40.0, 13.66), ("PG-OB3", 110.0, 13.91)],
                   "noise": 0.003, "tau": 4.0, "seed": 1404},
    }),
    "leaky-aquifer-test": (leaky, {
        "demo": {"slug": "ashby-fen-af-ob1", "site": "Ashby Fen (invented)", "pumped_well": "AF-PW1", "observation_well": "AF-OB1", "aquitard_thickness": 6.0,
                 "rate": 1300.0, "distance": 60.0, "static_depth": 4.17, "duration": 4320.0,
                 "T": 620.0, "S": 2.0e-4, "B": 320.0, "Sa": 4.0e-3, "noise": 0.003, "seed": 1405},
        "second": {"slug": "cole-marsh-cm-ob3", "site": "Cole Marsh (invented)", "pumped_well": "CM-PW1", "observation_well": "CM-OB3", "aquitard_thickness": 4.0,
                   "rate": 800.0, "distance": 35.0, "static_depth": 7.55, "duration": 2880.0,
                   "T": 280.0, "S": 1.2e-4, "B": 210.0, "Sa": 2.0e-3, "noise": 0.003, "seed": 1406},
    }),
    "unconfined-aquifer-test": (unconfined, {
        "demo": {"slug": "tarn-hollow-th-ob1", "site": "Tarn Hollow (invented)", "pumped_well": "TH-PW1", "observation_well": "TH-OB1",
                 "rate": 1100.0, "distance": 20.0, "static_depth": 3.62, "duration": 5760.0, "thickness": 18.0,
                 "T": 350.0, "S": 1.5e-3, "Sy": 0.12, "KzKr": 0.25, "noise": 0.003, "seed": 1407},
        "second": {"slug": "mire-end-me-ob2", "site": "Mire End (invented)", "pumped_well": "ME-PW1", "observation_well": "ME-OB2",
                   "rate": 700.0, "distance": 30.0, "static_depth": 2.18, "duration": 4320.0, "thickness": 24.0,
                   "T": 520.0, "S": 8.0e-4, "Sy": 0.18, "KzKr": 0.1, "noise": 0.003, "seed": 1408},
    }),
    "pumped-well-storage-skin": (wellbore, {
        "demo": {"slug": "brockwell-bq-pw3", "site": "Brockwell Quarry (invented)", "pumped_well": "BQ-PW3",
                 "rate": 260.0, "casing_radius": 0.1, "well_radius": 0.1, "static_depth": 17.45, "duration": 1440.0,
                 "T": 60.0, "S": 3.0e-4, "skin": 4.0, "noise": 0.005, "tau": 2.0, "seed": 1409},
        "second": {"slug": "fold-farm-ff-pw1", "site": "Fold Farm (invented)", "pumped_well": "FF-PW1",
                   "rate": 430.0, "casing_radius": 0.125, "well_radius": 0.1, "static_depth": 11.02, "duration": 1200.0,
                   "T": 140.0, "S": 1.0e-4, "skin": 2.0, "noise": 0.005, "tau": 2.0, "seed": 1410},
    }),
    "recovery-test": (recovery, {
        "demo": {"slug": "moss-ridge-mr-ob1", "site": "Moss Ridge (invented)", "pumped_well": "MR-PW2", "observation_well": "MR-OB1",
                 "rate": 840.0, "distance": 14.0, "static_depth": 15.26, "pumping_duration": 720.0,
                 "recovery_duration": 720.0, "T": 230.0, "S": 2.0e-4, "noise": 0.003, "seed": 1411},
        "second": {"slug": "lowick-lw-ob2", "site": "Lowick Carr (invented)", "pumped_well": "LW-PW1", "observation_well": "LW-OB2",
                   "rate": 1500.0, "distance": 25.0, "static_depth": 8.90, "pumping_duration": 1000.0,
                   "recovery_duration": 600.0, "T": 610.0, "S": 3.5e-4, "noise": 0.003, "seed": 1412},
    }),
    "step-drawdown-test": (step_test, {
        "demo": {"slug": "orchard-row-or-pw1", "site": "Orchard Row (invented)", "pumped_well": "OR-PW1",
                 "rates": [400.0, 700.0, 1000.0, 1300.0], "step_duration": 100.0, "well_radius": 0.15,
                 "static_depth": 12.08, "T": 180.0, "S": 5.0e-4, "C": 1.5e-6, "noise": 0.008, "seed": 1413},
        "second": {"slug": "beck-side-bs-pw2", "site": "Beck Side (invented)", "pumped_well": "BS-PW2",
                   "rates": [250.0, 500.0, 750.0, 1000.0], "step_duration": 120.0, "well_radius": 0.1,
                   "static_depth": 6.43, "T": 95.0, "S": 2.0e-4, "C": 4.0e-6, "noise": 0.008, "seed": 1414},
    }),
    "slug-test": (slug, {
        "demo": {"slug": "quarry-lane-ql-mw4", "site": "Quarry Lane (invented)", "test_well": "QL-MW4",
                 "casing_radius": 0.025, "well_radius": 0.06, "screen_length": 3.0, "thickness": 3.0,
                 "screen_bottom_depth": 9.5, "initial_displacement": 0.62, "duration_s": 400.0,
                 "T": 3.0, "S": 2.0e-5, "noise": 0.002, "seed": 1415},
        "second": {"slug": "hob-lane-hb-mw2", "site": "Hob Lane (invented)", "test_well": "HB-MW2",
                   "casing_radius": 0.026, "well_radius": 0.075, "screen_length": 2.0, "thickness": 2.0,
                   "screen_bottom_depth": 7.0, "initial_displacement": 0.45, "duration_s": 900.0,
                   "T": 0.8, "S": 8.0e-5, "noise": 0.002, "seed": 1416},
    }),
    "barrier-boundary-test": (barrier, {
        "demo": {"slug": "flint-scar-fs-ob1", "site": "Flint Scar (invented)", "pumped_well": "FS-PW1", "observation_well": "FS-OB1",
                 "rate": 1600.0, "obs_x": -7.5, "obs_y": 13.0, "boundary_distance": 400.0, "boundary_angle": 0.0,
                 "static_depth": 10.71, "duration": 4320.0, "T": 520.0, "S": 6.0e-5, "noise": 0.003, "tau": 6.0, "seed": 1417},
        "second": {"slug": "windle-gap-wg-ob2", "site": "Windle Gap (invented)", "pumped_well": "WG-PW1", "observation_well": "WG-OB2",
                   "rate": 900.0, "obs_x": 10.0, "obs_y": -8.0, "boundary_distance": 350.0, "boundary_angle": 90.0,
                   "static_depth": 5.33, "duration": 4320.0, "T": 240.0, "S": 8.0e-5, "noise": 0.003, "tau": 6.0, "seed": 1418},
    }),
    "raw-logger-import": (raw_logger, {
        "demo": {"slug": "greyhaugh-gh-ob2", "site": "Greyhaugh (invented)", "pumped_well": "GH-PW1", "observation_well": "GH-OB2",
                 "pump_on": "2027-03-10T09:00:00", "pre_test_hours": 48.0, "duration": 1440.0, "rate": 1900.0,
                 "distance": 60.0, "static_depth": 22.814, "T": 1400.0, "S": 6.0e-5, "BE": 0.55,
                 "trend_m_per_day": -0.012, "baro_mean_kpa": 101.2, "baro_daily_kpa": 0.12, "baro_phase_h": 3.0,
                 "baro_fronts": [(-2.0, -34.0, 3.0), (1.6, -12.0, 3.0), (-1.2, 8.0, 4.0)], "noise": 0.004, "tau": 20.0,
                 "missing_rows": [61, 240], "seed": 1419},
        "second": {"slug": "stainby-sb-ob1", "site": "Stainby Edge (invented)", "pumped_well": "SB-PW3", "observation_well": "SB-OB1",
                   "pump_on": "2027-09-21T07:30:00", "pre_test_hours": 36.0, "duration": 1200.0, "rate": 1250.0,
                   "distance": 45.0, "static_depth": 14.207, "T": 700.0, "S": 1.1e-4, "BE": 0.4,
                   "trend_m_per_day": 0.02, "baro_mean_kpa": 100.4, "baro_daily_kpa": 0.1, "baro_phase_h": 8.0,
                   "baro_fronts": [(1.8, -26.0, 3.0), (-1.5, -9.0, 2.5), (0.8, 6.0, 4.0)], "noise": 0.004, "tau": 20.0,
                   "missing_rows": [33, 301], "seed": 1420},
    }),
}

# Parameters that are the truth of the generating model (the rest describe the test).
TRUTH_KEYS = ("T", "S", "B", "Sa", "Sy", "KzKr", "skin", "C", "BE")


def main():
    out = {"demo": {}, "second": {}}
    for name, (make, sets) in SCENARIOS.items():
        for which in ("demo", "second"):
            p = sets[which]
            rng = np.random.default_rng(p["seed"])
            made = make(which, p, rng)
            entry = {"scenario": {k: v for k, v in p.items() if k not in TRUTH_KEYS and k not in ("seed", "slug")},
                     "truth": {k: p[k] for k in TRUTH_KEYS if k in p}}
            entry.update(made)
            out[which][name] = entry
            print(f"{which:6} {name}: {', '.join(made['data'].values())}")
    for which, path in (("demo", os.path.join(DEMO_DIR, "demo-sets.json")), ("second", os.path.join(SECOND_DIR, "second-sets.json"))):
        os.makedirs(os.path.dirname(path), exist_ok=True)
        with open(path, "w") as handle:
            json.dump({"generator": "notebooks/templates/data/make_template_data.py", "sets": out[which]}, handle, indent=1, sort_keys=True)
            handle.write("\n")


if __name__ == "__main__":
    main()
