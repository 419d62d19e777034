using System.Globalization;
using System.Text;
using ItemReduce.Cli;

namespace ItemReduce.Tests.Support;

/// <summary>A throw-away folder holding a small responses file and codebook, and a way to run the CLI on it.</summary>
public sealed class TempSurvey : IDisposable
{
    public TempSurvey()
    {
        Folder = Path.Combine(Path.GetTempPath(), "itemreduce-tests", Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(Folder);
    }

    public string Folder { get; }
    public string Responses => Path.Combine(Folder, "responses.csv");
    public string Codebook => Path.Combine(Folder, "codebook.csv");
    public string Out => Path.Combine(Folder, "results");

    /// <summary>Writes a valid codebook for items q1..qP on a 1–5 scale (q2 reverse-keyed).</summary>
    public TempSurvey WithCodebook(int items = 4, string? text = null)
    {
        var sb = new StringBuilder("item,subscale,reverse,min,max,text\n");
        for (int j = 1; j <= items; j++) sb.Append($"q{j},S{(j + 1) / 2},{(j == 2 ? "true" : "false")},1,5,Item {j}\n");
        File.WriteAllText(Codebook, text ?? sb.ToString());
        return this;
    }

    /// <summary>Writes <paramref name="rows"/> valid respondents with varied answers for q1..qP, header first.</summary>
    public static string ValidResponses(int rows, int items = 4, char d = ',')
    {
        var sb = new StringBuilder("respondent");
        for (int j = 1; j <= items; j++) sb.Append(d).Append('q').Append(j);
        sb.Append('\n');
        for (int i = 0; i < rows; i++)
        {
            sb.Append("id").Append(i + 1);
            for (int j = 0; j < items; j++) sb.Append(d).Append(((i * (j + 2) + j * j + i / 3) % 5 + 1).ToString(CultureInfo.InvariantCulture));
            sb.Append('\n');
        }
        return sb.ToString();
    }

    public TempSurvey WithResponses(string text, Encoding? encoding = null)
    {
        File.WriteAllText(Responses, text, encoding ?? new UTF8Encoding(false));
        return this;
    }

    /// <summary>Runs the CLI; returns exit code, stdout and stderr.</summary>
    public static (int Code, string Out, string Err) Cli(params string[] args)
    {
        var o = new StringWriter();
        var e = new StringWriter();
        int code = CliApp.Run(args, o, e);
        return (code, o.ToString(), e.ToString());
    }

    public (int Code, string Out, string Err) Run(params string[] extra) =>
        Cli(["run", "--responses", Responses, "--codebook", Codebook, "--out", Out, .. extra]);

    public (int Code, string Out, string Err) Check(params string[] extra) =>
        Cli(["check", "--responses", Responses, "--codebook", Codebook, .. extra]);

    public void Dispose()
    {
        try { Directory.Delete(Folder, true); } catch (IOException) { }
    }
}
