#!/usr/bin/python3
"""Item descriptives of cfa_missing_data.csv with numpy/scipy (Debian python3-scipy 1.10.1):
n, mean, sd (ddof=1), scipy.stats.skew(bias=True), scipy.stats.kurtosis(fisher=True, bias=True), share at 1, share at 5,
share missing. Run with /usr/bin/python3 from this folder."""
import numpy as np
from scipy import stats
y = np.genfromtxt("cfa_missing_data.csv", delimiter=",", comments="#")
with open("descriptives_expected.csv", "w") as fh:
    fh.write("# n,mean,sd,skewness,excess_kurtosis,lowest_share,highest_share,missing_share per item; made by make_descriptives_reference.py\n")
    for j in range(y.shape[1]):
        v = y[:, j][~np.isnan(y[:, j])]
        row = [len(v), v.mean(), v.std(ddof=1), stats.skew(v, bias=True), stats.kurtosis(v, fisher=True, bias=True),
               np.mean(v == 1), np.mean(v == 5), 1 - len(v) / y.shape[0]]
        fh.write(",".join(repr(float(x)) for x in row) + "\n")
