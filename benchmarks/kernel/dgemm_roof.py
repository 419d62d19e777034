"""Best-of-R time (R batches of at least a quarter second of CPU) of one dgemm C = AᵀB with A, B n × p (float64, C-contiguous, B a separate copy of A so that
numpy calls dgemm and not syrk), through Debian's numpy and its OpenBLAS. Prints `n p best_wall_seconds gflops best_cpu_seconds gflops_per_cpu_second`, flops
counted as 2·n·p² (the dgemm convention). Run with /usr/bin/python3; OPENBLAS_NUM_THREADS sets the threads.
Usage: dgemm_roof.py N1,N2 P1,P2 [repeats]"""
import sys
import time

import numpy as np

ns = [int(x) for x in sys.argv[1].split(",")]
ps = [int(x) for x in sys.argv[2].split(",")]
repeats = int(sys.argv[3]) if len(sys.argv) > 3 else 20
rng = np.random.default_rng(1)
for n in ns:
    for p in ps:
        a = rng.standard_normal((n, p))
        b = a.copy()
        c = a.T @ b
        best = best_cpu = float("inf")
        for _ in range(repeats):
            t, u, calls = time.perf_counter(), time.process_time(), 0
            while True:  # a batch of calls of at least a quarter second of CPU, as on the .NET side
                c = a.T @ b
                calls += 1
                used = time.process_time() - u
                if used >= 0.25:
                    break
            best = min(best, (time.perf_counter() - t) / calls)
            best_cpu = min(best_cpu, used / calls)
        flops = 2.0 * n * p * p
        print(f"{n} {p} {best:.6f} {flops / best / 1e9:.2f} {best_cpu:.6f} {flops / best_cpu / 1e9:.2f}")
