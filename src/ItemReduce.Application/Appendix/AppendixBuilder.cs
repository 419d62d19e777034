using System.Globalization;
using ItemReduce.Application.Jobs;
using ItemReduce.Application.Settings;
using ItemReduce.Core.Correlation;
using ItemReduce.Core.Data;
using ItemReduce.Core.Dimensions;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.Pipeline;
using ItemReduce.Core.Screening;
using ItemReduce.Core.ShortForm;
using ItemReduce.IO.Outputs;
using ItemReduce.Report.Charts;
using ItemReduce.Report.Model;
using static ItemReduce.Report.Formatting.NumberFormat;

namespace ItemReduce.Application.Appendix;

/// <summary>
/// Turns a run's results into the methods appendix document (sections, numbered tables and figures,
/// cautions and references). Wording is ours; numbers follow common reporting conventions (two or three
/// decimals, no leading zero for values bounded by 1).
/// </summary>
internal static partial class AppendixBuilder
{
    /// <summary>Loadings with absolute value below this are left blank in the loading table.</summary>
    public const double BlankBelow = 0.30;

    /// <summary>Title of the table of settings in section 1.</summary>
    public const string SettingsTableTitle = "Settings of this run";

    /// <summary>The appendix of one run. <c>itemDescriptives</c>: the analysed items' descriptives when the caller has them
    /// already (the job computes them once for item-descriptives.csv and the appendix — a full pass over the data);
    /// computed here when null.</summary>
    public static AppendixDocument Build(JobSettings settings, LoadedSurvey survey, PipelineResult result,
        IReadOnlyList<ItemDescriptive>? itemDescriptives = null)
    {
        var b = new Builder();
        var refs = new SortedSet<string>(StringComparer.Ordinal);
        DataSection(b, settings, survey, result, refs);
        if (result.Screening is { } s) ScreeningSection(b, result, s, refs);
        if (result.Dimensions is { } d)
        {
            FactorabilitySection(b, result, d, refs);
            DimensionsSection(b, result, d, refs);
        }
        if (result.ShortForm is { } sf)
        {
            SolutionSection(b, result, sf, refs);
            ReliabilitySection(b, result, sf, refs);
        }
        if (result.Confirmatory is { } cfa) ConfirmatorySection(b, result, cfa, refs);
        if (result.ShortForm is not null) ItemDescriptivesSection(b, result, itemDescriptives ?? ItemDescriptives.Compute(result.Analysed), refs);
        if (result.SelfCheck is { } check) SelfCheckSection(b, result, check, refs);
        CautionsSection(b, result);
        b.Heading(1, "References");
        b.Add(new ReferenceListBlock(refs.ToList()));
        var raw = result.Prepared.Raw;
        string subtitle = $"{Path.GetFileName(settings.Responses)} · {raw.RespondentCount} respondents · {raw.ItemCount} items";
        return new AppendixDocument("Methods appendix: respondent screening, dimensionality and short form", subtitle,
            settings.StartedUtc, $"itemreduce {SurveyJob.Version}", b.Blocks)
        {
            RunningFooter = $"itemreduce {SurveyJob.Version} · seed {settings.Seed.ToString(CultureInfo.InvariantCulture)}",
        };
    }

    private sealed class Builder
    {
        public List<Block> Blocks { get; } = [];
        private int _tables, _figures;
        public void Add(Block block) => Blocks.Add(block);
        public void Heading(int level, string text) => Blocks.Add(new HeadingBlock(level, text));
        public void Para(string text) => Blocks.Add(new ParagraphBlock(text));
        public void Bullets(IEnumerable<string> items) => Blocks.Add(new BulletListBlock(items.ToList()));
        public int Table(string title, IReadOnlyList<TableColumn> columns, IReadOnlyList<TableRow> rows, string? note = null)
        {
            Blocks.Add(new TableBlock(++_tables, title, columns, rows, note));
            return _tables;
        }
        public int Figure(string caption, ChartSpec chart)
        {
            Blocks.Add(new FigureBlock(++_figures, caption, chart));
            return _figures;
        }
        public int NextTable => _tables + 1;
        public int NextFigure => _figures + 1;
    }

    private static string Inv(FormattableString s) => s.ToString(CultureInfo.InvariantCulture);

    private static TableRow Row(params string[] cells) => new(cells);

    // ---- 1. Data and reproducibility -------------------------------------------------------------

    private static void DataSection(Builder b, JobSettings settings, LoadedSurvey survey, PipelineResult r, SortedSet<string> refs)
    {
        var p = r.Prepared;
        b.Heading(1, "1. Data and reproducibility");
        b.Para(Inv($"The responses of {p.Raw.RespondentCount} respondents to {p.Raw.ItemCount} items were read from the files below. ") +
               Inv($"{Percent(p.RawSummary.MissingShare)} of all answers were missing. Reverse-keyed items were rescored as minimum + maximum − answer before any analysis. ") +
               "Every number in this appendix can be reproduced by running the same version of the program on the same files with the options listed here.");
        var reversed = p.Raw.Items.Where(i => i.Reverse).Select(i => i.Name).ToList();
        var excluded = p.ExcludedItems.Concat(r.ExcludedAfterScreening).ToList();
        var entries = new List<KeyValueEntry>
        {
            new("Responses file", Path.GetFileName(settings.Responses)),
            new("SHA-256", survey.ResponsesSha256),
            new("Codebook file", Path.GetFileName(settings.Codebook)),
            new("SHA-256", survey.CodebookSha256),
            new("Plan file", settings.Plan is null ? "none" : Path.GetFileName(settings.Plan)),
            new("Respondent id column", survey.Intake.IdColumn ?? "none (data line numbers)"),
            new("Missing-data codes", "empty cell" + string.Concat(settings.Intake.EffectiveMissingCodes.Where(c => c.Length > 0).Select(c => ", " + c))),
            new("Respondents", Integer(p.Raw.RespondentCount)),
            new("Items in codebook / analysed", $"{Integer(p.Raw.ItemCount)} / {Integer(r.Analysed.ItemCount)}"),
            new("Reverse-keyed items", reversed.Count == 0 ? "none" : string.Join(", ", reversed)),
            new("Items left out", excluded.Count == 0 ? "none" : string.Join("; ", excluded.Select(e => $"{e.Item} ({e.Detail})"))),
            new("Share of answers missing", Percent(p.RawSummary.MissingShare)),
            new("Software", $"itemreduce {SurveyJob.Version} on .NET {Environment.Version}"),
            new("Random seed", settings.Seed.ToString(CultureInfo.InvariantCulture)),
            new("Run started (UTC)", settings.StartedUtc.ToUniversalTime().ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture)),
        };
        if (settings.PlanSha256 is { } planSha) entries.Insert(5, new("SHA-256", planSha));
        b.Add(new KeyValueBlock(entries));
        b.Table(SettingsTableTitle, [new("Setting"), new("Value"), new("Source")],
            SettingsRecord.Rows(settings).Select(x => Row("--" + x.Setting.Name, x.Text, x.Source)).ToList(),
            "Every setting of this command with the value the analysis used; source: default, command line or plan file.");
        refs.Add(MethodReferences.BlackmanVigna2021);
    }

    // ---- 2. Screening ----------------------------------------------------------------------------

    private static void ScreeningSection(Builder b, PipelineResult r, ScreeningResult s, SortedSet<string> refs)
    {
        int p = r.Prepared.Scored.ItemCount;
        b.Heading(1, "2. Respondent screening");
        b.Para(s.RuleDescription);
        b.Para(Inv($"{s.FlaggedRespondents} of {s.TotalRespondents} respondents ({Percent(s.FlaggedRespondents / (double)Math.Max(1, s.TotalRespondents))}) were flagged for review. ") +
               (r.Settings.Scope == PipelineScope.All
                   ? r.Settings.KeepFlagged
                       ? "At the analyst's request, flagged respondents were kept in the later stages."
                       : Inv($"They were set aside for the later stages, which analysed {r.Analysed.RespondentCount} respondents. The flags are prompts for human review; the list below is not a verdict on any person.")
                   : ""));
        var rows = s.ReasonCounts.Select(c => Row(c.Code, c.Meaning, Integer(c.Count))).ToList();
        b.Table("Respondents flagged, by reason", [new("Reason code"), new("Meaning"), new("Respondents", ColumnAlignment.Right)], rows,
            "A respondent may have several reasons, so counts can add up to more than the number flagged.");

        // Why a fixed radius fails.
        var hp = s.CentreShareByItems;
        var xs = hp.Select(h => (double)h.Items).ToList();
        var chart = new ChartSpec(ChartKind.Line, "Number of items answered (k)", "Share of respondents (log scale)",
        [
            new ChartSeries("Inside the half-peak-density region (D² ≤ 2 ln 2)", xs, hp.Select(h => h.ShareInsideHalfPeak).ToList(), SeriesStyle.LineAndMarkers),
            new ChartSeries(Inv($"Beyond the χ² cutoff (p = {s.Options.CutoffP})"), xs, hp.Select(h => h.ShareBeyondCutoff).ToList(), SeriesStyle.Dashed),
        ])
        { Marker = new VerticalMarker(p, Inv($"this survey: {p} items")), LogY = true };
        var k1 = hp.FirstOrDefault(h => h.Items == 1);
        var k2 = hp.FirstOrDefault(h => h.Items == 2);
        var k9 = hp.FirstOrDefault(h => h.Items == 9);
        var kp = hp.FirstOrDefault(h => h.Items == p);
        b.Figure(Inv($"Share of respondents from a multivariate normal population who lie in the region where the density is at least half its peak, by number of items. ") +
                 (k1 is null || k2 is null || k9 is null ? "" : Inv($"The share falls from {Percent(k1.ShareInsideHalfPeak)} for one item and {Percent(k2.ShareInsideHalfPeak)} for two to {Percent(k9.ShareInsideHalfPeak)} for nine") +
                 (kp is null ? "." : Inv($" and {(kp.ShareInsideHalfPeak < 1e-5 ? "less than 0.001%" : Percent(kp.ShareInsideHalfPeak, 3))} for this survey's {p} items."))) +
                 " Any fixed distance radius therefore flags almost everyone once there are more than a handful of items; a χ² cutoff whose degrees of freedom equal the number of items answered flags the same small share at every k.",
            chart);

        // Q–Q plot of the distances used for flagging, for respondents who answered every item.
        bool robust = s.Options.UseRobust && s.Robust.Available;
        var complete = s.SortedDistances(robust, p);
        if (complete.Length >= 10)
        {
            int n = complete.Length;
            var ranks = QqRanks(n);
            var q = ranks.Select(i => s.ReferenceQuantile(robust, p, (i + 0.5) / n)).ToList();
            var d2 = ranks.Select(i => complete[i]).ToList();
            string thinned = ranks.Count < n
                ? Inv($" For legibility {ranks.Count} order statistics are drawn: {QqEvenRanks} evenly spaced ranks and the {QqTailRanks} largest distances.")
                : "";
            string law = robust
                ? Inv($"quantiles of the law their cutoff is taken from (the finite-sample Beta law of in-sample distances for {s.Robust.SupportSize} respondents and {p} items") +
                  (s.Robust.ConsistencyFactor != 1 ? Inv($", times the ordinal calibration factor {s.Robust.ConsistencyFactor:0.###})") : ")")
                : Inv($"χ²({p}) quantiles");
            b.Figure(Inv($"{(robust ? "Robust" : "Classical")} squared distances of the {n} respondents who answered all {p} items against ") + law + ". " +
                     "Points on the diagonal behave as that law expects; points far above it at the right are the atypical respondents." + thinned,
                new ChartSpec(ChartKind.Scatter, robust ? "Reference quantile" : Inv($"χ²({p}) quantile"), robust ? "Robust D²" : "D²",
                    [new ChartSeries("Respondents", q, d2, SeriesStyle.Markers)])
                { IdentityLine = true });
        }

        var flagged = s.Respondents.Where(x => x.Flagged).Take(FlaggedTableLimit + 1).ToList();
        if (flagged.Count > 0)
        {
            string more = flagged.Count > FlaggedTableLimit
                ? Inv($" Only the first {FlaggedTableLimit} of the {s.FlaggedRespondents} flagged respondents (input order) are listed; respondent-flags.csv lists every respondent with the flag and its reasons.")
                : "";
            b.Table("Respondents flagged for review (ids only)", [new("Respondent"), new("Items answered", ColumnAlignment.Right), new("Reasons")],
                flagged.Take(FlaggedTableLimit).Select(x => Row(x.RespondentId, Integer(x.ItemsAnswered), string.Join(", ", x.Reasons))).ToList(),
                "Responses are not reproduced here. Look at each flagged respondent's answers before deciding anything; atypical is not the same as invalid." + more);
        }
        refs.Add(MethodReferences.Mahalanobis1936);
        if (s.Options.UseRobust)
        {
            refs.Add(MethodReferences.LittleSmith1987);
            refs.Add(MethodReferences.DempsterLairdRubin1977);
            if (s.Robust.Available) refs.Add(MethodReferences.VaradhanRoland2008);   // the iterations are accelerated (RuleDescription says so)
            refs.Add(MethodReferences.Beasley2009);
            refs.Add(MethodReferences.Wilks1963);
            if (s.Robust.Available && s.Robust.ConsistencyFactor != 1) refs.Add(MethodReferences.Olsson1979);
        }
        if (double.IsFinite(s.RandomAnsweringCutoff))
        {
            refs.Add(MethodReferences.Olsson1979);
            refs.Add(MethodReferences.MendellElston1974);
            refs.Add(MethodReferences.TrinhGenz2015);
        }
        refs.Add(MethodReferences.Curran2016);
        refs.Add(MethodReferences.Johnson2005);
        refs.Add(MethodReferences.Dunn2018);
        refs.Add(MethodReferences.MeadeCraig2012);
    }

    // ---- 3. Factorability --------------------------------------------------------------------------

    private static void FactorabilitySection(Builder b, PipelineResult r, DimensionResult d, SortedSet<string> refs)
    {
        b.Heading(1, "3. Factorability");
        string corr = d.CorrelationKind == CorrelationKind.Polychoric ? "polychoric" : "Pearson";
        b.Para(Inv($"The dimension analysis{(r.ShortForm is null ? "" : ", the factor solutions and the item judgements")} use the {corr} correlation matrix of the {r.Analysed.ItemCount} items ") +
               (d.MissingData == MissingDataHandling.Pairwise ? "computed from pairwise-complete answers" : "computed from respondents with complete answers") +
               Inv($" (effective n = {d.EffectiveRespondents}). ") +
               (d.SmoothingApplied
                   ? Inv($"The matrix was not positive definite and was replaced by the nearest valid correlation matrix (largest change {Fixed(d.Smoothing.MaxAbsoluteChange, 3)}). ")
                   : "The matrix was positive definite and was used as computed. ") +
               Inv($"The Kaiser–Meyer–Olkin measure of sampling adequacy was {Bounded(d.Kmo)}; Bartlett's test of sphericity gave χ²({d.Bartlett.DegreesOfFreedom}) = {Fixed(d.Bartlett.ChiSquare, 2)}, {PStatement(d.Bartlett.P)}."));
        var order = Enumerable.Range(0, d.Msa.Length).OrderBy(j => d.Msa[j]).ToList();
        var show = order.Take(3).Concat(order.Skip(Math.Max(3, order.Count - 3))).Distinct().ToList();
        b.Table("Items with the lowest and highest measure of sampling adequacy (MSA)", [new("Item"), new("MSA", ColumnAlignment.Right)],
            show.Select(j => Row(r.Analysed.Items[j].Name, Bounded(d.Msa[j]))).ToList(),
            "All items' MSA values are in item-factorability.csv. Values below about .50 suggest an item shares little with the others.");
        refs.Add(MethodReferences.Kaiser1974);
        refs.Add(MethodReferences.Bartlett1950);
        if (d.CorrelationKind == CorrelationKind.Polychoric) refs.Add(MethodReferences.Olsson1979);
        if (d.SmoothingApplied) refs.Add(MethodReferences.Higham2002);
    }

    // ---- 4. Number of factors ----------------------------------------------------------------------

    private static void DimensionsSection(Builder b, PipelineResult r, DimensionResult d, SortedSet<string> refs)
    {
        b.Heading(1, "4. Number of dimensions");
        var pa = d.Reference;
        string refKind = pa.Kind switch
        {
            ReferenceKind.Permutation => "data sets in which each item's answers were shuffled independently (which keeps every item's distribution and removes all correlation)" +
              (pa.Subsampled ? Inv($"; to keep the cost independent of the sample size, every shuffled data set was built from the same seeded random subsample of {pa.PermutedRespondents} of the {r.Analysed.RespondentCount} respondents, which makes the reference somewhat conservative") : ""),
            ReferenceKind.Ordinal => Inv($"sets of polychoric correlations of unrelated ordinal items with the observed answer distributions (n = {d.EffectiveRespondents}), as recommended for ordinal items by Garrido, Abad and Ponsoda (2013); they were drawn from the large-sample distribution of the polychoric estimate (a Wishart draw rescaled by each item's information), which the project checked against simulated ordinal data"),
            _ => Inv($"sets of uncorrelated normal data of the same size (n = {d.EffectiveRespondents}, {d.Eigenvalues.Length} variables), drawn directly as Wishart matrices by Bartlett's decomposition"),
        };
        b.Para(Inv($"Parallel analysis compared each eigenvalue of the correlation matrix, and of the reduced matrix with squared multiple correlations on the diagonal, with the mean and the {pa.PercentileLevel}th percentile of the same eigenvalue in {pa.Replicates} {refKind}. ") +
               (d.ComparisonData is { } cdInfo
                   ? Inv($"Comparison data (Ruscio & Roche, 2012) drew {cdInfo.Samples} samples of n = {d.EffectiveRespondents} from populations with 1, 2, … common factors fitted to the observed correlations (multivariate normal populations, sampled as Wishart matrices) and added factors while the eigenvalues of the samples matched the observed eigenvalues significantly better (one-sided Mann–Whitney test, α = {cdInfo.Alpha:0.00}). ")
                   : "") +
               "The empirical Kaiser criterion (Braeken & van Assen, 2017) compared each eigenvalue with a reference that accounts for the sample size and for the variance taken by the larger eigenvalues. " +
               (d.Hull is not null ? Inv($"The Hull method (Lorenzo-Seva, Timmerman & Kiers, 2011) compared the fit (common part accounted for) of solutions with 0 to {d.Hull.Fit.Length - 1} factors against their number of free parameters and chose the solution where the upper boundary of that plot bends most. ") : "") +
               (d.Combined is not null ? "The combined rule started from the reduced-matrix parallel-analysis count and moved it by up to two factors up or down according to gradient-boosted decision trees (Friedman, 2001) that read the other rules' counts, the size of the survey and how far the eigenvalues around that count stand out from the random reference; the project fitted it to separate invented surveys of known structure, in the spirit of Goretzko and Bühner (2020). " : "") +
               Inv($"Velicer's minimum average partial (MAP) test was computed with squared and with fourth-power partial correlations. The Kaiser criterion (eigenvalue > 1) is shown for reference only; it tends to keep too many dimensions."));
        int p = d.Eigenvalues.Length;
        var comp = Enumerable.Range(1, p).Select(c => (double)c).ToList();
        var series = new List<ChartSeries>
        {
            new("Observed eigenvalues", comp, d.Eigenvalues, SeriesStyle.LineAndMarkers),
            new(Inv($"Random-data {pa.PercentileLevel}th percentile"), comp, d.ReferencePercentile, SeriesStyle.Line),
            new("Random-data mean", comp, d.ReferenceMean, SeriesStyle.Dashed),
        };
        b.Figure(Inv($"Scree plot of the eigenvalues of the correlation matrix with the parallel-analysis references; {d.ByRule.Parallel} component(s) lie above the percentile line."),
            new ChartSpec(ChartKind.Line, "Component", "Eigenvalue", series));
        int show = Math.Min(p, Math.Max(10, d.Retained + 3));
        var rows = Enumerable.Range(0, show).Select(c => new TableRow(
        [
            Integer(c + 1), Fixed(d.Eigenvalues[c], 3), Fixed(d.ReferenceMean[c], 3), Fixed(d.ReferencePercentile[c], 3),
            d.ReducedEigenvalues is null ? "—" : Fixed(d.ReducedEigenvalues[c], 3),
            d.ReducedReferencePercentile is null ? "—" : Fixed(d.ReducedReferencePercentile[c], 3),
            c < d.ByRule.Parallel ? "yes" : "no",
        ], c < d.ByRule.Parallel ? RowMark.Highlighted : RowMark.None)).ToList();
        b.Table("Eigenvalues and parallel-analysis references",
            [new("No.", ColumnAlignment.Right), new("Observed", ColumnAlignment.Right), new("Random mean", ColumnAlignment.Right),
             new(Inv($"Random P{pa.PercentileLevel}"), ColumnAlignment.Right), new("Reduced observed", ColumnAlignment.Right),
             new(Inv($"Reduced P{pa.PercentileLevel}"), ColumnAlignment.Right), new("Above reference")],
            rows, "Reduced: squared multiple correlations on the diagonal (common-factor variant). All eigenvalues are in eigenvalues.csv.");
        var mapRows = new List<TableRow>
        {
            Row(Inv($"Parallel analysis, reduced matrix, P{pa.PercentileLevel} (default)"), d.ByRule.ParallelReduced is int pr ? Integer(pr) : "—"),
            Row(Inv($"Parallel analysis, principal components, P{pa.PercentileLevel}"), Integer(d.ByRule.Parallel)),
            Row("Parallel analysis, reduced matrix, mean", d.ByRule.ParallelReducedMean is int prm ? Integer(prm) : "—"),
            Row("Parallel analysis, principal components, mean", d.ByRule.ParallelMean is int pm ? Integer(pm) : "—"),
            Row("Comparison data", d.ByRule.ComparisonData is int cdc ? Integer(cdc) : "—"),
            Row("Empirical Kaiser criterion", Integer(d.ByRule.EmpiricalKaiser)),
            Row("Combined rule (model fitted to invented surveys)", d.ByRule.Combined is int cbc ? Integer(cbc) : "—"),
            Row("Hull method (for comparison only; see the note)", d.ByRule.Hull is int hc ? Integer(hc) : "—"),
            Row("MAP, squared partial correlations (1976)", Integer(d.ByRule.Map)),
            Row("MAP, fourth-power partial correlations (2000)", Integer(d.ByRule.MapRevised)),
            Row("Eigenvalue > 1 (reference only)", Integer(d.ByRule.Kaiser)),
        };
        b.Table("Number of dimensions indicated by each rule", [new("Rule"), new("Dimensions", ColumnAlignment.Right)], mapRows,
            d.Hull is null ? null : Inv($"The Hull method as implemented here found the planted number of factors in only {RetentionStudyAccuracy.HullOverall * 100:0}% of the project's simulated surveys (it often keeps too few); its count is shown for comparison, not as a recommendation."));
        if (d.ComparisonData is { } cd)
            b.Table("Comparison data: fit of populations with k factors",
                [new("k", ColumnAlignment.Right), new("Mean RMSR of eigenvalues", ColumnAlignment.Right), new("p (k better than k − 1)", ColumnAlignment.Right)],
                Enumerable.Range(0, cd.MeanRmsr.Length).Select(c => Row(Integer(c + 1), Fixed(cd.MeanRmsr[c], 4), c == 0 ? "—" : cd.PValues[c] < 0.001 ? "< .001" : Fixed(cd.PValues[c], 3))).ToList(),
                "RMSR: root mean squared difference between the eigenvalues of samples from the k-factor population and the observed eigenvalues. The fit curve is also in eigenvalues.csv (comparison_rmsr, comparison_p_value).");
        string why = d.RuleUsed == FactorsRule.ParallelReduced
            ? " Reduced-matrix parallel analysis is the default because, in the project's seeded simulation study of ten published rules (benchmarks/results/dimensions-study-2026-12-02.md), it found the planted number of factors most often of them overall and never suggested more than one factor for one-factor data; a combined rule fitted afterwards (decision trees over the rules' results) found it more often overall (" + Inv($"{RetentionStudyAccuracy.CombinedOverall * 100:0.#}%") + "), but it has been checked only with Pearson correlations and the normal reference, so it is offered as a choice, not the default; the other rules are shown for comparison. " + RetentionStudyAccuracy.Sentence(d.EffectiveRespondents) +
              " Accuracy was lowest with three items per factor, strongly correlated factors (r = .5) and 200 respondents."
            : d.RuleUsed == FactorsRule.Combined
                ? " The combined rule was chosen in the settings (benchmarks/results/dimensions-study-2026-12-02.md describes it and its study). " +
                  RetentionStudyAccuracy.CombinedSentence(d.EffectiveRespondents) + " It was fitted to Pearson correlations with the normal reference; with other settings its accuracy is untested."
                : "";
        b.Para("**Decision.** " + d.Reason + why + (r.FactorsUsed is int k && k != d.Retained ? Inv($" {k} factor(s) were extracted (see the warnings).") : ""));
        refs.Add(MethodReferences.Horn1965);
        refs.Add(MethodReferences.Glorfeld1995);
        refs.Add(MethodReferences.Velicer1976);
        refs.Add(MethodReferences.VelicerEatonFava2000);
        refs.Add(MethodReferences.Kaiser1960);
        refs.Add(MethodReferences.HumphreysIlgen1969);
        refs.Add(MethodReferences.BraekenVanAssen2017);
        if (d.Hull is not null) refs.Add(MethodReferences.LorenzoSevaTimmermanKiers2011);
        if (d.Combined is not null)
        {
            refs.Add(MethodReferences.GoretzkoBuhner2020);
            refs.Add(MethodReferences.Friedman2001);
        }
        if (d.ComparisonData is not null)
        {
            refs.Add(MethodReferences.RuscioRoche2012);
            refs.Add(MethodReferences.MannWhitney1947);
            refs.Add(MethodReferences.Bartlett1933);
            refs.Add(MethodReferences.MarsagliaTsang2000);
        }
        if (pa.Kind == ReferenceKind.Permutation) refs.Add(MethodReferences.BujaEyuboglu1992);
        else
        {
            if (pa.Kind == ReferenceKind.Ordinal)
            {
                refs.Add(MethodReferences.GarridoAbadPonsoda2013);
                refs.Add(MethodReferences.Olsson1979);
            }
            refs.Add(MethodReferences.Bartlett1933);
            refs.Add(MethodReferences.MarsagliaTsang2000);
        }
    }

    // ---- 5. Factor solution ------------------------------------------------------------------------

    private static void SolutionSection(Builder b, PipelineResult r, ShortFormResult sf, SortedSet<string> refs)
    {
        var s = sf.FullSolution;
        int k = s.Pattern.GetLength(1);
        b.Heading(1, "5. Factor solution");
        string extraction = s.Extraction switch
        {
            FactorExtraction.MinimumResidual => "minimum residual (unweighted least squares)",
            FactorExtraction.PrincipalAxis => "principal axis factoring with iterated communalities",
            _ => "maximum likelihood",
        };
        string rotation = s.Rotation switch
        {
            FactorRotation.Oblimin => "oblimin (quartimin, γ = 0) by gradient projection",
            FactorRotation.Promax => "promax (power 4)",
            FactorRotation.Varimax => "varimax with Kaiser normalisation",
            _ => "no rotation",
        };
        string fit = s.Fit is { } mf
            ? Inv($" Model fit: χ²({mf.Df}) = {Fixed(mf.ChiSquare, 2)}, {PStatement(mf.P)}, RMSEA = {Fixed(mf.Rmsea, 3)}, TLI = {Fixed(mf.Tli, 3)}.")
            : "";
        b.Para(Inv($"{k} factor(s) were extracted by {extraction} and rotated by {rotation}. ") +
               (s.Converged ? Inv($"The extraction converged in {s.Iterations} iterations.") : "The extraction did NOT converge within the iteration limit; treat the loadings with caution.") +
               (s.HeywoodItems.Count > 0 ? Inv($" Heywood case(s) (communality at or above 1): {string.Join(", ", s.HeywoodItems.Select(j => r.Analysed.Items[j].Name))}.") : "") + fit);

        var judgement = sf.Judgements.ToDictionary(j => j.Index);
        var order = Enumerable.Range(0, r.Analysed.ItemCount)
            .OrderBy(j => judgement.TryGetValue(j, out var jd) ? jd.PrimaryFactor : 0)
            .ThenByDescending(j => judgement.TryGetValue(j, out var jd) ? Math.Abs(jd.PrimaryLoading) : 0).ToList();
        var columns = new List<TableColumn> { new("Item"), new("Subscale") };
        for (int f = 0; f < k; f++) columns.Add(new TableColumn($"F{f + 1}", ColumnAlignment.Right));
        columns.Add(new TableColumn("h²", ColumnAlignment.Right));
        columns.Add(new TableColumn("Decision"));
        var rows = new List<TableRow>();
        foreach (int j in order)
        {
            var cells = new List<string> { r.Analysed.Items[j].Name + (r.Analysed.Items[j].Reverse ? " (R)" : ""), r.Analysed.Items[j].Subscale ?? "" };
            for (int f = 0; f < k; f++) cells.Add(Math.Abs(s.Pattern[j, f]) < BlankBelow ? "" : Loading(s.Pattern[j, f]));
            cells.Add(Loading(s.Communalities[j]));
            bool keep = judgement.TryGetValue(j, out var jd) && jd.Decision == ItemDecision.Keep;
            cells.Add(keep ? "keep" : "drop");
            rows.Add(new TableRow(cells, keep ? RowMark.Highlighted : RowMark.None));
        }
        b.Table(ShortFormTables.IsOblique(s) ? "Rotated pattern loadings" : "Rotated loadings", columns, rows,
            "Factors: " + string.Join(", ", Enumerable.Range(0, k).Select(f => $"F{f + 1} = {s.FactorLabels[f]}")) + ". " +
            Inv($"Loadings with absolute value below {Bounded(BlankBelow)} are left blank. h² = communality. (R) = reverse-keyed, rescored before analysis. Items kept in the short form are highlighted (bold; also shaded in the PDF). ") +
            "Full loadings are in loadings.csv" + (ShortFormTables.IsOblique(s) ? ", structure loadings in structure-loadings.csv." : "."));
        if (ShortFormTables.IsOblique(s) && k > 1)
        {
            var phi = new List<TableRow>();
            for (int a = 0; a < k; a++)
            {
                var c = new List<string> { $"F{a + 1} {s.FactorLabels[a]}" };
                for (int bb = 0; bb < k; bb++) c.Add(bb < a ? Loading(s.FactorCorrelations[a, bb]) : bb == a ? "—" : "");
                phi.Add(new TableRow(c));
            }
            var cols = new List<TableColumn> { new("Factor") };
            for (int f = 0; f < k; f++) cols.Add(new TableColumn($"F{f + 1}", ColumnAlignment.Right));
            b.Table("Factor correlations", cols, phi);
        }
        var codes = sf.Judgements.SelectMany(j => j.Reasons).Distinct().Order(StringComparer.Ordinal).ToList();
        if (codes.Count > 0)
        {
            b.Table("Item judgements: reason codes used", [new("Code"), new("Meaning"), new("Items", ColumnAlignment.Right)],
                codes.Select(c => Row(c, ItemReasonCodes.Descriptions.TryGetValue(c, out var m) ? m : "", Integer(sf.Judgements.Count(j => j.Reasons.Contains(c))))).ToList(),
                "Each item's codes and numbers are in item-decisions.csv. Thresholds: primary loading < .40, secondary ≥ .30 or gap < .20, communality < .20, corrected item–total r < .30.");
        }
        refs.Add(s.Extraction switch
        {
            FactorExtraction.MinimumResidual => MethodReferences.HarmanJones1966,
            FactorExtraction.MaximumLikelihood => MethodReferences.Joreskog1967,
            _ => MethodReferences.HarmanJones1966,
        });
        if (s.Rotation == FactorRotation.Oblimin) refs.Add(MethodReferences.Jennrich2002);
        if (s.Rotation == FactorRotation.Promax) { refs.Add(MethodReferences.HendricksonWhite1964); refs.Add(MethodReferences.Kaiser1958); }
        if (s.Rotation == FactorRotation.Varimax) refs.Add(MethodReferences.Kaiser1958);
    }

    private static string Loading(double v) => double.IsFinite(v) && Math.Abs(v) <= 1 ? Bounded(v) : Fixed(v, 2);

    // ---- 6. Reliability and short form -------------------------------------------------------------

    private static void ReliabilitySection(Builder b, PipelineResult r, ShortFormResult sf, SortedSet<string> refs)
    {
        b.Heading(1, "6. Reliability and short form");
        int total = sf.SelectedIndices.Count;
        b.Para(Inv($"For each scale, items were judged on their loadings, communality and corrected item–total correlation, and the strongest unflagged items were kept: {ScaleLengths(sf)}") +
               (r.Settings.ShortForm.KeepReverseKeyedBalance ? ", keeping reverse-keyed items in roughly their original proportion" : "") +
               Inv($". The short form has {total} items. Cronbach's alpha is reported with a {Percent(r.Settings.ShortForm.Confidence, 0)} confidence interval (Feldt's F-based interval), McDonald's omega total from a one-factor model of each scale, and the correlation between short and full scale scores corrected for the items they share (Levy's correction)."));
        if (sf.HoldoutRespondents > 0)
            b.Para(Inv($"Items were chosen on a random {sf.SelectionRespondents} respondents and evaluated again on the other {sf.HoldoutRespondents} (holdout rows), so the holdout figures are not inflated by the selection."));
        if (sf.OmegaHierarchical is { } h)
        {
            b.Para(Inv($"For all {sf.FullSolution.ItemCount} items together, omega hierarchical (the share of the unit-weighted total score's variance due to one general factor) was {Loading(h.OmegaH)}. It was computed on the respondents the factor solution was fitted on: a one-factor minimum-residual model of the correlations among the {sf.FullSolution.FactorCount} oblique factors gave second-order loadings {string.Join(", ", h.SecondOrderLoadings.Select(Loading))}; the Schmid–Leiman transformation turned these into general-factor loadings of the items; and the squared sum of those loadings was divided by the sum of all entries of the item correlation matrix (reverse-keyed items reversed)."));
            refs.Add(MethodReferences.SchmidLeiman1957);
            refs.Add(MethodReferences.Zinbarg2005);
        }
        var rows = sf.Reliability.Select(x => new TableRow(
        [
            x.Scale, x.FormLabel, Integer(x.Items), Integer(x.Respondents), Loading(x.Alpha),
            double.IsFinite(x.AlphaCiLow) ? $"[{Loading(x.AlphaCiLow)}, {Loading(x.AlphaCiHigh)}]" : "—",
            double.IsFinite(x.Omega) ? Loading(x.Omega) : "—",
            double.IsFinite(x.ShortFullCorrelation) ? Loading(x.ShortFullCorrelation) : "—",
        ], x.Form == ScaleForm.Short ? RowMark.Highlighted : RowMark.None)).ToList();
        b.Table("Reliability of the full and short forms",
            [new("Scale"), new("Form"), new("Items", ColumnAlignment.Right), new("n", ColumnAlignment.Right), new("α", ColumnAlignment.Right),
             new("95% CI", ColumnAlignment.Center), new("ω", ColumnAlignment.Right), new("r short–full", ColumnAlignment.Right)],
            rows, "r short–full is corrected for item overlap. ω is not computed for fewer than three items.");
        var items = r.Analysed.Items;
        b.Table("Items of the short form",
            [new("Scale"), new("Item"), new("Wording"), new("Keying")],
            sf.Scales.SelectMany(sc => sc.SelectedItems.Select(name =>
            {
                var it = items.First(i => i.Name == name);
                return Row(sc.Scale, name, it.Text ?? "", it.Reverse ? "reverse" : "forward");
            })).ToList(),
            "short-form-codebook.csv holds these items as a codebook for the next data collection.");
        refs.Add(MethodReferences.Cronbach1951);
        refs.Add(MethodReferences.Feldt1965);
        refs.Add(MethodReferences.McDonald1999);
        refs.Add(MethodReferences.Levy1967);
    }

    /// <summary>Requested and kept length of every scale, e.g. "comfort 3 of 3 requested, crew 5 of 5 requested".</summary>
    internal static string ScaleLengths(ShortFormResult sf) =>
        string.Join(", ", sf.Scales.Select(sc => Inv($"{sc.Scale} {sc.SelectedItems.Count} of {sc.Target} requested")));

    // ---- 8. Cautions -------------------------------------------------------------------------------

    private static void CautionsSection(Builder b, PipelineResult r)
    {
        b.Heading(1, "9. Cautions and limitations");
        b.Bullets(
        [
            "Screening flags are for human review, not automatic exclusion. Check each flagged respondent's answers, and report how many were set aside and why.",
            "Atypical is not invalid. Groups with a genuinely different response style (for example respondents answering in a second language, or a minority whose experience differs from the majority's) can be over-flagged by distance rules; look at who is flagged before excluding anyone.",
            "Parallel analysis, MAP and the loading thresholds are aids to judgement. The number of dimensions and the items kept should also make sense in terms of content.",
            "A short form chosen on these data must be validated in a new, independent sample before it is used for clinical, educational or employment decisions.",
            .. (r.SelfCheck is null ? Array.Empty<string>() : ["The self-check (section 8) shows how this run's decisions behave on surveys simulated from the fitted model. It describes the procedure under that model; it does not show that the model is right, and real data can make the decisions less stable than it suggests."]),
            "Follow the requirements of your ethics board and the professional standards of your field for data use, exclusions and test use.",
        ]);
        var warnings = r.Prepared.Warnings.Concat(r.Warnings).Concat(r.Screening?.Warnings ?? []).Concat(r.Dimensions?.Warnings ?? [])
            .Concat((r.ShortForm?.Warnings ?? []).Where(w => w.Message != ShortFormBuilder.ValidationCaution)).Concat(r.Confirmatory?.Warnings ?? []).Concat(r.SelfCheck?.Warnings ?? []).Select(w => w.Message).Distinct().ToList();
        if (warnings.Count > 0)
        {
            b.Heading(2, "Warnings raised during this run");
            b.Bullets(warnings);
        }
    }

    /// <summary>Most rows of the flagged-respondent table; the full list is in respondent-flags.csv.</summary>
    internal const int FlaggedTableLimit = 500;

    /// <summary>Evenly spaced ranks drawn in the Q–Q plot when there are more points than <see cref="QqEvenRanks"/> + <see
    /// cref="QqTailRanks"/>.</summary>
    internal const int QqEvenRanks = 2000;

    /// <summary>Largest distances always drawn in a thinned Q–Q plot (the tail is where atypical respondents show).</summary>
    internal const int QqTailRanks = 100;

    /// <summary>0-based ranks of the order statistics drawn in the Q–Q plot of <paramref name="n"/> distances: all of
    /// them up to <see cref="QqEvenRanks"/> + <see cref="QqTailRanks"/>, otherwise evenly spaced ranks (first and last
    /// included) plus the largest <see cref="QqTailRanks"/>, ascending and distinct.</summary>
    internal static List<int> QqRanks(int n)
    {
        if (n <= QqEvenRanks + QqTailRanks) return Enumerable.Range(0, n).ToList();
        var ranks = new SortedSet<int>();
        for (int k = 0; k < QqEvenRanks; k++) ranks.Add((int)((long)k * (n - 1) / (QqEvenRanks - 1)));
        for (int i = n - QqTailRanks; i < n; i++) ranks.Add(i);
        return ranks.ToList();
    }
}
