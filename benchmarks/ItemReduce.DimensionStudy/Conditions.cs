using ItemReduce.Core.Randomness;
using ItemReduce.Simulation;

namespace ItemReduce.DimensionStudy;

/// <summary>One cell of the design: the structural conditions; category count, skew and cross-loadings vary
/// over the data sets inside a cell (see <see cref="Conditions.Spec"/>).</summary>
internal sealed record Cell(int Index, int Factors, int ItemsPerFactor, double FactorCorrelation, int Respondents)
{
    public string Label => FormattableString.Invariant($"k={Factors} ipf={ItemsPerFactor} r={FactorCorrelation:0.0} n={Respondents}");
}

/// <summary>The study design and the data-generating models.</summary>
internal static class Conditions
{
    public static readonly int[] FactorCounts = [1, 2, 3, 4, 6];
    public static readonly int[] ItemsPerFactor = [3, 5, 10];
    public static readonly double[] FactorCorrelations = [0.0, 0.3, 0.5];
    public static readonly int[] Respondents = [200, 500, 1000];
    public static readonly int[] CategoryCounts = [4, 5, 6, 7];

    /// <summary>All cells; with one factor the factor correlation does not apply (only r = 0).</summary>
    public static List<Cell> Cells()
    {
        var cells = new List<Cell>();
        foreach (int k in FactorCounts)
            foreach (int ipf in ItemsPerFactor)
                foreach (double r in FactorCorrelations)
                {
                    if (k == 1 && r != 0) continue;
                    foreach (int n in Respondents) cells.Add(new Cell(cells.Count, k, ipf, r, n));
                }
        return cells;
    }

    /// <summary>Training design of the combined rule, separate from the grid: every training survey draws its own
    /// conditions — factors 1–6 (including 5, absent from the grid), items per factor 3–10, factor correlation uniform
    /// on [0, .5], respondents log-uniform on [200, 1000] — and then, like a grid data set, 4–7 categories, symmetric or
    /// skewed answers and cross-loadings in a third of the surveys, from its own random stream.
    /// <para>The second part of the design (<paramref name="hard"/>) oversamples the conditions in which the published
    /// comparisons found the rules to disagree (Crawford et al. 2010; Garrido, Abad &amp; Ponsoda 2013): factors 2–6,
    /// 3–5 items per factor, factor correlation uniform on [.25, .5], respondents log-uniform on [200, 600].</para></summary>
    public static (Cell Cell, FactorModelSpec Spec) TrainingSurvey(bool hard, RandomStream rng)
    {
        int k = hard ? 2 + rng.NextInt(5) : 1 + rng.NextInt(6);
        int ipf = 3 + rng.NextInt(hard ? 3 : 8);
        double r = k == 1 ? 0 : hard ? 0.25 + 0.25 * rng.NextDouble() : 0.5 * rng.NextDouble();
        int n = (int)Math.Round(200 * Math.Exp(Math.Log(hard ? 3 : 5) * rng.NextDouble()));
        var cell = new Cell(-1, k, ipf, r, n);
        int d = rng.NextInt(24); // categories, skew and cross-loadings as data set d of a grid cell
        return (cell, Spec(cell, d, rng));
    }

    /// <summary>Data set <paramref name="d"/> of a cell: categories cycle through 4–7 (d mod 4), items are symmetric
    /// or skewed (⌊d/4⌋ mod 2), and every third block of eight data sets has cross-loadings (the first item of each
    /// factor also loads .3 on the next factor). Primary loadings are uniform on [.4, .7].</summary>
    public static FactorModelSpec Spec(Cell cell, int d, RandomStream rng)
    {
        int k = cell.Factors, per = cell.ItemsPerFactor, p = k * per;
        int categories = CategoryCounts[d % 4];
        bool skewed = (d / 4) % 2 == 1;
        bool cross = k > 1 && (d / 8) % 3 == 2;
        var itemFactor = new int[p];
        var loadings = new double[p];
        for (int j = 0; j < p; j++) { itemFactor[j] = j / per; loadings[j] = 0.4 + 0.3 * rng.NextDouble(); }
        var phi = new double[k, k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++) phi[a, b] = a == b ? 1 : cell.FactorCorrelation;
        var crossLoadings = new List<(int, int, double)>();
        if (cross)
            for (int f = 0; f < k; f++) crossLoadings.Add((f * per, (f + 1) % k, 0.3));
        return new FactorModelSpec
        {
            ItemFactor = itemFactor,
            Loadings = loadings,
            FactorCorrelations = phi,
            CrossLoadings = crossLoadings,
            Categories = categories,
            CategoryProbabilities = skewed ? Skewed(categories) : Symmetric(categories),
        };
    }

    /// <summary>Symmetric, bell-shaped: proportional to a normal density centred on the middle category.</summary>
    public static double[] Symmetric(int c)
    {
        var w = new double[c];
        for (int t = 0; t < c; t++) w[t] = Math.Exp(-0.5 * Math.Pow((t - (c - 1) / 2.0) / (c / 3.0), 2));
        return Normalise(w);
    }

    /// <summary>Skewed towards agreement: weights growing geometrically so that the top category holds about
    /// 40–45 % and the bottom one 3–6 % (skewness near −1).</summary>
    public static double[] Skewed(int c)
    {
        double ratio = Math.Pow(12.0, 1.0 / (c - 1)); // top / bottom weight = 12
        var w = new double[c];
        for (int t = 0; t < c; t++) w[t] = Math.Pow(ratio, t);
        return Normalise(w);
    }

    private static double[] Normalise(double[] w)
    {
        double s = w.Sum();
        return w.Select(x => x / s).ToArray();
    }
}
