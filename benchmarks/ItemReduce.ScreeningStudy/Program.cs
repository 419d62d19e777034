using System.Diagnostics;
using System.Globalization;
using ItemReduce.Core.Screening;
using ItemReduce.Simulation;

// Validation study of the respondent-screening rules (seeded; one command):
//   dotnet run -c Release --project benchmarks/ItemReduce.ScreeningStudy -- [full|quick|case] [output.md]
// "full" (default) runs the whole design grid, "quick" a small slice, "case p c skew miss n careless reps" one cell.
var inv = CultureInfo.InvariantCulture;
string mode = args.Length > 0 ? args[0] : "full";
var conditions = new List<ScreeningStudy.Condition>();
const int AttentiveTarget = 4_000;   // attentive respondents per cell (fewer for n = 5 × items, see MaxReps)
const int MaxReps = 40;
int Reps(int n, int min = 2) => Math.Min(MaxReps, Math.Max(min, (int)Math.Ceiling(AttentiveTarget / (double)n)));
if (mode == "oracle")
{
    // oracle p c skew miss: the yardsticks alone for one design.
    var oc = new ScreeningStudy.Condition(int.Parse(args[1], inv), int.Parse(args[2], inv), args[3] == "skew", double.Parse(args[4], inv), 0, 0, 0);
    var sw = Stopwatch.StartNew();
    var res = ScreeningOracle.Run(oc, 77);
    foreach (double rate in new[] { 0.001, 0.002 })
        foreach (var (name, pt) in new[] { ("LR", res.LikelihoodRatio(rate)), ("D2", res.KnownModelDistance(rate)), ("copula", res.CopulaApproximation(rate)) })
            Console.WriteLine(string.Create(inv, $"{name} target {pt.TargetRate}: false {100 * pt.FalseFlagRate:0.000}% recall {100 * pt.Recall:0.0}%"));
    Console.WriteLine(string.Create(inv, $"{sw.Elapsed.TotalSeconds:0.0} s"));
    return;
}
switch (mode)
{
    case "case":
        conditions.Add(new(int.Parse(args[1], inv), int.Parse(args[2], inv), args[3] == "skew", double.Parse(args[4], inv),
            int.Parse(args[5], inv), double.Parse(args[6], inv), int.Parse(args[7], inv)));
        break;
    case "index-careless":
    case "index-careless-12":
        // Slice for the random-answering index: careless respondents at 5 % and 10 % with 20 respondents per item.
        foreach (int p in mode == "index-careless" ? new[] { 48, 24, 36 } : new[] { 12 })
            foreach (bool skew in new[] { true, false })
                foreach (double share in new[] { 0.05, 0.10 })
                {
                    int n = 20 * p;
                    conditions.Add(new(p, 5, skew, 0.05, n, share, Math.Max(2, (int)Math.Ceiling(200 / (share * n)))));
                }
        break;
    case "index-attentive":
        // Slice for the random-answering index: attentive respondents only (20 and 5 respondents per item, 0 and 10 % missing).
        foreach (int ratio in new[] { 20, 5 })
            foreach (int p in new[] { 24, 36 })
                foreach (bool skew in new[] { true, false })
                    foreach (double miss in new[] { 0.10, 0.0 })
                    {
                        if (ratio == 5 && miss == 0.0) continue;
                        int n = ratio * p;
                        conditions.Add(new(p, 5, skew, miss, n, 0.0, Reps(n)));
                    }
        conditions.Add(new(48, 5, true, 0.05, 960, 0.0, Reps(960)));
        break;
    case "quick":
        conditions.Add(new(24, 5, false, 0.0, 200, 0.0, 20));
        conditions.Add(new(30, 7, false, 0.05, 600, 0.03, 6));
        conditions.Add(new(24, 5, true, 0.10, 480, 0.10, 6));
        conditions.Add(new(12, 4, true, 0.05, 60, 0.0, 40));
        break;
    default:
        // Ordered by importance, so that a stopped run still covers the main cells (the table is rewritten after
        // every condition). 1. The two cases the rules must get right first.
        conditions.Add(new(30, 7, false, 0.05, 600, 0.03, Reps(600)));
        conditions.Add(new(24, 5, false, 0.0, 200, 0.0, Reps(200)));
        // 2. Careless respondents at 5 % and 10 % with 20 respondents per item: recall (and the attentive rest).
        foreach (int p in new[] { 24, 36, 48, 12 })
            foreach (bool skew in new[] { false, true })
                foreach (double share in new[] { 0.05, 0.10 })
                {
                    int n = 20 * p;
                    conditions.Add(new(p, 5, skew, 0.05, n, share, Math.Max(2, (int)Math.Ceiling(400 / (share * n)))));
                }
        // 3. Attentive respondents only: the false-flag rate.
        foreach (int ratio in new[] { 20, 5, 100 })
            foreach (int p in new[] { 24, 12, 36 })
                foreach (int c in new[] { 5, 7, 4 })
                    foreach (bool skew in new[] { false, true })
                        foreach (double miss in new[] { 0.10, 0.0 })
                        {
                            if (ratio == 100 && p == 36) continue;
                            int n = ratio * p;
                            conditions.Add(new(p, c, skew, miss, n, 0.0, Reps(n)));
                        }
        // 4. Careless respondents with 5 respondents per item.
        foreach (int p in new[] { 24, 36 })
            foreach (bool skew in new[] { false, true })
            {
                int n = 5 * p;
                conditions.Add(new(p, 5, skew, 0.05, n, 0.10, Math.Max(2, (int)Math.Ceiling(400 / (0.10 * n)))));
            }
        break;
}

var options = new ScreeningOptions();
var reasons = ScreeningReasons.All.Append(ScreeningStudy.ClassicalChiSquare).Append(ScreeningStudy.RandomIndexUnflagged).ToList();
var watch = Stopwatch.StartNew();
var outcomes = new List<ScreeningStudy.Outcome>();
var oracles = new Dictionary<(int, int, bool, double), ScreeningOracle.Result>();
for (int i = 0; i < conditions.Count; i++)
{
    var c = conditions[i];
    var o = ScreeningStudy.Run(c, options, 1_000_000UL * (ulong)(i + 1));
    if (c.CarelessShare > 0 && mode != "case")
    {
        // The yardsticks depend only on the items, categories, answer distribution and missing rate: one per design kind.
        var key = (c.Items, c.Categories, c.Skewed, c.MissingRate);
        if (!oracles.TryGetValue(key, out var y)) oracles[key] = y = ScreeningOracle.Run(c, 7_000_000UL + (ulong)oracles.Count * 10);
        o.Oracle = y;
    }
    outcomes.Add(o);
    string recall = string.Join(" ", ScreeningStudy.Kinds.Select(k => string.Create(inv, $"{ScreeningStudy.KindName(k)} {100 * o.Recall(k):0.#}")));
    string byReason = string.Join(" ", reasons.Select(r => string.Create(inv, $"{r}={100 * o.FalseFlagRate(r):0.000}")))
        + string.Create(inv, $" | random recall by random-like-answers {100 * o.Recall(CarelessKind.UniformRandom, ScreeningReasons.RandomLikeAnswers):0.0}, by distance {100 * o.Recall(CarelessKind.UniformRandom, ScreeningReasons.RobustDistance):0.0}");
    if (args.Length > 1 && mode != "case") File.WriteAllText(args[1], Header(outcomes.Count) + ScreeningStudy.Table(outcomes, reasons) + OracleSection());
    Console.Error.WriteLine(string.Create(inv, $"[{watch.Elapsed.TotalSeconds,6:0}s] {c.Label}: false {100 * o.FalseFlagRate():0.000}% ({byReason}) {recall} rule ") +
        string.Join("/", o.DistanceRule.Select(kv => $"{kv.Key}:{kv.Value}")));
}
string table = ScreeningStudy.Table(outcomes, reasons);
if (args.Length > 1 && mode != "case") File.WriteAllText(args[1], Header(outcomes.Count) + table + OracleSection());
else if (mode != "case") Console.WriteLine(Header(outcomes.Count) + table + OracleSection());

string OracleSection() => "\n## Random responders: the screening against the best possible test\n\n" +
    "Recall of the planted uniform-random responders by the screening (any rule) next to two yardsticks that know the true population model " +
    "(ItemReduce.Simulation.ScreeningOracle): LR = the likelihood ratio of uniform-random answers against the true ordinal factor model, the most powerful test " +
    "at a given false-flag rate (Neyman-Pearson lemma), its threshold the upper quantile of 100,000 simulated attentive respondents of the same design " +
    "and its false-flag rate checked on 100,000 more (in brackets); recall on 20,000 simulated random responders. \"At our false-flag rate\" holds the LR test " +
    "to the screening's measured any-rule rate of that cell. Known-model distance = squared Mahalanobis distance of population normal scores with the " +
    "population covariance, threshold simulated the same way: the best the distance statistic itself can do. No rule that uses only the data can beat the LR column.\n\n" +
    ScreeningStudy.OracleTable(outcomes, options.CutoffP);

string Header(int done) => string.Create(inv, $"# Screening validation study ({mode})\n\nDefault screening options (cutoff p = {options.CutoffP}). ") +
    string.Create(inv, $"{done} of {conditions.Count} conditions done, {watch.Elapsed.TotalMinutes:0.0} minutes on {Environment.ProcessorCount} cores. ") +
    "Columns: attentive = attentive respondents screened over all replicates; false-flag % = share of them flagged by the rule " +
    "(\"any\" = by at least one rule); then recall % per planted kind. \"(classical d2 > chi2)\" counts the classical distance " +
    "against its chi-square cutoff for comparison only (it raises no flag unless --distance classical).\n\n";
if (mode == "case")
    for (int r = 0; r < conditions[0].Replicates; r++)
    {
        var (scored, raw, truth) = ScreeningStudy.Draw(conditions[0], 1_000_000UL + (ulong)r);
        var res = RespondentScreening.Run(scored, options, raw);
        var randomD2 = Enumerable.Range(0, truth.Length).Where(i => truth[i] == CarelessKind.UniformRandom && res.Respondents[i].ItemsAnswered == scored.ItemCount)
            .Select(i => (res.Respondents[i].RobustD2, res.Respondents[i].D2)).ToList();
        var attentiveD2 = Enumerable.Range(0, truth.Length).Where(i => truth[i] == CarelessKind.None && res.Respondents[i].ItemsAnswered == scored.ItemCount)
            .Select(i => res.Respondents[i].RobustD2).OrderBy(v => v).ToList();
        var full = res.Respondents.First(x => x.ItemsAnswered == scored.ItemCount);
        Console.WriteLine(string.Create(inv, $"rep {r}: robust flags {res.ReasonCounts[0].Count}, kept {res.Robust.SupportSize}/{res.Robust.RowsUsed}, converged {res.Robust.Converged}, available {res.Robust.Available}; " +
            $"cutoff {full.Cutoff:0.0}; random robust D2 {string.Join(" ", randomD2.Select(v => v.RobustD2.ToString("0", inv)))}; classical {string.Join(" ", randomD2.Select(v => v.D2.ToString("0", inv)))}; attentive median {attentiveD2[attentiveD2.Count / 2]:0.0} max {attentiveD2[^1]:0.0}"));
    }
