#!/usr/bin/python3
"""Reference full spectra for ItemReduce's eigenvalues-only path (blocked Householder reduction + root-free QL).

Run from this folder with Debian's interpreter:  /usr/bin/python3 make_full_spectrum_fixtures.py
(numpy from python3-numpy, scipy from python3-scipy; eigenvalues by scipy.linalg.eigvalsh, i.e. LAPACK).

Writes, for each case NAME:
  spectrum_NAME.csv          the symmetric matrix
  spectrum_NAME_values.csv   all its eigenvalues, descending
Cases (numpy default_rng(20261203)):
  survey150   pairwise Pearson correlations of 750 invented respondents answering 150 seven-point items (5 correlated
              factors, phi = .35, loadings .3-.8), skewed answer distributions, 0-10 % missing answers per item and a
              few careless respondents answering at random: not positive semidefinite in general (pairwise deletion).
  reduced150  the same matrix with squared multiple correlations on the diagonal (the reduced matrix).
  singular90  a correlation matrix of 90 items where 6 items are sums of two others (exactly rank deficient: 6
              eigenvalues at rounding level) and 4 pairs are near duplicates (correlation 1 - 1e-9).
  graded64    64 x 64 with eigenvalues 10^0 ... 10^-12 (graded, condition number 1e12) in a random orthogonal basis.
"""
import numpy as np
import scipy
import scipy.linalg

rng = np.random.default_rng(20261203)


def write(path, m, comment):
    m = np.atleast_2d(m)
    with open(path, "w") as f:
        f.write(f"# {comment}; numpy {np.__version__}, scipy {scipy.__version__}, make_full_spectrum_fixtures.py\n")
        for row in m:
            f.write(",".join(repr(float(x)) for x in row) + "\n")


def pairwise_corr(y):
    """Pearson correlation of each pair of columns over the rows where both are present."""
    p = y.shape[1]
    r = np.eye(p)
    ok = ~np.isnan(y)
    for i in range(p):
        for j in range(i):
            both = ok[:, i] & ok[:, j]
            r[i, j] = r[j, i] = np.corrcoef(y[both, i], y[both, j])[0, 1]
    return r


cases = {}
k, per, n = 5, 30, 750
p = k * per
phi = np.full((k, k), 0.35) + 0.65 * np.eye(k)
f = rng.standard_normal((n, k)) @ np.linalg.cholesky(phi).T
lam = rng.uniform(0.3, 0.8, p)
x = f[:, np.repeat(np.arange(k), per)] * lam + rng.standard_normal((n, p)) * np.sqrt(1 - lam**2)
cuts = np.sort(rng.uniform(-0.8, 1.8, (p, 6)), axis=1)  # skewed: item-specific, mostly high thresholds
y = 1 + (x[:, :, None] > cuts[None, :, :]).sum(axis=2).astype(float)
careless = rng.choice(n, 20, replace=False)
y[careless] = rng.integers(1, 8, (20, p))
miss = rng.uniform(0, 0.10, p)
y[rng.uniform(size=(n, p)) < miss] = np.nan
r = pairwise_corr(y)
cases["survey150"] = r
smc = 1 - 1 / np.diag(np.linalg.inv(r))
reduced = r.copy()
np.fill_diagonal(reduced, smc)
cases["reduced150"] = reduced
# singular90: exact linear dependencies and near duplicates.
z = rng.standard_normal((400, 80)) + 0.5 * rng.standard_normal((400, 1))
extra = [z[:, 2 * i] + z[:, 2 * i + 1] for i in range(6)]
dup = [z[:, 20 + i] + 1e-5 * rng.standard_normal(400) for i in range(4)]
cases["singular90"] = np.corrcoef(np.column_stack([z] + extra + dup), rowvar=False)
# graded64: condition number 1e12.
q, _ = np.linalg.qr(rng.standard_normal((64, 64)))
ev = 10.0 ** -np.linspace(0, 12, 64)
cases["graded64"] = q @ np.diag(ev) @ q.T

for name, a in cases.items():
    a = (a + a.T) / 2
    w = scipy.linalg.eigvalsh(a)[::-1]
    write(f"spectrum_{name}.csv", a, f"{name}: symmetric matrix")
    write(f"spectrum_{name}_values.csv", w[:, None], f"{name}: scipy.linalg.eigvalsh eigenvalues, descending")
print("numpy", np.__version__, "scipy", scipy.__version__)
