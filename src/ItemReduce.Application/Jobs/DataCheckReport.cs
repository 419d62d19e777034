using System.Globalization;
using System.Text;

namespace ItemReduce.Application.Jobs;

/// <summary>Plain-text data summary printed by <c>itemreduce check</c>.</summary>
public static class DataCheckReport
{
    public static string Format(LoadedSurvey survey, JobSettings settings)
    {
        var ci = CultureInfo.InvariantCulture;
        var p = survey.Prepared;
        var s = p.RawSummary;
        var sb = new StringBuilder();
        sb.AppendLine($"Responses : {settings.Responses} (sha256 {survey.ResponsesSha256[..12]}…)");
        sb.AppendLine($"Codebook  : {settings.Codebook} (sha256 {survey.CodebookSha256[..12]}…)");
        sb.AppendLine($"Delimiter : {DelimiterName(survey.Intake.Delimiter)}; id column: {survey.Intake.IdColumn ?? "(none: data line numbers)"}");
        sb.AppendLine($"Missing codes: empty cell{string.Concat(settings.Intake.EffectiveMissingCodes.Where(c => c.Length > 0).Select(c => ", " + c))}");
        sb.AppendLine(string.Create(ci, $"Respondents: {s.Respondents} ({s.CompleteRespondents} complete, {s.RespondentsWithNoAnswers} with no answers)"));
        sb.AppendLine(string.Create(ci, $"Items      : {p.Raw.ItemCount} in codebook, {p.Scored.ItemCount} usable, {p.Raw.Items.Count(i => i.Reverse)} reverse-keyed"));
        sb.AppendLine(string.Create(ci, $"Missing    : {s.MissingShare:P2} of all answers"));
        if (survey.Intake.IgnoredColumns.Count > 0)
            sb.AppendLine($"Ignored columns (not in codebook): {string.Join(", ", survey.Intake.IgnoredColumns)}");
        sb.AppendLine();
        int w = Math.Max(4, p.Raw.Items.Max(i => i.Name.Length));
        sb.AppendLine($"{"item".PadRight(w)}  subscale        rev  scale    used     missing   mean    sd");
        for (int j = 0; j < s.Items.Count; j++)
        {
            var it = s.Items[j];
            var def = p.Raw.Items[j];
            string scale = $"{def.Min.ToString(ci)}–{def.Max.ToString(ci)}";
            string used = it.Answered > 0 ? $"{it.ObservedMin.ToString(ci)}–{it.ObservedMax.ToString(ci)}" : "none";
            sb.AppendLine(string.Create(ci,
                $"{it.Item.PadRight(w)}  {(def.Subscale ?? "").PadRight(14)}  {(def.Reverse ? "yes" : "no "),-3}  {scale,-7}  {used,-7}  {it.MissingShare,7:P1}  {it.Mean,5:F2}  {it.StandardDeviation,5:F2}"));
        }
        if (p.Warnings.Count > 0) sb.AppendLine($"Warnings: {p.Warnings.Count.ToString(ci)} (on stderr)");
        sb.AppendLine();
        sb.AppendLine("The data passed every check.");
        return sb.ToString();
    }

    internal static string DelimiterName(char d) => d switch { ',' => "comma", ';' => "semicolon", '\t' => "tab", _ => d.ToString() };
}
