#!/usr/bin/python3
"""The GROUP BY recipes of docs/large-data.md ("Many groups"), run on two SQL engines over one
generated table of a million rows: SQLite (Python's sqlite3 module, standard library) and DuckDB
(its Node.js client @duckdb/node-api, installed by .ci/bootstrap from tests/sql/package-lock.json;
tests/sql/duckdb_queries.mjs runs the queries). Each query's long table (group, category, count)
goes to `tallyproof --by branch` with the options its `-- then:` line names; the reference is the
tool's own screen of the raw rows (branch, value) read from a file: --digits first, second,
first-two, last, --raw categories and --bins. Per group the counts by label, df, chi-square and
p-value must be equal (the same counts in the same order give the same numbers; a 1e-12 relative
allowance covers a sum taken in another order). The amounts include the edge cases of digit
extraction: negatives, amounts below 1 (0.0042), trailing zeros, leading zeros, a plus sign,
zeros and NULLs. Python's own digit of each amount (collections.Counter) checks the raw reading
itself. Skipped with a message only when DuckDB's client is not installed (run .ci/bootstrap).
Usage: test_cli_sql_recipes.py PATH_TO_TALLYPROOF"""
import collections
import json
import os
import random
import re
import shutil
import sqlite3
import subprocess
import sys
import tempfile

from cli_common import check, close, finish, run

HERE = os.path.dirname(os.path.abspath(__file__))
DOC = os.path.join(HERE, "..", "..", "docs", "large-data.md")
SQL_DIR = os.path.join(HERE, "..", "sql")
ROWS = 1_000_000

# The tool's reading of the raw rows that each recipe must match, by the model the recipe names.
RAW_READING = {
    "benford-first": (["--digits", "first"], "amounts"),
    "benford-second": (["--digits", "second"], "amounts"),
    "benford-first-two": (["--digits", "first-two"], "amounts"),
    "last-digit": (["--digits", "last"], "amounts"),
}


def recipes():
    """(sql, tool options) for each ```sql block of the doc's "Many groups" section."""
    text = open(DOC, encoding="utf-8").read()
    out = []
    for block in re.findall(r"```sql\n(.*?)```", text, re.S):
        m = re.match(r"-- then: tallyproof (.*?) -\n", block)
        check(m is not None, "a recipe starts with its `-- then: tallyproof ... -` line: " + block[:60])
        if m:
            out.append((block, m.group(1).split()))
    return out


def amount_text(rng):
    """One amount as an analyst's file writes it (None: NULL)."""
    u = rng.random()
    if u < 0.01:
        return None
    if u < 0.02:
        return rng.choice(["0", "0.00", "-0.00", "000"])
    if u < 0.10:
        v = "%.4f" % rng.uniform(0.0001, 0.0999)   # below 1: 0.0042 starts with 4
    elif u < 0.20:
        v = str(rng.randint(1, 99999))             # whole amounts, some ending in 0
    elif u < 0.21:
        v = "00" + "%.2f" % rng.uniform(1, 99)     # leading zeros
    else:
        v = "%.2f" % (10 ** rng.uniform(-1, 6))    # cents: 12.50 ends in 0
    w = rng.random()
    return "-" + v if w < 0.08 else "+" + v if w < 0.09 else v


def python_digit(amount, test):
    """Python's digit of one amount for a test, or None when the tool's rules leave it out."""
    if amount is None:
        return None
    s = amount.lstrip("+-").replace(".", "").lstrip("0")
    if test == "benford-first":
        return s[:1] or None
    if test == "benford-second":
        return s[1] if len(s) >= 2 else None
    if test == "benford-first-two":
        return s[:2] if abs(float(amount)) >= 10 else None
    if test == "last-digit":
        return s[-1] if s else None


def screen(args, path):
    r = run(["--json"] + args + [path], timeout=600)
    check(r.returncode == 0, "tallyproof %s %s: %s" % (" ".join(args), os.path.basename(path), r.stderr[-400:]))
    if r.returncode != 0:
        return None
    doc = json.loads(r.stdout)
    cats = doc.get("categories", [])
    return {g["name"]: ({c: int(o) for c, o in zip(cats, g["observed"])}, g["df"], g["statistic"], g["p_value"])
            for g in doc.get("groups", [])}


def same_screen(got, want, what):
    check(got is not None and want is not None, what + ": both screens ran")
    if got is None or want is None:
        return
    check(sorted(got) == sorted(want), what + ": the same groups (%d vs %d)" % (len(got), len(want)))
    bad = [g for g in want if g in got and not (
        {k: v for k, v in got[g][0].items() if v} == {k: v for k, v in want[g][0].items() if v}
        and got[g][1] == want[g][1] and close(got[g][2], want[g][2]) and close(got[g][3], want[g][3]))]
    check(not bad, what + ": groups differ: %s; query %r, raw %r" % (
        bad[:3], got.get(bad[0]) if bad else None, want.get(bad[0]) if bad else None))


node = shutil.which("node")
duckdb_client = os.path.join(SQL_DIR, "node_modules", "@duckdb", "node-api")
if node is None or not os.path.isdir(duckdb_client):
    print("SKIPPED: DuckDB's Node.js client is not installed (%s); .ci/bootstrap installs it "
          "(cd tests/sql && npm ci)" % ("no node" if node is None else duckdb_client))
    sys.exit(77)  # ctest's SKIP_RETURN_CODE (tests/CMakeLists.txt)

with tempfile.TemporaryDirectory() as tmp:
    rng = random.Random(2028)
    branches = ["branch-%02d" % i for i in range(40)]
    kinds = ["Travel", "Meals", "Supplies", "Fees", " Travel ", "fees"]
    rows = []
    for i in range(ROWS):
        b = branches[min(int(rng.expovariate(1.0) * 8), len(branches) - 1)]  # groups of unequal size
        c = None if rng.random() < 0.01 else rng.choice(kinds)
        rows.append((b, amount_text(rng), c))
    csv_path = os.path.join(tmp, "entries.csv")
    with open(csv_path, "w", encoding="utf-8") as f:
        f.write("branch,amount,category\n")
        f.write("".join("%s,%s,%s\n" % (b, a or "", c or "") for b, a, c in rows))
    amounts_path = os.path.join(tmp, "amounts.tsv")
    with open(amounts_path, "w", encoding="utf-8") as f:
        f.write("branch\tamount\n" + "".join("%s\t%s\n" % (b, a or "") for b, a, c in rows))
    categories_path = os.path.join(tmp, "categories.tsv")
    with open(categories_path, "w", encoding="utf-8") as f:
        f.write("branch\tcategory\n" + "".join("%s\t%s\n" % (b, c or "") for b, a, c in rows))
    db = sqlite3.connect(os.path.join(tmp, "ledger.db"))
    db.execute("create table entries (branch text, amount text, category text)")
    db.executemany("insert into entries values (?, ?, ?)", rows)
    db.commit()

    blocks = recipes()
    check(len(blocks) == 6, "docs/large-data.md has six GROUP BY recipes (found %d)" % len(blocks))
    queries_path = os.path.join(tmp, "queries.json")
    with open(queries_path, "w") as f:
        json.dump([sql for sql, _ in blocks], f)
    duck_dir = os.path.join(tmp, "duckdb")
    os.mkdir(duck_dir)
    d = subprocess.run([node, os.path.join(SQL_DIR, "duckdb_queries.mjs"), csv_path, "entries", queries_path, duck_dir],
                       capture_output=True, text=True, timeout=600)
    check(d.returncode == 0, "DuckDB runs the recipes: " + d.stderr[-600:])
    print(d.stdout.strip(), "| sqlite", sqlite3.sqlite_version, "|", ROWS, "rows")

    raw_cache = {}
    for i, (sql, options) in enumerate(blocks):
        model = options[options.index("--model") + 1]
        if model in RAW_READING:
            raw_args, source = RAW_READING[model]
        elif "case when" in sql:
            raw_args, source = ["--bins", "-inf,0,10,100,1000,inf", "--model", "equal"], "amounts"
        else:
            raw_args, source = ["--raw", "--model", "equal"], "categories"
        key = " ".join(raw_args)
        if key not in raw_cache:
            raw_cache[key] = screen(["--by", "branch"] + raw_args, amounts_path if source == "amounts" else categories_path)
        want = raw_cache[key]
        if model in RAW_READING and want is not None:
            # Python's digits of the raw amounts (the rules of the doc's table), pooled over groups
            py = collections.Counter(python_digit(a, model) for _, a, _ in rows)
            py.pop(None, None)
            pooled = collections.Counter()
            for counts, _, _, _ in want.values():
                pooled.update(counts)
            check(+pooled == +py, "%s: the tool's raw reading equals Python's digits" % model)
        # SQLite: the table as `sqlite3 -header -separator TAB` prints it
        cur = db.execute(sql)
        out = os.path.join(tmp, "sqlite%d.tsv" % i)
        with open(out, "w", encoding="utf-8") as f:
            f.write("\t".join(c[0] for c in cur.description) + "\n")
            f.write("".join("\t".join(str(v) for v in r) + "\n" for r in cur))
        same_screen(screen(options, out), want, "SQLite, recipe %d (%s)" % (i + 1, " ".join(options)))
        # DuckDB: the table as `duckdb -csv` prints it
        out = os.path.join(duck_dir, "%d.csv" % i)
        if os.path.exists(out):
            same_screen(screen(options, out), want, "DuckDB, recipe %d (%s)" % (i + 1, " ".join(options)))
        else:
            check(False, "DuckDB wrote no result for recipe %d" % (i + 1))
    db.close()

finish("SQL GROUP BY recipes on SQLite and DuckDB: all checks passed")
