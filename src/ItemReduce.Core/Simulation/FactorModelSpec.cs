namespace ItemReduce.Simulation;

// The generator lives in Core (folder Simulation) so that the pipeline's self-check can use it; it keeps the namespace
// ItemReduce.Simulation so that the studies, tools and tests that use it did not change.

/// <summary>One item's answer scale for <see cref="FactorModelSpec.ItemScales"/>: the answer values in increasing order
/// (in the analysed, reverse-scored direction) and the share of answers of each (normalised to sum 1).</summary>
/// <param name="Values">Distinct answer values, increasing.</param>
/// <param name="Probabilities">Share of each value (same length, non-negative, positive sum).</param>
public sealed record ItemAnswerScale(double[] Values, double[] Probabilities);

/// <summary>
/// A planted common-factor model for simulated Likert data with known truth.
/// Item j loads <see cref="Loadings"/>[j] on factor <see cref="ItemFactor"/>[j] only (simple structure,
/// unless <see cref="CrossLoadings"/> adds a secondary loading); latent responses are
/// <c>x*_j = λ_j f_g(j) + c_j f_h(j) + sqrt(1 − λ_j² − c_j² − 2 λ_j c_j φ) ε_j</c> and are cut into
/// <see cref="Categories"/> ordered categories at normal quantiles of <see cref="CategoryProbabilities"/>.
/// </summary>
public sealed record FactorModelSpec
{
    /// <summary>Factor index (0-based) of each item.</summary>
    public required int[] ItemFactor { get; init; }

    /// <summary>Primary loading of each item, |λ| &lt; 1.</summary>
    public required double[] Loadings { get; init; }

    /// <summary>Optional secondary loadings: (item, factor, loading).</summary>
    public IReadOnlyList<(int Item, int Factor, double Loading)> CrossLoadings { get; init; } = [];

    /// <summary>Factor correlation matrix (k × k); identity when null.</summary>
    public double[,]? FactorCorrelations { get; init; }

    /// <summary>Number of response categories (scored 1..Categories). 0 = keep continuous latent scores.</summary>
    public int Categories { get; init; } = 5;

    /// <summary>Marginal category probabilities (length Categories); uniform-ish default when null.</summary>
    public double[]? CategoryProbabilities { get; init; }

    /// <summary>Optional full pattern matrix (p × k). When set it replaces <see cref="Loadings"/> and
    /// <see cref="CrossLoadings"/> in the latent scores: <c>x*_j = Σ_a P[j,a] f_a + sqrt(1 − P_j' Φ P_j) ε_j</c>
    /// (<see cref="ItemFactor"/> still names each item's subscale).</summary>
    public double[,]? Pattern { get; init; }

    /// <summary>Optional answer scale of each item (length p). When set, item j is cut at the normal quantiles of its own
    /// cumulative shares into its own values instead of <see cref="Categories"/>/<see cref="CategoryProbabilities"/>;
    /// reverse-keyed items are mirrored within their codebook range (<see cref="FactorModelSimulator.Settings.Items"/>)
    /// or, without one, within their lowest and highest value.</summary>
    public IReadOnlyList<ItemAnswerScale>? ItemScales { get; init; }

    /// <summary>Reverse-keyed items: their raw answers are mirrored (min + max − x) so that a codebook
    /// flag restores the model's direction.</summary>
    public bool[]? ReverseKeyed { get; init; }

    /// <summary>Number of factors.</summary>
    public int FactorCount => ItemFactor.Length == 0 ? 0 : ItemFactor.Max() + 1;

    /// <summary>Simple structure: <paramref name="factors"/> factors × <paramref name="itemsPerFactor"/> items,
    /// all loading <paramref name="loading"/>, factors correlated <paramref name="factorCorrelation"/>.</summary>
    public static FactorModelSpec Simple(int factors, int itemsPerFactor, double loading, double factorCorrelation = 0.0, int categories = 5)
    {
        int p = factors * itemsPerFactor;
        var f = new int[p];
        var l = new double[p];
        for (int j = 0; j < p; j++) { f[j] = j / itemsPerFactor; l[j] = loading; }
        var phi = new double[factors, factors];
        for (int a = 0; a < factors; a++)
            for (int b = 0; b < factors; b++) phi[a, b] = a == b ? 1.0 : factorCorrelation;
        return new FactorModelSpec { ItemFactor = f, Loadings = l, FactorCorrelations = phi, Categories = categories };
    }
}
