using ItemReduce.Core.Correlation;
using ItemReduce.Core.Factoring;
using ItemReduce.Core.ShortForm;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Core.Factoring;

/// <summary>
/// Known truth: loadings estimated from data drawn from a planted k-factor model agree with the generating
/// loadings. Agreement is Tucker's congruence coefficient φ = Σ a_i b_i / sqrt(Σ a_i² Σ b_i²)
/// (Tucker 1951; φ ≥ .95 read as "factors equal" is common practice, no source — Lorenzo-Seva &amp; ten Berge
/// 2006 from memory), after matching estimated to generating factors by the best congruence and sign.
/// </summary>
public class CongruenceRecoveryTests
{
    private static double Congruence(double[] a, double[] b)
    {
        double ab = 0, aa = 0, bb = 0;
        for (int i = 0; i < a.Length; i++) { ab += a[i] * b[i]; aa += a[i] * a[i]; bb += b[i] * b[i]; }
        return ab / Math.Sqrt(aa * bb);
    }

    private static double[] Column(double[,] m, int c) => Enumerable.Range(0, m.GetLength(0)).Select(i => m[i, c]).ToArray();

    public static TheoryData<int, int, int, FactorExtraction, FactorRotation> Designs() => new()
    {
        { 3, 6, 5, FactorExtraction.MinimumResidual, FactorRotation.Oblimin },
        { 4, 5, 5, FactorExtraction.PrincipalAxis, FactorRotation.Promax },
        { 3, 6, 0, FactorExtraction.MaximumLikelihood, FactorRotation.Oblimin },
        { 2, 8, 7, FactorExtraction.MinimumResidual, FactorRotation.Varimax },
    };

    [Theory]
    [MemberData(nameof(Designs))]
    public void Planted_loadings_are_recovered_with_congruence_at_least_95(int k, int perFactor, int categories, FactorExtraction extraction, FactorRotation rotation)
    {
        double phi = rotation == FactorRotation.Varimax ? 0.0 : 0.3;
        var spec = FactorModelSpec.Simple(k, perFactor, 0.65, phi, categories) with
        {
            Loadings = Enumerable.Range(0, k * perFactor).Select(j => 0.5 + 0.3 * (j % perFactor) / (perFactor - 1)).ToArray(),
        };
        var survey = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(3000, (ulong)(k * 100 + perFactor)));
        var r = PearsonCorrelation.Compute(survey.Responses);
        var s = FactorAnalysis.Fit(r, 3000, k, new FactoringOptions { Extraction = extraction, Rotation = rotation });
        int p = k * perFactor;
        var used = new HashSet<int>();
        for (int f = 0; f < k; f++)
        {
            var truth = new double[p];
            for (int j = 0; j < p; j++) if (spec.ItemFactor[j] == f) truth[j] = spec.Loadings[j];
            var (best, phiBest) = Enumerable.Range(0, k).Where(c => !used.Contains(c))
                .Select(c => (c, Math.Abs(Congruence(Column(s.Pattern, c), truth)))).MaxBy(t => t.Item2);
            used.Add(best);
            Assert.True(phiBest >= 0.95, $"factor {f}: congruence {phiBest:F3}");
        }
    }

    [Fact]
    public void Short_form_keeps_the_requested_number_of_items_from_every_factor()
    {
        var spec = FactorModelSpec.Simple(4, 6, 0.65, 0.25);
        var survey = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(1500, 77));
        var result = ShortFormBuilder.Build(ItemReduce.Core.Data.ReverseScoring.Apply(survey.Responses), 4, new ShortFormOptions { ItemsPerFactor = 3 });
        Assert.Equal(4, result.Scales.Count);
        Assert.All(result.Scales, sc => Assert.Equal(3, sc.SelectedItems.Count));
        // Every scale's items come from its own planted factor.
        foreach (var sc in result.Scales)
        {
            var factors = sc.SelectedItems.Select(name => spec.ItemFactor[survey.Responses.Items.ToList().FindIndex(i => i.Name == name)]).Distinct().ToList();
            Assert.Single(factors);
        }
    }
}
