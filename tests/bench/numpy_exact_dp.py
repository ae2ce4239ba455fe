#!/usr/bin/python3
"""Independent NumPy reference for bench_exact_dp: the exact p-value of Pearson's X^2 against
equal shares (N balls into k equally likely cells), by dynamic programming. Not a port of
core/exact/exact_equal_shares.cpp; written from the maths below.

With equal shares e = N/k, X^2 = sum (x_i - e)^2 / e = (k/N) S - N with S = sum x_i^2, an integer,
so p = P(X^2 >= X^2_obs) = P(S >= S_obs): only the sum of squares matters.

The multinomial probability of a count vector is N!/(prod x_i!) k^-N. Take x_1..x_k independent
Poisson(lambda = N/k): their joint probability is prod e^-lambda lambda^x_i / x_i!, and their total
is Poisson(N), so conditioning on the total being N gives
    prod Pois(x_i; lambda) / Pois(N; N) = N!/(prod x_i!) k^-N,
the multinomial. So the DP carries float64 probabilities (no factorial overflow):
    f_j[n, s] = P(x_1 + .. + x_j = n, x_1^2 + .. + x_j^2 = s)   (Poisson cells),
for s < S_obs, and tail_j[n] = P(sum = n, sum of squares >= S_obs): a sum of squares only grows
as cells are added, so once past S_obs a state's s no longer matters ("pruned into the tail").
Then p = tail_k[N] / (tail_k[N] + sum_s f_k[N, s]); the denominator must equal Pois(N; N),
which the program checks against SciPy.

Usage: numpy_exact_dp.py [--max-seconds S]   (default 60: a k whose estimated time exceeds it is
skipped and said so). Prints one line per k: k, N, S_obs, X^2, p, total probability - 1, seconds.
"""
import math
import sys
import time

import numpy as np

PATTERN = (5, 8, 2, 6, 4, 9, 3, 5, 1, 7)  # as sparse_table() in bench_exact_dp.cpp


def sparse_table(k):
    return [PATTERN[j % 10] for j in range(k)]


def poisson_weights(lam, n_max):
    """Pois(x; lam) for x = 0..n_max, in log space then exponentiated (underflow to 0 is harmless)."""
    x = np.arange(n_max + 1, dtype=np.float64)
    lg = np.array([math.lgamma(v + 1.0) for v in x])
    return np.exp(x * math.log(lam) - lam - lg) if lam > 0 else (x == 0).astype(np.float64)


def equal_shares_dp(k, n_total, s_obs):
    """(P(S >= s_obs), total probability) for N = n_total balls in k equally likely cells.
    The total probability (all outcomes, tail and not) is returned divided by Pois(N; N): 1 up to
    rounding when the DP is right."""
    N, S = int(n_total), int(s_obs)
    if k < 1 or N < 0:
        raise ValueError("need k >= 1, N >= 0")
    w = poisson_weights(N / k, N)
    # f[n, s] for s in 0..S-1 (states not yet in the tail); tail[n].
    f = np.zeros((N + 1, max(S, 0)), dtype=np.float64)
    tail = np.zeros(N + 1, dtype=np.float64)
    if S > 0:
        f[0, 0] = 1.0
    else:
        tail[0] = 1.0  # every outcome has S >= 0
    for _ in range(k):
        g = np.zeros_like(f)
        # Suffix sums over s: ssum[n, t] = sum_{s >= t} f[n, s]; ssum[:, S] = 0.
        ssum = np.zeros((N + 1, S + 1), dtype=np.float64)
        if S > 0:
            ssum[:, :S] = np.cumsum(f[:, ::-1], axis=1)[:, ::-1]
        new_tail = np.convolve(tail, w)[: N + 1]  # tail states stay in the tail whatever x is
        for x in range(N + 1):
            wx = w[x]
            if wx == 0.0:
                continue
            sq = x * x
            rows = N + 1 - x  # n + x <= N
            if sq < S:
                # s + x^2 < S stays in the table; s >= S - x^2 crosses into the tail.
                g[x:, sq:] += wx * f[:rows, : S - sq]
                new_tail[x:] += wx * ssum[:rows, S - sq]
            else:
                new_tail[x:] += wx * ssum[:rows, 0]
        f, tail = g, new_tail
    at_n = tail[N] + (f[N].sum() if S > 0 else 0.0)
    pois_nn = math.exp(N * math.log(N) - N - math.lgamma(N + 1.0)) if N > 0 else 1.0
    return tail[N] / at_n, at_n / pois_nn


def exact_p(observed):
    """Exact p of Pearson's X^2 for a list of whole counts against equal shares."""
    obs = [int(v) for v in observed]
    if any(v != o or v < 0 for v, o in zip(obs, observed)):
        raise ValueError("whole non-negative counts only")
    return equal_shares_dp(len(obs), sum(obs), sum(v * v for v in obs))[0]


def work(k, N, S):
    """Element updates the DP does (for estimating the time of the next k)."""
    per_cell = sum((N + 1 - x) * (S - x * x) for x in range(N + 1) if x * x < S)
    return k * per_cell


def main():
    budget = 60.0
    if len(sys.argv) >= 3 and sys.argv[1] == "--max-seconds":
        budget = float(sys.argv[2])
    from scipy.stats import poisson  # only for the printed check of the normaliser

    print("equal shares, X^2, mean 5 per cell, NumPy %s dynamic programming over (cells, count, sum of squares)" % np.__version__)
    print("%5s %6s %8s %12s %20s %12s %10s" % ("k", "N", "S_obs", "X^2", "p (NumPy DP)", "total - 1", "seconds"))
    rate = None  # element updates per second, measured on the previous k
    for k in (10, 20, 30, 50, 70, 100):
        obs = sparse_table(k)
        N, S = sum(obs), sum(v * v for v in obs)
        x2 = k * S / N - N
        if rate is not None and work(k, N, S) / rate > budget:
            print("%5d %6d %8d %12.6g %20s %12s %10s  skipped: estimated %.0f s > %.0f s budget" % (
                k, N, S, x2, "-", "-", "-", work(k, N, S) / rate, budget))
            continue
        t0 = time.perf_counter()
        p, total = equal_shares_dp(k, N, S)
        sec = time.perf_counter() - t0
        rate = work(k, N, S) / max(sec, 1e-6)
        # total is already divided by Pois(N; N) computed with lgamma; SciPy's pmf is a second opinion.
        total_scipy = total * math.exp(N * math.log(N) - N - math.lgamma(N + 1.0)) / poisson.pmf(N, N)
        print("%5d %6d %8d %12.6g %20.15g %12.2g %10.3f" % (k, N, S, x2, p, total_scipy - 1, sec))
        sys.stdout.flush()


if __name__ == "__main__":
    main()
