"""Every verdict answers the question asked, and the result document keeps its word (issues 27
and 31). References are named beside each check: SciPy 1.10 (ncx2, chi2, norm, brentq),
mpmath 1.2 at 50 digits, statsmodels 0.13, R 4.2 (fisher.test through Rscript), brute-force
enumeration written here, and closed forms from docs/methods.md.

usage: test_cli_verdicts.py PATH_TO_TALLYPROOF"""
import json
import math
import os
import random
import shutil
import subprocess
import tempfile

from cli_common import check, close, finish, run

try:
    import numpy as np
    from scipy import optimize, stats
    HAVE_SCIPY = True
except ImportError:  # the checks that need SciPy say so and are skipped
    HAVE_SCIPY = False
try:
    import mpmath as mp
    HAVE_MPMATH = True
except ImportError:
    HAVE_MPMATH = False


def doc(args, stdin):
    r = run(["--json"] + args, stdin)
    try:
        return json.loads(r.stdout), r
    except ValueError:
        return None, r


def paste(labels, counts):
    return "".join(f"{l}\t{c}\n" for l, c in zip(labels, counts))


def w_bounds_scipy(x, df, n, level=0.95):
    """Steiger and Fouladi (1997) noncentrality interval by SciPy ncx2 and brentq, as w = sqrt(lambda/N)."""
    tail = (1 - level) / 2
    lo = 0.0
    if stats.chi2.sf(x, df) < tail:
        lo = optimize.brentq(lambda l: stats.ncx2.sf(x, df, l) - tail, 1e-12, 10 * x + 100, xtol=1e-12)
    hi = 0.0
    if stats.chi2.cdf(x, df) > tail:
        hi = optimize.brentq(lambda l: stats.ncx2.cdf(x, df, l) - tail, 1e-12, 10 * x + 100, xtol=1e-12)
    return math.sqrt(lo / n), math.sqrt(hi / n)


# --- Issue 31: effect sizes beside their own intervals -----------------------------------------
# The k = 1000, N = 10 000 sample drawn from equal shares (Python's random, seed 31, stable
# across versions): the chance-corrected w is 0 or near it, "very small", inside its interval;
# Cohen's uncorrected w reads about sqrt(999/10000) = 0.32 (docs/methods.md).
rng = random.Random(31)
null_counts = [0] * 1000
for _ in range(10000):
    null_counts[rng.randrange(1000)] += 1
d, r = doc([], paste([f"c{i}" for i in range(1000)], null_counts))
check(d is not None and r.returncode == 0, f"k = 1000 null sample analysed: {r.stderr}")
if d:
    e = d["effect_size"]
    x, df, n = d["statistic"], d["df"], d["n"]
    # Definition in docs/methods.md: w = sqrt(max(0, X2 - df) / N), Cohen's w = sqrt(X2 / N).
    check(close(e["w"], math.sqrt(max(0.0, x - df) / n), 1e-12), f"w is the chance-corrected estimate: {e['w']}")
    check(close(e["cohen_w"], math.sqrt(x / n), 1e-12), f"cohen_w is sqrt(X2/N): {e['cohen_w']}")
    check(e["w_label"] == "very small", f"the null sample's w is labelled very small: {e['w_label']}")
    check(e["cohen_w_label"] in ("small", "medium"), f"Cohen's uncorrected w keeps its own label: {e['cohen_w_label']}")
    lo, hi = e["w_interval"]
    check(lo <= e["w"] <= hi, f"w {e['w']} inside w_interval {e['w_interval']}")
    check(e["fei"] is not None and e["fei_interval"][0] <= e["fei"] <= e["fei_interval"][1],
          f"fei {e['fei']} inside fei_interval {e.get('fei_interval')}")
    if HAVE_SCIPY:
        slo, shi = w_bounds_scipy(x, df, n)
        check(close(lo, slo, 1e-6, 1e-9) and close(hi, shi, 1e-6), f"w_interval {e['w_interval']} vs SciPy ncx2 [{slo}, {shi}]")
    else:
        print("skipped: SciPy ncx2 check of the k = 1000 interval (no SciPy)")


# A walk over every member of a result document that carries an interval: each point lies inside
# its interval ("X" beside "X_interval"), and each tested share inside its simultaneous intervals.
def walk_intervals(d, where):
    found = 0

    def visit(node, path):
        nonlocal found
        if isinstance(node, dict):
            for key, value in node.items():
                if key.endswith("_interval") and isinstance(value, list) and len(value) == 2:
                    point = node.get(key[: -len("_interval")])
                    found += 1
                    if point is None or value[0] is None or value[1] is None:
                        check(bool(d.get("warnings")) or "note" in node,
                              f"{where}: {path}.{key} missing, and the document says why")
                    else:
                        check(value[0] - 1e-12 <= point <= value[1] + 1e-12,
                              f"{where}: {path}.{key[:-9]} = {point} inside {value}")
                visit(value, f"{path}.{key}")
        elif isinstance(node, list):
            for i, v in enumerate(node):
                visit(v, f"{path}[{i}]")

    visit(d, "")
    iv = d.get("intervals")
    if iv:
        shares = [o / d["n"] for o in d["tested_observed"]]
        for lo_key, hi_key in (("lower", "upper"), ("goodman_lower", "goodman_upper")):
            for i, s in enumerate(shares):
                lo, hi = iv[lo_key][i], iv[hi_key][i]
                if lo is None or hi is None:
                    check("note" in iv, f"{where}: {lo_key}[{i}] null with a note saying why")
                else:
                    found += 1
                    check(lo <= s <= hi, f"{where}: observed share {s} inside {lo_key}/{hi_key} [{lo}, {hi}]")
    return found


paths = {
    "fitted Poisson": (["--model", "poisson"], paste(range(7), [12, 30, 25, 15, 8, 3, 1])),
    "digit law": (["--model", "benford-first"], paste(range(1, 10), [31, 17, 12, 10, 8, 7, 6, 5, 4])),
    "previous sample": (["--third-column", "previous"], "Type\tNow\tLast month\nA\t30\t25\nB\t42\t50\nC\t18\t20\nD\t10\t5\n"),
    "shares with conformity": (["--model", "shares", "--values", "0.4,0.3,0.2,0.1", "--conformity", "0.2"],
                               paste("ABCD", [205, 148, 97, 50])),
}
for name, (args, text) in paths.items():
    d, r = doc(args, text)
    check(d is not None and "error" not in d, f"{name}: analysed ({r.stderr.strip()})")
    if d:
        check(walk_intervals(d, name) >= 1, f"{name}: at least one interval walked")
        e = d["effect_size"]
        check(close(e["w"], math.sqrt(max(0.0, d["statistic"] - d["df"]) /
                                      (d["reference_sample"]["n_total"] if "reference_sample" in d else d["n"])), 1e-12),
              f"{name}: effect_size.w is the chance-corrected estimate")

# Screens: each group's w is the chance-corrected one, cohen_w the uncorrected (same definitions).
long_table = "group\tcategory\tcount\n" + "".join(f"{g}\t{c}\t{n}\n" for g, row in
                                                 (("north", (30, 20, 25, 25)), ("south", (60, 10, 15, 15)), ("east", (26, 24, 25, 25)))
                                                 for c, n in zip("ABCD", row))
d, r = doc(["--by", "group"], long_table)
check(d is not None and "groups" in d, f"screen analysed: {r.stderr}")
if d:
    for g in d["groups"]:
        n = g["n"]
        check(close(g["w"], math.sqrt(max(0.0, g["statistic"] - g["df"]) / n), 1e-12), f"screen {g['name']}: w chance-corrected")
        check(close(g["cohen_w"], math.sqrt(g["statistic"] / n), 1e-12), f"screen {g['name']}: cohen_w = sqrt(X2/N)")

# --- Issue 31: every refusal under --json is a document on standard output ----------------------
tmp = tempfile.mkdtemp(prefix="tp_verdicts_")
try:
    binary = os.path.join(tmp, "binary.dat")
    with open(binary, "wb") as f:
        f.write(b"A\t12\nB\x00\x01\x02\t9\n")
    cases = [("a binary file (NUL bytes)", ["--json", binary], None, 1),
             ("a directory", ["--json", tmp], None, 2),
             ("a missing file", ["--json", os.path.join(tmp, "absent.txt")], None, 2),
             ("an unknown option", ["--bogus", "--json"], "A\t1\nB\t2\n", 2),
             ("an unknown option before --json", ["--json-ish", "--json", "-"], "A\t1\nB\t2\n", 2),
             ("a bad --alpha", ["--json", "--alpha", "2", "-"], "A\t1\nB\t2\n", 2),
             ("binary on standard input", ["--json", "-"], b"\x00\x00\x00", 1),
             ("refused data", ["--json", "-"], "A\t-1\nB\t2\n", 1)]
    for what, args, stdin, status in cases:
        r = subprocess.run([__import__("cli_common").TOOL] + args, input=stdin, capture_output=True,
                           text=not isinstance(stdin, bytes) and stdin is not None)
        out = r.stdout if isinstance(r.stdout, str) else r.stdout.decode("utf-8", "replace")
        err = r.stderr if isinstance(r.stderr, str) else r.stderr.decode("utf-8", "replace")
        try:
            d = json.loads(out)
        except ValueError:
            d = None
        check(d is not None and d.get("format") == "tallyproof/1" and d.get("error"),
              f"--json with {what}: an error document on standard output ({out!r})")
        check(err.strip() != "", f"--json with {what}: the message on standard error too")
        check(r.returncode == status, f"--json with {what}: exit status {r.returncode}, README says {status}")
finally:
    shutil.rmtree(tmp)

# --- Issue 27: conformity p and decision over the whole range -----------------------------------
# A perfect fit: chi2 = 0 lies below every critical value; P(X <= 0) = 0 for the continuous
# noncentral chi-square (closed form), so the counts conform.
for counts in ([250, 250, 250, 250], [250_000_000_000_000] * 4):
    d, r = doc([], json.dumps({"observed": counts, "conformity": {"margin_w": 0.1}}))
    c = d["conformity"]
    check(c["conforms"] is True and c["p_value"] == 0, f"chi2 = 0 at N = {sum(counts)}: conforms, p = 0 ({c})")
    check(d["answer"]["test"] == "conformity" and d["goal"] == "conformity", "the answer leads with conformity")

# Monotone in chi2 and equal to SciPy ncx2.cdf(chi2, df, N w0^2) (rel 1e-8 where SciPy's value
# is above 1e-300); conforms exactly when p < alpha, and below the critical value.
previous_p = -1.0
for step in range(0, 60, 3):
    counts = [250 + step, 250 - step, 250, 250]
    d, r = doc([], json.dumps({"observed": counts, "conformity": {"margin_w": 0.1}}))
    c = d["conformity"]
    p = c["p_value"]
    check(p is not None and p >= previous_p, f"conformity p monotone in chi2 at shift {step}: {p} after {previous_p}")
    previous_p = p if p is not None else previous_p
    check(c["conforms"] == (p < 0.05) == (d["statistic"] < c["critical_value"]), f"shift {step}: one decision ({c})")
    if HAVE_SCIPY and d["statistic"] > 0:
        ref = stats.ncx2.cdf(d["statistic"], 3, 1000 * 0.01)
        if ref > 1e-300:
            check(close(p, ref, 1e-8), f"shift {step}: conformity p {p} vs SciPy ncx2.cdf {ref}")

# Noncentrality above 1e5 (the saddlepoint branch): N = 4e8, w0 = 0.1 gives 4e6; SciPy ncx2
# (Boost underneath) at points around the critical value, rel 1e-4.
if HAVE_SCIPY:
    n = 400_000_000
    crit = stats.ncx2.ppf(0.05, 3, n * 0.01)
    for frac in (0.998, 0.999, 1.0, 1.001):
        target = crit * frac  # counts whose X2 is near target: shift d with 2 d^2 / (N/4) * 2 = X2
        shift = round(math.sqrt(target * n / 4 / 2))
        counts = [n // 4 + shift, n // 4 - shift, n // 4, n // 4]
        d, r = doc([], json.dumps({"observed": counts, "conformity": {"margin_w": 0.1}}))
        c = d["conformity"]
        ref = stats.ncx2.cdf(d["statistic"], 3, n * 0.01)
        check(close(c["p_value"], ref, 1e-4, 1e-12), f"N = 4e8, X2 = {d['statistic']:.6g}: p {c['p_value']} vs SciPy ncx2 {ref}")
        check(close(c["critical_value"], crit, 1e-6), f"N = 4e8: critical value {c['critical_value']} vs SciPy ncx2.ppf {crit}")
else:
    print("skipped: SciPy checks of the conformity p-value (no SciPy)")

# N = 1e15 (noncentrality 1e13): mpmath's Edgeworth series from the exact cumulants of the
# noncentral chi-square (k1 = df + l, k2 = 2(df + 2l), k3 = 8(df + 3l); Johnson, Kotz and
# Balakrishnan 1995, ch. 29), whose next term is below 1e-12 there, at points near the critical
# value; and in the far tail (X2 = 3e-15) the Poisson mixture summed at 50 digits.
if HAVE_MPMATH:
    mp.mp.dps = 50
    n = 10 ** 15
    lam = mp.mpf(n) * mp.mpf("0.01")
    k1, k2, k3 = 3 + lam, 2 * (3 + 2 * lam), 8 * (3 + 3 * lam)
    gamma1 = k3 / k2 ** mp.mpf(1.5)

    def edgeworth_cdf(x):
        z = (mp.mpf(x) - k1) / mp.sqrt(k2)
        return mp.ncdf(z) - mp.npdf(z) * gamma1 / 6 * (z * z - 1)

    for shift in (40_000_000, 44_000_000, 46_000_000, 48_000_000):
        counts = [n // 4 + shift, n // 4 - shift, n // 4, n // 4]
        d, r = doc([], json.dumps({"observed": counts, "conformity": {"margin_w": 0.1}}))
        c = d["conformity"]
        ref = float(edgeworth_cdf(d["statistic"]))
        check(c["p_value"] is not None and close(c["p_value"], ref, 1e-5, 1e-15),
              f"N = 1e15, X2 = {d['statistic']:.8g}: conformity p {c['p_value']} vs mpmath Edgeworth {ref}")
        check(c["conforms"] == (ref < 0.05), f"N = 1e15, shift {shift}: decision {c['conforms']} vs reference p {ref}")
    counts = [250_000_000_000_000, 250_000_000_000_000, 250_000_000_000_000, 250_000_000_000_001]
    d, r = doc([], json.dumps({"observed": counts, "conformity": {"margin_w": 0.1}}))
    x = mp.mpf(d["statistic"])
    total = mp.mpf(0)
    for i in range(60):
        total += mp.exp(-lam / 2 + i * mp.log(lam / 2) - mp.loggamma(i + 1)) * mp.gammainc(mp.mpf(3) / 2 + i, 0, x / 2, regularized=True)
    ref_log10 = float(mp.log10(total))
    got = d["conformity"]["log10_p_value"]
    check(got is not None and close(got, ref_log10, 1e-9), f"N = 1e15 near-perfect fit: log10 p {got} vs mpmath mixture {ref_log10}")
    check(d["conformity"]["conforms"] is True, "N = 1e15 near-perfect fit conforms")
else:
    print("skipped: mpmath checks at N = 1e15 (no mpmath)")

# The margin in percentage points: moving d of share between the two smallest categories gives
# w^2 = d^2/p1 + d^2/p2 (closed form, docs/methods.md); the tool derives w0 from points that way
# and shows each with the other. Checked by building the shifted mix and computing its w.
shares = [0.5, 0.3, 0.15, 0.05]
d, r = doc(["--model", "shares", "--values", ",".join(map(str, shares)), "--conformity-points", "2"],
           paste("ABCD", [500, 300, 150, 50]))
c = d["conformity"]
shifted = [0.5, 0.3, 0.15 + 0.02, 0.05 - 0.02]
w_shift = math.sqrt(sum((q - p) ** 2 / p for q, p in zip(shifted, shares)))
check(close(c["margin_w"], w_shift, 1e-12), f"2 points between the two smallest shares is w0 = {w_shift}: {c['margin_w']}")
check(close(c["margin_points"], 2, 1e-12), "margin_points kept as entered")
check(("2 percentage points" in c["verdict"] or "2.0 percentage points" in c["verdict"]) and "w < 0.10" in c["verdict"], f"each margin shown with the other: {c['verdict']}")
d2, _ = doc(["--model", "shares", "--values", ",".join(map(str, shares)), "--conformity", str(w_shift)],
            paste("ABCD", [500, 300, 150, 50]))
check(close(d2["conformity"]["margin_points"], 2, 1e-9), f"w0 entered gives its points: {d2['conformity']['margin_points']}")
check(close(d2["conformity"]["p_value"], c["p_value"], 1e-9), "the same margin either way gives the same p")

# The goal leads: the report text and the write-up start with the conformity answer, the
# departure test second.
args = ["--model", "shares", "--values", "0.25,0.25,0.25,0.25", "--conformity", "0.1"]
text = paste("ABCD", [1010, 990, 1000, 1000])
rep = run(args + ["-"], text).stdout
lines = rep.splitlines()
check(len(lines) > 1 and lines[1].startswith("Answer (the goal is conformity): The counts conform"), f"report leads with conformity: {lines[:3]}")
check(rep.index("conform") < rep.index("p = "), "the conformity answer comes before the departure test's p")
wu = run(args + ["--writeup", "plain", "-"], text).stdout
check(wu.startswith("The counts conform to the stated mix"), f"write-up leads with the conformity answer: {wu[:80]}")
check("found no evidence against" in wu, "the departure test follows in the write-up")

# --- Issue 27: ordering by probability for a previous sample's exact p --------------------------
table_now, table_prev = [1, 1, 1, 9], [5, 4, 3, 0]
d, r = doc(["--third-column", "previous", "--method", "exact", "--ordering", "probability"],
           "".join(f"{l}\t{a}\t{b}\n" for l, a, b in zip("ABCD", table_now, table_prev)))
check(d["exact"]["ordering"] == "probability" and d["exact"]["method"] == "table-enumeration",
      f"exact.ordering and exact.method named: {d['exact']}")


def brute_force_fisher(row1, row2):
    """Every 2 x k table with the margins, multivariate hypergeometric, summed where its
    probability is at most the observed one's times 1 + 1e-7 (as R's fisher.test)."""
    cols = [a + b for a, b in zip(row1, row2)]
    m, total = sum(row1), sum(cols)

    def prob(xs):
        p = 1
        for x, c in zip(xs, cols):
            p *= math.comb(c, x)
        return p / math.comb(total, m)

    observed = prob(row1)
    acc = 0.0

    def rec(j, rem, xs):
        nonlocal acc
        if j == len(cols) - 1:
            if rem <= cols[j]:
                p = prob(xs + [rem])
                if p <= observed * (1 + 1e-7):
                    acc += p
            return
        for x in range(0, min(cols[j], rem) + 1):
            rec(j + 1, rem - x, xs + [x])

    rec(0, m, [])
    return acc


bf = brute_force_fisher(table_now, table_prev)
check(close(d["p_value"], bf, 1e-12), f"probability ordering: p {d['p_value']} vs brute-force enumeration {bf}")
if shutil.which("Rscript"):
    rr = subprocess.run(["Rscript", "-e", "cat(sprintf('%.17g', fisher.test(matrix(c(1,1,1,9,5,4,3,0), nrow=2, byrow=TRUE))$p.value))"],
                        capture_output=True, text=True)
    check(close(d["p_value"], float(rr.stdout), 1e-10), f"probability ordering: p {d['p_value']} vs R fisher.test {rr.stdout}")
else:
    print("skipped: R fisher.test check (no Rscript)")
d_stat, _ = doc(["--third-column", "previous", "--method", "exact"],
                "".join(f"{l}\t{a}\t{b}\n" for l, a, b in zip("ABCD", table_now, table_prev)))
check(d_stat["exact"]["ordering"] == "statistic" and d_stat["exact"]["method"] == "table-enumeration" and
      not close(d_stat["p_value"], d["p_value"], 1e-3), "statistic ordering named and different")
# Monte Carlo by probability approaches the exact p (20 000 replicates: within 4 standard errors).
d_mc, _ = doc(["--third-column", "previous", "--method", "monte-carlo", "--ordering", "probability", "--replicates", "20000"],
              "".join(f"{l}\t{a}\t{b}\n" for l, a, b in zip("ABCD", table_now, table_prev)))
check(d_mc["monte_carlo"]["ordering"] == "probability" and abs(d_mc["p_value"] - bf) < 4 * math.sqrt(bf / 20000) + 1e-4,
      f"Monte Carlo by probability {d_mc['p_value']} near the exact {bf}")

# --- Issue 27: Goodman intervals at any alpha ----------------------------------------------------
# [5, 5, 5] at alpha = 1e-17: Goodman's formula with the upper alpha/k point of chi2(1) from
# mpmath at 50 digits (the values the issue quotes, 0.0198698 / 0.9249921). statsmodels 0.13 itself
# returns NaN there (it takes chi2.ppf(1 - alpha/k), and 1 - 1e-17/3 is 1 in double), so it is the
# reference at alpha = 1e-9, where that form still holds (rel 1e-6).
def goodman_mpmath(counts, alpha):
    mp.mp.dps = 50
    k, n = len(counts), sum(counts)
    z = mp.findroot(lambda t: mp.erfc(t / mp.sqrt(2)) - mp.mpf(alpha) / k, 8)
    a = z * z
    out = []
    for x in counts:
        half = mp.sqrt(a * (a + 4 * x * (n - x) / mp.mpf(n)))
        out.append((float((a + 2 * x - half) / (2 * (n + a))), float((a + 2 * x + half) / (2 * (n + a)))))
    return out


d, r = doc(["--alpha", "1e-17"], paste("abc", [5, 5, 5]))
iv = d["intervals"]
check(all(v is not None for v in iv["goodman_lower"] + iv["goodman_upper"]), f"Goodman intervals given at alpha = 1e-17: {iv}")
check("note" in iv and "Sison-Glaz" in iv["note"], "the Sison-Glaz refusal says why")
if HAVE_MPMATH:
    ref = goodman_mpmath([5, 5, 5], 1e-17)
    for i, (lo, hi) in enumerate(ref):
        check(close(iv["goodman_lower"][i], lo, 1e-9) and close(iv["goodman_upper"][i], hi, 1e-9),
              f"alpha = 1e-17 Goodman [{iv['goodman_lower'][i]}, {iv['goodman_upper'][i]}] vs mpmath [{lo}, {hi}]")
table = run(["--alpha", "1e-17", "--table", "csv", "-"], paste("abc", [5, 5, 5])).stdout.splitlines()
check("Goodman" in table[0] and all(row.split(",")[-1] != "" for row in table[1:]),
      f"the table names Goodman and leaves no interval cell empty: {table[:2]}")
try:
    from statsmodels.stats.proportion import multinomial_proportions_confint
    d, r = doc(["--alpha", "1e-9"], paste("abcd", [40, 25, 20, 15]))
    ref = multinomial_proportions_confint([40, 25, 20, 15], alpha=1e-9, method="goodman")
    for i in range(4):
        check(close(d["intervals"]["goodman_lower"][i], ref[i][0], 1e-6) and close(d["intervals"]["goodman_upper"][i], ref[i][1], 1e-6),
              f"alpha = 1e-9 Goodman {i} vs statsmodels {ref[i]}")
except ImportError:
    print("skipped: statsmodels Goodman check (no statsmodels)")

# --- Issue 27: one rule for the drivers, named in the write-up -----------------------------------
text = paste("ABCDEF", [60, 20, 28, 40, 38, 14])
d, r = doc([], text)
rule = d["drivers_rule"]
adjusted = d["category_p_adjusted"]
want = [i for i, p in enumerate(adjusted) if p < d["alpha"]]
check(d["drivers"] == want, f"drivers are exactly the categories with Holm-adjusted p < alpha: {d['drivers']} vs {want}")
check("Holm" in rule, f"the rule is stated: {rule}")
wu = run(["--writeup", "plain", "-"], text).stdout
names = [d["tested_categories"][i] for i in want]
check(all(f"{nm} (" in wu for nm in names) and "drive" in wu, f"the write-up names the drivers {names}: {wu}")
rep = run(["-"], text).stdout
one = [ln for ln in rep.splitlines() if ln.startswith("Where it differs")]
if len(want) == 1:
    check(one and "categories drives the result" in one[0], f"one driver, singular verb: {one}")
else:
    check(one and "categories drive the result" in one[0], f"several drivers, plural verb: {one}")
d1, _ = doc([], paste("ABCDEF", [100, 100, 100, 100, 100, 160]))
check(len(d1["drivers"]) == 1, f"a one-driver case: {d1['drivers']}")
rep1 = run(["-"], paste("ABCDEF", [100, 100, 100, 100, 100, 160])).stdout
check("1 of 6 categories drives the result" in rep1, "grammar: 1 of 6 categories drives the result")

# --- Issue 27: consecutive whole-number labels, and the smaller items ----------------------------
d, r = doc([], paste(range(7), [12, 30, 25, 15, 8, 3, 1]))
check(d["ordered"] is True, "labels 0..6 tick 'Categories are in order'")
sug = d.get("model_suggestion", "")
check("Poisson" in sug and "negative binomial" in sug, f"the verdict under equal shares suggests count models: {sug}")
check("Suggestion: " in run(["-"], paste(range(7), [12, 30, 25, 15, 8, 3, 1])).stdout, "the report shows the suggestion")
d, r = doc(["--model", "poisson"], paste(range(7), [12, 30, 25, 15, 8, 3, 1]))
check("model_suggestion" not in d, "no suggestion once a count model is chosen")
d, r = doc([], paste(["red", "green", "blue"], [10, 12, 9]))
check(d["ordered"] is False, "text labels stay unordered")
r = run(["--model", "shares", "--values", "5:3:1:1", "-"], paste("ABCD", [48, 31, 12, 9]))
check(r.returncode == 1 and "Ratio" in r.stderr and "5:3:1:1" in r.stderr, f"5:3:1:1 as shares offers Ratio: {r.stderr}")
rep = run(["--merge", "all-5", "--model", "shares", "--values", "0.5,0.3,0.15,0.03,0.02", "-"], paste("ABCDE", [30, 18, 9, 2, 1])).stdout
check("must be recounted" not in rep and "degrees of freedom are counted on" in rep, f"merge note wording: {rep}")
check("a tiny value means too good a fit" in run(["-"], paste("ABC", [10, 12, 9])).stdout, "lower-tail p explained")

finish("test_cli_verdicts: all checks passed")
