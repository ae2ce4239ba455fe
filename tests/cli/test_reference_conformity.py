#!/usr/bin/python3
"""Command-line checks of --model reference-sample and --conformity against SciPy 1.10
(chi2_contingency(correction=False), ncx2.cdf), and their usage errors.
Usage: test_reference_conformity.py PATH_TO_TALLYPROOF"""
import json
import subprocess
import sys

from scipy.stats import chi2_contingency, ncx2

tool = sys.argv[1]
failures = 0


def run(args, text):
    return subprocess.run([tool] + args, input=text, capture_output=True, text=True, timeout=60)


def check(name, ok, detail=""):
    global failures
    print(("ok   " if ok else "FAIL ") + name + ("" if ok else ": " + detail))
    failures += not ok


paste = "A\t150\nB\t420\nC\t190\nD\t40\n"
out = run(["--json", "--model", "reference-sample", "--values", "140,390,230,40"], paste)
doc = json.loads(out.stdout)
stat, p, df, exp = chi2_contingency([[150, 420, 190, 40], [140, 390, 230, 40]], correction=False)
check("statistic (SciPy chi2_contingency)", abs(doc["statistic"] - stat) < 1e-10 * stat, str(doc.get("statistic")))
check("p (SciPy chi2_contingency)", abs(doc["p_value"] - p) < 1e-10 * p, str(doc.get("p_value")))
check("df", doc["df"] == 3)
check("expected of the current sample", all(abs(a - b) < 1e-9 for a, b in zip(doc["tested_expected"], exp[0])))
check("reference section", doc["reference_sample"]["n"] == 800 and doc["reference_sample"]["observed"] == [140, 390, 230, 40])
out = run(["--writeup", "plain", "--model", "reference-sample", "--values", "140,390,230,40"], paste)
check("write-up names the previous sample", "compared with the previous sample of N = 800" in out.stdout, out.stdout)

out = run(["--model", "reference-sample", "--values", "140,390,230"], paste)
check("reference of a different length is refused", out.returncode == 1 and "previous sample has 3 counts" in out.stderr, out.stderr)
out = run(["--model", "reference-sample", "--values", "0,0,0,0"], paste)
check("all-zero reference is refused", out.returncode == 1 and "previous sample are zero" in out.stderr, out.stderr)

even = "A\t330\nB\t352\nC\t338\n"
out = run(["--json", "--conformity", "0.1"], even)
c = json.loads(out.stdout)["conformity"]
x2 = json.loads(out.stdout)["statistic"]
check("conformity p (SciPy ncx2.cdf)", abs(c["p_value"] - ncx2.cdf(x2, 2, 1020 * 0.01)) < 1e-8 * c["p_value"], str(c))
check("conforms", c["conforms"] is True and 0 < c["smallest_margin_w"] < 0.1, str(c))
for bad in ["0", "1.5", "-0.2", "x"]:
    out = run(["--conformity", bad], even)
    check("--conformity " + bad + " is a usage error", out.returncode == 2 and "--conformity" in out.stderr, out.stderr)
out = run(["--json", "--conformity", "0.1", "--model", "poisson"], "0\t40\n1\t35\n2\t17\n3 or more\t8\n")
d = json.loads(out.stdout)
check("fitted parameters: conformity explained, not computed", "fitted model" in d["conformity"].get("error", ""), out.stdout[:300])
sys.exit(1 if failures else 0)
