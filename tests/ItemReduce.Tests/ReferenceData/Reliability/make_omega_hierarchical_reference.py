"""Independent reference for omega hierarchical by Schmid-Leiman (numpy + scipy only).

Run from the repository root with Debian's Python: /usr/bin/python3 tests/ItemReduce.Tests/ReferenceData/Reliability/make_omega_hierarchical_reference.py

Case: 14 items, 4 oblique factors, an invented pattern P and a factor correlation matrix PHI that is NOT exactly
one-factor (so the second-order fit is a real least-squares problem), and an item correlation matrix R = P PHI P' with
unit diagonal plus a small fixed symmetric perturbation (so 1'R1 is not the model-implied sum).
Second-order factor: one-factor unweighted least squares on PHI (minimise the sum of squared off-diagonal residuals
phi_ij - gamma_i gamma_j), solved with scipy.optimize.least_squares from a start of 0.5.
Schmid & Leiman (1957): g_j = sum_f P[j,f] gamma_f.  omega_h = (sum_j g_j)^2 / 1'R1 (McDonald 1999; Zinbarg et al. 2005).
"""
import os
import numpy as np
from scipy.optimize import least_squares

here = os.path.dirname(os.path.abspath(__file__))

P = np.zeros((14, 4))
groups = [range(0, 4), range(4, 8), range(8, 11), range(11, 14)]
main = [0.70, 0.62, 0.55, 0.48, 0.66, 0.58, 0.72, 0.51, 0.64, 0.57, 0.69, 0.60, 0.53, 0.67]
for f, items in enumerate(groups):
    for j in items:
        P[j, f] = main[j]
# a few cross-loadings, one negative
P[1, 2] = 0.12
P[6, 0] = -0.10
P[9, 3] = 0.15
PHI = np.array([[1.00, 0.45, 0.38, 0.30],
                [0.45, 1.00, 0.52, 0.25],
                [0.38, 0.52, 1.00, 0.41],
                [0.30, 0.25, 0.41, 1.00]])
R = P @ PHI @ P.T
rng = np.random.default_rng(20261202)
E = rng.uniform(-0.03, 0.03, size=R.shape)
E = (E + E.T) / 2
R = R + E
np.fill_diagonal(R, 1.0)
assert np.linalg.eigvalsh(R).min() > 0

iu = np.triu_indices(4, 1)
res = least_squares(lambda g: (PHI - np.outer(g, g))[iu], x0=np.full(4, 0.5), xtol=1e-15, ftol=1e-15, gtol=1e-15)
gamma = res.x * (1 if res.x.sum() >= 0 else -1)
general = P @ gamma
total = R.sum()
omega_h = general.sum() ** 2 / total

def write(name, m):
    np.savetxt(os.path.join(here, name), np.atleast_2d(m), delimiter=",", fmt="%.17g")

write("omegah_pattern.csv", P)
write("omegah_phi.csv", PHI)
write("omegah_correlation.csv", R)
write("omegah_gamma_scipy.csv", gamma)
write("omegah_general_numpy.csv", general)
with open(os.path.join(here, "omegah_expected.csv"), "w") as fh:
    fh.write("omega_h,total\n%.17g,%.17g\n" % (omega_h, total))
print("gamma", gamma, "omega_h", omega_h, "total", total)
