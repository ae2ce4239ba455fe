"""Words on screen (issue 18): Monte Carlo results say "replicates" and never "B ="; whole counts
that total 100 raise no warning, only a quiet question, while decimals, % signs and a percent
header do get the percentages note; docs/glossary.md carries the glossary the tool prints. These
are checks of wording, so they need no outside reference (the Monte Carlo p itself is checked
against SciPy in test_cli.py)."""
import json
import os
from cli_common import check, finish, run

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))

# Monte Carlo: the report, the write-up in each style, and --help.
mc = ["--method", "monte-carlo", "--replicates", "20000", "--seed", "5"]
rep = run(mc, "A\t12\nB\t18\nC\t9\nD\t11\n")
check(rep.returncode == 0, f"Monte Carlo report ran: {rep.stderr}")
check("20,000 replicates" in rep.stdout, "the report says '20,000 replicates'")
check("B =" not in rep.stdout and "B=" not in rep.stdout, "the report has no 'B ='")
for style in ("plain", "markdown", "tsv"):
    w = run(mc + ["--writeup", style], "A\t12\nB\t18\nC\t9\nD\t11\n")
    check(w.returncode == 0 and "replicates" in w.stdout, f"write-up ({style}) says replicates: {w.stdout[:300]}")
    check("B =" not in w.stdout, f"write-up ({style}) has no 'B ='")
h = run(["--help"])
check("replicates" in h.stdout and "--replicates N" in h.stdout and "--replicates B" not in h.stdout, "--help words --replicates")
check("--glossary" in h.stdout, "--help lists --glossary")

# Percentages: whole counts totalling 100 get a question, not a warning.
j = json.loads(run(["--json"], "A\t40\nB\t60\n").stdout)
check(not any("percent" in w for w in j["warnings"]), f"40/60: no percentages warning: {j['warnings']}")
check(len(j["questions"]) == 1 and "percentages" in j["questions"][0], f"40/60: one quiet question: {j['questions']}")
plain = run([], "A\t40\nB\t60\n")
check("Note:" not in plain.stdout and "Check: The counts total 100" in plain.stdout, "40/60: the report asks, it does not warn")
j = json.loads(run(["--json"], "A\t37\nB\t64\n").stdout)
check(j["questions"] == [] and not any("percent" in w for w in j["warnings"]), "37/64 (total 101): no question at all")
for text, what in (("A\t25.5\nB\t74.5\n", "decimals"), ("A\t25%\nB\t75%\n", "% signs")):
    r = run([], text)
    check(r.returncode == 1 and "a test on percentages is wrong by a factor of N/100" in r.stderr,
          f"{what}: refused with the percentages note: {r.stderr}")
r = run([], "Grade\tShare %\nA\t25\nB\t75\n")
check(r.returncode == 0 and "headed \"Share %\"" in r.stderr and "percentages" in r.stderr,
      f"a percent header over whole counts totalling 100: the note: {r.stderr}")

# The glossary: docs/glossary.md holds exactly what --glossary prints; the statistic's symbol is χ².
g = run(["--glossary"])
check(g.returncode == 0 and g.stdout.startswith("| Shown as | Meaning |"), "--glossary prints a Markdown table")
with open(os.path.join(ROOT, "docs", "glossary.md"), encoding="utf-8") as f:
    doc = f.read()
check(g.stdout in doc, "docs/glossary.md carries the glossary as --glossary prints it (regenerate it with the tool)")
for term in ("| χ² |", "| df |", "| Fei |", "| λ |", "| Holm p |", "| Adj. res. |", "| replicates |", "| by statistic |", "| by probability |"):
    check(term in g.stdout, f"the glossary explains {term}")
rep = run([], "A\t30\nB\t20\nC\t10\nD\t40\n")
check("χ² = 20.00" in rep.stdout and "X²" not in rep.stdout, "the report writes the statistic χ², never X²")
check("Pearson χ²" in rep.stdout, "the test is named Pearson χ²")
fei = run(["--model", "shares", "--values", "0.6,0.3,0.1"], "A\t50\nB\t30\nC\t20\n")
check("Fei (w rescaled to run from 0 to 1 for these expected shares) = " in fei.stdout, f"Fei introduced where it appears: {fei.stdout}")

finish("wording checks passed")
