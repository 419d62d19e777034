#!/usr/bin/python3
"""Straightforward normal-reference parallel analysis with numpy + OpenBLAS, for comparison with
ItemReduce's Wishart path. Per replicate: simulate n x p standard normals, correlate, eigenvalues.

Run:  /usr/bin/python3 benchmarks/reference/numpy_bruteforce_parallel_analysis.py [replicates]
Debian's python3-numpy is linked against whatever libblas.so.3 / liblapack.so.3 the system alternatives
select (netlib reference BLAS unless OpenBLAS is installed). To time with OpenBLAS without changing the
system default:  apt-get install libopenblas0-pthread, then run with
  LD_LIBRARY_PATH=/usr/lib/x86_64-linux-gnu/openblas-pthread /usr/bin/python3 ...
The script prints which BLAS it loaded (threadpoolctl).
Times `replicates` (default 50) replicates of n = 20,000, p = 100 and scales linearly to 1,000.
Also times np.corrcoef alone (GFLOP/s with the same n*p^2 convention as the C# benchmark).
"""
import os
import platform
import sys
import time

import numpy as np

n, p = 20_000, 100
reps = int(sys.argv[1]) if len(sys.argv) > 1 else 50
rng = np.random.default_rng(1)

# Warm-up (thread pool start, page faults).
x = rng.standard_normal((n, p))
np.linalg.eigvalsh(np.corrcoef(x, rowvar=False))

eig = np.empty((reps, p))
t0 = time.perf_counter()
for r in range(reps):
    x = rng.standard_normal((n, p))
    c = np.corrcoef(x, rowvar=False)
    eig[r] = np.linalg.eigvalsh(c)[::-1]
t = time.perf_counter() - t0

t1 = time.perf_counter()
k = 20
for _ in range(k):
    np.corrcoef(x, rowvar=False)
tc = (time.perf_counter() - t1) / k

t2 = time.perf_counter()
for _ in range(reps):
    rng.standard_normal((n, p))
tg = (time.perf_counter() - t2) / reps

print(f"python {platform.python_version()}, numpy {np.__version__}, cpus {os.cpu_count()}")
from threadpoolctl import threadpool_info
blas = [f"{i.get('internal_api')} {i.get('version')} threads={i.get('num_threads')}" for i in threadpool_info()]
print("BLAS:", ", ".join(blas) if blas else "netlib reference BLAS (not detected by threadpoolctl)")
print(f"{reps} replicates: {t:.3f} s  ({t / reps * 1000:.1f} ms per replicate)")
print(f"scaled to 1000 replicates: {t / reps * 1000:.1f} s")
print(f"  of which standard_normal((n, p)): {tg * 1000:.1f} ms per replicate")
print(f"np.corrcoef alone: {tc * 1000:.2f} ms  ->  {n * p * p / tc / 1e9:.2f} GFLOP/s (n*p^2 convention)")
print(f"mean largest eigenvalue over replicates: {eig[:, 0].mean():.5f}")
