#!/usr/bin/python3
"""Times one job, whole process, in tallyproof, R 4.2 and Debian's Python 3 with NumPy/SciPy:
read one million raw amounts (~7 MB, one per line), take first significant digits, tabulate
them and run a chi-square test against Benford's law. Prints seconds (best of --runs, wall and
CPU) and the ratios; also checks the three agree on the digit counts. A program that prints figures.
Usage: parse_reference.py PATH_TO_TALLYPROOF [--values N] [--runs R]"""
import argparse
import json
import os
import random
import resource
import subprocess
import sys
import tempfile
import time

ap = argparse.ArgumentParser()
ap.add_argument("tool")
ap.add_argument("--values", type=int, default=1000000)
ap.add_argument("--runs", type=int, default=3)
args = ap.parse_args()

# Invoice-like amounts: log-uniform over 1..100000 (first digits follow Benford), two decimals.
rng = random.Random(20240601)
folder = tempfile.mkdtemp(prefix="tallyproof_bench_")
path = os.path.join(folder, "amounts.txt")
with open(path, "w") as f:
    f.write("".join("%.2f\n" % (10 ** (5 * rng.random())) for _ in range(args.values)))
size_mb = os.path.getsize(path) / 1e6

R_CODE = r'''
x <- scan(commandArgs(TRUE)[1], quiet = TRUE)
x <- abs(x[x != 0])
d <- as.integer(substr(sprintf("%.14e", x), 1, 1))
o <- tabulate(d, 9)
r <- chisq.test(o, p = log10(1 + 1 / (1:9)))
cat(o, "\n")
cat(sprintf("%.17g", r$statistic), "\n")
'''
PY_CODE = r'''
import sys
import numpy as np
from scipy.stats import chisquare
x = np.loadtxt(sys.argv[1])
x = np.abs(x[x != 0])
d = (x / 10.0 ** np.floor(np.log10(x))).astype(int)
d = np.clip(d, 1, 9)
o = np.bincount(d, minlength=10)[1:]
p = np.log10(1 + 1 / np.arange(1, 10))
r = chisquare(o, f_exp=p * o.sum())
print(*o)
print(repr(float(r.statistic)))
'''


def best(cmd):
    """Best wall time and best CPU time (user + system, the child's own) of --runs runs."""
    times, cpus, out = [], [], None
    for _ in range(args.runs):
        r0 = resource.getrusage(resource.RUSAGE_CHILDREN)
        t0 = time.perf_counter()
        res = subprocess.run(cmd, capture_output=True, text=True)
        times.append(time.perf_counter() - t0)
        r1 = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpus.append(r1.ru_utime - r0.ru_utime + r1.ru_stime - r0.ru_stime)
        if res.returncode != 0:
            sys.exit(f"{cmd[0]} failed: {res.stderr}")
        out = res.stdout
    return min(times), min(cpus), out


ours_t, ours_cpu, ours_out = best([args.tool, "--json", "--digits", "first", path])
r_t, r_cpu, r_out = best(["Rscript", "-e", R_CODE, path])
py_t, py_cpu, py_out = best(["/usr/bin/python3", "-c", PY_CODE, path])

ours_counts = [int(v) for v in json.loads(ours_out)["observed"]]
ours_stat = json.loads(ours_out)["statistic"]
r_counts = [int(v) for v in r_out.split("\n")[0].split()]
py_counts = [int(v) for v in py_out.split("\n")[0].split()]
print(f"{args.values} amounts, {size_mb:.1f} MB, best of {args.runs} runs, whole process")
print(f"  tallyproof       {ours_t:8.3f} s   (CPU {ours_cpu:6.3f} s)   statistic {ours_stat!r}")
print(f"  R 4.2 (Rscript)  {r_t:8.3f} s   (CPU {r_cpu:6.3f} s)   statistic {r_out.split()[-1]}")
print(f"  Python/NumPy     {py_t:8.3f} s   (CPU {py_cpu:6.3f} s)   statistic {py_out.split()[-1]}")
faster = min(r_t, py_t)
print(f"  ratio R / ours {r_t / ours_t:.1f}x, Python / ours {py_t / ours_t:.1f}x, faster reference / ours {faster / ours_t:.1f}x (target 5x)")
faster_cpu = min(r_cpu, py_cpu)
if ours_cpu > 0:  # CPU time is steadier than wall time on a shared machine
    print(f"  CPU-time ratio R / ours {r_cpu / ours_cpu:.1f}x, Python / ours {py_cpu / ours_cpu:.1f}x, "
          f"faster reference / ours {faster_cpu / ours_cpu:.1f}x")
print(f"  digit counts agree: R {ours_counts == r_counts}, Python {ours_counts == py_counts}")
if ours_counts != r_counts or ours_counts != py_counts:
    print("  ours  ", ours_counts, "\n  R     ", r_counts, "\n  Python", py_counts)
os.unlink(path)
os.rmdir(folder)
