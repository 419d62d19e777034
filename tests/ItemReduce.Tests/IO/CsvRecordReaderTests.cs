using System.Text;
using ItemReduce.IO;

namespace ItemReduce.Tests.IO;

/// <summary>
/// The span-based record reader against a plain RFC 4180 reader written here (RFC 4180 §2: records end at a line break
/// outside double quotes; a quoted field may hold delimiters, line breaks and doubled quotes; line breaks \n, \r\n or a
/// lone \r as in <see cref="SurveyTextReaderTests"/>): same fields, same 1-based start line of every record, blank
/// lines skipped — on random files whose quoted fields cross the reader's 64 KiB blocks.
/// </summary>
public class CsvRecordReaderTests
{
    /// <summary>Reference: (start line, fields) of each non-blank record.</summary>
    private static List<(long Line, string[] Fields)> Reference(string text)
    {
        var records = new List<(long, string[])>();
        var fields = new List<string>();
        var field = new StringBuilder();
        long line = 1, start = 1;
        bool quoted = false, any = false;
        for (int i = 0; i < text.Length; i++)
        {
            char c = text[i];
            if (quoted)
            {
                if (c == '"' && i + 1 < text.Length && text[i + 1] == '"') { field.Append('"'); i++; }
                else if (c == '"') quoted = false;
                else
                {
                    if (c == '\n' || (c == '\r' && (i + 1 >= text.Length || text[i + 1] != '\n'))) line++;
                    field.Append(c);
                }
                continue;
            }
            if (c == '"') { quoted = true; any = true; continue; }
            if (c == ',') { fields.Add(field.ToString()); field.Clear(); any = true; continue; }
            if (c == '\r' && i + 1 < text.Length && text[i + 1] == '\n') i++;
            if (c == '\n' || c == '\r')
            {
                fields.Add(field.ToString());
                if (any || fields[0].Length > 0) records.Add((start, fields.ToArray()));
                fields.Clear(); field.Clear(); any = false;
                start = ++line;
                continue;
            }
            field.Append(c);
        }
        if (any || field.Length > 0) { fields.Add(field.ToString()); records.Add((start, fields.ToArray())); }
        return records;
    }

    private static string RandomCsv(Random rng, int records)
    {
        var sb = new StringBuilder();
        string[] ends = ["\n", "\r\n", "\r"];
        for (int r = 0; r < records; r++)
        {
            if (rng.Next(20) == 0) sb.Append(ends[rng.Next(3)]); // a blank line
            int n = rng.Next(1, 6);
            for (int f = 0; f < n; f++)
            {
                if (f > 0) sb.Append(',');
                if (rng.Next(4) == 0)
                {
                    sb.Append('"');
                    int len = rng.Next(0, rng.Next(8) == 0 ? 3000 : 12);
                    for (int k = 0; k < len; k++)
                    {
                        int kind = rng.Next(12);
                        sb.Append(kind switch { 0 => "\"\"", 1 => ",", 2 => ends[rng.Next(3)], _ => ((char)rng.Next('a', 'z' + 1)).ToString() });
                    }
                    sb.Append('"');
                }
                else
                {
                    int len = rng.Next(0, 6);
                    for (int k = 0; k < len; k++) sb.Append((char)rng.Next('0', '9' + 1));
                }
            }
            sb.Append(ends[rng.Next(3)]);
        }
        return sb.ToString();
    }

    private static List<(long, string[])> ReadAll(string path)
    {
        var got = new List<(long, string[])>();
        using var csv = new CsvRecordReader(path, ',');
        while (csv.Read()) got.Add((csv.Line, csv.Fields));
        return got;
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void Records_and_their_start_lines_match_a_plain_RFC_4180_reader(int seed)
    {
        var rng = new Random(seed);
        string text = RandomCsv(rng, 6000);
        string path = Path.GetTempFileName();
        try
        {
            File.WriteAllText(path, text, new UTF8Encoding(false));
            var expected = Reference(text);
            var got = ReadAll(path);
            Assert.Equal(expected.Count, got.Count);
            for (int i = 0; i < expected.Count; i++)
            {
                Assert.Equal(expected[i].Line, got[i].Item1);
                Assert.Equal(expected[i].Fields, got[i].Item2);
            }
        }
        finally { File.Delete(path); }
    }

    [Theory]
    [InlineData("a,b\nc,3\"x,d\ne,f\n", 2, "\"3\\\"x\"")] // quote inside an unquoted field
    [InlineData("a,b\n\"c\"d,e\n", 2, "\"\\\"c\\\"d\"")] // text after the closing quote
    [InlineData("a,b\r\r\"x\"\"y\"z,1\n", 3, "\"\\\"x\\\"\\\"y\\\"z\"")]
    public void A_stray_quote_is_refused_on_its_record_line_showing_the_field(string text, long line, string shown)
    {
        string path = Path.GetTempFileName();
        try
        {
            File.WriteAllText(path, text);
            var e = Assert.Throws<SurveyInputException>(() => ReadAll(path));
            Assert.Contains($"line {line}:", e.Message);
            Assert.Contains(shown, e.Message);
            Assert.Contains("RFC 4180", e.Message);
        }
        finally { File.Delete(path); }
    }

    [Fact]
    public void A_quoted_record_over_the_line_limit_is_refused_where_it_starts_even_when_the_quote_closes_later()
    {
        // 300 quoted lines of 4,000 characters = 1.2 Mi characters inside one record; every line is short.
        var sb = new StringBuilder("id,text\n1,ok\n2,\"");
        for (int i = 0; i < 300; i++) sb.Append('x', 4000).Append('\n');
        sb.Append("\"\n3,ok\n");
        string path = Path.GetTempFileName();
        try
        {
            File.WriteAllText(path, sb.ToString());
            var e = Assert.Throws<SurveyInputException>(() => ReadAll(path));
            Assert.Contains("line 3:", e.Message);
            Assert.Contains("field is longer than 1,048,576 characters", e.Message);
        }
        finally { File.Delete(path); }
        // The same record under the limit (200 lines = 0.8 Mi characters) is read whole.
        var ok = new StringBuilder("id,text\n1,ok\n2,\"");
        for (int i = 0; i < 200; i++) ok.Append('x', 4000).Append('\n');
        ok.Append("\"\n3,ok\n");
        path = Path.GetTempFileName();
        try
        {
            File.WriteAllText(path, ok.ToString());
            var got = ReadAll(path);
            Assert.Equal(4, got.Count);
            Assert.Equal(3, got[2].Item1);
            Assert.Equal(200 * 4001, got[2].Item2[1].Length);
            Assert.Equal(204, got[3].Item1);
        }
        finally { File.Delete(path); }
    }
}
