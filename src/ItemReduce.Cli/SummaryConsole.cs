using ItemReduce.Application.Summary;
using Spectre.Console;

namespace ItemReduce.Cli;

/// <summary>Prints the end-of-command summary: plain text when stdout is not a terminal (files, pipes, tests), aligned
/// tables with rules when it is.</summary>
internal static class SummaryConsole
{
    /// <summary>Writes <paramref name="blocks"/> to <paramref name="stdout"/>.</summary>
    internal static void Write(IReadOnlyList<SummaryBlock> blocks, TextWriter stdout, bool terminal)
    {
        if (!terminal)
        {
            stdout.Write(RunSummary.PlainText(blocks));
            stdout.Flush();
            return;
        }
        var console = AnsiConsole.Create(new AnsiConsoleSettings
        {
            Out = new AnsiConsoleOutput(stdout),
            Ansi = AnsiSupport.Detect,
            ColorSystem = ColorSystemSupport.Detect,
        });
        Render(blocks, console);
    }

    /// <summary>Renders the blocks as tables on <paramref name="console"/>.</summary>
    internal static void Render(IReadOnlyList<SummaryBlock> blocks, IAnsiConsole console)
    {
        foreach (var b in blocks)
        {
            console.Write(new Rule(Markup.Escape(b.Title)) { Justification = Justify.Left });
            if (b.Header.Count > 0)
            {
                var table = new Table { Border = TableBorder.Simple };
                for (int c = 0; c < b.Header.Count; c++)
                {
                    var column = new TableColumn(Markup.Escape(b.Header[c]));
                    if (c > 0 && b.Rows.All(r => RunSummary.IsNumeric(r[c]))) column.RightAligned();
                    table.AddColumn(column);
                }
                foreach (var row in b.Rows) table.AddRow(row.Select(cell => (Spectre.Console.Rendering.IRenderable)new Text(cell)).ToArray());
                console.Write(table);
            }
            foreach (string line in b.Lines) console.Write(new Paragraph(line + "\n"));
            console.WriteLine();
        }
    }
}
