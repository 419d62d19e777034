#!/usr/bin/env bash
# Intake speed: the whole `itemreduce check` process (read, validate, SHA-256, data summary) on a large invented survey,
# against pandas' C engine reading the same file (`pd.read_csv(..., engine="c")`, python3-pandas from Debian).
# Run both in turn, several times, and compare the medians pair by pair (paired whole-process runs); this script uses
# GNU time so that anyone can repeat it.
#
# Usage: benchmarks/intake/intake-vs-pandas.sh SURVEY_DIR [runs]
#   SURVEY_DIR  folder with responses.csv and codebook.csv, e.g. from tools/ItemReduce.ScaleSurvey (see
#               benchmarks/scale/run-2m.sh: 2,000,000 × 40, seed 7, 176 MB)
set -euo pipefail
repo="$(cd "$(dirname "$0")/../.." && pwd)"
dir="$1"; runs="${2:-3}"
dotnet build -c Release "$repo/src/ItemReduce.Cli" -v quiet -nologo >/dev/null
cli="$repo/src/ItemReduce.Cli/bin/Release/net10.0/itemreduce.dll"
cat "$dir/responses.csv" >/dev/null   # into the page cache
size=$(stat -c %s "$dir/responses.csv")
echo "machine: $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg); file $size bytes"
for r in $(seq "$runs"); do
  for who in itemreduce pandas; do
    if [[ $who == itemreduce ]]; then
      /usr/bin/time -f "%e %U %S %M" -o /tmp/intake.$$ dotnet "$cli" check --responses "$dir/responses.csv" --codebook "$dir/codebook.csv" >/dev/null
    else
      /usr/bin/time -f "%e %U %S %M" -o /tmp/intake.$$ /usr/bin/python3 -c "import pandas as pd, sys; pd.read_csv(sys.argv[1], engine='c')" "$dir/responses.csv"
    fi
    read -r wall user sys rss < /tmp/intake.$$
    printf 'run %d %-10s wall %6.2f s  user %6.2f s  sys %5.2f s  max RSS %5d MiB  %6.1f MB/s\n' "$r" "$who" "$wall" "$user" "$sys" $((rss / 1024)) \
      "$(echo "$size / 1000000 / $wall" | bc -l)"
  done
done
rm -f /tmp/intake.$$
