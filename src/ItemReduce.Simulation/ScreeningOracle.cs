using ItemReduce.Core.Data;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Simulation;

/// <summary>
/// Yardsticks for the recall of uniform-random responders in one design of <see cref="ScreeningStudy"/>: tests that
/// know the true population model, with their threshold taken from simulated attentive respondents of the same
/// design (same items, categories, answer distribution and missing rate), so that their false-flag rate is the one
/// asked for up to Monte Carlo error, which is measured on a second, independent attentive sample.
/// <list type="bullet">
/// <item><b>Likelihood ratio</b> (<see cref="OrdinalLikelihoodRatio"/>): the most powerful test of uniform-random
/// answers against the true ordinal factor model — no screening rule can have higher recall at the same false-flag
/// rate against this kind of careless answering.</item>
/// <item><b>Known-model distance</b>: the squared Mahalanobis distance of the items' population normal scores
/// (Φ⁻¹ of the mid-cumulative share of each category, the large-sample value of the rank-based normal score the
/// screening uses) with the population covariance of those scores (from a large attentive sample), on the items
/// answered, ranked across patterns by the Wilson–Hilferty normal approximation of its χ² (df = items answered)
/// value. It shows what the distance statistic itself can reach when location, scatter and cutoff are perfect.</item>
/// <item><b>Copula approximation</b>: the likelihood ratio with P_model(x) replaced by a Gaussian copula at the category
/// midpoints, <c>−log P(x) ≈ −Σ log p_j(x_j) + ½ (D² − Σ z_j²) + ½ log |Σ_O|</c> (p_j the category shares, z the normal
/// scores, D² and Σ_O as in the known-model distance; our approximation). Every ingredient could be estimated from
/// the data, so it shows how much of the likelihood ratio's advantage a data-based statistic of this form could
/// recover; it is not used by the screening.</item>
/// </list>
/// </summary>
public static class ScreeningOracle
{
    /// <summary>Recall of random responders and measured false-flag rate of one yardstick at one target rate.</summary>
    public sealed record Point(double TargetRate, double FalseFlagRate, double Recall);

    /// <summary>Both statistics on the three simulated samples (threshold, check, random) of one design.</summary>
    public sealed class Result
    {
        private readonly (double[] Lr, double[] D, double[] C) threshold, check, random;

        internal Result((double[], double[], double[]) threshold, (double[], double[], double[]) check, (double[], double[], double[]) random, int nullRows, int randomRows)
        {
            this.threshold = threshold;
            this.check = check;
            this.random = random;
            NullRows = nullRows;
            RandomRows = randomRows;
        }

        /// <summary>Attentive respondents in each null sample.</summary>
        public int NullRows { get; }

        /// <summary>Uniform-random respondents.</summary>
        public int RandomRows { get; }

        /// <summary>Likelihood-ratio yardstick at false-flag rate <paramref name="rate"/>.</summary>
        public Point LikelihoodRatio(double rate) => At(threshold.Lr, check.Lr, random.Lr, rate);

        /// <summary>Known-model distance yardstick at false-flag rate <paramref name="rate"/>.</summary>
        public Point KnownModelDistance(double rate) => At(threshold.D, check.D, random.D, rate);

        /// <summary>Known-model Gaussian-copula approximation of the likelihood ratio at false-flag rate <paramref name="rate"/>
        /// (see <see cref="ScreeningOracle"/>).</summary>
        public Point CopulaApproximation(double rate) => At(threshold.C, check.C, random.C, rate);

        private static Point At(double[] nul, double[] chk, double[] alt, double rate)
        {
            double cut = UpperQuantile(nul, rate);
            return new Point(rate, Share(chk, cut), Share(alt, cut));
        }
    }

    /// <summary>Computes both statistics for the samples of condition <paramref name="c"/>.</summary>
    /// <param name="c">Design cell (only items, categories, skew and missing rate matter).</param>
    /// <param name="seed">Seed of the simulated samples.</param>
    /// <param name="nullRows">Attentive respondents in each of the two null samples (threshold, check).</param>
    /// <param name="randomRows">Uniform-random respondents.</param>
    public static Result Run(ScreeningStudy.Condition c, ulong seed, int nullRows = 100_000, int randomRows = 20_000)
    {
        ArgumentNullException.ThrowIfNull(c);
        var spec = ScreeningStudy.Model(c);
        var lr = new OrdinalLikelihoodRatio(spec);
        var scores = PopulationScores(spec);
        var cov = Covariance(Sample(spec, 0.0, nullRows, 0, seed + 1), scores, spec.ItemFactor.Length);
        var known = new KnownDistance(cov);
        var threshold = Sample(spec, c.MissingRate, nullRows, 0, seed + 2);
        var check = Sample(spec, c.MissingRate, nullRows, 0, seed + 3);
        var random = Sample(spec, c.MissingRate, randomRows, randomRows, seed + 4);
        var logShare = LogShares(spec);
        (double[] Lr, double[] D, double[] C) Stats(ResponseMatrix m)
        {
            int n = m.RespondentCount, p = m.ItemCount;
            var a = new double[n];
            var d = new double[n];
            var cop = new double[n];
            Parallel.For(0, n, () => (Row: new double[p], Z: new double[p], Work: new double[p * p + 2 * p]), (i, _, s) =>
            {
                m.CopyRow(i, s.Row);
                a[i] = lr.Statistic(s.Row);
                for (int j = 0; j < p; j++) s.Z[j] = double.IsNaN(s.Row[j]) ? double.NaN : scores[j][(int)s.Row[j] - 1];
                (d[i], double d2, double logDet) = known.Distance(s.Z, s.Work);
                // −log P(x) ≈ −Σ log p_j(x_j) + ½ (d² − Σ z_j²) + ½ log|Σ_O| (Gaussian copula, scores at category midpoints).
                double c = 0, sz = 0;
                int answered = 0;
                for (int j = 0; j < p; j++)
                {
                    if (double.IsNaN(s.Z[j])) continue;
                    answered++;
                    c -= logShare[(int)s.Row[j] - 1];
                    sz += s.Z[j] * s.Z[j];
                }
                cop[i] = answered == 0 ? double.NaN : c - answered * Math.Log(spec.Categories) + 0.5 * (d2 - sz) + 0.5 * logDet;
                return s;
            }, _ => { });
            return (a, d, cop);
        }
        return new Result(Stats(threshold), Stats(check), Stats(random), nullRows, randomRows);
    }

    /// <summary>Reverse-scored respondents of the model (all attentive when <paramref name="random"/> is 0, all uniform-random otherwise).</summary>
    private static ResponseMatrix Sample(FactorModelSpec spec, double missing, int n, int random, ulong seed)
    {
        var s = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, seed, missing, RandomResponders: random));
        return ReverseScoring.Apply(s.Responses);
    }

    /// <summary>log P(category t) of the model's answer distribution (the same for every item).</summary>
    private static double[] LogShares(FactorModelSpec spec)
    {
        var pr = spec.CategoryProbabilities!;
        double total = pr.Sum();
        return pr.Select(v => Math.Log(v / total)).ToArray();
    }

    /// <summary>Per item, the population normal score of each category: Φ⁻¹(F(t − 1) + P(t) / 2).</summary>
    private static double[][] PopulationScores(FactorModelSpec spec)
    {
        var pr = spec.CategoryProbabilities!;
        double total = pr.Sum(), acc = 0;
        var v = new double[pr.Length];
        for (int t = 0; t < pr.Length; t++)
        {
            v[t] = Normal.InvCDF(0, 1, acc + pr[t] / total / 2);
            acc += pr[t] / total;
        }
        return Enumerable.Repeat(v, spec.ItemFactor.Length).ToArray();
    }

    private static double[,] Covariance(ResponseMatrix m, double[][] scores, int p)
    {
        int n = m.RespondentCount;
        var mean = new double[p];
        var cov = new double[p, p];
        var row = new double[p];
        var z = new double[p];
        for (int i = 0; i < n; i++)
        {
            m.CopyRow(i, row);
            for (int j = 0; j < p; j++) z[j] = scores[j][(int)row[j] - 1];
            for (int j = 0; j < p; j++) mean[j] += z[j];
            for (int j = 0; j < p; j++)
                for (int l = 0; l <= j; l++) cov[j, l] += z[j] * z[l];
        }
        for (int j = 0; j < p; j++) mean[j] /= n;
        for (int j = 0; j < p; j++)
            for (int l = 0; l <= j; l++) cov[l, j] = cov[j, l] = cov[j, l] / n - mean[j] * mean[l];
        // Population normal scores have mean 0 up to sampling error; centre at the sample mean.
        var withMean = new double[p + 1, p];
        for (int j = 0; j < p; j++) { withMean[p, j] = mean[j]; for (int l = 0; l < p; l++) withMean[j, l] = cov[j, l]; }
        return withMean;
    }

    /// <summary>Squared distance on the answered items through a Cholesky factor of the answered sub-matrix.</summary>
    private sealed class KnownDistance(double[,] covWithMean)
    {
        private readonly int p = covWithMean.GetLength(1);

        /// <summary>Wilson–Hilferty z of the squared distance, the squared distance and log |Σ_O|.</summary>
        public (double WilsonHilferty, double D2, double LogDet) Distance(double[] z, double[] work)
        {
            int m = 0;
            Span<int> idx = stackalloc int[p];
            for (int j = 0; j < p; j++) if (!double.IsNaN(z[j])) idx[m++] = j;
            if (m == 0) return (double.NaN, double.NaN, double.NaN);
            // work[0 .. m*m) = lower Cholesky factor, then the centred vector and its solve.
            for (int a = 0; a < m; a++)
                for (int b = 0; b <= a; b++)
                {
                    double s = covWithMean[idx[a], idx[b]];
                    for (int t = 0; t < b; t++) s -= work[a * m + t] * work[b * m + t];
                    work[a * m + b] = a == b ? Math.Sqrt(s) : s / work[b * m + b];
                }
            double d2 = 0;
            for (int a = 0; a < m; a++)
            {
                double s = z[idx[a]] - covWithMean[p, idx[a]];
                for (int t = 0; t < a; t++) s -= work[a * m + t] * work[p * p + t];
                s /= work[a * m + a];
                work[p * p + a] = s;
                d2 += s * s;
            }
            double v = 2.0 / (9 * m), logDet = 0;
            for (int a = 0; a < m; a++) logDet += 2 * Math.Log(work[a * m + a]);
            return ((Math.Cbrt(d2 / m) - (1 - v)) / Math.Sqrt(v), d2, logDet);
        }
    }

    /// <summary>The value exceeded by a share <paramref name="rate"/> of <paramref name="values"/> (NaN ignored).</summary>
    private static double UpperQuantile(double[] values, double rate)
    {
        var v = values.Where(x => !double.IsNaN(x)).OrderByDescending(x => x).ToArray();
        int k = Math.Clamp((int)Math.Round(rate * v.Length), 1, v.Length - 1);
        return (v[k - 1] + v[k]) / 2;
    }

    private static double Share(double[] values, double cut)
    {
        int n = 0, above = 0;
        foreach (double x in values)
        {
            if (double.IsNaN(x)) continue;
            n++;
            if (x > cut) above++;
        }
        return n == 0 ? double.NaN : above / (double)n;
    }
}
