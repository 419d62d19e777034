# Reference z-scores for StandardizationTests, computed with Debian's python3-numpy
# (run with /usr/bin/python3). z = (x - mean) / std(ddof=1) per column over non-missing values.
import numpy as np
x = np.array([
    [1, 2, 5, 3.5],
    [2, 4, 4, np.nan],
    [3, 4, 3, 1.0],
    [4, 5, 2, 2.0],
    [5, 1, 1, 4.0],
    [2, 3, np.nan, 0.5],
])
mean = np.nanmean(x, axis=0)
sd = np.nanstd(x, axis=0, ddof=1)
z = (x - mean) / sd
with open("standardization-input.csv", "w") as f:
    for row in x:
        f.write(",".join("" if np.isnan(v) else repr(float(v)) for v in row) + "\n")
with open("standardization-expected.csv", "w") as f:
    f.write("# numpy %s: (x - nanmean) / nanstd(ddof=1)\n" % np.__version__)
    for row in z:
        f.write(",".join("" if np.isnan(v) else repr(float(v)) for v in row) + "\n")
