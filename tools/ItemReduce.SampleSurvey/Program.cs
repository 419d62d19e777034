using System.Globalization;
using System.Text;
using ItemReduce.Core.Randomness;
using ItemReduce.Simulation;

// Regenerates sample-surveys/ferry-riders: an INVENTED rider-experience pilot for a harbour ferry
// operator, drawn from a planted five-factor model with our own seeded generator.
// Usage: dotnet run --project tools/ItemReduce.SampleSurvey -- [output-folder]

string outDir = args.Length > 0 ? args[0] : Path.Combine("sample-surveys", "ferry-riders");
Directory.CreateDirectory(outDir);

// (subscale, item name, reverse-keyed, loading, text)
var items = new (string Sub, string Name, bool Rev, double Load, string Text)[]
{
    ("reliability", "rel1", false, 0.78, "The ferry leaves the terminal at the time on the timetable."),
    ("reliability", "rel2", false, 0.74, "I can count on arriving at my destination on time."),
    ("reliability", "rel3", true,  0.70, "Cancellations disrupt my plans more than they should."),
    ("reliability", "rel4", false, 0.66, "Delays are rare on the routes I use."),
    ("reliability", "rel5", false, 0.62, "Connections with buses at the terminals work well."),
    ("reliability", "rel6", false, 0.35, "Sailings run in rough weather whenever it is safe."),
    ("reliability", "rel7", true,  0.58, "I often wait at the pier longer than I expected."),
    ("comfort", "cmf1", false, 0.76, "The seating on board is comfortable."),
    ("comfort", "cmf2", false, 0.72, "The passenger cabin is clean."),
    ("comfort", "cmf3", false, 0.69, "There is enough room for luggage, bicycles and prams."),
    ("comfort", "cmf4", true,  0.64, "The cabin is too crowded at busy times."),
    ("comfort", "cmf5", false, 0.60, "The temperature on board is pleasant."),
    ("comfort", "cmf6", false, 0.55, "The waiting areas at the terminals are pleasant."),
    ("comfort", "cmf7", false, 0.30, "I enjoy the view from the deck."),
    ("crew", "crw1", false, 0.80, "Crew members are courteous."),
    ("crew", "crw2", false, 0.77, "Crew members help passengers who need assistance."),
    ("crew", "crw3", false, 0.71, "I feel safe on board."),
    ("crew", "crw4", true,  0.65, "Crew members seem indifferent to passengers' questions."),
    ("crew", "crw5", false, 0.63, "Safety announcements are clear."),
    ("crew", "crw6", false, 0.58, "Ticket staff at the terminals are helpful."),
    ("crew", "crw7", false, 0.52, "Complaints are handled fairly."),
    ("information", "inf1", false, 0.79, "Real-time departure information is accurate."),
    ("information", "inf2", false, 0.75, "I am told promptly when a sailing is delayed."),
    ("information", "inf3", false, 0.70, "The timetable is easy to understand."),
    ("information", "inf4", false, 0.66, "The operator's app gives me the information I need."),
    ("information", "inf5", true,  0.61, "It is hard to find out which pier my ferry leaves from."),
    ("information", "inf6", false, 0.56, "Signs at the terminals are easy to follow."),
    ("information", "inf7", false, 0.50, "Service changes are announced well in advance."),
    ("value", "val1", false, 0.78, "The fare is reasonable for the service I receive."),
    ("value", "val2", false, 0.74, "Season tickets are good value."),
    ("value", "val3", true,  0.68, "The ferry is expensive compared with other ways to travel."),
    ("value", "val4", false, 0.64, "Buying a ticket is quick and easy."),
    ("value", "val5", false, 0.60, "I would recommend the ferry to a friend."),
    ("value", "val6", false, 0.55, "Discounts for students and seniors are fair."),
};
string[] subscales = ["reliability", "comfort", "crew", "information", "value"];
int p = items.Length;
var spec = new FactorModelSpec
{
    ItemFactor = items.Select(i => Array.IndexOf(subscales, i.Sub)).ToArray(),
    Loadings = items.Select(i => i.Load).ToArray(),
    ReverseKeyed = items.Select(i => i.Rev).ToArray(),
    // One planted cross-loader: the recommendation item also reflects crew experience.
    CrossLoadings = [(Array.FindIndex(items, i => i.Name == "val5"), 2, 0.35)],
    FactorCorrelations = new double[,]
    {
        { 1.00, 0.35, 0.30, 0.45, 0.25 },
        { 0.35, 1.00, 0.40, 0.30, 0.30 },
        { 0.30, 0.40, 1.00, 0.35, 0.25 },
        { 0.45, 0.30, 0.35, 1.00, 0.20 },
        { 0.25, 0.30, 0.25, 0.20, 1.00 },
    },
    Categories = 5,
    CategoryProbabilities = [0.07, 0.15, 0.28, 0.32, 0.18],
};
const ulong seed = 20261202;
var survey = FactorModelSimulator.Generate(spec, new FactorModelSimulator.Settings(
    Respondents: 960, Seed: seed, MissingRate: 0.015, StraightLiners: 7, RandomResponders: 9,
    ItemNames: items.Select(i => i.Name).ToList(), SubscaleNames: subscales));

var inv = CultureInfo.InvariantCulture;
var rng = new RandomStream(seed + 1);
string[] routes = ["North Quay", "Island Loop", "Harbour Express", "River Shuttle"];
var sb = new StringBuilder();
sb.Append("respondent,route");
foreach (var it in items) sb.Append(',').Append(it.Name);
sb.Append('\n');
var m = survey.Responses;
for (int i = 0; i < m.RespondentCount; i++)
{
    sb.Append("FR-").Append((i + 1).ToString("0000", inv)).Append(',').Append(routes[rng.NextInt(routes.Length)]);
    for (int j = 0; j < p; j++)
    {
        double x = m[i, j];
        sb.Append(',');
        // Missing answers appear both as empty cells and as NA, as survey exports mix them.
        if (double.IsNaN(x)) sb.Append(rng.NextDouble() < 0.5 ? "" : "NA");
        else sb.Append(x.ToString(inv));
    }
    sb.Append('\n');
}
File.WriteAllText(Path.Combine(outDir, "responses.csv"), sb.ToString(), new UTF8Encoding(false));

// The same answers as a survey platform might export them: two rows under the header hold each question's wording
// and its answer scale, a submission-time column is added, and every missing answer is the code -99.
// Read it with --skip-rows 2 --missing=-99 (the README's walkthrough and a test do).
var export = new StringBuilder("respondent,submitted,route");
foreach (var it in items) export.Append(',').Append(it.Name);
export.Append("\n\"Respondent ID\",\"Submitted at\",\"Which route do you use most often?\"");
foreach (var it in items) export.Append(",\"").Append(it.Text).Append('"');
export.Append("\nsystem,system,single choice");
foreach (var _ in items) export.Append(",1 = strongly disagree ... 5 = strongly agree");
export.Append('\n');
var start = new DateTime(2026, 9, 1, 7, 0, 0, DateTimeKind.Utc);
foreach (var (line, i) in sb.ToString().Split('\n', StringSplitOptions.RemoveEmptyEntries).Skip(1).Select((l, i) => (l, i)))
{
    var cells = line.Split(',');
    export.Append(cells[0]).Append(',').Append(start.AddMinutes(37 * i).ToString("yyyy-MM-dd HH:mm", inv)).Append(',').Append(cells[1]);
    foreach (string c in cells.Skip(2)) export.Append(',').Append(c is "" or "NA" ? "-99" : c);
    export.Append('\n');
}
File.WriteAllText(Path.Combine(outDir, "platform-export.csv"), export.ToString(), new UTF8Encoding(false));

var cb = new StringBuilder("item,subscale,reverse,min,max,text\n");
foreach (var it in items) cb.Append($"{it.Name},{it.Sub},{(it.Rev ? "true" : "false")},1,5,\"{it.Text}\"\n");
File.WriteAllText(Path.Combine(outDir, "codebook.csv"), cb.ToString(), new UTF8Encoding(false));

var truth = new StringBuilder("respondent,planted\n");
for (int i = 0; i < m.RespondentCount; i++)
    if (survey.Careless[i] != CarelessKind.None)
        truth.Append("FR-").Append((i + 1).ToString("0000", inv)).Append(',').Append(survey.Careless[i] == CarelessKind.StraightLine ? "same-answer-throughout" : "random-answers").Append('\n');
File.WriteAllText(Path.Combine(outDir, "planted-careless.csv"), truth.ToString(), new UTF8Encoding(false));
Console.WriteLine($"Wrote {m.RespondentCount} respondents × {p} items to {outDir}");
