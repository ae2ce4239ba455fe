#!/usr/bin/python3
"""Command-line checks of the design-corrected test on survey rows (--category, --weight,
--stratum, --cluster; --design-effect, --design-effects) against R survey 4.1-1
(tests/reference/survey_reference.csv, written by make_survey_reference.R from the invented
survey tests/reference/survey_respondents.csv), and the refusals of bad survey input.
Usage: test_cli_survey.py PATH_TO_TALLYPROOF"""
import csv
import json
import os

from cli_common import check, close, finish, run

HERE = os.path.dirname(os.path.abspath(__file__))
REF = os.path.join(HERE, "..", "reference")
DATA = os.path.join(REF, "survey_respondents.csv")

DESIGN_OPTIONS = {
    "weights": ["--weight", "weight"],
    "strata": ["--weight", "weight", "--stratum", "region"],
    "clusters": ["--weight", "weight", "--stratum", "2", "--cluster", "store"],  # a column by number too
    "clusters_only": ["--weight", "4", "--cluster", "store"],
}

with open(os.path.join(REF, "survey_reference.csv"), newline="") as f:
    rows = [r for r in csv.reader(line for line in f if not line.startswith("#"))]
header, rows = rows[0], rows[1:]
check(len(rows) == 12, "twelve reference rows")
for row in rows:
    ref = dict(zip(header, row))
    name = ref["design"] + "/" + ref["column"]
    out = run(["--json", "--sorted", "--category", ref["column"]] + DESIGN_OPTIONS[ref["design"]] +
              ["--model", "ratio", "--values", ref["mix"], DATA])
    check(out.returncode == 0, name + ": exit status 0 (" + out.stderr + ")")
    if out.returncode != 0:
        continue
    doc = json.loads(out.stdout)
    d = doc.get("design") or {}
    so, fo = d.get("second_order") or {}, d.get("first_order") or {}
    rel = 1e-8  # R survey 4.1-1 svygofchisq, printed to 17 digits
    check(close(so.get("statistic"), float(ref["second_statistic"]), rel), name + ": second-order statistic (R svygofchisq X-squared/scale)")
    check(close(so.get("df"), float(ref["second_df"]), rel), name + ": second-order df (R svygofchisq)")
    check(close(so.get("p_value"), float(ref["second_p"]), rel), name + ": second-order p (R svygofchisq)")
    check(close(fo.get("statistic"), float(ref["first_statistic"]), rel), name + ": first-order statistic (R eigenvalues, Rao-Scott 1981)")
    check(fo.get("df") == float(ref["first_df"]), name + ": first-order df")
    check(close(fo.get("p_value"), float(ref["first_p"]), rel), name + ": first-order p (R pchisq)")
    check(close(d.get("mean_design_effect"), float(ref["mean_deff"]), rel), name + ": mean design effect")
    check(close((d.get("f_form") or {}).get("p_value"), float(ref["f_p"]), rel), name + ": F form p (R pf)")
    deffs = [float(x) for x in ref["deff"].split(":")]
    check(len(d.get("design_effects") or []) == len(deffs) and
          all(close(a, b, rel) for a, b in zip(d["design_effects"], deffs)), name + ": design effects (R vcov(svymean))")
    check(d.get("clusters") == int(ref["clusters"]) and d.get("strata") == int(ref["strata"]), name + ": clusters and strata")
    check(close(d.get("effective_n"), float(ref["n"]) / float(ref["mean_deff"]), 1e-12), name + ": effective n = n / mean design effect")
    check(close(doc.get("p_value"), float(ref["second_p"]), rel), name + ": the decision's p is the second order's")

# Tier 2 and 3 on a pasted table; the second order is not offered, with its reason.
paste = "A\t50\nB\t30\nC\t20\n"
out = run(["--json", "--model", "equal", "--design-effects", "1.5,2,1.2"], paste)
doc = json.loads(out.stdout)
d = doc.get("design") or {}
# Rao and Scott (1981, eq. 4.3): mean deff = sum (p/p0)(1-p) d / (k-1) = (0.5*3*0.5*1.5 + 0.3*3*0.7*2 + 0.2*3*0.8*1.2)/2
mean = (0.5 * 3 * 0.5 * 1.5 + 0.3 * 3 * 0.7 * 2 + 0.2 * 3 * 0.8 * 1.2) / 2
x2 = (50 - 100 / 3) ** 2 / (100 / 3) + (30 - 100 / 3) ** 2 / (100 / 3) + (20 - 100 / 3) ** 2 / (100 / 3)
check(close(d.get("mean_design_effect"), mean, 1e-12), "tier 2: Rao-Scott 1981 mean design effect (closed form)")
check(close((d.get("first_order") or {}).get("statistic"), x2 / mean, 1e-12), "tier 2: first-order statistic X2 / mean deff")
check(d.get("second_order", 0) is None and "covariances" in d.get("second_order_reason", ""), "tier 2: no second order, reason given")
out = run(["--json", "--model", "equal", "--design-effect", "2"], paste)
d = json.loads(out.stdout).get("design") or {}
check(close((d.get("first_order") or {}).get("statistic"), x2 / 2, 1e-12) and "crude" in d.get("correction", ""), "tier 3: X2 / D, named crude")
out = run(["--json", "--sorted", "--category", "channel", "--weight", "weight", "--design-effect", "kish", DATA])
d = json.loads(out.stdout).get("design") or {}
check(out.returncode == 0 and close(d.get("mean_design_effect"), d.get("kish_design_effect"), 1e-15), "tier 3: Kish's design effect of the weights")

# The text report and the write-up.
out = run(["--sorted", "--category", "plan", "--weight", "weight", "--stratum", "region", "--cluster", "store",
           "--model", "ratio", "--values", "50:30:20", DATA])
check("Second order (Satterthwaite)" in out.stdout and "Uncorrected:" in out.stdout and "overstates the evidence" in out.stdout
      and "effective n" in out.stdout, "text report shows the corrected and uncorrected tests")
out = run(["--writeup", "plain", "--sorted", "--category", "plan", "--weight", "weight", "--cluster", "store",
           "--model", "ratio", "--values", "50:30:20", DATA])
check("Rao–Scott second-order" in out.stdout and "design-corrected" in out.stdout, "write-up names the correction")

# Bad input, refused by name.
def refused(args, text, words, what):
    out = run(args, text)
    check(out.returncode == 1 and all(w in out.stderr for w in words), what + ": " + out.stderr.strip())

rows = "answer,w,region,store\nA,1,N,1\nB,2,N,2\nA,1,S,3\nB,2,S,4\n"
refused(["--category", "answer", "--weight", "w"], rows.replace("B,2,N,2", "B,0,N,2"), ["zero", "weight"], "a zero weight")
refused(["--category", "answer", "--weight", "w"], rows.replace("B,2,N,2", "B,-2,N,2"), ["negative"], "a negative weight")
refused(["--category", "answer", "--weight", "w"], rows.replace("B,2,N,2", "B,,N,2"), ["weight is missing"], "a missing weight")
refused(["--category", "answer", "--weight", "w"], rows.replace("B,2,N,2", "B,x,N,2"), ["not a number"], "a weight that is not a number")
refused(["--category", "reply", "--weight", "w"], rows, ["category column", "reply"], "a category column that is missing")
refused(["--category", "answer", "--weight", "w", "--stratum", "region", "--cluster", "store"],
        rows.replace("S,4", "S,3"), ["stratum \"S\"", "lonely PSU"], "a stratum with one cluster")
refused(["--category", "answer", "--weight", "w", "--cluster", "region"],
        rows.replace(",S,", ",N,"), ["one value"], "a cluster column with one value")
out = run(["--weight", "w"], rows)
check(out.returncode == 2 and "--category" in out.stderr, "--weight without --category is a usage error")
out = run(["--category", "answer", "--design-effect", "0"], rows)
check(out.returncode == 2, "--design-effect 0 is a usage error")
out = run(["--category", "answer", "--weight", "w", "--method", "exact"], rows)
check(out.returncode == 1 and "Rao–Scott" in out.stderr, "exact p-values are refused with a survey design")

finish("survey design checks passed")
