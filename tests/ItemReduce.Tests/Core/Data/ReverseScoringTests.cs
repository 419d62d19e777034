using ItemReduce.Core.Data;

namespace ItemReduce.Tests.Core.Data;

public class ReverseScoringTests
{
    private static readonly ItemDefinition Forward = new("a", "S", false, 1, 5, null);
    private static readonly ItemDefinition Reversed = new("b", "S", true, 1, 5, null);
    private static readonly ItemDefinition Reversed07 = new("c", "S", true, 0, 7, null);

    [Fact]
    public void Reverse_keyed_items_become_min_plus_max_minus_x_and_others_are_untouched()
    {
        // Rule x' = min + max − x: common practice, no source.
        var m = new ResponseMatrix(["r1", "r2"], [Forward, Reversed, Reversed07], [1, 1, 0, 4, double.NaN, 7]);
        var r = ReverseScoring.Apply(m);
        Assert.Equal([1.0, 5.0, 7.0, 4.0, double.NaN, 0.0], r.ToArray());
        Assert.Equal(1.0, m[0, 1]); // input untouched
    }

    [Fact]
    public void Reversing_twice_restores_the_input()
    {
        var m = new ResponseMatrix(["r1", "r2", "r3"], [Reversed, Reversed07], [1, 2, 3, 4, 5, 6]);
        var twice = ReverseScoring.Apply(ReverseScoring.Apply(m));
        Assert.Equal(m.ToArray(), twice.ToArray());
    }
}
