#!/usr/bin/python3
"""Reference squared Mahalanobis distances for the screening tests, from Debian's python3-numpy.

Data: Fisher's iris measurements (Fisher, R. A., 1936, Annals of Eugenics 7, 179-188; public domain), as shipped
with python3-sklearn (sklearn.datasets.load_iris, no download).

Complete data: D2_i = (x_i - mean)^T S^{-1} (x_i - mean) with the sample mean and the n-1 sample covariance,
solved with np.linalg.solve.
With missing values (a fixed deterministic pattern, cell (i, j) missing when (7 i + 3 j) % 11 == 0, and row 5 fully
missing): mean_j over answered values; covariance entry (j, k) from rows answering both items, centred at that
pair's own means, divided by (m_jk - 1); D2_i on the answered items with the matching sub-vector and sub-matrix.

Run:  /usr/bin/python3 mahalanobis_reference.py   (writes iris_mahalanobis.csv, iris_missing_mahalanobis.csv)
"""
import numpy as np
from sklearn.datasets import load_iris

X = load_iris().data.astype(float)
n, p = X.shape


def write(name, data, d2, answered):
    with open(name, "w") as f:
        f.write(f"# numpy {np.__version__}: see mahalanobis_reference.py\n")
        f.write("x1,x2,x3,x4,answered,d2\n")
        for i in range(n):
            cells = ["" if np.isnan(v) else repr(float(v)) for v in data[i]]
            f.write(",".join(cells) + f",{answered[i]},{'' if np.isnan(d2[i]) else repr(float(d2[i]))}\n")


# Complete data.
mu = X.mean(axis=0)
S = np.cov(X, rowvar=False, ddof=1)
C = X - mu
d2 = np.einsum("ij,ij->i", C, np.linalg.solve(S, C.T).T)
write("iris_mahalanobis.csv", X, d2, [p] * n)

# Missing data, pairwise-complete covariance.
Xm = X.copy()
for i in range(n):
    for j in range(p):
        if (7 * i + 3 * j) % 11 == 0:
            Xm[i, j] = np.nan
Xm[5, :] = np.nan
mu = np.nanmean(Xm, axis=0)
S = np.empty((p, p))
for j in range(p):
    for k in range(p):
        both = ~np.isnan(Xm[:, j]) & ~np.isnan(Xm[:, k])
        a, b = Xm[both, j], Xm[both, k]
        S[j, k] = np.sum((a - a.mean()) * (b - b.mean())) / (both.sum() - 1)
d2 = np.full(n, np.nan)
answered = []
for i in range(n):
    obs = ~np.isnan(Xm[i])
    answered.append(int(obs.sum()))
    if obs.sum() == 0:
        continue
    c = Xm[i, obs] - mu[obs]
    d2[i] = c @ np.linalg.solve(S[np.ix_(obs, obs)], c)
write("iris_missing_mahalanobis.csv", Xm, d2, answered)
