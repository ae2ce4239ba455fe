#!/usr/bin/python3
"""Command-line tests of streamed digit tallies (issue #28): raw amounts larger than the 1 MiB
first piece are streamed. The same data read whole (--read-whole, a file) and streamed (standard
input) must give the same result document; the counts are checked against Python's own first
digit of each generated amount (collections.Counter over the written text); the peak memory of
a streamed run must not grow with the input (resource.getrusage of the child, Linux ru_maxrss
in KiB); a refusal in a later piece names its line.
Usage: test_cli_stream.py PATH_TO_TALLYPROOF"""
import collections
import json
import os
import random
import resource
import subprocess
import tempfile

from cli_common import TOOL, check, finish, run


def amounts(n, seed):
    rng = random.Random(seed)
    return ["%d.%02d" % (int(10 ** rng.uniform(0, 6)), rng.randrange(100)) for _ in range(n)]


def peak_kib(args, path):
    """Runs the tool on `path` through standard input; its own peak RSS (KiB) and the result."""
    code = ("import resource,subprocess,sys\n"
            "r=subprocess.run(sys.argv[1:],stdin=open(%r,'rb'),capture_output=True)\n"
            "print(resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss, r.returncode)\n" % path)
    out = subprocess.run(["/usr/bin/python3", "-c", code, TOOL] + args, capture_output=True, text=True, timeout=300)
    kib, rc = out.stdout.split()
    return int(kib), int(rc)


with tempfile.TemporaryDirectory() as tmp:
    # 300,000 amounts (about 2.6 MB): three pieces; a header row and a zero in a later piece.
    values = amounts(300000, 28)
    values[250000] = "0"
    text = "Amount\n" + "\n".join(values) + "\n"
    path = os.path.join(tmp, "amounts.txt")
    with open(path, "w") as f:
        f.write(text)
    whole = run(["--json", "--digits", "first", "--read-whole", path])
    streamed = run(["--json", "--digits", "first", "-"], stdin=text)
    check(whole.returncode == 0 and streamed.returncode == 0, "both runs succeed: %s %s" % (whole.stderr, streamed.stderr))
    check(json.loads(whole.stdout) == json.loads(streamed.stdout), "the streamed result document equals the whole reading's")
    # The reference: Python's first significant digit of each written amount (leading zeros skipped).
    ref = collections.Counter(v.lstrip("0.")[0] for v in values if v.strip("0.") != "")
    doc = json.loads(streamed.stdout)
    got = dict(zip(doc["input"]["categories"] if "input" in doc and "categories" in doc["input"] else doc.get("categories", []),
                   doc["input"]["observed"] if "input" in doc and "observed" in doc["input"] else doc.get("observed", [])))
    check({str(d): ref[str(d)] for d in range(1, 10)} == {k: int(v) for k, v in got.items()},
          "streamed counts equal Python's first digits: %s" % got)
    # The notice says the rest was streamed, and where the zero left out is (line 250002: header + 1).
    plain = run(["--digits", "first", "-"], stdin=text)
    check("was streamed" in plain.stderr, "the notice says the rest was streamed: " + plain.stderr[:300])
    check("(first at line 250002, column 1)" in plain.stderr, "the zero left out is placed at its line: " + plain.stderr[:600])
    # Other digit tests: the same document both ways.
    for test in ("second", "first-two", "last"):
        a = run(["--json", "--digits", test, "--read-whole", path])
        b = run(["--json", "--digits", test, path])
        check(a.returncode == b.returncode == 0 and json.loads(a.stdout) == json.loads(b.stdout), "--digits %s: streamed equals whole" % test)

    # Peak memory does not grow with the input: 8x the amounts, about the same peak.
    big = os.path.join(tmp, "big.txt")
    with open(big, "w") as f:
        for _ in range(8):
            f.write("\n".join(values) + "\n")
    small_kib, rc1 = peak_kib(["--digits", "first", "-"], path)
    big_kib, rc2 = peak_kib(["--digits", "first", "-"], big)
    check(rc1 == 0 and rc2 == 0, "the memory runs succeed")
    check(big_kib < small_kib + 4096, "peak memory %d KiB for 21 MB against %d KiB for 2.6 MB" % (big_kib, small_kib))
    whole_kib, _ = peak_kib(["--digits", "first", "--read-whole", "-"], big)
    check(whole_kib > big_kib + 10000, "the whole reading holds the input (%d KiB), the stream does not (%d KiB)" % (whole_kib, big_kib))

    # Not UTF-8 in a later piece: refused, exit non-zero, with the line reached.
    bad = text.encode() + b"12\n\xff\xfe\n"
    r = run(["--digits", "first", "-"], stdin=bad)
    check(r.returncode != 0 and b"after line" in r.stderr, "a later piece that is not text is refused: %r" % r.stderr[:300])

    # An input that ends in the middle of a line (a producer cut short): the result, a note and a
    # warning naming the line, and exit status 4; the counts are those of the whole reading.
    cut = text.rstrip("\n")
    lines = cut.count("\n") + 1
    r = run(["--digits", "first", "-"], stdin=cut)
    check(r.returncode == 4, "an input ending mid-line exits 4: %d %s" % (r.returncode, r.stderr[-300:]))
    check(("warning: the input ends in the middle of line %d;" % lines) in r.stderr, "the warning names the last line: " + r.stderr[-300:])
    check("Pearson" in r.stdout or "X²" in r.stdout or "p =" in r.stdout, "the result is still printed: " + r.stdout[:200])
    j = run(["--json", "--digits", "first", "-"], stdin=cut)
    doc = json.loads(j.stdout)
    check(j.returncode == 4 and ("the input ends in the middle of line %d;" % lines) in j.stderr,
          "with --json too: exit 4 and the warning on standard error: %d %s" % (j.returncode, j.stderr[-300:]))
    whole_cut = run(["--json", "--digits", "first", "--read-whole", "-"], stdin=cut)
    check(json.loads(whole_cut.stdout)["observed"] == doc["observed"], "the counts of the cut stream equal the whole reading's")

    # A stream stopped by a signal while it waits for more: no result, the line reached, 128 + N.
    import signal
    import time
    for sig, name in ((signal.SIGTERM, "SIGTERM"), (signal.SIGINT, "SIGINT")):
        p = subprocess.Popen([TOOL, "--digits", "first", "-"], stdin=subprocess.PIPE, stdout=subprocess.PIPE, stderr=subprocess.PIPE)
        p.stdin.write(text.encode())  # 2.6 MB: the first piece decides the shape, the rest streams
        p.stdin.flush()
        time.sleep(1.5)               # read to the end of what was written: waiting on the pipe
        p.send_signal(sig)
        out, err = p.communicate(timeout=30)
        p.stdin.close() if not p.stdin.closed else None
        check(p.returncode == 128 + int(sig), "%s: exit %d (expected %d): %r" % (name, p.returncode, 128 + int(sig), err[-300:]))
        check(out == b"", "%s: no result on standard output" % name)
        check(("stopped by %s while reading standard input, after line %d" % (name, text.count("\n"))).encode() in err,
              "%s: the line reached is named: %r" % (name, err[-300:]))

finish("streamed digit tallies: all checks passed")
