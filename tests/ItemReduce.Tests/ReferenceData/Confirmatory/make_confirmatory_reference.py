#!/usr/bin/python3
"""Independent reference for the confirmatory factor analysis (ML / casewise ML) and its fit statistics.

Written for ItemReduce with numpy and scipy only (Debian python3-numpy 1.24.2, python3-scipy 1.10.1); run with
/usr/bin/python3 from this folder. Everything is computed here from the textbook definitions, by a different route from
the C# code:
  * -2 ln L is summed respondent by respondent (not by pattern) and minimised with scipy.optimize.minimize (BFGS on a
    numerical gradient, then Newton steps on a numerical Hessian); the saturated and independence models are minimised
    the same way (no EM, no closed forms);
  * the expected information uses the duplication matrix and Kronecker products, 1/2 D_o'(K kron K) D_o, and the
    Jacobian of vech Sigma(theta) by central differences;
  * Gamma for complete data is the covariance (divide by N) of d_i = vech((x_i - xbar)(x_i - xbar)');
    with missing answers the sandwich A^-1 B A^-1 with casewise scores by numerical differentiation;
  * the RMSEA interval uses scipy.stats.ncx2.cdf with scipy.optimize.brentq.
Data: our own simulated two-factor survey (five-point answers cut from a normal factor model), seeded.
Outputs: cfa_<case>_data.csv (answers, empty = missing) and cfa_<case>_expected.csv (name,value).
"""
import numpy as np
from scipy import optimize, stats

np.set_printoptions(precision=10)


def simulate(n, seed, missing_share):
    rng = np.random.default_rng(seed)
    lam = np.array([0.8, 0.7, 0.6, 0.55, 0.75, 0.65, 0.5])
    fac = np.array([0, 0, 0, 0, 1, 1, 1])
    phi = np.array([[1.0, 0.4], [0.4, 1.0]])
    f = rng.multivariate_normal(np.zeros(2), phi, size=n)
    x = f[:, fac] * lam + rng.normal(size=(n, 7)) * np.sqrt(1 - lam ** 2)
    cuts = np.array([-1.3, -0.4, 0.5, 1.4])
    y = 1.0 + (x[:, :, None] > cuts).sum(axis=2)
    y[:, 6] = 1.0 + (x[:, 6, None] > np.array([-0.2, 0.6, 1.2, 1.9])).sum(axis=1)  # a skewed item
    if missing_share > 0:
        mask = rng.random(y.shape) < missing_share
        mask[mask.all(axis=1), 0] = False
        y[mask] = np.nan
    return y


def vech_index(p):
    return [(a, b) for a in range(p) for b in range(a + 1)]


def dup(p):
    idx = vech_index(p)
    d = np.zeros((p * p, len(idx)))
    for r, (a, b) in enumerate(idx):
        d[a * p + b, r] = 1
        d[b * p + a, r] = 1
    return d


def m2ll(y, mu, sigma):
    """-2 ln L without the constant: sum over respondents of ln|S_oo| + r' S_oo^-1 r (rows of one pattern together)."""
    total = 0.0
    masks = ~np.isnan(y)
    keys = [m.tobytes() for m in masks]
    for key in set(keys):
        rows = np.array([k == key for k in keys])
        o = masks[rows][0]
        s = sigma[np.ix_(o, o)]
        sign, logdet = np.linalg.slogdet(s)
        if sign <= 0:
            return np.inf
        r = y[rows][:, o] - mu[o]
        total += rows.sum() * logdet + np.einsum("ij,ij->", r, np.linalg.solve(s, r.T).T)
    return total


def num_grad(f, x, h=1e-6):
    g = np.zeros_like(x)
    for i in range(len(x)):
        e = np.zeros_like(x); e[i] = h * max(1.0, abs(x[i]))
        g[i] = (f(x + e) - f(x - e)) / (2 * e[i])
    return g


def minimise(f, x0):
    res = optimize.minimize(f, x0, method="BFGS", jac=lambda t: num_grad(f, t), options={"gtol": 1e-7, "maxiter": 5000})
    x = res.x
    for _ in range(4):  # Newton polish
        g = num_grad(f, x)
        hess = np.zeros((len(x), len(x)))
        for i in range(len(x)):
            e = np.zeros_like(x); e[i] = 1e-4 * max(1.0, abs(x[i]))
            hess[:, i] = (num_grad(f, x + e, 1e-5) - num_grad(f, x - e, 1e-5)) / (2 * e[i])
        hess = 0.5 * (hess + hess.T)
        step = np.linalg.solve(hess, g)
        if f(x - step) <= f(x) + 1e-9:
            x = x - step
    return x


class Model:
    def __init__(self, fac, k):
        self.fac = np.array(fac); self.k = k; self.p = len(fac)
        self.pairs = [(a, b) for a in range(k) for b in range(a + 1, k)]
        self.q = 2 * self.p + len(self.pairs)

    def sigma(self, th):
        p, k = self.p, self.k
        lam = np.zeros((p, k)); lam[np.arange(p), self.fac] = th[:p]
        phi = np.eye(k)
        for c, (a, b) in enumerate(self.pairs):
            phi[a, b] = phi[b, a] = th[2 * p + c]
        return lam @ phi @ lam.T + np.diag(th[p:2 * p])


def expected_info_vech(y, sigma):
    p = sigma.shape[0]
    dd = dup(p)
    a = np.zeros((dd.shape[1], dd.shape[1]))
    for row in y:
        o = ~np.isnan(row)
        k = np.zeros((p, p)); k[np.ix_(o, o)] = np.linalg.inv(sigma[np.ix_(o, o)])
        a += 0.5 * dd.T @ np.kron(k, k) @ dd
    return a


def expected_info_mean(y, sigma):
    p = sigma.shape[0]
    a = np.zeros((p, p))
    for row in y:
        o = ~np.isnan(row)
        a[np.ix_(o, o)] += np.linalg.inv(sigma[np.ix_(o, o)])
    return a


def vech(m):
    return np.array([m[a, b] for a, b in vech_index(m.shape[0])])


def unvech(v, p):
    m = np.zeros((p, p))
    for r, (a, b) in enumerate(vech_index(p)):
        m[a, b] = m[b, a] = v[r]
    return m


def casewise_scores(y, mu, sigma):
    p = sigma.shape[0]; s0 = vech(sigma)
    out = []
    for row in y:
        def ll(v):
            return -0.5 * m2ll(row[None, :], mu, unvech(v, p))
        out.append(num_grad(ll, s0, 1e-6))
    return np.array(out)


def scaling(y, complete, mu1, s1, sig_model, jac, df):
    n = y.shape[0]
    if complete:
        xc = y - y.mean(axis=0)
        d = np.array([vech(np.outer(r, r)) for r in xc])
        gamma = np.cov(d.T, bias=True)
    else:
        a = expected_info_vech(y, s1) / n
        b = casewise_scores(y, mu1, s1); b = b.T @ b / n
        ai = np.linalg.inv(a)
        gamma = ai @ b @ ai
    w = expected_info_vech(y, sig_model) / n
    u = w - w @ jac @ np.linalg.solve(jac.T @ w @ jac, jac.T @ w)
    return np.trace(u @ gamma) / df


def rmsea_ci(chi2, df, n):
    def root(prob):
        if stats.ncx2.cdf(chi2, df, 1e-12) <= prob:
            return 0.0
        hi = max(1.0, chi2)
        while stats.ncx2.cdf(chi2, df, hi) > prob:
            hi *= 2
        return optimize.brentq(lambda l: stats.ncx2.cdf(chi2, df, l) - prob, 1e-12, hi, xtol=1e-14, rtol=1e-14)
    return np.sqrt(root(0.95) / (df * n)), np.sqrt(root(0.05) / (df * n))


def fit_case(name, y, fac, k, listwise=False):
    if listwise:
        y = y[~np.isnan(y).any(axis=1)]
    y = y[~np.isnan(y).all(axis=1)]
    n, p = y.shape
    complete = not np.isnan(y).any()
    model = Model(fac, k)
    # Saturated model: mean and Cholesky factor of Sigma, minimised directly.
    tri = np.tril_indices(p)
    def sat(v):
        l = np.zeros((p, p)); l[tri] = v[p:]
        return m2ll(y, v[:p], l @ l.T)
    mu_start = np.nanmean(y, axis=0)
    cov_start = np.diag(np.nanvar(y, axis=0))
    v0 = np.concatenate([mu_start, np.linalg.cholesky(cov_start)[tri]])
    v1 = minimise(sat, v0)
    mu1 = v1[:p]; l1 = np.zeros((p, p)); l1[tri] = v1[p:]; s1 = l1 @ l1.T
    f1 = sat(v1)
    # Independence model.
    def ind(v):
        return m2ll(y, v[:p], np.diag(np.exp(v[p:])))
    v0i = minimise(ind, np.concatenate([mu_start, np.log(np.nanvar(y, axis=0))]))
    f0 = ind(v0i); s0 = np.diag(np.exp(v0i[p:]))
    # Model: theta = (lambda, psi, phi, mu).
    def fm(t):
        return m2ll(y, t[model.q:], model.sigma(t))
    th0 = np.concatenate([0.6 * np.sqrt(np.diag(s1)), 0.5 * np.diag(s1), np.full(len(model.pairs), 0.3), mu1])
    th = minimise(fm, th0)
    fmin = fm(th)
    sig = model.sigma(th)
    # Expected information of theta: Jacobian by central differences.
    jac = np.zeros((p * (p + 1) // 2, model.q))
    for i in range(model.q):
        e = np.zeros(len(th)); e[i] = 1e-6
        jac[:, i] = (vech(model.sigma(th + e)) - vech(model.sigma(th - e))) / 2e-6
    info_cov = jac.T @ expected_info_vech(y, sig) @ jac
    se = np.sqrt(np.diag(np.linalg.inv(info_cov)))
    ps = p * (p + 1) // 2
    df = ps - model.q; df0 = ps - p
    chi2 = fmin - f1; chi20 = f0 - f1
    cfi = 1 - max(chi2 - df, 0) / max(chi20 - df0, chi2 - df, 0)
    tli = (chi20 / df0 - chi2 / df) / (chi20 / df0 - 1)
    rmsea = np.sqrt(max(chi2 - df, 0) / (df * n))
    lo, hi = rmsea_ci(chi2, df, n)
    dres = (s1 - sig) / np.sqrt(np.outer(np.diag(s1), np.diag(s1)))
    srmr = np.sqrt(np.mean(vech(dres) ** 2))
    c = scaling(y, complete, mu1, s1, sig, jac, df)
    jac0 = np.zeros((ps, p))
    for r, (a, b) in enumerate(vech_index(p)):
        if a == b: jac0[r, a] = 1
    c0 = scaling(y, complete, mu1, s1, s0, jac0, df0)
    rc = chi2 - c * df; rc0 = chi20 - c0 * df0
    robust_cfi = 1 - max(rc, 0) / max(rc0, rc, 0)
    robust_tli = 1 - (rc / df) / (rc0 / df0)
    robust_rmsea = np.sqrt(max(rc, 0) / (df * n))
    std = th[:p] / np.sqrt(np.diag(sig))
    out = [("respondents", n), ("chi2", chi2), ("df", df), ("p_value", stats.chi2.sf(chi2, df)), ("cfi", cfi), ("tli", tli),
           ("rmsea", rmsea), ("rmsea_ci_low", lo), ("rmsea_ci_high", hi), ("srmr", srmr), ("scaled_chi2", chi2 / c),
           ("scaling_factor", c), ("robust_cfi", robust_cfi), ("robust_tli", robust_tli), ("robust_rmsea", robust_rmsea),
           ("independence_chi2", chi20)]
    for j in range(p):
        out += [(f"loading_{j}", th[j]), (f"loading_se_{j}", se[j]), (f"standardized_{j}", std[j]), (f"uniqueness_{j}", th[p + j])]
    for c_, _ in enumerate(model.pairs):
        out += [(f"correlation_{c_}", th[2 * p + c_]), (f"correlation_se_{c_}", se[2 * p + c_])]
    with open(f"cfa_{name}_expected.csv", "w") as fh:
        fh.write(f"# {name}: factors {list(fac)}, listwise={listwise}; made by make_confirmatory_reference.py\n")
        for key, v in out:
            fh.write(f"{key},{float(v):.12g}\n")
    print(name, dict(out[:16]))


def write_data(name, y):
    with open(f"cfa_{name}_data.csv", "w") as fh:
        fh.write("# simulated five-point answers, empty = missing; made by make_confirmatory_reference.py\n")
        for row in y:
            fh.write(",".join("" if np.isnan(v) else str(int(v)) for v in row) + "\n")


right = [0, 0, 0, 0, 1, 1, 1]
wrong = [0, 0, 0, 1, 1, 1, 1]  # item 4 moved to the wrong factor
complete = simulate(300, 20261202, 0.0)
missing = simulate(300, 20261203, 0.08)
write_data("complete", complete)
write_data("missing", missing)
fit_case("complete", complete, right, 2)
fit_case("complete_wrong", complete, wrong, 2)
fit_case("missing", missing, right, 2)
fit_case("missing_listwise", missing, right, 2, listwise=True)
