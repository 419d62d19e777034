#!/usr/bin/env bash
# Whole-process timing of the permutation reference of parallel analysis against the default references:
# 20,000 respondents x 100 seven-point items (benchmarks/e2e/make_pa_survey.py), 1,000 replicates, Release build.
# Four commands, each run RUNS times in turn (default 3) under /usr/bin/time: Pearson with the normal reference,
# Pearson with the permutation reference, polychoric with the ordinal reference (its default), polychoric with the
# permutation reference. Compare CPU seconds (user + sys) of runs made side by side; the machine's load changes wall times.
set -euo pipefail
cd "$(dirname "$0")/../.."
runs="${RUNS:-3}"
work="$(mktemp -d)"
/usr/bin/python3 benchmarks/e2e/make_pa_survey.py "$work"
dotnet build src/ItemReduce.Cli -c Release -v q -nologo >/dev/null
exe=src/ItemReduce.Cli/bin/Release/net10.0/itemreduce
common=(dimensions --responses "$work/responses.csv" --codebook "$work/codebook.csv" --out "$work/out" --force --replicates 1000 --quiet)
for run in $(seq "$runs"); do
  for variant in "pearson normal" "pearson permutation" "polychoric ordinal" "polychoric permutation"; do
    set -- $variant
    /usr/bin/time -f "run $run, $1 $2: %e s wall, %U s user, %S s sys, %M KB max RSS" \
      "$exe" "${common[@]}" --correlation "$1" --reference "$2" >/dev/null
  done
done
rm -rf "$work"
