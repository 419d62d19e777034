"""Reference values for MendellElstonApproximation: normal rectangle probabilities P(lower < Z <= upper), Z ~ N(0, S).
exact = scipy.stats.multivariate_normal.cdf(upper, lower_limit=lower) (Genz's quasi-Monte Carlo algorithm, tight error
settings); mendell_elston = an independent numpy implementation of the univariate conditioning (Mendell-Elston)
approximation written from the published description (condition on one variable at a time, truncated-normal moments,
linear regression update of the later means and covariances). Run from the repository root:
/usr/bin/python3 tests/ItemReduce.Tests/ReferenceData/Screening/rectangle_probability_reference.py > tests/ItemReduce.Tests/ReferenceData/Screening/rectangle_probability.csv
Columns: case, m, then S (m*m, row-major), lower (m), upper (m), exact, mendell_elston (infinite bounds written as Infinity)."""
import numpy as np
import scipy
from scipy import stats


def mendell_elston(s, lower, upper):
    s = np.array(s, dtype=float)
    m = len(lower)
    mu = np.zeros(m)
    log_p = 0.0
    for k in range(m):
        sd = np.sqrt(s[k, k])
        a, b = (lower[k] - mu[k]) / sd, (upper[k] - mu[k]) / sd
        p = stats.norm.cdf(b) - stats.norm.cdf(a)
        log_p += np.log(p)
        pa = 0.0 if np.isinf(a) else stats.norm.pdf(a)
        pb = 0.0 if np.isinf(b) else stats.norm.pdf(b)
        lam = (pa - pb) / p
        apa = 0.0 if np.isinf(a) else a * pa
        bpb = 0.0 if np.isinf(b) else b * pb
        ratio = 1 + (apa - bpb) / p - lam * lam
        new_mean = mu[k] + sd * lam
        new_var = s[k, k] * ratio
        beta = s[:, k] / s[k, k]
        rest = np.arange(k + 1, m)
        mu[rest] += beta[rest] * (new_mean - mu[k])
        s[np.ix_(rest, rest)] += np.outer(beta[rest], beta[rest]) * (new_var - s[k, k])
    return np.exp(log_p)


def factor_cov(loadings, groups, rho):
    m = len(loadings)
    s = np.eye(m)
    for i in range(m):
        for j in range(m):
            if i != j:
                s[i, j] = loadings[i] * loadings[j] * (1 if groups[i] == groups[j] else rho)
    return s


inf = np.inf
cases = [
    ("one", np.array([[1.0]]), [-0.5], [1.2]),
    ("independent", np.eye(3), [-inf, 0.3, -1.0], [0.1, inf, 2.0]),
    ("pair", np.array([[1.0, 0.5], [0.5, 1.0]]), [-inf, 0.8], [0.0, inf]),
    ("factor4", factor_cov([0.5, 0.6, 0.7, 0.8], [0, 0, 0, 0], 0.3), [0.5, -inf, 0.2, 1.0], [1.5, -0.4, 0.9, inf]),
    ("factor6", factor_cov([0.5, 0.6, 0.7, 0.8, 0.5, 0.6], [0, 0, 0, 1, 1, 1], 0.3),
     [-1.9, 0.5, -inf, 1.2, -0.3, -inf], [-0.8, 1.2, -1.5, inf, 0.6, 0.1]),
    ("ordinal8", factor_cov([0.5, 0.6, 0.7, 0.8] * 2, [0] * 6 + [1] * 2, 0.3),
     [-inf, 0.0, 0.25, -1.8, -inf, 0.84, -0.25, 0.25], [-1.8, 0.84, 0.84, -0.84, -1.8, inf, 0.25, inf]),
]
print(f"# scipy {scipy.__version__}, numpy {np.__version__}: multivariate_normal.cdf(abseps=1e-9, releps=1e-7, maxpts=5e6); Mendell-Elston in numpy")
print("case,m,s_lower_upper_exact_mendell_elston")


def cell(x):
    return "Infinity" if x == inf else "-Infinity" if x == -inf else repr(float(x))


for name, s, lo, up in cases:
    m = len(lo)
    if m == 1:
        exact = stats.norm.cdf(up[0]) - stats.norm.cdf(lo[0])
    else:
        exact = stats.multivariate_normal.cdf(np.array(up), mean=np.zeros(m), cov=s, maxpts=5_000_000, abseps=1e-9, releps=1e-7,
                                              lower_limit=np.array(lo))
    me = mendell_elston(s, lo, up)
    print(",".join([name, str(m)] + [cell(v) for v in s.flatten()] + [cell(v) for v in lo] + [cell(v) for v in up] + [repr(float(exact)), repr(float(me))]))
