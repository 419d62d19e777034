using ItemReduce.Report.Charts;
using ItemReduce.Report.Layout;
using SkiaSharp;

namespace ItemReduce.Report.Pdf;

/// <summary>Paints a laid-out page's display list onto a canvas (fills first, then everything in order).</summary>
internal static class PagePainter
{
    public static void Paint(SKCanvas canvas, LaidOutPage page, FontCache fonts)
    {
        using var paint = new SKPaint { IsAntialias = true };
        foreach (var fill in page.Items.OfType<FillItem>())
        {
            paint.Style = SKPaintStyle.Fill;
            paint.Color = fill.Color;
            canvas.DrawRect(fill.Rect, paint);
        }
        foreach (var item in page.Items)
        {
            switch (item)
            {
                case TextItem t:
                    paint.Style = SKPaintStyle.Fill;
                    paint.Color = t.Style.Color;
                    canvas.DrawText(t.Text, t.X, t.Baseline, fonts.Get(t.Style.Bold, t.Style.Size), paint);
                    break;
                case RuleItem r:
                    paint.Style = SKPaintStyle.Stroke;
                    paint.StrokeWidth = r.Thickness;
                    paint.Color = r.Color;
                    canvas.DrawLine(r.X1, r.Y1, r.X2, r.Y2, paint);
                    break;
                case ChartItem c:
                    int saved = canvas.Save();
                    canvas.ClipRect(c.Rect);
                    ChartPainter.Draw(canvas, c.Rect, c.Spec);
                    canvas.RestoreToCount(saved);
                    break;
            }
        }
    }
}
