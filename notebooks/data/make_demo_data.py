#!/usr/bin/python3
"""Writes the invented demo data set of the Kestrel Moor constant-rate test.

Everything here is invented for the demonstration: the site, the wells, the rate and the aquifer.
The drawdowns come from the Hantush-Jacob leaky solution evaluated independently of Conebook's own
code with scipy (adaptive quadrature of the defining integral, about 1e-12 relative), plus seeded Gaussian logger noise, then are written as
depth-to-water readings the way a pressure logger export would give them.

Rerun with:  /usr/bin/python3 notebooks/data/make_demo_data.py
"""
import csv
import math
import os

import numpy as np
from scipy.integrate import quad

HERE = os.path.dirname(os.path.abspath(__file__))

# Invented scenario: supply borehole KM-PW1 pumped at a constant rate; two observation wells.
Q = 1450.0          # m3/d
T = 380.0           # m2/d
S = 3.5e-4          # dimensionless
B = 900.0           # leakage factor, m
DURATION_MIN = 2880.0
NOISE_SD = 0.003    # m, logger noise
WELLS = [
    # name, distance from KM-PW1 (m), static depth to water (m below top of casing)
    ("KM-OB1", 28.0, 12.43),
    ("KM-OB2", 85.0, 13.07),
]


def hantush_w(u, rb):
    """W(u, r/B) = integral from u to infinity of exp(-y - rb^2/(4y))/y dy (Hantush and Jacob 1955).

    With y = u e^x the integrand becomes exp(-u e^x - rb^2 / (4 u e^x)) on x in [0, infinity)."""
    f = lambda x: math.exp(-u * math.exp(x) - rb * rb / (4.0 * u * math.exp(x)))
    upper = math.log(800.0 / u) if u < 800.0 else 1.0
    value, _ = quad(f, 0.0, max(upper, 1.0), epsabs=0.0, epsrel=1e-12, limit=200)
    return value


def main():
    rng = np.random.default_rng(20261201)
    minutes = np.unique(np.round(np.geomspace(0.5, DURATION_MIN, 70), 2))
    for name, r, static_dtw in WELLS:
        rows = []
        for t_min in minutes:
            t_d = t_min / 1440.0
            u = r * r * S / (4.0 * T * t_d)
            s = Q / (4.0 * math.pi * T) * hantush_w(u, r / B)
            s_obs = s + rng.normal(0.0, NOISE_SD)
            rows.append((f"{t_min:.2f}", f"{static_dtw + s_obs:.3f}"))
        path = os.path.join(HERE, f"kestrel-moor-{name.lower()}.csv")
        with open(path, "w", newline="") as handle:
            writer = csv.writer(handle, lineterminator="\n")
            writer.writerow(["elapsed_min", "depth_to_water_m"])
            writer.writerows(rows)
        print(f"wrote {path}: {len(rows)} readings, r = {r} m, static depth to water {static_dtw} m")


if __name__ == "__main__":
    main()
