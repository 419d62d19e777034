using ItemReduce.Core.Screening;
using static ItemReduce.IO.SafeCsvWriter;

namespace ItemReduce.IO.Outputs;

/// <summary>CSV tables of the screening stage.</summary>
public static class ScreeningTables
{
    private const int Decimals = 6;

    /// <summary>
    /// <c>respondent-flags.csv</c>: one row per respondent in input order: respondent, items_answered, d2,
    /// robust_d2, cutoff, p_value, long_string, irv, missing_share, flagged, reasons (then robust_p_value, even_odd).
    /// </summary>
    public static string RespondentFlags(ScreeningResult r)
    {
        using var text = new StringWriter(System.Globalization.CultureInfo.InvariantCulture) { NewLine = "\n" };
        WriteRespondentFlags(r, text);
        return text.ToString();
    }

    /// <summary>Streams <c>respondent-flags.csv</c> (same bytes as <see cref="RespondentFlags"/>) to
    /// <paramref name="sink"/> row by row, so a large panel never becomes one string in memory.</summary>
    public static void WriteRespondentFlags(ScreeningResult r, TextWriter sink)
    {
        ArgumentNullException.ThrowIfNull(r);
        ArgumentNullException.ThrowIfNull(sink);
        var w = new SafeCsvWriter(["respondent", "items_answered", "d2", "robust_d2", "cutoff", "p_value", "long_string", "irv",
            "missing_share", "flagged", "reasons", "robust_p_value", "even_odd"], sink);
        foreach (var x in r.Respondents)
        {
            w.AppendRow([Text(x.RespondentId), Integer(x.ItemsAnswered), Number(x.D2, Decimals), Number(x.RobustD2, Decimals),
                Number(x.Cutoff, Decimals), Number(x.PValue), Integer(x.LongString), Number(x.Irv, Decimals), Number(x.MissingShare, Decimals),
                Bool(x.Flagged), Text(string.Join(';', x.Reasons)), Number(x.RobustPValue), Number(x.EvenOdd, Decimals)]);
        }
    }

    /// <summary>
    /// <c>centre-share-by-items.csv</c>: for k items, the share of a standardized normal sample inside the
    /// half-peak-density region and beyond the chi-square cutoff.
    /// </summary>
    public static string CentreShare(ScreeningResult r)
    {
        var w = new SafeCsvWriter(["items", "share_inside_half_peak", "share_beyond_cutoff", "cutoff"]);
        foreach (var h in r.HalfPeakRegion)
            w.AppendRow([Integer(h.Items), Number(h.ShareInsideHalfPeak), Number(h.ShareBeyondCutoff), Number(h.Cutoff, Decimals)]);
        return w.ToString();
    }
}
