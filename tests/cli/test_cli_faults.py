#!/usr/bin/python3
"""Command-line tests of faults in what is read and written (issue 17).
- Every output kind to /dev/full and to a closed standard output: exit 3, one line on stderr
  naming what was lost. A directory and a missing file: the same status, "cannot read FILE".
- UTF-16 LE and BE, with and without a byte-order mark, give the same result document as UTF-8
  (the encodings are produced by Python's own codecs, an outside reference).
- Binary files are refused with status 1 naming the kind: a PNG made with zlib by the PNG
  layout (RFC 2083), a PDF, a zip and workbooks laid out as their formats specify (zipfile).
- A document with a duplicate key is refused naming the key; A<TAB>1e400 on line 1 names line 1.
- p below the double range: [1e12, 1] and a grid of totals up to 2^52 print a p whose exponent is
  floor(log10 p) and whose mantissa agrees with mpmath (50 digits): the chi-square upper tail
  with one df is erfc(sqrt(x/2)) (Abramowitz & Stegun 26.4.4 with 7.1.2), X² computed in mpmath.
Usage: test_cli_faults.py PATH_TO_TALLYPROOF"""
import io
import json
import os
import re
import struct
import subprocess
import tempfile
import zipfile
import zlib

from cli_common import TOOL, check, finish
import cli_common


def run(args, stdin=b"", **kw):  # bytes in and out: these tests are about encodings
    return cli_common.run(args, stdin, **kw)


folder = tempfile.mkdtemp()
paste = os.path.join(folder, "counts.txt")
with open(paste, "w", encoding="utf-8") as f:
    f.write("Grade A\t48\nGrade B\t35\nGrade C\t17\n")

# 1. Every output kind to /dev/full and to a closed standard output.
kinds = [([], "the report"), (["--json"], "the result document (--json)"),
         (["--table", "csv"], "the table (--table csv)"), (["--writeup", "markdown"], "the write-up (--writeup markdown)")]
for args, name in kinds:
    ok = run(args + [paste])
    check(ok.returncode == 0 and ok.stdout, f"{name}: written normally")
    if os.path.exists("/dev/full"):
        with open("/dev/full", "wb") as full:
            r = subprocess.run([TOOL] + args + [paste], stdout=full, stderr=subprocess.PIPE, timeout=60)
        err = r.stderr.decode()
        check(r.returncode == 3, f"{name} to /dev/full exits 3 (got {r.returncode})")
        check(f"could not write {name} to standard output: No space left on device" in err, f"{name} to /dev/full: {err!r}")
    r = subprocess.run([TOOL] + args + [paste], stderr=subprocess.PIPE, timeout=60, preexec_fn=lambda: os.close(1))
    err = r.stderr.decode()
    check(r.returncode == 3, f"{name} to a closed stdout exits 3 (got {r.returncode})")
    check(f"could not write {name} to standard output" in err and len([l for l in err.splitlines() if "could not" in l]) == 1,
          f"{name} to a closed stdout: one line on stderr ({err!r})")
r = subprocess.run([TOOL, "--help"], stderr=subprocess.PIPE, timeout=60, preexec_fn=lambda: os.close(1))
check(r.returncode == 3 and b"could not write the help text" in r.stderr, "--help to a closed stdout")
check(b"3 output that could not be written" in run(["--help"]).stdout, "--help documents exit status 3")

# A directory, a missing file and a directory on standard input: "cannot read", one status.
missing = os.path.join(folder, "no-such-file.txt")
r_dir, r_missing = run([folder]), run([missing])
check(r_dir.returncode == r_missing.returncode == 2, f"directory {r_dir.returncode} and missing file {r_missing.returncode} share status 2")
check(f"cannot read {folder}: Is a directory".encode() in r_dir.stderr, f"directory message {r_dir.stderr!r}")
check(f"cannot read {missing}: No such file or directory".encode() in r_missing.stderr, f"missing file message {r_missing.stderr!r}")
r = subprocess.run([TOOL], stdin=os.open(folder, os.O_RDONLY), capture_output=True, timeout=60)
check(r.returncode == 2 and b"cannot read standard input: Is a directory" in r.stderr, f"directory on stdin {r.stderr!r}")

# 2. UTF-16 in both byte orders, with and without a mark, reads as the UTF-8 text does.
text = "Größe S\t48\nGröße M\t35\nχ² ☃ 🍎\t17\n"  # Latin, Greek, a BMP symbol and a surrogate pair
reference = run(["--json"], text.encode("utf-8"))
check(reference.returncode == 0, "UTF-8 reference reads")
ref_doc = json.loads(reference.stdout)
check(ref_doc["categories"] == ["Größe S", "Größe M", "χ² ☃ 🍎"], f"UTF-8 labels {ref_doc['categories']}")
for name, data in [("UTF-8 with a mark", b"\xef\xbb\xbf" + text.encode("utf-8")),
                   ("UTF-16 LE with a mark", b"\xff\xfe" + text.encode("utf-16-le")),
                   ("UTF-16 BE with a mark", b"\xfe\xff" + text.encode("utf-16-be")),
                   ("UTF-16 LE without a mark", text.encode("utf-16-le")),
                   ("UTF-16 BE without a mark", text.encode("utf-16-be")),
                   ("CRLF UTF-16 LE", "\r\n".join(text.split("\n")).encode("utf-16"))]:
    r = run(["--json"], data)
    check(r.returncode == 0 and json.loads(r.stdout or b"{}") == ref_doc, f"{name} gives the UTF-8 result document ({r.stderr[:200]!r})")
r = run([], text.encode("utf-16-le"))
check(b"note: The text was read as UTF-16 little-endian (it has no byte-order mark)." in r.stderr, "UTF-16 note")
doc = '{"categories":["Größe S","Größe M"],"observed":[30,20]}'
r8, r16 = run(["--json"], doc.encode()), run(["--json"], doc.encode("utf-16"))
check(r16.returncode == 0 and r8.stdout == r16.stdout, "a UTF-16 document reads as the UTF-8 one")
r = run(["--json"], "café\t3\nthé\t5\n".encode("cp1252"))
check(r.returncode == 0 and json.loads(r.stdout)["categories"] == ["café", "thé"], "Windows-1252 text read with a notice")
check("read as Windows-1252" in run([], "café\t3\nthé\t5\n".encode("cp1252")).stderr.decode(), "Windows-1252 notice")


# 3. Binary files, refused with status 1 naming the kind.
def png():
    def chunk(kind, body):
        return struct.pack(">I", len(body)) + kind + body + struct.pack(">I", zlib.crc32(kind + body))
    raw = b"".join(b"\0" + bytes([x * 16, 0, 255 - x * 16]) * 16 for x in range(16))
    return (b"\x89PNG\r\n\x1a\n" + chunk(b"IHDR", struct.pack(">IIBBBBB", 16, 16, 8, 2, 0, 0, 0)) +
            chunk(b"IDAT", zlib.compress(raw)) + chunk(b"IEND", b""))


def zipped(members, stored_first=None):
    b = io.BytesIO()
    with zipfile.ZipFile(b, "w", zipfile.ZIP_DEFLATED) as z:
        if stored_first:
            z.writestr(zipfile.ZipInfo(stored_first[0]), stored_first[1], compress_type=zipfile.ZIP_STORED)
        for name, body in members:
            z.writestr(name, body)
    return b.getvalue()


xlsx = zipped([("[Content_Types].xml", "<Types/>"), ("_rels/.rels", "<Relationships/>"),
               ("xl/workbook.xml", "<workbook/>"), ("xl/worksheets/sheet1.xml", "<worksheet/>")])
ods = zipped([("content.xml", "<office:document-content/>")],
             stored_first=("mimetype", "application/vnd.oasis.opendocument.spreadsheet"))
ole = b"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1" + b"\0" * 504 + "Workbook".encode("utf-16-le") + b"\0" * 200
pdf = b"%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n"
cases = [("PNG", png(), "a PNG image"), ("PDF", pdf, "a PDF document"),
         ("zip", zipped([("counts.txt", "A\t3\nB\t5\n")]), "a zip archive"),
         # Workbooks are read (docs/workbooks.md): these hollow ones are refused for what they lack.
         ("xlsx", xlsx, "The workbook has no sheets."), ("ods", ods, "The workbook's part content.xml is not well-formed XML"),
         ("xls", ole, "This is an older Excel workbook (.xls), which is not read."), ("JPEG", b"\xff\xd8\xff\xe0\0\x10JFIF\0", "a JPEG image"),
         ("GIF", b"GIF89a\x01\0\x01\0\0\0\0;", "a GIF image"), ("gzip", b"\x1f\x8b\x08\0", "a gzip-compressed file"),
         ("NUL bytes", b"A\t3\nB\0\t5\n", "it holds a NUL byte (byte 6)")]
for name, data, kind in cases:
    r = run([], data)
    err = r.stderr.decode()
    check(r.returncode == 1, f"{name} refused with status 1 (got {r.returncode})")
    check(f"This is not text: it looks like {kind}." in err or kind in err, f"{name} message names {kind!r}: {err!r}")
    check(not r.stdout, f"{name}: nothing analysed")
check("Save it as .xlsx or .ods, or copy the cells" in run([], ole).stderr.decode(),
      "a legacy workbook gets 'save it as .xlsx or .ods, or copy the cells'")

# 4. A duplicate key, and a number out of range on the first line.
r = run([], b'{"observed":[3,5,2],"alpha":0.05,"alpha":0.9}')
check(r.returncode == 1 and b'the key "alpha" appears twice (line 1, column 34; first at line 1, column 21)' in r.stderr,
      f"duplicate key refused naming it {r.stderr!r}")
r = run([], b"A\t1e400\nB\t5\n")
check(r.returncode == 1 and b'Line 1, column 2: "1e400" is too large' in r.stderr, f"1e400 on line 1 {r.stderr!r}")

# 5. p below the double range, against mpmath.
try:
    import mpmath as mp
except ImportError:
    mp = None
    print("skip: mpmath not installed, p-values below the double range not checked")

SUPER = str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")


def printed_p(report):
    m = re.search(r"p = ([0-9.]+) × 10([⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+) \(asymptotic\)", report)
    return (m.group(1), int(m.group(2).translate(SUPER))) if m else None


if mp is not None:
    mp.mp.dps = 60
    grid = [(10 ** 12, 1)]
    for k in [20, 30, 40, 45, 50, 52]:
        n = 2 ** k
        for f in ["0.6", "0.9", "0.999999"]:
            a = int(mp.floor(n * mp.mpf(f)))
            grid.append((a, n - a))
    for a, b in grid:
        r = run([], f"A\t{a}\nB\t{b}\n".encode())
        got = printed_p(r.stdout.decode())
        n = mp.mpf(a + b)
        x = ((a - n / 2) ** 2 + (b - n / 2) ** 2) / (n / 2)
        log10p = mp.log10(mp.erfc(mp.sqrt(x / 2)))
        e = int(mp.floor(log10p))
        if got is None:
            check(False, f"[{a}, {b}]: no a × 10^b p in {r.stdout[:300]!r}")
            continue
        mantissa, exponent = got
        digits = len(mantissa.replace(".", ""))
        if mp.nint(mp.power(10, log10p - e) * 10 ** (digits - 1)) >= 10 ** digits:
            e += 1  # the mantissa rounds up to 10: one more in the exponent
        check(exponent == e, f"[{a}, {b}]: printed exponent {exponent}, floor(log10 p) = {e} (mpmath)")
        # one unit in the last printed digit: log10 p itself carries only about 16 digits
        check(abs(mp.mpf(mantissa) - mp.power(10, log10p - exponent)) <= mp.mpf(10) ** (1 - digits),
              f"[{a}, {b}]: mantissa {mantissa}, mpmath {mp.nstr(mp.power(10, log10p - exponent), 6)}")
        j = json.loads(run(["--json"], f"A\t{a}\nB\t{b}\n".encode()).stdout)
        check(abs(j["log10_p_value"] - float(log10p)) <= 1e-13 * abs(float(log10p)) + 1e-12,
              f"[{a}, {b}]: log10 p {j['log10_p_value']} vs mpmath {mp.nstr(log10p, 17)}")
    print(f"checked {len(grid)} p-values below the double range against mpmath")

finish("all command-line fault tests passed", "{n} failures")
