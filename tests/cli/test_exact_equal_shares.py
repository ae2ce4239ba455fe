#!/usr/bin/python3
"""The command-line tool's exact p-value against equal shares (`--method exact --json`, Pearson
ordering) beside an independent reference: the NumPy dynamic programming of
tests/bench/numpy_exact_dp.py (Poisson cells conditioned on the total, over count and sum of
squares), which is itself checked against brute-force enumeration of every count vector on the
smallest tables.
Usage: test_exact_equal_shares.py PATH_TO_TALLYPROOF"""
import json
import math
import os
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "bench"))
from cli_common import check, close, finish, run  # noqa: E402
from numpy_exact_dp import equal_shares_dp, exact_p  # noqa: E402


def brute_force_p(obs):
    """P(sum x^2 >= observed sum x^2) under the multinomial N!/(prod x_i!) k^-N, summed over every
    count vector of len(obs) cells totalling N (exact rationals), and the total probability."""
    from fractions import Fraction

    k, n = len(obs), sum(obs)
    s_obs = sum(v * v for v in obs)
    p = total = Fraction(0)
    fact = [math.factorial(i) for i in range(n + 1)]

    def rec(j, left, denom, sq):
        nonlocal p, total
        if j == k - 1:
            pr = Fraction(fact[n], denom * fact[left] * k ** n)
            total += pr
            if sq + left * left >= s_obs:
                p += pr
            return
        for x in range(left + 1):
            rec(j + 1, left - x, denom * fact[x], sq + x * x)

    rec(0, n, 1, 0)
    return float(p), total


def cli_exact(obs):
    # Labelled lines (label<TAB>count), so a column of small whole numbers is not read as raw values.
    out = run(["--json", "--method", "exact"], "".join("C%d\t%d\n" % (j + 1, v) for j, v in enumerate(obs)))
    if out.returncode != 0:
        return None, out.stderr
    doc = json.loads(out.stdout)
    return doc, ""


# 1. The reference itself: NumPy DP against brute force (exact fractions) on small tables,
#    including a far tail (all balls in one cell) and the centre (p = 1).
for obs in ([3, 1, 4, 2, 2], [0, 0, 12, 0, 0], [2, 3, 2, 3, 2], [7, 0, 1, 2]):
    bf, total = brute_force_p(obs)
    dp, dp_total = equal_shares_dp(len(obs), sum(obs), sum(v * v for v in obs))
    check(total == 1, "brute force sums to 1 for %s" % obs)
    check(close(dp, bf, rel=1e-12), "NumPy DP %r vs brute force %r for %s" % (dp, bf, obs))
    check(close(dp_total, 1.0, rel=1e-12), "NumPy DP total probability %r for %s" % (dp_total, obs))

# 2. The tool against the references. Tables chosen by hand: k = 5, N = 12; k = 10, N = 30;
#    k = 20, N = 40 (sparse, mean 2); k = 8, N = 24 far in the tail.
cases = [
    ([3, 1, 4, 2, 2], "brute force and independent NumPy DP (tests/bench/numpy_exact_dp.py)"),
    ([6, 1, 3, 5, 0, 2, 4, 3, 2, 4], "independent NumPy DP, tests/bench/numpy_exact_dp.py"),
    ([0, 4, 1, 2, 3, 0, 5, 2, 1, 2, 3, 0, 2, 4, 1, 2, 3, 1, 2, 2], "independent NumPy DP, tests/bench/numpy_exact_dp.py"),
    ([14, 0, 1, 3, 0, 2, 4, 0], "independent NumPy DP, tests/bench/numpy_exact_dp.py"),
]
for obs, reference in cases:
    ref = exact_p(obs)
    if len(obs) <= 5:  # brute force for k = 5
        check(close(ref, brute_force_p(obs)[0], rel=1e-12), "NumPy DP vs brute force for %s" % obs)
    doc, err = cli_exact(obs)
    check(doc is not None, "tallyproof --method exact runs for %s: %s" % (obs, err))
    if doc is None:
        continue
    k, n = len(obs), sum(obs)
    check(doc.get("method") == "exact", "method is exact for %s: %r" % (obs, doc.get("method")))
    check(doc.get("n") == n and len(doc.get("observed", [])) == k, "the table was read as given: %s" % obs)
    # The statistic from the maths: X^2 = (k/N) sum x^2 - N with equal shares.
    x2 = k * sum(v * v for v in obs) / n - n
    check(close(doc.get("statistic"), x2, rel=1e-12), "X^2 %r vs %r for %s" % (doc.get("statistic"), x2, obs))
    p = doc.get("p_value")
    check(close(p, ref, rel=1e-9), "exact p %r vs %r (%s) for k = %d, N = %d" % (p, ref, reference, k, n))
    bound = (doc.get("exact") or {}).get("error_bound")
    check(bound is not None and abs(p - ref) <= bound + 1e-12 * ref,
          "|p - reference| = %.3g within the stated error bound %r for %s" % (abs(p - ref), bound, obs))
    # The exact p is not the asymptotic one (sparse tables): a check that the exact path ran.
    check(doc.get("asymptotic_p_value") is not None and not close(doc["asymptotic_p_value"], ref, rel=1e-6),
          "exact p differs from the asymptotic p for %s" % obs)

finish("exact equal shares: %d tables agree with the NumPy DP and brute force" % len(cases))
