#!/usr/bin/python3
"""Reference answer-pattern probabilities of a small ordinal factor model (python3-scipy), for the study's
likelihood-ratio yardstick (ItemReduce.Simulation.OrdinalLikelihoodRatio).

Model: 4 items, item j loads l[j] on factor f[j] (2 factors correlated 0.3), latent x*_j = l_j F + sqrt(1 - l_j^2) e_j,
3 categories with probabilities proportional to 1, 2, 4 (cut at the normal quantiles of the cumulative shares).
P(pattern) = P(latent vector in the pattern's box), by scipy.stats.multivariate_normal.cdf and inclusion-exclusion over
the box corners; for patterns with a missing item the item is dropped (marginal of the other three).
Writes T = -m log 3 - log P for every complete pattern and for every pattern with item 3 missing.

Run from the repository root:
  /usr/bin/python3 tests/ItemReduce.Tests/ReferenceData/Screening/ordinal_likelihood_reference.py
"""
import itertools, math, os
import numpy as np
import scipy
from scipy.stats import multivariate_normal, norm

l = np.array([0.5, 0.8, 0.6, 0.7]); f = [0, 0, 1, 1]; rho = 0.3
pr = np.array([1.0, 2.0, 4.0]); pr /= pr.sum()
cuts = np.concatenate([[-np.inf], norm.ppf(np.cumsum(pr)[:-1]), [np.inf]])
p = 4
R = np.eye(p)
for a in range(p):
    for b in range(p):
        if a != b:
            R[a, b] = l[a] * l[b] * (1.0 if f[a] == f[b] else rho)

def box_prob(items, cats):
    sub = R[np.ix_(items, items)]
    k = len(items)
    total = 0.0
    for corner in itertools.product([0, 1], repeat=k):
        upper = []
        sign = 1
        skip = False
        for it, (j, c) in enumerate(zip(items, cats)):
            v = cuts[c + 1] if corner[it] == 0 else cuts[c]
            if corner[it] == 1: sign = -sign
            if v == -np.inf: skip = True; break
            upper.append(min(v, 40.0))
        if skip: continue
        total += sign * multivariate_normal.cdf(np.array(upper), mean=np.zeros(k), cov=sub, abseps=1e-8, releps=1e-5, maxpts=100000)
    return total

out = os.path.join(os.path.dirname(os.path.abspath(__file__)), "ordinal_likelihood.csv")
with open(out, "w") as fh:
    fh.write(f"# scipy {scipy.__version__}: T = -m log 3 - log P(pattern); answers 1..3, 0 = missing\n")
    fh.write("x1,x2,x3,x4,T\n")
    for cats in itertools.product(range(3), repeat=4):
        P = box_prob([0, 1, 2, 3], list(cats))
        fh.write(",".join(str(c + 1) for c in cats) + f",{-4 * math.log(3) - math.log(P)!r}\n")
    for cats in itertools.product(range(3), repeat=3):
        P = box_prob([0, 1, 3], list(cats))
        x = [cats[0] + 1, cats[1] + 1, 0, cats[2] + 1]
        fh.write(",".join(map(str, x)) + f",{-3 * math.log(3) - math.log(P)!r}\n")
