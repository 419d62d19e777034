using System.Text.Json.Nodes;
using ItemReduce.Core.SelfCheck;
using ItemReduce.Core.ShortForm;
using static ItemReduce.IO.JsonOut;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>One quantity of the self-check: its value, its interval and the simulated surveys it rests on.</summary>
/// <param name="Quantity">Dotted name, e.g. <c>screening.false_flag_rate</c> or <c>short_form.alpha.comfort</c>.</param>
/// <param name="Value">Rate (share of respondents or surveys) or median.</param>
/// <param name="Low">Interval low end: 95 % Wilson score interval for rates, 5th percentile for distributions.</param>
/// <param name="High">Interval high end: 95 % Wilson score interval for rates, 95th percentile for distributions.</param>
/// <param name="Surveys">Simulated surveys the quantity rests on.</param>
/// <param name="IsRate">True for a rate (Wilson interval), false for a distribution (percentiles).</param>
/// <param name="Observed">This survey's value of the same quantity, when it has one (NaN otherwise).</param>
public sealed record SelfCheckRow(string Quantity, double Value, double Low, double High, int Surveys, bool IsRate, double Observed);

/// <summary><c>self-check.csv</c> and the <c>selfCheck</c> block of summary.json.</summary>
public static class SelfCheckTables
{
    /// <summary>File name of the table.</summary>
    public const string FileName = "self-check.csv";

    private const int Decimals = 6;

    /// <summary>Name of a planted kind in quantity names (snake case).</summary>
    private static string Snake(string s) => s.Replace('-', '_');

    /// <summary>Prefix of a reliability quantity: <c>short_form</c> (all analysed respondents, or the selection part with a
    /// holdout) or <c>holdout</c>.</summary>
    public static string SamplePrefix(SampleRole role) => role == SampleRole.Holdout ? "holdout" : "short_form";

    /// <summary>Every quantity, in table order: screening, dimensions, item stability, reliability.</summary>
    public static IReadOnlyList<SelfCheckRow> Rows(SelfCheckResult selfCheck)
    {
        ArgumentNullException.ThrowIfNull(selfCheck);
        var rows = new List<SelfCheckRow>();
        SelfCheckRow Rate(string q, RateEstimate r, int surveys)
        {
            var (lo, hi) = r.Interval;
            return new SelfCheckRow(q, r.Rate, lo, hi, surveys, true, double.NaN);
        }
        if (selfCheck.FalseFlags is { } ff) rows.Add(Rate("screening.false_flag_rate", ff, selfCheck.Completed));
        foreach (var r in selfCheck.Recall) rows.Add(Rate("screening.recall." + Snake(r.Kind), r.Recall, selfCheck.Completed));
        if (selfCheck.DimensionRecovery is { } rec)
        {
            rows.Add(Rate("dimensions.recovery", rec, (int)rec.Trials));
            foreach (var kv in selfCheck.DimensionPicks)
                rows.Add(Rate(FormattableString.Invariant($"dimensions.picked.{kv.Key}"), new RateEstimate(kv.Value, rec.Trials), (int)rec.Trials));
        }
        foreach (var s in selfCheck.Stability) rows.Add(Rate("short_form.kept_again." + s.Item, s.KeptAgain, (int)s.KeptAgain.Trials));
        foreach (var role in new[] { SampleRole.All, SampleRole.Selection, SampleRole.Holdout })
            foreach (var (name, pick, observed) in new (string, Func<ScaleSpread, Spread>, Func<ScaleSpread, double>)[]
                     { ("alpha", s => s.Alpha, s => s.ObservedAlpha), ("omega", s => s.Omega, s => s.ObservedOmega), ("short_full_r", s => s.ShortFull, s => s.ObservedShortFull) })
                foreach (var s in selfCheck.Scales.Where(s => s.Sample == role))
                {
                    var d = pick(s);
                    rows.Add(new SelfCheckRow($"{SamplePrefix(role)}.{name}.{s.Scale}", d.Median, d.Low, d.High, d.Count, false, observed(s)));
                }
        return rows;
    }

    /// <summary><c>self-check.csv</c>: quantity, value, interval_low, interval_high, simulated_surveys.</summary>
    public static string Csv(SelfCheckResult selfCheck)
    {
        var w = new SafeCsvWriter(["quantity", "value", "interval_low", "interval_high", "simulated_surveys"]);
        foreach (var r in Rows(selfCheck))
            w.AppendRow([Text(r.Quantity), Number(r.Value, Decimals), Number(r.Low, Decimals), Number(r.High, Decimals), Integer(r.Surveys)]);
        return w.ToString();
    }

    /// <summary>The <c>selfCheck</c> block of summary.json.</summary>
    public static JsonObject Json(SelfCheckResult selfCheck)
    {
        ArgumentNullException.ThrowIfNull(selfCheck);
        return new JsonObject
        {
            ["simulatedSurveys"] = selfCheck.Requested,
            ["completed"] = selfCheck.Completed,
            ["stopped"] = new JsonObject(selfCheck.Stopped.Select(kv => KeyValuePair.Create(kv.Key, (JsonNode?)kv.Value))),
            ["respondents"] = selfCheck.Respondents,
            ["items"] = selfCheck.Items,
            ["plantedPerKind"] = selfCheck.PlantedEach,
            ["fittedFactors"] = selfCheck.FittedFactors,
            ["intervals"] = new JsonObject
            {
                ["rates"] = "95% Wilson score interval (Monte Carlo uncertainty)",
                ["distributions"] = "5th to 95th percentile over the simulated surveys",
            },
            ["quantities"] = new JsonArray(Rows(selfCheck).Select(r => (JsonNode?)new JsonObject
            {
                ["quantity"] = r.Quantity,
                ["value"] = Num(r.Value),
                ["interval"] = Nums([r.Low, r.High]),
                ["simulatedSurveys"] = r.Surveys,
            }).ToArray()),
            ["file"] = FileName,
            ["caution"] = DesignSelfCheck.Caution,
        };
    }
}
