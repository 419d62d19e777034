#!/usr/bin/python3
"""Reference for the correlation settings reaching the factoring stage (tests/.../Cli/CorrelationChoiceTests.cs).

Step 1 (`generate`): writes our own invented two-factor survey: responses.csv and codebook.csv (400 respondents,
8 five-point items, item a2 reverse-keyed, about 6 % of answers missing completely at random), numpy seed 20261202.

Step 2 (`reference`): for each correlations-<case>.csv written by `itemreduce shorten --rotation none --factors 2`
(copied here as fixtures), fits a two-factor minimum-residual (unweighted least squares) model to that matrix with an
independent implementation (numpy eigendecomposition + scipy.optimize.minimize, L-BFGS-B over the uniquenesses,
bounds [0.005, 1]; Harman & Jones 1966 objective: half the sum of squared off-diagonal residuals) and writes
minres-<case>.csv (item, F1, F2, communality; columns ordered by variance, signs with positive column sums).
For the listwise case it also computes the listwise Pearson matrix straight from responses.csv with numpy
(reverse-keyed items rescored as min + max - x, complete respondents only) and writes listwise-pearson-numpy.csv.

Run from this folder:  /usr/bin/python3 make_correlation_choice_reference.py generate|reference
(numpy 1.24.2, scipy 1.10.1 from Debian bookworm).
"""
import sys
import numpy as np
from scipy.optimize import minimize

ITEMS = ["a1", "a2", "a3", "a4", "b1", "b2", "b3", "b4"]


def generate():
    rng = np.random.default_rng(20261202)
    n = 400
    lam = np.array([[.75, 0], [-.65, 0], [.7, 0], [.55, 0], [0, .7], [0, .6], [0, .75], [.15, .5]])
    phi = np.array([[1, .3], [.3, 1]])
    f = rng.multivariate_normal([0, 0], phi, size=n)
    uniq = 1 - np.sum((lam @ phi) * lam, axis=1)
    x = f @ lam.T + rng.standard_normal((n, 8)) * np.sqrt(uniq)
    cuts = np.array([-1.3, -0.4, 0.4, 1.2])
    y = 1 + np.sum(x[:, :, None] > cuts[None, None, :], axis=2)
    mask = rng.random((n, 8)) < 0.06
    with open("responses.csv", "w") as fh:
        fh.write("respondent," + ",".join(ITEMS) + "\n")
        for i in range(n):
            cells = ["NA" if mask[i, j] else str(int(y[i, j])) for j in range(8)]
            fh.write(f"r{i + 1}," + ",".join(cells) + "\n")
    with open("codebook.csv", "w") as fh:
        fh.write("item,subscale,reverse,min,max,text\n")
        for j, name in enumerate(ITEMS):
            fh.write(f"{name},{'alpha' if name[0] == 'a' else 'beta'},{'true' if name == 'a2' else 'false'},1,5,Invented item {name}\n")


def read_matrix(path):
    rows = [l.rstrip("\n").split(",") for l in open(path) if l.strip()]
    names = rows[0][1:]
    return names, np.array([[float(c) for c in r[1:]] for r in rows[1:]])


def minres(r, k):
    p = r.shape[0]

    def loadings(psi):
        w, v = np.linalg.eigh(r - np.diag(psi))
        order = np.argsort(w)[::-1][:k]
        return v[:, order] * np.sqrt(np.maximum(w[order], 0))

    def objective(psi):
        lam = loadings(psi)
        res = r - lam @ lam.T
        np.fill_diagonal(res, 0)
        return 0.5 * np.sum(res ** 2)

    start = 1 - 1 / np.diag(np.linalg.inv(r))
    fit = minimize(objective, 1 - start, method="L-BFGS-B", bounds=[(0.005, 1)] * p,
                   options={"ftol": 1e-15, "gtol": 1e-12, "maxiter": 10000})
    lam = loadings(fit.x)
    lam = lam * np.where(lam.sum(axis=0) < 0, -1, 1)
    return lam


def reference():
    for case in ["polychoric", "listwise"]:
        names, r = read_matrix(f"correlations-{case}.csv")
        lam = minres(r, 2)
        with open(f"minres-{case}.csv", "w") as fh:
            fh.write(f"# two-factor minres on correlations-{case}.csv: numpy.linalg.eigh + scipy.optimize.minimize (L-BFGS-B)\n")
            for name, row in zip(names, lam):
                fh.write(f"{name},{row[0]:.10f},{row[1]:.10f},{np.sum(row ** 2):.10f}\n")
    rows = [l.rstrip("\n").split(",") for l in open("responses.csv") if l.strip()][1:]
    x = np.array([[np.nan if c == "NA" else float(c) for c in r[1:]] for r in rows])
    x[:, 1] = 1 + 5 - x[:, 1]
    complete = x[~np.isnan(x).any(axis=1)]
    c = np.corrcoef(complete, rowvar=False)
    with open("listwise-pearson-numpy.csv", "w") as fh:
        fh.write(f"# numpy.corrcoef on the {complete.shape[0]} complete respondents of responses.csv, a2 rescored as 6 - x\n")
        for row in c:
            fh.write(",".join(f"{v:.15f}" for v in row) + "\n")


if __name__ == "__main__":
    {"generate": generate, "reference": reference}[sys.argv[1]]()
