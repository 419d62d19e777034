using ItemReduce.Core.Correlation;
using ItemReduce.Core.Pipeline;
using ItemReduce.Core.SelfCheck;
using ItemReduce.IO.Outputs;
using ItemReduce.Report.Charts;
using ItemReduce.Report.Model;
using static ItemReduce.Report.Formatting.NumberFormat;

namespace ItemReduce.Application.Appendix;

/// <summary>Section 8: the design-matched self-check ("How stable are these decisions?").</summary>
internal static partial class AppendixBuilder
{
    /// <summary>Heading of the self-check section.</summary>
    public const string SelfCheckHeading = "8. How stable are these decisions?";

    /// <summary>Title of the self-check table.</summary>
    public const string SelfCheckTableTitle = "Self-check: the decisions of this run on surveys simulated from the fitted model";

    private static void SelfCheckSection(Builder b, PipelineResult r, SelfCheckResult c, SortedSet<string> refs)
    {
        b.Heading(1, SelfCheckHeading);
        var sf = r.ShortForm!;
        bool holdout = sf.HoldoutRespondents > 0;
        b.Para(Inv($"To show how stable the decisions above are for a survey like this one, {c.Requested} surveys were simulated from the model fitted in section 5 and analysed again. ") +
               Inv($"Each simulated survey has the same {c.Respondents} respondents and {c.Items} analysed items as this one, each item's observed answer values and their shares (answers were cut from normal latent scores at the quantiles of the observed cumulative shares), each item's share of missing answers (missing completely at random), and the {c.FittedFactors}-factor pattern loadings and factor correlations of section 5 as the true structure. ") +
               (c.PlantedEach > 0 ? Inv($"In each, {c.PlantedEach} respondents of each kind answered at random, gave the same answer to every item, or alternated between the lowest and highest answers. ") : "") +
               "Each simulated survey was analysed with the settings of this run — " +
               (r.Screening is not null ? "screening and setting aside flagged respondents, " : "") +
               (r.Settings.Dimensions.FixedFactors is null ? "the rule for the number of dimensions, " : "") +
               "factoring, item selection and reliability" + (holdout ? ", with the same holdout share" : "") +
               " (the confirmatory check was not repeated). Each simulated survey drew from its own random stream derived from the seed, so the results do not depend on the number of threads." +
               (c.Completed < c.Requested ? Inv($" On {c.Requested - c.Completed} simulated surveys a stage stopped (see the warnings); the figures describe the other {c.Completed}.") : ""));
        b.Para("**What this shows and what it does not.** These are properties of this procedure when the fitted model is true. They are not evidence that the model is right: " +
               "real respondents can differ from it (cross-loadings, shared wording, missing answers that are not random, careless patterns other than the three planted), and then the decisions can be less stable than shown here." +
               (sf.Correlation.Kind == CorrelationKind.Pearson ? " Because the loadings were fitted to Pearson correlations of the answers, each item's loadings were divided by the correlation of its answers with the latent score they are cut from (Olsson, Drasgow & Dorans, 1982), so that the simulated answers correlate about as the observed ones do; this correction is approximate." : ""));
        b.Para("Rates are shares of simulated respondents or surveys with 95% Wilson score intervals, which express the Monte Carlo uncertainty of the rate (the false-flag interval counts respondents as independent, although respondents of one survey share its cutoff). " +
               "Distributions are medians over the simulated surveys with the 5th to 95th percentiles; with few simulated surveys these lie close to the smallest and largest values. More simulated surveys (--self-check N) narrow the intervals and lengthen the run. Every quantity is in " + SelfCheckTables.FileName + ".");

        var all = SelfCheckTables.Rows(c);
        var rows = new List<TableRow>();
        string Interval(SelfCheckRow x) => double.IsFinite(x.Low) ? (x.IsRate ? $"{Percent(x.Low)}–{Percent(x.High)}" : $"{Loading(x.Low)}–{Loading(x.High)}") : "—";
        void AddRate(string label, string observed, SelfCheckRow? x)
        {
            if (x is null) return;
            rows.Add(Row(label, observed, Percent(x.Value), Interval(x), Integer(x.Surveys)));
        }
        SelfCheckRow? Find(string q) => all.FirstOrDefault(x => x.Quantity == q);
        AddRate("Attentive respondents flagged (false flags)", "—", Find("screening.false_flag_rate"));
        foreach (var kind in c.Recall)
            AddRate(Inv($"Planted {kind.Kind} respondents flagged (recall)"), "—", Find("screening.recall." + kind.Kind.Replace('-', '_')));
        if (c.DimensionRecovery is not null)
        {
            AddRate(Inv($"Rule picked the fitted {c.FittedFactors} factor(s)"), Integer(c.FittedFactors), Find("dimensions.recovery"));
            foreach (var kv in c.DimensionPicks.Where(kv => kv.Key != c.FittedFactors))
                AddRate(Inv($"Rule picked {kv.Key} factor(s)"), "—", Find(Inv($"dimensions.picked.{kv.Key}")));
        }
        if (c.Stability.Count > 0)
        {
            if (c.LeastStable is { } least)
            {
                var (lo, hi) = least.KeptAgain.Interval;
                rows.Add(Row(Inv($"Items of this short form kept again: median of {c.Stability.Count} items"), "—",
                    Percent(c.MedianKeptAgain), "—", Integer(least.KeptAgain.Trials)));
                rows.Add(Row(Inv($"Least stable kept item ({least.Item}, {least.Scale}) kept again"), "—", Percent(least.KeptAgain.Rate),
                    $"{Percent(lo)}–{Percent(hi)}", Integer(least.KeptAgain.Trials)));
            }
        }
        foreach (var x in all.Where(x => !x.IsRate))
        {
            var parts = x.Quantity.Split('.', 3);
            string what = parts[1] switch { "alpha" => "α", "omega" => "ω", _ => "r short–full" };
            string sample = parts[0] == "holdout" ? ", holdout" : holdout ? ", selection part" : "";
            rows.Add(Row(Inv($"{what} of the short form, {parts[2]}{sample}"), double.IsFinite(x.Observed) ? Loading(x.Observed) : "—",
                double.IsFinite(x.Value) ? Loading(x.Value) : "—", Interval(x), Integer(x.Surveys)));
        }
        int table = b.NextTable;
        b.Table(SelfCheckTableTitle,
            [new("Quantity"), new("This survey", ColumnAlignment.Right), new("Simulated", ColumnAlignment.Right), new("Interval", ColumnAlignment.Center),
             new("Surveys", ColumnAlignment.Right)],
            rows, "Simulated: share (rates) or median (α, ω, r). Interval: 95% Wilson score interval for shares, 5th–95th percentile for α, ω and r. " +
                  "Surveys: simulated surveys the figure rests on. " + DesignSelfCheck.Caution);

        if (c.Stability.Count > 0)
        {
            var series = new List<ChartSeries>();
            int x0 = 1;
            foreach (var scale in sf.Scales)
            {
                var items = c.Stability.Where(s => s.Scale == scale.Scale).ToList();
                if (items.Count == 0) continue;
                series.Add(new ChartSeries(scale.Scale, items.Select((_, i) => (double)(x0 + i)).ToList(), items.Select(s => s.KeptAgain.Rate).ToList(), SeriesStyle.Markers));
                x0 += items.Count;
            }
            b.Figure(Inv($"Selection stability: the share of the {c.Completed} simulated surveys whose short form kept each item of this short form again. Items are numbered in the order of the table of short-form items (section 6), one colour per scale; values near 1 mean the item is kept whatever the sampling noise."),
                new ChartSpec(ChartKind.Scatter, "Item of the short form (numbered)", "Share of simulated surveys keeping it", series) { AspectRatio = 0.45, YLimits = (0, 1.05) });
        }
        b.Para(Inv($"Table {table} reads as follows: many attentive respondents flagged, a low recall, a low share of surveys recovering the fitted number of factors, or items rarely kept again mean that the corresponding decision of this run depends strongly on chance for a survey of this size and shape; treat it with matching caution."));
        refs.Add(MethodReferences.Wilson1927);
        if (sf.Correlation.Kind == CorrelationKind.Pearson) refs.Add(MethodReferences.OlssonDrasgowDorans1982);
    }
}
