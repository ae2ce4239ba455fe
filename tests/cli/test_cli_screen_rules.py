#!/usr/bin/python3
"""Command-line tests of issue 26's rules for a screen of many groups: a wide table headed by
numbered categories (digits 0..9, years) read as a header (detected, stated, changeable with
--group-header); group names under the category label rules (NFC, invisible characters as
<U+XXXX> codes in the report, CSV and TSV, look-alike names noted); conformity with groups
refused naming both options; one Monte Carlo budget for a single sample, a previous sample and a
screen; the same messages for one group, an empty or missing group cell and an all-zero group; a
document whose "groups" is null or not a list refused naming the member; and a screen's --json
output read back as the same screen (settings, sort and opened group kept).
Per-group values are checked live against SciPy 1.10 chisquare and statsmodels 0.13
multipletests (Debian's python3-scipy / python3-statsmodels).
Usage: test_cli_screen_rules.py PATH_TO_TALLYPROOF"""
import json
import random
import unicodedata

from cli_common import check, finish, run
import cli_common

try:
    from scipy.stats import chisquare
    from statsmodels.stats.multitest import multipletests
    have_scipy = True
except ImportError:
    have_scipy = False
    print("skip: scipy/statsmodels not installed, live cross-checks not run")


def close(a, b, rel=1e-10):
    return cli_common.close(a, b, rel)


# ---- 1. Header rows: 40 collectors x last digits 0..9 (counts drawn here, no source) --------
rng = random.Random(2601)
collectors = {f"Collector {i:02d}": [rng.randint(6, 16) for _ in range(10)] for i in range(40)}
collectors["Collector 07"] = [30, 4, 5, 6, 5, 28, 5, 6, 4, 5]  # prefers 0 and 5
digits_wide = "Collector," + ",".join(str(d) for d in range(10)) + "\n" + "".join(
    name + "," + ",".join(map(str, c)) + "\n" for name, c in collectors.items())
for args in (["--by", "1"], ["--group-shape", "wide"]):
    r = run(args + ["--model", "last-digit", "--json"], digits_wide)
    check(r.returncode == 0, f"digit header {args}: exits 0 ({r.stderr})")
    doc = json.loads(r.stdout)
    check(len(doc["groups"]) == 40, f"digit header {args}: 40 groups, not 41 ({len(doc['groups'])})")
    check(doc["categories"] == [str(d) for d in range(10)], f"digit header {args}: categories named 0..9: {doc['categories']}")
    check(doc["screen"]["header"] is True and doc["by"] == "Collector", f"digit header {args}: header and group column recorded")
    check(any("read as a header row" in n and "steps of 1" in n for n in doc["reading_notes"]),
          f"digit header {args}: the detection is stated: {doc['reading_notes']}")
    check([g["name"] for g in doc["groups"]] == list(collectors), f"digit header {args}: group names in order")
    flagged = [g for g in doc["groups"] if g["flagged"]]
    check([g["name"] for g in flagged] == ["Collector 07"], f"digit header {args}: Collector 07 flagged: {[g['name'] for g in flagged]}")
    check({d["category"] for d in flagged[0]["drivers"]} >= {"0", "5"}, f"digit header {args}: drivers named by digit: {flagged[0]['drivers']}")
    if have_scipy:
        ps = [chisquare(collectors[g["name"]]).pvalue for g in doc["groups"]]  # uniform last digits: equal expected
        check(all(close(g["p_value"], p) for g, p in zip(doc["groups"], ps)), f"digit header {args}: p vs scipy chisquare")
        qs = multipletests(ps, method="fdr_bh")[1]
        check(all(close(g["q_value"], q) for g, q in zip(doc["groups"], qs)), f"digit header {args}: q vs statsmodels fdr_bh")
r = run(["--by", "1", "--model", "last-digit"], digits_wide)
check("note: Line 1 read as a header row: its cells \"0\", \"1\" ... \"9\" are numbers in steps of 1 beside the text \"Collector\"" in r.stderr,
      f"digit header: note on the command line: {r.stderr!r}")
check("Collector 07" in r.stdout and "0: more than expected" in r.stdout and "Category 1" not in r.stdout, "digit header: report names digits")
# Changeable: --group-header no reads the line as a group (41 groups, categories unnamed).
r = run(["--by", "1", "--group-header", "no", "--json"], digits_wide)
doc = json.loads(r.stdout)
check(r.returncode == 0 and len(doc["groups"]) == 41 and doc["groups"][0]["name"] == "Collector" and doc["categories"][0] == "Category 1",
      f"--group-header no: the first line is a group: {r.stdout[:300]}")
r = run(["--by", "1", "--group-header", "maybe"], digits_wide)
check(r.returncode == 2 and "--group-header must be yes or no" in r.stderr, "--group-header other values: usage error")
# Years as categories, and a table whose rows all count up in steps: no header guessed there.
years = "Region\t2019\t2020\t2021\t2022\nNorth\t40\t38\t45\t37\nSouth\t22\t61\t25\t30\nEast\t33\t35\t31\t36\n"
doc = json.loads(run(["--by", "1", "--json"], years).stdout)
check(doc["categories"] == ["2019", "2020", "2021", "2022"] and len(doc["groups"]) == 3, f"year header read: {doc['categories']}")
stepping = "A,1,2,3\nB,2,3,4\nC,3,4,5\nD,5,6,7\n"
doc = json.loads(run(["--by", "1", "--json"], stepping).stdout)
check(len(doc["groups"]) == 4 and doc["screen"]["header"] is False, f"rows that all step alike: no header guessed: {doc.get('categories')}")
doc = json.loads(run(["--by", "1", "--group-header", "yes", "--json"], stepping).stdout)
check(len(doc["groups"]) == 3 and doc["categories"] == ["1", "2", "3"], "--group-header yes: the first line names the categories")

# ---- 2. Group names follow the category label rules --------------------------------------
cafe_nfc, cafe_nfd = unicodedata.normalize("NFC", "Café"), unicodedata.normalize("NFD", "Café")
check(cafe_nfc != cafe_nfd, "test data: two spellings of Café")
long_cafe = ("shop\tdigit\tcount\n" + f"{cafe_nfc}\t0\t10\n{cafe_nfc}\t1\t12\n{cafe_nfd}\t0\t5\n{cafe_nfd}\t1\t3\n"
             "Bar\t0\t20\nBar\t1\t9\nInn\t0\t11\nInn\t1\t13\n")
r = run(["--by", "shop", "--json"], long_cafe)
doc = json.loads(r.stdout)
check(r.returncode == 0 and [g["name"] for g in doc["groups"]] == [cafe_nfc, "Bar", "Inn"],
      f"NFC: composed and decomposed Café are one group: {[g['name'] for g in doc['groups']]}")
check(doc["groups"][0]["observed"] == [15, 15], f"NFC: their rows added: {doc['groups'][0]['observed']}")
check(any("more than one Unicode form" in n for n in doc["reading_notes"]), f"NFC: said in a note: {doc['reading_notes']}")
if have_scipy:
    check(close(doc["groups"][0]["p_value"], chisquare([15, 15]).pvalue), "NFC: Café's p vs scipy chisquare of the joined counts")
wide_cafe = f"shop,a,b,c\n{cafe_nfc},1,2,3\n{cafe_nfd},3,2,1\nBar,2,2,2\n"
r = run(["--by", "shop"], wide_cafe)
check(r.returncode == 1 and "appears again" in r.stderr and "another Unicode form" in r.stderr, f"NFC wide: refused naming the form: {r.stderr!r}")

# Invisible and direction characters: codes in the report, CSV and TSV; never the raw character.
rlo, zwsp, lri = "\u202e", "\u200b", "\u2066"
sly = {f"{rlo}exe.live": [30, 2, 3], f"A{zwsp}": [10, 11, 9], "A": [9, 10, 11], f"{lri}West": [12, 8, 10],
       "North": [10, 10, 10], "north": [11, 9, 10]}
sly_text = "region\tkind\tcount\n" + "".join(f"{g}\t{k}\t{c}\n" for g, cs in sly.items() for k, c in zip("xyz", cs))
r = run(["--by", "region"], sly_text)
check(r.returncode == 0, f"invisible names: exits 0 ({r.stderr})")
for out, what in [(r.stdout, "report")] + [(run(["--by", "region", "--table", f], sly_text).stdout, f) for f in ("csv", "tsv")]:
    check(not any(ch in out for ch in (rlo, zwsp, lri)), f"{what}: no raw invisible character")
    check("<U+202E>exe.live" in out and "A<U+200B>" in out and "<U+2066>West" in out, f"{what}: codes shown: {out[:400]!r}")
doc = json.loads(run(["--by", "region", "--json"], sly_text).stdout)
check("<U+202E>exe.live" in [g["name"] for g in doc["groups"]], "JSON: the name with its code")
check("Group names that look the same" in r.stderr and '"A<U+200B>" and "A"' in r.stderr and '"North" and "north"' in r.stderr,
      f"look-alike names noted on the command line: {r.stderr!r}")
check("shown as <U+XXXX> codes" in r.stderr, "invisible characters: noted")
if have_scipy:
    ps = [chisquare(cs).pvalue for cs in sly.values()]
    check(all(close(g["p_value"], p) for g, p in zip(doc["groups"], ps)), "invisible names: each group's p vs scipy chisquare")
# ---- 3. Conformity with groups: refused, naming both options ------------------------------
r = run(["--by", "1", "--conformity", "0.1"], digits_wide)
check(r.returncode == 2 and "--conformity" in r.stderr and "--by" in r.stderr, f"--conformity with --by refused: {r.stderr!r}")
conf_doc = json.dumps({"categories": ["a", "b"], "conformity": {"margin_w": 0.1},
                       "groups": [{"name": "g1", "observed": [50, 52]}, {"name": "g2", "observed": [48, 55]}]})
r = run([], conf_doc)
check(r.returncode == 1 and "conformity" in r.stderr and "screen" in r.stderr, f"document: conformity with groups refused: {r.stderr!r}")
r = run(["--json"], conf_doc)
check(r.returncode == 1 and "conformity" in json.loads(r.stdout)["error"], "document: JSON error form")

# ---- 4. One Monte Carlo budget: 100,000,000 draws for every kind of analysis ---------------
ten = "".join(f"c{i}\t{100 + (i % 3) - 1}\n" for i in range(10))
r = run(["--method", "monte-carlo", "--replicates", "100000000", "--json"], ten)
doc = json.loads(r.stdout)
check(r.returncode == 0 and doc["method"] == "asymptotic", f"single sample over the budget: asymptotic p shown ({doc.get('method')})")
check(any("beyond the budget of 100,000,000 draws" in w and "at most 10,000,000 here" in w for w in doc["warnings"]),
      f"single sample: refusal names the budget: {doc['warnings']}")
r = run(["--method", "monte-carlo", "--replicates", "10000", "--json"], ten)
doc = json.loads(r.stdout)
check(doc["method"] == "monte-carlo" and doc["monte_carlo"]["replicates"] == 10000, "single sample within the budget: simulated")
previous = "Category\tThis month\tLast month\n" + "".join(f"c{i}\t{100 + i}\t{500 + 3 * i}\n" for i in range(10))
r = run(["--method", "monte-carlo", "--replicates", "200000", "--json"], previous)
doc = json.loads(r.stdout)
check(any("beyond the budget of 100,000,000 draws" in w and "placing 1,045 observations" in w for w in doc["warnings"]),
      f"previous sample: refusal names the same budget: {doc['warnings']}")
r = run(["--method", "monte-carlo", "--replicates", "50000", "--json"], previous)
check(json.loads(r.stdout)["method"] == "monte-carlo", "previous sample within the budget: simulated")
r = run(["--by", "1", "--method", "monte-carlo", "--replicates", "300000"], digits_wide)
check(r.returncode == 1 and "beyond the budget of 100,000,000 draws" in r.stderr and "300,000 for each of 40 groups" in r.stderr,
      f"screen over the budget: refused naming it: {r.stderr!r}")
r = run(["--by", "1", "--method", "monte-carlo", "--replicates", "2000", "--seed", "5", "--json"], digits_wide)
doc = json.loads(r.stdout)
check(r.returncode == 0 and all(g["method"] == "monte-carlo" for g in doc["groups"]), "screen within the budget: every group simulated")
if have_scipy:  # a Monte Carlo p within 4 standard errors of the asymptotic one at these sizes (common practice)
    for g in doc["groups"][:5]:
        p = chisquare(collectors[g["name"]]).pvalue
        check(abs(g["p_value"] - p) <= 4 * (p * (1 - p) / 2000) ** 0.5 + 1 / 2001, f"screen MC {g['name']}: near scipy's asymptotic p")

# ---- 5. The same messages for groups' faults, from core -----------------------------------
r = run(["--by", "reader"], "reader\tdigit\tcount\nA\t0\t3\nA\t1\t2\n")
check(r.returncode == 1 and "Only one group (\"A\"): screening compares two or more groups; read its counts as one sample instead." in r.stderr,
      f"one group: {r.stderr!r}")
r = run(["--by", "reader"], "reader\tdigit\tcount\nA\t0\t3\n\t1\t2\nB\t0\t1\nB\t1\t1\n")
check(r.returncode == 1 and "Line 3, column 1: the group cell is empty; every row needs the name of its group." in r.stderr, f"empty group: {r.stderr!r}")
for groups, what in [("null", "null"), ("5", "not a list"), ('"A"', "not a list")]:
    r = run(["--json"], '{"categories": ["a", "b", "c"], "observed": [1, 2, 3], "groups": ' + groups + "}")
    err = json.loads(r.stdout).get("error", "")
    check(r.returncode == 1 and '"groups" must be a list' in err and f"(it is {what})" in err, f'"groups": {groups} refused naming it: {err!r}')

# ---- 6. The screen in the analysis document: --json output read back as the same screen ----
lots = {"lot 1": [50, 30, 20], "lot 2": [20, 50, 30], "lot 3": [48, 33, 19], "lot 4": [52, 27, 21]}
source = {"format": "tallyproof/1", "categories": ["A", "B", "C"], "model": {"kind": "shares", "values": [0.5, 0.3, 0.2]},
          "statistic": {"lambda": 0}, "by": "lot", "groups": [{"name": n, "observed": c} for n, c in lots.items()],
          "screen": {"against": "model", "adjust": "holm", "q": 0.1, "sort": "q", "ascending": False, "opened": "lot 2"}}
first = run(["--json"], json.dumps(source))
check(first.returncode == 0, f"document screen exits 0 ({first.stderr})")
out1 = json.loads(first.stdout)
check(out1["model"]["values"] == [0.5, 0.3, 0.2] and out1["statistic"]["lambda"] == 0, "output carries the model's values and statistic")
check(out1["screen"]["sort"] == "q" and out1["screen"]["ascending"] is False and out1["screen"]["opened"] == "lot 2", "output carries sort and opened group")
second = run(["--json"], first.stdout)
check(second.returncode == 0, f"the output read back exits 0 ({second.stderr})")
out2 = json.loads(second.stdout)
for key in ("categories", "by", "model", "statistic", "pvalue", "merge", "screen"):
    check(out1[key] == out2[key], f"round trip: {key} the same: {out1[key]} / {out2[key]}")
check([(g["name"], g["observed"], g["p_value"], g["q_value"], g["flagged"]) for g in out1["groups"]] ==
      [(g["name"], g["observed"], g["p_value"], g["q_value"], g["flagged"]) for g in out2["groups"]], "round trip: every group's result the same")
if have_scipy:  # G2 (lambda 0) against the shares: SciPy power_divergence; Holm across groups: statsmodels
    from scipy.stats import power_divergence
    ps = [power_divergence(c, [sum(c) * s for s in (0.5, 0.3, 0.2)], lambda_=0).pvalue for c in lots.values()]
    check(all(close(g["p_value"], p) for g, p in zip(out2["groups"], ps)), "round trip: G2 p vs scipy power_divergence")
    check(all(close(g["q_value"], q) for g, q in zip(out2["groups"], multipletests(ps, method="holm")[1])), "round trip: q vs statsmodels holm")
# A paste's screen: --json output re-run gives the same groups and settings (shape and header kept).
paste1 = json.loads(run(["--by", "1", "--model", "last-digit", "--adjust", "bonferroni", "--json"], digits_wide).stdout)
paste2 = json.loads(run(["--json"], json.dumps(paste1)).stdout)
check(paste2["screen"]["shape"] == "wide" and paste2["screen"]["header"] is True and paste2["model"]["kind"] == "last-digit"
      and paste2["screen"]["adjust"] == "bonferroni", f"paste round trip: settings kept: {paste2['screen']}")
check([g["q_value"] for g in paste1["groups"]] == [g["q_value"] for g in paste2["groups"]], "paste round trip: q-values the same")
bad = dict(source, screen={"opened": "lot 9"})
r = run([], json.dumps(bad))
check(r.returncode == 1 and "screen.opened" in r.stderr and "lot 9" in r.stderr, f"opened group not in groups: refused: {r.stderr!r}")
r = run([], json.dumps(dict(source, screen={"sort": "colour"})))
check(r.returncode == 1 and "screen.sort" in r.stderr, f"unknown sort column refused: {r.stderr!r}")

# Documents: group faults named by member, and group names under the label rules.
r = run([], '{"categories": ["a", "b"], "groups": [{"name": "only", "observed": [1, 2]}]}')
check(r.returncode == 1 and 'has 1 group ("only")' in r.stderr and "read its counts as one sample instead" in r.stderr, f"document, one group: {r.stderr!r}")
r = run([], '{"categories": ["a", "b"], "groups": [{"name": "", "observed": [1, 2]}, {"name": "B", "observed": [2, 1]}]}')
check(r.returncode == 1 and "groups[0].name" in r.stderr and "every group needs its name" in r.stderr, f"document, empty name: {r.stderr!r}")
# A name written twice in two forms is refused as one group twice.
dup = json.dumps({"categories": ["a", "b"], "groups": [{"name": cafe_nfc, "observed": [1, 2]}, {"name": cafe_nfd, "observed": [2, 1]}]})
r = run([], dup)
check(r.returncode == 1 and "appears twice" in r.stderr and "NFC" in r.stderr, f"document: NFC duplicates refused: {r.stderr!r}")
alike = json.dumps({"categories": ["a", "b"], "groups": [{"name": "North", "observed": [5, 6]}, {"name": "north", "observed": [6, 5]},
                                                         {"name": f"x{rlo}", "observed": [4, 4]}]})
r = run([], alike)
check(r.returncode == 0 and '"North" and "north"' in r.stderr and "x<U+202E>" in r.stdout and rlo not in r.stdout,
      f"document: look-alikes noted, codes shown: {r.stderr!r}")

finish("0 failure(s)", "{n} failure(s)")
