#!/usr/bin/python3
"""Whole-process yardstick for `itemreduce dimensions` on a survey CSV: a plain numpy parallel analysis done the
straightforward way. Reads DIR/responses.csv (first column = respondent id, then one column per item, complete
data as written by benchmarks/e2e/make_pa_survey.py), correlates, takes the eigenvalues of R and of the reduced
matrix (squared multiple correlations on the diagonal), then per replicate simulates n x p standard normals,
correlates and takes both sets of eigenvalues again; prints the 95th-percentile retained counts.

Run:  /usr/bin/python3 benchmarks/reference/numpy_bruteforce_survey_pa.py DIR [replicates, default 1000]
Debian's numpy uses the system libblas.so.3 / liblapack.so.3 (netlib reference BLAS unless OpenBLAS is installed).
"""
import sys

import numpy as np

folder = sys.argv[1]
reps = int(sys.argv[2]) if len(sys.argv) > 2 else 1000
x = np.loadtxt(f"{folder}/responses.csv", delimiter=",", skiprows=1,
               converters={0: lambda s: 0.0}, dtype=float)[:, 1:]
n, p = x.shape


def both(c):
    smc = 1 - 1 / np.diag(np.linalg.inv(c))
    reduced = c.copy()
    np.fill_diagonal(reduced, smc)
    return np.linalg.eigvalsh(c)[::-1], np.linalg.eigvalsh(reduced)[::-1]


observed, observed_reduced = both(np.corrcoef(x, rowvar=False))
rng = np.random.default_rng(1)
ref = np.empty((reps, p))
ref_reduced = np.empty((reps, p))
for r in range(reps):
    ref[r], ref_reduced[r] = both(np.corrcoef(rng.standard_normal((n, p)), rowvar=False))


def retained(obs, refs):
    above = obs > np.percentile(refs, 95, axis=0)
    return int(np.argmin(above)) if not above.all() else len(obs)


print(f"n={n} p={p} replicates={reps} parallel={retained(observed, ref)} "
      f"reduced={retained(observed_reduced, ref_reduced)}")
