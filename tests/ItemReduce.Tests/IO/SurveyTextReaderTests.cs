using System.Text;
using ItemReduce.IO;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.IO;

/// <summary>
/// The input text reader against a plain reference computed here from the bytes: the text read back equals the
/// decoded file, and the line named for an invalid byte or an over-long line is the 1-based line counted over the bytes
/// before it (line ends \n, \r\n or a lone \r, as RFC 4180 readers and most spreadsheets accept) — including when the
/// position or a \r\n pair falls on a 64 KiB block boundary.
/// </summary>
public class SurveyTextReaderTests
{
    private static long ExpectedLine(byte[] bytes, int position)
    {
        long line = 1;
        for (int i = 0; i < position; i++)
        {
            if (bytes[i] == (byte)'\n') line++;
            else if (bytes[i] == (byte)'\r' && (i + 1 >= bytes.Length || bytes[i + 1] != (byte)'\n')) line++;
        }
        return line;
    }

    private static byte[] RandomText(Random rng, int length)
    {
        var b = new List<byte>(length + 2);
        string[] ends = ["\n", "\r\n", "\r"];
        while (b.Count < length)
        {
            int n = rng.Next(0, 120);
            for (int i = 0; i < n; i++) b.Add((byte)rng.Next('a', 'z' + 1));
            if (rng.Next(10) == 0) b.AddRange(Encoding.UTF8.GetBytes("é€")); // multi-byte characters across blocks too
            b.AddRange(Encoding.ASCII.GetBytes(ends[rng.Next(ends.Length)]));
        }
        return [.. b];
    }

    [Fact]
    public void Reads_back_the_decoded_text()
    {
        var rng = new Random(20261202);
        using var t = new TempSurvey();
        byte[] bytes = RandomText(rng, 300_000);
        File.WriteAllBytes(t.Responses, bytes);
        using var r = new SurveyTextReader(t.Responses);
        Assert.Equal(Encoding.UTF8.GetString(bytes), r.ReadToEnd());
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    [InlineData(4)]
    [InlineData(5)]
    [InlineData(6)]
    public void An_invalid_byte_is_reported_on_its_true_line(int seed)
    {
        var rng = new Random(seed);
        using var t = new TempSurvey();
        byte[] bytes = RandomText(rng, 400_000);
        // Positions on and next to block boundaries as well as random ones; never inside a multi-byte character.
        int[] candidates = [65_535, 65_536, 65_537, 131_071, 131_072, rng.Next(1, bytes.Length - 1)];
        int at = candidates[seed % candidates.Length];
        while (bytes[at] >= 0x80 || (at > 0 && bytes[at - 1] >= 0x80)) at++;
        bytes[at] = 0xFF;
        File.WriteAllBytes(t.Responses, bytes);
        using var r = new SurveyTextReader(t.Responses);
        var e = Assert.Throws<SurveyInputException>(() => r.ReadToEnd());
        Assert.Contains($"line {ExpectedLine(bytes, at)}:", e.Message);
        Assert.Contains("not valid UTF-8", e.Message);
    }

    [Theory]
    [InlineData(131_072)] // the first decoded block holds the first two reads of 64 KiB
    [InlineData(196_608)] // later blocks hold one read each
    public void A_crlf_pair_split_by_a_block_boundary_counts_once(int boundary)
    {
        using var t = new TempSurvey();
        var bytes = new byte[boundary + 200];
        Array.Fill(bytes, (byte)'x');
        for (int i = 50_000; i < boundary - 50_000; i += 50_000) bytes[i] = (byte)'\n'; // keep lines under the limit
        bytes[boundary - 1] = (byte)'\r';
        bytes[boundary] = (byte)'\n';
        bytes[boundary + 100] = 0xFF;
        File.WriteAllBytes(t.Responses, bytes);
        using var r = new SurveyTextReader(t.Responses);
        var e = Assert.Throws<SurveyInputException>(() => r.ReadToEnd());
        Assert.Contains($"line {ExpectedLine(bytes, boundary + 100)}:", e.Message);
    }

    [Fact]
    public void An_over_long_line_stops_the_read_on_that_line()
    {
        using var t = new TempSurvey();
        var sb = new StringBuilder("header\r\nrow one\rrow two\n");
        sb.Append('y', SurveyTextReader.MaxLineChars + 1).Append('\n');
        File.WriteAllText(t.Responses, sb.ToString());
        using var r = new SurveyTextReader(t.Responses);
        var buffer = new char[4096];
        long delivered = 0;
        var e = Assert.Throws<SurveyInputException>(() => { int n; while ((n = r.Read(buffer, 0, buffer.Length)) > 0) delivered += n; });
        Assert.Contains("line 4:", e.Message);
        Assert.True(delivered <= "header\r\nrow one\rrow two\n".Length + SurveyTextReader.MaxLineChars, "read past the limit");
    }

    [Fact]
    public void Utf16_with_a_byte_order_mark_is_decoded_and_without_one_is_named()
    {
        using var t = new TempSurvey();
        string text = "respondent,q1\nA,1\n";
        File.WriteAllBytes(t.Responses, [.. Encoding.Unicode.GetPreamble(), .. Encoding.Unicode.GetBytes(text)]);
        using (var r = new SurveyTextReader(t.Responses)) Assert.Equal(text, r.ReadToEnd());
        File.WriteAllBytes(t.Responses, Encoding.Unicode.GetBytes(text));
        using var bare = new SurveyTextReader(t.Responses);
        var e = Assert.Throws<SurveyInputException>(() => bare.ReadToEnd());
        Assert.Contains("UTF-16 or UTF-32 text without a byte-order mark", e.Message);
    }
}
