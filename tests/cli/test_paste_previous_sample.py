#!/usr/bin/python3
"""Command-line checks of a pasted third column read as a previous sample (issue 14): a file
headed "Category,This month,Last month" is tested for homogeneity of the two samples, checked
against SciPy 1.10 chi2_contingency(correction=False) on the 2 x k table built here from the
same numbers; --third-column expected gives the goodness-of-fit test against those values as
expected counts instead, checked against SciPy 1.10 scipy.stats.chisquare; --third-column
previous on a header-less paste; the refusal of a previous sample that is not whole; and the
usage error for an unknown choice.
Usage: test_paste_previous_sample.py PATH_TO_TALLYPROOF"""
import json
import os
import tempfile

from scipy.stats import chi2_contingency, chisquare

from cli_common import check, close, finish, run

labels = ["Email", "Search", "Social", "Referral", "Direct"]
this_month = [212, 388, 145, 61, 94]
last_month = [240, 351, 118, 70, 121]
with tempfile.TemporaryDirectory() as folder:
    path = os.path.join(folder, "channels.csv")
    with open(path, "w", encoding="utf-8") as f:
        f.write("Category,This month,Last month\n")
        for row in zip(labels, this_month, last_month):
            f.write("%s,%d,%d\n" % row)

    # Source: SciPy 1.10 chi2_contingency, Pearson's X2 without Yates' correction, on the 2 x k table.
    stat, p, df, expected = chi2_contingency([this_month, last_month], correction=False)
    out = run(["--json", path])
    check(out.returncode == 0, "header 'Last month': analysed (" + out.stderr + ")")
    doc = json.loads(out.stdout) if out.returncode == 0 else {}
    check(doc.get("model", {}).get("kind") == "reference-sample", "model kind reference-sample: " + out.stdout[:200])
    check(close(doc.get("statistic"), stat, 1e-10), "statistic = SciPy chi2_contingency %r (got %r)" % (stat, doc.get("statistic")))
    check(close(doc.get("p_value"), p, 1e-10), "p = SciPy chi2_contingency %r (got %r)" % (p, doc.get("p_value")))
    check(doc.get("df") == df, "df = SciPy chi2_contingency %r (got %r)" % (df, doc.get("df")))
    check(all(close(a, b, 1e-10) for a, b in zip(doc.get("tested_expected", []), expected[0])),
          "expected counts of this month = SciPy chi2_contingency's first row")
    check(doc.get("reference_sample", {}).get("observed") == last_month, "the previous sample is the third column")

    out = run([path])
    check("note: The third column, headed \"Last month\", is read as a previous sample's counts" in out.stderr,
          "the note says the third column is read as a previous sample: " + out.stderr)
    check("alternative: If the third column holds expected counts" in out.stderr, "the alternative reading is offered: " + out.stderr)

    # Source: SciPy 1.10 scipy.stats.chisquare(f_obs, f_exp), the last month's counts rescaled to this month's total.
    n_this, n_last = sum(this_month), sum(last_month)
    f_exp = [x * n_this / n_last for x in last_month]
    gof_stat, gof_p = chisquare(this_month, f_exp)
    out = run(["--json", "--third-column", "expected", path])
    check(out.returncode == 0, "--third-column expected: analysed (" + out.stderr + ")")
    doc = json.loads(out.stdout) if out.returncode == 0 else {}
    check(doc.get("model", {}).get("kind") != "reference-sample", "--third-column expected: not a test of homogeneity")
    check(doc.get("df") == len(labels) - 1, "--third-column expected: df k - 1")
    check(close(doc.get("statistic"), gof_stat, 1e-10),
          "--third-column expected: statistic = SciPy chisquare %r (got %r)" % (gof_stat, doc.get("statistic")))
    check(close(doc.get("p_value"), gof_p, 1e-10),
          "--third-column expected: p = SciPy chisquare %r (got %r)" % (gof_p, doc.get("p_value")))

    out = run(["--json", "--third-column", "auto", path])
    check(json.loads(out.stdout).get("model", {}).get("kind") == "reference-sample", "--third-column auto is the default")

# A header-less paste: expected values unless --third-column previous says otherwise.
plain = "".join("%s\t%d\t%d\n" % row for row in zip(labels, this_month, last_month))
out = run(["--json", "-"], plain)
check(json.loads(out.stdout).get("model", {}).get("kind") != "reference-sample", "no header: the third column is expected values")
out = run(["--json", "--third-column", "previous", "-"], plain)
doc = json.loads(out.stdout)
check(close(doc.get("statistic"), stat, 1e-10), "--third-column previous without a header: statistic = SciPy chi2_contingency")

# A previous sample that is not whole is refused, naming line and column.
out = run([], "Category,This month,Last month\nA,150,140\nB,420,390.5\nC,190,230\n")
check(out.returncode == 1 and "Line 3, column 3: \"390.5\" is not a whole number" in out.stderr
      and "previous sample's counts" in out.stderr, "non-whole previous sample refused: " + out.stderr)

out = run(["--third-column", "previous-sample"], plain)
check(out.returncode == 2 and "--third-column must be auto, expected or previous" in out.stderr, "unknown choice: " + out.stderr)
h = run(["--help"])
check("--third-column C" in h.stdout, "--help lists --third-column")

finish("paste previous sample: all checks passed")
