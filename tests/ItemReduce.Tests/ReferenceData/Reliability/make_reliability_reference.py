"""Reference values for the reliability tests (ItemReduce). Run with Debian's /usr/bin/python3
(numpy 1.24, scipy 1.10):  /usr/bin/python3 make_reliability_reference.py
All statistics are computed here directly from their textbook definitions, independently of the C# code.
"""
import numpy as np
from scipy.stats import f as fdist
from scipy.optimize import minimize

here = __file__.rsplit('/', 1)[0] if '/' in __file__ else '.'
rng = np.random.default_rng(7041)

# --- 1. Likert fixture: 300 respondents x 6 items (5-point), one factor, some missing answers -------
n, k = 300, 6
lam = np.array([.75, .7, .65, .6, .45, .3])
f = rng.standard_normal(n)
x = f[:, None] * lam + rng.standard_normal((n, k)) * np.sqrt(1 - lam ** 2)
likert = np.clip(np.round(x * 1.1 + 3), 1, 5)
miss = rng.random((n, k)) < 0.02
likert[miss] = np.nan
np.savetxt(f'{here}/likert_items.csv', likert, delimiter=',', fmt='%.17g')

X = likert[~np.isnan(likert).any(1)]              # listwise complete rows
m = X.shape[0]
def alpha(Y):
    kk = Y.shape[1]
    return kk / (kk - 1) * (1 - Y.var(0, ddof=1).sum() / Y.sum(1).var(ddof=1))
a = alpha(X)
R = np.corrcoef(X, rowvar=False)
rbar = R[np.triu_indices(k, 1)].mean()
std_alpha = k * rbar / (1 + (k - 1) * rbar)
aid = [alpha(np.delete(X, j, 1)) for j in range(k)]
itr = [np.corrcoef(X[:, j], np.delete(X, j, 1).sum(1))[0, 1] for j in range(k)]
lo = 1 - (1 - a) * fdist.ppf(0.975, m - 1, (m - 1) * (k - 1))   # Feldt (1965)
hi = 1 - (1 - a) * fdist.ppf(0.025, m - 1, (m - 1) * (k - 1))

# omega total from a one-factor ULS fit (off-diagonal least squares, scipy BFGS)
iu = ~np.eye(k, dtype=bool)
obj = lambda l: 0.5 * np.sum((R - np.outer(l, l))[iu] ** 2)
l1 = minimize(obj, np.full(k, .5), method='BFGS', options={'gtol': 1e-12}).x
l1 = l1 * np.sign(l1.sum())
omega = l1.sum() ** 2 / (l1.sum() ** 2 + np.sum(1 - l1 ** 2))
with open(f'{here}/likert_expected.csv', 'w') as fh:
    fh.write('n,alpha,std_alpha,ci_low,ci_high,omega\n')
    fh.write(f'{m},{a:.17g},{std_alpha:.17g},{lo:.17g},{hi:.17g},{omega:.17g}\n')
with open(f'{here}/likert_item_expected.csv', 'w') as fh:
    fh.write('alpha_if_deleted,item_total_r,omega_loading\n')
    for j in range(k):
        fh.write(f'{aid[j]:.17g},{itr[j]:.17g},{l1[j]:.17g}\n')

# --- 2. Feldt intervals for a grid of (alpha, n, k, confidence) --------------------------------------
with open(f'{here}/feldt_scipy.csv', 'w') as fh:
    fh.write('alpha,n,k,confidence,low,high\n')
    for (al, nn, kk, c) in [(.8, 50, 10, .95), (.7, 200, 4, .95), (.9, 1000, 20, .90), (.55, 30, 3, .99)]:
        d1, d2 = nn - 1, (nn - 1) * (kk - 1)
        fh.write(f'{al},{nn},{kk},{c},{1 - (1 - al) * fdist.ppf((1 + c) / 2, d1, d2):.17g},'
                 f'{1 - (1 - al) * fdist.ppf((1 - c) / 2, d1, d2):.17g}\n')

# --- 3. Overlap correction: short form vs full form, checked against fresh-error replication -------
# tau-equivalent one-factor model, 10 continuous items (loading .6), short form = items 0..3.
N, p, s = 200_000, 10, 4
F = rng.standard_normal(N)
E = rng.standard_normal((N, p)) * 0.8
Y = 0.6 * F[:, None] + E
Yrep = 0.6 * F[:, None] + rng.standard_normal((N, s)) * 0.8     # the short items again, fresh errors
full = Y.sum(1); short = Y[:, :s].sum(1); short_rep = Yrep.sum(1)
C = np.cov(Y, rowvar=False)
np.savetxt(f'{here}/overlap_covariance.csv', C, delimiter=',', fmt='%.17g')
r_obs = np.corrcoef(short, full)[0, 1]
r_rep = np.corrcoef(short_rep, full)[0, 1]
# population values from the model
cov_sf_true = s * p * .36; vs = s * s * .36 + s * .64; vf = p * p * .36 + p * .64
r_pop = cov_sf_true / np.sqrt(vs * vf)
# the correction formula evaluated by hand on the sample covariance
Vs = C[:s, :s].sum(); Vf = C.sum(); Csf = C[:s, :].sum()
a_s = s / (s - 1) * (1 - np.trace(C[:s, :s]) / Vs)
r_formula = (Csf - Vs * (1 - a_s)) / np.sqrt(Vs * Vf)
with open(f'{here}/overlap_expected.csv', 'w') as fh:
    fh.write('short_items,observed_r,replication_r,population_r,formula_r\n')
    fh.write(f'{s},{r_obs:.17g},{r_rep:.17g},{r_pop:.17g},{r_formula:.17g}\n')
print('ok', a, std_alpha, lo, hi, omega, r_obs, r_rep, r_pop, r_formula)
