"""Independent numpy/scipy implementation of the screening's robust EM (ER) estimate, written from its description
(ErAlgorithm summary) without the C# code: EM start from item means and pairwise covariance (stop at relative change 1e-8), hard-rejection ER
stages (earlier stages stop at 1e-4, the last at 1e-8) at shares 0.1, 0.025 and then alpha with in-sample Beta cutoffs (scipy.stats.beta.ppf), rows outside the
estimate judged by their leave-in distance, Croux-Haesbroeck truncation factor, and the direct fit used when the
staged one keeps fewer rows than the direct fit minus 0.2 n. Writes er-reference-data.csv (the data) and
er-reference-fit.csv (location, scatter, kept flags). Run: python3 make_er_reference.py (numpy, scipy from Debian).
"""
import numpy as np
from scipy import stats

rng = np.random.default_rng(20261202)
n, p, alpha = 90, 5, 0.001
L = np.array([[1, 0, 0, 0, 0], [.6, .8, 0, 0, 0], [.5, .3, .8, 0, 0], [.4, .2, .1, .9, 0], [.3, .3, .3, .3, .8]])
x = rng.standard_normal((n, p)) @ L.T
x[:6] = rng.uniform(-4, 4, (6, p))                       # six planted outliers
x[rng.random((n, p)) < 0.06] = np.nan                    # 6 % missing at random
x = np.round(x, 3)

def pairwise_start(x):
    m = np.nanmean(x, axis=0)
    d = x - m
    c = np.zeros((p, p))
    for j in range(p):
        for k in range(p):
            ok = ~np.isnan(d[:, j]) & ~np.isnan(d[:, k])
            c[j, k] = (d[ok, j] * d[ok, k]).sum() / (ok.sum() - 1)
    return m, c

def fill(row, mean, cov):
    """Filled centred vector z, distance on the answered items, conditional covariance of the missing part."""
    o = ~np.isnan(row)
    z = np.zeros(p)
    z[o] = row[o] - mean[o]
    cc = np.zeros((p, p))
    mi = ~o
    if mi.any():
        soo = cov[np.ix_(o, o)]
        z[mi] = cov[np.ix_(mi, o)] @ np.linalg.solve(soo, z[o])
        cc[np.ix_(mi, mi)] = cov[np.ix_(mi, mi)] - cov[np.ix_(mi, o)] @ np.linalg.solve(soo, cov[np.ix_(o, mi)])
    d2 = z[o] @ np.linalg.solve(cov[np.ix_(o, o)], z[o])
    return z, d2, cc, int(o.sum())

def cutoff(a, k, N):
    if N - k - 1 <= 0:
        return np.inf
    return (N - 1) ** 2 / N * stats.beta.ppf(1 - a, k / 2, (N - k - 1) / 2)

def leave_in(d, N):
    a = N / (N + 1)
    return a * a * N / (N - 1) * d / (1 + N * d / ((N + 1) * (N - 1)))

def step(mean, cov, a, kept_prev, nk, factor):
    rows = [fill(x[i], mean, cov) for i in range(n)]
    kept = np.zeros(n, bool)
    for i, (z, d2, cc, k) in enumerate(rows):
        d = d2 if (kept_prev is None or kept_prev[i]) else leave_in(d2, nk)
        kept[i] = d <= (cutoff(a, k, nk) if a is not None else np.inf)
    zs = np.array([rows[i][0] for i in range(n) if kept[i]])
    m = kept.sum()
    zbar = zs.mean(axis=0)
    s = (zs.T @ zs - m * np.outer(zbar, zbar) + sum(rows[i][2] for i in range(n) if kept[i])) / (m - 1) * factor
    return mean + zbar, s, kept

mean, cov = pairwise_start(x)
for _ in range(200):
    m1, c1, _k = step(mean, cov, None, None, n, 1.0)
    done = max(np.abs(m1 - mean).max() / np.sqrt(cov.diagonal().max()), np.abs(c1 - cov).max() / cov.diagonal().max()) < 1e-8
    mean, cov = m1, c1
    if done:
        break

def stages(mean, cov, alphas):
    kept, nk = np.ones(n, bool), n
    for i, a in enumerate(alphas):
        tol = 1e-8 if i == len(alphas) - 1 else 1e-4
        factor = (1 - a) / stats.chi2.cdf(stats.chi2.isf(a, p), p + 2)
        for _ in range(200):
            m1, c1, k1 = step(mean, cov, a, kept, nk, factor)
            same = (k1 == kept).all()
            small = max(np.abs(m1 - mean).max() / np.sqrt(cov.diagonal().max()), np.abs(c1 - cov).max() / cov.diagonal().max()) < tol
            mean, cov, kept, nk = m1, c1, k1, int(k1.sum())
            if same and small:
                break
    return mean, cov, kept

staged = stages(mean, cov, [0.1, 0.025, alpha])
direct = stages(mean, cov, [alpha])
chosen = direct if staged[2].sum() < direct[2].sum() - 0.2 * n else staged

with open("er-reference-data.csv", "w") as f:
    f.write("# Data for the ER reference check (make_er_reference.py); empty = missing\n")
    f.write(",".join(f"x{j + 1}" for j in range(p)) + "\n")
    for r in x:
        f.write(",".join("" if np.isnan(v) else f"{v:.3f}" for v in r) + "\n")
with open("er-reference-fit.csv", "w") as f:
    f.write("# make_er_reference.py (numpy %s, scipy): row 0 = location, rows 1..p = scatter; kept flags are in er-reference-kept.csv\n" % np.__version__)
    f.write("what," + ",".join(f"c{j + 1}" for j in range(p)) + "\n")
    f.write("0," + ",".join(repr(float(v)) for v in chosen[0]) + "\n")
    for j in range(p):
        f.write(f"{j + 1}," + ",".join(repr(float(v)) for v in chosen[1][j]) + "\n")
with open("er-reference-kept.csv", "w") as f:
    f.write("# make_er_reference.py: 1 = row kept in the final ER step\nkept\n")
    for v in chosen[2]:
        f.write(f"{int(v)}\n")
print("kept", chosen[2].sum(), "of", n, "outliers kept:", chosen[2][:6])
