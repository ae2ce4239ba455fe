#!/usr/bin/python3
"""The Monte Carlo and exact p-value workloads of bench_pvalues.cpp, run through R 4.2 and
NumPy/SciPy, timed. A benchmark helper that prints figures (JSON on stdout), not a test.
  Monte Carlo: Pearson X2, N = 1000, k = 10 equal shares, observed as in bench_pvalues.cpp,
    one million replicates. R: chisq.test(simulate.p.value = TRUE, B = 1e5) timed and scaled by 10
    (R keeps every simulated statistic; 1e6 in one call is slow and memory-hungry). NumPy:
    Generator.multinomial vectorised in blocks of 1e5 replicates.
  Exact: N = 100, k = 6 equal shares, observed {20, 15, 12, 18, 25, 10}. Neither base R 4.2 nor
    SciPy 1.10 has an exact multinomial goodness-of-fit test; here NumPy computes it exactly by
    dynamic programming over (count so far, sum of squares so far): with equal shares Pearson's X2
    = (k/N) sum x^2 - N, so "X2 >= observed" is "sum x^2 >= observed sum" in whole numbers.
Usage: reference_pvalues.py [--quick]"""
import json
import math
import subprocess
import sys
import time

import numpy as np
import scipy
from scipy.stats import chisquare

MC_OBS = [95, 110, 98, 102, 88, 105, 97, 101, 99, 105]
EX_OBS = [20, 15, 12, 18, 25, 10]
QUICK = "--quick" in sys.argv


def numpy_monte_carlo(replicates, seed=1):
    rng = np.random.default_rng(seed)
    n, k = sum(MC_OBS), len(MC_OBS)
    e = n / k
    x2_obs = sum((o - e) ** 2 / e for o in MC_OBS)
    hits, done, block = 0, 0, 100000
    t0 = time.perf_counter()
    c0 = time.process_time()
    while done < replicates:
        b = min(block, replicates - done)
        x = rng.multinomial(n, [1 / k] * k, size=b)
        x2 = ((x - e) ** 2).sum(axis=1) / e
        hits += int((x2 >= x2_obs - 1e-9 * x2_obs).sum())
        done += b
    return {"replicates": replicates, "wall_s": time.perf_counter() - t0, "cpu_s": time.process_time() - c0,
            "p": (hits + 1) / (replicates + 1), "x2": x2_obs, "asymptotic_p": float(chisquare(MC_OBS).pvalue)}


def r_monte_carlo(b):
    script = f"""
x <- c({",".join(map(str, MC_OBS))})
set.seed(1)
t <- system.time(r <- chisq.test(x, p = rep(0.1, 10), simulate.p.value = TRUE, B = {b}))
cat(sprintf("%.6f %.6f %.17g\\n", t[["elapsed"]], t[["user.self"]] + t[["sys.self"]], r$p.value))
"""
    out = subprocess.run(["Rscript", "-e", script], capture_output=True, text=True, check=True).stdout.split()
    wall, cpu, p = float(out[0]), float(out[1]), float(out[2])
    scale = 1e6 / b
    return {"replicates_run": b, "wall_s_run": wall, "cpu_s_run": cpu, "p": p,
            "wall_s_scaled_to_1e6": wall * scale, "cpu_s_scaled_to_1e6": cpu * scale}


def numpy_exact():
    n, k = sum(EX_OBS), len(EX_OBS)
    s_obs = sum(x * x for x in EX_OBS)
    t0 = time.perf_counter()
    S = n * n
    inv_fact = np.array([1 / math.factorial(x) for x in range(n + 1)])
    w = np.zeros((n + 1, S + 1))
    w[0, 0] = 1.0
    for _ in range(k):
        nw = np.zeros_like(w)
        for x in range(n + 1):
            nw[x:, x * x:] += w[: n + 1 - x, : S + 1 - x * x] * inv_fact[x]
        w = nw
    # P(x) = N! / prod x_i! * k^-N ; p = sum over sum x^2 >= observed
    scale = math.exp(math.lgamma(n + 1) - n * math.log(k))
    p = float(w[n, s_obs:].sum() * scale)
    total = float(w[n, :].sum() * scale)
    return {"wall_s": time.perf_counter() - t0, "p": p, "total_probability": total,
            "x2": k / n * s_obs - n, "asymptotic_p": float(chisquare(EX_OBS).pvalue)}


def main():
    r_version = subprocess.run(["Rscript", "-e", "cat(R.version.string)"], capture_output=True, text=True).stdout
    out = {"numpy": np.__version__, "scipy": scipy.__version__, "r": r_version,
           "monte_carlo_numpy": numpy_monte_carlo(100000 if QUICK else 1000000),
           "monte_carlo_r": r_monte_carlo(10000 if QUICK else 100000),
           "exact_numpy_dp": numpy_exact()}
    print(json.dumps(out, indent=1))


if __name__ == "__main__":
    main()
