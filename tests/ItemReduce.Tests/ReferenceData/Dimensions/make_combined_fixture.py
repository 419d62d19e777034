#!/usr/bin/python3
"""Independent reference for the fitting of the combined retention rule (src/ItemReduce.Core/Dimensions/
CombinedRetentionModel.cs, fitted by the study program's Newton iterations). Run from the repository root with
Debian's interpreter:
    /usr/bin/python3 tests/ItemReduce.Tests/ReferenceData/Dimensions/make_combined_fixture.py RIDGE
(python3-numpy 1.24, python3-scipy 1.10).

Reads the committed training tables benchmarks/results/dimensions-study-2026-12-02/training-datasets.csv and
training-hard-datasets.csv (in that order) and
maximises the same penalised log-likelihood with scipy.optimize.minimize (L-BFGS-B, analytic gradient):
  classes = steps -2..+2 from the reduced-matrix count m (label = planted - m clipped to -2..+2, moved to the
  nearest allowed step); a step is allowed when m + step >= max(min(1, m), m - 2) and, for steps > 0,
  m + step <= the largest k with (p - k)^2 - (p + k) > 0 (at least 1) (Ledermann bound), and <= 1 when m <= 1;
  softmax over the allowed steps only; step 0 is the reference class (coefficients 0);
  features standardised with the training means and standard deviations (ddof = 1);
  penalty (RIDGE / 2) * sum of squared weights (intercepts not penalised).
Writes combined_fit.csv: kind,index,value rows for mean, sd, intercept (index = class 0..4) and weight
(index = class*F + feature).
"""
import sys
import numpy as np
from scipy.optimize import minimize

ridge = float(sys.argv[1])
paths = ["benchmarks/results/dimensions-study-2026-12-02/training-datasets.csv",
         "benchmarks/results/dimensions-study-2026-12-02/training-hard-datasets.csv"]
names = ["d_pca95", "d_pca_mean", "d_reduced_mean", "d_cd", "d_ekc", "d_kaiser", "d_map", "ln_n", "ln_p",
         "ln_items_per_factor", "z_reduced_m", "z_reduced_m1", "z_reduced_m2", "z_pca_m", "z_pca_m1", "z_pca_m2",
         "ln_gap_m", "cd_p_m1"]
raw = np.concatenate([np.genfromtxt(pth, delimiter=",", names=True, dtype=float) for pth in paths])
k = raw["factors"].astype(int)
p = (raw["factors"] * raw["items_per_factor"]).astype(int)
m = raw["pareduced95"].astype(int)
X = np.column_stack([raw[nm] for nm in names])
mu = X.mean(axis=0)
sd = X.std(axis=0, ddof=1)
sd[~(sd > 1e-12)] = 1.0
Z = (X - mu) / sd
steps = np.array([-2, -1, 0, 1, 2])


def ledermann(pp):
    kk = 1
    while kk + 1 < pp and (pp - (kk + 1)) ** 2 - (pp + kk + 1) > 0:
        kk += 1
    return kk


mx = np.array([ledermann(v) for v in p])
lowest = np.maximum(np.minimum(1, m), m - 2)
cand = m[:, None] + steps[None, :]
highest = np.where(m <= 1, 1, np.maximum(m, mx))
allowed = (cand >= lowest[:, None]) & ((cand <= highest[:, None]) | (steps[None, :] <= 0))
target = np.clip(k - m, -2, 2)
labels = np.empty(len(k), dtype=int)
for i in range(len(k)):
    dist = np.where(allowed[i], np.abs(steps - target[i]), 99)
    labels[i] = int(np.argmin(dist))  # first minimum, as the C# loop (strictly smaller replaces)
free = [0, 1, 3, 4]
F = Z.shape[1]
Zi = np.column_stack([np.ones(len(k)), Z])


def unpack(theta):
    full = np.zeros((5, F + 1))
    full[free] = theta.reshape(4, F + 1)
    return full


def objective(theta):
    full = unpack(theta)
    s = Zi @ full.T
    s = np.where(allowed, s, -np.inf)
    top = s.max(axis=1, keepdims=True)
    e = np.where(allowed, np.exp(s - top), 0.0)
    tot = e.sum(axis=1, keepdims=True)
    logp = (s - top) - np.log(tot)
    prob = e / tot
    ll = logp[np.arange(len(k)), labels].sum()
    w = full[:, 1:]
    f = -ll + 0.5 * ridge * (w ** 2).sum()
    y = np.zeros_like(prob)
    y[np.arange(len(k)), labels] = 1
    g = -(y - prob).T @ Zi
    g[:, 1:] += ridge * w
    return f, g[free].ravel()


res = minimize(objective, np.zeros(4 * (F + 1)), jac=True, method="L-BFGS-B",
               options={"maxiter": 20000, "ftol": 1e-15, "gtol": 1e-10})
full = unpack(res.x)
with open("tests/ItemReduce.Tests/ReferenceData/Dimensions/combined_fit.csv", "w") as out:
    out.write("kind,index,value\n")
    out.write(f"ridge,0,{ridge!r}\n")
    for j in range(F):
        out.write(f"mean,{j},{mu[j]!r}\n")
    for j in range(F):
        out.write(f"sd,{j},{sd[j]!r}\n")
    for c in range(5):
        out.write(f"intercept,{c},{full[c, 0]!r}\n")
    for c in range(5):
        for j in range(F):
            out.write(f"weight,{c * F + j},{full[c, j + 1]!r}\n")
print(res.message, res.nit, "max |grad|", np.abs(objective(res.x)[1]).max())
