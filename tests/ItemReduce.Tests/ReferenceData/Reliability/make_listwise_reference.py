"""Reference listwise covariances for several column sets (ItemReduce, ListwiseCovarianceBatch tests).
Run with Debian's /usr/bin/python3 (numpy 1.24):  /usr/bin/python3 make_listwise_reference.py
For every column set: keep the rows with no missing answer on that set's columns (listwise within the set),
then numpy.cov(..., ddof=1); sets with fewer than 2 such rows get NaN (written as empty cells).
Data are invented here with a seeded numpy generator.
"""
import numpy as np

here = __file__.rsplit('/', 1)[0] if '/' in __file__ else '.'
rng = np.random.default_rng(20261202)

# Column sets (0-based), shared by both data sets; written to listwise_sets.csv, one set per line.
SETS = [[0, 1, 2], [2, 5, 6, 1], [3], [0, 1, 2, 3, 4, 5, 6], [4, 7], [6, 0]]

def one_factor(n, p):
    f = rng.standard_normal(n)
    lam = np.linspace(0.75, 0.35, p)
    return f[:, None] * lam + rng.standard_normal((n, p)) * np.sqrt(1 - lam ** 2)

# 1. Integer answers 1..5 (compact storage, exact path): 1500 rows x 8 items, about 6 % missing; item 8
#    (column 7) is answered by exactly one respondent (who also answers column 4), so set [4, 7] has 1 complete row.
n = 1500
ints = np.clip(np.round(one_factor(n, 8) * 1.1 + 3), 1, 5)
ints[rng.random(ints.shape) < 0.06] = np.nan
ints[:, 7] = np.nan
ints[17, [4, 7]] = [2, 4]
# 2. Non-integer answers (dense storage, two-pass path): 400 rows x 8, about 5 % missing; column 7 answered twice
#    by rows that miss item 5 (column 4), so set [4, 7] has no complete row.
m = 400
reals = one_factor(m, 8) * 1.7 + 0.25
reals[rng.random(reals.shape) < 0.05] = np.nan
reals[:, 7] = np.nan
reals[[5, 9], 7] = [0.5, -1.25]
reals[[5, 9], 4] = np.nan

def write_data(name, x):
    with open(f'{here}/{name}', 'w') as fh:
        fh.write('# make_listwise_reference.py; rows = respondents, columns = items, empty = missing\n')
        for row in x:
            fh.write(','.join('' if np.isnan(v) else f'{v:.17g}' for v in row) + '\n')

def write_expected(name, x):
    with open(f'{here}/{name}', 'w') as fh:
        fh.write('# make_listwise_reference.py; set, n (rows complete on the set), a, b, numpy.cov ddof=1 [a, b] (empty = NaN)\n')
        for s, cols in enumerate(SETS):
            y = x[:, cols]
            y = y[~np.isnan(y).any(axis=1)]
            k = len(cols)
            c = np.atleast_2d(np.cov(y, rowvar=False, ddof=1)) if y.shape[0] >= 2 else np.full((k, k), np.nan)
            for a in range(k):
                for b in range(k):
                    v = '' if np.isnan(c[a, b]) else f'{c[a, b]:.17g}'
                    fh.write(f'{s},{y.shape[0]},{a},{b},{v}\n')

write_data('listwise_integer_items.csv', ints)
write_data('listwise_real_items.csv', reals)
write_expected('listwise_integer_expected.csv', ints)
write_expected('listwise_real_expected.csv', reals)
with open(f'{here}/listwise_sets.csv', 'w') as fh:
    fh.write('# make_listwise_reference.py; one column set per line (0-based item indices)\n')
    for cols in SETS:
        fh.write(','.join(str(c) for c in cols) + '\n')
