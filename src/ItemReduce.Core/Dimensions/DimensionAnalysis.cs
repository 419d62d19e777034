using System.Globalization;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;

namespace ItemReduce.Core.Dimensions;

/// <summary>
/// Façade of the dimensions stage: how many dimensions do the items measure? Steps: correlation matrix
/// (Pearson or polychoric, pairwise or listwise) → positive-definiteness check and smoothing
/// (<see cref="NearestCorrelationMatrix"/>) → eigenvalues of R and of the reduced matrix
/// (<see cref="SquaredMultipleCorrelation"/>) → <see cref="ParallelAnalysis"/>, <see cref="VelicerMap"/>,
/// <see cref="KaiserCriterion"/> → factorability (<see cref="KaiserMeyerOlkin"/>,
/// <see cref="BartlettSphericityTest"/>) → the retained count from the chosen rule.
/// </summary>
public static class DimensionAnalysis
{
    /// <summary>Runs the stage.</summary>
    /// <param name="data">Reverse-scored responses of the usable items (no zero-variance or empty items), n × p, p ≥ 2.</param>
    /// <param name="options">Settings.</param>
    /// <exception cref="ArgumentException">Invalid options, too few items or respondents, or a pair of items
    /// with fewer than 3 joint answers (its correlation is undefined).</exception>
    /// <param name="progress">Optional callback told how many parallel-analysis replicates are done.</param>
    public static DimensionResult Run(ResponseMatrix data, DimensionOptions options, Action<string>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(options);
        Validate(data, options);
        var warnings = new WarningList("dimensions");
        int p = data.ItemCount;

        var raw = options.Correlation.Compute(data, options.MaxDegreeOfParallelism);
        CheckDefined(raw, data);
        int nEff = EffectiveRespondents(data, options, warnings);
        if (nEff <= p + 1)
            throw new DataConditionException(
                $"Too few respondents for {p} items: {nEff} usable (at least {p + 2} needed; in practice several times the number of items).", nameof(data));

        var smoothing = NearestCorrelationMatrix.Find(raw, options.EigenvalueFloor);
        if (smoothing.Adjusted)
            warnings.Add("matrix-smoothed", string.Create(CultureInfo.InvariantCulture,
                $"The {options.Correlation.KindName} correlation matrix was not positive definite (smallest eigenvalue {smoothing.MinEigenvalueBefore:G3}); it was replaced by the nearest valid correlation matrix, changing no correlation by more than {smoothing.MaxAbsoluteChange:F3}."));
        var r = smoothing.Matrix;

        var eigen = LinearAlgebra.SymmetricEigensolver.Eigenvalues(r);
        double[]? smc = null, reducedEigen = null;
        if (options.IncludeReducedMatrix)
        {
            smc = SquaredMultipleCorrelation.Compute(r);
            var reduced = (double[,])r.Clone();
            for (int j = 0; j < p; j++) reduced[j, j] = smc[j];
            reducedEigen = LinearAlgebra.SymmetricEigensolver.Eigenvalues(reduced);
        }

        var reference = Reference(data, options, nEff, progress);
        var map = VelicerMap.Compute(r);
        int kaiser = KaiserCriterion.Count(eigen);
        var ekcReference = EmpiricalKaiserCriterion.References(eigen, nEff);
        // Comparison data and the Hull method both need k-factor minimum-residual fits of R; each k is fitted once.
        var fits = new MinimumResidualFits(r);
        var comparison = p >= 3 ? Dimensions.ComparisonData.Run(r, eigen, nEff, ToComparisonOptions(options), fits.Loadings) : null;
        int parallelCount = ParallelAnalysis.RetainedCount(eigen, reference.Percentile);
        int? reducedCount = reducedEigen is null || reference.ReducedPercentile is null ? null : ParallelAnalysis.RetainedCount(reducedEigen, reference.ReducedPercentile);
        var hull = p >= 3 ? HullMethod.Run(r, (reducedCount ?? parallelCount) + 1, fits.Loadings) : null;
        var counts = new RuleCounts(
            parallelCount,
            reducedCount,
            map.Count, map.RevisedCount, kaiser,
            ParallelAnalysis.RetainedCount(eigen, ekcReference),
            comparison?.Count)
        {
            ParallelMean = ParallelAnalysis.RetainedCount(eigen, reference.Mean),
            ParallelReducedMean = reducedEigen is null || reference.ReducedMean is null ? null : ParallelAnalysis.RetainedCount(reducedEigen, reference.ReducedMean),
            Hull = hull?.Count,
        };
        CombinedRetentionResult? combined = null;
        if (reducedCount is int m && reducedEigen is not null && p >= 3)
        {
            combined = CombinedRetention.Decide(
                CombinedRetention.Features(counts, m, eigen, reducedEigen, reference, comparison, nEff), m, p);
            counts = counts with { Combined = combined.Count };
        }
        var kmo = KaiserMeyerOlkin.Compute(r);
        var bartlett = BartlettSphericityTest.Compute(r, nEff);

        var (retained, rule, reason) = Decide(options, counts, reference);
        AddInterpretationNotes(warnings, options, counts, kmo, bartlett, data);

        return new DimensionResult
        {
            CorrelationKind = options.Correlation.Kind,
            MissingData = options.Correlation.MissingData,
            CorrelationMatrix = r,
            Smoothing = smoothing,
            EffectiveRespondents = nEff,
            Eigenvalues = eigen,
            SquaredMultipleCorrelations = smc,
            ReducedEigenvalues = reducedEigen,
            Reference = reference,
            ByRule = counts,
            Retained = retained,
            RuleUsed = rule,
            Reason = reason,
            Kmo = kmo.Overall,
            Msa = kmo.PerItem,
            Bartlett = bartlett,
            EmpiricalKaiserReferences = ekcReference,
            ComparisonData = comparison,
            Hull = hull,
            Combined = combined,
            MapCurve = map.Curve,
            MapRevisedCurve = map.RevisedCurve,
            Warnings = warnings,
        };
    }

    private static void Validate(ResponseMatrix data, DimensionOptions o)
    {
        if (data.ItemCount < 2) throw new DataConditionException($"At least 2 items are needed, got {data.ItemCount}.", nameof(data));
        if (o.FactorsRule == FactorsRule.Fixed || !Enum.IsDefined(o.FactorsRule))
            throw new ArgumentException($"FactorsRule must be ParallelReduced, Parallel, Map, Kaiser, EmpiricalKaiser, ComparisonData, Hull or Combined, got {o.FactorsRule}; use FixedFactors to fix the count.", nameof(o));
        if (o.FactorsRule == FactorsRule.ParallelReduced && !o.IncludeReducedMatrix)
            throw new ArgumentException("FactorsRule ParallelReduced needs IncludeReducedMatrix = true.", nameof(o));
        if (o.FactorsRule == FactorsRule.Combined && !o.IncludeReducedMatrix)
            throw new ArgumentException("FactorsRule Combined needs IncludeReducedMatrix = true.", nameof(o));
        if (o.FactorsRule is FactorsRule.ComparisonData or FactorsRule.Hull or FactorsRule.Combined && data.ItemCount < 3)
            throw new DataConditionException($"Comparison data, the Hull method and the combined rule need at least 3 items, got {data.ItemCount}.", nameof(o));
        if (o.FixedFactors is int k && (k < 1 || k > data.ItemCount))
            throw new DataConditionException($"FixedFactors must lie in [1, {data.ItemCount}] (the number of items), got {k}.", nameof(o));
        if (!(o.EigenvalueFloor > 0 && o.EigenvalueFloor <= 0.5))
            throw new ArgumentException($"EigenvalueFloor must lie in (0, 0.5], got {o.EigenvalueFloor}.", nameof(o));
        ToParallelOptions(o).Validate();
    }

    private static ParallelAnalysisOptions ToParallelOptions(DimensionOptions o) => new()
    {
        Replicates = o.Replicates,
        Percentile = o.Percentile,
        Reference = o.Reference,
        Seed = o.Seed,
        IncludeReducedMatrix = o.IncludeReducedMatrix,
        MaxDegreeOfParallelism = o.MaxDegreeOfParallelism,
    };

    /// <summary>Comparison-data settings: samples per population = a quarter of the parallel-analysis replicates
    /// (at least 20), so the default 1000 gives 250; same seed and thread cap.</summary>
    internal static ComparisonDataOptions ToComparisonOptions(DimensionOptions o) => new()
    {
        Samples = Math.Max(20, o.Replicates / 4),
        Seed = o.Seed,
        MaxDegreeOfParallelism = o.MaxDegreeOfParallelism,
    };

    private static void CheckDefined(double[,] r, ResponseMatrix data)
    {
        int p = r.GetLength(0);
        for (int j = 0; j < p; j++)
            for (int k = 0; k < j; k++)
                if (double.IsNaN(r[j, k]))
                    throw new DataConditionException(
                        $"The correlation of items '{data.Items[k].Name}' and '{data.Items[j].Name}' is undefined (fewer than 3 respondents answered both, or one of them does not vary among those who did).",
                        nameof(data));
    }

    /// <summary>n for the normal reference and Bartlett's test (see <see cref="DimensionResult.EffectiveRespondents"/>).</summary>
    internal static int EffectiveRespondents(ResponseMatrix data, DimensionOptions o, WarningList warnings)
    {
        int n = data.RespondentCount;
        if (!data.HasMissing()) return n;
        int nEff = o.Correlation.EffectiveRespondents(data);
        if (o.Correlation.MissingData == MissingDataHandling.Listwise)
        {
            warnings.Add("listwise-deletion", $"Listwise deletion: {n - nEff} of {n} respondents with at least one missing answer were left out of the correlation-based analyses.");
            return nEff;
        }
        warnings.Add("pairwise-effective-n", $"Missing answers were handled pairwise; the random reference, Bartlett's test and the factor solutions use an effective sample size of {nEff} respondents (harmonic mean of the pairwise counts).");
        return nEff;
    }

    private static ParallelAnalysisReference Reference(ResponseMatrix data, DimensionOptions o, int nEff, Action<string>? progress)
    {
        var po = ToParallelOptions(o);
        // Reported every tenth of the replicates, the permutation replicates every hundredth from 0 (a progress view shows it only when the step
        // takes long).
        if (progress is not null)
            po = po with { ReplicatesDone = k => progress(string.Create(CultureInfo.InvariantCulture, $"parallel analysis: {k} of {po.Replicates} replicates")) };
        if (o.Reference == ReferenceKind.Permutation)
            return ParallelAnalysis.PermutationReference(data, o.Correlation, po);
        if (o.Reference == ReferenceKind.Ordinal)
            return ParallelAnalysis.OrdinalReference(nEff, PolychoricNullDistribution.InformationFactors(data), po);
        return ParallelAnalysis.NormalReference(nEff, data.ItemCount, po);
    }

    private static (int Retained, FactorsRule Rule, string Reason) Decide(DimensionOptions o, RuleCounts c, ParallelAnalysisReference reference)
    {
        var ci = CultureInfo.InvariantCulture;
        if (o.FixedFactors is int k)
            return (k, FactorsRule.Fixed, string.Create(ci, $"The number of dimensions was set to {k} in the settings; the rules below are shown for comparison."));
        string source = reference.Kind switch
        {
            ReferenceKind.Permutation => "copies of the data with each item shuffled separately",
            ReferenceKind.Ordinal => "sets of polychoric correlations of unrelated items with the observed answer distributions",
            _ => "sets of uncorrelated normal data of the same size",
        };
        return o.FactorsRule switch
        {
            FactorsRule.Map => (c.Map, FactorsRule.Map, string.Create(ci,
                $"{Count(c.Map)} kept because the average squared partial correlation between items is lowest once {c.Map} component{(c.Map == 1 ? " is" : "s are")} removed (minimum average partial test).")),
            FactorsRule.ParallelReduced when c.ParallelReduced is int pr => (pr, FactorsRule.ParallelReduced, string.Create(ci,
                $"{Count(pr)} kept because {(pr == 1 ? "the first eigenvalue" : $"the first {pr} eigenvalues")} of the reduced correlation matrix (squared multiple correlations on the diagonal, the common-factor version of parallel analysis) {(pr == 1 ? "is" : "are")} larger than the {Ordinal(reference.PercentileLevel)} percentile of the same eigenvalues in {reference.Replicates} {source}.")),
            FactorsRule.EmpiricalKaiser => (c.EmpiricalKaiser, FactorsRule.EmpiricalKaiser, string.Create(ci,
                $"{Count(c.EmpiricalKaiser)} kept because {(c.EmpiricalKaiser == 1 ? "the first eigenvalue is" : $"the first {c.EmpiricalKaiser} eigenvalues are")} above the reference that random data of this size would reach after the larger ones (empirical Kaiser criterion).")),
            FactorsRule.ComparisonData when c.ComparisonData is int cd => (cd, FactorsRule.ComparisonData, string.Create(ci,
                $"{Count(cd)} kept because simulated data with {cd + 1} factor{(cd + 1 == 1 ? "" : "s")} did not reproduce the observed eigenvalues significantly better than data with {cd} (comparison data).")),
            FactorsRule.Hull when c.Hull is int h => (h, FactorsRule.Hull, string.Create(ci,
                $"{Count(h)} kept because the fit of the {h}-factor solution gains most against its added complexity among the solutions on the convex hull of fit versus free parameters (Hull method).")),
            FactorsRule.Combined when c.Combined is int cb && c.ParallelReduced is int start => (cb, FactorsRule.Combined, string.Create(ci,
                $"{Count(cb)} kept by the combined rule: a model fitted to invented surveys of known structure read what the single rules found here (reduced-matrix parallel analysis {start}, principal-component parallel analysis {c.Parallel}, comparison data {(c.ComparisonData is int cdc ? cdc.ToString(ci) : "not run")}, empirical Kaiser criterion {c.EmpiricalKaiser}) and how far the eigenvalues stand out from random data, and {(cb == start ? "kept the reduced-matrix count" : $"moved the reduced-matrix count of {start} to {cb}")}.")),
            FactorsRule.Kaiser => (c.Kaiser, FactorsRule.Kaiser, string.Create(ci,
                $"{Count(c.Kaiser)} kept because {c.Kaiser} eigenvalue{(c.Kaiser == 1 ? " is" : "s are")} above 1; this rule tends to keep too many.")),
            _ => (c.Parallel, FactorsRule.Parallel, string.Create(ci,
                $"{Count(c.Parallel)} kept because {(c.Parallel == 1 ? "the first eigenvalue is" : $"the first {c.Parallel} eigenvalues are")} larger than the {Ordinal(reference.PercentileLevel)} percentile of {reference.Replicates} {source} (parallel analysis).")),
        };
    }

    private static string Count(int k) => k switch { 0 => "No dimension is", 1 => "One dimension is", _ => $"{k} dimensions are" };

    private static string Ordinal(double level)
    {
        string s = level.ToString("0.##", CultureInfo.InvariantCulture);
        if (level != Math.Floor(level)) return s + "th";
        int v = (int)level;
        string suffix = (v % 100) is 11 or 12 or 13 ? "th" : (v % 10) switch { 1 => "st", 2 => "nd", 3 => "rd", _ => "th" };
        return s + suffix;
    }

    private static void AddInterpretationNotes(WarningList w, DimensionOptions o, RuleCounts c, KaiserMeyerOlkinResult kmo, BartlettSphericityResult b, ResponseMatrix data)
    {
        var ci = CultureInfo.InvariantCulture;
        w.Add("kaiser-caution", KaiserCriterion.Caution);
        if (c.Parallel == 0 && (c.ParallelReduced ?? 0) == 0)
            w.Add("no-component-above-random", "No component stands out from random data in parallel analysis: the items may not share a common dimension.");
        var shown = new List<(string Name, int? Count)>
        {
            ("reduced-matrix parallel analysis", c.ParallelReduced), ("principal-component parallel analysis", c.Parallel),
            ("comparison data", c.ComparisonData), ("empirical Kaiser criterion", c.EmpiricalKaiser), ("Hull method", c.Hull), ("MAP", c.Map),
        };
        if (shown.Where(x => x.Count is not null).Select(x => x.Count).Distinct().Count() > 1)
            w.Add("rules-disagree", "The rules disagree (" + string.Join(", ", shown.Where(x => x.Count is not null).Select(x => string.Create(ci, $"{x.Name} {x.Count}"))) +
                  "); consider inspecting solutions with each count before deciding.");
        if (kmo.Overall < 0.6)
            w.Add("kmo-low", string.Create(ci, $"The overall KMO is {kmo.Overall:F2}; values below about 0.6 suggest the items share too little variance for a factor analysis to be informative (Kaiser, 1974)."));
        var low = Enumerable.Range(0, kmo.PerItem.Length).Where(j => kmo.PerItem[j] < 0.5).Select(j => data.Items[j].Name).ToList();
        if (low.Count > 0)
            w.Add("msa-low", $"Items with a sampling adequacy below 0.5 (they share little with the rest): {string.Join(", ", low)}.");
        if (b.P > 0.05)
            w.Add("bartlett-not-rejected", string.Create(ci, $"Bartlett's test does not reject uncorrelated items (p = {b.P:G3}); the correlations may be too weak to analyse."));
        if (o.Correlation.Kind == CorrelationKind.Polychoric && o.Reference == ReferenceKind.Normal)
            w.Add("polychoric-normal-reference", "Polychoric correlations are compared with a normal-data reference, which tends to suggest too many dimensions with skewed items; the ordinal reference (the default for polychoric correlations) keeps the items' own category distributions.");
        if (o.Correlation.Kind == CorrelationKind.Pearson && o.Reference == ReferenceKind.Ordinal)
            w.Add("pearson-ordinal-reference", "The ordinal reference describes polychoric correlations; with Pearson correlations the normal reference is the matching one.");
    }
}
