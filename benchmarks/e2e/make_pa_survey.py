# Generates the 20,000 respondents x 100 items survey used by pa-end-to-end.sh (invented data:
# four correlated factors, 25 seven-point items each). Run with Debian's /usr/bin/python3 (numpy).
# Optional: OUT N FACTORS (e.g. "out 5000 12" for 5,000 respondents x 300 items, 25 items per factor).
import sys
import numpy as np

out = sys.argv[1] if len(sys.argv) > 1 else "."
rng = np.random.default_rng(20261202)
n = int(sys.argv[2]) if len(sys.argv) > 2 else 20000
k = int(sys.argv[3]) if len(sys.argv) > 3 else 4
per = 25
p = k * per
phi = np.full((k, k), 0.3) + 0.7 * np.eye(k)
f = rng.standard_normal((n, k)) @ np.linalg.cholesky(phi).T
lam = rng.uniform(0.45, 0.75, p)
x = f[:, np.repeat(np.arange(k), per)] * lam + rng.standard_normal((n, p)) * np.sqrt(1 - lam**2)
cuts = np.array([-1.6, -0.9, -0.3, 0.3, 0.9, 1.6])
y = 1 + (x[:, :, None] > cuts).sum(axis=2)
with open(f"{out}/responses.csv", "w") as fh:
    fh.write("respondent," + ",".join(f"i{j+1:03d}" for j in range(p)) + "\n")
    for i in range(n):
        fh.write(f"P{i+1:05d}," + ",".join(map(str, y[i])) + "\n")
with open(f"{out}/codebook.csv", "w") as fh:
    fh.write("item,subscale,reverse,min,max,text\n")
    for j in range(p):
        fh.write(f"i{j+1:03d},S{j // per + 1},false,1,7,\n")
