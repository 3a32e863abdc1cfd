#!/usr/bin/python3
"""Reference values of the Hantush & Jacob (1955) leaky well function for tests/core/hydro/hantush_test.cpp.

W(u, b) = integral from u to infinity of exp(-y - b^2/(4y))/y dy, by scipy.integrate.quad of that
integrand (no change of variable), split at u*10^k up to 1 so that each piece is well scaled, and
2*K0(b) from scipy.special.k0. Reads "u b" pairs from stdin (one per line), prints
"u b W quad_error 2K0(b)" with 17 significant digits.
"""
import math
import sys

from scipy import integrate, special


def leaky(u, b):
    f = lambda y: math.exp(-y - b * b / (4.0 * y)) / y
    edges = [u]
    while edges[-1] * 10.0 < max(1.0, 10.0 * u) and edges[-1] < 1.0:
        edges.append(edges[-1] * 10.0)
    total, err = 0.0, 0.0
    for a, c in zip(edges, edges[1:]):
        v, e = integrate.quad(f, a, c, epsabs=0.0, epsrel=2e-14, limit=400)
        total, err = total + v, err + e
    v, e = integrate.quad(f, edges[-1], math.inf, epsabs=0.0, epsrel=2e-14, limit=400)
    return total + v, err + e


for line in sys.stdin:
    if not line.strip():
        continue
    u, b = (float(x) for x in line.split())
    w, e = leaky(u, b)
    print("%.17g %.17g %.17g %.3g %.17g" % (u, b, w, e, 2.0 * special.k0(b)))
