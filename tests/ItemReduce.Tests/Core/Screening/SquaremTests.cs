using ItemReduce.Core.Screening;

namespace ItemReduce.Tests.Core.Screening;

public class SquaremTests
{
    [Theory]
    [InlineData(0.9, 3.0)]
    [InlineData(0.5, -2.0)]
    public void One_extrapolation_solves_a_scalar_linear_iteration_once_the_step_bound_allows_it(double rate, double fixedPoint)
    {
        // Our derivation from the scheme's definition: for x ← ρ x + (1 − ρ) x*, with e = x₀ − x*, r = (ρ − 1) e and
        // v = (ρ − 1)² e, so a = ‖r‖ / ‖v‖ = 1 / (1 − ρ) and x₀ + 2a r + a² v = x₀ − 2e + e = x* exactly.
        // The bound a_max starts at 1 and grows ×4 per step at the bound: 1 / (1 − 0.9) = 10 needs a_max = 16.
        double F(double x) => rate * x + (1 - rate) * fixedPoint;
        var squarem = new Squarem();
        double x0 = 7.5;
        for (int grow = 0; grow < 3; grow++)
        {
            var clamped = squarem.Extrapolate([x0], [F(x0)], [F(F(x0))], out double bounded);
            Assert.NotNull(clamped);
            Assert.Equal(Math.Min(squarem.MaxStep, 1 / (1 - rate)), bounded, 1e-12);
            if (bounded >= 1 / (1 - rate) - 1e-12)
            {
                Assert.Equal(fixedPoint, clamped[0], 1e-12);
                return;
            }
            squarem.Accepted(bounded);
        }
        Assert.Fail("the step bound never reached 1 / (1 − ρ)");
    }

    [Fact]
    public void A_rejected_step_shrinks_the_bound_but_never_below_the_plain_double_step()
    {
        // Property of the bound rule in the type's summary: ×4 after a step at the bound, ÷4 (not below 1) after a rejection.
        var squarem = new Squarem();
        squarem.Accepted(1);
        squarem.Accepted(4);
        Assert.Equal(16, squarem.MaxStep);
        squarem.Rejected();
        Assert.Equal(4, squarem.MaxStep);
        squarem.Rejected();
        squarem.Rejected();
        Assert.Equal(1, squarem.MaxStep);
    }

    [Fact]
    public void No_extrapolation_when_the_second_difference_vanishes()
    {
        // v = θ₂ − 2θ₁ + θ₀ = 0 (a map that moves by a constant) leaves the step length undefined.
        Assert.Null(new Squarem().Extrapolate([0.0, 1.0], [1.0, 2.0], [2.0, 3.0], out _));
    }
}
