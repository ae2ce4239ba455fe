"""What the command-line tests share: the tool under test (the first argument), the list of
failed checks, `check`, `run` (text in and out for a str stdin, bytes for bytes), `close` and
`finish`, which prints the outcome and exits 1 when any check failed."""
import subprocess
import sys

if len(sys.argv) < 2:
    sys.exit("usage: " + sys.argv[0] + " PATH_TO_TALLYPROOF")
TOOL = sys.argv[1]
failures = []
checks = 0


def check(cond, what):
    global checks
    checks += 1
    if not cond:
        failures.append(what)
        print("FAIL:", what)


def run(args, stdin=None, timeout=60, **kw):
    text = not isinstance(stdin, (bytes, bytearray))
    return subprocess.run([TOOL] + args, input=stdin, capture_output=True, text=text, timeout=timeout, **kw)


def close(a, b, rel=1e-12, abs_tol=0.0):
    return a is not None and b is not None and abs(a - b) <= max(rel * abs(b), abs_tol)


def finish(passed, failed="{n} check(s) failed"):
    if failures:
        print(failed.format(n=len(failures)))
        sys.exit(1)
    print(passed)
    sys.exit(0)
