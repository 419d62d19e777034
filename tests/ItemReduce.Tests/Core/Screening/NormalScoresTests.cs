using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class NormalScoresTests
{
    [Fact]
    public void Scores_are_normal_quantiles_at_the_middle_of_each_category()
    {
        // Answers 1 (×1), 2 (×2), 3 (×1): average ranks 1, 2.5, 4 of m = 4 → Φ⁻¹((r − ½)/4) = Φ⁻¹(.125), Φ⁻¹(.5),
        // Φ⁻¹(.875) = −1.1503494, 0, 1.1503494 (normal table; scipy.stats.norm.ppf(0.875) = 1.1503493803760079).
        var s = NormalScores.FromCounts([new Dictionary<double, long> { [1] = 1, [2] = 2, [3] = 1 }]);
        Assert.Equal(-1.1503493803760079, s.Score(0, 1), 1e-12);
        Assert.Equal(0.0, s.Score(0, 2), 1e-15);
        Assert.Equal(1.1503493803760079, s.Score(0, 3), 1e-12);
        Assert.True(double.IsNaN(s.Score(0, double.NaN)));
        Assert.True(double.IsNaN(s.Score(0, 4)));   // a value never seen has no score
        var (values, shares) = s.Categories(0);
        Assert.Equal([1.0, 2, 3], values);
        Assert.Equal([0.25, 0.5, 0.25], shares);
    }

    [Fact]
    public void Non_integer_answers_use_the_dictionary_path_with_the_same_rule()
    {
        // 0.5 (×3), 1.25 (×1): Φ⁻¹(1.5/4) = Φ⁻¹(.375) = −0.31863936396437514, Φ⁻¹(3.5/4) = 1.1503493803760079 (scipy).
        var s = NormalScores.FromCounts([new Dictionary<double, long> { [0.5] = 3, [1.25] = 1 }]);
        Assert.Equal(-0.31863936396437514, s.Score(0, 0.5), 1e-12);
        Assert.Equal(1.1503493803760079, s.Score(0, 1.25), 1e-12);
    }
}
