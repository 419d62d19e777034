using System.Globalization;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Reliability;

namespace ItemReduce.Core.ShortForm;

/// <summary>
/// Façade: judges every item, chooses a short form per scale, refits the factor model on it and reports
/// full- and short-form reliability — optionally on held-out respondents the items were not chosen on.
/// Steps: <see cref="HoldoutSplit"/> → correlations (<see cref="ShortFormOptions.Correlation"/>: Pearson or polychoric,
/// pairwise or listwise; smoothed by <see cref="NearestCorrelationMatrix"/> when not positive definite) → <see cref="FactorAnalysis.Fit"/> → scale
/// statistics (<see cref="ScaleReliability"/>) → flags (<see cref="ItemReasonCodes"/>) →
/// <see cref="ItemSelection"/> → refit → reliability rows with the overlap-corrected short/full correlation.
/// Scales: an item's scale is its declared subscale, or, when it has none, the label of its primary factor.
/// </summary>
public static class ShortFormBuilder
{
    /// <summary>Caution attached to every result.</summary>
    public const string ValidationCaution =
        "A short form chosen on these data must be validated in a new, independent sample before it is used for clinical, " +
        "educational or employment decisions. Item flags are prompts for expert review, not automatic verdicts; follow your " +
        "ethics board and the professional standards for test use.";

    /// <summary>Builds the short form.</summary>
    /// <param name="data">Reverse-scored responses of the usable items; each item's
    /// <see cref="ItemDefinition.Subscale"/> and <see cref="ItemDefinition.Reverse"/> are used. NaN = missing.</param>
    /// <param name="factors">Number of factors k, 1 ≤ k &lt; p.</param>
    /// <param name="options">Options; null = defaults.</param>
    /// <exception cref="ArgumentException">Invalid data, k or options (message gives value and range).</exception>
    /// <param name="progress">Optional callback told when each step starts (for progress reports on large data).</param>
    /// <param name="correlation">Optional correlation matrix of <paramref name="data"/> (p × p, positive definite) computed
    /// already with <see cref="ShortFormOptions.Correlation"/> on the same respondents, e.g. by the dimensions stage;
    /// used only without a holdout. Null = computed here.</param>
    public static ShortFormResult Build(ResponseMatrix data, int factors, ShortFormOptions? options = null, Action<string>? progress = null,
        double[,]? correlation = null)
    {
        var o = options ?? new ShortFormOptions();
        Validate(data, factors, o);
        var (selRows, holdRows) = HoldoutSplit.Split(data.RespondentCount, o.HoldoutFraction, o.Seed);
        if (holdRows.Length > 0 && (selRows.Length < 10 || holdRows.Length < 10))
            throw new DataConditionException($"Holdout fraction {o.HoldoutFraction} leaves {selRows.Length} selection and {holdRows.Length} holdout respondents; each part needs at least 10.", nameof(options));
        var sel = holdRows.Length > 0 ? data.SelectRespondents(selRows) : data;
        var warnings = new WarningList("short-form");

        var subscales = data.Items.Select(i => string.IsNullOrEmpty(i.Subscale) ? null : i.Subscale).ToList();
        progress?.Invoke("short form: correlations");
        double[,] r;
        if (correlation is not null && holdRows.Length == 0)
        {
            if (correlation.GetLength(0) != data.ItemCount || correlation.GetLength(1) != data.ItemCount)
                throw new ArgumentException($"The correlation matrix is {correlation.GetLength(0)}×{correlation.GetLength(1)} for {data.ItemCount} items.", nameof(correlation));
            r = correlation;
        }
        else
        {
            var smoothing = NearestCorrelationMatrix.Find(o.Correlation.Compute(sel));
            if (smoothing.Adjusted)
                warnings.Add("matrix-smoothed", string.Create(CultureInfo.InvariantCulture,
                    $"The {o.Correlation.KindName} correlation matrix of the items was not positive definite (smallest eigenvalue {smoothing.MinEigenvalueBefore:G3}); the factor solutions use the nearest valid correlation matrix, changing no correlation by more than {smoothing.MaxAbsoluteChange:F3}."));
            r = smoothing.Matrix;
        }
        int nCorr = o.Correlation.EffectiveRespondents(sel);
        progress?.Invoke("short form: factor solution");
        var full = FactorAnalysis.Fit(r, nCorr, factors, o.Factoring with { ItemSubscales = subscales, ItemNames = data.Items.Select(i => i.Name).ToList() });
        warnings.AddRange(full.Warnings.Select(w => w with { Message = "Full solution: " + w.Message }));

        var scales = AssignScales(data, full, subscales);
        WarnSharedHomes(scales, warnings);
        progress?.Invoke("short form: scale reliability and item judgements");
        var flags = new ItemFlags[data.ItemCount];
        // One read of the selection rows gives every scale's listwise covariance; the estimates are reused for the
        // full-form rows of the selection sample below.
        var selFull = ListwiseCovarianceBatch.Compute(sel, scales.Select(sc => (IReadOnlyList<int>)sc.Items).ToList())
            .Select(c => ScaleReliability.FromCovariance(c.Covariance, c.Respondents, o.Confidence)).ToList();
        for (int s = 0; s < scales.Count; s++)
        {
            var sc = scales[s];
            var rel = selFull[s];
            for (int a = 0; a < sc.Items.Count; a++)
            {
                int j = sc.Items[a];
                var (primary, secondary, pf) = ItemJudging.PrimaryAndSecondary(full, j);
                var reasons = ItemJudging.Flags(full, j, sc.Home, sc.Declared, rel.ItemTotalCorrelations[a], rel.AlphaIfDeleted[a], rel.Alpha, o.Thresholds);
                flags[j] = new ItemFlags(j, sc.Name, sc.Home, pf, primary, secondary, full.Communalities[j],
                    rel.ItemTotalCorrelations[a], rel.AlphaIfDeleted[a], rel.Alpha, reasons)
                { HomeLoading = full.Pattern[j, sc.Home] };
            }
        }

        var reverse = data.Items.Select(i => i.Reverse).ToList();
        var chosenAll = new HashSet<int>();
        var forcedAll = new HashSet<int>();
        var scaleResults = new List<ShortFormScale>();
        foreach (var sc in scales)
        {
            int target = o.ScaleTargets is { } t && t.TryGetValue(sc.Name, out int tt) ? tt : o.ItemsPerFactor;
            var (chosen, forced) = ItemSelection.Choose(sc.Items.Select(j => flags[j]).ToList(), reverse, target, o.KeepReverseKeyedBalance);
            chosenAll.UnionWith(chosen);
            forcedAll.UnionWith(forced);
            if (chosen.Count < Math.Min(target, sc.Items.Count))
                warnings.Add("scale-short", $"Scale '{sc.Name}': only {chosen.Count} of the requested {target} items could be chosen.");
            if (forced.Count > 0)
                warnings.Add("flagged-items-kept", $"Scale '{sc.Name}': {forced.Count} flagged item(s) kept to reach a usable length; review them.");
            scaleResults.Add(new ShortFormScale(sc.Name, sc.Home, target,
                sc.Items.Select(j => data.Items[j].Name).ToList(), chosen.Select(j => data.Items[j].Name).ToList()));
        }

        var judgements = Enumerable.Range(0, data.ItemCount).Select(j => Judge(data, full, flags[j], chosenAll.Contains(j), forcedAll.Contains(j))).ToList();
        var selected = chosenAll.Order().ToList();
        var shortSolution = Refit(r, nCorr, factors, selected, subscales, data.Items.Select(i => i.Name).ToList(), o, warnings);

        progress?.Invoke("short form: reliability of full and short forms");
        var rows = new List<ReliabilityRow>();
        AddRows(rows, sel, scales, scaleResults, data, holdRows.Length > 0 ? SampleRole.Selection : SampleRole.All, o.Confidence, selFull);
        if (holdRows.Length > 0)
            AddRows(rows, data.SelectRespondents(holdRows), scales, scaleResults, data, SampleRole.Holdout, o.Confidence, null);
        warnings.Add("validate-short-form", ValidationCaution);

        return new ShortFormResult
        {
            FullSolution = full,
            OmegaHierarchical = full.FactorCount >= 3 && full.IsOblique
                ? ItemReduce.Core.Reliability.OmegaHierarchical.Compute(full.Pattern, full.FactorCorrelations, r) : null,
            Correlation = new CorrelationUsed(o.Correlation.Kind, o.Correlation.MissingData, r, nCorr, sel.RespondentCount),
            Judgements = judgements,
            Scales = scaleResults,
            SelectedIndices = selected,
            ShortSolution = shortSolution,
            Reliability = rows,
            SelectionRespondents = sel.RespondentCount,
            HoldoutRespondents = holdRows.Length,
            HoldoutRows = holdRows,
            Warnings = warnings,
        };
    }

    private sealed record ScaleDefinition(string Name, int Home, bool Declared, List<int> Items);

    /// <summary>Declared subscales keep their items and get their home factor; undeclared items join the scale
    /// named after their primary factor's label.</summary>
    private static List<ScaleDefinition> AssignScales(ResponseMatrix data, FactorSolution s, List<string?> subscales)
    {
        var list = new List<ScaleDefinition>();
        var byName = new Dictionary<string, ScaleDefinition>(StringComparer.Ordinal);
        for (int j = 0; j < data.ItemCount; j++)
        {
            string name;
            int home;
            bool declared = subscales[j] is not null;
            if (declared) { name = subscales[j]!; home = s.SubscaleFactor[name]; }
            else { home = ItemJudging.PrimaryAndSecondary(s, j).PrimaryFactor; name = s.FactorLabels[home]; }
            if (!byName.TryGetValue(name, out var sc))
            {
                sc = new ScaleDefinition(name, home, declared, []);
                byName[name] = sc;
                list.Add(sc);
            }
            sc.Items.Add(j);
        }
        return list;
    }

    private static void WarnSharedHomes(List<ScaleDefinition> scales, WarningList warnings)
    {
        foreach (var g in scales.Where(s => s.Declared).GroupBy(s => s.Home).Where(g => g.Count() > 1))
            warnings.Add("shared-home-factor", $"Subscales {string.Join(", ", g.Select(s => "'" + s.Name + "'"))} load mainly on the same factor (F{g.Key + 1}); " +
                         "the factor solution does not separate them.");
    }

    private static ItemJudgement Judge(ResponseMatrix data, FactorSolution s, ItemFlags f, bool kept, bool forced)
    {
        var reasons = new List<string>(f.Reasons);
        if (kept && forced) reasons.Add(ItemReasonCodes.KeptDespiteFlags);
        if (!kept && reasons.Count == 0) reasons.Add(ItemReasonCodes.Surplus);
        var item = data.Items[f.Index];
        return new ItemJudgement(item.Name, f.Index, string.IsNullOrEmpty(item.Subscale) ? null : item.Subscale, f.Scale, item.Reverse,
            kept ? ItemDecision.Keep : ItemDecision.Drop, reasons, f.PrimaryFactor, s.FactorLabels[f.PrimaryFactor], f.PrimaryLoading,
            f.SecondaryLoading, f.Communality, f.ItemTotal, f.AlphaIfDeleted, f.ScaleAlpha);
    }

    private static FactorSolution? Refit(double[,] r, int n, int k, List<int> selected, List<string?> subscales, List<string> names, ShortFormOptions o, WarningList warnings)
    {
        if (selected.Count <= k || selected.Count < 3)
        {
            warnings.Add("no-refit", $"The short form has {selected.Count} items; a {k}-factor refit needs more than {Math.Max(k, 2)}. No refit.");
            return null;
        }
        var sub = new double[selected.Count, selected.Count];
        for (int a = 0; a < selected.Count; a++)
            for (int b = 0; b < selected.Count; b++) sub[a, b] = r[selected[a], selected[b]];
        try
        {
            var s = FactorAnalysis.Fit(sub, n, k, o.Factoring with { ItemSubscales = selected.Select(j => subscales[j]).ToList(), ItemNames = selected.Select(j => names[j]).ToList() });
            warnings.AddRange(s.Warnings.Select(w => w with { Message = "Short-form refit: " + w.Message }));
            return s;
        }
        catch (Exception e) when (e is DataConditionException or FactorNonConvergenceException)
        {
            warnings.Add("refit-failed", "Short-form refit failed: " + e.Message);
            return null;
        }
    }

    /// <summary>Full- and short-form rows of one sample. All column sets the sample needs (each scale's full items unless
    /// <paramref name="knownFull"/> gives their estimates, and each short form) come from one read of its rows; each set
    /// stays listwise on its own items.</summary>
    private static void AddRows(List<ReliabilityRow> rows, ResponseMatrix sample, List<ScaleDefinition> scales, List<ShortFormScale> chosen,
        ResponseMatrix data, SampleRole role, double confidence, List<ReliabilityEstimate>? knownFull)
    {
        string suffix = role == SampleRole.Holdout ? "-holdout" : "";
        var shortPositions = new List<int>[scales.Count];
        var sets = new List<IReadOnlyList<int>>();
        var fullSet = new int[scales.Count];
        var shortSet = new int[scales.Count];
        for (int s = 0; s < scales.Count; s++)
        {
            var fullIdx = scales[s].Items;
            var shortNames = chosen[s].SelectedItems;
            shortPositions[s] = fullIdx.Select((j, pos) => (j, pos)).Where(t => shortNames.Contains(data.Items[t.j].Name)).Select(t => t.pos).ToList();
            fullSet[s] = shortSet[s] = -1;
            if (knownFull is null) { fullSet[s] = sets.Count; sets.Add(fullIdx); }
            if (shortPositions[s].Count > 0) { shortSet[s] = sets.Count; sets.Add(shortPositions[s].Select(pos => fullIdx[pos]).ToList()); }
        }
        var cov = ListwiseCovarianceBatch.Compute(sample, sets);
        for (int s = 0; s < scales.Count; s++)
        {
            var f = knownFull?[s] ?? ScaleReliability.FromCovariance(cov[fullSet[s]].Covariance, cov[fullSet[s]].Respondents, confidence);
            rows.Add(Row(scales[s].Name, ScaleForm.Full, role, "full" + suffix, f, double.NaN, double.NaN));
            if (shortSet[s] < 0) continue;
            var c = cov[shortSet[s]];
            var sh = ScaleReliability.FromCovariance(c.Covariance, c.Respondents, confidence);
            var (observed, corrected) = ScaleReliability.ShortFullCorrelation(f.Covariance, f.Respondents, shortPositions[s]);
            rows.Add(Row(scales[s].Name, ScaleForm.Short, role, "short" + suffix, sh, corrected, observed));
        }
    }

    private static ReliabilityRow Row(string scale, ScaleForm form, SampleRole role, string label, ReliabilityEstimate e, double corrected, double observed)
        => new(scale, form, role, label, e.ItemCount, e.Respondents, e.Alpha, e.AlphaCiLow, e.AlphaCiHigh, e.StandardizedAlpha, e.Omega, corrected, observed);

    private static void Validate(ResponseMatrix data, int factors, ShortFormOptions o)
    {
        ArgumentNullException.ThrowIfNull(data);
        ArgumentNullException.ThrowIfNull(o);
        int p = data.ItemCount;
        if (factors < 1 || factors >= p) throw new DataConditionException($"factors = {factors}; allowed range is 1..{p - 1} for {p} items.", nameof(factors));
        const int minLen = ShortFormOptions.MinItemsPerFactor, maxLen = ShortFormOptions.MaxItemsPerFactor;
        if (o.ItemsPerFactor is < minLen or > maxLen) throw new ArgumentException($"ItemsPerFactor = {o.ItemsPerFactor}; allowed {minLen}..{maxLen}.", nameof(o));
        if (o.ScaleTargets is { } t)
            foreach (var (name, n) in t)
                if (n is < minLen or > maxLen) throw new ArgumentException($"Target for scale '{name}' = {n}; allowed {minLen}..{maxLen}.", nameof(o));
        if (!(o.HoldoutFraction >= 0 && o.HoldoutFraction <= ShortFormOptions.MaxHoldoutFraction))
            throw new ArgumentException($"HoldoutFraction = {o.HoldoutFraction.ToString(CultureInfo.InvariantCulture)}; allowed [0, {ShortFormOptions.MaxHoldoutFraction.ToString(CultureInfo.InvariantCulture)}].", nameof(o));
        if (!(o.Confidence > 0 && o.Confidence < 1)) throw new ArgumentException($"Confidence = {o.Confidence}; allowed (0, 1).", nameof(o));
        var th = o.Thresholds;
        foreach (var (name, v, lo, hi) in new[]
                 {
                     ("MinPrimaryLoading", th.MinPrimaryLoading, 0.0, 1.0), ("MaxSecondaryLoading", th.MaxSecondaryLoading, 0.0, 1.0),
                     ("MinLoadingGap", th.MinLoadingGap, 0.0, 1.0), ("MinCommunality", th.MinCommunality, 0.0, 1.0),
                     ("MinItemTotalCorrelation", th.MinItemTotalCorrelation, -1.0, 1.0), ("AlphaRiseMargin", th.AlphaRiseMargin, 0.0, 1.0),
                 })
            if (!(v >= lo && v <= hi)) throw new ArgumentException($"{name} = {v}; allowed [{lo}, {hi}].", nameof(o));
    }
}
