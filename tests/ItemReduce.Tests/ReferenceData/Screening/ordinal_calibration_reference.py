"""Reference for DiscretenessCalibration: the upper-0.001 quantile of squared distances of ordinal answers drawn from
a latent normal model, divided by chi2_p(0.999). Latent correlation R (two factors, loadings .8/.7/.6, factor
correlation .3), five categories with skewed shares (1, 2, 4, 8, 16)/31 for every item, scored by normal scores at the
middle of each category's cumulative share; distances from the sample mean and covariance of 4,000,000 draws.
Run: python3 ordinal_calibration_reference.py > ordinal_calibration.csv (numpy, scipy from Debian)."""
import numpy as np
from scipy import stats
rng = np.random.default_rng(20261202)
p = 6
lam = np.array([.8, .7, .6, .8, .7, .6]); f = np.array([0, 0, 0, 1, 1, 1])
L = np.zeros((p, 2)); L[np.arange(p), f] = lam
Phi = np.array([[1, .3], [.3, 1]])
R = L @ Phi @ L.T; np.fill_diagonal(R, 1)
pr = np.array([1, 2, 4, 8, 16.0]); pr /= pr.sum()
cuts = stats.norm.ppf(np.cumsum(pr)[:-1]); sc = stats.norm.ppf(np.cumsum(pr) - pr / 2)
qs = []
for _ in range(4):
    z = rng.multivariate_normal(np.zeros(p), R, 1_000_000)
    x = sc[np.searchsorted(cuts, z)]
    m = x.mean(0); C = np.cov(x.T)
    d = np.einsum('ij,jk,ik->i', x - m, np.linalg.inv(C), x - m)
    qs.append(np.quantile(d, 0.999))
print(f"# numpy {np.__version__}: factor = mean over 4 batches of 1e6 draws; batch sd in the second column")
print("factor,batch_sd")
print(f"{np.mean(qs) / stats.chi2.isf(0.001, p)!r},{np.std(qs, ddof=1) / stats.chi2.isf(0.001, p)!r}")
for j in range(p):
    print("# R row " + ",".join(f"{v:.4f}" for v in R[j]))
