#!/usr/bin/python3
"""Runs every hostile input of tests/hostile/catalogue.json through `tallyproof` with a 5 s
timeout: nothing may crash (exit code 0, 1, 2 or 3 only, never a signal), nothing may hang, and the
message must contain the catalogue's substring. Large inputs (a million categories, ten million
lines, deep nesting) are generated here, never committed.
Entries with `known_defect` are expected to fail (reported as XFAIL); one that passes is XPASS and
fails the run, so that the catalogue is updated when the defect is fixed.
Usage: test_hostile_catalogue.py PATH_TO_TALLYPROOF [--record] [ID ...]
  --record  prints what the tool does now (exit, stream, first message line) for each entry."""
import json
import os
import resource
import subprocess
import sys
import tempfile
import time

HERE = os.path.dirname(os.path.abspath(__file__))
CATALOGUE = os.path.join(HERE, "..", "hostile", "catalogue.json")
# 5 s of CPU time as the catalogue promises (user + system time of the tool, read from the kernel's
# accounting, so a machine busy with other work does not fail the run); sanitized builds run several
# times slower and set a longer limit. A run is also stopped after six times the limit of wall time.
TIMEOUT = float(os.environ.get("TALLYPROOF_HOSTILE_TIMEOUT", "5"))


def generate(g):
    kind = g["kind"]
    if kind == "million_categories":  # one million label<TAB>count lines, all labels distinct
        return "".join("c%d\t%d\n" % (i, 1 + i % 7) for i in range(1000000)).encode()
    if kind == "million_categories_document":
        labels = ",".join('"c%d"' % i for i in range(1000000))
        counts = ",".join(str(1 + i % 7) for i in range(1000000))
        return ('{"categories":[%s],"observed":[%s]}' % (labels, counts)).encode()
    if kind == "ten_million_lines":  # ten million counts, one per line
        return b"3\n5\n" * 5000000
    if kind == "deep_json":
        d = g["depth"]
        return ('{"observed":' + "[" * d + "]" * d + "}").encode()
    if kind == "long_label":
        return ("A" * g["bytes"] + "\t3\nB\t5\n").encode()
    raise ValueError("unknown generator " + kind)


def input_bytes(e):
    if "generate" in e:
        return generate(e["generate"])
    return e["input"].encode(e.get("encoding", "utf-8"))


def run(tool, e, folder):
    path = os.path.join(folder, e["id"] + (".json" if e["kind"] == "document" else ".txt"))
    with open(path, "wb") as f:
        f.write(input_bytes(e))
    start = time.monotonic()
    before = resource.getrusage(resource.RUSAGE_CHILDREN)
    try:
        p = subprocess.run([tool] + e.get("args", []) + [path], capture_output=True, timeout=6 * TIMEOUT)
    except subprocess.TimeoutExpired:
        return None, b"", b"", time.monotonic() - start
    finally:
        os.unlink(path)
    after = resource.getrusage(resource.RUSAGE_CHILDREN)
    cpu = (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)
    if cpu > TIMEOUT:
        return None, b"", b"", cpu
    return p.returncode, p.stdout, p.stderr, time.monotonic() - start


def verdict(e, rc, out, err):
    """The list of problems with one run (empty when it behaved as catalogued)."""
    if rc is None:
        return ["hung (more than %.0f s of CPU time, or no exit within %.0f s)" % (TIMEOUT, 6 * TIMEOUT)]
    problems = []
    if rc < 0:
        problems.append("killed by signal %d" % -rc)
    elif rc not in (0, 1, 2, 3):
        problems.append("exit code %d (only 0, 1, 2, 3 allowed)" % rc)
    elif rc != e["exit"]:
        problems.append("exit %d, catalogue says %d" % (rc, e["exit"]))
    text = (out if e["stream"] == "stdout" else err).decode("utf-8", "replace")
    if e["message"] not in text:
        problems.append("%s lacks %r; it begins %r" % (e["stream"], e["message"], text[:200]))
    if e.get("json_must_parse"):
        try:
            json.loads(out.decode("utf-8"))
        except (UnicodeDecodeError, ValueError) as x:
            problems.append("stdout is not valid JSON: %s" % x)
    return problems


def main():
    args = [a for a in sys.argv[1:] if a != "--record"]
    record = "--record" in sys.argv
    if not args:
        print(__doc__)
        return 2
    tool, only = args[0], set(args[1:])
    with open(CATALOGUE, encoding="utf-8") as f:
        catalogue = json.load(f)
    failures, xfail = [], []
    with tempfile.TemporaryDirectory() as folder:
        for e in catalogue:
            if only and e["id"] not in only:
                continue
            rc, out, err, seconds = run(tool, e, folder)
            if record:
                first = lambda b: b.decode("utf-8", "replace").strip().splitlines()[-1:] or [""]
                print(json.dumps({"id": e["id"], "exit": rc, "seconds": round(seconds, 2),
                                  "stderr": first(err)[0][:300], "stdout": first(out)[0][:120]}, ensure_ascii=False))
                continue
            problems = verdict(e, rc, out, err)
            if e.get("known_defect"):
                if problems:
                    xfail.append(e["id"])
                    print("XFAIL %s: %s (%s)" % (e["id"], "; ".join(problems), e["known_defect"]))
                else:
                    failures.append(e["id"])
                    print("XPASS %s: known defect no longer shows; update the catalogue" % e["id"])
            elif problems:
                failures.append(e["id"])
                print("FAIL %s: %s" % (e["id"], "; ".join(problems)))
            else:
                print("ok   %s (%.2f s)" % (e["id"], seconds))
    if record:
        return 0
    print("%d entries, %d failed, %d known defects" % (len(catalogue) if not only else len(only), len(failures), len(xfail)))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
