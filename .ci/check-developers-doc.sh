#!/usr/bin/env bash
# Checks that DEVELOPERS.md stays true: every code span that names a repository path must exist, every code span
# that names a type (a capitalised identifier such as `ParallelAnalysis`) must be declared somewhere under src/,
# tools/, benchmarks/ or tests/, and every command span that runs a script or project of the repository must point
# at an existing file. Prints each broken reference; exits 1 if there is any.
set -euo pipefail
cd "$(dirname "$0")/.."
doc=DEVELOPERS.md
[[ -f $doc ]] || { echo "$doc is missing"; exit 1; }
status=0
# Code spans of one backtick pair, one per line.
mapfile -t spans < <(grep -o '`[^`]*`' "$doc" | sed 's/^`//; s/`$//' | sort -u)
for s in "${spans[@]}"; do
  # 1) repository paths: start with a top-level folder of the repo or a top-level file name
  if [[ $s =~ ^(src|tests|benchmarks|tools|templates|sample-surveys|\.ci)/[^[:space:]]*$ || $s =~ ^[A-Za-z.]+\.(md|props|sln)$ ]]; then
    p="${s%%[*?]*}"                       # a glob like src/ItemReduce.Core/*/ is checked up to the wildcard
    p="${p%/}"
    [[ -e $p ]] || { echo "DEVELOPERS.md: path \`$s\` does not exist"; status=1; }
    continue
  fi
  # 2) commands: check the files they run (bash X, dotnet run --project X, python3 X)
  if [[ $s =~ ^(bash|sh|python3)[[:space:]]+([^[:space:]]+) ]]; then
    f="${BASH_REMATCH[2]}"
    [[ -e $f ]] || { echo "DEVELOPERS.md: command \`$s\` runs $f, which does not exist"; status=1; }
    continue
  fi
  if [[ $s =~ --project[[:space:]]+([^[:space:]]+) ]]; then
    f="${BASH_REMATCH[1]}"
    [[ -e $f ]] || { echo "DEVELOPERS.md: command \`$s\` names project $f, which does not exist"; status=1; }
    continue
  fi
  # 3) type names: one capitalised identifier, optionally with a member (Type.Member)
  if [[ $s =~ ^([A-Z][A-Za-z0-9]+)(\.[A-Z][A-Za-z0-9]*)?(\(\))?$ ]]; then
    t="${BASH_REMATCH[1]}"
    if ! grep -rqE "(class|record|struct|enum|interface)( struct| class)? $t\b" --include='*.cs' src tools benchmarks tests; then
      echo "DEVELOPERS.md: type \`$t\` is not declared in the code"; status=1
    fi
  fi
done
exit $status
