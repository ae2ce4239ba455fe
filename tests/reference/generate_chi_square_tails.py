#!/usr/bin/python3
"""Reference grid of chi-square tail probabilities at 50 significant digits (mpmath).

Run:  /usr/bin/python3 tests/reference/generate_chi_square_tails.py > tests/reference/chi_square_tails.csv

For X ~ chi2(df) and statistic x the upper tail is Q(df/2, x/2) and the lower tail P(df/2, x/2)
(regularized incomplete gamma). The tail that is below 1/2 is computed directly and the other
one as 1 - (it) with log1p, so neither loses digits:
  x/2 >= df/2: Q from mpmath.gammainc(a, z, inf, regularized=True);
  x/2 <  df/2: P from the power series P = z^a e^-z / Gamma(a+1) * sum_k z^k / ((a+1)...(a+k))
               (Abramowitz and Stegun 6.5.29), summed here in mpmath (mpmath's own lower gamma
               gives up on its series for a ~ 5e5).
Besides the regular grid (x rounded to six significant digits) two sets of hard cases, x kept to
thirteen significant digits:
  near the centre for df 1e4 to 1e6: x = df + k sqrt(2 df) for small k, and x = df + 2 +- a
  little (x/2 = a + 1 is where the code switches from the series for P to the fraction for Q);
  the far tails where p is a normal double just above the underflow, log10 p in -300.5 to -307.6,
  for df 1 to 1e6 and both tails: x found by safeguarded Newton steps on ln(tail) in mpmath
  (the lower tail only where that x is a normal double).
Every value is computed twice, at 50 and at 70 digits, and the script stops unless both agree
to 30 significant digits. The x column is the exact double the test reads (Python repr), and
mpmath takes that double exactly, so the reference answers exactly the question the code sees.
"""
import sys
import mpmath

DFS = [0.5, 1, 1.5, 2, 2.5, 3, 4, 5, 7.5, 10, 17, 30, 50, 100, 250.5, 1000, 3000,
       1e4, 3e4, 1e5, 3e5, 1e6]
LOWER_FRACTIONS = [1e-8, 1e-4, 0.01, 0.1, 0.3, 0.6]
SIGMAS = [-3, -2, -1, -0.5, 0, 0.25, 0.5, 1, 2, 3, 5, 8, 12, 20, 35, 60]
UPPER_MULTIPLES = [1.5, 2, 3, 5, 10]
ABSOLUTE = [50, 200, 700, 1400, 1500, 3000, 1e4, 1e5, 1e6, 1e7]


def statistics_for(df):
    xs = set()
    for f in LOWER_FRACTIONS:
        xs.add(df * f)
    for k in SIGMAS:
        xs.add(df + k * (2 * df) ** 0.5)
    for m in UPPER_MULTIPLES:
        xs.add(df * m)
    for v in ABSOLUTE:
        if v > df:
            xs.add(v)
    # six significant digits keep the file readable; the rounded double is what is stored
    out = {float('%.6g' % x) for x in xs if x > 0 and x <= 1e7}
    return sorted(out | set(hard_statistics(df)))


CENTRE_DFS = [1e4, 3e4, 1e5, 3e5, 1e6]
CENTRE_SIGMAS = [-1.5, -0.7, -0.3, -0.1, -0.02, 0.02, 0.1, 0.3, 0.7, 1.5]
CENTRE_OFFSETS = [1.9, 1.999999, 2.000001, 2.1]  # x - df, around x/2 = a + 1
FAR_DFS = [1, 2, 3, 5, 10, 30, 100, 1000, 1e4, 1e5, 1e6]
FAR_LOG10 = [-300.5, -303.7, -306.9, -307.6]


def hard_statistics(df):
    xs = set()
    if df in CENTRE_DFS:
        for k in CENTRE_SIGMAS:
            xs.add(df + k * (2 * df) ** 0.5)
        for d in CENTRE_OFFSETS:
            xs.add(df + d)
    if df in FAR_DFS:
        for target in FAR_LOG10:
            for upper in (True, False):
                x = far_tail_statistic(df, target, upper)
                if x is not None:
                    xs.add(x)
    return sorted({float('%.13g' % x) for x in xs})


def log_tail(a, z, upper):
    """ln Q(a, z) (upper) or ln P(a, z), at the working precision."""
    if upper:
        if z >= a:
            return mpmath.log(mpmath.gammainc(a, z, mpmath.inf, regularized=True))
        return mpmath.log1p(-lower_series(a, z))
    if z < a:
        return mpmath.log(lower_series(a, z))
    return mpmath.log1p(-mpmath.gammainc(a, z, mpmath.inf, regularized=True))


def far_tail_statistic(df, log10_target, upper):
    """The x (a double) where the upper or lower tail has log10 = log10_target, or None."""
    with mpmath.workdps(30):
        a = mpmath.mpf(df) / 2
        target = mpmath.mpf(log10_target) * mpmath.log(10)
        f = lambda z: log_tail(a, z, upper) - target
        # bracket: f falls in z for the upper tail and rises for the lower one
        if upper:
            lo, hi = a, a + 1
            while f(hi) > 0:
                lo, hi = hi, a + 2 * (hi - a)
        else:
            lo, hi = a / 2, a
            while f(lo) > 0:
                hi, lo = lo, lo / 2 ** 16
                if lo < mpmath.mpf('1e-300'):
                    return None
        # Newton steps in y = ln z, kept inside the bracket (bisection in y otherwise)
        y_lo, y_hi = mpmath.log(lo), mpmath.log(hi)
        y = (y_lo + y_hi) / 2
        for _ in range(200):
            z = mpmath.exp(y)
            v = f(z)
            if abs(v) < mpmath.mpf(10) ** -20:
                break
            if (v > 0) == upper:
                y_lo = y
            else:
                y_hi = y
            # d ln(tail) / d ln z = -+ z^a e^-z / Gamma(a) / tail
            slope = mpmath.exp(a * y - z - mpmath.loggamma(a) - (v + target))
            step = y + v / slope if upper else y - v / slope
            y = step if y_lo < step < y_hi else (y_lo + y_hi) / 2
        x = float(2 * mpmath.exp(y))
        return x if x > 1e-300 else None


def lower_series(a, z):
    s = mpmath.mpf(1)
    t = mpmath.mpf(1)
    k = 1
    eps = mpmath.mpf(10) ** (-mpmath.mp.dps - 5)
    while True:
        t = t * z / (a + k)
        s += t
        k += 1
        if t < s * eps:
            break
    return mpmath.exp(a * mpmath.log(z) - z - mpmath.loggamma(a + 1)) * s


def tails(df, x, dps):
    with mpmath.workdps(dps):
        a = mpmath.mpf(df) / 2
        z = mpmath.mpf(x) / 2
        if z >= a:
            small = mpmath.gammainc(a, z, mpmath.inf, regularized=True)
            log_small = mpmath.log(small)
            log_other = mpmath.log1p(-small)
            lu, ll = log_small, log_other
            u, l = small, mpmath.exp(log_other)
        else:
            small = lower_series(a, z)
            log_small = mpmath.log(small)
            log_other = mpmath.log1p(-small)
            ll, lu = log_small, log_other
            l, u = small, mpmath.exp(log_other)
        ln10 = mpmath.log(10)
        return lu / ln10, ll / ln10, u, l


def agree(p, q):
    if p == q:
        return True
    return abs(p - q) <= abs(q) * mpmath.mpf(10) ** -30


def main():
    mpmath.mp.dps = 50
    w = sys.stdout.write
    w('# Chi-square tails, reference grid. Generated by:\n')
    w('#   /usr/bin/python3 tests/reference/generate_chi_square_tails.py > tests/reference/chi_square_tails.csv\n')
    w('# mpmath %s at 50 significant digits, cross-checked at 70 digits to 30 digits; values printed\n' % mpmath.__version__)
    w('# with 20 significant digits. upper = P(X >= x) = Q(df/2, x/2), lower = P(X <= x) = P(df/2, x/2).\n')
    w('# Rows: a regular grid (x to six significant digits), then hard cases (x to thirteen): near the\n')
    w('# centre for df 1e4 to 1e6, and where p is a normal double just above the underflow\n')
    w('# (log10 p from -300.5 to -307.6), df 1 to 1e6; the script says how they are chosen.\n')
    w('# x is the exact double (Python repr). Tolerances used by tests/unit/test_chi_square_tail.cpp:\n')
    w('#   p a normal double (p >= 2.2250738585072014e-308): |p - p_ref| <= 1e-14 * p_ref.\n')
    w('#     (Measured worst 2.9e-16: the exponent of p = exp(E) and the sums are carried in\n')
    w('#     double-double, so only the last exp rounds; 1e-14 leaves room for other libms.)\n')
    w('#   p below that: |log10 p - log10 p_ref| <= 1e-14 * |log10 p_ref| (measured 2.7e-16).\n')
    w('#   log10 of the tail near 1 (-log10 p tiny): within 1e-14 relative as well.\n')
    w('df,x,log10_upper,log10_lower,upper,lower\n')
    for df in DFS:
        for x in statistics_for(df):
            r50 = tails(df, x, 50)
            r70 = tails(df, x, 70)
            for p, q in zip(r50, r70):
                if not agree(p, q):
                    raise SystemExit('precision check failed at df=%r x=%r: %s vs %s' % (df, x, p, q))
            lu, ll, u, l = r50
            w('%r,%r,%s,%s,%s,%s\n' % (df, x, mpmath.nstr(lu, 20, min_fixed=-1, max_fixed=1),
                                       mpmath.nstr(ll, 20, min_fixed=-1, max_fixed=1),
                                       mpmath.nstr(u, 20, min_fixed=1, max_fixed=0),
                                       mpmath.nstr(l, 20, min_fixed=1, max_fixed=0)))


if __name__ == '__main__':
    main()
