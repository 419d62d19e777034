#!/usr/bin/python3
"""Reference values for the reweighting factor of the robust scatter (python3-scipy).

For a p-variate normal truncated to D^2 <= q (q = chi2_p 0.975 quantile), the covariance of the kept part is
Sigma * E[D^2 | D^2 <= q] / p. The factor that undoes this shrinkage is p * 0.975 / integral_0^q x f_p(x) dx, computed
here by numerical integration (scipy.integrate.quad), independently of the closed form used in the code.

Run:  /usr/bin/python3 reweighting_factor_reference.py   (writes reweighting_factor.csv)
"""
import scipy
from scipy import integrate
from scipy.stats import chi2

with open("reweighting_factor.csv", "w") as f:
    f.write(f"# scipy {scipy.__version__}: factor = p * 0.975 / quad(x * chi2.pdf(x, p), 0, chi2.isf(0.025, p))\n")
    f.write("p,factor\n")
    for p in [1, 2, 3, 5, 6, 8, 12, 20, 36, 48, 100]:
        q = chi2.isf(0.025, p)
        m, _ = integrate.quad(lambda x: x * chi2.pdf(x, p), 0, q, epsabs=0, epsrel=1e-13, limit=200)
        f.write(f"{p},{p * 0.975 / m!r}\n")
