#!/usr/bin/python3
"""`--table xlsx`: the workbooks of one analysis (sheets Categories and Numbers) and of a screen of
groups (sheets Groups and Screen), checked from outside the tool:
1. LibreOffice Calc (Debian libreoffice-calc-nogui) converts each workbook back to one CSV per
   sheet; every label must come back as typed (χ², accents, CJK, and "=1+1", "@x", "+1" as text,
   never evaluated) and every number must equal the tool's --json value (full precision) and its
   --table csv / --writeup tsv text (within the printed precision);
2. openpyxl (Debian python3-openpyxl), when installed, reads the cell types: numbers numeric,
   labels strings, p-values in the format 0.000E+00, and the values exactly the --json doubles;
3. a p-value below the double range is text, as the CSV writes it, with a note row;
4. a terminal is refused as the destination of the binary workbook.
Skipped parts say why. Usage: test_cli_xlsx.py PATH_TO_TALLYPROOF"""
import csv
import glob
import io
import json
import math
import os
import pty
import shutil
import subprocess
import tempfile

from cli_common import TOOL, check, finish, run

work = tempfile.mkdtemp(prefix="tp-xlsx-")
soffice = shutil.which("soffice") or shutil.which("libreoffice")
try:
    import openpyxl
except ImportError:
    openpyxl = None
    print("skip: python3-openpyxl is not installed; cell types not checked with openpyxl")

# Invented counts; the labels cover what a spreadsheet could mangle: Greek and superscripts,
# accents, CJK, and text that looks like a formula or a number.
LABELS = ["χ² bin", "Café é", "Über ü", "中文标签", "=1+1", "@x", "+1"]
COUNTS = [30, 14, 34, 45, 22, 18, 27]
paste = "".join(f"{l}\t{c}\n" for l, c in zip(LABELS, COUNTS))


def workbook(args, stdin, name):
    path = os.path.join(work, name + ".xlsx")
    r = run(args + ["--table", "xlsx", "-"], stdin.encode("utf-8"))
    check(r.returncode == 0, f"{name}: --table xlsx exits 0 ({r.stderr!r})")
    check(r.stdout[:4] == b"PK\x03\x04", f"{name}: a ZIP file (APPNOTE 4.3.7 local header signature)")
    open(path, "wb").write(r.stdout)
    check(run(args + ["--table", "xlsx", "-"], stdin.encode("utf-8")).stdout == r.stdout, f"{name}: the same bytes twice")
    return path


def calc_sheets(path):
    """Every sheet as rows of strings, through LibreOffice's CSV export of all sheets (filter
    options token 12 = -1, LibreOffice 7.2+; token 9 false: full values, not as shown)."""
    out = os.path.join(work, os.path.basename(path)[:-5] + "-csv")
    os.makedirs(out, exist_ok=True)
    env = dict(os.environ, HOME=work)
    subprocess.run([soffice, f"-env:UserInstallation=file://{work}/profile", "--headless", "--convert-to",
                    'csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1', "--outdir", out, path],
                   capture_output=True, timeout=180, env=env, check=True)
    sheets = {}
    base = os.path.basename(path)[:-5]
    for f in glob.glob(os.path.join(out, "*.csv")):
        sheet = os.path.basename(f)[len(base) + 1:-4]
        sheets[sheet] = list(csv.reader(io.open(f, encoding="utf-8", newline="")))
    return sheets


def calc_fods_cells(path, sheet):
    """One sheet's cells as (value-type, value or text) through LibreOffice's flat ODF export
    (OpenDocument 1.3 part 3, 19.385 office:value-type, 19.382 office:value: the value in full)."""
    import xml.etree.ElementTree as ET
    ns = {"table": "urn:oasis:names:tc:opendocument:xmlns:table:1.0", "office": "urn:oasis:names:tc:opendocument:xmlns:office:1.0",
          "text": "urn:oasis:names:tc:opendocument:xmlns:text:1.0"}
    out = os.path.join(work, "fods")
    subprocess.run([soffice, f"-env:UserInstallation=file://{work}/profile", "--headless", "--convert-to", "fods", "--outdir", out, path],
                   capture_output=True, timeout=180, env=dict(os.environ, HOME=work), check=True)
    root = ET.parse(os.path.join(out, os.path.basename(path)[:-5] + ".fods")).getroot()
    for t in root.iter(f"{{{ns['table']}}}table"):
        if t.get(f"{{{ns['table']}}}name") != sheet:
            continue
        rows = []
        for row in t.iter(f"{{{ns['table']}}}table-row"):
            cells = []
            for c in row.iter(f"{{{ns['table']}}}table-cell"):
                if c.get(f"{{{ns['table']}}}formula"):
                    cells.append(("formula", c.get(f"{{{ns['table']}}}formula")))
                    continue
                kind = c.get(f"{{{ns['office']}}}value-type")
                text = "".join("".join(p.itertext()) for p in c.iter(f"{{{ns['text']}}}p"))
                repeat = int(c.get(f"{{{ns['table']}}}number-columns-repeated", "1"))
                cells += [(kind, float(c.get(f"{{{ns['office']}}}value")) if kind == "float" else text)] * min(repeat, 50)
            rows.append(cells)
        return rows
    return []


def num(s):
    try:
        return float(s)
    except ValueError:
        return None


def same(a, b, rel=5e-15):
    """Equal within LibreOffice's CSV export, which writes at most 15 significant digits (half a unit
    of the 15th digit: 5e-15 relative). The exact doubles are checked through the .fods export and
    openpyxl below."""
    return a is not None and b is not None and (a == b or abs(a - b) <= rel * max(abs(a), abs(b)))


def within_print(cell_text, printed):
    """`cell_text` (full precision) rounds to `printed` (the CSV's %.6g / %.4g, the write-up's 2
    decimals): within half a unit of the last digit printed."""
    a, b = num(cell_text), num(printed)
    if a is None or b is None:
        return False
    mantissa, _, exponent = printed.lower().partition("e")
    decimals = len(mantissa.split(".")[1]) if "." in mantissa else 0
    return abs(a - b) <= 0.5 * 10.0 ** ((int(exponent) if exponent else 0) - decimals) * (1 + 1e-9)


# --- One analysis ------------------------------------------------------------------------------
doc = json.loads(run(["--json", "-"], paste).stdout)
table = list(csv.reader(io.StringIO(run(["--table", "csv", "-"], paste).stdout)))
wtsv = [line.split("\t") for line in run(["--writeup", "tsv", "-"], paste).stdout.split("\n")]
quantities = wtsv[:wtsv.index([""])]  # the first block, before the category table
one = workbook([], paste, "one")

if soffice:
    sheets = calc_sheets(one)
    check(sorted(sheets) == ["Categories", "Numbers"], f"one: sheets {sorted(sheets)}")
    cats = sheets.get("Categories", [])
    check(len(cats) == 1 + len(LABELS), f"Categories: {len(cats)} rows")
    check(cats and cats[0] == table[0], f"Categories: header as the CSV's: {cats[:1]} vs {table[0]}")
    # Columns with their --json source: the full-precision value each cell must hold.
    n = doc["n"]
    full = {1: doc["tested_observed"], 2: doc["tested_expected"], 3: [o / n for o in doc["tested_observed"]],
            4: [e / n for e in doc["tested_expected"]], 5: doc["contributions"], 6: doc["pearson_residuals"],
            7: doc["adjusted_residuals"], 8: doc["category_p_values"], 9: doc["category_p_adjusted"],
            11: doc["intervals"]["lower"], 12: doc["intervals"]["upper"]}
    for i, label in enumerate(LABELS):
        row = cats[i + 1] if i + 1 < len(cats) else []
        check(row[:1] == [label], f"Categories: label {label!r} came back as {row[:1]}")
        check(len(row) == 13 and row[10] == table[i + 1][10], f"Categories {label}: direction {row[10:11]}")
        for col, values in full.items():
            if len(row) <= col:
                break
            check(same(num(row[col]), values[i]), f"Categories {label} col {col}: {row[col]} vs --json {values[i]!r}")
            check(within_print(row[col], table[i + 1][col]), f"Categories {label} col {col}: {row[col]} vs --table csv {table[i + 1][col]}")
    nums = sheets.get("Numbers", [])
    check(nums[:1] == [["Quantity", "Value"]], f"Numbers: header {nums[:1]}")
    check([r[0] for r in nums[1:]] == [q[0] for q in quantities], f"Numbers: quantities as --writeup tsv: {[r[0] for r in nums[1:]]}")
    by_name = {r[0]: r[1] for r in nums[1:] if len(r) > 1}
    for name, value in [("Value", doc["statistic"]), ("df", doc["df"]), ("N", doc["n"]), ("p", doc["p_value"]),
                        ("w (corrected for chance)", doc["effect_size"]["w"]),
                        ("Cohen's w before the correction, √(χ²/N)", doc["effect_size"]["cohen_w"]),
                        ("w, 95% CI lower", doc["effect_size"]["w_interval"][0]),
                        ("w, 95% CI upper", doc["effect_size"]["w_interval"][1])]:
        check(same(num(by_name.get(name)), value), f"Numbers {name}: {by_name.get(name)} vs --json {value!r}")
    for q in quantities:  # every number within the write-up's print, every text as written there
        got = by_name.get(q[0])
        if num(q[1]) is not None:
            check(within_print(got or "", q[1]), f"Numbers {q[0]}: {got} vs --writeup tsv {q[1]}")
        elif q[0] != "Note":
            check(got == q[1], f"Numbers {q[0]}: {got!r} vs --writeup tsv {q[1]!r}")
    # Calc's own reading of the cells: labels are strings, nothing is a formula, numbers are numbers
    # (LibreOffice 7.4 saves office:value to 15 significant digits too, so `same` again; the exact
    # doubles in the file are checked by openpyxl below).
    fods = calc_fods_cells(one, "Categories")
    check(not any(k == "formula" for r in fods for k, _ in r), "Calc (fods): no cell became a formula")
    for i, label in enumerate(LABELS):
        row = fods[i + 1] if i + 1 < len(fods) else []
        check(row[:1] == [("string", label)], f"Calc (fods): {label!r} is a string: {row[:1]}")
        for col, values in full.items():
            if len(row) > col:
                check(row[col][0] == "float" and same(row[col][1], values[i]),
                      f"Calc (fods) {label} col {col}: {row[col]} vs --json {values[i]!r}")
else:
    print("skip: LibreOffice is not installed (Debian libreoffice-calc-nogui); workbooks not converted back")

if openpyxl:
    wb = openpyxl.load_workbook(one)
    ws = wb["Categories"]
    check(ws["A1"].font.b, "openpyxl: the header is bold")
    for i, label in enumerate(LABELS):
        r = i + 2
        check(ws.cell(r, 1).data_type == "s" and ws.cell(r, 1).value == label, f"openpyxl: {label!r} a string: {ws.cell(r, 1).value!r}")
        check(ws.cell(r, 2).data_type == "n" and ws.cell(r, 2).value == doc["tested_observed"][i], f"openpyxl: observed of {label}")
        check(ws.cell(r, 3).value == doc["tested_expected"][i], f"openpyxl: expected of {label}: {ws.cell(r, 3).value!r}")
        check(ws.cell(r, 9).value == doc["category_p_values"][i] and ws.cell(r, 9).number_format == "0.000E+00",
              f"openpyxl: category p of {label}: {ws.cell(r, 9).value!r} {ws.cell(r, 9).number_format}")
    values = {ws2[0].value: ws2[1] for ws2 in wb["Numbers"].iter_rows(min_row=2)}
    check(values["p"].value == doc["p_value"] and values["p"].number_format == "0.000E+00", f"openpyxl: p {values['p'].value!r}")
    check(values["Value"].value == doc["statistic"] and values["Value"].data_type == "n", "openpyxl: the statistic, full precision")

# --- p below the double range: text as the CSV writes it, with a note ----------------------------
tiny = "A\t100000\nB\t1\n"
tdoc = json.loads(run(["--json", "-"], tiny).stdout)
check(tdoc["p_value"] == 0 and tdoc["log10_p_value"] < -308, f"tiny: p underflows ({tdoc['p_value']}, {tdoc['log10_p_value']})")
tcsv = [l.split("\t") for l in run(["--writeup", "tsv", "-"], tiny).stdout.split("\n")]
p_text = next(r[1] for r in tcsv if r[0] == "p")
tiny_book = workbook([], tiny, "tiny")
if soffice:
    nums = calc_sheets(tiny_book).get("Numbers", [])
    got = {r[0]: r[1] if len(r) > 1 else "" for r in nums}
    check(got.get("p") == p_text and "e-" in p_text, f"tiny: p as text {got.get('p')!r} vs --writeup tsv {p_text!r}")
    check(any(r and r[0].startswith("Note: a p-value below") for r in nums), "tiny: the note row under the Numbers sheet")
if openpyxl:
    cell = {r[0].value: r[1] for r in openpyxl.load_workbook(tiny_book)["Numbers"].iter_rows(min_row=2) if r[0].value}
    check(cell["p"].data_type == "s" and cell["p"].value == p_text, f"openpyxl tiny: p is text {cell['p'].value!r}")

# --- A screen of groups -------------------------------------------------------------------------
GROUPS = {"χ² team": [11, 9, 10, 12, 8, 10, 9, 11, 10, 10], "Zürich é": [9, 12, 11, 8, 10, 9, 12, 10, 9, 10],
          "东京": [10, 10, 9, 11, 12, 8, 10, 9, 11, 10], "=1+1": [12, 8, 10, 10, 9, 11, 10, 12, 8, 10],
          "@x": [40, 4, 6, 5, 5, 35, 5, 6, 4, 5]}
long_text = "reader\tdigit\tcount\n" + "".join(f"{g}\t{d}\t{c}\n" for g, cs in GROUPS.items() for d, c in enumerate(cs))
args = ["--by", "reader", "--model", "last-digit"]
sdoc = json.loads(run(args + ["--json", "-"], long_text).stdout)
gtable = list(csv.reader(io.StringIO(run(args + ["--table", "csv", "-"], long_text).stdout)))
groups_book = workbook(args, long_text, "groups")
if soffice:
    sheets = calc_sheets(groups_book)
    check(sorted(sheets) == ["Groups", "Screen"], f"groups: sheets {sorted(sheets)}")
    rows = sheets.get("Groups", [])
    check(rows[:1] == gtable[:1], f"Groups: header as the CSV's: {rows[:1]}")
    check(len(rows) == 1 + len(GROUPS), f"Groups: {len(rows)} rows")
    for i, (name, g) in enumerate(zip(GROUPS, sdoc["groups"])):
        row = rows[i + 1] if i + 1 < len(rows) else []
        check(row[:1] == [name], f"Groups: name {name!r} came back as {row[:1]}")
        for col, key in [(1, "n"), (2, "statistic"), (3, "df"), (4, "p_value"), (5, "q_value"), (6, "w")]:
            if len(row) > col:
                check(same(num(row[col]), g[key]), f"Groups {name} {key}: {row[col]} vs --json {g[key]!r}")
                check(within_print(row[col], gtable[i + 1][col]), f"Groups {name} {key}: {row[col]} vs --table csv {gtable[i + 1][col]}")
        check(row[9:12] == gtable[i + 1][9:12], f"Groups {name}: flagged, thin, method {row[9:12]}")
    screen = {r[0]: r[1] for r in sheets.get("Screen", []) if len(r) > 1}
    check(screen.get("Summary") == sdoc["screen"]["summary"], f"Screen: summary {screen.get('Summary')!r}")
    check(num(screen.get("Flagged")) == sdoc["screen"]["flagged"], f"Screen: flagged {screen.get('Flagged')}")
if openpyxl:
    ws = openpyxl.load_workbook(groups_book)["Groups"]
    for i, (name, g) in enumerate(zip(GROUPS, sdoc["groups"])):
        check(ws.cell(i + 2, 1).data_type == "s" and ws.cell(i + 2, 1).value == name, f"openpyxl groups: {name!r} a string")
        check(ws.cell(i + 2, 5).value == g["p_value"] and ws.cell(i + 2, 6).value == g["q_value"], f"openpyxl groups: p, q of {name}")

# --- A terminal is refused ------------------------------------------------------------------------
leader, follower = pty.openpty()
r = subprocess.run([TOOL, "--table", "xlsx", "-"], input=paste.encode(), stdout=follower, stderr=subprocess.PIPE, timeout=30)
os.close(follower)
os.close(leader)
check(r.returncode == 2 and b"> table.xlsx" in r.stderr, f"terminal refused: {r.returncode} {r.stderr!r}")
check(run(["--table", "ods", "-"], paste).returncode == 2, "--table ods is a usage error")

shutil.rmtree(work, ignore_errors=True)
finish("xlsx workbooks: all checks passed")
