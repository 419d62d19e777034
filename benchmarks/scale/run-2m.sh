#!/usr/bin/env bash
# End-to-end scale measurement: generates an invented 2,000,000 × 40 survey (planted five-factor model, 1 % missing,
# 0.2 % careless respondents; tools/ItemReduce.ScaleSurvey), then times a parse-only pass (`itemreduce check`) and the
# full `itemreduce run`, printing wall time and peak memory (max RSS) of each. Nothing is written into the repository.
#
# Usage: benchmarks/scale/run-2m.sh [work-dir] [respondents]
#   work-dir     where the survey and results go (default: a new folder under ${TMPDIR:-/tmp}); about 0.5 GB
#   respondents  rows to generate (default 2000000)
# Needs GNU time (/usr/bin/time).
set -euo pipefail
repo="$(cd "$(dirname "$0")/../.." && pwd)"
work="${1:-$(mktemp -d "${TMPDIR:-/tmp}/itemreduce-scale.XXXXXX")}"
rows="${2:-2000000}"
mkdir -p "$work"

echo "== building (Release)"
dotnet build -c Release "$repo/ItemReduce.sln" -v quiet -nologo >/dev/null
cli="$repo/src/ItemReduce.Cli/bin/Release/net10.0/itemreduce.dll"
gen="$repo/tools/ItemReduce.ScaleSurvey/bin/Release/net10.0/ItemReduce.ScaleSurvey.dll"

if [[ ! -f "$work/responses.csv" ]]; then
  echo "== generating $rows respondents into $work"
  dotnet "$gen" "$work" "$rows" 7
fi
ls -l "$work/responses.csv"

measure() { # label, then the command
  local label="$1"; shift
  local log="$work/$label.time"
  /usr/bin/time -v "$@" >"$work/$label.out" 2>"$log" || { echo "$label failed"; tail -5 "$log"; exit 1; }
  local wall rss
  wall=$(grep "Elapsed (wall clock)" "$log" | awk '{print $NF}')
  rss=$(grep "Maximum resident set size" "$log" | awk '{print $NF}')
  printf '%-12s wall %s   max RSS %d MiB\n' "$label" "$wall" $((rss / 1024))
}

echo "== machine: $(nproc) cores, $(free -g | awk '/Mem:/{print $2}') GiB RAM, load $(cut -d' ' -f1-3 /proc/loadavg)"
measure parse-only dotnet "$cli" check --responses "$work/responses.csv" --codebook "$work/codebook.csv"
rm -rf "$work/results"   # so the run does not also time deleting an earlier run's outputs
measure full-run dotnet "$cli" run --responses "$work/responses.csv" --codebook "$work/codebook.csv" \
  --out "$work/results" --force --progress
echo "== steps of the full run (stderr with --progress):"
grep '^itemreduce:' "$work/full-run.time" || true
