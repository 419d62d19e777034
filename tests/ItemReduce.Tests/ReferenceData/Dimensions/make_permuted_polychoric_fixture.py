#!/usr/bin/python3
"""Two-step polychoric correlations of contingency tables of permuted (independent) ordinal items.

Run from this folder with Debian's interpreter:  /usr/bin/python3 make_permuted_polychoric_fixture.py
(python3-numpy, python3-scipy).

permuted_polychoric_tables.csv  name,rows,cols,counts (row-major, ';'-separated),rho
    Each table cross-tabulates two invented skewed ordinal items (category shares proportional to (i + 1)^-skew) after shuffling one of them (numpy's
    default_rng(20261202).permutation), so its correlation lies near 0, as in the permutation reference of
    parallel analysis. rho = two-step ML polychoric correlation (Olsson 1979): thresholds from the table's
    marginals via scipy.stats.norm.ppf, then scipy.optimize.minimize_scalar(bounded, xatol=1e-13) of
    -sum n_ij log pi_ij(rho), with pi_ij rectangle differences of the bivariate normal CDF computed by Owen's
    (1956) formula with scipy.special.owens_t (no series, no Genz integration).
"""
import numpy as np
from scipy.stats import norm
from scipy.special import owens_t
from scipy.optimize import minimize_scalar

BIG = 40.0


def bvn(h, k, rho):
    """Owen (1956), Ann. Math. Statist. 27, 1075-1090: Phi2(h, k; rho) via Owen's T."""
    if np.isinf(h) or np.isinf(k):
        if h == -np.inf or k == -np.inf:
            return 0.0
        return norm.cdf(k) if np.isinf(h) else norm.cdf(h)
    if h == 0 and k == 0:
        return 0.25 + np.arcsin(rho) / (2 * np.pi)
    s = np.sqrt(1 - rho * rho)

    def t(a, b):
        if a == 0:
            return 0.25 if b > 0 else -0.25 if b < 0 else 0.0
        return owens_t(a, (b - rho * a) / (a * s))
    beta = 0.0 if (h * k > 0 or (h * k == 0 and h + k >= 0)) else 0.5
    return 0.5 * (norm.cdf(h) + norm.cdf(k)) - t(h, k) - t(k, h) - beta


def thresholds(totals):
    cum = np.cumsum(totals)[:-1] / np.sum(totals)
    return np.concatenate(([-np.inf], norm.ppf(cum), [np.inf]))


def polychoric(table):
    a = thresholds(table.sum(axis=1))
    b = thresholds(table.sum(axis=0))

    def nll(rho):
        grid = np.array([[bvn(x, y, rho) for y in b] for x in a])
        pi = grid[1:, 1:] - grid[:-1, 1:] - grid[1:, :-1] + grid[:-1, :-1]
        return -np.sum(table * np.log(np.maximum(pi, 1e-300)))
    return minimize_scalar(nll, bounds=(-0.6, 0.6), method="bounded", options={"xatol": 1e-13}).x


def skewed_cuts(c, skew):
    """Cumulative shares of c categories with weights (i + 1)^-skew: the first category is the most common."""
    w = (np.arange(c) + 1.0) ** -skew
    return np.cumsum(w)[:-1] / w.sum()


rng = np.random.default_rng(20261202)
cases = []
for name, n, c1, c2, skew in (("five_by_five_n200", 200, 5, 5, 0.8), ("seven_by_seven_n2000", 2000, 7, 7, 1.2),
                              ("four_by_six_n500", 500, 4, 6, 1.6), ("two_by_five_n300", 300, 2, 5, 0.5),
                              ("seven_by_three_n20000", 20000, 7, 3, 1.0), ("three_by_three_n100", 100, 3, 3, 2.0)):
    z = rng.standard_normal((n, 2)) + skew * rng.standard_exponential((n, 2))
    x = np.digitize(z[:, 0], np.quantile(z[:, 0], skewed_cuts(c1, skew)))
    y = np.digitize(z[:, 1], np.quantile(z[:, 1], skewed_cuts(c2, skew)))
    y = rng.permutation(y)
    table = np.zeros((c1, c2), dtype=int)
    np.add.at(table, (x, y), 1)
    assert (table.sum(axis=0) > 0).all() and (table.sum(axis=1) > 0).all()
    cases.append((name, table, polychoric(table)))

with open("permuted_polychoric_tables.csv", "w") as f:
    f.write("# made by make_permuted_polychoric_fixture.py (numpy, scipy; Owen's T for the bivariate normal CDF)\n")
    f.write("name,rows,cols,counts,rho\n")
    for name, t, rho in cases:
        f.write(f"{name},{t.shape[0]},{t.shape[1]},{';'.join(map(str, t.ravel()))},{rho!r}\n")
