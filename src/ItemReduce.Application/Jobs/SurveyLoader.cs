using ItemReduce.Core.Pipeline;
using ItemReduce.IO;

namespace ItemReduce.Application.Jobs;

/// <summary>Inputs read and prepared, with their fingerprints.</summary>
public sealed record LoadedSurvey(ResponseIntake Intake, PreparedData Prepared, string ResponsesSha256, string CodebookSha256);

/// <summary>Reads the codebook and responses, prepares the data and enforces the minimum sample size.</summary>
public static class SurveyLoader
{
    /// <summary>Loads and validates; throws <see cref="SurveyInputException"/> on user errors.</summary>
    public static LoadedSurvey Load(JobSettings settings, ProgressLog log)
    {
        log.Step($"reading codebook: {settings.Codebook}");
        var (codebook, lines) = CodebookReader.Read(settings.Codebook);
        Settings.SettingsMapping.CheckAgainstCodebook(settings, codebook);
        log.Step($"reading responses: {settings.Responses}");
        // The fingerprint is computed on the second core while the (single-threaded) reader parses the file.
        var responsesHash = Task.Run(() => TryFingerprint(settings.Responses));
        var clock = System.Diagnostics.Stopwatch.StartNew();
        long lastReport = 0;
        var intake = ResponseReader.Read(settings.Responses, codebook, lines, settings.Codebook, settings.Intake, rows =>
        {
            // At most about one message per second.
            if (clock.ElapsedMilliseconds - lastReport < 1000) return;
            lastReport = clock.ElapsedMilliseconds;
            log.Step(string.Create(System.Globalization.CultureInfo.InvariantCulture, $"reading responses: {rows:N0} rows read ({rows / clock.Elapsed.TotalSeconds:N0} rows/s)"));
        });
        log.Step($"read {intake.Responses.RespondentCount} respondents × {intake.Responses.ItemCount} items");
        var prepared = PreparedData.From(intake.Responses);
        int usable = prepared.Scored.ItemCount;
        if (usable < 3) throw InputErrors.TooFewItems(settings.Responses, usable);
        int answering = prepared.RawSummary.Respondents - prepared.RawSummary.RespondentsWithNoAnswers;
        int need = PreparedData.MinimumRespondents(usable);
        if (answering < need) throw InputErrors.TooFewRespondents(settings.Responses, answering, need, usable);
        string responsesSha = responsesHash.Result ?? FileFingerprint.Sha256(settings.Responses);
        return new LoadedSurvey(intake, prepared, responsesSha, FileFingerprint.Sha256(settings.Codebook));
    }

    /// <summary>The SHA-256 of a file, or null when it cannot be read now (the caller then reads it again and reports errors itself).</summary>
    private static string? TryFingerprint(string path)
    {
        try { return FileFingerprint.Sha256(path); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or SurveyInputException) { return null; }
    }
}
