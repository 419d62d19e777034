#!/usr/bin/python3
"""Noncentral chi-square CDF grid from scipy.stats.ncx2.cdf (Debian python3-scipy 1.10.1).
Columns: x, df, noncentrality, cdf. Run with /usr/bin/python3 from this folder."""
from scipy import stats
with open("ncx2_cdf.csv", "w") as fh:
    fh.write("# x,df,noncentrality,cdf from scipy.stats.ncx2.cdf; made by make_ncx2_reference.py\n")
    for df in (1, 4, 13, 50, 164):
        for nc in (0.001, 0.5, 3.0, 20.0, 150.0):
            for mult in (0.3, 0.8, 1.0, 1.3, 2.0):
                x = mult * (df + nc)
                fh.write(f"{x!r},{df},{nc!r},{stats.ncx2.cdf(x, df, nc)!r}\n")
