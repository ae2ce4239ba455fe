#!/usr/bin/python3
# Generates power_divergence.csv: reference power-divergence statistics.
# Run: /usr/bin/python3 tests/reference/generate_power_divergence.py > tests/reference/power_divergence.csv
# Columns: lambda, observed (';'-separated), expected (';'), SciPy 1.10
# scipy.stats.power_divergence statistic ('nan' where SciPy returns nan), and an mpmath 1.2
# evaluation of the defining formula 2/(l(l+1)) sum O[(O/E)^l - 1] at 50 digits (limits for
# l = 0, -1; O^(l+1) = 0 for O = 0, l > -1), printed with 17 significant digits.
import warnings
import mpmath
import numpy as np
import scipy
from scipy.stats import power_divergence

mpmath.mp.dps = 50
warnings.simplefilter("ignore")

def mp_stat(obs, exp, lam):
    lam = mpmath.mpf(lam)
    s = mpmath.mpf(0)
    for o, e in zip(obs, exp):
        o = mpmath.mpf(o); e = mpmath.mpf(e)
        if lam == 0:
            s += 2 * o * mpmath.log(o / e) if o > 0 else 0
        elif lam == -1:
            s += 2 * e * mpmath.log(e / o)
        else:
            term = (o ** (lam + 1) * e ** (-lam) if o > 0 else 0) - o
            s += 2 / (lam * (lam + 1)) * term
    return s

cases = [
    ([16, 18, 16, 14, 12, 12], [14.666666666666666] * 6),
    ([16, 18, 16, 14, 12, 12], [16, 16, 16, 16, 16, 8]),
    ([43, 52, 25, 80], [50, 50, 25, 75]),
    ([1, 0, 3, 9, 2], [3, 3, 3, 3, 3]),
    ([315, 108, 101, 32], [312.75, 104.25, 104.25, 34.75]),
    ([1000, 1010, 990, 1003], [1000.75] * 4),
    ([0, 0, 12], [4, 4, 4]),
    ([2.5, 7.5], [5, 5]),
]
lambdas = [1, 0, 2 / 3, -0.5, -1, -2, 3.7, -0.3, -0.75, 0.5, 1e-6, -0.999]
print("# power-divergence statistics: SciPy %s scipy.stats.power_divergence vs mpmath %s (50 digits)"
      % (scipy.__version__, mpmath.__version__))
print("# generator: /usr/bin/python3 tests/reference/generate_power_divergence.py")
print("# lambda,observed,expected,scipy,mpmath")
for obs, exp in cases:
    for lam in lambdas:
        if lam <= -1 and min(obs) == 0:
            continue
        sp = power_divergence(np.array(obs, float), np.array(exp, float), lambda_=lam).statistic
        mp = mp_stat(obs, exp, lam)
        print("%r,%s,%s,%s,%s" % (lam, ";".join(repr(float(o)) for o in obs), ";".join(repr(float(e)) for e in exp),
                                  "nan" if np.isnan(sp) else repr(float(sp)), mpmath.nstr(mp, 17)))
