# Blanks a share of the answers of a survey made by make_pa_survey.py, each answer independently (numpy seed 7), so
# every respondent has their own missing-answer pattern. Run with Debian's /usr/bin/python3 (numpy).
# Usage: blank_answers.py IN/responses.csv OUT/responses.csv SHARE (e.g. 0.05)
import sys
import numpy as np

src, dst, share = sys.argv[1], sys.argv[2], float(sys.argv[3])
rng = np.random.default_rng(7)
with open(src) as fh:
    header = fh.readline()
    rows = [line.rstrip("\n").split(",") for line in fh]
p = len(rows[0]) - 1
mask = rng.random((len(rows), p)) < share
with open(dst, "w") as fh:
    fh.write(header)
    for i, r in enumerate(rows):
        fh.write(r[0] + "," + ",".join("" if mask[i, j] else r[j + 1] for j in range(p)) + "\n")
