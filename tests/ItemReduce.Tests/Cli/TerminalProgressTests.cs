using ItemReduce.Cli;

namespace ItemReduce.Tests.Cli;

/// <summary>The live progress view for terminals, driven by a hand-set clock (no timer, no wall time).</summary>
public sealed class TerminalProgressTests
{
    private sealed class Clock
    {
        public TimeSpan Now;
        public TimeSpan Read() => Now;
    }

    private static (TerminalProgress View, StringWriter Err, Clock Clock) Make(int width = 100)
    {
        var err = new StringWriter();
        var clock = new Clock();
        return (new TerminalProgress(err, clock.Read, () => width, redraw: false), err, clock);
    }

    [Fact]
    public void Short_steps_print_nothing()
    {
        var (view, err, clock) = Make();
        view.Report(clock.Now, "reading codebook: codebook.csv");
        clock.Now += TimeSpan.FromSeconds(1.5);
        view.Tick();
        view.Report(clock.Now, "screening: item means and covariances");
        clock.Now += TimeSpan.FromSeconds(0.5);
        view.Dispose();
        Assert.Equal("", err.ToString());
    }

    [Fact]
    public void A_counted_step_longer_than_two_seconds_gets_a_bar_and_ends_with_its_duration()
    {
        var (view, err, clock) = Make();
        view.Report(clock.Now, "parallel analysis: 0 of 1000 replicates");
        clock.Now += TimeSpan.FromSeconds(2.5);
        view.Report(clock.Now, "parallel analysis: 250 of 1000 replicates");
        string drawn = err.ToString();
        Assert.Equal("\ritemreduce: [   3 s] [######..................]  25% parallel analysis (250/1000)\u001b[K", drawn); // 6 of 24 cells
        Assert.DoesNotContain("\n", drawn, StringComparison.Ordinal); // redrawn in place
        clock.Now += TimeSpan.FromSeconds(1);
        view.Report(clock.Now, "factoring 30 items into 3 factor(s) and building the short form");
        Assert.EndsWith("itemreduce: parallel analysis done in 3.5 s\u001b[K\n", err.ToString(), StringComparison.Ordinal);
        view.Dispose();
    }

    [Fact]
    public void Messages_of_one_step_share_its_clock_and_an_uncounted_step_shows_a_spinner()
    {
        var (view, err, clock) = Make();
        view.Report(clock.Now, "screening: item means and covariances");
        clock.Now += TimeSpan.FromSeconds(1.5);
        view.Report(clock.Now, "screening: robust EM (ER) estimate on 900 respondents");
        Assert.Equal("", err.ToString()); // the step has run 1.5 s, not yet shown
        clock.Now += TimeSpan.FromSeconds(1.0);
        view.Tick();
        Assert.Contains("itemreduce: [   3 s] / screening: robust EM (ER) estimate on 900 respondents", err.ToString(), StringComparison.Ordinal);
        view.Dispose();
        Assert.EndsWith("itemreduce: screening done in 2.5 s\u001b[K\n", err.ToString(), StringComparison.Ordinal);
        view.Report(clock.Now, "after the end");
        view.Tick();
        Assert.DoesNotContain("after the end", err.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void The_line_never_exceeds_the_terminal_width()
    {
        var (view, err, clock) = Make(width: 40);
        view.Report(clock.Now, "screening: " + new string('x', 200));
        clock.Now += TimeSpan.FromSeconds(3);
        view.Tick();
        string line = err.ToString().TrimStart('\r').Replace("\u001b[K", "", StringComparison.Ordinal);
        Assert.Equal(39, line.Length);
        Assert.EndsWith("…", line, StringComparison.Ordinal);
        view.Dispose();
    }
}
