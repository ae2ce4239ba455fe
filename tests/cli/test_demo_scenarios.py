#!/usr/bin/python3
"""Every demo scenario the page offers (assets/demos/*.json) must analyse without error, and its
figures must agree with SciPy 1.10 computed live on the same counts (skipped without SciPy).
Usage: test_demo_scenarios.py PATH_TO_TALLYPROOF"""
import glob
import json
import os
import subprocess
import sys

tool = sys.argv[1]
here = os.path.dirname(os.path.abspath(__file__))
demos = sorted(glob.glob(os.path.join(here, "..", "..", "assets", "demos", "*.json")))
failures = 0
try:
    from scipy.stats import chisquare
except ImportError:
    chisquare = None
    print("skip: scipy not installed; demo figures not cross-checked")
for path in demos:
    doc = json.load(open(path, encoding="utf-8"))
    r = subprocess.run([tool, "--json", path], capture_output=True, text=True, timeout=60)
    out = json.loads(r.stdout)
    name = os.path.basename(path)
    if r.returncode != 0 or "error" in out:
        print(f"FAIL {name}: {out.get('error')}")
        failures += 1
        continue
    for key in ("title", "story"):
        if not doc.get(key):
            print(f"FAIL {name}: no {key}")
            failures += 1
    if chisquare is not None:
        ddof = out["estimated_parameters"]
        ref = chisquare(out["tested_observed"], out["tested_expected"], ddof=ddof)
        if abs(ref.statistic - out["statistic"]) > 1e-9 * max(1, ref.statistic) or abs(ref.pvalue - out["p_value"]) > 1e-9:
            print(f"FAIL {name}: ours {out['statistic']}, {out['p_value']}; SciPy {ref.statistic}, {ref.pvalue}")
            failures += 1
print(f"demo scenarios: {len(demos)} checked, {failures} failures")
sys.exit(1 if failures or not demos else 0)
