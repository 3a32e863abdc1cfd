#!/usr/bin/python3
"""Reference values of the Rudnicki (1986) constant-rate fluid point source for
tests/core/poro/rudnicki_test.cpp, by numerical integration of the instantaneous source.

Instantaneous injection of a fluid volume V at the origin at t = 0 into an infinite poroelastic
solid (Rudnicki 1986; Rice & Cleary 1976): the pore pressure is the Gaussian of 3-D diffusion,
    p_i(r, t) = V / S * (4 pi c t)^(-3/2) * exp(-r^2 / (4 c t)),   S = kappa / c,
and the displacement is u = grad(Phi) with laplacian(Phi) = (eta/G) p_i, so the stress (tension
positive) is
    sigma_ij = 2 eta [(p_i - 3 m_i/r^3) n_i n_j - (p_i - m_i/r^3) delta_ij],  m_i = int_0^r s^2 p_i ds.
A constant rate q from t = 0 is the time integral of q times the instantaneous source. This
script takes that integral (and the one for m_i) with scipy.integrate.quad, nothing in closed
form, so it checks the erfc/g(xi) forms of src/core/poro/rudnicki.hpp independently.

Reads "c kappa eta r t" per line from stdin; prints "p a_delta a_nn err" for q = 1 with the
stress in compression-positive form Delta sigma = a_delta I + a_nn n n^T (so a_delta =
2 eta (p - m/r^3), a_nn = -2 eta (p - 3 m/r^3)), and err the largest quad error estimate
relative to p.
"""
import math
import sys

from scipy import integrate


def reference(c, kappa, eta, r, t):
    S = kappa / c

    def p_inst(s, tau):
        return (4.0 * math.pi * c * tau) ** -1.5 * math.exp(-s * s / (4.0 * c * tau)) / S

    # p_i(r, tau) < e^(-700) of its peak for tau < t0 = r^2/(4c 700): that part is left out
    t0 = min(t, r * r / (4.0 * c) / 700.0)
    kw = dict(epsabs=0.0, epsrel=1e-13, limit=400)
    # in log time: the integrand rises and falls over a few e-folds around r^2/(6c)
    p, ep = integrate.quad(lambda lt: p_inst(r, math.exp(lt)) * math.exp(lt), math.log(t0), math.log(t), **kw) \
        if t > t0 else (0.0, 0.0)

    def m_inst(tau):
        v, _ = integrate.quad(lambda s: s * s * p_inst(s, tau), 0.0, r, **kw)
        return v

    # (m_i takes V = 1 here: the rate q = 1 times d tau)

    # m_i(tau) falls from V/(4 pi S) (all the fluid within r) to 0 as the Gaussian spreads: smooth in
    # log(tau), so the time integral is taken in log time down to lo; below lo the fluid outside r
    # is a fraction below e^(-1e6), so that part is lo/(4 pi S) exactly to rounding.
    lo = min(t, r * r / (4.0 * c) * 1e-6)
    m, em = integrate.quad(lambda lt: m_inst(math.exp(lt)) * math.exp(lt), math.log(lo), math.log(t), **kw) \
        if t > lo else (0.0, 0.0)
    m += lo / (4.0 * math.pi * S)
    a_delta = 2.0 * eta * (p - m / r**3)
    a_nn = -2.0 * eta * (p - 3.0 * m / r**3)
    return p, a_delta, a_nn, max(ep / p if p > 0 else ep, em / m)


for line in sys.stdin:
    if not line.strip():
        continue
    c, kappa, eta, r, t = (float(x) for x in line.split())
    print("%.17g %.17g %.17g %.3g" % reference(c, kappa, eta, r, t))
