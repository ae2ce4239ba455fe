#!/usr/bin/python3
"""The recipes of docs/large-data.md, run as written through a shell pipe: a SQLite database
built here with Python's sqlite3 module (standard library; amounts from a fixed random.Random,
with NULLs, zeros and negatives), the column streamed to `tallyproof --digits first -`, and the
GROUP BY counts piped to `tallyproof --model benford-first --ordered -`. The reference is the
tool's own result on the same amounts read from a file (the path issue #28 compares against),
and Python's first digit of each amount (collections.Counter) for the counts.
Usage: test_cli_large_data.py PATH_TO_TALLYPROOF"""
import collections
import json
import os
import random
import re
import shutil
import sqlite3
import subprocess
import tempfile

from cli_common import TOOL, check, finish, run

DOC = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "docs", "large-data.md")


def recipes():
    """The sh blocks of docs/large-data.md that use sqlite3, with `tallyproof` as the tool under test."""
    text = open(DOC, encoding="utf-8").read()
    blocks = re.findall(r"```sh\n(.*?)```", text, re.S)
    return [b for b in blocks if "sqlite3" in b]


def counts_of(doc):
    return dict(zip(doc["categories"], doc["observed"])) if "categories" in doc else None


if shutil.which("sqlite3") is None:
    print("sqlite3 (the command) is not installed: the recipes cannot run (.ci/bootstrap installs it)")
    check(False, "sqlite3 is installed")
    finish("")

with tempfile.TemporaryDirectory() as tmp:
    rng = random.Random(2028)
    amounts = []
    for i in range(200000):
        if i % 997 == 0:
            amounts.append(None)
        elif i % 1009 == 0:
            amounts.append(0.0)
        else:
            v = round(10 ** rng.uniform(-1, 6), 2)
            amounts.append(-v if i % 13 == 0 else v)
    db = sqlite3.connect(os.path.join(tmp, "ledger.db"))
    db.execute("create table entries (id integer primary key, amount real)")
    db.executemany("insert into entries (amount) values (?)", [(a,) for a in amounts])
    db.commit()
    db.close()
    # The same amounts in a file, one per line, as sqlite3 would not round them: two decimals.
    with open(os.path.join(tmp, "amounts.txt"), "w") as f:
        f.write("".join(("" if a is None else "%.2f" % a) + "\n" for a in amounts))
    from_file = run(["--json", "--digits", "first", os.path.join(tmp, "amounts.txt")])
    check(from_file.returncode == 0, "the file reads: " + from_file.stderr[:300])
    ref = json.loads(from_file.stdout)
    # Python's first significant digit of each non-zero amount.
    py = collections.Counter(("%.2f" % abs(a)).replace(".", "").lstrip("0")[0] for a in amounts if a)

    blocks = recipes()
    check(len(blocks) == 2, "docs/large-data.md has the two sqlite3 recipes (found %d)" % len(blocks))
    for block in blocks:
        cmd = block.replace("tallyproof ", "tallyproof --json ", 1).replace("tallyproof", "'%s'" % os.path.abspath(TOOL))
        r = subprocess.run(["/bin/sh", "-c", cmd], cwd=tmp, capture_output=True, text=True, timeout=300)
        check(r.returncode == 0, "the recipe runs: %s\n%s" % (block.strip()[:80], r.stderr[:300]))
        if r.returncode != 0:
            continue
        doc = json.loads(r.stdout)
        got = counts_of(doc.get("input", doc)) or counts_of(doc)
        want = counts_of(ref.get("input", ref)) or counts_of(ref)
        check(got is not None and {k: int(v) for k, v in got.items()} == {k: int(v) for k, v in want.items()},
              "the recipe's counts equal the file's: %s vs %s" % (got, want))
        check({k: int(v) for k, v in want.items()} == {d: py[d] for d in "123456789"}, "the file's counts equal Python's first digits")
        for key in ("statistic", "p_value", "df"):
            a, b = doc.get(key), ref.get(key)
            check(a is not None, "the result has %s" % key)
            check(a == b, "%s: recipe %r, file %r" % (key, a, b))

finish("large-data recipes: all checks passed")
