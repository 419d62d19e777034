using System.Runtime.CompilerServices;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Screening;

/// <summary>
/// Per-respondent log likelihood ratio of uniform random answering against the survey's fitted model (our own
/// statistic, built on published parts): <c>T = log L_uniform(x_O) − log L_model(x_O) = −Σ_{j∈O} log c_j − log P̂(x_O)</c>,
/// O the items the respondent answered (missing answers are dropped from both likelihoods), c_j the number of answer
/// categories of item j. Large T means the answers look more like uniform random answering than like an attentive
/// respondent of this survey. The model is a Gaussian copula of the fitted model: each ordinal answer is a latent
/// standard normal cut at the normal quantiles of the item's observed cumulative answer shares, the latent variables
/// correlated by R (the polychoric correlations of the respondents kept by the robust fit, as in
/// <see cref="DiscretenessCalibration"/>), so P̂(x_O) is the probability of a rectangle under N(0, R_OO), approximated by
/// <see cref="MendellElstonApproximation"/> (items in questionnaire order). Against uniform random answering with a
/// known true model, T is the most powerful statistic (the Neyman–Pearson likelihood ratio); here the model is
/// estimated and the rectangle probability approximated, so its cutoff is not taken from theory but from attentive
/// respondents simulated from the fitted model, each given the missing-answer pattern of one of the survey's respondents
/// (<see cref="Calibrate"/>).
/// <para>Fit (<see cref="Fit"/>): the first model takes the answer shares and the polychoric correlations of every
/// respondent who answered an item (at most <see cref="RespondentScreening.CalibrationRows"/> of them, taken
/// systematically). Respondents beyond that model's cutoff are then left out and the model is estimated again from the
/// rest (<see cref="Rounds"/> models in all): planted random responders otherwise flatten the answer shares and weaken
/// the correlations, which hides them. Only respondents beyond the cutoff are left out — about α / 2 of attentive
/// ones — so the model of attentive answering is hardly trimmed. Trimming more makes the fitted model too coherent and
/// attentive respondents are then flagged far above the intended rate: in our trials (48 skewed five-point items,
/// 960 respondents, attentive only) fitting R to the respondents kept by the robust distance (2–3 % left out) flagged
/// 0.15 % instead of 0.05 %, and leaving out 0.5 % by this index in each of two rounds flagged 0.35 %.
/// Answer shares are counted with ½ added to every category seen in the survey, so that no category seen becomes
/// impossible. The cutoff of the last model is the one used.</para>
/// </summary>
internal sealed class RandomAnsweringIndex
{
    /// <summary>Most items for which the index is computed: its cost grows with the cube of the items answered.</summary>
    internal const int MaxItems = 100;

    /// <summary>Share of the distance cutoff α the index's flag may add at most (our choice: the distance rule at α, this
    /// rule at α / 2 and the two run rules at α / 4 each keep all rules together within 2 α).</summary>
    internal const double ShareOfCutoff = 0.5;

    /// <summary>Models fitted in turn (the first on all respondents, each later one without the respondents beyond the
    /// previous cutoff).</summary>
    internal const int Rounds = 2;

    /// <summary>Fixed seed of the calibration draws (not that of <see cref="DiscretenessCalibration"/> or
    /// <see cref="RunLimitCalibration"/>).</summary>
    internal const ulong Seed = 0x5241_4E44_4F4D;

    /// <summary>A fitted index, its cutoff and how it was obtained.</summary>
    /// <param name="Index">The index of the last model.</param>
    /// <param name="Cutoff">Values above it are flagged.</param>
    /// <param name="SimulatedRate">Share of the simulated attentive respondents above the cutoff.</param>
    /// <param name="Draws">Simulated attentive respondents per model.</param>
    /// <param name="RespondentsUsed">Respondents the last model was estimated from (before the systematic cap).</param>
    internal sealed record Fitted(RandomAnsweringIndex Index, double Cutoff, double SimulatedRate, int Draws, int RespondentsUsed);

    private readonly int _p;
    private readonly double[] _r;
    private readonly double[][] _cuts;
    private readonly double[][] _values;
    private readonly double[] _logCategories;

    /// <param name="latentCorrelation">R, p × p row-major, positive definite.</param>
    /// <param name="scores">The items' categories and shares (the cuts are taken from these).</param>
    /// <param name="categories">Answer categories of each item for the uniform law (at least the categories observed).</param>
    public RandomAnsweringIndex(double[] latentCorrelation, NormalScores scores, IReadOnlyList<int> categories)
    {
        _p = scores.Items;
        _r = latentCorrelation;
        _cuts = DiscretenessCalibration.Cuts(scores);
        _values = Enumerable.Range(0, _p).Select(j => scores.Categories(j).Values).ToArray();
        _logCategories = Enumerable.Range(0, _p).Select(j => Math.Log(Math.Max(categories[j], _values[j].Length))).ToArray();
    }

    /// <summary>Items.</summary>
    public int Items => _p;

    /// <summary>Fits the index to the <paramref name="answering"/> respondents of <paramref name="data"/> (see the
    /// summary); null when a polychoric correlation matrix cannot be made positive definite.</summary>
    /// <param name="data">Analysed responses (ordinal, every item with 2 to <see cref="DiscretenessCalibration.MaxCategories"/> answers
    /// seen).</param>
    /// <param name="answering">Respondents who answered at least one item.</param>
    /// <param name="categories">Scale categories per item (0 = use the categories seen).</param>
    /// <param name="alpha">Distance cutoff α; the index's cutoff is set at <see cref="ShareOfCutoff"/> × α.</param>
    public static Fitted? Fit(ResponseMatrix data, IReadOnlyList<int> answering, IReadOnlyList<int> categories, double alpha)
    {
        int p = data.ItemCount;
        var patterns = Patterns(data, answering, DiscretenessCalibration.Draws(alpha));
        var used = answering;
        var row = new double[p];
        Fitted? fitted = null;
        var seen = ValueCounts(data, answering, row);
        for (int round = 0; round < Rounds; round++)
        {
            var counts = round == 0 ? seen : ValueCounts(data, used, row);
            // ½ added to every category seen (doubled counts + 1, so they stay whole).
            var smoothed = seen.Select((all, j) => all.Keys.ToDictionary(v => v, v => 2 * counts[j].GetValueOrDefault(v) + 1)).ToList();
            var scores = NormalScores.FromCounts(smoothed);
            var sample = used.Count > RespondentScreening.CalibrationRows
                ? Enumerable.Range(0, RespondentScreening.CalibrationRows)
                    .Select(t => used[(int)((long)t * used.Count / RespondentScreening.CalibrationRows)]).ToList()
                : used;
            var latent = DiscretenessCalibration.LatentCorrelation(data, sample);
            if (latent is null) return fitted;
            var index = new RandomAnsweringIndex(latent, scores, categories);
            var (cutoff, rate, draws) = index.Calibrate(patterns, ShareOfCutoff * alpha);
            fitted = new Fitted(index, cutoff, rate, draws, used.Count);
            if (round == Rounds - 1) break;
            var values = index.ComputeAll(data, answering);
            var next = new List<int>(answering.Count);
            for (int t = 0; t < answering.Count; t++)
                if (!(values[t] > cutoff)) next.Add(answering[t]);
            used = next;
        }
        return fitted;
    }

    /// <summary>Index of each of <paramref name="rows"/> (parallel over blocks; thread-count independent).</summary>
    internal double[] ComputeAll(ResponseMatrix data, IReadOnlyList<int> rows)
    {
        var values = new double[rows.Count];
        const int block = 256;
        Parallel.For(0, (rows.Count + block - 1) / block, () => (Row: new double[_p], Scratch: new Scratch(_p)), (b, _, s) =>
        {
            for (int t = b * block; t < Math.Min(rows.Count, (b + 1) * block); t++)
            {
                data.CopyRow(rows[t], s.Row);
                values[t] = Compute(s.Row, s.Scratch);
            }
            return s;
        }, _ => { });
        return values;
    }

    /// <summary>Per item, how often each value was answered by <paramref name="rows"/>.</summary>
    private static List<Dictionary<double, long>> ValueCounts(ResponseMatrix data, IReadOnlyList<int> rows, double[] row)
    {
        int p = data.ItemCount;
        var counts = Enumerable.Range(0, p).Select(_ => new Dictionary<double, long>()).ToList();
        foreach (int i in rows)
        {
            data.CopyRow(i, row);
            for (int j = 0; j < p; j++)
                if (!double.IsNaN(row[j])) counts[j][row[j]] = counts[j].GetValueOrDefault(row[j]) + 1;
        }
        return counts;
    }

    /// <summary>Answered-item bit masks (⌈p / 64⌉ words each) of at most <paramref name="most"/> of the
    /// <paramref name="answering"/> respondents, taken systematically in input order.</summary>
    internal static ulong[] Patterns(ResponseMatrix data, IReadOnlyList<int> answering, int most)
    {
        int p = data.ItemCount, words = (p + 63) / 64, k = Math.Min(answering.Count, most);
        var bits = new ulong[(long)k * words];
        var row = new double[p];
        for (int t = 0; t < k; t++)
        {
            data.CopyRow(answering[(int)((long)t * answering.Count / k)], row);
            for (int j = 0; j < p; j++)
                if (!double.IsNaN(row[j])) bits[(long)t * words + (j >> 6)] |= 1UL << (j & 63);
        }
        return bits;
    }

    /// <summary>Simulates attentive respondents from this model (latent N(0, R) rows cut into the categories, as in
    /// <see cref="DiscretenessCalibration"/>, with the seed <see cref="Seed"/>), gives simulated row t the missing-answer
    /// pattern number ⌊t K / N⌋ of the K in <paramref name="patterns"/>, and returns the smallest value exceeded by at
    /// most a share <paramref name="share"/> of the simulated indices, that share, and the number of draws.</summary>
    internal (double Cutoff, double Rate, int Draws) Calibrate(ulong[] patterns, double share)
    {
        int p = _p, words = (p + 63) / 64;
        long patternCount = patterns.Length / words;
        if (patternCount == 0) throw new ArgumentException("At least one missing-answer pattern is required.", nameof(patterns));
        var chol = DiscretenessCalibration.CholeskyLower(_r, p);
        var dummy = _cuts.Select(c => new double[c.Length + 1]).ToArray();
        const int blockRows = DiscretenessCalibration.BlockRows;
        int draws = DiscretenessCalibration.Draws(2 * share);
        int blocks = (draws + blockRows - 1) / blockRows, n = blocks * blockRows;
        var values = new double[n];
        Parallel.For(0, blocks, () => (Rows: new double[blockRows * p], Cat: new int[blockRows * p], Scratch: new Scratch(p)), (b, _, s) =>
        {
            DiscretenessCalibration.DrawBlock(b, chol, _cuts, dummy, p, s.Rows, s.Cat, Seed);
            for (int r = 0; r < blockRows; r++)
            {
                long t = (long)b * blockRows + r, pattern = t * patternCount / n;
                values[t] = ComputeFromCategories(s.Cat.AsSpan(r * p, p), patterns.AsSpan((int)(pattern * words), words), s.Scratch);
            }
            return s;
        }, _ => { });
        var v = values.Where(double.IsFinite).ToArray();
        Array.Sort(v);
        int allowed = (int)Math.Floor(share * v.Length);
        double cut = v[Math.Clamp(v.Length - 1 - allowed, 0, v.Length - 1)];
        int above = v.Length - 1 - Array.LastIndexOf(v, cut);
        return (cut, above / (double)v.Length, n);
    }

    /// <summary>Work space of one thread.</summary>
    internal sealed class Scratch(int p)
    {
        internal readonly double[] S = new double[p * p];
        internal readonly double[] Mean = new double[p];
        internal readonly double[] Lower = new double[p];
        internal readonly double[] Upper = new double[p];
        internal readonly int[] Index = new int[p];
    }

    /// <summary>T for one respondent's analysed answers (NaN = missing); NaN when nothing was answered.</summary>
    public double Compute(ReadOnlySpan<double> answers, Scratch scratch)
    {
        int m = 0;
        for (int j = 0; j < _p; j++)
        {
            double v = answers[j];
            if (double.IsNaN(v)) continue;
            int c = Array.BinarySearch(_values[j], v);
            if (c < 0) return double.NaN;
            scratch.Index[m] = j;
            scratch.Lower[m] = c == 0 ? double.NegativeInfinity : _cuts[j][c - 1];
            scratch.Upper[m] = c == _cuts[j].Length ? double.PositiveInfinity : _cuts[j][c];
            m++;
        }
        return Finish(m, scratch);
    }

    /// <summary>T for a simulated respondent given as category indices (ascending categories of each item), with
    /// only the items where <paramref name="answered"/> has its bit set.</summary>
    public double ComputeFromCategories(ReadOnlySpan<int> categories, ReadOnlySpan<ulong> answered, Scratch scratch)
    {
        int m = 0;
        for (int j = 0; j < _p; j++)
        {
            if ((answered[j >> 6] & (1UL << (j & 63))) == 0) continue;
            int c = categories[j];
            scratch.Index[m] = j;
            scratch.Lower[m] = c == 0 ? double.NegativeInfinity : _cuts[j][c - 1];
            scratch.Upper[m] = c == _cuts[j].Length ? double.PositiveInfinity : _cuts[j][c];
            m++;
        }
        return Finish(m, scratch);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private double Finish(int m, Scratch scratch)
    {
        if (m == 0) return double.NaN;
        var s = scratch.S.AsSpan(0, m * m);
        double logUniform = 0;
        for (int a = 0; a < m; a++)
        {
            int ja = scratch.Index[a];
            logUniform -= _logCategories[ja];
            for (int b = a; b < m; b++) s[a * m + b] = _r[ja * _p + scratch.Index[b]];
        }
        double logModel = MendellElstonApproximation.LogProbability(s, m, scratch.Lower, scratch.Upper, scratch.Mean);
        return logUniform - logModel;
    }
}
