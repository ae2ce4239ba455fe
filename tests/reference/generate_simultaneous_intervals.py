#!/usr/bin/python3
"""Reference simultaneous confidence intervals for multinomial proportions
(core/statistics/simultaneous_intervals.cpp).

Run: /usr/bin/python3 tests/reference/generate_simultaneous_intervals.py > tests/reference/simultaneous_intervals.csv

Goodman (1965, Technometrics 7:247-254): A = scipy.stats.chi2.isf(alpha / k, 1) (SciPy 1.10),
  bounds (A + 2 x -+ sqrt(A (A + 4 x (n - x) / n))) / (2 (n + A)), in double precision.
Sison and Glaz (1995, JASA 90:366-369): NOT a published library's output. It is our own
  independent Python re-implementation of the paper, written apart from the C++ and on purpose in a
  different form: truncated Poisson moments from the factorial moments
  mu_(r) = lambda^r [F(a - r) - F(b - r - 1)] / [F(a) - F(b - 1)] (F the Poisson cdf),
  central moments from those, evaluated in mpmath at 50 significant digits (the C++ uses a
  recurrence about lambda in double precision). nu(c) = n!/(n^n e^-n) prod P(b_i <= Y_i <= a_i)
  f_e(z) / sqrt(sum sigma_i^2) with the Edgeworth density f_e; c is the first whole number >= 1
  with nu(c) > 1 - alpha, scanning up, and the intervals use c - 1 and
  gamma = (1 - alpha - nu(c - 1)) / (nu(c) - nu(c - 1)), nu(0) being the exact multinomial
  probability of x under p = x / n (the expansion needs a positive variance, so c = 0 is exact).
  Column exact_nu_c: the exact nu at the chosen c (the multinomial probability of the box, by
  convolution of truncated Poisson pmfs in double precision), shown to judge the expansion;
  blank for n > 3000.
No published example values are used: we do not recall the paper's worked numbers reliably.
"""
import sys

import mpmath
import numpy as np
import scipy
from scipy import stats

CASES = [
    # (name, counts, confidence)
    ("die", [8, 12, 9, 15, 4, 12], 0.95),
    ("die90", [8, 12, 9, 15, 4, 12], 0.90),
    ("die99", [8, 12, 9, 15, 4, 12], 0.99),
    ("small", [1, 2, 3, 4], 0.95),
    ("zero", [0, 5, 10, 25], 0.95),
    ("three", [20, 30, 50], 0.95),
    ("mendel", [315, 108, 101, 32], 0.95),
    ("seven", [56, 72, 73, 59, 62, 87, 58], 0.95),
    ("skew", [1, 1, 1, 97], 0.95),
    ("ten", [5, 11, 19, 30, 32, 40, 49, 77, 85, 522], 0.95),
    ("big", [10250, 9800, 10100, 9850], 0.95),
    ("large", [120000, 80000, 300000, 500000], 0.95),
]

mpmath.mp.dps = 50


def pois_cdf(x, lam):
    """P(Y <= x) for Y ~ Poisson(lam)."""
    if x < 0:
        return mpmath.mpf(0)
    if lam == 0:
        return mpmath.mpf(1)
    return mpmath.gammainc(x + 1, lam, mpmath.inf, regularized=True)


def truncated_moments(lam, c):
    """Central moments of Poisson(lam) truncated to [max(0, lam - c), lam + c], from factorial moments."""
    a, b = lam + c, max(0, lam - c)
    lam = mpmath.mpf(lam)
    den = pois_cdf(a, lam) - pois_cdf(b - 1, lam)
    f = [lam ** r * (pois_cdf(a - r, lam) - pois_cdf(b - r - 1, lam)) / den for r in range(1, 5)]
    mu = f[0]
    var = f[1] + mu - mu ** 2
    mu3 = f[2] + f[1] * (3 - 3 * mu) + (mu - 3 * mu ** 2 + 2 * mu ** 3)
    mu4 = f[3] + f[2] * (6 - 4 * mu) + f[1] * (7 - 12 * mu + 6 * mu ** 2) + mu - 4 * mu ** 2 + 6 * mu ** 3 - 3 * mu ** 4
    return den, mu, var, mu3, mu4


def check_moments_by_summation():
    """Guards the factorial-moment algebra: direct sums over the truncated support must agree."""
    for lam, c in [(3, 2), (7, 4), (12, 3), (0, 2), (25, 30)]:
        den, mu, var, mu3, mu4 = truncated_moments(lam, c)
        a, b = lam + c, max(0, lam - c)
        w = [mpmath.mpf(1) if lam == 0 else mpmath.exp(-lam) * mpmath.mpf(lam) ** y / mpmath.factorial(y) for y in range(b, a + 1)]
        if lam == 0:
            w = [mpmath.mpf(1 if y == 0 else 0) for y in range(b, a + 1)]
        s = mpmath.fsum(w)
        m = mpmath.fsum(y * wi for y, wi in zip(range(b, a + 1), w)) / s
        cm = [mpmath.fsum((y - m) ** r * wi for y, wi in zip(range(b, a + 1), w)) / s for r in (2, 3, 4)]
        for got, want in [(den, s), (mu, m), (var, cm[0]), (mu3, cm[1]), (mu4, cm[2])]:
            assert abs(got - want) <= mpmath.mpf("1e-30") * (1 + abs(want)), (lam, c, got, want)


def nu_edgeworth(x, c):
    n = sum(x)
    s1 = s2 = s3 = s4 = mpmath.mpf(0)
    prob = mpmath.mpf(1)
    for xi in x:
        den, mu, var, mu3, mu4 = truncated_moments(xi, c)
        prob *= den
        s1 += mu
        s2 += var
        s3 += mu3
        s4 += mu4 - 3 * var ** 2
    z = (n - s1) / mpmath.sqrt(s2)
    g1 = s3 / s2 ** mpmath.mpf(1.5)
    g2 = s4 / s2 ** 2
    poly = 1 + g1 * (z ** 3 - 3 * z) / 6 + g2 * (z ** 4 - 6 * z ** 2 + 3) / 24 + g1 ** 2 * (z ** 6 - 15 * z ** 4 + 45 * z ** 2 - 15) / 72
    fe = poly * mpmath.exp(-z ** 2 / 2) / mpmath.sqrt(2 * mpmath.pi)
    norm = mpmath.factorial(n) / (mpmath.mpf(n) ** n * mpmath.exp(-n))
    return norm * prob * fe / mpmath.sqrt(s2)


def nu_exact_zero(x):
    n = sum(x)
    v = mpmath.factorial(n)
    for xi in x:
        v *= (mpmath.mpf(xi) / n) ** xi / mpmath.factorial(xi)
    return v


def nu_exact(x, c):
    """Exact P(x_i - c <= X_i <= x_i + c for all i), X ~ multinomial(n, x / n), by convolution."""
    n = sum(x)
    if n > 3000:
        return None
    conv = np.zeros(n + 1)
    conv[0] = 1.0
    for xi in x:
        pmf = np.zeros(n + 1)
        lo, hi = max(0, xi - c), min(n, xi + c)
        ys = np.arange(lo, hi + 1)
        pmf[lo:hi + 1] = stats.poisson.pmf(ys, xi) if xi > 0 else (ys == 0).astype(float)
        conv = np.convolve(conv, pmf)[: n + 1]
    return conv[n] / stats.poisson.pmf(n, n)


def sison_glaz(x, conf):
    n = sum(x)
    prev = nu_exact_zero(x)
    for c in range(1, n + 1):
        cur = nu_edgeworth(x, c)
        if cur > conf:
            break
        prev = cur
    c0 = c - 1
    gamma = (conf - prev) / (cur - prev)
    bounds = [(max(0.0, xi / n - c0 / n), min(1.0, float(xi / n + c0 / n + 2 * gamma / n))) for xi in x]
    return c0, float(gamma), float(prev), float(cur), bounds, nu_exact(x, c0)


def goodman(x, conf):
    n, k = sum(x), len(x)
    a = stats.chi2.isf((1 - conf) / k, 1)
    out = []
    for xi in x:
        half = np.sqrt(a * (a + 4.0 * xi * (n - xi) / n))
        out.append(((a + 2 * xi - half) / (2 * (n + a)), (a + 2 * xi + half) / (2 * (n + a))))
    return out


def main():
    check_moments_by_summation()
    print("# Simultaneous intervals reference, generated by")
    print("#   /usr/bin/python3 tests/reference/generate_simultaneous_intervals.py > tests/reference/simultaneous_intervals.csv")
    print("# goodman_*: SciPy %s chi2.isf(alpha/k, 1) in Goodman's (1965) formula, double precision." % scipy.__version__)
    print("# sg_*, c, gamma, nu_c, nu_c1: OUR OWN independent Python re-implementation of Sison & Glaz (1995), not a")
    print("#   published library: factorial moments of truncated Poissons in mpmath %s at 50 digits, printed %%.17g." % mpmath.__version__)
    print("# exact_nu_c: exact coverage at c by convolution (double precision); blank for n > 3000.")
    print("# No published example values are included (not recalled reliably).")
    print("case,confidence,index,count,goodman_lower,goodman_upper,sg_lower,sg_upper,c,gamma,nu_c,nu_c1,exact_nu_c")
    for name, x, conf in CASES:
        g = goodman(x, conf)
        c0, gamma, nu0, nu1, sg, exact = sison_glaz(x, conf)
        for i, xi in enumerate(x):
            print("%s,%.17g,%d,%d,%.17g,%.17g,%.17g,%.17g,%d,%.17g,%.17g,%.17g,%s" % (
                name, conf, i, xi, g[i][0], g[i][1], sg[i][0], sg[i][1], c0, gamma, nu0, nu1,
                "" if exact is None else "%.17g" % exact))
        sys.stdout.flush()


if __name__ == "__main__":
    sys.exit(main())
