#!/usr/bin/env bash
# Correlation kernel against the dgemm roof: alternates, ROUNDS times, the best-of-R timing of ItemReduce's
# complete-data Pearson correlation (n·p² flops) and of one OpenBLAS dgemm of the same shape through Debian's numpy
# (2·n·p² flops), so that both see the same load. Prints every round; the share of the roof is
# (our GFLOP/s) / (dgemm GFLOP/s) per shape, best round of each, by wall time and by CPU time (on a loaded machine the
# CPU-time rates are the steadier; run with 1 thread for the per-core roof). Threads: 2 each by default (the machine has 2 cores).
# The roof needs an optimised BLAS: Debian's numpy links the reference BLAS unless another is selected, so the script
# loads OpenBLAS (apt-get install libopenblas0-pthread) for its own numpy process only, leaving the system's choice alone.
# Usage: benchmarks/kernel/correlation-roof.sh [rounds] [repeats] [threads]
set -euo pipefail
repo="$(cd "$(dirname "$0")/../.." && pwd)"
rounds="${1:-3}"; repeats="${2:-20}"; threads="${3:-2}"
openblas=/usr/lib/x86_64-linux-gnu/openblas-pthread
[[ -f "$openblas/libblas.so.3" ]] || { echo "needs OpenBLAS: apt-get install libopenblas0-pthread"; exit 1; }
ns="5000,20000"; ps="100,200,300"
dotnet build -c Release "$repo/benchmarks/ItemReduce.Benchmarks" -v quiet -nologo >/dev/null
bench="$repo/benchmarks/ItemReduce.Benchmarks/bin/Release/net10.0/ItemReduce.Benchmarks.dll"
echo "== $(nproc) cores, load $(cut -d' ' -f1-3 /proc/loadavg), commit $(git -C "$repo" rev-parse --short HEAD)"
ours=$(mktemp); roof=$(mktemp)
for r in $(seq "$rounds"); do
  dotnet "$bench" correlation-kernel "$ns" "$ps" "$repeats" "$threads" | sed "s/^/ours $r /" | tee -a "$ours"
  LD_LIBRARY_PATH="$openblas" OPENBLAS_NUM_THREADS="$threads" /usr/bin/python3 "$repo/benchmarks/kernel/dgemm_roof.py" "$ns" "$ps" "$repeats" | sed "s/^/dgemm $r /" | tee -a "$roof"
done
echo "== best of $rounds rounds: n p | wall: ours dgemm GFLOP/s share | per CPU second: ours dgemm GFLOP/s share"
awk 'FNR==NR { k=$3" "$4; if ($6>o[k]) o[k]=$6; if ($8>oc[k]) oc[k]=$8; next }
     { k=$3" "$4; if ($6>d[k]) d[k]=$6; if ($8>dc[k]) dc[k]=$8 }
     END { for (k in o) printf "%s | %.2f %.2f %.0f%% | %.2f %.2f %.0f%%\n", k, o[k], d[k], 100*o[k]/d[k], oc[k], dc[k], 100*oc[k]/dc[k] }' \
  "$ours" "$roof" | sort -n -k1 -k2
echo "== load after: $(cut -d' ' -f1-3 /proc/loadavg)"
rm -f "$ours" "$roof"
