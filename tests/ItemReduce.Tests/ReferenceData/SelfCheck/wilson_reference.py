#!/usr/bin/env python3
"""Cross-check of the Wilson score intervals quoted in WilsonScoreIntervalTests (Newcombe 1998, Table II, method 3).

Run from the repository root with Debian's python3-scipy:  /usr/bin/python3 tests/ItemReduce.Tests/ReferenceData/SelfCheck/wilson_reference.py
Prints x, n and the 95 % interval from scipy.stats.binomtest(x, n).proportion_ci(method="wilson") to four decimals;
the output is committed beside this script as wilson_reference.txt.
"""
from scipy.stats import binomtest

for x, n in [(81, 263), (15, 148), (0, 20), (1, 29)]:
    ci = binomtest(x, n).proportion_ci(confidence_level=0.95, method="wilson")
    print(f"{x} {n} {ci.low:.4f} {ci.high:.4f}")
