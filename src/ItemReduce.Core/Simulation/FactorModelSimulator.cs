using ItemReduce.Core;
using ItemReduce.Core.Data;
using ItemReduce.Core.Randomness;
using MathNet.Numerics.Distributions;

namespace ItemReduce.Simulation;

/// <summary>
/// Draws survey data from a <see cref="FactorModelSpec"/> with a seeded <see cref="RandomStream"/>:
/// correlated normal factors (Cholesky of Φ), item latent scores, ordinal cut-points, reverse keying,
/// MCAR missingness and planted careless respondents. Deterministic for a given seed.
/// </summary>
public static class FactorModelSimulator
{
    /// <summary>Simulation settings besides the model.</summary>
    /// <param name="Respondents">Number of rows.</param>
    /// <param name="Seed">Random seed.</param>
    /// <param name="MissingRate">Probability that any one answer is missing (MCAR).</param>
    /// <param name="StraightLiners">Number of planted straight-line respondents.</param>
    /// <param name="RandomResponders">Number of planted uniform-random respondents.</param>
    /// <param name="ItemNames">Optional item names (default q01, q02, ...).</param>
    /// <param name="SubscaleNames">Optional subscale name per factor (default F1, F2, ...).</param>
    /// <param name="WideAlternators">Number of planted wide-alternation respondents (ordinal items only).</param>
    /// <param name="NarrowAlternators">Number of planted narrow-alternation respondents (ordinal items only).</param>
    /// <param name="MostlyUnanswered">Number of planted respondents who answer only about a quarter of the items.</param>
    /// <param name="ItemMissingRates">Optional probability that an answer to item j is missing (MCAR), replacing
    /// <paramref name="MissingRate"/> item by item.</param>
    /// <param name="Items">Optional item definitions (names, subscales, keying, range) used as given instead of generated
    /// ones; reverse-keyed answers are mirrored within their range.</param>
    public sealed record Settings(
        int Respondents,
        ulong Seed,
        double MissingRate = 0.0,
        int StraightLiners = 0,
        int RandomResponders = 0,
        IReadOnlyList<string>? ItemNames = null,
        IReadOnlyList<string>? SubscaleNames = null,
        int WideAlternators = 0,
        int NarrowAlternators = 0,
        int MostlyUnanswered = 0,
        IReadOnlyList<double>? ItemMissingRates = null,
        IReadOnlyList<ItemDefinition>? Items = null)
    {
        /// <summary>All planted careless respondents.</summary>
        public int Careless => StraightLiners + RandomResponders + WideAlternators + NarrowAlternators + MostlyUnanswered;
    }

    /// <summary>Generates a survey.</summary>
    public static SimulatedSurvey Generate(FactorModelSpec spec, Settings settings)
    {
        ArgumentNullException.ThrowIfNull(spec);
        ArgumentNullException.ThrowIfNull(settings);
        int n = settings.Respondents, p = spec.ItemFactor.Length, k = spec.FactorCount;
        if (settings.Careless > n)
            throw new ArgumentException("More careless respondents than respondents.");
        var rng = new RandomStream(settings.Seed);
        var chol = Cholesky(spec.FactorCorrelations ?? Identity(k));

        // Unique-variance weights per item.
        var uniq = new double[p];
        var cross = new double[p];
        var crossFactor = new int[p];
        Array.Fill(crossFactor, -1);
        foreach (var (item, factor, loading) in spec.CrossLoadings) { cross[item] = loading; crossFactor[item] = factor; }
        var pattern = spec.Pattern;
        if (pattern is not null && (pattern.GetLength(0) != p || pattern.GetLength(1) != k))
            throw new ArgumentException($"Pattern is {pattern.GetLength(0)} × {pattern.GetLength(1)}; expected {p} × {k}.");
        var phiAll = spec.FactorCorrelations ?? Identity(k);
        for (int j = 0; j < p; j++)
        {
            if (pattern is not null)
            {
                double cv = 0;
                for (int a = 0; a < k; a++)
                    for (int b = 0; b < k; b++) cv += pattern[j, a] * phiAll[a, b] * pattern[j, b];
                if (cv >= 1.0) throw new ArgumentException($"Item {j}: common variance {cv} ≥ 1.");
                uniq[j] = Math.Sqrt(1.0 - cv);
                continue;
            }
            double phi = crossFactor[j] >= 0 ? (spec.FactorCorrelations?[spec.ItemFactor[j], crossFactor[j]] ?? 0.0) : 0.0;
            double common = spec.Loadings[j] * spec.Loadings[j] + cross[j] * cross[j] + 2 * spec.Loadings[j] * cross[j] * phi;
            if (common >= 1.0) throw new ArgumentException($"Item {j}: common variance {common} ≥ 1.");
            uniq[j] = Math.Sqrt(1.0 - common);
        }

        int c = spec.Categories;
        double[] cuts = c > 0 ? CutPoints(spec.CategoryProbabilities ?? DefaultProbabilities(c)) : [];
        var scales = spec.ItemScales;
        if (scales is not null && scales.Count != p) throw new ArgumentException($"ItemScales has {scales.Count} entries; expected {p}.");
        if (settings.Items is { } defs && defs.Count != p) throw new ArgumentException($"Items has {defs.Count} entries; expected {p}.");
        if (settings.ItemMissingRates is { } rates && rates.Count != p) throw new ArgumentException($"ItemMissingRates has {rates.Count} entries; expected {p}.");
        // Per-item answers: values in the analysed direction, cut points, and the raw value of each category.
        double[][]? itemCuts = scales?.Select(sc => CutPoints(sc.Probabilities)).ToArray();
        double[][]? rawValues = scales is null ? null : RawValues(scales, spec.ReverseKeyed, settings.Items);
        if (scales is not null) c = 0; // ordinal per item: the shared category count is not used

        var careless = new CarelessKind[n];
        // Plant careless respondents at seeded random positions.
        var order = Enumerable.Range(0, n).ToArray();
        rng.Shuffle(order.AsSpan());
        for (int t = 0; t < settings.StraightLiners; t++) careless[order[t]] = CarelessKind.StraightLine;
        for (int t = 0; t < settings.RandomResponders; t++) careless[order[settings.StraightLiners + t]] = CarelessKind.UniformRandom;
        int next = settings.StraightLiners + settings.RandomResponders;
        foreach (var (kind, count) in new[] { (CarelessKind.WideAlternation, settings.WideAlternators),
                     (CarelessKind.NarrowAlternation, settings.NarrowAlternators), (CarelessKind.MostlyUnanswered, settings.MostlyUnanswered) })
        {
            if (count > 0 && c < 2 && scales is null && kind != CarelessKind.MostlyUnanswered)
                throw new ArgumentException($"{kind} respondents need ordinal items (Categories ≥ 2).");
            for (int t = 0; t < count; t++) careless[order[next++]] = kind;
        }

        var values = new double[(long)n * p];
        var z = new double[k];
        var f = new double[k];
        for (int i = 0; i < n; i++)
        {
            long o = (long)i * p;
            switch (careless[i])
            {
                case CarelessKind.StraightLine when rawValues is not null:
                    {
                        // The same position on every item's scale (the same box when the scales are alike).
                        double q = rng.NextDouble();
                        for (int j = 0; j < p; j++) values[o + j] = rawValues[j][(int)(q * rawValues[j].Length)];
                        break;
                    }
                case CarelessKind.UniformRandom when rawValues is not null:
                    for (int j = 0; j < p; j++) values[o + j] = rawValues[j][rng.NextInt(rawValues[j].Length)];
                    break;
                case CarelessKind.WideAlternation or CarelessKind.NarrowAlternation when rawValues is not null:
                    {
                        bool wide = careless[i] == CarelessKind.WideAlternation;
                        bool startHigh = rng.NextInt(2) == 1;
                        for (int j = 0; j < p; j++)
                        {
                            var r = rawValues[j];
                            int mid = (r.Length - 1) / 2;
                            int lo = wide ? 0 : Math.Max(0, mid - (r.Length % 2 == 1 ? 1 : 0)), hi = wide ? r.Length - 1 : Math.Min(r.Length - 1, mid + 1);
                            values[o + j] = (j % 2 == 0) == startHigh ? r[hi] : r[lo];
                        }
                        break;
                    }
                case CarelessKind.StraightLine:
                    {
                        double v = c > 0 ? 1 + rng.NextInt(c) : rng.NextGaussian();
                        for (int j = 0; j < p; j++) values[o + j] = v;
                        break;
                    }
                case CarelessKind.UniformRandom:
                    for (int j = 0; j < p; j++) values[o + j] = c > 0 ? 1 + rng.NextInt(c) : 3 * (2 * rng.NextDouble() - 1);
                    break;
                case CarelessKind.WideAlternation:
                case CarelessKind.NarrowAlternation:
                    {
                        // Wide: 1 and c. Narrow: one category either side of the midpoint, rounded outwards.
                        double mid = (1 + c) / 2.0;
                        bool wide = careless[i] == CarelessKind.WideAlternation;
                        double lo = wide ? 1 : Math.Floor(mid - 0.5), hi = wide ? c : Math.Ceiling(mid + 0.5);
                        bool startHigh = rng.NextInt(2) == 1;
                        for (int j = 0; j < p; j++) values[o + j] = (j % 2 == 0) == startHigh ? hi : lo;
                        break;
                    }
                default:
                    for (int a = 0; a < k; a++) z[a] = rng.NextGaussian();
                    for (int a = 0; a < k; a++)
                    {
                        double s = 0;
                        for (int b = 0; b <= a; b++) s += chol[a, b] * z[b];
                        f[a] = s;
                    }
                    for (int j = 0; j < p; j++)
                    {
                        double x;
                        if (pattern is not null)
                        {
                            x = uniq[j] * rng.NextGaussian();
                            for (int a = 0; a < k; a++) x += pattern[j, a] * f[a];
                        }
                        else
                        {
                            x = spec.Loadings[j] * f[spec.ItemFactor[j]] + uniq[j] * rng.NextGaussian();
                            if (crossFactor[j] >= 0) x += cross[j] * f[crossFactor[j]];
                        }
                        values[o + j] = itemCuts is not null ? rawValues![j][ScaledCategory(x, itemCuts[j], spec.ReverseKeyed?[j] ?? false)]
                            : c > 0 ? Categorize(x, cuts) : x;
                    }
                    break;
            }
            // Reverse-keyed items are mirrored only for model-generated answers: careless respondents'
            // raw answers are planted as given (a straight-liner ticks the same box on every item).
            if (c > 0 && careless[i] is (CarelessKind.None or CarelessKind.MostlyUnanswered) && spec.ReverseKeyed is { } rev)
                for (int j = 0; j < p; j++) if (rev[j]) values[o + j] = 1 + c - values[o + j];
            if (settings.ItemMissingRates is { } missing)
            {
                for (int j = 0; j < p; j++) if (missing[j] > 0 && rng.NextDouble() < missing[j]) values[o + j] = double.NaN;
            }
            else if (settings.MissingRate > 0)
                for (int j = 0; j < p; j++) if (rng.NextDouble() < settings.MissingRate) values[o + j] = double.NaN;
            if (careless[i] == CarelessKind.MostlyUnanswered)
            {
                // Keep about a quarter of the items (at least one), chosen at random; the rest are left blank.
                int keep = Math.Max(1, p / 4), kept = 0;
                for (int j = 0; j < p; j++)
                {
                    bool take = rng.NextInt(p - j) < keep - kept;
                    if (take) kept++;
                    else values[o + j] = double.NaN;
                }
            }
        }

        var items = new ItemDefinition[p];
        for (int j = 0; j < p && settings.Items is { } given; j++) items[j] = given[j];
        for (int j = 0; j < p && settings.Items is null; j++)
        {
            string name = settings.ItemNames?[j] ?? $"q{j + 1:00}";
            string sub = settings.SubscaleNames?[spec.ItemFactor[j]] ?? $"F{spec.ItemFactor[j] + 1}";
            bool reverse = spec.ReverseKeyed?[j] ?? false;
            items[j] = scales is not null ? new ItemDefinition(name, sub, reverse, scales[j].Values[0], scales[j].Values[^1], null)
                     : c > 0 ? new ItemDefinition(name, sub, reverse, 1, c, null)
                             : new ItemDefinition(name, sub, false, -1e6, 1e6, null);
        }
        var ids = Enumerable.Range(1, n).Select(i => $"R{i:00000}").ToArray();
        return new SimulatedSurvey(new ResponseMatrix(ids, items, values), new Codebook(items), spec, careless);
    }

    /// <summary>Index into the raw values of item answers (<see cref="RawValues"/>) of latent score <paramref name="x"/>:
    /// the analysed category, counted from the top for a reverse-keyed item (whose raw values are mirrored).</summary>
    private static int ScaledCategory(double x, double[] cuts, bool reverse)
    {
        int cat = 0;
        foreach (double t in cuts) if (x > t) cat++;
        return reverse ? cuts.Length - cat : cat;
    }

    /// <summary>Raw answer values of each item's categories, increasing: the analysed values, mirrored within the
    /// item's range for reverse-keyed items (so that index <c>c − 1 − t</c> holds the raw answer of analysed category t).</summary>
    private static double[][] RawValues(IReadOnlyList<ItemAnswerScale> scales, bool[]? reverse, IReadOnlyList<ItemDefinition>? items)
    {
        var raw = new double[scales.Count][];
        for (int j = 0; j < scales.Count; j++)
        {
            var v = scales[j].Values;
            if (v.Length == 0 || v.Length != scales[j].Probabilities.Length)
                throw new ArgumentException($"Item {j}: {v.Length} answer values and {scales[j].Probabilities.Length} shares.");
            if (reverse?[j] ?? false)
            {
                double sum = items is null ? v[0] + v[^1] : items[j].Min + items[j].Max;
                raw[j] = v.Select(x => sum - x).Reverse().ToArray();
            }
            else raw[j] = (double[])v.Clone();
        }
        return raw;
    }

    private static double Categorize(double x, double[] cuts)
    {
        int cat = 1;
        foreach (double t in cuts) if (x > t) cat++;
        return cat;
    }

    /// <summary>Normal quantiles of the cumulative category probabilities.</summary>
    private static double[] CutPoints(double[] probabilities)
    {
        double total = probabilities.Sum(), acc = 0;
        var cuts = new double[probabilities.Length - 1];
        for (int t = 0; t < cuts.Length; t++)
        {
            acc += probabilities[t] / total;
            cuts[t] = Normal.InvCDF(0, 1, acc);
        }
        return cuts;
    }

    private static double[] DefaultProbabilities(int c)
    {
        // Mildly bell-shaped, slightly favouring agreement, as Likert pilots usually are.
        var pr = new double[c];
        for (int t = 0; t < c; t++)
        {
            double mid = (c - 1) / 2.0 + 0.3;
            pr[t] = Math.Exp(-0.5 * Math.Pow((t - mid) / (c / 3.0), 2));
        }
        return pr;
    }

    private static double[,] Identity(int k)
    {
        var m = new double[k, k];
        for (int a = 0; a < k; a++) m[a, a] = 1;
        return m;
    }

    private static double[,] Cholesky(double[,] a)
    {
        int k = a.GetLength(0);
        var l = new double[k, k];
        for (int i = 0; i < k; i++)
        {
            for (int j = 0; j <= i; j++)
            {
                double s = a[i, j];
                for (int t = 0; t < j; t++) s -= l[i, t] * l[j, t];
                if (i == j)
                {
                    if (s <= 0) throw new DataConditionException("Factor correlation matrix is not positive definite.");
                    l[i, i] = Math.Sqrt(s);
                }
                else l[i, j] = s / l[j, j];
            }
        }
        return l;
    }
}
