"""Reference values for the factoring tests (ItemReduce). Run with Debian's /usr/bin/python3
(numpy 1.24, scipy 1.10, scikit-learn 1.2):  /usr/bin/python3 make_factoring_reference.py
Writes CSV files next to this script. Everything here is independent of the C# code:
  * data drawn with numpy's seeded generator from a planted two-factor model;
  * sklearn.decomposition.FactorAnalysis (maximum likelihood on the covariance, here of z-scores
    with ddof=0 so the covariance equals the correlation matrix);
  * ULS/minres by scipy.optimize over the full loading matrix (off-diagonal least squares);
  * principal axis iteration in numpy;
  * varimax by Kaiser's (1958) original pairwise planar rotations in numpy, and sklearn's varimax
    (no Kaiser normalisation).
"""
import numpy as np
from scipy.optimize import minimize
from sklearn.decomposition import FactorAnalysis

here = __file__.rsplit('/', 1)[0] if '/' in __file__ else '.'
rng = np.random.default_rng(20240611)

# Planted model: 2 correlated factors, 8 items, one cross-loader.
L = np.array([[.8, 0], [.7, 0], [.6, 0], [.5, .3], [0, .75], [0, .65], [0, .55], [0, .45]])
phi = np.array([[1, .3], [.3, 1]])
common = np.einsum('jf,fg,jg->j', L, phi, L)
n = 3000
F = rng.multivariate_normal(np.zeros(2), phi, size=n)
X = F @ L.T + rng.standard_normal((n, 8)) * np.sqrt(1 - common)
Z = (X - X.mean(0)) / X.std(0)          # ddof = 0 -> covariance (1/n) == correlation matrix
R = np.corrcoef(X, rowvar=False)
np.savetxt(f'{here}/two_factor_correlation.csv', R, delimiter=',', fmt='%.17g')

# --- ML: sklearn FactorAnalysis (ML via SVD iterations) ---------------------------------------
fa = FactorAnalysis(n_components=2, tol=1e-12, max_iter=100000, svd_method='lapack').fit(Z)
psi = fa.noise_variance_
Lml = fa.components_.T
Sigma = Lml @ Lml.T + np.diag(psi)
p, k = 8, 2
Fmin = np.linalg.slogdet(Sigma)[1] - np.linalg.slogdet(R)[1] + np.trace(R @ np.linalg.inv(Sigma)) - p
chi = (n - 1 - (2 * p + 5) / 6 - 2 * k / 3) * Fmin             # Bartlett (1950) multiplier
df = ((p - k) ** 2 - (p + k)) / 2
rmsea = np.sqrt(max(chi - df, 0) / (df * (n - 1)))
chi0 = -(n - 1 - (2 * p + 5) / 6) * np.linalg.slogdet(R)[1]
df0 = p * (p - 1) / 2
tli = (chi0 / df0 - chi / df) / (chi0 / df0 - 1)
from scipy.stats import chi2
np.savetxt(f'{here}/two_factor_ml_uniqueness_sklearn.csv', psi, delimiter=',', fmt='%.17g')
with open(f'{here}/two_factor_ml_fit.csv', 'w') as fh:
    fh.write('n,fmin,chisq,df,p,rmsea,tli\n')
    fh.write(f'{n},{Fmin:.17g},{chi:.17g},{df:.17g},{chi2.sf(chi, df):.17g},{rmsea:.17g},{tli:.17g}\n')

# --- minres / ULS: minimise the off-diagonal residual sum of squares over L -------------------
iu = ~np.eye(p, dtype=bool)
def uls(theta):
    Lm = theta.reshape(p, k)
    res = (R - Lm @ Lm.T)[iu]
    return 0.5 * np.sum(res ** 2)
def uls_grad(theta):
    Lm = theta.reshape(p, k)
    res = R - Lm @ Lm.T
    np.fill_diagonal(res, 0)
    return (-2 * res @ Lm).ravel()
start = np.linalg.eigh(R)[1][:, ::-1][:, :k] * 0.7
opt = minimize(uls, start.ravel(), jac=uls_grad, method='BFGS', options={'gtol': 1e-12, 'maxiter': 100000})
Luls = opt.x.reshape(p, k)
np.savetxt(f'{here}/two_factor_minres_communality_scipy.csv', np.sum(Luls ** 2, 1), delimiter=',', fmt='%.17g')

# --- principal axis factoring with iterated communalities -------------------------------------
h2 = 1 - 1 / np.diag(np.linalg.inv(R))
for _ in range(100000):
    Rr = R.copy(); np.fill_diagonal(Rr, h2)
    w, v = np.linalg.eigh(Rr)
    w, v = w[::-1][:k], v[:, ::-1][:, :k]
    Lp = v * np.sqrt(np.maximum(w, 0))
    new = np.sum(Lp ** 2, 1)
    if np.max(np.abs(new - h2)) < 1e-12:
        h2 = new; break
    h2 = new
np.savetxt(f'{here}/two_factor_paf_communality_numpy.csv', h2, delimiter=',', fmt='%.17g')

# --- varimax on the sklearn ML loadings ------------------------------------------------------
def kaiser_pairwise_varimax(A, normalize=True, sweeps=500):
    """Kaiser (1958): cycle over factor pairs, rotate each plane by the angle maximising the criterion."""
    A = A.copy()
    h = np.sqrt(np.sum(A ** 2, 1)) if normalize else np.ones(A.shape[0])
    A = A / h[:, None]
    pp = A.shape[0]
    for _ in range(sweeps):
        moved = 0.0
        for a in range(A.shape[1] - 1):
            for b in range(a + 1, A.shape[1]):
                x, y = A[:, a], A[:, b]
                u = x ** 2 - y ** 2; v = 2 * x * y
                num = 2 * (pp * np.sum(u * v) - np.sum(u) * np.sum(v))
                den = pp * np.sum(u ** 2 - v ** 2) - (np.sum(u) ** 2 - np.sum(v) ** 2)
                theta = np.arctan2(num, den) / 4
                c, s = np.cos(theta), np.sin(theta)
                A[:, a], A[:, b] = c * x + s * y, -s * x + c * y
                moved = max(moved, abs(theta))
        if moved < 1e-14:
            break
    return A * h[:, None]

np.savetxt(f'{here}/two_factor_unrotated_ml_loadings.csv', Lml, delimiter=',', fmt='%.17g')
np.savetxt(f'{here}/two_factor_varimax_kaiser_numpy.csv', kaiser_pairwise_varimax(Lml, True), delimiter=',', fmt='%.17g')
# three-factor loadings for a harder varimax comparison (fixed, hand-written)
A3 = np.array([[.7, .2, .1], [.6, .3, -.1], [.5, .4, .2], [.3, .6, .1], [.2, .7, .0],
               [.1, .5, .4], [.4, .1, .6], [.2, .2, .7], [.3, -.2, .5], [.6, -.1, .3]])
np.savetxt(f'{here}/three_factor_loadings.csv', A3, delimiter=',', fmt='%.17g')
np.savetxt(f'{here}/three_factor_varimax_kaiser_numpy.csv', kaiser_pairwise_varimax(A3, True), delimiter=',', fmt='%.17g')
np.savetxt(f'{here}/three_factor_varimax_raw_numpy.csv', kaiser_pairwise_varimax(A3, False), delimiter=',', fmt='%.17g')
# sklearn's own varimax (raw, no Kaiser normalisation) via its private rotation helper (p x k in, k x p out)
from sklearn.decomposition._factor_analysis import _ortho_rotation
np.savetxt(f'{here}/three_factor_varimax_raw_sklearn.csv', _ortho_rotation(A3, method='varimax', tol=1e-12, max_iter=10000).T,
           delimiter=',', fmt='%.17g')

# --- quartimin (oblimin, gamma = 0) by general-purpose optimisation over T with unit-length columns ----
# Independent of the gradient-projection algorithm: T = X / ||X|| (column-wise), Lambda = A (T^-1)^T,
# Q = 1/4 sum(L2 * (L2 N)); scipy BFGS with numerical gradients from X = I. Kaiser row normalisation first.
def quartimin_free(A, normalize=True):
    h = np.sqrt(np.sum(A ** 2, 1)) if normalize else np.ones(A.shape[0])
    An = A / h[:, None]
    kk = A.shape[1]
    N = np.ones((kk, kk)) - np.eye(kk)
    def lam(xv):
        X = xv.reshape(kk, kk)
        T = X / np.sqrt(np.sum(X ** 2, 0))
        return An @ np.linalg.inv(T).T, T
    def q(xv):
        L2 = lam(xv)[0] ** 2
        return 0.25 * np.sum(L2 * (L2 @ N))
    res = minimize(q, np.eye(kk).ravel(), method='BFGS', options={'gtol': 1e-13, 'maxiter': 100000})
    Lr, T = lam(res.x)
    return Lr * h[:, None], T.T @ T
Pq, Phiq = quartimin_free(A3, True)
np.savetxt(f'{here}/three_factor_quartimin_kaiser_scipy.csv', Pq, delimiter=',', fmt='%.17g')
np.savetxt(f'{here}/three_factor_quartimin_kaiser_scipy_phi.csv', Phiq, delimiter=',', fmt='%.17g')

# --- promax (Hendrickson & White 1964, power 4) from the numpy Kaiser varimax --------------------------
Lv = kaiser_pairwise_varimax(A3, True)
Q = Lv * np.abs(Lv) ** 3
U = np.linalg.lstsq(Lv, Q, rcond=None)[0]
U = U @ np.diag(np.sqrt(np.diag(np.linalg.inv(U.T @ U))))
np.savetxt(f'{here}/three_factor_promax_numpy.csv', Lv @ U, delimiter=',', fmt='%.17g')
np.savetxt(f'{here}/three_factor_promax_numpy_phi.csv', np.linalg.inv(U.T @ U), delimiter=',', fmt='%.17g')
print('ok', opt.fun, Fmin, chi, rmsea, tli)
