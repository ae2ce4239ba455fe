#!/usr/bin/python3
"""Monte Carlo with many categories, run repeatedly (issue 15): equal shares, k = 1000, N =
10,000, 20,000 replicates, seed 3 once crashed (signal 11) in one of three identical runs; the
sampler's cache could free a table it was about to hand out. Under .ci/sanitize this test runs
the case 20 times under AddressSanitizer and UndefinedBehaviorSanitizer (any finding aborts the
process and fails the test); in the Release build it checks the same. Each run must exit 0 with
the same p-value (seeded, so reproducible), a p within [1/(B+1), 1] as (b+1)/(B+1) is (Davison
and Hinkley 1997, eq. 4.11), and agree within 4 standard errors with the asymptotic p-value of
the same table (for N/k = 10 the chi-square approximation is good; common practice).
A k = 10,000 run (N = 2,000, 500 replicates: simulation is offered up to N x k = 2e7) is checked the same way.
Usage: test_cli_monte_carlo_many.py PATH_TO_TALLYPROOF [RUNS]"""
import json
import math
import random
import subprocess
import sys

TOOL = sys.argv[1]
RUNS = int(sys.argv[2]) if len(sys.argv) > 2 else 20
failures = []


def check(cond, what):
    if not cond:
        failures.append(what)
        print("FAIL", what)


def table(k, n):
    # A table drawn under the null (N draws from k equal cells, Python's own seeded
    # Mersenne Twister), so its p-value lies in the middle of the range.
    rng = random.Random(3)
    counts = [0] * k
    for _ in range(n):
        counts[rng.randrange(k)] += 1
    return "".join("c%d\t%d\n" % (i, c) for i, c in enumerate(counts))


def run(text, replicates):
    r = subprocess.run([TOOL, "--json", "--method", "monte-carlo", "--replicates", str(replicates), "--seed", "3", "-"],
                       input=text.encode(), capture_output=True, timeout=600)
    return r


for k, n, replicates, runs in ((1000, 10000, 20000, RUNS), (10000, 2000, 500, 2)):
    text = table(k, n)
    ps = []
    for i in range(runs):
        r = run(text, replicates)
        check(r.returncode == 0, f"k = {k}, run {i + 1}: exit {r.returncode} {r.stderr.decode()[-300:]}")
        if r.returncode != 0:
            break
        d = json.loads(r.stdout)
        mc = d.get("monte_carlo") or {}
        p = d.get("p_value")
        check(mc.get("replicates") == replicates and mc.get("hits") is not None, f"k = {k}: Monte Carlo section {mc}")
        check(p is not None and 1 / (replicates + 1) - 1e-15 <= p <= 1, f"k = {k}: p {p}")
        ps.append(p)
        if i == 0 and n >= 5 * k:
            # The asymptotic p of the same table, from the document's own asymptotic field.
            pa = d.get("asymptotic_p_value")
            if pa is not None and p is not None:
                se = math.sqrt(max(pa * (1 - pa), 1 / replicates) / replicates)
                check(abs(p - pa) <= 4 * se + 1 / replicates, f"k = {k}: Monte Carlo p {p} vs asymptotic {pa} (4 SE = {4 * se:.4g})")
    check(len(set(ps)) <= 1, f"k = {k}: the seeded runs differ: {ps}")
    print(f"k = {k}: {len(ps)} runs, p = {ps[0] if ps else None}")

if failures:
    print(f"{len(failures)} failures")
    sys.exit(1)
print("Monte Carlo with many categories: all runs agree")
