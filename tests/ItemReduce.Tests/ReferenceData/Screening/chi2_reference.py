#!/usr/bin/python3
"""Reference chi-square values for the screening tests, from Debian's python3-scipy.

Run:  /usr/bin/python3 chi2_reference.py   (writes chi2_upper_quantiles.csv, chi2_upper_tail.csv, half_peak_region.csv)
"""
import math
import scipy
from scipy.stats import chi2

dfs = list(range(1, 301)) + [400, 500, 1000, 2000]
probs = [0.5, 0.1, 0.05, 0.025, 0.01, 0.001, 1e-4, 1e-6, 1e-10]
with open("chi2_upper_quantiles.csv", "w") as f:
    f.write(f"# scipy {scipy.__version__}: x = scipy.stats.chi2.isf(q, df), i.e. P(chi2_df > x) = q\n")
    f.write("df,q,x\n")
    for df in dfs:
        for q in probs:
            f.write(f"{df},{q!r},{chi2.isf(q, df)!r}\n")

# Upper-tail probabilities, including the far tail where 1 - cdf would underflow.
points = [(1, 0.5), (1, 10.83), (2, 13.8155), (5, 40.0), (10, 29.588), (10, 100.0), (10, 200.0),
          (20, 45.315), (30, 300.0), (50, 86.661), (100, 149.449), (100, 400.0), (250, 600.0), (3, 1e-6)]
with open("chi2_upper_tail.csv", "w") as f:
    f.write(f"# scipy {scipy.__version__}: q = scipy.stats.chi2.sf(x, df)\n")
    f.write("df,x,q\n")
    for df, x in points:
        f.write(f"{df},{x!r},{chi2.sf(x, df)!r}\n")

with open("half_peak_region.csv", "w") as f:
    f.write(f"# scipy {scipy.__version__}: share = scipy.stats.chi2.cdf(2*ln 2, k)\n")
    f.write("k,share\n")
    for k in range(1, 101):
        f.write(f"{k},{chi2.cdf(2 * math.log(2), k)!r}\n")
