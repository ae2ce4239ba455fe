#!/usr/bin/python3
"""Parametric-bootstrap reference p-values for tests/unit/test_refit_monte_carlo.cpp: a Poisson
fitted by grouped maximum likelihood to counts in cells 0, 1, 2, 3, 4, "5 or more" (SciPy's
poisson.pmf / poisson.sf for the cells, scipy.optimize.minimize_scalar on the negative grouped
log-likelihood), NumPy's multinomial draws from the fitted cells, the model refitted to every
replicate the same way, Pearson X^2 against the refitted expected counts; p = (b + 1)/(B + 1).
Run: /usr/bin/python3 tests/reference/generate_refit_monte_carlo.py > tests/reference/refit_monte_carlo.csv"""
import numpy as np
from scipy import optimize, stats

CELLS = 6


def cell_probs(mean):
    p = stats.poisson.pmf(np.arange(CELLS - 1), mean)
    return np.append(p, stats.poisson.sf(CELLS - 2, mean))


def fit(y):
    y = np.asarray(y, dtype=float)
    nll = lambda u: -np.sum(y * np.log(cell_probs(np.exp(u))))
    start = np.log(max(1e-3, np.dot(np.arange(CELLS), y) / y.sum()))
    r = optimize.minimize_scalar(nll, bracket=(start - 0.5, start + 0.5), tol=1e-12)
    return np.exp(r.x)


def pearson(y, mean):
    e = y.sum() * cell_probs(mean)
    return np.sum((y - e) ** 2 / e)


def main():
    rng = np.random.default_rng(20261202)
    print("# Parametric bootstrap (Poisson, grouped MLE refitted per replicate) by "
          "tests/reference/generate_refit_monte_carlo.py: NumPy 1.24 / SciPy 1.10, seed 20261202")
    print("observed,replicates,mean_hat,x2,p,se")
    for observed in ([35, 40, 15, 6, 3, 1], [10, 30, 28, 17, 9, 6], [52, 30, 10, 2, 4, 2]):
        y = np.array(observed, dtype=float)
        n = int(y.sum())
        m = fit(y)
        x2 = pearson(y, m)
        B = 20000
        draws = rng.multinomial(n, cell_probs(m), size=B)
        cache = {}
        b = 0
        for d in draws:
            key = tuple(d)
            if key not in cache:
                cache[key] = pearson(d.astype(float), fit(d))
            b += cache[key] >= x2 * (1 - 1e-9)
        p = (b + 1) / (B + 1)
        print("%s,%d,%.12g,%.12g,%.6g,%.3g" % (";".join(map(str, observed)), B, m, x2, p, np.sqrt(p * (1 - p) / B)))


main()
