#!/usr/bin/python3
"""Upper- and lower-tail chi-square probabilities on a dense grid, for the whole-number-df fast path of ChiSquareTail.

For every df = 1..300 the grid holds tiny x (1e-6 .. 0.1), multiples of df, points around the 0.999 quantile,
and the x values whose upper tail is 0.5 .. 1e-300 (from chi2.isf), plus two points beyond 1e-300.
A few rows exercise the general path: df that is not a whole number, df > 400, and x > 2800.
Columns: q_scipy = scipy.stats.chi2.sf(x, df) (Debian python3-scipy) and, as an independent check of scipy
itself, q_mpmath = regularised upper incomplete gamma Gamma(df/2, x/2)/Gamma(df/2) at 50 significant digits
(Debian python3-mpmath), rounded to double; p_scipy = scipy.stats.chi2.cdf(x, df) and p_mpmath = the regularised
lower incomplete gamma function, likewise (lower tail).

Run:  /usr/bin/python3 chi2_tail_grid_reference.py   (writes chi2_tail_grid.csv)
"""
import mpmath
import scipy
from scipy.stats import chi2

mpmath.mp.dps = 50

tiny = [1e-6, 1e-3, 0.1]
multiples = [0.25, 0.5, 0.8, 1.0, 1.2, 1.5, 2.0, 3.0, 5.0]
tails = [0.5, 0.05, 1e-3, 1e-6, 1e-12, 1e-20, 1e-50, 1e-100, 1e-150, 1e-200, 1e-250, 1e-300]

with open("chi2_tail_grid.csv", "w") as f:
    f.write(f"# scipy {scipy.__version__}, mpmath {mpmath.__version__}: q_scipy = scipy.stats.chi2.sf(x, df); "
            "q_mpmath = mpmath.gammainc(df/2, x/2, inf, regularized=True) at 50 digits; "
            "p_scipy = scipy.stats.chi2.cdf(x, df); p_mpmath = mpmath.gammainc(df/2, 0, x/2, regularized=True)\n")
    f.write("df,x,q_scipy,q_mpmath,p_scipy,p_mpmath\n")
    def row(df, x):
        a, z = mpmath.mpf(df) / 2, mpmath.mpf(x) / 2
        q_mp = mpmath.gammainc(a, z, mpmath.inf, regularized=True)
        p_mp = mpmath.gammainc(a, 0, z, regularized=True)
        f.write(f"{df!r},{x!r},{chi2.sf(x, df)!r},{float(q_mp)!r},{chi2.cdf(x, df)!r},{float(p_mp)!r}\n")

    for df in range(1, 301):
        q999 = chi2.isf(1e-3, df)
        xs = tiny + [m * df for m in multiples] + [0.99 * q999, 1.01 * q999]
        xs += [chi2.isf(q, df) for q in tails]
        far = chi2.isf(1e-300, df)
        xs += [1.02 * far, 1.3 * far]
        for x in sorted(set(xs)):
            row(df, x)
    for df in [0.5, 2.5, 17.5, 299.5, 401, 450]:
        xs = [1e-3, 0.5 * df, df, 2 * df] + [chi2.isf(q, df) for q in [1e-3, 1e-20, 1e-100]]
        for x in xs:
            row(df, x)
    for df, x in [(1, 2800.0), (400, 2800.0), (400, 2800.5), (400, 3000.0), (300, 1e4)]:
        row(df, x)
