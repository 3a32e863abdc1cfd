#!/usr/bin/env python3
"""Fits the coefficients of slipscreen's E1 (src/core/hydro/well_function.cpp).

Needs python3-mpmath (Debian); only run by hand when the fits change, never by the build.

Two pieces:
  0 < u <= 1 :  E1(u) = -gamma - ln u + u * S(u),  S(u) = Ein(u)/u, Ein(u) = sum_{k>=1} (-1)^(k+1) u^k / (k k!)
                (Abramowitz & Stegun 1964, eq. 5.1.11). S is fitted by a Chebyshev economised
                polynomial (mpmath.chebyfit) to absolute error far below 1e-17.
  u >= 1     :  E1(u) = exp(-u)/u * g(u), g(u) = u e^u E1(u) in (0.59, 1), fitted as a rational
                function of t = 1/u on [0, 1] (relative error, iterated linearised least squares:
                Sanathanan-Koerner / Loeb), then written as P(u)/Q(u) with reversed coefficients.
and the two helpers the kernel needs (both Chebyshev economised, mpmath.chebyfit):
  ln m = 2 atanh s = 2s + s R(s^2), s = (m-1)/(m+1), m in [sqrt(1/2), sqrt(2)): R on [0, 0.0295]
  e^r for |r| <= ln(2)/2
Prints C++ arrays (highest-degree first, for Horner) and the fit's maximum errors.
"""
import sys
import mpmath as mp

mp.mp.dps = 60


def small_piece(deg):
    def s(u):
        if u == 0:
            return mp.mpf(1)
        return (mp.e1(u) + mp.euler + mp.log(u)) / u
    coeffs, err = mp.chebyfit(s, [0, 1], deg + 1, error=True)
    return coeffs, err


def g_of_t(t):
    if t == 0:
        return mp.mpf(1)
    u = 1 / t
    return u * mp.exp(u) * mp.e1(u)


def rational_fit(m, n, npts=400, iters=12):
    # sample points: Chebyshev nodes on [0,1] plus points uniform in log(u) on [1, 1e4]
    ts = [(1 - mp.cos(mp.pi * (i + mp.mpf(0.5)) / npts)) / 2 for i in range(npts)]
    ts += [1 / mp.power(10, mp.mpf(4) * i / npts) for i in range(npts)]
    ts.append(mp.mpf(0))
    fs = [g_of_t(t) for t in ts]
    qold = [mp.mpf(1)] * len(ts)
    sol = None
    for _ in range(iters):
        # unknowns p0..pm, q1..qn ; residual (P - f Q) / (f Qold)
        rows, rhs = [], []
        for t, f, qo in zip(ts, fs, qold):
            w = 1 / (f * qo)
            row = [w * t**k for k in range(m + 1)] + [-w * f * t**k for k in range(1, n + 1)]
            rows.append(row)
            rhs.append(w * f)
        A = mp.matrix(rows)
        b = mp.matrix(rhs)
        sol = mp.qr_solve(A, b)[0]
        p = [sol[k] for k in range(m + 1)]
        q = [mp.mpf(1)] + [sol[m + k] for k in range(1, n + 1)]
        qold = [mp.polyval(q[::-1], t) for t in ts]
    err = max(abs(mp.polyval(p[::-1], t) / mp.polyval(q[::-1], t) / f - 1) for t, f in zip(ts, fs))
    return p, q, err


def print_array(name, coeffs):
    print(f"constexpr double {name}[] = {{")
    for c in coeffs:
        print(f"    {mp.nstr(c, 20, min_fixed=1, max_fixed=0)},")
    print("};")


def helpers(deg_log=7, deg_exp=11):
    zmax = ((mp.sqrt(2) - 1) / (mp.sqrt(2) + 1)) ** 2

    def r_of_z(z):
        if z == 0:
            return mp.mpf(0)
        s = mp.sqrt(z)
        return (2 * mp.atanh(s) - 2 * s) / s
    c, e = mp.chebyfit(r_of_z, [0, zmax], deg_log + 1, error=True)
    print(f"// R(z) for ln, degree {deg_log}, max abs error of fit {mp.nstr(e, 3)}")
    print_array("kLogR", c)
    h = mp.log(2) / 2
    c, e = mp.chebyfit(mp.exp, [-h, h], deg_exp + 1, error=True)
    print(f"// e^r, degree {deg_exp}, max abs error of fit {mp.nstr(e, 3)}")
    print_array("kExp", c)


def main():
    deg_s = int(sys.argv[1]) if len(sys.argv) > 1 else 11
    m = int(sys.argv[2]) if len(sys.argv) > 2 else 10
    helpers()
    coeffs, err = small_piece(deg_s)
    print(f"// S(u), degree {deg_s}, max abs error of fit {mp.nstr(err, 3)}")
    print_array("kSmall", coeffs)
    p, q, rerr = rational_fit(m, m)
    print(f"// g(u) = P(u)/Q(u), degree {m}/{m} in u (reversed from t = 1/u), max rel error of fit {mp.nstr(rerr, 3)}")
    # P(1/u)/Q(1/u) = (sum p_k u^(m-k)) / (sum q_k u^(m-k)); Horner in u, highest power first = p_0
    print_array("kLargeP", p)
    print_array("kLargeQ", q)
    # underflow cut: smallest u with E1(u) < DBL_MIN
    dbl_min = mp.mpf(2) ** -1022
    ucut = mp.findroot(lambda u: mp.log(mp.e1(u)) - mp.log(dbl_min), 701)
    print(f"// E1(u) < DBL_MIN for u > {mp.nstr(ucut, 17)}")


if __name__ == "__main__":
    main()
