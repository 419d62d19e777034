"""Reference values for BetaDistanceLaw: in-sample squared distances D² with N·D²/(N−1)² ~ Beta(k/2, (N−k−1)/2).
Upper quantile (N−1)²/N · beta.ppf(1 − q, k/2, (N−k−1)/2) and upper tail beta.sf(N·d/(N−1)², k/2, (N−k−1)/2) from
scipy.stats. Run: python3 beta_distance_reference.py > beta_distance.csv (numpy, scipy from Debian)."""
from scipy import stats
import scipy
print(f"# scipy {scipy.__version__}: scipy.stats.beta.ppf / beta.sf")
print("q,k,n,quantile,d2,upper_tail")
for q, k, n in [(0.001, 24, 200), (0.001, 12, 60), (0.025, 5, 90), (1e-6, 30, 600), (0.001, 30, 20000), (0.5, 3, 10)]:
    a, b, s = k / 2, (n - k - 1) / 2, (n - 1) ** 2 / n
    quant = s * stats.beta.ppf(1 - q, a, b)
    d2 = 0.8 * quant
    print(f"{q!r},{k},{n},{quant!r},{d2!r},{stats.beta.sf(n * d2 / (n - 1) ** 2, a, b)!r}")
