using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Reliability;

/// <summary>Sample covariance (divisor n − 1) of one column set over the rows complete on that set.</summary>
/// <param name="Covariance">k × k symmetric matrix in the order of the set's columns; all NaN when
/// <paramref name="Respondents"/> &lt; 2.</param>
/// <param name="Respondents">Rows with an answer on every column of the set (listwise n).</param>
internal sealed record ListwiseCovariance(double[,] Covariance, int Respondents);

/// <summary>
/// Listwise covariances of several column sets of one response matrix, each set listwise on its own columns
/// (a row missing an answer on set A still counts for set B if B's columns are answered), from one read of the
/// rows instead of one per set (common practice, no source).
/// <list type="bullet">
/// <item>Compact integer data small enough for exact sums (<see cref="PairwiseSums.Applies"/> on the set's columns):
/// with Z = [X | 1] on the rows complete on the set (zero rows elsewhere), Zᵀ Z holds n, Σx and Σxy as exact
/// integers; each block of rows is decoded once and one tile per set is accumulated by the tiled kernel of
/// <see cref="PearsonCorrelation"/>, in parallel over fixed row segments. <c>n·C_ab = n·Σx_a x_b − Σx_a Σx_b</c> is
/// formed in 128-bit integers and rounded once, so the result does not depend on grouping or thread count. When the
/// matrix's all-rows pairwise sums are already cached (<see cref="PairwiseSums.Cached"/>), the same integer sums are
/// obtained by subtracting the rows incomplete on each set from them, so only those rows need arithmetic.</item>
/// <item>Other data: two passes (means, then centred cross-products) over blocks of rows taken in order, each
/// row serving every set; each set's sums run over its complete rows in row order, exactly as a separate row loop
/// per set would.</item>
/// </list>
/// </summary>
internal static class ListwiseCovarianceBatch
{
    /// <summary>Rows per block of the two-pass path.</summary>
    private const int BlockRows = 1024;

    /// <summary>Listwise covariance of each column set of <paramref name="data"/>.</summary>
    /// <param name="data">Responses, NaN = missing.</param>
    /// <param name="columnSets">Column indices per set (each in [0, p − 1]; at least one column per set).</param>
    /// <param name="maxDegreeOfParallelism">Thread cap of the exact path (−1 = all cores); results do not depend on it.</param>
    /// <returns>One result per set, in the order of <paramref name="columnSets"/>.</returns>
    /// <exception cref="ArgumentException">An empty set or a column outside [0, p − 1].</exception>
    public static ListwiseCovariance[] Compute(ResponseMatrix data, IReadOnlyList<IReadOnlyList<int>> columnSets, int maxDegreeOfParallelism = -1)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(columnSets);
        int p = data.ItemCount;
        for (int s = 0; s < columnSets.Count; s++)
        {
            var set = columnSets[s] ?? throw new ArgumentException($"Column set {s} is null.", nameof(columnSets));
            if (set.Count == 0) throw new ArgumentException($"Column set {s} is empty; at least 1 column is needed.", nameof(columnSets));
            foreach (int c in set)
                if ((uint)c >= (uint)p) throw new ArgumentException($"Column set {s} holds column {c}; allowed range is 0..{p - 1}.", nameof(columnSets));
        }
        var results = new ListwiseCovariance[columnSets.Count];
        var exact = new List<int>();
        var twoPass = new List<int>();
        for (int s = 0; s < columnSets.Count; s++)
            (PairwiseSums.Applies(data.SelectItems(columnSets[s])) ? exact : twoPass).Add(s);
        if (exact.Count > 0)
        {
            var sets = exact.Select(s => columnSets[s].ToArray()).ToArray();
            var (source, local) = Narrow(data, sets);
            var sums = PairwiseSums.Cached(data) is { } totals
                ? FromTotals(source, local, totals, sets, maxDegreeOfParallelism)
                : ExactSums(source, local, maxDegreeOfParallelism);
            for (int e = 0; e < exact.Count; e++) results[exact[e]] = sums[e];
        }
        if (twoPass.Count > 0)
        {
            var (source, local) = Narrow(data, twoPass.Select(s => columnSets[s].ToArray()).ToArray());
            var moments = TwoPass(source, local);
            for (int e = 0; e < twoPass.Count; e++) results[twoPass[e]] = moments[e];
        }
        return results;
    }

    /// <summary>A view holding only the columns some set uses (the matrix itself when that is all of them), and the
    /// sets' column indices in that view.</summary>
    private static (ResponseMatrix Source, int[][] Local) Narrow(ResponseMatrix data, int[][] sets)
    {
        int p = data.ItemCount;
        var used = sets.SelectMany(c => c).Distinct().Order().ToArray();
        var position = new int[p];
        for (int u = 0; u < used.Length; u++) position[used[u]] = u;
        return (used.Length < p ? data.SelectItems(used) : data, sets.Select(set => set.Select(c => position[c]).ToArray()).ToArray());
    }

    /// <summary>Exact path: one Zᵀ Z per set (Z = [X_set | 1] on the set's complete rows) from one read of the rows.</summary>
    private static ListwiseCovariance[] ExactSums(ResponseMatrix data, int[][] sets, int maxDegreeOfParallelism)
    {
        int p = data.ItemCount, tileRows = PearsonCorrelation.TileRows;
        var padded = sets.Select(c => (c.Length + 1 + 3) & ~3).ToArray();
        var zz = PearsonCorrelation.AccumulateSegments(data.Rows, data.RespondentCount, p, padded, maxDegreeOfParallelism,
            (block, rows, s, tile) => FillTile(block, p, rows, sets[s], tile.AsSpan(0, padded[s] * tileRows), tileRows));
        var results = new ListwiseCovariance[sets.Length];
        for (int s = 0; s < sets.Length; s++)
        {
            int k = sets[s].Length, q = padded[s];
            var z = zz[s];
            results[s] = FromExactSums(k, (long)z[k * q + k], a => (long)z[k * q + a], (a, b) => (long)z[a * q + b]);
        }
        return results;
    }

    /// <summary>
    /// Exact path when the all-rows sums of the matrix are cached (<see cref="PairwiseSums.Cached"/>, left by the
    /// pairwise correlations of the same matrix): with missing answers counted as 0, the sums over the rows complete
    /// on a set are the all-rows sums (n, Σx_a = <see cref="PairwiseSums.Sum"/>(a, a), Σx_a x_b =
    /// <see cref="PairwiseSums.Product"/>(a, b)) minus those over the rows missing some answer of the set. Only those
    /// rows need arithmetic; the read runs in parallel over fixed row segments and all terms are integers, so the
    /// result equals <see cref="ExactSums"/> exactly.
    /// </summary>
    private static ListwiseCovariance[] FromTotals(ResponseMatrix source, int[][] local, PairwiseSums totals, int[][] global, int maxDegreeOfParallelism)
    {
        int n = source.RespondentCount, p = source.ItemCount, sets = local.Length, tileRows = PearsonCorrelation.TileRows;
        int segments = Math.Clamp((n + 4 * tileRows - 1) / (4 * tileRows), 1, 16);
        var partial = new Incomplete[segments][];
        Parallel.For(0, segments, new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism }, seg =>
        {
            int r0 = (int)((long)n * seg / segments), r1 = (int)((long)n * (seg + 1) / segments);
            var acc = local.Select(c => new Incomplete(c.Length)).ToArray();
            var row = new double[p];
            for (int i = r0; i < r1; i++)
            {
                if (source.IsComplete(i)) continue;   // scans the stored cells; only incomplete rows are decoded
                source.CopyRow(i, row);
                for (int s = 0; s < sets; s++)
                    if (!CompleteOn(row, 0, local[s])) acc[s].Add(row, 0, local[s]);
            }
            partial[seg] = acc;
        });
        var results = new ListwiseCovariance[sets];
        for (int s = 0; s < sets; s++)
        {
            var g = global[s];
            int k = g.Length;
            var drop = new Incomplete(k);
            foreach (var part in partial) drop.Merge(part[s]);
            results[s] = FromExactSums(k, n - drop.Rows, a => totals.Sum(g[a], g[a]) - drop.Sums[a],
                (a, b) => totals.Product(g[a], g[b]) - drop.Products[a * k + b]);
        }
        return results;
    }

    /// <summary>Integer sums over rows incomplete on one set, answers of missing cells counted as 0.</summary>
    private sealed class Incomplete(int k)
    {
        public long Rows;
        public readonly long[] Sums = new long[k];
        public readonly long[] Products = new long[k * k];   // lower triangle [a·k + b], b ≤ a

        public void Add(ReadOnlySpan<double> block, int offset, int[] cols)
        {
            Rows++;
            for (int a = 0; a < cols.Length; a++)
            {
                double x = block[offset + cols[a]];
                if (double.IsNaN(x)) continue;
                long xa = (long)x;
                Sums[a] += xa;
                for (int b = 0; b <= a; b++)
                {
                    double y = block[offset + cols[b]];
                    if (!double.IsNaN(y)) Products[a * k + b] += xa * (long)y;
                }
            }
        }

        public void Merge(Incomplete other)
        {
            Rows += other.Rows;
            for (int a = 0; a < Sums.Length; a++) Sums[a] += other.Sums[a];
            for (int c = 0; c < Products.Length; c++) Products[c] += other.Products[c];
        }
    }

    /// <summary>Variable-major tile of Z = [X_set | 1] for a row-major block: rows incomplete on the set stay 0.</summary>
    private static void FillTile(ReadOnlySpan<double> block, int p, int rows, int[] cols, Span<double> tile, int tileRows)
    {
        tile.Clear();
        int k = cols.Length;
        for (int t = 0, o = 0; t < rows; t++, o += p)
        {
            if (!CompleteOn(block, o, cols)) continue;
            for (int a = 0; a < k; a++) tile[a * tileRows + t] = block[o + cols[a]];
            tile[k * tileRows + t] = 1;
        }
    }

    /// <summary>Covariance and n from exact integer sums over the n complete rows (Σx_a, and Σx_a x_b for b ≤ a):
    /// <c>C_ab = (n·Σx_a x_b − Σx_a Σx_b) / (n (n − 1))</c>, numerator in 128-bit integers, rounded once.</summary>
    private static ListwiseCovariance FromExactSums(int k, long n, Func<int, long> sum, Func<int, int, long> product)
    {
        var s = new long[k];
        for (int a = 0; a < k; a++) s[a] = sum(a);
        var cov = new double[k, k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b <= a; b++)
            {
                Int128 scaled = n * (Int128)product(a, b) - (Int128)s[a] * s[b];
                cov[a, b] = cov[b, a] = n > 1 ? (double)scaled / ((double)n * (n - 1)) : double.NaN;
            }
        return new ListwiseCovariance(cov, (int)n);
    }

    /// <summary>Two-pass path: pass 1 counts complete rows and sums per set, pass 2 sums centred cross-products at
    /// the set's means; rows in order, so each set's sums equal those of a plain row loop over its complete rows.</summary>
    private static ListwiseCovariance[] TwoPass(ResponseMatrix data, int[][] sets)
    {
        int p = data.ItemCount;
        var n = new int[sets.Length];
        var mean = sets.Select(c => new double[c.Length]).ToArray();
        data.ForEachBlock(BlockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
                for (int s = 0; s < sets.Length; s++)
                {
                    var cols = sets[s];
                    if (!CompleteOn(v, o, cols)) continue;
                    n[s]++;
                    var m = mean[s];
                    for (int a = 0; a < cols.Length; a++) m[a] += v[o + cols[a]];
                }
        });
        for (int s = 0; s < sets.Length; s++)
            for (int a = 0; a < sets[s].Length; a++) mean[s][a] = n[s] > 0 ? mean[s][a] / n[s] : double.NaN;
        var cov = sets.Select(c => new double[c.Length, c.Length]).ToArray();
        var d = new double[sets.Length == 0 ? 0 : sets.Max(c => c.Length)];
        data.ForEachBlock(BlockRows, (v, rows) =>
        {
            for (int o = 0; o < rows * p; o += p)
                for (int s = 0; s < sets.Length; s++)
                {
                    var cols = sets[s];
                    if (!CompleteOn(v, o, cols)) continue;
                    int k = cols.Length;
                    var m = mean[s];
                    var c = cov[s];
                    for (int a = 0; a < k; a++) d[a] = v[o + cols[a]] - m[a];
                    for (int a = 0; a < k; a++)
                        for (int b = 0; b <= a; b++) c[a, b] += d[a] * d[b];
                }
        });
        var results = new ListwiseCovariance[sets.Length];
        for (int s = 0; s < sets.Length; s++)
        {
            var c = cov[s];
            for (int a = 0; a < sets[s].Length; a++)
                for (int b = 0; b <= a; b++)
                    c[a, b] = c[b, a] = n[s] > 1 ? c[a, b] / (n[s] - 1) : double.NaN;
            results[s] = new ListwiseCovariance(c, n[s]);
        }
        return results;
    }

    private static bool CompleteOn(ReadOnlySpan<double> v, int offset, int[] cols)
    {
        foreach (int c in cols) if (double.IsNaN(v[offset + c])) return false;
        return true;
    }
}
