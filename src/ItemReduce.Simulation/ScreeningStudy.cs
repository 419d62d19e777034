using System.Globalization;
using System.Text;
using ItemReduce.Core.Data;
using ItemReduce.Core.Screening;

namespace ItemReduce.Simulation;

/// <summary>
/// Seeded validation study of <see cref="RespondentScreening"/>: ordinal survey data from a factor model with known
/// careless respondents planted, screened at given options; per condition it counts how many attentive respondents
/// each rule flags (false-flag rate) and how many planted respondents of each kind are flagged (recall).
/// The data model: items in subscales of six, loadings cycling 0.5, 0.6, 0.7, 0.8, factor correlations 0.3, every
/// third item reverse-keyed (and reverse-scored before screening, as the pipeline does), answers cut at normal
/// quantiles of symmetric or skewed category probabilities, answers missing completely at random.
/// </summary>
public static class ScreeningStudy
{
    /// <summary>One design cell.</summary>
    /// <param name="Items">p (a multiple of 6).</param>
    /// <param name="Categories">Response categories (4 to 7).</param>
    /// <param name="Skewed">Skewed category probabilities (most answers in the upper two categories) instead of symmetric ones.</param>
    /// <param name="MissingRate">Probability that one answer is missing (MCAR).</param>
    /// <param name="Respondents">n.</param>
    /// <param name="CarelessShare">Share of planted careless respondents, split evenly over the five kinds.</param>
    /// <param name="Replicates">Data sets drawn.</param>
    public sealed record Condition(int Items, int Categories, bool Skewed, double MissingRate, int Respondents, double CarelessShare, int Replicates)
    {
        /// <summary>Short text label.</summary>
        public string Label => string.Create(CultureInfo.InvariantCulture,
            $"p={Items} c={Categories} {(Skewed ? "skew" : "sym")} miss={MissingRate:0.##} n={Respondents} careless={CarelessShare:0.##}");
    }

    /// <summary>Counts of one condition.</summary>
    public sealed class Outcome(Condition condition)
    {
        /// <summary>The condition.</summary>
        public Condition Condition { get; } = condition;
        /// <summary>Attentive respondents screened over all replicates.</summary>
        public long Attentive { get; set; }
        /// <summary>Attentive respondents flagged by any rule.</summary>
        public long AttentiveFlagged { get; set; }
        /// <summary>Attentive respondents flagged, by reason code.</summary>
        public Dictionary<string, long> AttentiveByReason { get; } = new(StringComparer.Ordinal);
        /// <summary>Planted respondents by kind.</summary>
        public Dictionary<CarelessKind, long> Planted { get; } = [];
        /// <summary>Planted respondents flagged by any rule, by kind.</summary>
        public Dictionary<CarelessKind, long> Caught { get; } = [];
        /// <summary>Planted respondents flagged, by (kind, reason).</summary>
        public Dictionary<(CarelessKind, string), long> CaughtByReason { get; } = [];
        /// <summary>Yardsticks for the recall of random responders in this design (null when not computed).</summary>
        public ScreeningOracle.Result? Oracle { get; set; }
        /// <summary>Distance rule used ("robust"/"classical") per replicate, counted.</summary>
        public Dictionary<string, int> DistanceRule { get; } = new(StringComparer.Ordinal);

        /// <summary>Share of attentive respondents flagged by <paramref name="reason"/> (null = any rule).</summary>
        public double FalseFlagRate(string? reason = null) =>
            Attentive == 0 ? double.NaN : (reason is null ? AttentiveFlagged : AttentiveByReason.GetValueOrDefault(reason)) / (double)Attentive;

        /// <summary>Share of planted <paramref name="kind"/> respondents flagged by <paramref name="reason"/> (null = any rule).</summary>
        public double Recall(CarelessKind kind, string? reason = null)
        {
            long planted = Planted.GetValueOrDefault(kind);
            if (planted == 0) return double.NaN;
            return (reason is null ? Caught.GetValueOrDefault(kind) : CaughtByReason.GetValueOrDefault((kind, reason))) / (double)planted;
        }
    }

    /// <summary>Pseudo reason counted for comparison only: the classical distance beyond its χ² cutoff (whether or not it is the rule in
    /// use).</summary>
    public const string ClassicalChiSquare = "(classical d2 > chi2)";

    /// <summary>Pseudo reason counted for comparison only: the random-answering index beyond its cutoff where it raises no
    /// flag (fewer than 10 respondents per item).</summary>
    public const string RandomIndexUnflagged = "(random-answer index > cutoff, no flag)";

    /// <summary>The careless kinds planted, in order.</summary>
    public static IReadOnlyList<CarelessKind> Kinds { get; } =
        [CarelessKind.UniformRandom, CarelessKind.StraightLine, CarelessKind.WideAlternation, CarelessKind.NarrowAlternation, CarelessKind.MostlyUnanswered];

    /// <summary>The factor model of a condition.</summary>
    public static FactorModelSpec Model(Condition c)
    {
        int p = c.Items, k = Math.Max(1, p / 6);
        var f = new int[p];
        var l = new double[p];
        var rev = new bool[p];
        for (int j = 0; j < p; j++)
        {
            f[j] = Math.Min(k - 1, j / 6);
            l[j] = 0.5 + 0.1 * (j % 4);
            rev[j] = j % 3 == 2;
        }
        var phi = new double[k, k];
        for (int a = 0; a < k; a++)
            for (int b = 0; b < k; b++) phi[a, b] = a == b ? 1.0 : 0.3;
        return new FactorModelSpec
        {
            ItemFactor = f,
            Loadings = l,
            FactorCorrelations = phi,
            Categories = c.Categories,
            ReverseKeyed = rev,
            CategoryProbabilities = c.Skewed ? Skewed(c.Categories) : Symmetric(c.Categories),
        };
    }

    /// <summary>Symmetric, bell-shaped category probabilities.</summary>
    public static double[] Symmetric(int categories)
    {
        var pr = new double[categories];
        double mid = (categories - 1) / 2.0;
        for (int t = 0; t < categories; t++) pr[t] = Math.Exp(-0.5 * Math.Pow((t - mid) / (categories / 3.5), 2));
        return pr;
    }

    /// <summary>Skewed category probabilities: weights 1, 2, 4, 8, ... (the top category about half the answers).</summary>
    public static double[] Skewed(int categories)
    {
        var pr = new double[categories];
        for (int t = 0; t < categories; t++) pr[t] = Math.Pow(2, t);
        return pr;
    }

    /// <summary>Draws one replicate of <paramref name="c"/>: the analysed (reverse-scored) data, the data as answered and the truth.</summary>
    public static (ResponseMatrix Scored, ResponseMatrix AsAnswered, CarelessKind[] Truth) Draw(Condition c, ulong seed)
    {
        int planted = (int)Math.Round(c.CarelessShare * c.Respondents);
        int each = planted / Kinds.Count, extra = planted - each * Kinds.Count;
        int Count(int k) => each + (k < extra ? 1 : 0);
        var s = FactorModelSimulator.Generate(Model(c), new FactorModelSimulator.Settings(c.Respondents, seed, c.MissingRate,
            StraightLiners: Count(1), RandomResponders: Count(0), WideAlternators: Count(2), NarrowAlternators: Count(3), MostlyUnanswered: Count(4)));
        return (ReverseScoring.Apply(s.Responses), s.Responses, s.Careless);
    }

    /// <summary>Runs every replicate of <paramref name="c"/> (replicate r uses data seed <c>baseSeed + r</c>; the
    /// screening itself has no random step).</summary>
    public static Outcome Run(Condition c, ScreeningOptions options, ulong baseSeed)
    {
        var outcome = new Outcome(c);
        for (int r = 0; r < c.Replicates; r++)
        {
            var (scored, raw, truth) = Draw(c, baseSeed + (ulong)r);
            var result = RespondentScreening.Run(scored, options, raw);
            outcome.DistanceRule[result.DistanceRule] = outcome.DistanceRule.GetValueOrDefault(result.DistanceRule) + 1;
            for (int i = 0; i < truth.Length; i++)
            {
                var row = result.Respondents[i];
                IEnumerable<string> reasons = row.PValue < options.CutoffP ? row.Reasons.Append(ClassicalChiSquare) : row.Reasons;
                if (!result.RandomAnsweringFlags && row.RandomAnswering > result.RandomAnsweringCutoff) reasons = reasons.Append(RandomIndexUnflagged);
                if (truth[i] == CarelessKind.None)
                {
                    outcome.Attentive++;
                    if (row.Flagged) outcome.AttentiveFlagged++;
                    foreach (var reason in reasons) outcome.AttentiveByReason[reason] = outcome.AttentiveByReason.GetValueOrDefault(reason) + 1;
                }
                else
                {
                    outcome.Planted[truth[i]] = outcome.Planted.GetValueOrDefault(truth[i]) + 1;
                    if (row.Flagged) outcome.Caught[truth[i]] = outcome.Caught.GetValueOrDefault(truth[i]) + 1;
                    foreach (var reason in reasons)
                        outcome.CaughtByReason[(truth[i], reason)] = outcome.CaughtByReason.GetValueOrDefault((truth[i], reason)) + 1;
                }
            }
        }
        return outcome;
    }

    /// <summary>Short names of the careless kinds for table headers.</summary>
    public static string KindName(CarelessKind k) => k switch
    {
        CarelessKind.UniformRandom => "random",
        CarelessKind.StraightLine => "straight",
        CarelessKind.WideAlternation => "wide-alt",
        CarelessKind.NarrowAlternation => "narrow-alt",
        CarelessKind.MostlyUnanswered => "unanswered",
        _ => k.ToString(),
    };

    /// <summary>Markdown table of the random-responder recall of the screening (any rule) next to the yardsticks of
    /// <see cref="ScreeningOracle"/>: the likelihood-ratio test with the true model at the nominal rate
    /// <paramref name="nominal"/> and at the screening's own measured false-flag rate, and the known-model distance.</summary>
    public static string OracleTable(IEnumerable<Outcome> outcomes, double nominal)
    {
        var inv = CultureInfo.InvariantCulture;
        var b = new StringBuilder();
        b.Append("| items | cat | dist | miss | n | careless | our false-flag % | our random recall % | LR recall % at nominal (its false-flag %) | LR recall % at our false-flag rate | known-model distance recall % at nominal (its false-flag %) |\n");
        b.Append("|---:|---:|---|---:|---:|---:|---:|---:|---:|---:|---:|\n");
        foreach (var o in outcomes)
        {
            if (o.Oracle is not { } y || double.IsNaN(o.Recall(CarelessKind.UniformRandom))) continue;
            var c = o.Condition;
            double ours = o.FalseFlagRate();
            var lr = y.LikelihoodRatio(nominal);
            var lrOurs = y.LikelihoodRatio(Math.Max(ours, 1.0 / y.NullRows));
            var d = y.KnownModelDistance(nominal);
            b.Append(inv, $"| {c.Items} | {c.Categories} | {(c.Skewed ? "skewed" : "symmetric")} | {c.MissingRate:0.##} | {c.Respondents} | {c.CarelessShare:0.##} | ")
             .Append(inv, $"{100 * ours:0.000} | {100 * o.Recall(CarelessKind.UniformRandom):0.0} | {100 * lr.Recall:0.0} ({100 * lr.FalseFlagRate:0.000}) | ")
             .Append(inv, $"{100 * lrOurs.Recall:0.0} | {100 * d.Recall:0.0} ({100 * d.FalseFlagRate:0.000}) |\n");
        }
        return b.ToString();
    }

    /// <summary>Markdown table: one row per condition and rule (any rule first), false-flag rate and recall per kind.</summary>
    public static string Table(IEnumerable<Outcome> outcomes, IReadOnlyList<string> reasons)
    {
        var inv = CultureInfo.InvariantCulture;
        var b = new StringBuilder();
        b.Append("| items | cat | dist | miss | n | careless | rule | attentive | false-flag % |");
        foreach (var k in Kinds) b.Append(' ').Append(KindName(k)).Append(" % |");
        b.Append('\n').Append("|---:|---:|---|---:|---:|---:|---|---:|---:|");
        foreach (var _ in Kinds) b.Append("---:|");
        b.Append('\n');
        foreach (var o in outcomes)
        {
            var c = o.Condition;
            foreach (string? reason in new string?[] { null }.Concat(reasons))
            {
                if (reason is not null && o.AttentiveByReason.GetValueOrDefault(reason) == 0 && !Kinds.Any(k => o.CaughtByReason.GetValueOrDefault((k, reason)) > 0))
                    continue;
                b.Append(inv, $"| {c.Items} | {c.Categories} | {(c.Skewed ? "skewed" : "symmetric")} | {c.MissingRate:0.##} | {c.Respondents} | {c.CarelessShare:0.##} | ")
                 .Append(reason ?? "any").Append(inv, $" | {o.Attentive} | {100 * o.FalseFlagRate(reason):0.000} |");
                foreach (var k in Kinds)
                {
                    double rc = o.Recall(k, reason);
                    b.Append(double.IsNaN(rc) ? " – |" : string.Create(inv, $" {100 * rc:0.0} |"));
                }
                b.Append('\n');
            }
        }
        return b.ToString();
    }
}
