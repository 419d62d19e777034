using System.Text;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;
using ItemReduce.Core.Randomness;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>Property: random mutations of a valid CSV never crash the intake (exit 0 or 2, never 1).</summary>
public class IntakeFuzzTests
{
    private static readonly string[] Pieces = [",", ";", "\t", "\"", "\n", "\r\n", "\r", "\0", "NaN", "1e308", "-", "=", "7", "3", " ", "NA", "é", "\uFEFF", "\"\"", ",,,"];

    private static string Mutate(string text, ulong seed, int edits)
    {
        var rng = new RandomStream(seed);
        var sb = new StringBuilder(text);
        for (int e = 0; e < edits && sb.Length > 0; e++)
        {
            int at = rng.NextInt(sb.Length);
            switch (rng.NextInt(4))
            {
                case 0: sb.Insert(at, Pieces[rng.NextInt(Pieces.Length)]); break;
                case 1: sb.Remove(at, Math.Min(1 + rng.NextInt(5), sb.Length - at)); break;
                case 2: sb[at] = Pieces[rng.NextInt(Pieces.Length)][0]; break;
                default:
                    int end = text.IndexOf('\n', Math.Min(at, text.Length - 1));
                    if (end > 0) sb.Insert(at, text[..Math.Min(end + 1, text.Length)]);
                    break;
            }
        }
        return sb.ToString();
    }

    [Property(MaxTest = 150, Replay = "(20261202,67891)")] // fixed replay seed: the same cases on every run
    public Property Mutated_responses_never_crash(PositiveInt seed, byte edits)
    {
        using var s = new TempSurvey().WithCodebook().WithResponses(Mutate(TempSurvey.ValidResponses(20), (ulong)seed.Get, 1 + edits % 12));
        var r = s.Check();
        return (r.Code is 0 or 2 && !r.Err.Contains("   at ")).Label($"exit {r.Code}: {r.Err}");
    }

    [Property(MaxTest = 100, Replay = "(20261203,67893)")]
    public Property Mutated_codebooks_never_crash(PositiveInt seed, byte edits)
    {
        string cb = "item,subscale,reverse,min,max,text\nq1,S1,false,1,5,a\nq2,S1,true,1,5,b\nq3,S2,false,1,5,c\nq4,S2,false,1,5,d\n";
        using var s = new TempSurvey().WithCodebook(text: Mutate(cb, (ulong)seed.Get, 1 + edits % 8)).WithResponses(TempSurvey.ValidResponses(20));
        var r = s.Check();
        return (r.Code is 0 or 2 && !r.Err.Contains("   at ")).Label($"exit {r.Code}: {r.Err}");
    }
}
