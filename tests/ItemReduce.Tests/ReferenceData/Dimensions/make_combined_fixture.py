#!/usr/bin/python3
"""Outside reference for the combined retention rule (src/ItemReduce.Core/Dimensions/CombinedRetention.cs): K-class
gradient boosting as fitted by scikit-learn's GradientBoostingClassifier (Debian python3-sklearn 1.2.1, numpy 1.24).
Run from the repository root with Debian's interpreter:
    /usr/bin/python3 tests/ItemReduce.Tests/ReferenceData/Dimensions/make_combined_fixture.py

Writes two fixtures:
1. boosting_small.csv — the algorithm: 240 invented rows (numpy seed 20261202; four continuous features and one with
   five integer values; three classes from a noisy linear rule), the first 160 for fitting
   GradientBoostingClassifier(n_estimators=25, learning_rate=0.1, max_depth=3, random_state=0), the last 80 held
   out. Columns: role (fit/score), label, x0..x4, s0..s2 (decision_function, i.e. the raw class scores).
2. combined_grid_rows.csv — the committed model: the same classifier settings as the study program's fit mode
   (n_estimators=300, learning_rate=0.05, max_depth=3, random_state=0) fitted on the committed training tables
   benchmarks/results/dimensions-study-2026-12-02/training-datasets.csv and training-hard-datasets.csv (classes =
   steps -2..+2 from the reduced-matrix count m, moved to the nearest allowed step), applied with the same allowed
   steps to every 10th row of grid-datasets.csv. Columns: row (data-set index in grid-datasets.csv), m, items, the 18 features, count.
   Allowed steps: m + step >= max(min(1, m), m - 2); for steps > 0, m + step <= 1 when m <= 1, otherwise
   <= max(m, K) with K the largest k (at least 1, below p) with (p - k)^2 - (p + k) > 0.
"""
import numpy as np
from sklearn.ensemble import GradientBoostingClassifier

rng = np.random.default_rng(20261202)
x = rng.normal(size=(240, 5))
x[:, 4] = rng.integers(0, 5, size=240)
score = x[:, 0] - 0.7 * x[:, 1] + 0.4 * x[:, 4] + 0.5 * rng.normal(size=240)
label = np.digitize(score, [-0.8, 0.9])
small = GradientBoostingClassifier(n_estimators=25, learning_rate=0.1, max_depth=3, random_state=0)
small.fit(x[:160], label[:160])
raw = small.decision_function(x)
with open("tests/ItemReduce.Tests/ReferenceData/Dimensions/boosting_small.csv", "w") as f:
    f.write("role,label," + ",".join(f"x{j}" for j in range(5)) + ",s0,s1,s2\n")
    for i in range(240):
        xs = ",".join(repr(float(v)) for v in x[i])
        s = ",".join(repr(float(v)) for v in raw[i])
        f.write(f"{'fit' if i < 160 else 'score'},{label[i]},{xs},{s}\n")

names = ["d_pca95", "d_pca_mean", "d_reduced_mean", "d_cd", "d_ekc", "d_kaiser", "d_map", "ln_n", "ln_p",
         "ln_items_per_factor", "z_reduced_m", "z_reduced_m1", "z_reduced_m2", "z_pca_m", "z_pca_m1", "z_pca_m2",
         "ln_gap_m", "cd_p_m1"]
steps = np.array([-2, -1, 0, 1, 2])


def table(path):
    t = np.genfromtxt(path, delimiter=",", names=True, dtype=float, deletechars="")
    return (np.column_stack([t[n] for n in names]), t["pa-reduced-95"].astype(int), t["factors"].astype(int),
            (t["factors"] * t["items_per_factor"]).astype(int))


def max_factors(p):
    k = 1
    while k + 1 < p and (p - (k + 1)) ** 2 - (p + k + 1) > 0:
        k += 1
    return k


def allowed(m, p):
    lowest = max(min(1, m), m - 2)
    highest = 1 if m <= 1 else max(m, max_factors(p))
    return np.array([m + s >= lowest and (s <= 0 or m + s <= highest) for s in steps])


base = "benchmarks/results/dimensions-study-2026-12-02/"
parts = [table(base + "training-datasets.csv"), table(base + "training-hard-datasets.csv")]
X = np.vstack([q[0] for q in parts])
M = np.concatenate([q[1] for q in parts])
K = np.concatenate([q[2] for q in parts])
P = np.concatenate([q[3] for q in parts])
y = []
for m, k, p in zip(M, K, P):
    a = allowed(m, p)
    y.append(min((c for c in range(5) if a[c]), key=lambda c: abs(steps[c] - (k - m))))
model = GradientBoostingClassifier(n_estimators=300, learning_rate=0.05, max_depth=3, random_state=0)
model.fit(X, np.array(y))
Xg, Mg, Kg, Pg = table(base + "grid-datasets.csv")
rows = np.arange(0, len(Xg), 10)
raw = model.decision_function(Xg[rows])
with open("tests/ItemReduce.Tests/ReferenceData/Dimensions/combined_grid_rows.csv", "w") as f:
    f.write("row,m,items," + ",".join(names) + ",count\n")
    for r, s in zip(rows, raw):
        a = allowed(Mg[r], Pg[r])
        best = max((c for c in range(5) if a[c]), key=lambda c: s[c])
        xs = ",".join(repr(float(v)) for v in Xg[r])
        f.write(f"{r},{Mg[r]},{Pg[r]},{xs},{Mg[r] + steps[best]}\n")
