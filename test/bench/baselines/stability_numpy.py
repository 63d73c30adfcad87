"""Baseline for `npm run bench -- stability`: OADEV, OHDEV and MDEV of a phase record (float64 file) with numpy
array operations (MDEV through a cumulative sum, O(N) per tau). Usage: stability_numpy.py <file> <statistic> <m>...
Prints the elapsed CPU seconds (time.process_time), then one deviation per m (tau0 = 1 s)."""
import sys
import time

import numpy as np

x = np.fromfile(sys.argv[1], dtype="<f8")
stat = sys.argv[2]
ms = [int(v) for v in sys.argv[3:]]
t0 = time.process_time()
out = []
if stat == "mdev":
    S = np.concatenate(([0.0], np.cumsum(x)))
for m in ms:
    if stat == "oadev":
        d = x[2 * m:] - 2 * x[m:-m] + x[:-2 * m]
        out.append(np.sqrt(np.dot(d, d) / (2.0 * m * m * d.size)))
    elif stat == "ohdev":
        d = x[3 * m:] - 3 * x[2 * m:-m] + 3 * x[m:-2 * m] - x[:-3 * m]
        out.append(np.sqrt(np.dot(d, d) / (6.0 * m * m * d.size)))
    else:
        n = x.size - 3 * m + 1
        a, b, c, d = S[3 * m:3 * m + n], S[2 * m:2 * m + n], S[m:m + n], S[:n]
        inner = (a - b) - 2 * (b - c) + (c - d)
        out.append(np.sqrt(np.dot(inner, inner) / (2.0 * m ** 4 * n)))
t1 = time.process_time()
print(" ".join([f"{t1 - t0:.6f}"] + [repr(float(v)) for v in out]))
