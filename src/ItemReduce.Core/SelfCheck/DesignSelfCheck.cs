using System.Globalization;
using ItemReduce.Core.Pipeline;
using ItemReduce.Core.Randomness;
using ItemReduce.Core.ShortForm;
using ItemReduce.Simulation;

namespace ItemReduce.Core.SelfCheck;

/// <summary>
/// The design-matched self-check (our own procedure; a parametric Monte Carlo of the whole decision chain). Surveys are
/// simulated from this survey's fitted model with <see cref="FactorModelSimulator"/>: the same number of respondents
/// and analysed items, each item's observed answer values and shares (cut at normal quantiles of its cumulative shares),
/// each item's missing share (completely at random), and the fitted pattern loadings and factor correlations as the
/// latent truth; 1 % of respondents per kind answer at random, the same box throughout, or alternating between the
/// scale ends. <see cref="SurveyPipeline.Run"/> then runs on each simulated survey with this run's settings (the
/// confirmatory check and the self-check itself excepted), so the check measures whatever screening rule, factor rule,
/// item selection, reliability and holdout the pipeline uses. Survey r draws its data and its pipeline seed from
/// <see cref="RandomStream.ForTask"/>(seed, r), so results do not depend on the thread count.
/// </summary>
public static class DesignSelfCheck
{
    /// <summary>What the self-check is and is not (for every place that reports it).</summary>
    public const string Caution = "The self-check describes how this tool's decisions behave on surveys simulated from the model fitted to these data; it is not evidence that this model is right, and real data can behave worse.";

    /// <summary>Purpose code of the self-check's random streams.</summary>
    private const ulong Purpose = 0x5345_4C46;

    /// <summary>Largest common variance given to a simulated item (fitted Heywood items are scaled down to it).</summary>
    public const double MaxCommonVariance = 0.95;

    /// <summary>Planted kinds, with their reported names.</summary>
    public static IReadOnlyList<(CarelessKind Kind, string Name)> PlantedKinds { get; } =
        [(CarelessKind.UniformRandom, "random"), (CarelessKind.StraightLine, "straight-line"), (CarelessKind.WideAlternation, "alternating")];

    /// <summary>Runs the self-check of <paramref name="main"/> (a full pipeline run with a short form).</summary>
    /// <param name="main">This survey's result; its short form's full solution is the truth.</param>
    /// <param name="settings">This run's settings (the replicates run with the same, minus confirmatory check and self-check).</param>
    /// <param name="progress">Optional progress callback (called from worker threads, one call at a time).</param>
    public static SelfCheckResult Run(PipelineResult main, PipelineSettings settings, Action<string>? progress = null)
    {
        ArgumentNullException.ThrowIfNull(main);
        ArgumentNullException.ThrowIfNull(settings);
        settings.SelfCheck.Validate();
        var sf = main.ShortForm ?? throw new ArgumentException("The self-check needs a short form (a full run).", nameof(main));
        int surveys = settings.SelfCheck.Surveys;
        var warnings = new WarningList("self-check");
        var (spec, simSettings) = Design(main, warnings);
        bool screened = main.Screening is not null;
        int plantedEach = screened ? Math.Max(1, (int)Math.Round(SelfCheckOptions.PlantedShareEach * simSettings.Respondents)) : 0;
        if (3 * plantedEach >= simSettings.Respondents) plantedEach = 0;
        simSettings = simSettings with { RandomResponders = plantedEach, StraightLiners = plantedEach, WideAlternators = plantedEach };
        var replicateSettings = settings with
        {
            Confirmatory = false,
            SelfCheck = settings.SelfCheck with { Surveys = 0 },
            Scope = PipelineScope.All,
            Dimensions = settings.Dimensions with { MaxDegreeOfParallelism = 1 },
        };
        var outcomes = new Replicate[surveys];
        int done = 0;
        var gate = new object();
        int workers = settings.Dimensions.MaxDegreeOfParallelism;
        Parallel.For(0, surveys, new ParallelOptions { MaxDegreeOfParallelism = workers }, r =>
        {
            var stream = RandomStream.ForTask(settings.Seed, r, Purpose);
            ulong dataSeed = stream.NextUInt64(), pipelineSeed = stream.NextUInt64();
            outcomes[r] = RunOne(spec, simSettings with { Seed = dataSeed }, replicateSettings with { Seed = pipelineSeed });
            lock (gate)
            {
                done++;
                progress?.Invoke(string.Create(CultureInfo.InvariantCulture, $"self-check: simulated survey {done} of {surveys} analysed"));
            }
        });
        return Summarise(main, settings, outcomes, simSettings.Respondents, spec.ItemFactor.Length, plantedEach, warnings);
    }

    /// <summary>The simulation design matching <paramref name="main"/>: model and settings (seed and planted counts unset).</summary>
    internal static (FactorModelSpec Spec, FactorModelSimulator.Settings Settings) Design(PipelineResult main, List<AnalysisWarning> warnings)
    {
        var data = main.Analysed;
        var sol = main.ShortForm!.FullSolution;
        int p = data.ItemCount, k = sol.FactorCount;
        var pattern = (double[,])sol.Pattern.Clone();
        var phi = sol.FactorCorrelations;
        var scales = new ItemAnswerScale[p];
        var missing = new double[p];
        for (int j = 0; j < p; j++)
        {
            var counts = new SortedDictionary<double, int>();
            int answered = 0;
            foreach (double v in data.Column(j))
            {
                if (double.IsNaN(v)) continue;
                counts[v] = counts.GetValueOrDefault(v) + 1;
                answered++;
            }
            scales[j] = new ItemAnswerScale(counts.Keys.ToArray(), counts.Values.Select(c => c / (double)answered).ToArray());
            missing[j] = 1 - answered / (double)data.RespondentCount;
        }
        // Loadings fitted to Pearson correlations of the answers describe the answers, not the latent scores they are cut
        // from: divide each item's row by the answers' correlation with their latent score, so that the simulated answers
        // correlate about as the observed ones do.
        if (main.ShortForm.Correlation.Kind == Correlation.CorrelationKind.Pearson)
            for (int j = 0; j < p; j++)
            {
                double a = LatentCorrelation(scales[j]);
                if (a > 0)
                    for (int f = 0; f < k; f++) pattern[j, f] /= a;
            }
        int reduced = 0;
        var itemFactor = new int[p];
        var loadings = new double[p];
        for (int j = 0; j < p; j++)
        {
            double cv = 0;
            for (int a = 0; a < k; a++)
                for (int b = 0; b < k; b++) cv += pattern[j, a] * phi[a, b] * pattern[j, b];
            if (cv > MaxCommonVariance)
            {
                double f = Math.Sqrt(MaxCommonVariance / cv);
                for (int a = 0; a < k; a++) pattern[j, a] *= f;
                reduced++;
            }
            int best = 0;
            for (int a = 1; a < k; a++) if (Math.Abs(pattern[j, a]) > Math.Abs(pattern[j, best])) best = a;
            itemFactor[j] = best;
            loadings[j] = pattern[j, best];
        }
        if (reduced > 0)
            warnings.Add(new AnalysisWarning("self-check-loadings-reduced", "self-check", string.Create(CultureInfo.InvariantCulture,
                $"{reduced} item(s) had a fitted common variance above {MaxCommonVariance}; their loadings were scaled down to it for the simulated surveys.")));
        var spec = new FactorModelSpec
        {
            ItemFactor = itemFactor,
            Loadings = loadings,
            Pattern = pattern,
            FactorCorrelations = (double[,])phi.Clone(),
            ItemScales = scales,
            ReverseKeyed = data.Items.Select(i => i.Reverse).ToArray(),
        };
        var settings = new FactorModelSimulator.Settings(main.Prepared.Scored.RespondentCount, 0, ItemMissingRates: missing,
            Items: data.Items.ToArray());
        return (spec, settings);
    }

    /// <summary>
    /// Correlation of answers cut from a standard normal latent score with that score: Σ_t φ(τ_t)(x_{t+1} − x_t) / σ_X,
    /// with τ_t the normal quantiles of the cumulative shares, x_t the answer values and σ_X their standard deviation —
    /// the ratio of the point-polyserial to the polyserial correlation in Olsson, U., Drasgow, F., &amp; Dorans, N. J.
    /// (1982). The polyserial correlation coefficient. Psychometrika, 47(3), 337–347. For two items it makes the Pearson
    /// correlation of the answers about a_j·a_k times the latent one (exact only to first order).
    /// </summary>
    internal static double LatentCorrelation(ItemAnswerScale s)
    {
        double mean = 0, sq = 0;
        for (int t = 0; t < s.Values.Length; t++) mean += s.Probabilities[t] * s.Values[t];
        for (int t = 0; t < s.Values.Length; t++) sq += s.Probabilities[t] * (s.Values[t] - mean) * (s.Values[t] - mean);
        if (!(sq > 0)) return double.NaN;
        double acc = 0, cov = 0;
        for (int t = 0; t + 1 < s.Values.Length; t++)
        {
            acc += s.Probabilities[t];
            if (acc >= 1) break;
            cov += MathNet.Numerics.Distributions.Normal.PDF(0, 1, MathNet.Numerics.Distributions.Normal.InvCDF(0, 1, acc)) * (s.Values[t + 1] - s.Values[t]);
        }
        return cov / Math.Sqrt(sq);
    }

    /// <summary>What one simulated survey gave.</summary>
    private sealed record Replicate(string? Stopped, CarelessKind[] Truth, bool[]? Flags, int? Picked, HashSet<string> Kept,
        IReadOnlyList<ReliabilityRow> Reliability);

    private static Replicate RunOne(FactorModelSpec spec, FactorModelSimulator.Settings sim, PipelineSettings settings)
    {
        var survey = FactorModelSimulator.Generate(spec, sim);
        try
        {
            var prepared = PreparedData.From(survey.Responses);
            var r = SurveyPipeline.Run(prepared, settings);
            bool[]? flags = r.Screening?.Respondents.Select(x => x.Flagged).ToArray();
            var kept = new HashSet<string>(r.ShortForm!.Scales.SelectMany(s => s.SelectedItems), StringComparer.Ordinal);
            return new Replicate(null, survey.Careless, flags, r.Dimensions?.Retained, kept, r.ShortForm.Reliability);
        }
        catch (AnalysisStoppedException e)
        {
            return new Replicate(e.Message.Split(':')[0], survey.Careless, null, null, [], []);
        }
    }

    private static SelfCheckResult Summarise(PipelineResult main, PipelineSettings settings, Replicate[] outcomes, int n, int p,
        int plantedEach, WarningList warnings)
    {
        var ok = outcomes.Where(o => o.Stopped is null).ToList();
        var stopped = outcomes.Where(o => o.Stopped is not null).GroupBy(o => o.Stopped!, StringComparer.Ordinal)
            .OrderBy(g => g.Key, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count(), StringComparer.Ordinal);
        if (stopped.Count > 0)
            warnings.Add(new AnalysisWarning("self-check-stopped", "self-check", string.Create(CultureInfo.InvariantCulture,
                $"On {outcomes.Length - ok.Count} of {outcomes.Length} simulated surveys a stage stopped ({string.Join("; ", stopped.Select(kv => $"{kv.Key}: {kv.Value}"))}); the self-check describes the other {ok.Count}.")));

        RateEstimate? falseFlags = null;
        var recall = new List<CarelessRecall>();
        if (main.Screening is not null)
        {
            long attentive = 0, flagged = 0;
            var planted = new long[PlantedKinds.Count];
            var caught = new long[PlantedKinds.Count];
            foreach (var o in ok.Where(o => o.Flags is not null))
                for (int i = 0; i < o.Truth.Length; i++)
                {
                    if (o.Truth[i] == CarelessKind.None)
                    {
                        attentive++;
                        if (o.Flags![i]) flagged++;
                        continue;
                    }
                    for (int t = 0; t < PlantedKinds.Count; t++)
                        if (PlantedKinds[t].Kind == o.Truth[i])
                        {
                            planted[t]++;
                            if (o.Flags![i]) caught[t]++;
                        }
                }
            falseFlags = new RateEstimate(flagged, attentive);
            if (plantedEach > 0)
                for (int t = 0; t < PlantedKinds.Count; t++) recall.Add(new CarelessRecall(PlantedKinds[t].Name, new RateEstimate(caught[t], planted[t])));
        }

        var sf = main.ShortForm!;
        int fitted = sf.FullSolution.FactorCount;
        bool fixedCount = settings.Dimensions.FixedFactors is not null;
        var picks = fixedCount ? [] : ok.Where(o => o.Picked is not null).GroupBy(o => o.Picked!.Value).OrderBy(g => g.Key)
            .Select(g => new KeyValuePair<int, int>(g.Key, g.Count())).ToList();
        RateEstimate? recovery = fixedCount ? null : new RateEstimate(ok.Count(o => o.Picked == fitted), ok.Count(o => o.Picked is not null));

        var stability = sf.Scales.SelectMany(s => s.SelectedItems.Select(item =>
            new ItemStability(item, s.Scale, new RateEstimate(ok.Count(o => o.Kept.Contains(item)), ok.Count)))).ToList();

        var scales = new List<ScaleSpread>();
        foreach (var role in new[] { SampleRole.All, SampleRole.Selection, SampleRole.Holdout })
            foreach (var s in sf.Scales)
            {
                var observed = sf.Reliability.FirstOrDefault(x => x.Scale == s.Scale && x.Form == ScaleForm.Short && x.Sample == role);
                if (observed is null) continue;
                var rows = ok.Select(o => o.Reliability.FirstOrDefault(x => x.Scale == s.Scale && x.Form == ScaleForm.Short && x.Sample == role)).ToList();
                scales.Add(new ScaleSpread(s.Scale, role,
                    new Spread(rows.Select(x => x?.Alpha ?? double.NaN).ToArray()),
                    new Spread(rows.Select(x => x?.Omega ?? double.NaN).ToArray()),
                    new Spread(rows.Select(x => x?.ShortFullCorrelation ?? double.NaN).ToArray()),
                    observed.Alpha, observed.Omega, observed.ShortFullCorrelation));
            }

        return new SelfCheckResult
        {
            Requested = outcomes.Length,
            Completed = ok.Count,
            Stopped = stopped,
            Respondents = n,
            Items = p,
            PlantedEach = plantedEach,
            FalseFlags = falseFlags,
            Recall = recall,
            FittedFactors = fitted,
            DimensionRecovery = recovery,
            DimensionPicks = picks,
            Stability = stability,
            Scales = scales,
            Warnings = warnings,
        };
    }
}
