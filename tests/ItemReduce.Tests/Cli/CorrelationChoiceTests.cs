using System.Globalization;
using ItemReduce.Tests.Support;

namespace ItemReduce.Tests.Cli;

/// <summary>
/// --correlation and --missing-data reach the factoring stage: the loadings of <c>shorten</c> equal a two-factor
/// minimum-residual fit computed outside the project from the correlations.csv the run wrote. Reference:
/// ReferenceData/Settings/make_correlation_choice_reference.py (numpy 1.24.2 eigendecomposition + scipy 1.10.1
/// L-BFGS-B over the uniquenesses); the survey there is our own invented data.
/// </summary>
public class CorrelationChoiceTests
{
    private static string Fixture(string name) => ReferenceData.PathOf("Settings", name);

    private static (string[] Items, double[][] Loadings, double[,] Correlations) Shorten(params string[] extra)
    {
        string dir = Path.Combine(Path.GetTempPath(), "itemreduce-tests", Guid.NewGuid().ToString("N"));
        try
        {
            var r = TempSurvey.Cli(["shorten", "--responses", Fixture("responses.csv"), "--codebook", Fixture("codebook.csv"), "--out", dir,
                "--rotation", "none", "--factors", "2", "--quiet", .. extra]);
            Assert.True(r.Code == 0, r.Err);
            var rows = File.ReadAllLines(Path.Combine(dir, "loadings.csv")).Skip(1).Select(l => l.Split(',')).ToList();
            var loadings = rows.Select(c => new[] { Num(c[2]), Num(c[3]), Num(c[4]) }).ToArray();
            var corr = File.ReadAllLines(Path.Combine(dir, "correlations.csv")).Skip(1).Select(l => l.Split(',').Skip(1).Select(Num).ToArray()).ToArray();
            var m = new double[corr.Length, corr.Length];
            for (int a = 0; a < corr.Length; a++)
                for (int b = 0; b < corr.Length; b++) m[a, b] = corr[a][b];
            return (rows.Select(c => c[0]).ToArray(), loadings, m);
        }
        finally
        {
            if (Directory.Exists(dir)) Directory.Delete(dir, true);
        }
    }

    private static double Num(string s) => double.Parse(s, CultureInfo.InvariantCulture);

    private static void AssertMatchesReference(string[] items, double[][] loadings, string reference)
    {
        var expected = ReferenceData.Lines("Settings", reference).Select(l => l.Split(',')).ToList();
        Assert.Equal(expected.Select(e => e[0]), items);
        for (int f = 0; f < 2; f++)
        {
            // Unrotated minres loadings are unique up to the sign of each factor.
            double sign = Math.Sign(loadings.Sum(l => l[f]));
            for (int j = 0; j < items.Length; j++)
                Assert.Equal(Num(expected[j][f + 1]), sign * loadings[j][f], 4);
        }
        for (int j = 0; j < items.Length; j++) Assert.Equal(Num(expected[j][3]), loadings[j][2], 4);
    }

    [Fact]
    public void Polychoric_loadings_match_scipy_minres_on_the_written_matrix()
    {
        var (items, loadings, corr) = Shorten("--correlation", "polychoric");
        var written = ReferenceData.Lines("Settings", "correlations-polychoric.csv").Skip(1).Select(l => l.Split(',').Skip(1).Select(Num).ToArray()).ToArray();
        for (int a = 0; a < written.Length; a++)
            for (int b = 0; b < written.Length; b++) Assert.Equal(written[a][b], corr[a, b], 12);
        AssertMatchesReference(items, loadings, "minres-polychoric.csv");
    }

    [Fact]
    public void Listwise_loadings_match_scipy_minres_and_the_matrix_matches_numpy_on_complete_rows()
    {
        var (items, loadings, corr) = Shorten("--missing-data", "listwise");
        var numpy = ReferenceData.Numbers("Settings", "listwise-pearson-numpy.csv");
        for (int a = 0; a < numpy.Length; a++)
            for (int b = 0; b < numpy.Length; b++) Assert.Equal(numpy[a][b], corr[a, b], 12);
        AssertMatchesReference(items, loadings, "minres-listwise.csv");
    }

    [Fact]
    public void The_default_pearson_pairwise_loadings_differ_from_both_references()
    {
        // Guards the two tests above against passing because the options changed nothing.
        var (items, loadings, _) = Shorten();
        foreach (string reference in new[] { "minres-polychoric.csv", "minres-listwise.csv" })
        {
            var expected = ReferenceData.Lines("Settings", reference).Select(l => Num(l.Split(',')[3])).ToArray();
            Assert.True(Enumerable.Range(0, items.Length).Max(j => Math.Abs(expected[j] - loadings[j][2])) > 0.005, reference);
        }
    }
}
