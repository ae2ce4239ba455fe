#!/usr/bin/python3
"""NumPy reference for bench_monte_carlo: the same workloads (equal shares, N = 10 k + 10,
observed 20, 0, 0, 10, 10, ...; k = 10000: 1 in every sixth cell), Generator(PCG64).multinomial vectorised over the replicates in
chunks, Pearson X^2 by array arithmetic, p = (b + 1)/(B + 1). Prints one line per k."""
import time

import numpy as np

print("%8s %8s %10s %10s %14s %10s" % ("k", "N", "replicates", "seconds", "us/replicate", "p"))
for k in (10, 100, 1000, 10000):
    obs = np.full(k, 10.0) if k < 10000 else np.array([1.0 if j % 6 == 0 else 0.0 for j in range(k)])
    obs[0], obs[1], obs[2] = 20, 0, 0
    n = int(obs.sum())
    e = n / k
    x2_obs = ((obs - e) ** 2 / e).sum()
    reps = 2000 if k == 10000 else 20000
    rng = np.random.default_rng(3)
    pvals = np.full(k, 1.0 / k)
    t0 = time.perf_counter()
    hits, done = 0, 0
    chunk = max(1, 2_000_000 // k)
    while done < reps:
        b = min(chunk, reps - done)
        x = rng.multinomial(n, pvals, size=b)
        x2 = ((x - e) ** 2 / e).sum(axis=1)
        hits += int((x2 >= x2_obs * (1 - 1e-9)).sum())
        done += b
    sec = time.perf_counter() - t0
    print("%8d %8d %10d %10.3f %14.2f %10.4f" % (k, n, reps, sec, 1e6 * sec / reps, (hits + 1) / (reps + 1)))
