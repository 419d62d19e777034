using System.Globalization;
using ItemReduce.Report.Model;
using SkiaSharp;

namespace ItemReduce.Report.Layout;

/// <summary>
/// Turns an <see cref="AppendixDocument"/> into display lists, one per page. Layout runs completely before
/// anything is drawn, so the page count is known when the footers ("Page n of N") are added.
/// </summary>
internal sealed partial class AppendixLayout
{
    // Type sizes (pt).
    internal const float BodySize = 10f;
    internal const float TableSize = 9f;
    internal const float NoteSize = 8.5f;
    internal const float FooterSize = 8f;
    private const float ParagraphGap = 6f;
    private const float BlockGap = 10f;

    private static readonly SKColor RuleColor = new(0x30, 0x30, 0x30);

    private readonly PageGeometry page;
    private readonly FontCache fonts;
    private readonly List<LaidOutPage> pages = [];
    private LaidOutPage current = null!;
    private float y;

    private AppendixLayout(PageGeometry page, FontCache fonts)
    {
        this.page = page;
        this.fonts = fonts;
    }

    /// <summary>Lays out the whole document and adds footers. At least one page is returned.</summary>
    public static IReadOnlyList<LaidOutPage> Run(AppendixDocument doc, PageGeometry page, FontCache fonts)
    {
        var layout = new AppendixLayout(page, fonts);
        layout.NewPage();
        layout.TitleBlock(doc);
        bool breakPending = false;
        foreach (var block in doc.Blocks)
        {
            if (block is PageBreakBlock)
            {
                // Applied when content follows, so a trailing break never adds an empty page.
                breakPending = true;
                continue;
            }
            if (breakPending) layout.PageBreak();
            breakPending = false;
            switch (block)
            {
                case HeadingBlock h: layout.Heading(h, layout.LeadHeight(doc.Blocks, block)); break;
                case ParagraphBlock p: layout.Paragraph(p.Text); break;
                case BulletListBlock b: layout.Bullets(b); break;
                case TableBlock t: layout.Table(t); break;
                case FigureBlock f: layout.Figure(f); break;
                case KeyValueBlock kv: layout.KeyValues(kv); break;
                case ReferenceListBlock r: layout.References(r); break;
                default: throw new ArgumentException($"Unsupported block type {block.GetType().Name}.", nameof(doc));
            }
        }
        layout.Footers(doc.RunningFooter);
        return layout.pages;
    }

    // ---- page management -------------------------------------------------------------------------

    private void NewPage()
    {
        current = new LaidOutPage();
        pages.Add(current);
        y = page.ContentTop;
    }

    private bool AtPageTop => y <= page.ContentTop + 0.01f;

    private float Remaining => page.ContentBottom - y;

    /// <summary>Starts a new page unless <paramref name="height"/> fits below the cursor (or we are at the top already).</summary>
    private void Reserve(float height)
    {
        if (height > Remaining && !AtPageTop) NewPage();
    }

    private void PageBreak()
    {
        if (!AtPageTop) NewPage();
    }

    private void Gap(float height)
    {
        if (!AtPageTop) y = Math.Min(y + height, page.ContentBottom);
    }

    // ---- text primitives -------------------------------------------------------------------------

    private List<TextLine> Wrap(IReadOnlyList<TextRun> runs, float size, float firstWidth, float otherWidth)
        => LineBreaker.Break(runs, firstWidth, otherWidth, (s, bold) => fonts.Measure(s, bold, size));

    /// <summary>Draws one wrapped line with its top at <paramref name="top"/>.</summary>
    private void DrawLine(TextLine line, float x, float top, TextStyle style)
    {
        float baseline = top + fonts.BaselineOffset(style);
        foreach (var run in line.Runs)
        {
            if (run.Text.Trim().Length == 0) continue;
            // A leading space belongs to the run for measuring; drawing starts at the first visible glyph.
            string text = run.Text.TrimStart();
            float skip = text.Length == run.Text.Length ? 0f : fonts.Measure(run.Text[..(run.Text.Length - text.Length)], run.Bold, style.Size);
            current.Items.Add(new TextItem(x + run.Offset + skip, baseline, text, style.WithBold(run.Bold)));
        }
    }

    /// <summary>Flowing text: lines move to the next page one by one.</summary>
    private void FlowLines(List<TextLine> lines, float firstX, float otherX, TextStyle style)
    {
        for (int i = 0; i < lines.Count; i++)
        {
            Reserve(style.LineHeight);
            DrawLine(lines[i], i == 0 ? firstX : otherX, y, style);
            y += style.LineHeight;
        }
    }

    private void SingleLine(string text, TextStyle style, float x)
    {
        current.Items.Add(new TextItem(x, y + fonts.BaselineOffset(style), text, style));
        y += style.LineHeight;
    }

    private void Rule(float x1, float x2, float atY, float thickness)
        => current.Items.Add(new RuleItem(x1, atY, x2, atY, thickness, RuleColor));

    // ---- blocks ----------------------------------------------------------------------------------

    private void TitleBlock(AppendixDocument doc)
    {
        var title = TextStyle.Strong(17f);
        var lines = Wrap([new TextRun(doc.Title, true)], title.Size, page.ContentWidth, page.ContentWidth);
        FlowLines(lines, page.ContentLeft, page.ContentLeft, title);
        if (!string.IsNullOrWhiteSpace(doc.Subtitle))
        {
            var sub = TextStyle.Regular(12f);
            y += 2f;
            FlowLines(Wrap([new TextRun(doc.Subtitle, false)], sub.Size, page.ContentWidth, page.ContentWidth), page.ContentLeft, page.ContentLeft, sub);
        }
        y += 4f;
        string stamp = "Created " + doc.CreatedUtc.ToUniversalTime().ToString("yyyy-MM-dd HH:mm", CultureInfo.InvariantCulture) + " UTC";
        if (!string.IsNullOrWhiteSpace(doc.Creator)) stamp += " \u00B7 " + doc.Creator;
        var meta = new TextStyle(9f, false, TextStyle.Grey);
        FlowLines(Wrap([new TextRun(stamp, false)], meta.Size, page.ContentWidth, page.ContentWidth), page.ContentLeft, page.ContentLeft, meta);
        y += 4f;
        Rule(page.ContentLeft, page.ContentRight, y, 0.8f);
        y += 12f;
    }

    /// <summary>
    /// Height of the start of the block after <paramref name="heading"/> that must share the heading's page:
    /// a whole figure, a table's caption, header and first rows, or three lines of text.
    /// </summary>
    private float LeadHeight(IReadOnlyList<Block> blocks, Block heading)
    {
        int i = -1;
        for (int k = 0; k < blocks.Count; k++)
        {
            if (ReferenceEquals(blocks[k], heading)) { i = k; break; }
        }
        Block? next = i >= 0 && i + 1 < blocks.Count ? blocks[i + 1] : null;
        float threeLines = 3 * TextStyle.Regular(BodySize).LineHeight;
        return next switch
        {
            FigureBlock f => BlockGap + FigureSize(f).CaptionHeight + FigureSize(f).Height,
            TableBlock => BlockGap + 2 * TextStyle.Regular(BodySize).LineHeight + 4f + 3 * TextStyle.Regular(TableSize).LineHeight + 4 * CellPadY,
            _ => threeLines,
        };
    }

    private void Heading(HeadingBlock h, float leadHeight)
    {
        var style = h.Level == 1 ? TextStyle.Strong(13.5f) : TextStyle.Strong(11f);
        Gap(h.Level == 1 ? 12f : 8f);
        var lines = Wrap([new TextRun(h.Text, true)], style.Size, page.ContentWidth, page.ContentWidth);
        // Keep the heading on the same page as the start of what follows.
        Reserve(lines.Count * style.LineHeight + (h.Level == 1 ? 5f : 3f) + leadHeight);
        FlowLines(lines, page.ContentLeft, page.ContentLeft, style);
        y += h.Level == 1 ? 5f : 3f;
    }

    private void Paragraph(string text)
    {
        var style = TextStyle.Regular(BodySize);
        var lines = Wrap(InlineText.Parse(text), style.Size, page.ContentWidth, page.ContentWidth);
        // Avoid a single orphan line at the bottom of a page.
        if (lines.Count > 1) Reserve(2 * style.LineHeight);
        FlowLines(lines, page.ContentLeft, page.ContentLeft, style);
        y += ParagraphGap;
    }

    private void Bullets(BulletListBlock b)
    {
        var style = TextStyle.Regular(BodySize);
        const float indent = 16f;
        float textWidth = page.ContentWidth - indent;
        foreach (string item in b.Items)
        {
            var lines = Wrap(InlineText.Parse(item), style.Size, textWidth, textWidth);
            Reserve(style.LineHeight);
            current.Items.Add(new TextItem(page.ContentLeft + 5f, y + fonts.BaselineOffset(style), "\u2022", style));
            FlowLines(lines, page.ContentLeft + indent, page.ContentLeft + indent, style);
            y += 2f;
        }
        y += ParagraphGap;
    }

    private void KeyValues(KeyValueBlock kv)
    {
        var label = TextStyle.Strong(TableSize);
        var value = TextStyle.Regular(TableSize);
        float labelWidth = kv.Entries.Count == 0 ? 0f : kv.Entries.Max(e => fonts.Measure(e.Label, label)) + 14f;
        labelWidth = Math.Min(labelWidth, page.ContentWidth * 0.4f);
        float valueWidth = page.ContentWidth - labelWidth;
        foreach (var e in kv.Entries)
        {
            var labelLines = Wrap([new TextRun(e.Label, true)], label.Size, labelWidth - 14f, labelWidth - 14f);
            var valueLines = Wrap([new TextRun(e.Value, false)], value.Size, valueWidth, valueWidth);
            int n = Math.Max(labelLines.Count, valueLines.Count);
            Reserve(n * value.LineHeight);
            for (int i = 0; i < labelLines.Count; i++) DrawLine(labelLines[i], page.ContentLeft, y + i * label.LineHeight, label);
            for (int i = 0; i < valueLines.Count; i++) DrawLine(valueLines[i], page.ContentLeft + labelWidth, y + i * value.LineHeight, value);
            y += n * value.LineHeight + 1.5f;
        }
        y += ParagraphGap;
    }

    private void References(ReferenceListBlock r)
    {
        var style = TextStyle.Regular(9.5f);
        const float hang = 18f;
        foreach (string entry in r.Entries)
        {
            var lines = Wrap(InlineText.Parse(entry), style.Size, page.ContentWidth, page.ContentWidth - hang);
            FlowLines(lines, page.ContentLeft, page.ContentLeft + hang, style);
            y += 3f;
        }
        y += ParagraphGap;
    }

    private void Footers(string? runningFooter)
    {
        var style = new TextStyle(FooterSize, false, TextStyle.Grey);
        int total = pages.Count;
        for (int i = 0; i < total; i++)
        {
            var items = pages[i].Items;
            float ruleY = page.ContentBottom + 10f;
            items.Add(new RuleItem(page.ContentLeft, ruleY, page.ContentRight, ruleY, 0.4f, TextStyle.Grey));
            string number = string.Create(CultureInfo.InvariantCulture, $"Page {i + 1} of {total}");
            float numberWidth = fonts.Measure(number, style);
            items.Add(new TextItem(page.ContentRight - numberWidth, page.FooterBaseline, number, style));
            if (!string.IsNullOrWhiteSpace(runningFooter))
            {
                string text = Ellipsize(runningFooter.ReplaceLineEndings(" "), style, page.ContentWidth - numberWidth - 18f);
                items.Add(new TextItem(page.ContentLeft, page.FooterBaseline, text, style));
            }
        }
    }

    private string Ellipsize(string text, TextStyle style, float width)
    {
        if (fonts.Measure(text, style) <= width) return text;
        const string dots = "\u2026";
        int lo = 0, hi = text.Length;
        while (lo < hi)
        {
            int mid = (lo + hi + 1) / 2;
            if (fonts.Measure(text[..mid] + dots, style) <= width) lo = mid; else hi = mid - 1;
        }
        return text[..lo].TrimEnd() + dots;
    }
}
