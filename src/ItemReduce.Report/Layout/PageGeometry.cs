namespace ItemReduce.Report.Layout;

/// <summary>Page size and margins in PDF points (1/72 inch); origin at the top-left corner.</summary>
internal sealed record PageGeometry(float Width, float Height, float MarginLeft, float MarginRight, float MarginTop, float MarginBottom)
{
    /// <summary>ISO A4 (210 × 297 mm = 595.28 × 841.89 pt) with 2.25 cm side margins.</summary>
    public static PageGeometry A4 { get; } = new(595.28f, 841.89f, 64f, 64f, 60f, 72f);

    public float ContentLeft => MarginLeft;
    public float ContentRight => Width - MarginRight;
    public float ContentTop => MarginTop;
    public float ContentBottom => Height - MarginBottom;
    public float ContentWidth => ContentRight - ContentLeft;
    public float ContentHeight => ContentBottom - ContentTop;

    /// <summary>Baseline of the footer line (page number), inside the bottom margin.</summary>
    public float FooterBaseline => Height - MarginBottom / 2f;
}
