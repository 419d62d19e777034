using System.Globalization;
using System.Text;
using ItemReduce.Core.Data;
using ItemReduce.Simulation;

// Writes a large INVENTED survey for scale measurements: a planted five-factor model with 40 five-point
// items (8 per factor, two reverse-keyed per factor), 1 % missing answers (MCAR) and 0.2 % planted
// careless respondents (half straight-liners, half random responders). Rows are generated in blocks of
// 100,000, each block from its own seed (seed + block index), so memory stays small and the file is
// deterministic for a given seed.
// Usage: dotnet run -c Release --project tools/ItemReduce.ScaleSurvey -- OUT_DIR [respondents=2000000] [seed=7]

if (args.Length < 1)
{
    Console.Error.WriteLine("usage: ItemReduce.ScaleSurvey OUT_DIR [respondents] [seed]");
    return 2;
}
string outDir = args[0];
int total = args.Length > 1 ? int.Parse(args[1], CultureInfo.InvariantCulture) : 2_000_000;
ulong seed = args.Length > 2 ? ulong.Parse(args[2], CultureInfo.InvariantCulture) : 7;
Directory.CreateDirectory(outDir);

const int factors = 5, perFactor = 8, block = 100_000;
int p = factors * perFactor;
string[] subscales = ["s1", "s2", "s3", "s4", "s5"];
var itemFactor = new int[p];
var loadings = new double[p];
var reverse = new bool[p];
var names = new string[p];
for (int j = 0; j < p; j++)
{
    itemFactor[j] = j % factors;                       // interleaved, so blocks of columns are not one factor
    loadings[j] = 0.45 + 0.05 * ((j / factors) % 7);   // 0.45 … 0.75
    reverse[j] = (j / factors) % 4 == 3;               // two reverse-keyed items per factor
    names[j] = "q" + (j + 1).ToString("00", CultureInfo.InvariantCulture);
}
var phi = new double[factors, factors];
for (int a = 0; a < factors; a++)
    for (int b = 0; b < factors; b++)
        phi[a, b] = a == b ? 1.0 : 0.3;
var spec = new FactorModelSpec
{
    ItemFactor = itemFactor,
    Loadings = loadings,
    ReverseKeyed = reverse,
    FactorCorrelations = phi,
    Categories = 5,
    CategoryProbabilities = [0.08, 0.17, 0.30, 0.29, 0.16],
};

var inv = CultureInfo.InvariantCulture;
using (var w = new StreamWriter(Path.Combine(outDir, "responses.csv"), false, new UTF8Encoding(false), 1 << 20))
{
    w.Write("respondent");
    foreach (var name in names) w.Write("," + name);
    w.Write('\n');
    var sb = new StringBuilder(1 << 16);
    for (int start = 0, b = 0; start < total; start += block, b++)
    {
        int rows = Math.Min(block, total - start);
        int planted = Math.Max(1, rows / 1000);
        var survey = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(
            Respondents: rows, Seed: seed + (ulong)b, MissingRate: 0.01, StraightLiners: planted, RandomResponders: planted,
            ItemNames: names, SubscaleNames: subscales));
        ResponseMatrix m = survey.Responses;
        for (int i = 0; i < rows; i++)
        {
            sb.Clear();
            sb.Append('r').Append((start + i + 1).ToString(inv));
            for (int j = 0; j < p; j++)
            {
                double x = m[i, j];
                sb.Append(',');
                if (!double.IsNaN(x)) sb.Append(x.ToString(inv));
            }
            sb.Append('\n');
            w.Write(sb);
        }
    }
}
var cb = new StringBuilder("item,subscale,reverse,min,max,text\n");
for (int j = 0; j < p; j++)
    cb.Append(names[j]).Append(',').Append(subscales[itemFactor[j]]).Append(',').Append(reverse[j] ? "true" : "false").Append(",1,5,\n");
File.WriteAllText(Path.Combine(outDir, "codebook.csv"), cb.ToString(), new UTF8Encoding(false));
Console.WriteLine($"Wrote {total} respondents × {p} items to {outDir}");
return 0;
