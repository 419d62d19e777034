#!/usr/bin/python3
"""Reference eigenvalues for ItemReduce's symmetric eigen-solver and Pearson correlation.

Run with Debian's interpreter:  /usr/bin/python3 make_eigen_fixtures.py
(numpy, scikit-learn from python3-numpy / python3-sklearn).

Writes
  iris.csv                          Fisher's (1936) iris measurements, 150 x 4, public domain
                                    (sklearn.datasets.load_iris).
  iris_correlation.csv              np.corrcoef of the four columns (4 x 4).
  iris_correlation_eigenvalues.csv  np.linalg.eigvalsh of that matrix, descending.
  symmetric_<name>.csv              random symmetric matrices (numpy default_rng(20261202)).
  symmetric_<name>_eigenvalues.csv  np.linalg.eigvalsh, descending.
"""
import numpy as np
from sklearn.datasets import load_iris


def write_matrix(path, m):
    m = np.atleast_2d(m)
    with open(path, "w") as f:
        for row in m:
            f.write(",".join(repr(float(x)) for x in row) + "\n")


def write_vector(path, v):
    with open(path, "w") as f:
        for x in v:
            f.write(repr(float(x)) + "\n")


iris = load_iris()
x = iris.data
with open("iris.csv", "w") as f:
    f.write("sepal_length,sepal_width,petal_length,petal_width\n")
    for row in x:
        f.write(",".join(repr(float(v)) for v in row) + "\n")
r = np.corrcoef(x, rowvar=False)
write_matrix("iris_correlation.csv", r)
write_vector("iris_correlation_eigenvalues.csv", np.linalg.eigvalsh(r)[::-1])

rng = np.random.default_rng(20261202)
cases = {}
for n in (1, 2, 5, 17, 60):
    a = rng.standard_normal((n, n))
    cases[f"gaussian{n}"] = (a + a.T) / 2
# Repeated eigenvalues (1, 1, 1, 2, 2, 5, -3) in a random orthogonal basis.
q, _ = np.linalg.qr(rng.standard_normal((7, 7)))
cases["repeated7"] = q @ np.diag([1.0, 1.0, 1.0, 2.0, 2.0, 5.0, -3.0]) @ q.T
cases["repeated7"] = (cases["repeated7"] + cases["repeated7"].T) / 2
# Already tridiagonal and already diagonal inputs (paths where a Householder step is skipped).
t = np.diag(rng.standard_normal(9)) + np.diag(rng.standard_normal(8), 1) + np.diag(rng.standard_normal(8), -1)
cases["tridiagonal9"] = (t + t.T) / 2
cases["diagonal6"] = np.diag([3.0, -1.0, 0.0, 2.5, 2.5, 10.0])
for name, m in cases.items():
    write_matrix(f"symmetric_{name}.csv", m)
    write_vector(f"symmetric_{name}_eigenvalues.csv", np.linalg.eigvalsh(m)[::-1])
print("numpy", np.__version__)
