using SkiaSharp;

namespace ItemReduce.Report.Layout;

/// <summary>Font size (pt), weight and colour of a piece of text.</summary>
internal readonly record struct TextStyle(float Size, bool Bold, SKColor Color)
{
    public static readonly SKColor Ink = new(0x1A, 0x1A, 0x1A);
    public static readonly SKColor Grey = new(0x70, 0x70, 0x70);

    public static TextStyle Regular(float size) => new(size, false, Ink);
    public static TextStyle Strong(float size) => new(size, true, Ink);

    public TextStyle WithBold(bool bold) => this with { Bold = bold };

    /// <summary>Distance between baselines of consecutive lines.</summary>
    public float LineHeight => Size * 1.32f;
}
