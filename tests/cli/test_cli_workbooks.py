#!/usr/bin/python3
"""Workbooks (.xlsx, .ods) on the command line. Sources of the workbooks:
1. LibreOffice Calc (Debian 12's libreoffice-calc-nogui, 7.4) converts held CSV texts of every input
   shape the paste reader knows (one sample of label and count, with an expected column, with a
   previous sample's column, a counts column alone, raw text, raw values for --digits and for
   --bins, long and wide groups for --by) to .xlsx and .ods; the tool's --json result from each
   workbook must equal its result from the CSV (statistic, df, p-value, categories, counts).
2. openpyxl (Debian 12's python3-openpyxl 3.0.9) writes a workbook with a hidden sheet, a merged
   header, dates, booleans, a number stored as text and a formula, which openpyxl saves WITHOUT a
   cached value; LibreOffice then saves it again as .xlsx and .ods, with the value calculated.
   The reading asserted is the one docs/workbooks.md documents.
3. Refusals: --sheet/--range given for text, a sheet that is not there, an encrypted workbook
   (an OLE2 header with an "EncryptedPackage" stream name, [MS-OFFCRYPTO]), bad option values.
Skipped with a message when LibreOffice or openpyxl is absent.
Usage: test_cli_workbooks.py PATH_TO_TALLYPROOF"""
import datetime
import json
import os
import shutil
import subprocess
import tempfile

from cli_common import check, close, finish, run

soffice = shutil.which("soffice") or shutil.which("libreoffice")
work = tempfile.mkdtemp(prefix="tp-wb-")
env = dict(os.environ, HOME=work)


def convert(target, files):
    """One soffice call for many files: comma-separated UTF-8 CSV (filter options 44,34,76)."""
    cmd = [soffice, "-env:UserInstallation=file://" + os.path.join(work, "profile"), "--headless",
           "--infilter=CSV:44,34,76", "--convert-to", target, "--outdir", work] + files
    subprocess.run(cmd, capture_output=True, timeout=300, check=True, env=env)


def result(args, path=None, stdin=None):
    r = run(args + ["--json"] + ([path] if path else ["-"]), stdin=stdin)
    try:
        return r.returncode, json.loads(r.stdout), r.stderr
    except ValueError:
        return r.returncode, {}, r.stderr


# Data of our own invention, one per input shape, with the options that read it.
digits = "Amount\n" + "".join(f"{(i * 7919) % 9973 + 1}.{i % 100:02d}\n" for i in range(300))
values = "Reading\n" + "".join(f"{((i * 37) % 41) + 0.5 * (i % 3)}\n" for i in range(200))
SHAPES = {
    "label_count": ("Colour,Count\nred,18\ngreen,25\nblue,31\nyellow,26\n", []),
    "expected": ("Grade,Observed,Expected\nA,30,25\nB,14,20\nC,34,30\nD,22,25\n", []),
    "previous": ("Defect,This month,Last month\nScratch,40,35\nDent,22,30\nCrack,13,12\nStain,25,23\n", []),
    "counts_column": ("12\n15\n9\n14\n10\n", []),
    "raw_text": ("Answer\n" + "".join(["yes\n", "no\n", "yes\n", "maybe\n", "yes\n", "no\n"] * 7), []),
    "raw_digits": (digits, ["--digits", "first"]),
    "raw_bins": (values, ["--bins", "0,10,20,30,inf"]),
    "long_groups": ("Line,Defect,Count\n" + "".join(f"L{g},{d},{c}\n" for g, row in enumerate([[12, 8, 5], [10, 14, 6], [20, 4, 6]], 1)
                                                    for d, c in zip(["Scratch", "Dent", "Crack"], row)), ["--by", "Line"]),
    "wide_groups": ("Site,A,B,C\nNorth,12,9,15\nSouth,20,11,9\nEast,14,14,13\n", ["--by", "Site"]),
}


def same_result(a, b, what):
    if "groups" in a or "groups" in b:
        ga, gb = a.get("groups", []), b.get("groups", [])
        check(len(ga) == len(gb) and len(ga) > 0, f"{what}: {len(ga)} groups, {len(gb)} from the CSV")
        for x, y in zip(ga, gb):
            check(x["name"] == y["name"] and x["observed"] == y["observed"], f"{what}: group {x['name']} read as from the CSV")
            check(close(x["statistic"], y["statistic"]) and close(x["p_value"], y["p_value"]), f"{what}: group {x['name']} statistic and p")
        return
    check(a.get("error") is None and b.get("error") is None, f"{what}: analysed ({a.get('error')}, CSV: {b.get('error')})")
    check(a.get("categories") == b.get("categories"), f"{what}: categories {a.get('categories')} vs {b.get('categories')}")
    check(a.get("observed") == b.get("observed"), f"{what}: counts {a.get('observed')} vs {b.get('observed')}")
    check(a.get("df") == b.get("df"), f"{what}: df")
    check(close(a.get("statistic"), b.get("statistic")), f"{what}: statistic {a.get('statistic')} vs {b.get('statistic')}")
    check(close(a.get("p_value"), b.get("p_value")), f"{what}: p-value")
    check(a.get("expected_counts") == b.get("expected_counts"), f"{what}: expected counts")


if not soffice:
    print("skip: LibreOffice is not installed (Debian package libreoffice-calc-nogui); workbook round trips not run")
else:
    # 1. Every input shape, from the CSV and from LibreOffice's .xlsx and .ods of it.
    csvs = []
    for name, (text, _) in SHAPES.items():
        path = os.path.join(work, name + ".csv")
        open(path, "w", encoding="utf-8").write(text)
        csvs.append(path)
    convert("xlsx", csvs)
    convert("ods", csvs)
    for name, (text, opts) in SHAPES.items():
        code, want, _ = result(opts, os.path.join(work, name + ".csv"))
        check(code == 0, f"{name}: the CSV is analysed ({want.get('error')})")
        for ext in ("xlsx", "ods"):
            path = os.path.join(work, f"{name}.{ext}")
            code, got, err = result(opts, path)
            check(code == 0, f"{name}.{ext}: exits 0 ({got.get('error')} {err})")
            same_result(got, want, f"{name}.{ext}")
        # By content from standard input (no file name to go by).
        check(got.get("workbook", {}).get("sheet") == name and "workbook" not in want, f"{name}.{ext}: --json names the sheet read")
        code, got, _ = result(opts, None, open(os.path.join(work, name + ".xlsx"), "rb").read())
        check(code == 0, f"{name}.xlsx on standard input: exits 0")
        same_result(got, want, f"{name}.xlsx on standard input")

    r = run([os.path.join(work, "label_count.xlsx")])
    check(r.returncode == 0, "label_count.xlsx: plain report")
    check('note: Read sheet "label_count" (A1:B5) of ' in r.stderr and "1 sheet: label_count." in r.stderr,
          f"the notice names the sheet, range and sheets: {r.stderr}")

# 2. A workbook written by openpyxl, then saved again by LibreOffice.
try:
    import openpyxl
except ImportError:
    openpyxl = None
    print("skip: openpyxl is not installed (Debian package python3-openpyxl); the multi-sheet workbook is not tested")

if openpyxl:
    wb = openpyxl.Workbook()
    readme = wb.active
    readme.title = "Readme"
    readme["A1"] = "Counts of an inspection"
    readme["A2"] = "invented for this test"
    readme.sheet_state = "hidden"
    ws = wb.create_sheet("Counts")
    ws["A1"] = "Inspection"
    ws.merge_cells("A1:C1")
    rows = [("Grade", "Count", "Checked on", "Passed"),
            ("A", 30, datetime.date(2024, 3, 1), True),
            ("B", "14", datetime.datetime(2024, 3, 1, 13, 45), False),  # 14 stored as text
            ("C", 34, datetime.date(2024, 3, 2), True),
            ("D", 45, datetime.date(2024, 3, 2), True)]
    for i, row in enumerate(rows, 2):
        for j, v in enumerate(row, 1):
            ws.cell(row=i, column=j, value=v)
    ws["A8"] = "Total"
    ws["B8"] = "=SUM(B3:B6)"
    wb.create_sheet("Plan")
    source = os.path.join(work, "openpyxl.xlsx")
    wb.save(source)
    paste = "Grade\tCount\nA\t30\nB\t14\nC\t34\nD\t45\n"
    code, want, _ = result([], None, paste)

    def check_workbook(path, formula_saved, booleans=("TRUE", "FALSE")):
        what = os.path.basename(path)
        r = run([path])
        check('Read sheet "Counts" (A1:D8)' in r.stderr and "3 sheets: Readme (hidden), Counts, Plan." in r.stderr,
              f"{what}: the first visible sheet, its used range, the hidden sheet listed: {r.stderr}")
        check("Merged cells A1:C1" in r.stderr, f"{what}: the merged header is noted")
        # openpyxl 3.0.9 writes <f>SUM(B3:B6)</f> with no <v>: the note names B8.
        check(("B8 has a formula with no saved value" in r.stderr) != formula_saved, f"{what}: formula note {r.stderr}")
        code, got, _ = result(["--range", "A2:B6"], path)
        check(code == 0, f"{what}: --range A2:B6 analysed")
        check(got.get("workbook") == {"sheet": "Counts", "range": "A2:B6", "sheets": [
            {"name": "Readme", "hidden": True}, {"name": "Counts", "hidden": False}, {"name": "Plan", "hidden": False}]},
            f"{what}: --json's workbook member {got.get('workbook')}")
        same_result(got, want, f"{what} A2:B6")
        # Dates as ISO 8601 text and booleans as TRUE/FALSE: read as raw text, their categories.
        code, got, _ = result(["--range", "C3:C6", "--raw"], path)
        check(got.get("categories") == ["2024-03-01", "2024-03-01 13:45:00", "2024-03-02"], f"{what}: dates {got.get('categories')}")
        check(got.get("observed") == [1, 1, 2], f"{what}: dates counted")
        code, got, _ = result(["--sheet", "2", "--range", "D3:D6", "--raw"], path)
        want_booleans = {"TRUE": 3, "FALSE": 1, "1": 3, "0": 1}
        check(got.get("categories") is not None and sorted(got["categories"]) == sorted(booleans) and
              got.get("observed") == [want_booleans[c] for c in got["categories"]], f"{what}: booleans {got.get('categories')} {got.get('observed')}")
        code, got, err = result(["--sheet", "Counts", "--range", "A8:B8", "--raw"], path)
        if formula_saved:  # LibreOffice calculated 30 + 34 + 45 (the text "14" is not summed by SUM)
            check(code == 0 and got.get("categories") == ["Total", "109"], f"{what}: the saved total {got.get('categories')} {got.get('error')}")
        code, got, _ = result(["--sheet", "readme", "--raw"], path)
        check(code == 0 and got.get("categories") == ["Counts of an inspection", "invented for this test"], f"{what}: the hidden sheet by name")
        code, got, _ = result(["--sheet", "Plan"], path)
        check(code == 1 and "holds no cells with values" in (got.get("error") or ""), f"{what}: an empty sheet is refused: {got.get('error')}")
        code, got, _ = result(["--sheet", "Summary"], path)
        check(code == 1 and 'no sheet "Summary"' in (got.get("error") or "") and '2 "Counts"' in got.get("error", ""),
              f"{what}: a sheet not there is refused, listing the sheets: {got.get('error')}")

    check_workbook(source, False)
    if soffice:
        os.mkdir(os.path.join(work, "lo"))
        cmd = [soffice, "-env:UserInstallation=file://" + os.path.join(work, "profile"), "--headless", "--convert-to", "ods", "--outdir", work, source]
        subprocess.run(cmd, capture_output=True, timeout=300, check=True, env=env)
        cmd = [soffice, "-env:UserInstallation=file://" + os.path.join(work, "profile"), "--headless", "--convert-to", "xlsx",
               "--outdir", os.path.join(work, "lo"), source]
        subprocess.run(cmd, capture_output=True, timeout=300, check=True, env=env)
        check_workbook(os.path.join(work, "lo", "openpyxl.xlsx"), True)
        # LibreOffice 7.4 (Debian 12) opens openpyxl's boolean cells (t="b") as the formulas =TRUE() and
        # =FALSE() with number results and no boolean format: its .ods saves them as the floats 1 and 0.
        check_workbook(os.path.join(work, "openpyxl.ods"), True, ("1", "0"))

# 3. Refusals and usage errors.
r = run(["--sheet", "1", "-"], "A\t10\nB\t12\n")
check(r.returncode == 2 and "--sheet and --range choose cells of a workbook" in r.stderr, f"--sheet with text: usage error ({r.stderr})")
r = run(["--range", "A1-B2", "-"], "A\t10\n")
check(r.returncode == 2 and "is not a range of cells" in r.stderr, f"--range with a bad value: usage error ({r.stderr})")
r = run(["--sheet", "", "-"], "A\t10\n")
check(r.returncode == 2, "--sheet with an empty value: usage error")
ole = b"\xD0\xCF\x11\xE0\xA1\xB1\x1A\xE1" + bytes(504) + "EncryptedPackage".encode("utf-16-le") + bytes(100)
r = run(["-"], ole)
check(r.returncode == 1 and b"encrypted (password-protected)" in r.stderr, f"an encrypted workbook is refused by name ({r.stderr})")

shutil.rmtree(work, ignore_errors=True)
finish("workbook tests passed")
