#!/usr/bin/python3
"""Reference robust distances for the FAST-MCD tests, from Debian's python3-sklearn (MinCovDet).

Data are simulated here with a fixed numpy seed: correlated normal rows (correlation 0.5 between all variables,
unit variances) with a planted block of outliers shifted by +3 on the first half of the variables and -3 on the
rest (a direction against the correlation structure, so classical distances are masked less than robust ones).

MinCovDet is used with its defaults (support_fraction=None, i.e. h = ceil((n + p + 1) / 2), raw covariance
corrected by median(dist) / chi2(p).isf(0.5), one-step reweighting at chi2(p).isf(0.025) with the plain
(divide-by-n_w) covariance) and random_state=0. dist_ are its reweighted squared distances.

Run:  /usr/bin/python3 mcd_reference.py   (writes mcd_small.csv, mcd_large.csv)
"""
import numpy as np
import sklearn
from sklearn.covariance import MinCovDet


def make(n, p, outliers, seed):
    rng = np.random.RandomState(seed)
    cov = np.full((p, p), 0.5) + 0.5 * np.eye(p)
    X = rng.multivariate_normal(np.zeros(p), cov, size=n)
    planted = np.zeros(n, dtype=int)
    rows = rng.choice(n, outliers, replace=False)
    shift = np.array([3.0 if j < p // 2 else -3.0 for j in range(p)])
    X[rows] = rng.multivariate_normal(np.zeros(p), 0.25 * np.eye(p), size=outliers) + shift
    planted[rows] = 1
    return X, planted


def write(name, X, planted):
    mcd = MinCovDet(random_state=0).fit(X)
    n, p = X.shape
    with open(name, "w") as f:
        f.write(f"# sklearn {sklearn.__version__} MinCovDet(random_state=0); see mcd_reference.py\n")
        f.write(",".join(f"x{j + 1}" for j in range(p)) + ",planted,sk_dist,sk_support\n")
        for i in range(n):
            f.write(",".join(repr(float(v)) for v in X[i]) + f",{planted[i]},{float(mcd.dist_[i])!r},{int(mcd.support_[i])}\n")
    with open(name.replace(".csv", "_location.csv"), "w") as f:
        f.write(f"# sklearn {sklearn.__version__}: MinCovDet location_ (reweighted) and raw_location_\n")
        f.write("location,raw_location\n")
        for j in range(p):
            f.write(f"{float(mcd.location_[j])!r},{float(mcd.raw_location_[j])!r}\n")


write("mcd_small.csv", *make(400, 6, 20, 11))
write("mcd_large.csv", *make(3000, 5, 90, 12))
