#!/usr/bin/python3
"""Reference values for the bivariate normal CDF and two-step polychoric correlations.

Run with Debian's interpreter:  /usr/bin/python3 make_polychoric_fixtures.py   (python3-scipy, python3-numpy)

bivariate_normal_cdf.csv  h,k,rho,cdf with cdf = scipy.stats.multivariate_normal.cdf([h,k], cov=[[1,rho],[rho,1]])
                          (abseps = releps = 1e-12). Each value is cross-checked against Owen's (1956) formula
                          with Owen's T function (scipy.special.owens_t), an independent algorithm.
polychoric_tables.csv     name,rows,cols,counts (row-major, ';'-separated),rho
                          rho = two-step ML polychoric correlation (Olsson 1979): thresholds from the table's
                          marginals via scipy.stats.norm.ppf, then scipy.optimize.minimize_scalar(bounded,
                          xatol=1e-12) of -sum n_ij log pi_ij(rho), with pi_ij from the scipy CDF above.
"""
import numpy as np
from scipy.stats import multivariate_normal, norm
from scipy.special import owens_t
from scipy.optimize import minimize_scalar

BIG = 12.0  # stands in for +/- infinity in the scipy CDF (tail mass ~ 1.8e-33)


def bvn_scipy(h, k, rho):
    h = max(min(h, BIG), -BIG)
    k = max(min(k, BIG), -BIG)
    return float(multivariate_normal.cdf([h, k], mean=[0.0, 0.0], cov=[[1.0, rho], [rho, 1.0]],
                                         abseps=1e-12, releps=1e-12))


def bvn_owen(h, k, rho):
    """Owen (1956), Ann. Math. Statist. 27, 1075-1090, eq. (2.1)-(3.1): Phi2 via Owen's T."""
    if h == 0 and k == 0:
        return 0.25 + np.arcsin(rho) / (2 * np.pi)
    s = np.sqrt(1 - rho * rho)
    def t(a, b):
        if a == 0:
            return 0.25 if b > 0 else -0.25 if b < 0 else 0.0  # limit of T(a, b/(a s)) as a -> 0
        return owens_t(a, (b - rho * a) / (a * s))
    beta = 0.0 if (h * k > 0 or (h * k == 0 and h + k >= 0)) else 0.5
    return 0.5 * (norm.cdf(h) + norm.cdf(k)) - t(h, k) - t(k, h) - beta


points = []
for rho in (-0.99, -0.93, -0.8, -0.5, -0.2, 0.0, 0.1, 0.4, 0.74, 0.76, 0.9, 0.926, 0.97, 0.999):
    for h, k in ((0.0, 0.0), (-1.0, 0.5), (1.3, 1.7), (-2.2, -0.4), (0.3, -1.9), (2.5, -2.5), (-3.1, -2.8)):
        c = bvn_scipy(h, k, rho)
        o = bvn_owen(h, k, rho)
        assert abs(c - o) < 1e-10, (h, k, rho, c, o)
        points.append((h, k, rho, c))
with open("bivariate_normal_cdf.csv", "w") as f:
    f.write("h,k,rho,cdf\n")
    for h, k, rho, c in points:
        f.write(f"{h!r},{k!r},{rho!r},{c!r}\n")


def thresholds(totals):
    cum = np.cumsum(totals)[:-1] / np.sum(totals)
    return np.concatenate(([-np.inf], norm.ppf(cum), [np.inf]))


def polychoric(table):
    table = np.asarray(table, dtype=float)
    table = table[table.sum(axis=1) > 0][:, table.sum(axis=0) > 0]
    a = thresholds(table.sum(axis=1))
    b = thresholds(table.sum(axis=0))

    def negll(rho):
        grid = np.array([[bvn_scipy(ai, bj, rho) if np.isfinite(ai) or ai > 0 else 0.0 for bj in b] for ai in a])
        grid[0, :] = 0.0
        grid[:, 0] = 0.0
        pi = grid[1:, 1:] - grid[:-1, 1:] - grid[1:, :-1] + grid[:-1, :-1]
        mask = table > 0
        return -np.sum(table[mask] * np.log(np.maximum(pi[mask], 1e-300)))

    res = minimize_scalar(negll, bounds=(-0.9999, 0.9999), method="bounded", options={"xatol": 1e-12})
    return res.x


tables = {
    "two_by_two": [[40, 10], [15, 35]],
    "three_by_three": [[20, 10, 3], [8, 25, 12], [2, 9, 31]],
    "negative_three_by_four": [[2, 6, 14, 22], [9, 15, 12, 6], [25, 11, 5, 3]],
    "likert_five_by_five_sparse": [[5, 3, 0, 0, 0], [4, 12, 6, 1, 0], [1, 8, 30, 9, 2], [0, 2, 11, 25, 7], [0, 0, 1, 6, 14]],
    "skewed_four_by_three": [[60, 12, 1], [20, 25, 6], [4, 10, 9], [0, 2, 5]],
}
with open("polychoric_tables.csv", "w") as f:
    f.write("name,rows,cols,counts,rho\n")
    for name, t in tables.items():
        t = np.asarray(t)
        rho = polychoric(t)
        f.write(f"{name},{t.shape[0]},{t.shape[1]},{';'.join(str(int(v)) for v in t.ravel())},{rho!r}\n")
        print(name, rho)
