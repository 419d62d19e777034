#!/usr/bin/python3
"""Reference leading eigenpairs for ItemReduce's partial symmetric eigensolver (Lanczos, SymmetricEigensolver.Leading).

Run from this folder with Debian's interpreter:  /usr/bin/python3 make_leading_eigen_fixtures.py
(numpy from python3-numpy; eigenpairs by np.linalg.eigh, i.e. LAPACK's symmetric eigensolver).

Writes, for each case NAME:
  leading_NAME.csv          the symmetric matrix
  leading_NAME_values.csv   all its eigenvalues, descending
  leading_NAME_vectors.csv  the eigenvectors of the 8 largest eigenvalues as rows (each signed so that its
                            largest-magnitude element is positive, the project's convention)
Cases (numpy default_rng(20261202)):
  factor120   a reduced correlation matrix (squared multiple correlations on the diagonal) of 600 invented respondents
              answering 120 five-point items with a skewed answer distribution, 6 correlated factors (phi = .3) of 20
              items, loadings .4-.8: the matrix a minimum-residual fit decomposes.
  random80    the correlation matrix of 400 independent standard-normal 80-vectors: leading eigenvalues in a dense
              cluster (what parallel analysis draws).
  close30     30 x 30 with eigenvalues 10, 9.999, 9.99, 5, 4, ... in a random orthogonal basis (close leading pairs).
"""
import numpy as np

rng = np.random.default_rng(20261202)


def write(path, m, comment):
    m = np.atleast_2d(m)
    with open(path, "w") as f:
        f.write(f"# {comment}; numpy {np.__version__}, make_leading_eigen_fixtures.py\n")
        for row in m:
            f.write(",".join(repr(float(x)) for x in row) + "\n")


cases = {}
# factor120: ordinal skewed items from correlated factors.
k, per, n = 6, 20, 600
p = k * per
phi = np.full((k, k), 0.3) + 0.7 * np.eye(k)
f = rng.standard_normal((n, k)) @ np.linalg.cholesky(phi).T
lam = rng.uniform(0.4, 0.8, p)
x = f[:, np.repeat(np.arange(k), per)] * lam + rng.standard_normal((n, p)) * np.sqrt(1 - lam**2)
cuts = np.array([-0.5, 0.3, 0.9, 1.5])  # skewed: most answers in the lower categories
y = 1 + (x[:, :, None] > cuts).sum(axis=2)
r = np.corrcoef(y, rowvar=False)
smc = 1 - 1 / np.diag(np.linalg.inv(r))
reduced = r.copy()
np.fill_diagonal(reduced, smc)
cases["factor120"] = reduced
# random80: a random correlation matrix.
cases["random80"] = np.corrcoef(rng.standard_normal((400, 80)), rowvar=False)
# close30: close leading eigenvalues.
q, _ = np.linalg.qr(rng.standard_normal((30, 30)))
ev = np.concatenate([[10.0, 9.999, 9.99, 5.0], np.linspace(4.0, -2.0, 26)])
m = q @ np.diag(ev) @ q.T
cases["close30"] = (m + m.T) / 2

for name, a in cases.items():
    a = (a + a.T) / 2
    w, v = np.linalg.eigh(a)
    order = np.argsort(-w, kind="stable")
    w, v = w[order], v[:, order]
    vec = v[:, :8].T.copy()
    for row in vec:
        big = np.argmax(np.abs(row))
        if row[big] < 0:
            row *= -1
    write(f"leading_{name}.csv", a, f"{name}: symmetric matrix")
    write(f"leading_{name}_values.csv", w[:, None], f"{name}: np.linalg.eigh eigenvalues, descending")
    write(f"leading_{name}_vectors.csv", vec, f"{name}: np.linalg.eigh eigenvectors of the 8 largest, rows, sign rule")
print("numpy", np.__version__)
