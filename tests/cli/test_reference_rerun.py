#!/usr/bin/python3
"""Reruns a sample of analyses (the demo scenarios and the documented examples with a stated
mix or digit law, Pearson statistic) through R 4.2's chisq.test (Debian r-base-core) and
compares statistic, p-value, Pearson residuals and standardised residuals with the tool's.
Skipped with a message when Rscript is absent. Usage: test_reference_rerun.py PATH_TO_TALLYPROOF"""
import glob
import json
import os
import shutil
import subprocess
import sys

tool = sys.argv[1]
if not shutil.which("Rscript"):
    print("skip: Rscript (r-base-core) not installed; R rerun not done")
    sys.exit(0)
here = os.path.dirname(os.path.abspath(__file__))
top = os.path.join(here, "..", "..")
files = sorted(glob.glob(os.path.join(top, "assets", "demos", "*.json")) + glob.glob(os.path.join(top, "docs", "examples", "*.json")))
cases = []
for path in files:
    doc = json.load(open(path, encoding="utf-8"))
    kind = doc.get("model", {}).get("kind", "equal")
    lam = doc.get("statistic", {}).get("lambda", 1)
    if kind not in ("equal", "shares", "ratio", "counts", "benford-first", "benford-second", "last-digit") or lam != 1:
        continue
    if doc.get("merge", {}).get("rule", "none") != "none":
        continue
    out = json.loads(subprocess.run([tool, "--json", path], capture_output=True, text=True, timeout=60).stdout)
    if "error" in out:
        print(f"FAIL {os.path.basename(path)}: {out['error']}")
        sys.exit(1)
    cases.append((os.path.basename(path), out))

script = ["library(stats)", "cases <- list()"]
for i, (_, out) in enumerate(cases):
    x = ",".join(str(int(v)) for v in out["tested_observed"])
    p = ",".join(repr(v / out["n"]) for v in out["tested_expected"])
    script.append(f"r <- suppressWarnings(chisq.test(c({x}), p = c({p}), rescale.p = TRUE))")
    script.append("cat(sprintf('%.17g', r$statistic), sprintf('%.17g', r$p.value), sprintf('%.17g', r$residuals), "
                  "sprintf('%.17g', r$stdres), '\\n')")
r = subprocess.run(["Rscript", "-e", "\n".join(script)], capture_output=True, text=True, timeout=120)
if r.returncode != 0:
    print("FAIL: Rscript:", r.stderr[:500])
    sys.exit(1)
lines = [l.split() for l in r.stdout.strip().split("\n")]
failures = 0


def close(a, b, rel, abs_tol=1e-300):
    return abs(a - b) <= max(rel * abs(b), abs_tol)


for (name, out), values in zip(cases, lines):
    k = len(out["tested_observed"])
    vals = [float(v) for v in values]
    stat, p, res, stdres = vals[0], vals[1], vals[2:2 + k], vals[2 + k:2 + 2 * k]
    problems = []
    if not close(out["statistic"], stat, 1e-12): problems.append(f"statistic {out['statistic']} vs R {stat}")
    if not close(out["p_value"] if out["method"] == "asymptotic" else out["asymptotic_p_value"], p, 1e-11): problems.append(f"p vs R {p}")
    for i in range(k):
        if not close(out["pearson_residuals"][i], res[i], 1e-11, 1e-13): problems.append(f"residual {i}")
        if not close(out["adjusted_residuals"][i], stdres[i], 1e-11, 1e-13): problems.append(f"stdres {i}")
    if problems:
        failures += 1
        print(f"FAIL {name}: " + "; ".join(problems))
print(f"R rerun: {len(cases)} analyses compared with chisq.test, {failures} failures")
sys.exit(1 if failures or not cases else 0)
