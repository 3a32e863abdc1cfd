#!/usr/bin/env python3
"""Reference values for tests/core/geomech/orientation_search_test.cpp (the poroelastic path).

An implementation independent of the C++ code: for a plane with unit normal n, the stress after a
pore-pressure change x along the uniaxial-strain path is S + kappa*x*diag(1, 1, 0) (NED) and
CFF(x) = |t - sn n| - mu (sn - p0 - x) - c with t = S(x) n, sn = n.t. Its root is found with
scipy.optimize.brentq (not the quadratic the C++ code solves): the smallest root > 0 when
CFF(0) < 0, else the largest root <= 0 (bracketed by the minimum of the convex CFF, found with
scipy.optimize.minimize_scalar). The minimum over planes is found by a 0.5 deg grid over
strike and dip, then scipy.optimize.minimize (Nelder-Mead, tight tolerances) from the 12 best
nodes. Run with /usr/bin/python3 (scipy 1.10.1, numpy 1.24.2 when the values were recorded).
"""
import math

import numpy as np
from scipy.optimize import brentq, minimize, minimize_scalar

DEG = math.pi / 180.0


def tensor(sv, shmax, shmin, az_deg):
    a = az_deg * DEG
    c, s = math.cos(a), math.sin(a)
    t = np.zeros((3, 3))
    t[0, 0] = shmax * c * c + shmin * s * s
    t[1, 1] = shmax * s * s + shmin * c * c
    t[0, 1] = t[1, 0] = (shmax - shmin) * s * c
    t[2, 2] = sv
    return t


def normal(strike, dip):
    return np.array([-math.sin(dip) * math.sin(strike), math.sin(dip) * math.cos(strike), -math.cos(dip)])


def cff(stress, p0, mu, c, kappa, n, x):
    s = stress + kappa * x * np.diag([1.0, 1.0, 0.0])
    t = s @ n
    sn = float(n @ t)
    tau = float(np.linalg.norm(t - sn * n))
    return tau - mu * (sn - (p0 + x)) - c


def dp_crit(stress, p0, mu, c, kappa, n):
    f = lambda x: cff(stress, p0, mu, c, kappa, n, x)
    f0 = f(0.0)
    scale = float(np.max(np.abs(stress)))
    if f0 < 0.0:  # smallest root > 0 (CFF is convex in x: at most one)
        hi = 1e-3 * scale
        while f(hi) < 0.0:
            hi *= 2.0
            if hi > 1e6 * scale:
                return math.inf
        return brentq(f, 0.0, hi, xtol=1e-9, rtol=1e-15, maxiter=500)
    if f0 == 0.0:
        return 0.0
    # largest root <= 0: CFF is convex, so it rises monotonically from its minimum m on
    # [-1e3 scale, 0] to 0; the root is in [m, 0], or there is none (-inf) when CFF(m) > 0.
    lo = -1e3 * scale
    m = minimize_scalar(f, bounds=(lo, 0.0), method="bounded", options={"xatol": 1e-6}).x
    m = lo if f(lo) <= f(m) else m
    if f(m) > 0.0:
        return -math.inf
    return brentq(f, m, 0.0, xtol=1e-9, rtol=1e-15, maxiter=500)


def minimum(stress, p0, mu, c, kappa):
    g = lambda v: dp_crit(stress, p0, mu, c, kappa, normal(v[0], v[1]))
    nodes = [(s * DEG, d * DEG) for s in np.arange(0.0, 360.0, 0.5) for d in np.arange(0.0, 90.001, 0.5)]
    values = np.array([g(v) for v in nodes])
    best = math.inf
    for i in np.argsort(values)[:12]:
        r = minimize(g, np.array(nodes[i]), method="Nelder-Mead",
                     options={"xatol": 1e-12, "fatol": 1e-7, "maxiter": 20000, "maxfev": 40000})
        best = min(best, float(r.fun))
    return best


STATES = [
    # name, (sv, shmax, shmin, azimuth deg), p0, mu, c, kappa  (Pa; invented test states)
    ("normal, below failure", (70e6, 55e6, 45e6, 25.0), 30e6, 0.6, 0.0, 0.5),
    ("strike-slip, Shmin 10 kPa below Sv", (60e6, 75e6, 59.99e6, 25.0), 30e6, 0.6, 0.0, 0.67),
    ("normal, SHmax 10 kPa below Sv", (70e6, 69.99e6, 45e6, 25.0), 30e6, 0.6, 0.0, 0.9),
    ("reverse with cohesion", (60e6, 100e6, 70e6, 110.0), 30e6, 0.7, 1e6, 0.3),
    ("normal, already critical", (70e6, 50e6, 35e6, 25.0), 30e6, 0.6, 0.0, 0.5),
]

if __name__ == "__main__":
    for name, (sv, hmax, hmin, az), p0, mu, c, kappa in STATES:
        v = minimum(tensor(sv, hmax, hmin, az), p0, mu, c, kappa)
        print(f"{name}: min dp_crit = {v:.4f} Pa")
