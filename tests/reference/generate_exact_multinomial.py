#!/usr/bin/python3
# Generates exact_multinomial.csv: exact multinomial goodness-of-fit p-values by full enumeration.
# Run: /usr/bin/python3 tests/reference/generate_exact_multinomial.py > tests/reference/exact_multinomial.csv
# Every outcome x with sum N is enumerated; P(x) = scipy.stats.multinomial.pmf (SciPy 1.10);
# p = math.fsum of P(x) over extreme x, where extreme means: ordering 'statistic': the
# power-divergence statistic (scipy.stats.power_divergence, lambda given) >= t_obs (1 - 1e-9);
# ordering 'probability': P(x) <= P(obs) (1 + 1e-9). SciPy's power_divergence returns nan for
# lambda < 0 when a count is 0, so for lambda < 0 the statistic is the defining formula
# 2/(l(l+1)) sum [x^(l+1) E^(-l) - x] in numpy, with 0^(l+1) = 0. Precision about 1e-14 relative.
import itertools
import math
import warnings

import numpy as np
import scipy
from scipy.stats import multinomial, power_divergence

warnings.simplefilter("ignore")

def outcomes(n, k):
    for cuts in itertools.combinations(range(n + k - 1), k - 1):
        prev, x = -1, []
        for c in cuts:
            x.append(c - prev - 1)
            prev = c
        x.append(n + k - 2 - prev)
        yield x

def exact_p(obs, pi, ordering, lam):
    n, k = sum(obs), len(obs)
    xs = np.array(list(outcomes(n, k)), dtype=float)
    probs = multinomial.pmf(xs, n, pi)
    if ordering == "probability":
        p_obs = multinomial.pmf(obs, n, pi)
        mask = probs <= p_obs * (1 + 1e-9)
    else:
        exp = n * np.array(pi)
        def stat(x):
            if lam >= 0:
                return power_divergence(x, np.broadcast_to(exp, x.shape), lambda_=lam, axis=-1).statistic
            return 2 / (lam * (lam + 1)) * np.sum(x ** (lam + 1) * exp ** (-lam) - x, axis=-1)
        stats = stat(xs)
        t_obs = stat(np.array(obs, float))
        mask = stats >= t_obs * (1 - 1e-9)
    return math.fsum(probs[mask])

cases = [
    ([3, 5, 2], [0.2, 0.3, 0.5]),
    ([10, 2, 1, 0], [0.4, 0.3, 0.2, 0.1]),
    ([1, 2, 3, 4], [0.1, 0.2, 0.3, 0.4]),
    ([8, 3, 5, 2, 2], [0.2] * 5),
    ([15, 2, 3], [0.6, 0.2, 0.2]),
    ([0, 9, 1, 14], [0.05, 0.35, 0.1, 0.5]),
    ([6, 6, 6, 2], [0.25] * 4),
    ([2, 9, 4, 1, 4], [0.1, 0.3, 0.2, 0.15, 0.25]),
]
print("# exact multinomial p-values: full enumeration, SciPy %s multinomial.pmf, math.fsum" % scipy.__version__)
print("# generator: /usr/bin/python3 tests/reference/generate_exact_multinomial.py")
print("# ordering,lambda,observed,shares,p")
for obs, pi in cases:
    print("probability,nan,%s,%s,%r" % (";".join(map(str, obs)), ";".join(map(repr, pi)),
                                        exact_p(obs, pi, "probability", None)))
    for lam in (1.0, 0.0, 2 / 3, -0.5):
        print("statistic,%r,%s,%s,%r" % (lam, ";".join(map(str, obs)), ";".join(map(repr, pi)),
                                         exact_p(obs, pi, "statistic", lam)))
