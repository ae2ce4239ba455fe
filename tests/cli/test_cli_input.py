#!/usr/bin/python3
"""Command-line tests of input shapes: pastes in each shape, separator and locale, written by
this script (common practice for clipboard/CSV text; no external source needed), read by
`tallyproof --json`. Counts are checked against Python's own reading of the same data
(csv, collections.Counter, numpy.histogram) and p-values against scipy.stats.chisquare run here.
A LibreOffice round trip (a .fods spreadsheet exported as CSV in two locales) runs when
`libreoffice` is installed and is skipped with a message otherwise.
Usage: test_cli_input.py PATH_TO_TALLYPROOF"""
import collections
import json
import math
import os
import random
import shutil
import subprocess
import tempfile

from cli_common import check, close, finish, run


def doc_of(args, stdin):
    r = run(["--json"] + args, stdin)
    try:
        return r.returncode, json.loads(r.stdout)
    except ValueError:
        return r.returncode, {"error": r.stderr}


try:
    import numpy
    from scipy.stats import chisquare
except ImportError:
    numpy = None
    print("skip: numpy/scipy not installed, reference cross-checks reduced")

# 1. CSV with a header and quoted thousands ("1,234" decided from the whole column).
code, d = doc_of([], 'Colour,Count\r\nred,"1,234"\r\nblue,"2,500"\r\ngreen,980\r\n')
check(code == 0, f"quoted thousands CSV exits 0 ({d.get('error')})")
check(d.get("categories") == ["red", "blue", "green"], "CSV categories")
check(d.get("observed") == [1234, 2500, 980], f"CSV counts {d.get('observed')}")
if numpy is not None and code == 0:
    check(close(d["p_value"], float(chisquare([1234, 2500, 980]).pvalue)), "CSV p-value vs scipy")

# 2. Semicolon-separated, decimal comma, percentages in an expected column.
code, d = doc_of([], "Farbe;Anzahl;Erwartet\nrot;1.234;25,5 %\nblau;2.500;24,5 %\ngrün;1.266;50 %\n")
check(code == 0, f"semicolon locale exits 0 ({d.get('error')})")
check(d.get("observed") == [1234, 2500, 1266], f"semicolon counts {d.get('observed')}")
if numpy is not None and code == 0:
    obs = numpy.array([1234, 2500, 1266.0])
    exp = numpy.array([25.5, 24.5, 50.0]) / 100 * obs.sum()
    check(close(d["p_value"], float(chisquare(obs, exp).pvalue), 1e-10), "percentages p-value vs scipy")

# 3. Label, observed, expected ratio terms (Mendel 1866: 315, 108, 101, 32 against 9:3:3:1).
code, d = doc_of([], "round yellow\t315\t9\nround green\t108\t3\nwrinkled yellow\t101\t3\nwrinkled green\t32\t1\n")
check(code == 0, "ratio column exits 0")
if numpy is not None and code == 0:
    obs = numpy.array([315, 108, 101, 32.0])
    check(close(d["p_value"], float(chisquare(obs, obs.sum() * numpy.array([9, 3, 3, 1]) / 16).pvalue), 1e-10),
          "ratio p-value vs scipy")

# 4. Raw text values, one per line, tallied (first seen; then --case-fold --sorted).
rng = random.Random(7)
words = [rng.choice(["Red", "red", "blue", "green", "Blue"]) for _ in range(300)]
text = "\n".join(words) + "\n"
code, d = doc_of([], text)
counts = collections.Counter(words)
first_seen = list(dict.fromkeys(words))
check(d.get("categories") == first_seen, "raw text: first-seen order")
check(d.get("observed") == [counts[w] for w in first_seen], "raw text counts vs collections.Counter")
code, d = doc_of(["--case-fold", "--sorted"], text)
folded = collections.Counter(w.lower() for w in words)
check(d.get("observed") == [folded[w] for w in sorted(folded)], f"--case-fold --sorted counts {d.get('observed')}")

# 5. Raw whole numbers: ordered categories with zero-filled gaps, and --shape to override.
defects = [rng.choice([0, 0, 0, 1, 1, 2, 4]) for _ in range(120)]
text = "defects\n" + "\n".join(map(str, defects)) + "\n"
code, d = doc_of(["--model", "poisson"], text)
check(code == 0, f"raw whole numbers exit 0 ({d.get('error')})")
check(d.get("categories", [None])[:5] == ["0", "1", "2", "3", "4"], f"whole-number categories {d.get('categories')}")
c = collections.Counter(defects)
check(d.get("observed", [None])[:5] == [c[0], c[1], c[2], 0, c[4]], "whole-number counts vs Counter")
code, d = doc_of(["--shape", "counts-column"], "3\n3\n4\n")
check(d.get("observed") == [3, 3, 4], "--shape counts-column")
code, d = doc_of(["--raw"], "3\n3\n5\n")
check(d.get("categories") == ["3", "4", "5"] and d.get("observed") == [2, 0, 1], "--raw fills the gap")

# 6. Raw amounts for a first-digit test, written in several ways.
amounts = [10 ** (5 * rng.random()) for _ in range(2000)]
cells = []
for i, a in enumerate(amounts):
    s = f"{a:,.2f}"
    cells.append(["$" + s, s + " €".replace(" ", "\u00a0"), f"({s})", "\u2212" + s][i % 4])
code, d = doc_of(["--digits", "first"], "Amount\n" + "\n".join(cells) + "\n")
check(code == 0, f"--digits first exits 0 ({d.get('error')})")
ref = collections.Counter(f"{a:.2f}".lstrip("0.")[0] for a in amounts)
check(d.get("observed") == [ref[str(k)] for k in range(1, 10)], "first digits vs Python's reading")
if numpy is not None and code == 0:
    obs = numpy.array(d["observed"], dtype=float)
    p = numpy.log10(1 + 1 / numpy.arange(1, 10))
    check(close(d["p_value"], float(chisquare(obs, p * obs.sum()).pvalue), 1e-10), "Benford p-value vs scipy")
code, d = doc_of(["--digits", "last", "--decimal-comma"], "12,50\n3,07\n1.234,5\n8,01\n")
check(d.get("observed") == [1, 1, 0, 0, 0, 1, 0, 1, 0, 0], f"--digits last --decimal-comma {d.get('observed')}")

# 7. Bins: given edges and equal widths, against numpy.histogram (same convention: [a, b), last closed).
xs = [round(rng.gauss(50, 12), 1) for _ in range(400)]
text = "\n".join(map(str, xs)) + "\n"
code, d = doc_of(["--bins", "-inf,30,40,50,60,70,inf", "--model", "normal"], text)
check(code == 0, f"--bins edges exits 0 ({d.get('error')})")
if numpy is not None:
    h, _ = numpy.histogram(xs, bins=[-numpy.inf, 30, 40, 50, 60, 70, numpy.inf])
    check(d.get("observed") == h.tolist(), f"edge bins vs numpy.histogram {d.get('observed')} {h.tolist()}")
    code, d = doc_of(["--bins", "equal:6"], text)
    h, _ = numpy.histogram(xs, bins=6)
    check(d.get("observed") == h.tolist(), f"equal-width bins vs numpy.histogram {d.get('observed')} {h.tolist()}")

# 7b. Equal-probability bins: edges at scipy.stats.norm.ppf(i/K, numpy.mean, numpy.std) (ML sd),
# counts by numpy.histogram, and the p-value against a grouped maximum likelihood fit done here
# with scipy.optimize (Nelder-Mead) and scipy.stats.chisquare(ddof=2).
r = run(["--bins", "equal-probability:8"], text)
check(r.returncode == 0 and "note: No continuous model was chosen, so the equal-probability bins are placed under the normal model" in r.stderr,
      "equal-probability without a model uses the normal, with a note")
code, d = doc_of(["--bins", "equal-probability:8", "--model", "normal"], text)
check(code == 0, f"--bins equal-probability:8 exits 0 ({d.get('error')})")
check(d.get("df") == 5, f"equal-probability df = k - 1 - m = 5 ({d.get('df')})")
if numpy is not None and code == 0:
    from scipy import optimize, stats
    x = numpy.array(xs)
    edges = numpy.concatenate(([-numpy.inf], stats.norm.ppf(numpy.arange(1, 8) / 8, x.mean(), x.std()), [numpy.inf]))
    h, _ = numpy.histogram(x, bins=edges)
    check(d.get("observed") == h.tolist(), f"equal-probability bins vs numpy.histogram {d.get('observed')} {h.tolist()}")

    def nll(t):
        pr = numpy.diff(stats.norm.cdf(edges, t[0], math.exp(t[1])))
        return -float(numpy.sum(h * numpy.log(pr)))
    fit = optimize.minimize(nll, [x.mean(), math.log(x.std())], method="Nelder-Mead",
                            options={"xatol": 1e-12, "fatol": 1e-14, "maxiter": 20000})
    pr = numpy.diff(stats.norm.cdf(edges, fit.x[0], math.exp(fit.x[1])))
    ref = float(chisquare(h, pr * h.sum(), ddof=2).pvalue)
    check(close(d["p_value"], ref, 1e-6), f"equal-probability p-value vs scipy grouped ML {d['p_value']} {ref}")
ln = [round(rng.lognormvariate(2, 0.7), 3) for _ in range(300)]
code, d = doc_of(["--bins", "equal-probability:6", "--model", "lognormal"], "\n".join(map(str, ln)) + "\n")
check(code == 0 and d.get("df") == 3, f"lognormal equal-probability exits 0 with df 3 ({d.get('error')})")
if numpy is not None and code == 0:
    lx = numpy.log(ln)
    edges = numpy.concatenate(([0], stats.lognorm.ppf(numpy.arange(1, 6) / 6, lx.std(), scale=math.exp(lx.mean())), [numpy.inf]))
    h, _ = numpy.histogram(ln, bins=edges)
    check(d.get("observed") == h.tolist(), f"lognormal equal-probability bins vs numpy.histogram {d.get('observed')} {h.tolist()}")

# 8. Refusals: bad option values are usage errors (2); an unsupported request is refused (1).
check(run(["--digits", "third"], "1\n").returncode == 2, "--digits third is a usage error")
check(run(["--shape", "pie"], "1\n").returncode == 2, "--shape pie is a usage error")
check(run(["--bins", "equal:0"], "1\n").returncode == 2, "--bins equal:0 is a usage error")
check(run(["--bins", "equal-probability:1"], "1\n").returncode == 2, "--bins equal-probability:1 is a usage error")
check(run(["--bins", "equal-probability:1001"], "1\n").returncode == 2, "--bins equal-probability:1001 is a usage error")
r = run(["--bins", "equal-probability:5", "--model", "poisson"], "1\n2\n3\n")
check(r.returncode == 1 and "the poisson model is not one of these" in r.stderr, "equal-probability under poisson refused")
r = run(["--bins", "equal-probability:5", "--model", "lognormal"], "1\n2\n-3\n")
check(r.returncode == 1 and 'Line 3, column 1: "-3" is not above 0' in r.stderr, "lognormal equal-probability refuses -3")
r = run([], "A\t4\nB\t4\nA\t5\n")
check(r.returncode == 1 and "Line 3, column 1: the label \"A\" appears twice" in r.stderr, "duplicate label refused")

# 9. What was detected is stated (text mode: notes on standard error).
r = run([], "Grade\tCount\nA\t18\nB\t25\nC\t31\nTotal\t74\n")
check(r.returncode == 0, "totals row paste exits 0")
check("note: Line 5 (74) equals the sum of the counts above it: dropped as a totals row." in r.stderr, "totals note")

# 10. LibreOffice round trip: the same sheet exported in a comma and a semicolon/decimal-comma locale.
office = shutil.which("libreoffice") or shutil.which("soffice")
if office is None:
    print("skip: libreoffice not installed, spreadsheet export round trip not run")
else:
    fods = """<?xml version="1.0" encoding="UTF-8"?>
<office:document xmlns:office="urn:oasis:names:tc:opendocument:xmlns:office:1.0"
 xmlns:table="urn:oasis:names:tc:opendocument:xmlns:table:1.0"
 xmlns:text="urn:oasis:names:tc:opendocument:xmlns:text:1.0" office:version="1.2"
 office:mimetype="application/vnd.oasis.opendocument.spreadsheet"><office:body><office:spreadsheet>
<table:table table:name="Sheet1">
<table:table-row><table:table-cell office:value-type="string"><text:p>Label</text:p></table:table-cell>
<table:table-cell office:value-type="string"><text:p>Count</text:p></table:table-cell>
<table:table-cell office:value-type="string"><text:p>Share</text:p></table:table-cell></table:table-row>
%s
</table:table></office:spreadsheet></office:body></office:document>"""
    rows = [("North, upper", 1234, 0.25), ("South", 2500, 0.5), ("East", 980, 0.25)]
    body = "".join(
        f'<table:table-row><table:table-cell office:value-type="string"><text:p>{l}</text:p></table:table-cell>'
        f'<table:table-cell office:value-type="float" office:value="{c}"><text:p>{c}</text:p></table:table-cell>'
        f'<table:table-cell office:value-type="float" office:value="{s}"><text:p>{s}</text:p></table:table-cell></table:table-row>'
        for l, c, s in rows)
    work = tempfile.mkdtemp(prefix="tallyproof_lo_")
    src = os.path.join(work, "sheet.fods")
    with open(src, "w") as f:
        f.write(fods % body)
    for name, filt, locale in [("comma", "44,34,76,1,,1033", "en-US"), ("semicolon", "59,34,76,1,,1031", "de-DE")]:
        out = os.path.join(work, name)
        os.mkdir(out)
        subprocess.run([office, "--headless", f"-env:UserInstallation=file://{work}/profile", "--convert-to",
                        f"csv:Text - txt - csv (StarCalc):{filt}", "--outdir", out, src],
                       capture_output=True, timeout=180, env=dict(os.environ, LC_ALL=locale.replace("-", "_") + ".UTF-8"))
        path = os.path.join(out, "sheet.csv")
        if not os.path.exists(path):
            check(False, f"LibreOffice wrote {name} CSV")
            continue
        with open(path) as f:
            code, d = doc_of([], f.read())
        check(d.get("categories") == [r[0] for r in rows], f"LibreOffice {name} CSV labels {d.get('categories')}")
        check(d.get("observed") == [r[1] for r in rows], f"LibreOffice {name} CSV counts {d.get('observed')}")
    shutil.rmtree(work, ignore_errors=True)

finish("command-line input tests passed", "{n} input check(s) failed")
