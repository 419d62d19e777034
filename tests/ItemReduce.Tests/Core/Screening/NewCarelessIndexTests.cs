using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class NewCarelessIndexTests
{
    private const double N = double.NaN;

    [Theory]
    // Counts by construction (answers in a period-two stretch; gaps of any length are skipped, positions keep their parity).
    [InlineData(new[] { 3.0, 5, 3, 5, 3, 5, 3, 5 }, 8)]
    [InlineData(new[] { 1.0, 5, 1, 5, 2, 4, 2, 4, 2 }, 5)]          // 1-5-1-5 (4 answers), then 2-4-2-4-2 (5)
    [InlineData(new[] { 3.0, 3, 3, 3 }, 1)]                         // a straight line is not alternation
    [InlineData(new[] { 3.0, 5, N, 5, 3, 5 }, 5)]                   // the gap neither ends nor counts
    [InlineData(new[] { 3.0, 5, N, N, 3, 5 }, 4)]                   // two missing answers neither end nor count
    [InlineData(new[] { 3.0, 5, N, N, N, 5, 3 }, 4)]                // an odd gap: item 5 is an odd position (5), item 6 even (3)
    [InlineData(new[] { 3.0, 5, N, N, 5, 3 }, 2)]                   // across the gap the parity breaks: a new stretch
    [InlineData(new[] { 1.0, 2, 3, 4, 5 }, 2)]                      // a staircase: every pair differs, no repeat
    [InlineData(new[] { N, N }, 0)]
    public void Alternating_run_counts_answers_in_the_longest_seesaw_stretch(double[] answers, int expected) =>
        Assert.Equal(expected, AlternatingRun.Compute(answers));

    [Fact]
    public void Person_total_correlation_is_the_pearson_correlation_with_the_item_means()
    {
        // Hand computation: answers (1, 2, 3, 5) against means (2, 3, 3.5, 4.5) over the answered items (the third
        // item is skipped): x̄ = 2.75, ȳ = 3.25; Σdxdy = 5.25; Σdx² = 8.75; Σdy² = 3.25; r = 5.25 / √(8.75 · 3.25) = 0.98450...
        double r = PersonTotalCorrelation.Compute([1, 2, N, 3, 5], [2, 3, 9, 3.5, 4.5]);
        Assert.Equal(5.25 / Math.Sqrt(8.75 * 3.25), r, 1e-14);
        Assert.True(double.IsNaN(PersonTotalCorrelation.Compute([4, 4, 4, 4], [1, 2, 3, 4])));   // no spread
        Assert.True(double.IsNaN(PersonTotalCorrelation.Compute([1, 2, 3, 4], [3, 3, 3, 3])));   // equal item means
        Assert.True(double.IsNaN(PersonTotalCorrelation.Compute([1, N, N, 4], [1, 2, 3, 4])));   // fewer than 3 answers
    }

    [Fact]
    public void Synonyms_and_antonyms_use_the_pairs_beyond_the_critical_correlation()
    {
        // Four items: (0,1) and (2,3) correlate .7 (synonyms), (0,2) −.65 (antonym), (1,3) −.61, (0,3), (1,2) weak.
        double[] r =
        [
            1, .7, -.65, .1,
            .7, 1, .2, -.61,
            -.65, .2, 1, .7,
            .1, -.61, .7, 1,
        ];
        var s = new PsychometricSynonyms(r, 4);
        Assert.Equal(2, s.SynonymPairs);
        Assert.Equal(2, s.AntonymPairs);
        // Only two pairs each: fewer than MinimumPairs (3), so NaN.
        var (syn, ant) = s.Compute([1, 2, 3, 4]);
        Assert.True(double.IsNaN(syn) && double.IsNaN(ant));
    }

    [Fact]
    public void Synonym_coefficient_is_the_within_person_correlation_across_pairs()
    {
        // Six items in three synonym pairs (0,1), (2,3), (4,5). Answers: pairs (1,2), (3,3), (5,4):
        // first members (1, 3, 5), second members (2, 3, 4): r = 1 exactly (second = 0.5·first + 1.5).
        var r = new double[36];
        for (int j = 0; j < 6; j++) r[j * 6 + j] = 1;
        foreach (var (a, b) in new[] { (0, 1), (2, 3), (4, 5) }) r[a * 6 + b] = r[b * 6 + a] = 0.8;
        var s = new PsychometricSynonyms(r, 6);
        Assert.Equal(1.0, s.Compute([1, 2, 3, 3, 5, 4]).Synonyms, 1e-14);
        Assert.Equal(-1.0, s.Compute([1, 4, 3, 3, 5, 2]).Synonyms, 1e-14);   // second = −first + 5 → r = −1
    }
}
