#!/usr/bin/python3
"""Round trips through LibreOffice Calc (Debian libreoffice-calc-nogui), skipped with a message
when it is absent:
1. the tool's CSV and TSV tables (--table) opened in Calc: numbers arrive as numbers, labels that
   look like formulas stay text and nothing is evaluated (OWASP CSV-injection guidance);
2. a small spreadsheet written here, exported by Calc as CSV in a comma locale (en-US) and as
   semicolon-separated CSV in a decimal-comma locale (de-DE): the tool reads the same counts.
Usage: test_libreoffice.py PATH_TO_TALLYPROOF"""
import json
import os
import shutil
import subprocess
import sys
import tempfile
import xml.etree.ElementTree as ET

tool = sys.argv[1]
soffice = shutil.which("soffice") or shutil.which("libreoffice")
if not soffice:
    print("skip: LibreOffice is not installed (Debian package libreoffice-calc-nogui); spreadsheet round trips not run")
    sys.exit(0)

NS = {"table": "urn:oasis:names:tc:opendocument:xmlns:table:1.0", "office": "urn:oasis:names:tc:opendocument:xmlns:office:1.0",
      "text": "urn:oasis:names:tc:opendocument:xmlns:text:1.0"}
failures = []
work = tempfile.mkdtemp(prefix="tp-lo-")
profile = "file://" + os.path.join(work, "profile")  # a private profile: no user settings leak in


def convert(src, target, infilter=None):
    cmd = [soffice, f"-env:UserInstallation={profile}", "--headless"]
    if infilter:
        cmd.append(f"--infilter={infilter}")
    cmd += ["--convert-to", target, "--outdir", work, src]
    subprocess.run(cmd, capture_output=True, timeout=120, check=True)


def cells(fods):
    rows = []
    for row in ET.parse(fods).getroot().iter(f"{{{NS['table']}}}table-row"):
        out = []
        for c in row.iter(f"{{{NS['table']}}}table-cell"):
            if c.get(f"{{{NS['table']}}}formula"):
                out.append(("formula", c.get(f"{{{NS['table']}}}formula")))
                continue
            kind = c.get(f"{{{NS['office']}}}value-type")
            text = "".join(p.text or "" for p in c.iter(f"{{{NS['text']}}}p"))
            out.append((kind, c.get(f"{{{NS['office']}}}value") if kind == "float" else text))
        rows.append(out)
    return rows


# 1. Our tables into Calc.
paste = "=HYPERLINK(\"http://x\")\t30\n+cmd|calc\t14\n@SUM(A1)\t34\n-1.5\t45\n"
for fmt, infilter, comma in (("csv", "CSV:44,34,76,1,,1033", False), ("tsv", "CSV:9,34,76,1,,1033", False),
                             ("csv", "CSV:59,34,76,1,,1031", True)):
    args = [tool, "--table", fmt] + (["--output-decimal-comma"] if comma else []) + ["-"]
    table = subprocess.run(args, input=paste, capture_output=True, text=True, timeout=30).stdout
    src = os.path.join(work, f"ours-{fmt}{'-comma' if comma else ''}.csv")
    open(src, "w", encoding="utf-8").write(table)
    convert(src, "fods", infilter)
    rows = cells(src[:-4] + ".fods")
    what = f"{fmt}{' decimal comma' if comma else ''}"
    if any(k == "formula" for r in rows for k, _ in r):
        failures.append(f"{what}: Calc evaluated a formula")
    data = [r for r in rows[1:] if r and r[0][1]]
    if len(data) != 4:
        failures.append(f"{what}: {len(data)} data rows")
        continue
    for r in data:
        if r[0][0] != "string":
            failures.append(f"{what}: label {r[0]} is not text")
        if r[1][0] != "float" or r[2][0] != "float":
            failures.append(f"{what}: observed/expected {r[1]}, {r[2]} are not numbers")
    if [float(r[1][1]) for r in data] != [30.0, 14.0, 34.0, 45.0]:
        failures.append(f"{what}: observed counts {[r[1][1] for r in data]}")
    if abs(float(data[0][2][1]) - 30.75) > 1e-9:
        failures.append(f"{what}: expected count {data[0][2][1]}")

# 2. A spreadsheet written here, exported by Calc in two locales, read by the tool.
counts = [("Grade A", 1234), ("Grade B", 987), ("Grade C", 2045)]
rows_xml = "".join(
    f'<table:table-row><table:table-cell office:value-type="string"><text:p>{l}</text:p></table:table-cell>'
    f'<table:table-cell office:value-type="float" office:value="{v}"><text:p>{v}</text:p></table:table-cell>'
    f'<table:table-cell office:value-type="float" office:value="{s}"><text:p>{s}</text:p></table:table-cell></table:table-row>'
    for (l, v), s in zip(counts, (0.25, 0.25, 0.5)))
fods = ('<?xml version="1.0" encoding="UTF-8"?><office:document xmlns:office="%s" xmlns:table="%s" xmlns:text="%s" '
        'office:version="1.2" office:mimetype="application/vnd.oasis.opendocument.spreadsheet"><office:body><office:spreadsheet>'
        '<table:table table:name="Counts">%s</table:table></office:spreadsheet></office:body></office:document>'
        % (NS["office"], NS["table"], NS["text"], rows_xml))
sheet = os.path.join(work, "sheet.fods")
open(sheet, "w", encoding="utf-8").write(fods)
for name, options in (("comma", "44,34,76,1,,1033"), ("semicolon", "59,34,76,1,,1031")):
    out_dir = os.path.join(work, name)
    os.makedirs(out_dir, exist_ok=True)
    subprocess.run([soffice, f"-env:UserInstallation={profile}", "--headless", "--convert-to",
                    f"csv:Text - txt - csv (StarCalc):{options}", "--outdir", out_dir, sheet],
                   capture_output=True, timeout=120, check=True)
    csv = os.path.join(out_dir, "sheet.csv")
    r = subprocess.run([tool, "--json", csv], capture_output=True, text=True, timeout=30)
    doc = json.loads(r.stdout)
    if "error" in doc:
        failures.append(f"Calc {name} CSV: refused: {doc['error']} (file: {open(csv).read()!r})")
        continue
    if doc["observed"] != [v for _, v in counts] or doc["categories"] != [l for l, _ in counts]:
        failures.append(f"Calc {name} CSV: read {doc['categories']} {doc['observed']}")
    if abs(doc["expected_counts"][2] - 0.5 * sum(v for _, v in counts)) > 1e-9:
        failures.append(f"Calc {name} CSV: the share column was not read as the stated mix: {doc['expected_counts']}")

for f in failures:
    print("FAIL:", f)
print(f"LibreOffice round trips: {len(failures)} failures")
shutil.rmtree(work, ignore_errors=True)
sys.exit(1 if failures else 0)
