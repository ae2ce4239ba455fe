#!/usr/bin/python3
"""Times screening many groups, whole process, in tallyproof and in Debian's Python 3 with
NumPy/SciPy/statsmodels: a long table (group, category, count) of 10,000 groups x 10 categories
(100,000 rows, ~1.3 MB) read, counted into a groups x categories matrix, each group tested
against equal shares (chi-square, df 9) and the p-values adjusted by Benjamini-Hochberg.
Reference pipeline: numpy.loadtxt, numpy.unique, numpy.add.at, scipy.stats.chisquare(axis=1),
statsmodels multipletests(method="fdr_bh"). Prints seconds (best of --runs, wall and CPU), the
ratio, peak memory (ru_maxrss of the child) at 10,000 and 40,000 groups, and checks that both
give the same q-values. A program that prints figures, not a test.
Usage: screen_reference.py PATH_TO_TALLYPROOF [--groups G] [--runs R]"""
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
ap.add_argument("--groups", type=int, default=10000)
ap.add_argument("--runs", type=int, default=5)
args = ap.parse_args()
K = 10

folder = tempfile.mkdtemp(prefix="tallyproof_screen_")


def write_table(groups):
    # Fixed test counts: Poisson-like counts around 30 per cell from a seeded generator.
    rng = random.Random(20261202)
    path = os.path.join(folder, "long_%d.tsv" % groups)
    with open(path, "w") as f:
        f.write("group\tcategory\tcount\n")
        f.write("".join("G%05d\tC%d\t%d\n" % (g, c, 20 + rng.randrange(21)) for g in range(groups) for c in range(K)))
    return path


PY_CODE = r'''
import sys
import numpy as np
from scipy.stats import chisquare
from statsmodels.stats.multitest import multipletests
t = np.loadtxt(sys.argv[1], dtype=str, delimiter="\t", skiprows=1)
groups, gi = np.unique(t[:, 0], return_inverse=True)
cats, ci = np.unique(t[:, 1], return_inverse=True)
m = np.zeros((len(groups), len(cats)))
np.add.at(m, (gi, ci), t[:, 2].astype(float))
p = chisquare(m, axis=1).pvalue
q = multipletests(p, method="fdr_bh")[1]
print(repr(float(q.min())), int((q <= 0.05).sum()))
'''


def best(cmd):
    """Best wall time and best CPU time (user + system, the child's own) of --runs runs."""
    times, cpus, out = [], [], None
    for _ in range(args.runs):
        r0 = resource.getrusage(resource.RUSAGE_CHILDREN)
        t0 = time.perf_counter()
        out = subprocess.run(cmd, capture_output=True, text=True, check=True).stdout
        times.append(time.perf_counter() - t0)
        r1 = resource.getrusage(resource.RUSAGE_CHILDREN)
        cpus.append(r1.ru_utime - r0.ru_utime + r1.ru_stime - r0.ru_stime)
    return min(times), min(cpus), out


def peak_kb(cmd):
    """Peak resident memory of one run, from /usr/bin/time -f %M (KB)."""
    r = subprocess.run(["/usr/bin/time", "-f", "%M"] + cmd, capture_output=True, text=True)
    return int(r.stderr.strip().split("\n")[-1])


path = write_table(args.groups)
size_mb = os.path.getsize(path) / 1e6
ours_cmd = [args.tool, "--by", "group", "--json", path]
ref_cmd = ["/usr/bin/python3", "-c", PY_CODE, path]
ours_t, ours_cpu, ours_out = best(ours_cmd)
ref_t, ref_cpu, ref_out = best(ref_cmd)
doc = json.loads(ours_out)
ours_q = min(g["q_value"] for g in doc["groups"])
ours_flagged = doc["screen"]["flagged"]
ref_q, ref_flagged = ref_out.split()
ref_q, ref_flagged = float(ref_q), int(ref_flagged)
print("%d groups x %d categories, long table of %d rows, %.2f MB, best of %d runs, whole process"
      % (args.groups, K, args.groups * K, size_mb, args.runs))
print("  tallyproof --by group --json     %.3f s   (CPU %.3f s)   smallest q %.17g, flagged %d" % (ours_t, ours_cpu, ours_q, ours_flagged))
print("  NumPy/SciPy/statsmodels          %.3f s   (CPU %.3f s)   smallest q %.17g, flagged %d" % (ref_t, ref_cpu, ref_q, ref_flagged))
print("  ratio reference / ours %.1fx wall, %.1fx CPU (target 5x); whole process target 1 s" % (ref_t / ours_t, ref_cpu / ours_cpu))
print("  machine load while measuring: %s" % open("/proc/loadavg").read().strip())
print("  q-values agree: %s" % (abs(ours_q - ref_q) <= 1e-9 * ref_q and ours_flagged == ref_flagged))
for groups in (args.groups, 4 * args.groups):
    p = path if groups == args.groups else write_table(groups)
    print("  peak memory, %6d groups (%.1f MB): tallyproof %6.1f MB, reference %6.1f MB"
          % (groups, os.path.getsize(p) / 1e6, peak_kb([args.tool, "--by", "group", "--json", p]) / 1024,
             peak_kb(["/usr/bin/python3", "-c", PY_CODE, p]) / 1024))
