using System.Globalization;
using System.Text;
using ItemReduce.Simulation;

namespace ItemReduce.Tests.Support;

/// <summary>Writes a simulated survey as responses.csv and codebook.csv into a <see cref="TempSurvey"/> folder.</summary>
public static class SimulatedFiles
{
    public static TempSurvey Write(SimulatedSurvey survey)
    {
        var t = new TempSurvey();
        var inv = CultureInfo.InvariantCulture;
        var m = survey.Responses;
        var sb = new StringBuilder("respondent");
        foreach (var it in m.Items) sb.Append(',').Append(it.Name);
        sb.Append('\n');
        for (int i = 0; i < m.RespondentCount; i++)
        {
            sb.Append(m.RespondentIds[i]);
            for (int j = 0; j < m.ItemCount; j++)
            {
                sb.Append(',');
                double x = m[i, j];
                if (!double.IsNaN(x)) sb.Append(x.ToString(inv));
            }
            sb.Append('\n');
        }
        t.WithResponses(sb.ToString());
        var cb = new StringBuilder("item,subscale,reverse,min,max,text\n");
        foreach (var it in m.Items)
            cb.Append(inv, $"{it.Name},{it.Subscale},{(it.Reverse ? "yes" : "no")},{it.Min},{it.Max},Invented item {it.Name}\n");
        t.WithCodebook(text: cb.ToString());
        return t;
    }

    /// <summary>Three correlated factors × 5 five-point items (one reverse-keyed per factor), with planted careless respondents.</summary>
    public static SimulatedSurvey ThreeFactorSurvey(int n = 500, ulong seed = 11, int straight = 6, int random = 6)
    {
        var spec = FactorModelSpec.Simple(3, 5, 0.7, 0.3) with
        {
            ReverseKeyed = Enumerable.Range(0, 15).Select(j => j % 5 == 4).ToArray(),
        };
        return FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(n, seed, MissingRate: 0.01,
            StraightLiners: straight, RandomResponders: random, SubscaleNames: ["alpha", "beta", "gamma"]));
    }
}
