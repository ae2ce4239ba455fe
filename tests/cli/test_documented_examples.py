#!/usr/bin/python3
"""Runs every example analysis document in docs/examples/*.json through `tallyproof --json` and
checks the result document: exit 0 and no "error"; the statistic is the sum of the contributions;
p-values lie in [0, 1]; df = k_tested - 1 - estimated_parameters. Where an independent reference
exists it is computed live with SciPy 1.10 / NumPy (Debian's python3-scipy, python3-numpy):
  - statistic and asymptotic p-value: scipy.stats.power_divergence (chisquare for lambda = 1) on
    the tool's tested observed and expected counts with ddof = estimated_parameters; for the
    Williams-corrected G2, SciPy's G2 divided by Williams' (1976) q = 1 + (k + 1) / (6 N) (closed form);
  - expected shares of stated mixes and digit laws from their closed forms (N * v / sum v;
    Benford 1938: log10(1 + 1/d) and its second-digit sum; uniform last digits);
  - expected shares of fitted models from scipy.stats cdf/sf at the tool's estimates (end bins
    widened to cover the support), and that the estimates maximise the grouped log-likelihood
    (no better value at +-1e-4 relative along each estimated parameter);
  - exact p-values by brute-force enumeration of all outcomes (NumPy, log-multinomial with
    scipy.special.gammaln); Monte Carlo p-values against an independent NumPy simulation
    (agreement within 5 combined standard errors);
  - critical value (chi2.isf), Cohen's w and Fei (closed forms), the w interval ends (ncx2),
    the power and required N (ncx2 at chi2.isf), the mean absolute deviation of digit shares.
If SciPy is missing those comparisons are skipped with a message. Exits non-zero on any failure.
Usage: /usr/bin/python3 test_documented_examples.py PATH_TO_TALLYPROOF"""
import glob
import json
import math
import os
import subprocess
import sys

if len(sys.argv) != 2:
    sys.exit(__doc__)
TOOL = sys.argv[1]
HERE = os.path.dirname(os.path.abspath(__file__))
EXAMPLES = os.path.normpath(os.path.join(HERE, "..", "..", "docs", "examples"))
KINDS = ["equal", "shares", "ratio", "counts", "poisson", "binomial", "geometric", "negative-binomial",
         "uniform", "normal", "lognormal", "exponential", "benford-first", "benford-second",
         "benford-first-two", "last-digit", "last-digit-even"]

failures = []
checks = 0
skipped = []


def check(cond, what):
    global checks
    checks += 1
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def close(a, b, rel, abs_tol=0.0):
    return a is not None and b is not None and abs(a - b) <= max(rel * abs(b), abs_tol)


try:
    import numpy as np
    from scipy import special, stats
    HAVE_SCIPY = True
except ImportError:
    HAVE_SCIPY = False
    print("skip: scipy/numpy not installed; the live SciPy comparisons are not run")


# ---------------------------------------------------------------------------------------------
# Independent expected shares

def stated_shares(doc_in, k):
    kind = doc_in["model"]["kind"]
    if kind == "equal":
        return [1.0 / k] * k
    v = doc_in["model"]["values"]
    return [x / sum(v) for x in v]


def digit_shares(kind):
    if kind == "benford-first":
        return [math.log10(1 + 1 / d) for d in range(1, 10)]
    if kind == "benford-second":
        return [sum(math.log10(1 + 1 / (10 * j + d)) for j in range(1, 10)) for d in range(10)]
    if kind == "benford-first-two":
        return [math.log10(1 + 1 / d) for d in range(10, 100)]
    if kind == "last-digit":
        return [0.1] * 10
    if kind == "last-digit-even":
        return [0.2] * 5
    return None


def integer_bins(labels):
    """Integer ranges of labels such as "3", "5 or more" (only the forms the examples use)."""
    bins = []
    for s in labels:
        if s.endswith(" or more"):
            bins.append((int(s.split()[0]), math.inf))
        else:
            bins.append((int(s), int(s)))
    return bins


def discrete_cells(dist, bins):
    """Cell probabilities with the first bin widened down to the support's start and the last to +inf."""
    out = []
    for i, (lo, hi) in enumerate(bins):
        if i == len(bins) - 1:
            out.append(float(dist.sf(lo - 1)))
        elif i == 0:
            out.append(float(dist.cdf(hi)))
        else:
            out.append(float(dist.cdf(hi) - dist.cdf(lo - 1)))
    return out


def continuous_cells(dist, edges):
    """Bin probabilities with the end bins widened to the whole support."""
    k = len(edges) - 1
    out = []
    for i in range(k):
        if i == 0:
            out.append(float(dist.cdf(edges[1])))
        elif i == k - 1:
            out.append(float(dist.sf(edges[i])))
        else:
            out.append(float(dist.cdf(edges[i + 1]) - dist.cdf(edges[i])))
    return out


def fitted_shares(doc_in, est):
    """scipy.stats cell probabilities of a fitted model at the parameter values `est`."""
    m = doc_in["model"]
    kind = m["kind"]
    labels = doc_in["categories"]
    if kind == "poisson":
        return discrete_cells(stats.poisson(est["mean"]), integer_bins(labels))
    if kind == "binomial":
        return discrete_cells(stats.binom(int(est["trials"]), est["p"]), integer_bins(labels))
    if kind == "geometric":  # failures before the first success: nbinom with n = 1
        return discrete_cells(stats.nbinom(1, est["p"]), integer_bins(labels))
    if kind == "negative-binomial":
        return discrete_cells(stats.nbinom(est["size"], est["p"]), integer_bins(labels))
    if kind == "uniform":
        bins = integer_bins(labels)
        lo, hi = bins[0][0], bins[-1][1]
        return [(b[1] - b[0] + 1) / (hi - lo + 1) for b in bins]
    if kind == "normal":
        return continuous_cells(stats.norm(est["mean"], est["sd"]), m["edges"])
    if kind == "lognormal":
        return continuous_cells(stats.lognorm(s=est["sdlog"], scale=math.exp(est["meanlog"])), m["edges"])
    if kind == "exponential":
        return continuous_cells(stats.expon(scale=1 / est["rate"]), m["edges"])
    return None


# The free parameters of each fit (derived ones such as the geometric mean are recomputed).
FREE = {"poisson": ["mean"], "binomial": ["p"], "geometric": ["p"], "negative-binomial": ["size", "p"],
        "normal": ["mean", "sd"], "lognormal": ["meanlog", "sdlog"], "exponential": ["rate"]}


def grouped_loglik(doc_in, est, observed):
    shares = fitted_shares(doc_in, est)
    return sum(o * math.log(s) for o, s in zip(observed, shares) if o > 0)


# ---------------------------------------------------------------------------------------------
# Brute-force exact p-value and an independent simulation

def pd_statistic(x, expected, lam):
    """Power-divergence statistic of outcome rows x (n_outcomes x k) in the centred form."""
    x = np.asarray(x, dtype=float)
    e = np.asarray(expected, dtype=float)
    if lam == 0:
        with np.errstate(divide="ignore", invalid="ignore"):
            t = np.where(x > 0, x * np.log(x / e), 0.0) - (x - e)
        return 2 * t.sum(axis=1)
    with np.errstate(divide="ignore", invalid="ignore"):
        t = np.where(x > 0, x * np.power(x / e, lam), 0.0) - x - lam * (x - e)
    return 2 / (lam * (lam + 1)) * t.sum(axis=1)


def compositions_tail(n, parts):
    """All rows of `parts` (2 or 3) non-negative integers summing to n, as an array."""
    a = np.arange(n + 1)
    if parts == 2:
        return np.stack([a, n - a], axis=1)
    x, y = np.meshgrid(a, a, indexing="ij")
    keep = x + y <= n
    x, y = x[keep], y[keep]
    return np.stack([x, y, n - x - y], axis=1)


def heads(n, m):
    """All m-tuples of non-negative integers with sum at most n."""
    if m == 0:
        yield ()
        return
    for first in range(n + 1):
        for rest in heads(n - first, m - 1):
            yield (first,) + rest


def exact_p_brute_force(observed, shares, lam, ordering):
    n = int(sum(observed))
    k = len(observed)
    logp = np.log(np.asarray(shares))
    obs = np.asarray(observed, dtype=float)[None, :]
    obs_logprob = special.gammaln(n + 1) + float(np.sum(obs * logp - special.gammaln(obs + 1)))
    obs_stat = float(pd_statistic(obs, n * np.asarray(shares), lam)[0])
    total = 0.0
    parts = min(3, k)
    for head in heads(n, k - parts):
        s = sum(head)
        tail = compositions_tail(n - s, parts)
        x = np.hstack([np.tile(np.asarray(head, dtype=float), (len(tail), 1)), tail])
        lp = special.gammaln(n + 1) + (x * logp - special.gammaln(x + 1)).sum(axis=1)
        if ordering == "probability":
            extreme = lp <= obs_logprob + 1e-9 * abs(obs_logprob)
        else:
            extreme = pd_statistic(x, n * np.asarray(shares), lam) >= obs_stat * (1 - 1e-9)
        total += float(np.exp(lp[extreme]).sum())
    return total


def simulated_p(observed, shares, lam, ordering, replicates, seed):
    rng = np.random.default_rng(seed)
    n = int(sum(observed))
    draws = rng.multinomial(n, shares, size=replicates)
    if ordering == "probability":
        logp = np.log(np.asarray(shares))
        lp = lambda x: (x * logp - special.gammaln(x + 1)).sum(axis=1)
        obs_lp = float(lp(np.asarray([observed], dtype=float))[0])
        hits = int(np.sum(lp(draws.astype(float)) <= obs_lp + 1e-9 * abs(obs_lp)))
    else:
        e = n * np.asarray(shares)
        t_obs = float(pd_statistic([observed], e, lam)[0])
        hits = int(np.sum(pd_statistic(draws, e, lam) >= t_obs * (1 - 1e-9)))
    return (hits + 1) / (replicates + 1)


# ---------------------------------------------------------------------------------------------

paths = sorted(glob.glob(os.path.join(EXAMPLES, "*.json")))
check(len(paths) > 0, f"examples found in {EXAMPLES}")
stems = [os.path.splitext(os.path.basename(p))[0] for p in paths]
for kind in KINDS:
    check(kind in stems, f"an example for model kind {kind} (docs/examples/{kind}.json)")

for path in paths:
    name = os.path.basename(path)
    with open(path, encoding="utf-8") as f:
        doc_in = json.load(f)
    r = subprocess.run([TOOL, "--json", path], capture_output=True, text=True, timeout=120)
    check(r.returncode == 0, f"{name}: exit 0 (got {r.returncode}: {r.stderr.strip()})")
    try:
        out = json.loads(r.stdout)
    except ValueError:
        check(False, f"{name}: output is JSON ({r.stdout[:200]!r})")
        continue
    check("error" not in out, f"{name}: no error ({out.get('error')})")
    if "error" in out:
        continue
    kind = doc_in["model"]["kind"]
    check(out["model"]["kind"] == kind and os.path.splitext(name)[0] == kind, f"{name}: named after its model kind")

    stat = out["statistic"]
    contributions = out["contributions"]
    check(close(math.fsum(contributions), stat, 1e-9, 1e-300), f"{name}: statistic {stat} = sum of contributions {math.fsum(contributions)}")
    for key in ("p_value", "asymptotic_p_value", "lower_p_value"):
        check(out[key] is not None and 0 <= out[key] <= 1, f"{name}: 0 <= {key} <= 1 ({out[key]})")
    k_tested = len(out["tested_observed"])
    check(out["df"] == k_tested - 1 - out["estimated_parameters"],
          f"{name}: df {out['df']} = k_tested {k_tested} - 1 - estimated {out['estimated_parameters']}")
    check(sum(out["observed"]) == out["n"] and sum(out["tested_observed"]) == out["n"], f"{name}: counts total N")
    check(out["estimated_parameters"] >= doc_in.get("extra_estimated_parameters", 0),
          f"{name}: estimated_parameters includes extra_estimated_parameters")
    # The tested cells are sums of the categories the merge map names.
    for g, cell_obs, cell_exp in zip(out["merge_map"], out["tested_observed"], out["tested_expected"]):
        check(cell_obs == sum(out["observed"][i] for i in g), f"{name}: tested observed follow merge_map")
        check(close(cell_exp, math.fsum(out["expected_counts"][i] for i in g), 1e-12), f"{name}: tested expected follow merge_map")
    check(out["merged"] == any(len(g) > 1 for g in out["merge_map"]), f"{name}: merged flag matches merge_map")
    if out["method"] == "monte-carlo":
        mc = out["monte_carlo"]
        check(close(out["p_value"], (mc["hits"] + 1) / (mc["replicates"] + 1), 1e-15),
              f"{name}: Monte Carlo p = (b + 1) / (B + 1)")
        check(mc["seed"] == doc_in["pvalue"].get("seed", 1), f"{name}: Monte Carlo seed reported back")
    if doc_in.get("pvalue", {}).get("method", "asymptotic") != "asymptotic":
        check(out["method"] == doc_in["pvalue"]["method"], f"{name}: the requested p-value method was used ({out['method']})")
    # Effect sizes, closed forms (Cohen 1988; Ben-Shachar et al. 2023).
    n = out["n"]
    # w and Fei are corrected for chance (docs/methods.md); cohen_w is the uncorrected sqrt(X2 / N).
    w = out["effect_size"]["w"]
    check(close(w, math.sqrt(max(0.0, stat - out["df"]) / n), 1e-13, 1e-15), f"{name}: w = sqrt(max(0, X2 - df) / N)")
    check(close(out["effect_size"]["cohen_w"], math.sqrt(stat / n), 1e-13), f"{name}: cohen_w = sqrt(X2 / N)")
    p_min = min(out["tested_expected"]) / n
    if out["effect_size"]["fei"] is not None:
        check(close(out["effect_size"]["fei"], min(1.0, math.sqrt(max(0.0, stat - out["df"]) / (n * (1 / p_min - 1)))), 1e-12, 1e-15),
              f"{name}: Fei = sqrt(max(0, X2 - df) / (N (1/p_min - 1)))")
    # Digit laws: mean absolute deviation of the shares.
    if digit_shares(kind) is not None and not out["merged"]:
        ds = digit_shares(kind)
        mad = sum(abs(o / n - e) for o, e in zip(out["observed"], ds)) / len(ds)
        check(close(out["mad"], mad, 1e-12), f"{name}: MAD {out['mad']} vs closed form {mad}")

    if not HAVE_SCIPY:
        continue

    # Expected shares from an independent source.
    k = len(out["observed"])
    if kind in ("equal", "shares", "ratio", "counts"):
        ref = stated_shares(doc_in, k)
    elif digit_shares(kind) is not None:
        ref = digit_shares(kind)
    else:
        ref = fitted_shares(doc_in, out["estimates"])
    for i, (got, want) in enumerate(zip(out["expected_shares"], ref)):
        check(close(got, want, 1e-9, 1e-15), f"{name}: expected share {i} {got} vs reference {want}")
    check(close(math.fsum(out["expected_counts"]), n, 1e-12), f"{name}: expected counts total N")
    if kind in FREE:
        est = dict(out["estimates"])
        estimated = [p for p in FREE[kind] if p in out["estimated"]]
        ll = grouped_loglik(doc_in, est, out["observed"])
        for p in estimated:
            for step in (1 + 1e-4, 1 - 1e-4):
                moved = dict(est)
                moved[p] = est[p] * step
                if p == "p" and not 0 < moved[p] < 1:
                    continue
                check(grouped_loglik(doc_in, moved, out["observed"]) <= ll + 1e-12 * abs(ll),
                      f"{name}: {p} = {est[p]} maximises the grouped log-likelihood (x{step})")

    # Statistic and asymptotic p-value against SciPy.
    lam = out["lambda"]
    williams = doc_in.get("statistic", {}).get("williams", False)
    ddof = out["estimated_parameters"]
    sp = stats.power_divergence(out["tested_observed"], f_exp=out["tested_expected"], ddof=ddof, lambda_=lam)
    sp_stat, sp_p = float(sp.statistic), float(sp.pvalue)
    if williams:
        q = 1 + (k_tested + 1) / (6 * n)
        check(close(out["williams_q"], q, 1e-14), f"{name}: Williams q {out['williams_q']} vs 1 + (k + 1)/(6N) = {q}")
        sp_stat = sp_stat / q
        sp_p = float(stats.chi2.sf(sp_stat, k_tested - 1 - ddof))
    check(close(stat, sp_stat, 1e-11), f"{name}: statistic {stat} vs SciPy {sp_stat}")
    check(close(out["asymptotic_p_value"], sp_p, 1e-10), f"{name}: asymptotic p {out['asymptotic_p_value']} vs SciPy {sp_p}")
    if lam == 1 and not williams:
        cs = stats.chisquare(out["tested_observed"], f_exp=out["tested_expected"], ddof=ddof)
        check(close(out["asymptotic_p_value"], float(cs.pvalue), 1e-10), f"{name}: p vs scipy.stats.chisquare")
    check(close(out["critical_value"], float(stats.chi2.isf(out["alpha"], out["df"])), 1e-10), f"{name}: critical value vs chi2.isf")
    check(out["reject"] == (out["p_value"] <= out["alpha"]), f"{name}: reject iff p <= alpha")

    # w interval ends invert the noncentral chi-square (Steiger and Fouladi 1997).
    lo, hi = out["effect_size"]["w_interval"]
    df = out["df"]
    if lo is not None and lo > 0:
        check(close(float(stats.ncx2.sf(stat, df, n * lo * lo)), 0.025, 1e-6), f"{name}: w interval lower end (ncx2.sf = 0.025)")
    if hi is not None and hi > 0:
        check(close(float(stats.ncx2.cdf(stat, df, n * hi * hi)), 0.025, 1e-6), f"{name}: w interval upper end (ncx2.cdf = 0.025)")

    # Power and sample size (Cohen 1988, ch. 7): noncentral chi-square at the central critical value.
    if "plan" in out and "error" not in out["plan"]:
        pl = out["plan"]
        crit = stats.chi2.isf(pl["alpha"], pl["df"])
        power = lambda N: float(stats.ncx2.sf(crit, pl["df"], N * pl["w"] ** 2))
        check(close(pl["power"], power(pl["n"]), 1e-9), f"{name}: power {pl['power']} vs ncx2 {power(pl['n'])}")
        nr = pl["n_required"]
        check(power(nr) >= pl["target_power"] and power(nr - 1) < pl["target_power"],
              f"{name}: n_required {nr} is the smallest N with power >= {pl['target_power']}")

    # Exact p-value by brute force; Monte Carlo against an independent simulation.
    shares_tested = [e / n for e in out["tested_expected"]]
    ordering = doc_in.get("pvalue", {}).get("ordering", "statistic")
    if out["method"] == "exact":
        bf = exact_p_brute_force(out["tested_observed"], shares_tested, lam, ordering)
        check(close(out["p_value"], bf, 1e-9), f"{name}: exact p {out['p_value']} vs brute-force enumeration {bf}")
    if out["method"] == "monte-carlo":
        B = 200000
        ref_p = simulated_p(out["tested_observed"], shares_tested, lam, ordering, B, 12345)
        mc = out["monte_carlo"]
        se = math.sqrt(mc["se"] ** 2 + ref_p * (1 - ref_p) / B)
        check(abs(out["p_value"] - ref_p) <= 5 * se,
              f"{name}: Monte Carlo p {out['p_value']} vs NumPy simulation {ref_p} (5 SE = {5 * se:.2g})")

status = "FAILED" if failures else "ok"
print(f"documented examples: {len(paths)} documents, {checks} checks, {len(failures)} failures"
      f"{'' if HAVE_SCIPY else ' (SciPy comparisons skipped)'}: {status}")
sys.exit(1 if failures else 0)
