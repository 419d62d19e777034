#!/usr/bin/python3
"""Reference values for the number-of-dimensions rules added with comparison data and the empirical Kaiser
criterion. Independent numpy/scipy computations; run with Debian's interpreter:
    /usr/bin/python3 make_rule_fixtures.py
(python3-numpy 1.24, python3-scipy 1.10).

Writes
  ekc_cases.csv          case,n,eigenvalues(';'),references(';'),count: empirical Kaiser criterion
                         (Braeken & van Assen 2017, eq. for l_j) computed with numpy from eigvalsh of random
                         correlation matrices (default_rng(14)), and of the iris correlation matrix (n = 150).
  mann_whitney_cases.csv case,x(';'),y(';'),p_less: scipy.stats.mannwhitneyu(x, y, alternative='less',
                         method='asymptotic', use_continuity=True) on random samples, some with ties.
  polychoric_information.csv counts(';'),info: Fisher information per respondent for the polychoric
                         correlation at rho = 0, computed NUMERICALLY: cell probabilities from
                         scipy.stats.multivariate_normal.cdf at rho = +-h, central differences,
                         sum (dpi/drho)^2 / pi over the table of an item with itself-like marginals
                         (row and column marginals both = counts), then the square root (= I_j of the code).
  wishart_sigma_eigen.csv component,mean,p95: eigenvalues of sample correlation matrices of n = 60 normal
                         observations from N(0, Sigma) (Sigma below), 20,000 brute-force replicates
                         (default_rng(1414)); 95th percentile by numpy's default (linear, type 7).
  wishart_sigma.csv      that Sigma (5 x 5).
  hull_caf.csv, hull_select.csv  the Hull method's fit index and selection step (see the end of this script).
"""
import numpy as np
from scipy import stats

rng = np.random.default_rng(14)


def fmt(v):
    return ";".join(repr(float(x)) for x in v)


def ekc(eig, n):
    p = len(eig)
    edge = (1 + np.sqrt(p / n)) ** 2
    ref = np.empty(p)
    for j in range(p):
        ref[j] = max(edge * (p - eig[:j].sum()) / (p - j), 1.0)
    c = 0
    while c < p and eig[c] > ref[c]:
        c += 1
    return ref, c


def random_corr(p, k):
    lam = rng.uniform(0.3, 0.8, (p, k)) * (rng.random((p, k)) < 0.5)
    x = rng.standard_normal((400, k)) @ lam.T + rng.standard_normal((400, p))
    return np.corrcoef(x, rowvar=False)


with open("ekc_cases.csv", "w") as f:
    f.write("case,n,eigenvalues,references,count\n")
    cases = [(random_corr(8, 2), 150), (random_corr(12, 3), 400), (random_corr(20, 4), 90), (random_corr(6, 1), 1000)]
    iris = np.loadtxt("iris_correlation.csv", delimiter=",")
    cases.append((iris, 150))
    for i, (r, n) in enumerate(cases):
        eig = np.sort(np.linalg.eigvalsh(r))[::-1]
        ref, c = ekc(eig, n)
        f.write(f"{i},{n},{fmt(eig)},{fmt(ref)},{c}\n")

with open("mann_whitney_cases.csv", "w") as f:
    f.write("case,x,y,p_less\n")
    for i in range(6):
        m1, m2 = [(30, 30), (250, 250), (12, 20), (100, 80), (40, 40), (250, 250)][i]
        shift = [0.3, 0.05, -0.2, 0.0, 0.5, 0.0][i]
        x = rng.standard_normal(m1) + shift
        y = rng.standard_normal(m2)
        if i == 4:  # ties
            x = np.round(x, 0)
            y = np.round(y, 0)
        p = stats.mannwhitneyu(x, y, alternative="less", method="asymptotic", use_continuity=True).pvalue
        f.write(f"{i},{fmt(x)},{fmt(y)},{repr(float(p))}\n")

with open("polychoric_information.csv", "w") as f:
    f.write("counts,info\n")
    h = 1e-4
    for counts in [[10, 20, 40, 20, 10], [5, 10, 20, 30, 35], [50, 50], [3, 7, 15, 25, 50, 100], [30, 5, 60, 5]]:
        counts = np.array(counts, float)
        P = counts / counts.sum()
        tau = np.concatenate([[-np.inf], stats.norm.ppf(np.cumsum(P)[:-1]), [np.inf]])
        tau_f = np.clip(tau, -10, 10)

        def cell_probs(rho):
            mvn = stats.multivariate_normal(mean=[0, 0], cov=[[1, rho], [rho, 1]])
            G = np.zeros((len(tau), len(tau)))
            for i1, a in enumerate(tau_f):
                for j1, b in enumerate(tau_f):
                    G[i1, j1] = mvn.cdf([a, b])
            return G[1:, 1:] - G[:-1, 1:] - G[1:, :-1] + G[:-1, :-1]

        dpi = (cell_probs(h) - cell_probs(-h)) / (2 * h)
        pi0 = np.outer(P, P)
        info = (dpi ** 2 / pi0).sum()
        f.write(f"{fmt(counts.astype(int))},{repr(float(np.sqrt(info)))}\n")

sigma = np.array([[1, .5, .4, .1, 0], [.5, 1, .45, .1, .05], [.4, .45, 1, 0, .1], [.1, .1, 0, 1, .35], [0, .05, .1, .35, 1]])
rng2 = np.random.default_rng(1414)
chol = np.linalg.cholesky(sigma)
reps, n = 20000, 60
eigs = np.empty((reps, 5))
for r in range(reps):
    x = rng2.standard_normal((n, 5)) @ chol.T
    eigs[r] = np.sort(np.linalg.eigvalsh(np.corrcoef(x, rowvar=False)))[::-1]
np.savetxt("wishart_sigma.csv", sigma, delimiter=",", fmt="%r")
with open("wishart_sigma_eigen.csv", "w") as f:
    f.write("component,mean,p95\n")
    for c in range(5):
        f.write(f"{c + 1},{repr(float(eigs[:, c].mean()))},{repr(float(np.percentile(eigs[:, c], 95)))}\n")

# ---- Hull method (Lorenzo-Seva, Timmerman & Kiers 2011) -----------------------------------------------------
# hull_caf.csv:   case,m,loadings(';' row-major p x m, empty for m = 0),caf   on the iris correlation matrix and a
#                 random 8 x 8 one; CAF = 1 - KMO of the residual matrix R - L L' as it is
#                 (numpy inverse for the anti-image correlations).
# hull_select.csv: case,fit(';'),params(';'),on_hull(';' 0/1),st(';' nan where undefined),count : the hull
#                 selection on given fit/parameter sequences, numpy implementation of the published steps.


def kmo(r):
    inv = np.linalg.inv(r)
    d = np.sqrt(np.diag(inv))
    q = -inv / np.outer(d, d)
    off = ~np.eye(len(r), dtype=bool)
    sr = (r[off] ** 2).sum()
    sq = (q[off] ** 2).sum()
    return sr / (sr + sq)


def caf(r, lam):
    e = r - lam @ lam.T if lam is not None else r.copy()
    return 1 - kmo(e)


rng3 = np.random.default_rng(1515)
with open("hull_caf.csv", "w") as f:
    f.write("case,m,loadings,caf\n")
    iris = np.loadtxt("iris_correlation.csv", delimiter=",")
    r8 = random_corr(8, 2)
    for case, r in enumerate([iris, r8]):
        p = len(r)
        f.write(f"{case},0,,{repr(float(caf(r, None)))}\n")
        for m in (1, 2):
            lam = rng3.uniform(0.1, 0.5, (p, m))
            f.write(f"{case},{m},{fmt(lam.ravel())},{repr(float(caf(r, lam)))}\n")


def hull_select(fit, par):
    kept = []
    best = -np.inf
    for m in range(len(fit)):
        if not np.isnan(fit[m]) and fit[m] > best:
            kept.append(m)
            best = fit[m]
    changed = True
    while changed and len(kept) > 2:
        changed = False
        for h in range(1, len(kept) - 1):
            a, m, b = kept[h - 1], kept[h], kept[h + 1]
            line = fit[a] + (fit[b] - fit[a]) * (par[m] - par[a]) / (par[b] - par[a])
            if fit[m] <= line:
                del kept[h]
                changed = True
                break
    st = np.full(len(fit), np.nan)
    count, best_st = 0, -np.inf
    for h in range(1, len(kept) - 1):
        a, m, b = kept[h - 1], kept[h], kept[h + 1]
        before = (fit[m] - fit[a]) / (par[m] - par[a])
        after = (fit[b] - fit[m]) / (par[b] - par[m])
        st[m] = before / after if after > 0 else np.inf
        if st[m] > best_st:
            best_st, count = st[m], m
    on = np.zeros(len(fit), int)
    on[kept] = 1
    return on, st, count


with open("hull_select.csv", "w") as f:
    f.write("case,fit,params,on_hull,st,count\n")
    p = 12
    fits = [[0.2, 0.55, 0.8, 0.83, 0.84], [0.3, 0.7, 0.72, 0.9, 0.91, 0.915], [0.1, 0.6, 0.62], [0.25, 0.5, 0.45, 0.7, 0.72]]
    for case, fit in enumerate(fits):
        fit = np.array(fit)
        par = np.array([p * m - m * (m - 1) // 2 for m in range(len(fit))])
        on, st, count = hull_select(fit, par)
        f.write(f"{case},{fmt(fit)},{fmt(par)},{fmt(on)},{fmt(st)},{count}\n")
