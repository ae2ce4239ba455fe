#!/usr/bin/python3
"""Command-line tests of screening many groups (`--by`, `--against`, `--adjust`, `--q`): each
input shape (long, wide, raw with a group column: text, digits, bins), the JSON, table and write-up
outputs, the analysis document's `groups` and `screen`, and refusals naming the line.
Per-group values are checked live against SciPy (chisquare, chi2_contingency(correction=False))
and statsmodels (multipletests) from Debian's python3-scipy / python3-statsmodels.
Usage: test_cli_screen.py PATH_TO_TALLYPROOF"""
import json

from cli_common import check, finish, run
import cli_common


def close(a, b, rel=1e-10):
    return cli_common.close(a, b, rel)


# Fixed test counts (no source): six readers, last digits 0-9; reader "F" prefers 0 and 5.
COUNTS = {
    "A": [11, 9, 10, 12, 8, 10, 9, 11, 10, 10], "B": [9, 12, 11, 8, 10, 9, 12, 10, 9, 10],
    "C": [10, 10, 9, 11, 12, 8, 10, 9, 11, 10], "D": [12, 8, 10, 10, 9, 11, 10, 12, 8, 10],
    "E": [10, 11, 8, 9, 11, 10, 12, 9, 10, 10], "F": [40, 4, 6, 5, 5, 35, 5, 6, 4, 5],
}
NAMES = list(COUNTS)
long_text = "reader\tdigit\tcount\n" + "".join(f"{g}\t{d}\t{c}\n" for g in NAMES for d, c in enumerate(COUNTS[g]))
wide_text = "reader," + ",".join(str(d) for d in range(10)) + "\n" + "".join(g + "," + ",".join(map(str, COUNTS[g])) + "\n" for g in NAMES)
raw_text = "reader;value\n" + "".join(f"{g};{1230 + d}\n" for g in NAMES for d, c in enumerate(COUNTS[g]) for _ in range(c))

try:
    from scipy.stats import chisquare, chi2_contingency
    from statsmodels.stats.multitest import multipletests
    import numpy as np
    have_scipy = True
except ImportError:
    have_scipy = False
    print("skip: scipy/statsmodels not installed, live cross-checks not run")

for name, text, extra in [("long", long_text, []), ("wide", wide_text, []), ("raw digits", raw_text, ["--digits", "last"])]:
    r = run(["--by", "reader", "--model", "last-digit", "--json"] + extra, text)
    check(r.returncode == 0, f"{name}: exits 0 ({r.stderr})")
    doc = json.loads(r.stdout)
    check([g["name"] for g in doc["groups"]] == NAMES, f"{name}: groups in order")
    check([g["observed"] for g in doc["groups"]] == [COUNTS[g] for g in NAMES], f"{name}: counts as read")
    check(doc["screen"]["groups"] == 6 and doc["screen"]["flagged"] == 1, f"{name}: 1 of 6 flagged: {doc['screen']}")
    check(doc["screen"]["adjust"] == "BH" and doc["screen"]["q"] == 0.05 and doc["screen"]["against"] == "model", f"{name}: screen settings")
    check(doc["by"] == "reader", f"{name}: by echoed")
    f = doc["groups"][5]
    check(f["flagged"] and {d["category"] for d in f["drivers"]} >= {"0", "5"}, f"{name}: F flagged, driven by 0 and 5: {f['drivers']}")
    check(all(g["mad"] is not None for g in doc["groups"]), f"{name}: MAD for a digit law")
    if have_scipy:
        ps = []
        for g in doc["groups"]:
            sp = chisquare(COUNTS[g["name"]])  # SciPy 1.10: uniform expected
            check(close(g["statistic"], sp.statistic, 1e-12), f"{name} {g['name']}: statistic vs scipy chisquare")
            check(close(g["p_value"], sp.pvalue), f"{name} {g['name']}: p vs scipy chisquare")
            ps.append(sp.pvalue)
        qs = multipletests(ps, method="fdr_bh")[1]  # statsmodels 0.13
        for g, q in zip(doc["groups"], qs):
            check(close(g["q_value"], q), f"{name} {g['name']}: q vs statsmodels fdr_bh")

# Against the rest, Holm: live against chi2_contingency(correction=False) and multipletests holm.
r = run(["--by", "1", "--against", "rest", "--adjust", "holm", "--q", "0.01", "--json"], long_text)
check(r.returncode == 0, f"--against rest exits 0 ({r.stderr})")
doc = json.loads(r.stdout)
check(doc["screen"]["against"] == "rest" and doc["screen"]["adjust"] == "holm" and doc["screen"]["q"] == 0.01, "rest settings echoed")
if have_scipy:
    table = np.array([COUNTS[g] for g in NAMES])
    ps = []
    for i, g in enumerate(doc["groups"]):
        chi2, p, dof, _ = chi2_contingency(np.array([table[i], table.sum(axis=0) - table[i]]), correction=False)
        check(close(g["statistic"], chi2, 1e-12) and g["df"] == dof, f"rest {g['name']}: statistic and df vs chi2_contingency")
        check(close(g["p_value"], p), f"rest {g['name']}: p vs chi2_contingency")
        ps.append(p)
    for g, q in zip(doc["groups"], multipletests(ps, method="holm")[1]):
        check(close(g["q_value"], q), f"rest {g['name']}: q vs statsmodels holm")

# Text report, write-up and groups table.
r = run(["--by", "reader", "--model", "last-digit"], long_text)
check(r.returncode == 0, "text report exits 0")
check("1 of 6 groups departs from uniform last digit at a false discovery rate of 5%: F (q = " in r.stdout, f"summary sentence: {r.stdout[:400]!r}")
check("never proof" in r.stdout and "false discovery rate of 5% means" in r.stdout, "cautions in the report")
check("note: Groups read from column 1 (\"reader\") as a long table." in r.stderr, f"detection stated: {r.stderr!r}")
r = run(["--by", "reader", "--model", "last-digit", "--writeup", "plain"], long_text)
check(r.stdout.startswith("1 of 6 groups departs") and "F: 0: more than expected" in r.stdout, f"write-up: {r.stdout!r}")
r = run(["--by", "reader", "--model", "last-digit", "--table", "csv"], long_text)
lines = r.stdout.strip().splitlines()
check(lines[0].startswith("group,n,statistic,df,p_value,q_value,w,mad,mad_band,flagged"), f"CSV header: {lines[0]!r}")
check(len(lines) == 7 and lines[6].startswith("F,115,") and ",yes," in lines[6], f"CSV row of F: {lines[-1]!r}")
r = run(["--by", "reader", "--model", "last-digit", "--table", "tsv"], long_text)
check(r.stdout.split("\n")[0].split("\t")[0:3] == ["group", "n", "statistic"], "TSV header")

# Raw text values with a group column, tallied per group.
raw_words = "line,defect\n" + "".join(f"L{i % 3},{w}\n" for i, w in enumerate(["scratch", "dent", "stain"] * 20))
r = run(["--by", "line", "--json"], raw_words)
doc = json.loads(r.stdout)
check(r.returncode == 0 and doc["categories"] == ["scratch", "dent", "stain"], f"raw text categories: {r.stdout[:200]}")
check([g["observed"] for g in doc["groups"]] == [[20, 0, 0], [0, 20, 0], [0, 0, 20]], "raw text tallied per group")

# Raw text with a group column, tallied per group, each group's p against SciPy 1.10 chisquare
# (equal shares); the tallies counted here by brute force from the lines written.
import random
rng = random.Random(1402)
words = ["scratch", "dent", "stain", "crack"]
lines = [(f"L{rng.randint(1, 4)}", rng.choice(words[:3] if rng.random() < 0.8 else words)) for _ in range(400)]
r = run(["--by", "line", "--json"], "line,defect\n" + "".join(f"{g},{w}\n" for g, w in lines))
check(r.returncode == 0, f"raw text per group exits 0 ({r.stderr})")
doc = json.loads(r.stdout)
seen_groups = list(dict.fromkeys(g for g, _ in lines))
seen_words = list(dict.fromkeys(w for _, w in lines))
check(doc["categories"] == seen_words and [g["name"] for g in doc["groups"]] == seen_groups, "raw text: categories and groups in first-seen order")
for g in doc["groups"]:
    tally = [sum(1 for n, w in lines if n == g["name"] and w == c) for c in seen_words]
    check(g["observed"] == tally, f"raw text {g['name']}: tallied as counted here {tally}")
    if have_scipy:
        check(close(g["p_value"], chisquare(tally).pvalue), f"raw text {g['name']}: p vs scipy chisquare")

# Raw numbers with a group column counted into --bins per group: the bins counted here by brute
# force ([a, b), the last bin closed, as the labels say), each group's p against SciPy chisquare.
values = [(f"S{rng.randint(1, 3)}", rng.choice([rng.uniform(0, 60), rng.uniform(0, 30)])) for _ in range(300)]
values += [("S1", 20.0), ("S2", 60.0), ("S3", 0.0)]  # on the edges
edges = [0, 20, 40, 60]
r = run(["--by", "supplier", "--bins", "0,20,40,60", "--json"], "supplier\tamount\n" + "".join(f"{g}\t{v:.3f}\n" for g, v in values))
check(r.returncode == 0, f"--bins per group exits 0 ({r.stderr})")
doc = json.loads(r.stdout)
check(doc["categories"] == ["[0, 20)", "[20, 40)", "[40, 60]"], f"--bins labels: {doc['categories']}")


def bin_of(v):
    v = float(f"{v:.3f}")
    return 2 if v >= 40 else 1 if v >= 20 else 0


for g in doc["groups"]:
    tally = [sum(1 for n, v in values if n == g["name"] and bin_of(v) == b) for b in range(3)]
    check(g["observed"] == tally, f"--bins {g['name']}: {g['observed']} vs counted here {tally}")
    if have_scipy:
        sp = chisquare(tally)  # equal shares: the default model
        check(close(g["statistic"], sp.statistic, 1e-12) and close(g["p_value"], sp.pvalue), f"--bins {g['name']}: vs scipy chisquare")
if have_scipy:
    ps = [chisquare([sum(1 for n, v in values if n == g["name"] and bin_of(v) == b) for b in range(3)]).pvalue for g in doc["groups"]]
    for g, q in zip(doc["groups"], multipletests(ps, method="fdr_bh")[1]):
        check(close(g["q_value"], q), f"--bins {g['name']}: q vs statsmodels fdr_bh")

# A long table whose groups list different categories: the missing combinations are zero counts,
# said in a note naming the group, its line and the category; p of the zero-filled row vs SciPy.
uneven = "reader\tdigit\tcount\nA\t0\t12\nA\t1\t9\nA\t2\t10\nB\t0\t14\nB\t2\t3\nC\t1\t8\nC\t2\t11\nC\t0\t7\n"
r = run(["--by", "reader", "--json"], uneven)
check(r.returncode == 0, f"uneven long table exits 0 ({r.stderr})")
doc = json.loads(r.stdout)
check([g["observed"] for g in doc["groups"]] == [[12, 9, 10], [14, 0, 3], [7, 8, 11]], f"uneven: zero filled {[g['observed'] for g in doc['groups']]}")
r = run(["--by", "reader"], uneven)
check("1 combinations of group and category do not appear in the table: read as zero counts" in r.stderr and
      'group "B", first on line 5, has no row for category "1"' in r.stderr, f"uneven: note names the group and line: {r.stderr!r}")
if have_scipy:
    doc_p = json.loads(run(["--by", "reader", "--json"], uneven).stdout)["groups"][1]["p_value"]
    check(close(doc_p, chisquare([14, 0, 3]).pvalue), "uneven: B's p vs scipy chisquare of (14, 0, 3)")

# The analysis document's groups and screen members.
document = json.dumps({"format": "tallyproof/1", "categories": ["A", "B", "C"], "model": {"kind": "shares", "values": [0.5, 0.3, 0.2]},
                       "groups": [{"name": "lot 1", "observed": [50, 30, 20]}, {"name": "lot 2", "observed": [20, 50, 30]},
                                  {"name": "lot 3", "observed": [48, 33, 19]}],
                       "screen": {"against": "model", "adjust": "bonferroni", "q": 0.05}})
r = run(["--json"], document)
doc = json.loads(r.stdout)
check(r.returncode == 0 and doc["screen"]["adjust"] == "bonferroni", f"document screen read: {r.stdout[:300]}")
if have_scipy:
    sp = chisquare([20, 50, 30], [50, 30, 20])
    check(close(doc["groups"][1]["p_value"], sp.pvalue) and close(doc["groups"][1]["q_value"], min(1, 3 * sp.pvalue)),
          "document: lot 2 p vs scipy chisquare, Bonferroni q = 3p")
check([g["flagged"] for g in doc["groups"]] == [False, True, False], "document: lot 2 flagged")

# Benford's first-digit law per supplier, with Nigrini's MAD band.
amounts = "supplier\tamount\n" + "".join(f"S{i % 4}\t{v}\n" for i, v in enumerate(
    [1000 + 37 * k for k in range(400)]))
r = run(["--by", "supplier", "--digits", "first", "--json"], amounts)
doc = json.loads(r.stdout)
check(r.returncode == 0 and doc["model"]["kind"] == "benford-first" and all(g["mad_band"] for g in doc["groups"]),
      f"first digits per supplier: Benford's law with MAD bands: {r.stdout[:300]}")

# The documented example (docs/analysis-document.md, "Screening many groups").
import os
example = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "docs", "examples", "screening", "last-digits-by-reader.json")
r = run(["--json", example], None)
doc = json.loads(r.stdout)
check(r.returncode == 0 and [g["flagged"] for g in doc["groups"]] == [False, False, True, False, False], "documented example: reader C flagged")
check(doc["groups"][4]["thin"] and doc["groups"][4]["method"] == "exact", "documented example: thin reader E gets an exact p")
if have_scipy:
    sp = chisquare([31, 6, 7, 8, 6, 27, 5, 7, 9, 6])
    check(close(doc["groups"][2]["p_value"], sp.pvalue), "documented example: reader C p vs scipy chisquare")

# Refusals: exit 1 with the line and the group.
r = run(["--by", "reader"], "reader\tdigit\tcount\nA\t0\t3\n\t1\t2\nB\t0\t1\nB\t1\t1\nA\t1\t4\n")
check(r.returncode == 1 and "Line 3, column 1" in r.stderr and "group cell is empty" in r.stderr, f"empty group cell: {r.stderr!r}")
r = run(["--by", "reader"], "digit\tcount\treader\n0\t3\tA\n1\t2\tA\n0\t1\n1\t4\tB\n")
check(r.returncode == 1 and "Line 4, column 3: the row has only 2 cells, so the group column (3) is missing" in r.stderr,
      f"group column missing from a row: {r.stderr!r}")
r = run(["--by", "reader"], "reader;value\nA;x\nA;y\n;x\nB;y\n")
check(r.returncode == 1 and "Line 4, column 1: the group cell is empty" in r.stderr, f"raw: empty group cell: {r.stderr!r}")
r = run(["--by", "reader"], "reader\t0\t1\nA\t3\t4\nB\t2\n")
check(r.returncode == 0 and json.loads(run(["--by", "reader", "--json"], "reader\t0\t1\nA\t3\t4\nB\t2\n").stdout)["groups"][1]["observed"] == [2, 0],
      f"wide: a short row's missing cells are zero counts: {r.stderr!r}")
r = run(["--by", "reader"], "reader\tdigit\tcount\nA\t0\t3\nA\t1\t2\n")
check(r.returncode == 1 and "Only one group" in r.stderr, f"one group: {r.stderr!r}")
r = run(["--by", "supplier"], long_text)
check(r.returncode == 1 and "No column is named \"supplier\"" in r.stderr, f"unknown column: {r.stderr!r}")
r = run(["--by", "reader", "--model", "last-digit"], long_text + "G\t0\t0\nG\t1\t0\n")
check(r.returncode == 0 and "\"G\" (line 62) has a total of zero" in r.stdout and "(1 not tested)" in r.stdout,
      f"zero-total group listed, not tested: {r.stdout[-600:]!r}")
r = run(["--by", "reader", "--q", "2"], long_text)
check(r.returncode == 2, "--q out of range is a usage error")
r = run(["--by", "reader", "--adjust", "fdr-by"], long_text)
check(r.returncode == 2, "unknown --adjust is a usage error")
r = run(["--by", "reader", "--json"], "reader\tdigit\tcount\nA\t0\t3\nB\t1\tmany\n")
check(r.returncode == 1 and "error" in json.loads(r.stdout), "JSON error form")

finish("0 failure(s)", "{n} failure(s)")
