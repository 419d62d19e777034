using System.Globalization;
using ItemReduce.Report.Charts;
using ItemReduce.Report.Formatting;
using ItemReduce.Report.Model;

namespace ItemReduce.Tests.Report;

/// <summary>
/// A small invented appendix used by the report tests: one long table (forces a page split), a short table,
/// a line chart with a marker, a Q–Q scatter chart, bullets, a key/value block and references.
/// Numbers are made up by simple deterministic formulas; they are not results of any analysis.
/// </summary>
internal static class DemoAppendix
{
    public const string Title = "Methods appendix (demo): a 60-item wellbeing pool";
    public const string Creator = "ItemReduce 0.1.0 (test build)";
    public const string LongTableHeader = "Item code";
    public const int LongTableRows = 60;

    public static readonly DateTimeOffset Created = new(2026, 3, 15, 9, 30, 0, TimeSpan.Zero);

    public static readonly string[] Headings =
    [
        "1 Data screening",
        "2 Item statistics",
        "2.1 Loadings on the first factor",
        "3 Number of dimensions",
        "4 Reproducibility",
        "References",
    ];

    public static string ItemCode(int i) => "WB" + (i + 1).ToString("00", CultureInfo.InvariantCulture);

    public static AppendixDocument Build()
    {
        var rows = new List<TableRow>();
        for (int i = 0; i < LongTableRows; i++)
        {
            double loading = 0.25 + 0.6 * ((i * 37) % 100) / 100.0;
            double itemTotal = loading * 0.9;
            double mean = 2.0 + ((i * 13) % 30) / 10.0;
            var mark = i % 7 == 0 ? RowMark.Highlighted : i % 11 == 5 ? RowMark.Struck : RowMark.None;
            rows.Add(new TableRow(
                [ItemCode(i), "I feel statement number " + (i + 1).ToString(CultureInfo.InvariantCulture), NumberFormat.Fixed(mean),
                 NumberFormat.Bounded(itemTotal), NumberFormat.Bounded(loading)],
                mark));
        }

        var components = Enumerable.Range(1, 12).Select(k => (double)k).ToArray();
        var observed = components.Select(k => 9.0 / Math.Pow(k, 1.3)).ToArray();
        var reference = components.Select(k => 1.6 - 0.05 * k).ToArray();
        var theoretical = Enumerable.Range(0, 40).Select(i => -2.0 + 4.0 * i / 39.0).ToArray();
        var sample = theoretical.Select((t, i) => t * 1.05 + 0.1 * Math.Sin(i)).ToArray();

        return new AppendixDocument(Title, "Invented content for layout tests", Created, Creator,
        [
            new HeadingBlock(1, Headings[0]),
            new ParagraphBlock("Respondents were screened before any item statistics were computed. Flags are for **human review**, not for automatic deletion; the decision to exclude anyone rests with the research team and its ethics board."),
            new BulletListBlock(["Long-string index above the cutoff: 4 respondents.", "Squared distance beyond the chi-square cutoff (α = .001): 7 respondents."]),
            new HeadingBlock(1, Headings[1]),
            new ParagraphBlock("Table 1 lists all items of the pool. Shaded rows are kept in the short form; struck rows were removed."),
            new HeadingBlock(2, Headings[2]),
            new TableBlock(1, "Item means, corrected item–total correlations and loadings",
                [new TableColumn(LongTableHeader), new TableColumn("Wording"), new TableColumn("M", ColumnAlignment.Right),
                 new TableColumn("r(it)", ColumnAlignment.Right), new TableColumn("Loading", ColumnAlignment.Right)],
                rows,
                "Invented values. r(it) = correlation of the item with the sum of the other items."),
            new TableBlock(2, "Reliability of the full pool and of the short form",
                [new TableColumn("Scale"), new TableColumn("Items", ColumnAlignment.Right), new TableColumn("α", ColumnAlignment.Right), new TableColumn("p", ColumnAlignment.Right)],
                [new TableRow(["Full pool", "60", NumberFormat.Bounded(0.93), NumberFormat.PValue(0.0002)]),
                 new TableRow(["Short form", "12", NumberFormat.Bounded(0.85), NumberFormat.PValue(0.034)])],
                "Short forms need validation in a new sample."),
            new HeadingBlock(1, Headings[3]),
            new FigureBlock(1, "Eigenvalues of the observed data and of the random reference data",
                new ChartSpec(ChartKind.Line, "Component number", "Eigenvalue",
                    [new ChartSeries("Observed", components, observed, SeriesStyle.LineAndMarkers),
                     new ChartSeries("Random reference", components, reference, SeriesStyle.Dashed)])
                { Marker = new VerticalMarker(3, "retained: 3") }),
            new FigureBlock(2, "Quantiles of squared distances against chi-square quantiles",
                new ChartSpec(ChartKind.Scatter, "Theoretical quantile", "Sample quantile",
                    [new ChartSeries("Respondents", theoretical, sample)])
                { IdentityLine = true, AspectRatio = 0.8 }),
            new HeadingBlock(1, Headings[4]),
            new KeyValueBlock([new KeyValueEntry("Seed", "20260315"), new KeyValueEntry("Input file", "responses_demo.csv"),
                new KeyValueEntry("Program", Creator)]),
            new HeadingBlock(1, Headings[5]),
            new ReferenceListBlock(["Horn, J. L. (1965). A rationale and test for the number of factors in factor analysis. Psychometrika, 30(2), 179–185.",
                "Cronbach, L. J. (1951). Coefficient alpha and the internal structure of tests. Psychometrika, 16(3), 297–334."]),
        ])
        {
            RunningFooter = "Demo appendix · seed 20260315",
        };
    }
}
