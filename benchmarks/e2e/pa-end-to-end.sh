#!/usr/bin/env bash
# Whole-process timing of normal-reference parallel analysis: 20,000 respondents x 100 items,
# 1,000 replicates, including CSV reading, validation and writing the results (Release build).
# Compare with benchmarks/reference/numpy_bruteforce_parallel_analysis.py (simulate n x p data,
# correlate, eigendecompose, per replicate).
set -euo pipefail
cd "$(dirname "$0")/../.."
work="$(mktemp -d)"
/usr/bin/python3 benchmarks/e2e/make_pa_survey.py "$work"
dotnet build src/ItemReduce.Cli -c Release -v q -nologo >/dev/null
exe=src/ItemReduce.Cli/bin/Release/net10.0/itemreduce
for run in 1 2 3; do
  /usr/bin/time -f "run $run: %e s wall, %M KB max RSS" "$exe" dimensions --responses "$work/responses.csv" \
    --codebook "$work/codebook.csv" --out "$work/out" --force --replicates 1000 --quiet >/dev/null
done
rm -rf "$work"
