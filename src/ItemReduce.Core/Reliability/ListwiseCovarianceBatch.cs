using System.Runtime.CompilerServices;
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
/// with missing answers counted as 0, the sums n, Σx_a and Σx_a x_b over the rows complete on a set equal the all-rows
/// sums minus those over the rows missing some answer of the set. The all-rows sums come from the matrix's cached
/// pairwise sums (<see cref="PairwiseSums.Cached"/>) or from one read of the rows that accumulates Zᵀ Z of
/// Z = [X₀_G | 1] per group G of nested sets (a short form inside its scale) with the tiled kernel of
/// <see cref="PearsonCorrelation"/>; a second, cheap read decodes only the incomplete rows. Both run in parallel over
/// fixed row segments; all terms are integers below 2⁵³, and <c>n·C_ab = n·Σx_a x_b − Σx_a Σx_b</c> is formed in
/// 128-bit integers and rounded once, so the result does not depend on grouping, order or thread count.</item>
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
            ListwiseCovariance[] sums;
            if (PairwiseSums.Cached(data) is { } totals)
                sums = SubtractIncomplete(source, local, (s, a) => totals.Sum(sets[s][a], sets[s][a]),
                    (s, a, b) => totals.Product(sets[s][a], sets[s][b]), maxDegreeOfParallelism);
            else
                sums = ExactSums(source, local, maxDegreeOfParallelism);
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

    /// <summary>
    /// Exact path without cached sums: sets are grouped so that each set's columns lie within its group's columns
    /// (a short form within its scale); one read of the rows accumulates, per group G, Zᵀ Z of Z = [X₀_G | 1] over all
    /// rows (missing answers as 0) with the tiled kernel, and <see cref="SubtractIncomplete"/> removes the rows
    /// incomplete on each set.
    /// </summary>
    private static ListwiseCovariance[] ExactSums(ResponseMatrix data, int[][] sets, int maxDegreeOfParallelism)
    {
        var groups = new List<int[]>();
        var groupOf = new int[sets.Length];
        foreach (int s in Enumerable.Range(0, sets.Length).OrderByDescending(s => sets[s].Length))
        {
            int g = groups.FindIndex(cols => sets[s].All(cols.Contains));
            if (g < 0) { g = groups.Count; groups.Add(sets[s]); }
            groupOf[s] = g;
        }
        int p = data.ItemCount, tileRows = PearsonCorrelation.TileRows;
        var padded = groups.Select(c => (c.Length + 1 + 3) & ~3).ToArray();
        var zz = PearsonCorrelation.AccumulateSegments(data.Rows, data.RespondentCount, p, padded, maxDegreeOfParallelism,
            (block, rows, g, tile) => FillTile(block, p, rows, groups[g], tile.AsSpan(0, padded[g] * tileRows), tileRows));
        // Position of each set's columns within its group; the group's sums are the lower triangle of its Zᵀ Z.
        var position = sets.Select((cols, s) => cols.Select(c => Array.IndexOf(groups[groupOf[s]], c)).ToArray()).ToArray();
        long At(int s, int i, int j)
        {
            int g = groupOf[s];
            return (long)zz[g][Math.Max(i, j) * padded[g] + Math.Min(i, j)];
        }
        return SubtractIncomplete(data, sets, (s, a) => At(s, groups[groupOf[s]].Length, position[s][a]),
            (s, a, b) => At(s, position[s][a], position[s][b]), maxDegreeOfParallelism);
    }

    /// <summary>Variable-major tile of Z = [X₀ | 1] (missing answers as 0) of the given columns for a row-major block.</summary>
    private static void FillTile(ReadOnlySpan<double> block, int p, int rows, int[] cols, Span<double> tile, int tileRows)
    {
        tile.Clear();
        int k = cols.Length;
        for (int a = 0; a < k; a++)
        {
            var dst = tile.Slice(a * tileRows, rows);
            for (int t = 0, o = cols[a]; t < rows; t++, o += p)
            {
                double x = block[o];
                dst[t] = double.IsNaN(x) ? 0 : x;
            }
        }
        tile.Slice(k * tileRows, rows).Fill(1);
    }

    /// <summary>
    /// Exact sums over the rows complete on each set from all-rows sums with missing answers counted as 0
    /// (n, Σx_a = <paramref name="totalSum"/>(set, a), Σx_a x_b = <paramref name="totalProduct"/>(set, a, b); from
    /// <see cref="PairwiseSums.Cached"/> or <see cref="ExactSums"/>) minus the same sums over the rows missing some
    /// answer of the set. Only those rows are decoded (found by <see cref="ResponseMatrix.IsComplete"/>, which scans the
    /// stored cells); the read runs in parallel over fixed row segments and every term is an integer, so the result
    /// equals summing the complete rows directly, exactly.
    /// </summary>
    private static ListwiseCovariance[] SubtractIncomplete(ResponseMatrix source, int[][] local, Func<int, int, long> totalSum,
        Func<int, int, int, long> totalProduct, int maxDegreeOfParallelism)
    {
        int n = source.RespondentCount, p = source.ItemCount, sets = local.Length, tileRows = PearsonCorrelation.TileRows;
        int segments = Math.Clamp((n + 4 * tileRows - 1) / (4 * tileRows), 1, 16);
        var partial = new Incomplete[segments][];
        Parallel.For(0, segments, new ParallelOptions { MaxDegreeOfParallelism = maxDegreeOfParallelism }, [MethodImpl(MethodImplOptions.AggressiveOptimization)] (seg) =>
        {
            int r0 = (int)((long)n * seg / segments), r1 = (int)((long)n * (seg + 1) / segments);
            var acc = local.Select(c => new Incomplete(c.Length)).ToArray();
            var row = new double[p];
            for (int i = r0; i < r1; i++)
            {
                if (source.IsComplete(i)) continue;
                source.CopyRow(i, row);
                for (int s = 0; s < sets; s++)
                    if (!CompleteOn(row, 0, local[s])) acc[s].Add(row, 0, local[s]);
            }
            partial[seg] = acc;
        });
        var results = new ListwiseCovariance[sets];
        for (int s = 0; s < sets; s++)
        {
            int k = local[s].Length, set = s;
            var drop = new Incomplete(k);
            foreach (var part in partial) drop.Merge(part[s]);
            results[s] = FromExactSums(k, n - drop.Rows, a => totalSum(set, a) - drop.Sums[a],
                (a, b) => totalProduct(set, a, b) - drop.Products[a * k + b]);
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
