using System.Runtime.CompilerServices;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Simulation-calibrated cutoff factor for ordinal answers (our own calibration, in the spirit of the
/// simulation-based cutoffs used for robust distances; no published source is followed). Squared distances of
/// ordinal answers — even after the normal-score transformation — do not follow χ² in the far tail: with skewed
/// answer distributions the rare categories stretch the tail (in our study up to 0.45 % of attentive respondents
/// beyond the 0.1 % χ² cutoff), with symmetric ones it is shorter than χ². The factor measures this for the survey at
/// hand: latent rows are drawn from N(0, R) with R the polychoric correlations of the respondents kept by the robust
/// fit (Olsson 1979; pairwise; shrunk towards I until positive definite), cut into each item's observed categories
/// at the normal quantiles of its observed cumulative shares, scored with the same normal scores, and their squared
/// distances from the simulated scores' own mean and covariance taken; the factor is the simulated upper-α quantile
/// divided by χ²_p(1 − α), bounded to [<see cref="MinimumFactor"/>, <see cref="MaximumFactor"/>]. Every distance
/// cutoff is multiplied by it. The draws use a fixed internal seed (<see cref="Seed"/>), one stream per block, so
/// the factor does not depend on <c>--seed</c> or on the thread count.
/// </summary>
internal static class DiscretenessCalibration
{
    /// <summary>Fixed seed of the calibration draws.</summary>
    internal const ulong Seed = 0x4341_4C49_4252;

    /// <summary>Bounds of the factor.</summary>
    internal const double MinimumFactor = 0.7, MaximumFactor = 2.0;

    /// <summary>Most distinct answers per item for the calibration (ordinal items).</summary>
    internal const int MaxCategories = 11;

    /// <summary>Rows drawn per block.</summary>
    internal const int BlockRows = 8192;

    /// <summary>Rows drawn: 100 / α (about 100 draws beyond the quantile), between 50,000 and 1,000,000.</summary>
    internal static int Draws(double alpha) => (int)Math.Clamp(Math.Ceiling(100 / alpha), 50_000, 1_000_000);

    /// <summary>True when every item has between 2 and <see cref="MaxCategories"/> distinct answers.</summary>
    public static bool Applies(NormalScores scores)
    {
        for (int j = 0; j < scores.Items; j++)
        {
            int c = scores.Categories(j).Values.Length;
            if (c < 2 || c > MaxCategories) return false;
        }
        return true;
    }

    /// <summary>Polychoric correlations of <paramref name="rows"/> of <paramref name="data"/>, made positive definite by
    /// shrinking towards the identity; null when that fails.</summary>
    public static double[]? LatentCorrelation(ResponseMatrix data, IReadOnlyList<int> rows)
    {
        int p = data.ItemCount;
        var r = PolychoricCorrelation.Compute(data.SelectRespondents(rows), MissingDataHandling.Pairwise, -1);
        var flat = new double[p * p];
        for (double shrink = 0; shrink < 1; shrink = shrink == 0 ? 0.01 : shrink * 2)
        {
            for (int j = 0; j < p; j++)
                for (int k = 0; k < p; k++) flat[j * p + k] = j == k ? 1 : (1 - shrink) * (double.IsFinite(r[j, k]) ? r[j, k] : 0);
            if (ScreeningCholesky.TryFactor(flat, p) is not null) return flat;
        }
        return null;
    }

    /// <summary>The factor for upper-tail probability <paramref name="alpha"/>.</summary>
    public static double Factor(double[] latentCorrelation, NormalScores scores, double alpha)
    {
        int p = scores.Items;
        var chol = CholeskyLower(latentCorrelation, p);
        // Category cuts (normal quantiles of the cumulative shares) and the score of each category.
        var cuts = Cuts(scores);
        var score = new double[p][];
        for (int j = 0; j < p; j++) score[j] = scores.Categories(j).Values.Select(v => scores.Score(j, v)).ToArray();
        int draws = Draws(alpha);
        int blocks = (draws + BlockRows - 1) / BlockRows, n = blocks * BlockRows;
        // Pass 1: sums and cross-products per block (scores have mean ≈ 0 by construction, so the one-pass form is
        // accurate), added in block order. Pass 2 redraws the same rows (same streams) for the distances, so the
        // draws are never stored.
        var sums = new double[blocks][];
        Parallel.For(0, blocks, () => new double[BlockRows * p], (b, _, rows) =>
        {
            DrawBlock(b, chol, cuts, score, p, rows);
            var acc = new double[p + p * p];
            for (int r = 0; r < BlockRows; r++)
                for (int j = 0; j < p; j++)
                {
                    double v = rows[r * p + j];
                    acc[j] += v;
                    for (int k = 0; k <= j; k++) acc[p + j * p + k] += v * rows[r * p + k];
                }
            sums[b] = acc;
            return rows;
        }, _ => { });
        var total = new double[p + p * p];
        foreach (var acc in sums)
            for (int t = 0; t < total.Length; t++) total[t] += acc[t];
        var mean = new double[p];
        for (int j = 0; j < p; j++) mean[j] = total[j] / n;
        var cov = new double[p * p];
        for (int j = 0; j < p; j++)
            for (int k = 0; k <= j; k++) cov[j * p + k] = cov[k * p + j] = (total[p + j * p + k] - n * mean[j] * mean[k]) / (n - 1);
        var factor = ScreeningCholesky.TryFactor(cov, p);
        if (factor is null) return 1;
        var d2 = new double[n];
        Parallel.For(0, blocks, () => new double[BlockRows * p], (b, _, rows) =>
        {
            DrawBlock(b, chol, cuts, score, p, rows);
            var diff = new double[p];
            var work = new double[p];
            for (int r = 0; r < BlockRows; r++)
            {
                for (int j = 0; j < p; j++) diff[j] = rows[r * p + j] - mean[j];
                d2[b * BlockRows + r] = factor.QuadraticForm(diff, work);
            }
            return rows;
        }, _ => { });
        Array.Sort(d2);
        double q = d2[Math.Clamp((int)Math.Ceiling((1 - alpha) * n) - 1, 0, n - 1)];
        return Math.Clamp(q / ChiSquareTail.UpperQuantile(alpha, p), MinimumFactor, MaximumFactor);
    }

    /// <summary>Rows of block <paramref name="b"/>: latent N(0, R) draws cut into categories and scored (with
    /// <paramref name="categories"/>, each draw's category index is stored there too).</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    internal static void DrawBlock(int b, double[] chol, double[][] cuts, double[][] score, int p, double[] rows, int[]? categories = null, ulong seed = Seed)
    {
        var rng = RandomStream.ForTask(seed, b);
        Span<double> e = p <= 256 ? stackalloc double[p] : new double[p];
        for (int r = 0; r < BlockRows; r++)
        {
            for (int j = 0; j < p; j++) e[j] = rng.NextGaussian();
            for (int j = 0; j < p; j++)
            {
                double z = 0;
                for (int k = 0; k <= j; k++) z += chol[j * p + k] * e[k];
                int c = 0;
                var cj = cuts[j];
                while (c < cj.Length && z > cj[c]) c++;
                rows[r * p + j] = score[j][c];
                if (categories is not null) categories[r * p + j] = c;
            }
        }
    }

    /// <summary>Category cuts of every item: normal quantiles of its observed cumulative shares.</summary>
    internal static double[][] Cuts(NormalScores scores)
    {
        int p = scores.Items;
        var cuts = new double[p][];
        for (int j = 0; j < p; j++)
        {
            var (values, shares) = scores.Categories(j);
            cuts[j] = new double[values.Length - 1];
            double acc = 0;
            for (int t = 0; t < cuts[j].Length; t++) { acc += shares[t]; cuts[j][t] = Normal.InvCDF(0, 1, Math.Min(acc, 1 - 1e-15)); }
        }
        return cuts;
    }

    internal static double[] CholeskyLower(double[] a, int p)
    {
        var l = new double[p * p];
        for (int i = 0; i < p; i++)
            for (int j = 0; j <= i; j++)
            {
                double s = a[i * p + j];
                for (int t = 0; t < j; t++) s -= l[i * p + t] * l[j * p + t];
                l[i * p + j] = i == j ? Math.Sqrt(Math.Max(s, 0)) : s / l[j * p + j];
            }
        return l;
    }
}
