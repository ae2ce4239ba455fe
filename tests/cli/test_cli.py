#!/usr/bin/python3
"""Command-line tests of `tallyproof`: the same pasted text the page takes, read from a file
and from stdin, printed as text and as JSON; bad input exits 1 with a message naming the line.
Usage: test_cli.py PATH_TO_TALLYPROOF"""
import json
import os
import subprocess
import tempfile

from cli_common import TOOL, check, close, finish, run


# Four grades of an invented sorting line, pasted as a spreadsheet copies them (TSV, CRLF).
paste = "Grade\tCount\r\nA\t18\r\nB\t25\r\nC\t31\r\nD\t26\r\n"
# Reference: R 4.2 chisq.test(c(18,25,31,26)): X-squared = 3.44, df = 3, p = 0.32862769938219899,
# and qchisq(0.95, 3) = 7.8147279032511792.
R_STAT, R_P, R_CRIT = 3.44, 0.32862769938219899, 7.8147279032511792

with tempfile.NamedTemporaryFile("w", suffix=".tsv", delete=False) as f:
    f.write(paste)
    path = f.name

r = run(["--json", path])
check(r.returncode == 0, f"--json FILE exits 0 (got {r.returncode}: {r.stderr})")
doc = json.loads(r.stdout)
check(doc["categories"] == ["A", "B", "C", "D"], "categories as read")
check(doc["observed"] == [18, 25, 31, 26], "observed as read")
check(close(doc["statistic"], R_STAT, 1e-13), f"statistic {doc['statistic']} vs R {R_STAT}")
check(doc["df"] == 3, "df 3")
check(close(doc["p_value"], R_P, 1e-13), f"p {doc['p_value']} vs R {R_P}")
check(close(doc["critical_value"], R_CRIT, 1e-12), f"critical value {doc['critical_value']} vs R {R_CRIT}")
check(doc["expected_counts"] == [25, 25, 25, 25], "expected counts")

# Live cross-check with SciPy when present (Debian python3-scipy).
try:
    from scipy.stats import chisquare
    sp = chisquare([18, 25, 31, 26])
    check(close(doc["p_value"], float(sp.pvalue), 1e-12), "p agrees with scipy.stats.chisquare")
except ImportError:
    print("skip: scipy not installed, live SciPy cross-check not run")

r = run([], stdin=paste)
check(r.returncode == 0, "stdin text exits 0")
check("χ² = 3.44, df = 3, p = 0.329" in r.stdout, f"text output states the result: {r.stdout!r}")
check("No evidence against the stated mix at α = 0.05." in r.stdout, "text output states the decision")

r = run(["--version"])
check(r.returncode == 0 and r.stdout.startswith("tallyproof "), "--version")

# Bad input: exit 1, message names the line (and column).
bad = {
    "": "Nothing to read: the pasted text is empty.",
    "A\t4\nB\t-2\n": "Line 2, column 2: \"-2\" is negative; counts must be non-negative whole numbers.",
    "A\t4\nB\tlots\n": "Line 2, column 2: \"lots\" is not a count; expected a non-negative whole number.",
    "Only\t7\n": "Only one category (\"Only\"): a goodness-of-fit test needs at least two.",
    "A\t0\nB\t0\n": "All counts are zero: there is nothing to test.",
}
for text, message in bad.items():
    r = run(["--json"], stdin=text)
    check(r.returncode == 1, f"bad input {text!r} exits 1 (got {r.returncode})")
    got = json.loads(r.stdout).get("error")
    check(got == message, f"bad input {text!r}: error {got!r}")
    r = run([], stdin=text)
    check(message in r.stderr, f"bad input {text!r}: message on stderr")

r = run(["--alpha", "2"], stdin=paste)
check(r.returncode == 2, "--alpha out of range is a usage error")
r = run(["--bogus"])
check(r.returncode == 2, "unknown option is a usage error")

# --table: no byte-order mark on standard output unless --byte-order-mark asks for one (for a file
# a spreadsheet program opens); labels arrive normalised (NFC, invisible characters as <U+XXXX>).
labels_paste = "caf\u00e9\t5\nA\u200b\t7\n\u03c7\u00b2\t9\n"
r = run(["--table", "csv"], stdin=labels_paste)
check(r.returncode == 0 and r.stdout.startswith("Category,"), "--table csv starts with the header, no mark")
check("A<U+200B>," in r.stdout and "\u03c7\u00b2," in r.stdout, "--table csv shows the zero-width space as <U+200B>")
r = subprocess.run([TOOL, "--table", "tsv", "--byte-order-mark", "-"], input=labels_paste.encode(), capture_output=True, timeout=30)
check(r.returncode == 0 and r.stdout.startswith(b"\xef\xbb\xbfCategory\t"), "--byte-order-mark starts the table with U+FEFF")
check(r.stdout.count(b"\xef\xbb\xbf") == 1, "one byte-order mark only")
# Totals near 2^53 answer within 5 s (the two-sided binomial test per category once bisected on
# doubles whose midpoint rounded back onto an end: [9e15, 0] hung). The binomial p of the first
# category is 2 * 2^-n (closed form), so its log10 is log10(2) - n log10(2); mpmath 1.3 agrees.
import math
import time
for counts in ([9 * 10**15, 0], [2**53 - 1, 1], [2**52, 2**52], [2**53 - 10, 7, 3], [10**12, 1],
               [4 * 10**15, 1, 4 * 10**15], [2**53 - 1, 0]):
    text = "".join("c%d\t%d\n" % (i, v) for i, v in enumerate(counts))
    start = time.monotonic()
    r = run(["--json"], stdin=text)
    took = time.monotonic() - start
    check(r.returncode == 0, f"total {sum(counts)} {counts}: exits 0 (got {r.returncode}: {r.stderr[-200:]})")
    check(took < 5, f"total {sum(counts)} {counts}: answered in {took:.1f} s (limit 5 s)")
    if r.returncode != 0:
        continue
    d = json.loads(r.stdout)
    n = sum(counts)
    check(d["n"] == n, f"total {counts}: N = {d['n']}")
    check(d["log10_p_value"] is None or d["log10_p_value"] <= 0, f"total {counts}: log10 p <= 0")
    if len(counts) == 2 and counts[1] == 0:
        want = math.log10(2) - n * math.log10(2)
        got = math.log10(d["category_p_values"][0]) if d["category_p_values"][0] > 0 else None
        check(got is None or close(got, want, 1e-9), f"{counts}: category p log10 {got} vs {want}")
    check(d["effect_size"]["w"] <= d["effect_size"]["w_interval"][1] * (1 + 1e-9) and
          d["effect_size"]["w"] >= d["effect_size"]["w_interval"][0] * (1 - 1e-9),
          f"{counts}: labelled effect size inside its interval")

# The lower tail beyond the double range is in the result document as a logarithm:
# R 4.2.2 pchisq(0.02, 300, log.p = TRUE) / log(10) = -562.761207593581 (301 categories of 100,
# one +1 and one -1: X2 = 0.02).
text = "".join("c%d\t%d\n" % (i, 100 + (1 if i == 0 else -1 if i == 1 else 0)) for i in range(301))
d = json.loads(run(["--json"], stdin=text).stdout)
check(d["lower_p_value"] == 0 and close(d["log10_lower_p_value"], -562.761207593581, 1e-12),
      f"log10_lower_p_value {d.get('log10_lower_p_value')}")
check(d["exact_lower_p_value"] is None, "no exact lower tail for 301 categories")
# A perfect fit at N = 15: exact P(X2 <= 0) = 15! / (5!^3 3^15) = 756756 / 14348907, no warning.
d = json.loads(run(["--json"], stdin="A\t5\nB\t5\nC\t5\n").stdout)
check(close(d["exact_lower_p_value"], 756756 / 14348907, 1e-12), f"exact lower p {d['exact_lower_p_value']}")
check(not any("closer to the stated mix" in w for w in d["warnings"]), "perfect fit at N = 15 is not called too good")
# At alpha 1e-17 Goodman's intervals hold (from alpha itself; checked against mpmath in
# test_cli_verdicts.py) and Sison-Glaz's are null, with a note saying why.
d = json.loads(run(["--json", "--alpha", "1e-17"], stdin="A\t30\nB\t50\nC\t20\n").stdout)
check(None not in d["intervals"]["goodman_lower"] and d["intervals"]["lower"] == [None] * 3 and
      "not available" in d["intervals"].get("note", ""), f"intervals at alpha 1e-17: {d['intervals']}")

os.unlink(path)
finish("command-line tests passed", "{n} command-line check(s) failed")
