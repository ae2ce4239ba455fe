#!/usr/bin/python3
"""Chi-square upper-tail accuracy of Tallyproof, R 4.2 (pchisq) and SciPy 1.10 (chi2.sf / logsf)
against mpmath 1.2 at 50 significant digits, over df 1 ... 1e6 and statistics far into the tail.
A benchmark helper that prints figures (JSON on stdout), not a test.
Usage: tail_accuracy.py PATH_TO_bench_tail_grid OUT_FOLDER"""
import csv
import json
import math
import os
import subprocess
import sys
import time

import mpmath as mp
import scipy
from scipy.stats import chi2

mp.mp.dps = 50
DBL_MIN = 2.2250738585072014e-308  # smallest normal double: below it a double no longer holds p to full precision
DFS = [1, 2, 3, 5, 10, 30, 100, 300, 1e3, 3e3, 1e4, 1e5, 1e6]
MULTIPLES = [0.001, 0.1, 0.5, 0.9, 1, 1.1, 1.5, 2, 3, 5, 10, 20, 50, 100, 1000]
Z = [2, 5, 10, 20, 40, 80]
ABSOLUTE = [50, 500, 5000, 50000, 1e6, 1e7]


def grid():
    rows = set()
    for df in DFS:
        for m in MULTIPLES:
            rows.add((df, df * m))
        for z in Z:
            rows.add((df, df + z * math.sqrt(2 * df)))
        for x in ABSOLUTE:
            rows.add((df, float(x)))
    return sorted(rows)


def reference(rows):
    """log10 of the upper tail Q(df/2, x/2) in 50-digit arithmetic, at the exact double df and x."""
    out = []
    for df, x in rows:
        q = mp.gammainc(mp.mpf(df) / 2, mp.mpf(x) / 2, mp.inf, regularized=True)
        out.append((float(mp.log10(q)) if q > 0 else -math.inf, float(q)))  # float(q): p rounded once
    return out


def run_tallyproof(tool, grid_csv):
    t0 = time.perf_counter()
    p = subprocess.run([tool, grid_csv], capture_output=True, text=True, check=True)
    wall = time.perf_counter() - t0
    r = list(csv.DictReader(p.stdout.splitlines()))
    return [float(x["p"]) for x in r], [float(x["log10_p"]) for x in r], wall


def run_r(grid_csv, out_csv):
    script = f"""
d <- read.csv("{grid_csv}", comment.char = "#")
p <- pchisq(d$x, d$df, lower.tail = FALSE)
lp <- pchisq(d$x, d$df, lower.tail = FALSE, log.p = TRUE) / log(10)
writeLines(c("p,log10_p", sprintf("%.17g,%.17g", p, lp)), "{out_csv}")
cat(R.version.string, "\\n")
"""
    t0 = time.perf_counter()
    p = subprocess.run(["Rscript", "-e", script], capture_output=True, text=True, check=True)
    wall = time.perf_counter() - t0
    r = list(csv.DictReader(open(out_csv)))
    return [float(x["p"]) for x in r], [float(x["log10_p"]) for x in r], wall, p.stdout.strip()


def run_scipy(rows):
    import numpy as np
    df = np.array([r[0] for r in rows])
    x = np.array([r[1] for r in rows])
    with np.errstate(all="ignore"):
        p = chi2.sf(x, df)
        lp = chi2.logsf(x, df) / math.log(10)
    return [float(v) for v in p], [float(v) for v in lp]


def score(ref_log10, p, log10_p):
    worst_rel, at_rel = 0.0, None
    worst_log, at_log, worst_log_rel = 0.0, None, 0.0
    zeros = zeros_in_range = bad_log = 0
    for i, (lr, true_p) in enumerate(ref_log10):
        if p[i] == 0:
            zeros += 1
        if true_p >= DBL_MIN:
            if p[i] == 0:
                zeros_in_range += 1
            rel = abs(p[i] - true_p) / true_p if math.isfinite(p[i]) else math.inf
            # 10**lr itself carries the rounding of a double: relative errors below ~1e-15 are noise
            if rel > worst_rel:
                worst_rel, at_rel = rel, i
        else:
            err = abs(log10_p[i] - lr) if math.isfinite(log10_p[i]) else math.inf
            worst_log_rel = max(worst_log_rel, err / abs(lr))
            if not math.isfinite(log10_p[i]):
                bad_log += 1
            if err > worst_log:
                worst_log, at_log = err, i
    return {"worst_relative_error_p": worst_rel, "at_rel": at_rel, "worst_abs_error_log10_beyond": worst_log,
            "worst_rel_error_log10_beyond": worst_log_rel,
            "at_log": at_log, "returned_zero": zeros, "zero_where_double_holds_p": zeros_in_range,
            "log10_not_finite_beyond": bad_log}


def main():
    tool, folder = sys.argv[1], sys.argv[2]
    os.makedirs(folder, exist_ok=True)
    rows = grid()
    grid_csv = os.path.join(folder, "tail_grid.csv")
    with open(grid_csv, "w") as f:
        f.write("# chi-square upper-tail grid: df, x (tests/bench/tail_accuracy.py)\ndf,x\n")
        for df, x in rows:
            f.write("%.17g,%.17g\n" % (df, x))
    t0 = time.perf_counter()
    ref = reference(rows)
    t_ref = time.perf_counter() - t0
    tp, tl, t_tp = run_tallyproof(tool, grid_csv)
    rp, rl, t_r, r_version = run_r(grid_csv, os.path.join(folder, "tail_r.csv"))
    t0 = time.perf_counter()
    sp, sl = run_scipy(rows)
    t_sp = time.perf_counter() - t0
    beyond = sum(1 for _, v in ref if v < DBL_MIN)
    result = {"rows": len(rows), "rows_beyond_double": beyond, "df_range": [DFS[0], DFS[-1]],
              "x_max": max(x for _, x in rows), "most_negative_log10_p": min(l for l, _ in ref),
              "mpmath": mp.__version__, "mpmath_seconds": t_ref, "scipy": scipy.__version__, "r": r_version,
              "tools": {}}
    for name, p, l, wall in (("tallyproof", tp, tl, t_tp), ("R pchisq", rp, rl, t_r), ("SciPy chi2.sf", sp, sl, t_sp)):
        s = score(ref, p, l)
        for key in ("at_rel", "at_log"):
            i = s.pop(key)
            s[key.replace("at_", "where_")] = None if i is None else {"df": rows[i][0], "x": rows[i][1], "log10_p": ref[i][0]}
        s["seconds_whole_run"] = wall
        result["tools"][name] = s
    print(json.dumps(result, indent=1))


if __name__ == "__main__":
    main()
