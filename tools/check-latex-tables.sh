#!/usr/bin/env bash
# Checks that a results folder's tables.tex compiles with pdflatex when \input into a plain article with the
# packages its header names, and that no table is wider than the text (no "Overfull \hbox" in the log).
# Usage: tools/check-latex-tables.sh RESULTS_DIR
# Needs pdflatex (Debian: apt-get install texlive-latex-base texlive-latex-recommended texlive-latex-extra).
set -euo pipefail
dir="${1:?usage: tools/check-latex-tables.sh RESULTS_DIR}"
test -s "$dir/tables.tex" || { echo "check-latex-tables: no tables.tex in $dir" >&2; exit 2; }
command -v pdflatex >/dev/null || { echo "check-latex-tables: pdflatex not found; install texlive-latex-base, -recommended and -extra" >&2; exit 2; }
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
cp "$dir/tables.tex" "$work/tables.tex"
printf '%s\n' '\documentclass{article}' '\usepackage{booktabs,longtable,array}' '\begin{document}' '\input{tables}' '\end{document}' > "$work/check.tex"
# longtable settles its column widths over up to three runs.
for run in 1 2 3; do
  if ! (cd "$work" && pdflatex -interaction=nonstopmode -halt-on-error check.tex >/dev/null 2>&1); then
    grep -E '^!' -A3 "$work/check.log" >&2 || true
    echo "check-latex-tables: tables.tex does not compile" >&2
    exit 1
  fi
done
if grep -q 'Overfull \\hbox' "$work/check.log"; then
  grep 'Overfull \\hbox' "$work/check.log" >&2
  echo "check-latex-tables: a table is wider than the text" >&2
  exit 1
fi
echo "check-latex-tables: tables.tex compiles and every table fits the text width ($(grep -c 'begin{longtable}' "$work/tables.tex") tables)"
