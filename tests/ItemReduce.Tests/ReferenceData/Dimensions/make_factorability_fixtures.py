#!/usr/bin/python3
"""Reference values for KMO/MSA, Bartlett's sphericity test, SMCs and Velicer's MAP.

Run with Debian's interpreter:  /usr/bin/python3 make_factorability_fixtures.py  (numpy, scipy, sklearn)

Data: the UCI wine recognition data (Forina et al.; Aeberhard, Coomans & de Vel 1992), 178 x 13, as shipped
in sklearn.datasets.load_wine  -> wine.csv. R = np.corrcoef of the columns.

Every quantity is computed straight from its published formula with numpy:
  KMO (Kaiser 1970; 1974): q_ij = -P_ij / sqrt(P_ii P_jj), P = inv(R);
      KMO = sum_{i!=j} r^2 / (sum r^2 + sum q^2);  MSA_j = same with sums over i != j in row j.
  Bartlett (1950): chi2 = -(n - 1 - (2p + 5)/6) * log det R, df = p(p-1)/2, p = scipy.stats.chi2.sf(chi2, df).
  SMC_j = 1 - 1 / inv(R)_jj;  reduced-matrix eigenvalues = eigvalsh(R with SMC diagonal), descending.
  MAP (Velicer 1976): for m = 0..p-1, C = R - A_m A_m^T with A_m = V_m sqrt(L_m) (first m components of
      eigh(R)), r*_ij = C_ij / sqrt(C_ii C_jj); f2_m = mean over i != j of r*^2, f4_m = mean of r*^4
      (fourth-power revision, Velicer, Eaton & Fava 2000).
Also a hand-written 4 x 4 correlation matrix ("small", n = 120) for the same KMO/Bartlett quantities.
"""
import numpy as np
from scipy.stats import chi2
from sklearn.datasets import load_wine


def kmo(r):
    p_inv = np.linalg.inv(r)
    d = np.sqrt(np.diag(p_inv))
    q = -p_inv / np.outer(d, d)
    off = ~np.eye(r.shape[0], dtype=bool)
    r2 = np.where(off, r * r, 0.0)
    q2 = np.where(off, q * q, 0.0)
    overall = r2.sum() / (r2.sum() + q2.sum())
    msa = r2.sum(axis=1) / (r2.sum(axis=1) + q2.sum(axis=1))
    return overall, msa


def bartlett(r, n):
    p = r.shape[0]
    stat = -(n - 1 - (2 * p + 5) / 6) * np.linalg.slogdet(r)[1]
    df = p * (p - 1) // 2
    return stat, df, chi2.sf(stat, df)


def velicer_map(r):
    p = r.shape[0]
    values, vectors = np.linalg.eigh(r)
    order = np.argsort(values)[::-1]
    values, vectors = values[order], vectors[:, order]
    off = ~np.eye(p, dtype=bool)
    f2, f4 = [], []
    for m in range(p):
        a = vectors[:, :m] * np.sqrt(values[:m])
        c = r - a @ a.T
        d = np.diag(c)
        if np.any(d <= 1e-12):
            break
        rs = c / np.sqrt(np.outer(d, d))
        f2.append(np.mean(rs[off] ** 2))
        f4.append(np.mean(rs[off] ** 4))
    return np.array(f2), np.array(f4)


def write(prefix, r, n):
    overall, msa = kmo(r)
    stat, df, pval = bartlett(r, n)
    smc = 1 - 1 / np.diag(np.linalg.inv(r))
    reduced = r.copy()
    np.fill_diagonal(reduced, smc)
    f2, f4 = velicer_map(r)
    with open(f"{prefix}_factorability.csv", "w") as f:
        f.write("quantity,index,value\n")
        f.write(f"n,0,{n}\n")
        f.write(f"kmo,0,{overall!r}\n")
        for j, v in enumerate(msa):
            f.write(f"msa,{j},{v!r}\n")
        f.write(f"bartlett_chisq,0,{stat!r}\nbartlett_df,0,{df}\nbartlett_p,0,{pval!r}\n")
        for j, v in enumerate(smc):
            f.write(f"smc,{j},{v!r}\n")
        for j, v in enumerate(np.linalg.eigvalsh(reduced)[::-1]):
            f.write(f"reduced_eigenvalue,{j},{v!r}\n")
        for j, v in enumerate(f2):
            f.write(f"map,{j},{v!r}\n")
        for j, v in enumerate(f4):
            f.write(f"map4,{j},{v!r}\n")
        f.write(f"map_count,0,{int(np.argmin(f2))}\nmap4_count,0,{int(np.argmin(f4))}\n")
    print(prefix, "KMO", overall, "Bartlett", stat, df, pval, "MAP", np.argmin(f2), np.argmin(f4))


wine = load_wine()
x = wine.data
with open("wine.csv", "w") as f:
    f.write(",".join(wine.feature_names).replace("/", "_") + "\n")
    for row in x:
        f.write(",".join(repr(float(v)) for v in row) + "\n")
write("wine", np.corrcoef(x, rowvar=False), x.shape[0])

small = np.array([[1.00, 0.62, 0.48, 0.20],
                  [0.62, 1.00, 0.55, 0.15],
                  [0.48, 0.55, 1.00, 0.31],
                  [0.20, 0.15, 0.31, 1.00]])
with open("small_correlation.csv", "w") as f:
    for row in small:
        f.write(",".join(repr(float(v)) for v in row) + "\n")
write("small", small, 120)
