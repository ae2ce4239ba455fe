#!/usr/bin/python3
"""The NumPy reference beside bench_stream: the same amounts (bench_stream's LCG is not
reproduced; numpy's own generator, log-uniform over 1..1e5, two decimals, the same shape of
text) written to a temporary file, then a plain NumPy byte scan of the first digit: the file
read whole (np.fromfile), the byte after each line end taken, bincount over '1'..'9' (amounts
>= 1 here, so the first byte of a line is its first significant digit). CPU time is
time.process_time() of the scan; peak RSS is resource's ru_maxrss (KiB on Linux).
Usage: numpy_stream.py [N ...]   (default 1000000 10000000)"""
import os
import resource
import subprocess
import sys
import tempfile
import time

import numpy as np


def scan(path):
    t0 = time.process_time()
    b = np.fromfile(path, dtype=np.uint8)
    starts = np.concatenate(([0], np.flatnonzero(b[:-1] == 10) + 1))
    counts = np.bincount(b[starts] - 48, minlength=10)[1:10]
    cpu = time.process_time() - t0
    mb = b.size / 1e6
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    print("%12d %10.1f %10.3f %10.0f %10.1f %12d" % (starts.size, mb, cpu, mb / cpu, peak, counts[0]), flush=True)


if len(sys.argv) == 3 and sys.argv[1] == "--scan":  # the scan alone, in its own process (its own peak RSS)
    scan(sys.argv[2])
    sys.exit(0)
sizes = [int(float(a)) for a in sys.argv[1:]] or [1000000, 10000000]
print("%12s %10s %10s %10s %10s %12s" % ("amounts", "MB", "cpu_s", "MB/s", "peak_MB", "first_digit_1"), flush=True)
rng = np.random.default_rng(12345)
for n in sizes:
    fd, path = tempfile.mkstemp(prefix="numpy_stream_")
    with os.fdopen(fd, "wb") as f:
        for start in range(0, n, 1000000):
            v = 10 ** (5 * rng.random(min(1000000, n - start)))
            f.write(("\n".join("%.2f" % x for x in v) + "\n").encode())
    subprocess.run([sys.executable, os.path.abspath(__file__), "--scan", path], check=True)
    os.remove(path)
