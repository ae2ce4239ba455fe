#!/usr/bin/python3
"""NumPy reference for bench_monte_carlo_grid: the same cells (k in {2, 10, 100, 1000} x N in
{10, 1e3, 1e5, 1e6}; shares proportional to 1..k; observed = the counts expected under shares
(j + 1)(1 + c (-1)^j), c = min(0.5, sqrt(k / N)), rounded by largest remainder; Pearson X^2; B = 2e6 / k replicates, at least 2000), Generator(PCG64).multinomial
vectorised over the replicates in chunks of about 2e6 / k rows, X^2 by array arithmetic, p = (b + 1)/(B + 1)
with the tie allowance x2 >= x2_obs (1 - 1e-9). CPU time is time.process_time() of the
simulation. Usage: numpy_monte_carlo_grid.py [k N ...]"""
import sys
import time

import numpy as np

args = [float(a) for a in sys.argv[1:]]
cells = [(int(args[i]), int(args[i + 1])) for i in range(0, len(args) - 1, 2)] or \
    [(k, n) for k in (2, 10, 100, 1000) for n in (10, 1000, 100000, 1000000)]
print("%6s %9s %10s %10s %14s %10s" % ("k", "N", "replicates", "cpu_s", "us/replicate", "p"), flush=True)
for k, n in cells:
    shares = np.arange(1, k + 1, dtype=float)
    shares /= shares.sum()
    e = n * shares
    c = min(0.5, (k / n) ** 0.5)
    tilt = np.arange(1, k + 1, dtype=float) * (1 + c * np.where(np.arange(k) % 2 == 0, 1.0, -1.0))
    eo = n * tilt / tilt.sum()
    obs = np.floor(eo)
    order = np.argsort(-(eo - obs), kind="stable")
    obs[order[: n - int(obs.sum())]] += 1
    x2_obs = ((obs - e) ** 2 / e).sum()
    reps = max(2000, 2000000 // k)
    rng = np.random.default_rng(7)
    t0 = time.process_time()
    hits, done = 0, 0
    chunk = max(1, 2000000 // k)
    while done < reps:
        b = min(chunk, reps - done)
        x = rng.multinomial(n, shares, size=b)
        x2 = ((x - e) ** 2 / e).sum(axis=1)
        hits += int((x2 >= x2_obs * (1 - 1e-9)).sum())
        done += b
    sec = time.process_time() - t0
    print("%6d %9d %10d %10.3f %14.3f %10.4f" % (k, n, reps, sec, 1e6 * sec / reps, (hits + 1) / (reps + 1)), flush=True)
