using FsCheck;
using FsCheck.Fluent;
using ItemReduce.Report.Layout;

namespace ItemReduce.Tests.Report;

// Property checks of greedy word wrapping with a monospace measure (width = number of characters, bold
// counts double), so expected line contents can be worked out by hand.
public class LineBreakerTests
{
    private static float Mono(string s, bool bold) => s.Length * (bold ? 2f : 1f);

    private static List<string> Plain(List<TextLine> lines) => lines.Select(l => l.PlainText).ToList();

    [Fact]
    public void Words_are_packed_greedily()
    {
        var lines = LineBreaker.Break([new TextRun("aaa bb cccc d", false)], 7, 7, Mono);
        Assert.Equal(["aaa bb", "cccc d"], Plain(lines));
    }

    [Fact]
    public void First_line_may_be_wider_than_the_rest()
    {
        var lines = LineBreaker.Break([new TextRun("aa bb cc dd", false)], 8, 5, Mono);
        Assert.Equal(["aa bb cc", "dd"], Plain(lines));
    }

    [Fact]
    public void Overlong_word_is_split_between_characters()
    {
        var lines = LineBreaker.Break([new TextRun("x abcdefghij y", false)], 4, 4, Mono);
        Assert.Equal(["x", "abcd", "efgh", "ij y"], Plain(lines));
    }

    [Fact]
    public void Bold_runs_keep_their_spaces_and_weights()
    {
        var lines = LineBreaker.Break(InlineText.Parse("see **this** now"), 100, 100, Mono);
        var line = Assert.Single(lines);
        Assert.Equal("see this now", line.PlainText);
        Assert.Equal([false, true, false], line.Runs.Select(r => r.Bold).ToArray());
        Assert.Equal(3 + 5 * 2 + 4, line.Width); // "see" + " this" bold + " now"
    }

    [Fact]
    public void Explicit_line_breaks_are_kept_and_empty_text_gives_one_empty_line()
    {
        Assert.Equal(["a", "b"], Plain(LineBreaker.Break([new TextRun("a\nb", false)], 50, 50, Mono)));
        Assert.Equal([""], Plain(LineBreaker.Break([], 50, 50, Mono)));
    }

    [Fact]
    public void Unpaired_bold_marker_stays_literal()
    {
        var runs = InlineText.Parse("a **b** c ** d");
        Assert.Equal("a b c ** d", string.Concat(runs.Select(r => r.Text)));
        Assert.Equal([false, true, false, false], runs.Select(r => r.Bold).ToArray());
    }

    [Fact]
    public void Property_lines_fit_and_words_survive_in_order()
    {
        var gen =
            from words in Gen.ListOf(Gen.Elements("a", "bb", "ccc", "dddddd", "eeeeeeeeeeee")).Select(l => l.ToArray())
            from width in Gen.Choose(3, 20)
            select (words, width);
        Prop.ForAll(gen.ToArbitrary(), t =>
        {
            string text = string.Join(" ", t.words);
            var lines = LineBreaker.Break([new TextRun(text, false)], t.width, t.width, Mono);
            bool fit = lines.All(l => l.Width <= t.width + 0.01f);
            string rejoined = string.Concat(lines.Select(l => l.PlainText)).Replace(" ", "", StringComparison.Ordinal);
            return fit && rejoined == text.Replace(" ", "", StringComparison.Ordinal);
        }).Check(Config.QuickThrowOnFailure.WithReplay(20261202UL, 67891UL)); // fixed replay seed: the same cases on every run
    }
}
