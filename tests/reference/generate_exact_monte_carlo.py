#!/usr/bin/python3
"""Monte Carlo reference p-values for the exact bracket (issue 32) where brute-force enumeration is
infeasible (k = 10..100, N up to 5000, unequal and irrational shares): for each table, B = 1e7
multinomial replicates drawn under the null by NumPy (numpy.random.Generator(PCG64(seed)).multinomial,
in batches), Pearson X^2 computed in float64 as sum (x - e)^2 / e, and p_hat = b / B with b the
replicates at least as extreme as the observed table under the core's tie rule: X^2_rep >=
X^2_obs (1 - 1e-9) (kTieRelativeTolerance, core/exact/exact_multinomial.hpp). SE = sqrt(p_hat (1 -
p_hat) / B). Read by tests/unit/test_exact_bracket.cpp, which checks each certified bracket against
p_hat within 5 SE.

Tables: eight of tests/bench/bench_exact_bracket.cpp (shares 1..k or the first-two-digit law,
expected counts rounded and moved by shift x (1, -1, 2, 0, -2)), and four with irrational shares
whose observed table is a draw from the null chosen near the alpha = 0.05 or 0.01 critical value
(selection: 2e5 null replicates give the X^2 quantile, then null draws until one lies within 0.5%
of it; its own seed, recorded in the file). Only tables whose p is large enough for b >= 100 are
kept (a normal 5 SE band is then sound); the benchmark's tables with p below 1e-5 get no hits. A
benchmark row's N is the one it names, give or take the last cell's clamp at 0 (column n is the total).

Run: /usr/bin/python3 tests/reference/generate_exact_monte_carlo.py tests/reference/exact_monte_carlo.csv
(measured 2026-12-05: 901 s of replicates on one core of the shared build machine, plus about 10 s choosing
the near-alpha tables; the file's header records the replicates' time).
Optional second argument: replicates (for a trial run; the committed file uses 10000000)."""
import math
import sys
import time

import numpy as np

SEED = 20261205
BATCH = 50000
TIE = 1e-9  # kTieRelativeTolerance


def bench_table(k, n, kind, shift):
    """tests/bench/bench_exact_bracket.cpp's table(): the same shares and observed counts."""
    if kind == "benford_two":
        shares = [math.log10(1.0 + 1.0 / (10 + j)) for j in range(k)]
    else:
        shares = [1.0 + j for j in range(k)]
    total = sum_left(shares)  # left to right, as the benchmark sums them
    pattern = [1, -1, 2, 0, -2]
    observed = []
    for j in range(k):
        x = int(math.floor(n * shares[j] / total + 0.5)) + shift * pattern[j % 5]
        observed.append(max(0, x))
    observed[-1] = max(0, observed[-1] + (n - sum(observed)))
    return observed, shares


def sum_left(v):
    t = 0.0
    for a in v:
        t += a
    return t


def pearson(x, e, inv_e):
    d = x - e
    return (d * d) @ inv_e


def null_draws(rng, n, pi, count):
    return rng.multinomial(n, pi, size=count).astype(np.float64)


def near_critical(n, shares, alpha, seed):
    """A null draw whose X^2 lies within 0.5% of the null's (1 - alpha) quantile (2e5 replicates)."""
    rng = np.random.Generator(np.random.PCG64(seed))
    pi = np.array(shares) / sum_left(shares)
    e = n * pi
    inv_e = 1.0 / e
    stats = np.concatenate([pearson(null_draws(rng, n, pi, BATCH), e, inv_e) for _ in range(4)])
    q = np.quantile(stats, 1 - alpha)
    while True:
        x = null_draws(rng, n, pi, 1000)
        t = pearson(x, e, inv_e)
        hit = np.nonzero(np.abs(t - q) <= 0.005 * q)[0]
        if hit.size:
            return [int(v) for v in x[hit[0]]]


def monte_carlo(observed, shares, replicates, seed):
    rng = np.random.Generator(np.random.PCG64(seed))
    n = int(sum(observed))
    pi = np.array(shares) / sum_left(shares)
    e = n * pi
    inv_e = 1.0 / e
    t_obs = pearson(np.array(observed, dtype=np.float64), e, inv_e)
    hits = 0
    done = 0
    while done < replicates:
        m = min(BATCH, replicates - done)
        t = pearson(null_draws(rng, n, pi, m), e, inv_e)
        hits += int(np.count_nonzero(t >= t_obs * (1 - TIE)))
        done += m
    return t_obs, hits


def main():
    out_path = sys.argv[1]
    replicates = int(sys.argv[2]) if len(sys.argv) > 2 else 10_000_000
    cases = []
    for k, n, kind, shift in [(10, 50, "linear", 3), (10, 300, "linear", 6), (20, 100, "linear", 1), (30, 150, "linear", 1),
                              (40, 200, "linear", 2), (60, 300, "linear", 2), (90, 300, "benford_two", 1), (100, 5000, "linear", 3)]:
        observed, shares = bench_table(k, n, kind, shift)
        cases.append((f"bench row k={k} N={n} {kind} shift={shift}", observed, shares, 0))
    # Irrational shares, observed near a critical value (the decision is close).
    near = [
        ("sqrt(j) k=30 N=1000 near 0.05", 1000, [math.sqrt(j) for j in range(1, 31)], 0.05),
        ("1/(j+pi) k=50 N=2000 near 0.01", 2000, [1.0 / (j + math.pi) for j in range(1, 51)], 0.01),
        ("first-two-digit k=90 N=300 near 0.05", 300, [math.log10(1.0 + 1.0 / d) for d in range(10, 100)], 0.05),
        ("1..100 k=100 N=5000 near 0.05", 5000, [1.0 + j for j in range(100)], 0.05),
    ]
    for i, (name, n, shares, alpha) in enumerate(near):
        select_seed = SEED + 100 + i
        cases.append((name + f" (selection seed {select_seed})", near_critical(n, shares, alpha, select_seed), shares, select_seed))
    rows = []
    start = time.time()
    for i, (name, observed, shares, _) in enumerate(cases):
        seed = SEED + i
        t0 = time.time()
        t_obs, hits = monte_carlo(observed, shares, replicates, seed)
        sec = time.time() - t0
        p = hits / replicates
        se = math.sqrt(p * (1 - p) / replicates)
        rows.append(f"{name},{len(observed)},{sum(observed)},{';'.join(str(v) for v in observed)},"
                    f"{';'.join(repr(s) for s in shares)},{seed},{repr(float(t_obs))},{replicates},{hits},{p!r},{se!r},{sec:.1f}")
        print(f"{name}: X2 {t_obs:.6g} hits {hits} p {p:.6g} se {se:.3g} ({sec:.1f} s)", file=sys.stderr, flush=True)
    total = time.time() - start
    with open(out_path, "w") as f:
        f.write("# Monte Carlo reference for the exact bracket: tests/reference/generate_exact_monte_carlo.py, "
                f"NumPy {np.__version__} (Generator(PCG64(seed)).multinomial), B = {replicates} replicates a table, "
                f"p_hat = hits / B, se = sqrt(p_hat (1 - p_hat) / B), extreme: X2_rep >= X2_obs (1 - 1e-9); "
                f"{total:.0f} s of replicates on one core ({time.strftime('%Y-%m-%d', time.gmtime())})\n")
        f.write("# shares as given (not normalised; the core rescales them to sum 1); seed: of the replicates\n")
        f.write("name,k,n,observed,shares,seed,x2,replicates,hits,p_hat,se,seconds\n")
        for r in rows:
            f.write(r + "\n")


if __name__ == "__main__":
    main()
