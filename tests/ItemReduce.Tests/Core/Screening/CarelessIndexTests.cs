using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class CarelessIndexTests
{
    private const double NaN = double.NaN;

    [Fact]
    public void Long_string_is_the_longest_run_of_identical_consecutive_answers()
    {
        // Hand computation: 1 1 | 2 2 2 | (missing) | 2 2 | 3 → runs 2, 3, 2, 1 → 3.
        // The missing answer ends the run (our convention); joining across it would give 5.
        Assert.Equal(3, LongString.Compute([1, 1, 2, 2, 2, NaN, 2, 2, 3]));
        // 4 4 4 4 4 4 → 6; a single answer → 1; nothing answered → 0.
        Assert.Equal(6, LongString.Compute([4, 4, 4, 4, 4, 4]));
        Assert.Equal(1, LongString.Compute([NaN, 5, NaN]));
        Assert.Equal(0, LongString.Compute([NaN, NaN]));
        // Alternating 1 5 1 5 never repeats → 1.
        Assert.Equal(1, LongString.Compute([1, 5, 1, 5]));
    }

    [Fact]
    public void Irv_is_the_within_person_standard_deviation()
    {
        // Hand computation: 1..5 → mean 3, squared deviations 4+1+0+1+4 = 10, /(5−1) = 2.5, √2.5 = 1.5811388300841898.
        Assert.Equal(Math.Sqrt(2.5), IntraIndividualResponseVariability.Compute([1, 2, 3, 4, 5]), 1e-15);
        // 2, (missing), 4 → mean 3, squared deviations 1 + 1 = 2, /(2−1) = 2, √2.
        Assert.Equal(Math.Sqrt(2), IntraIndividualResponseVariability.Compute([2, NaN, 4]), 1e-15);
        // A straight line → 0; one answer → undefined.
        Assert.Equal(0.0, IntraIndividualResponseVariability.Compute([3, 3, 3, 3]));
        Assert.True(double.IsNaN(IntraIndividualResponseVariability.Compute([NaN, 3])));
    }

    private static readonly string?[] ThreeByFour = ["A", "A", "A", "A", "B", "B", "B", "B", "C", "C", "C", "C"];

    [Fact]
    public void Even_odd_consistency_matches_a_hand_computation()
    {
        // Subscale A answers 1 2 1 2: odd items (1st, 3rd) mean 1, even items (2nd, 4th) mean 2.
        // B: 3 3 3 3 → 3 and 3.  C: 5 5 5 4 → odd 5, even 4.5.
        // odd = (1, 3, 5), even = (2, 3, 4.5). Deviations: (−2, 0, 2) and (−7/6, −1/6, 4/3);
        // Σ products = 7/3 + 8/3 = 5, Σ odd² = 8, Σ even² = 19/6, r = 5 / √(8 · 19/6) = 0.9933992677987828,
        // Spearman–Brown 2r / (1 + r) = 0.996688705414994.
        var eo = new EvenOddConsistency(ThreeByFour, 3);
        Assert.True(eo.Applicable);
        double v = eo.Compute([1, 2, 1, 2, 3, 3, 3, 3, 5, 5, 5, 4]);
        Assert.Equal(0.996688705414994, v, 1e-12);
    }

    [Fact]
    public void Even_odd_consistency_with_interleaved_items_and_four_subscales()
    {
        // Columns interleave the subscales: A B C D A B C D A B C D A B C D (4 items each); within each subscale
        // the items are taken in column order. Answers chosen so that the half means are
        // odd = (1, 3, 5, 2), even = (2, 3, 4, 5): means 2.75 and 3.5; deviations (−1.75, .25, 2.25, −.75) and
        // (−1.5, −.5, .5, 1.5); Σ products = 2.5, Σ odd² = 8.75, Σ even² = 5, r = 2.5 / √43.75 = 0.3779644730092272,
        // Spearman–Brown = 0.5485837703548635.
        string?[] subs = ["A", "B", "C", "D", "A", "B", "C", "D", "A", "B", "C", "D", "A", "B", "C", "D"];
        // Item k of subscale s sits at column 4k + s. A: 1 2 1 2; B: 3 3 3 3; C: 5 4 5 4; D: 2 5 2 5.
        double[] a = [1, 3, 5, 2, 2, 3, 4, 5, 1, 3, 5, 2, 2, 3, 4, 5];
        var eo = new EvenOddConsistency(subs, 3);
        Assert.Equal(0.5485837703548635, eo.Compute(a), 1e-12);
    }

    [Fact]
    public void Even_odd_consistency_edge_cases()
    {
        var eo = new EvenOddConsistency(ThreeByFour, 3);
        // Halves exactly opposite: odd (1, 3, 5), even (5, 3, 1) → r = −1 → reported as −1.
        Assert.Equal(-1.0, eo.Compute([1, 5, 1, 5, 3, 3, 3, 3, 5, 1, 5, 1]));
        // Straight line: both half vectors constant → no correlation → NaN.
        Assert.True(double.IsNaN(eo.Compute(Enumerable.Repeat(4.0, 12).ToArray())));
        // Subscale C's even half unanswered → only 2 usable subscales → NaN.
        Assert.True(double.IsNaN(eo.Compute([1, 2, 1, 2, 3, 3, 3, 3, 5, NaN, 5, NaN])));
        // Two subscales in the codebook (plus unassigned items) → not applicable.
        var two = new EvenOddConsistency(["A", "A", null, "B", "B", null], 3);
        Assert.False(two.Applicable);
        Assert.True(double.IsNaN(two.Compute([1, 2, 3, 4, 5, 6])));
        Assert.Throws<ArgumentOutOfRangeException>(() => new EvenOddConsistency(ThreeByFour, 2));
    }
}
