using System.Text;

namespace ItemReduce.Report.Export;

/// <summary>Escaping of plain text for LaTeX (text mode).</summary>
public static class LatexText
{
    /// <summary>
    /// Escapes the ten LaTeX special characters <c>&amp; % $ # _ { } ~ ^ \</c> so they print literally,
    /// and replaces characters that print wrongly in the default font encoding: &lt; and &gt;
    /// (→ <c>\textless{}</c>, <c>\textgreater{}</c>), the typographic minus U+2212 (→ <c>$-$</c>).
    /// Line breaks become spaces. Other Unicode passes through unchanged (UTF-8 input is the default
    /// since LaTeX 2018).
    /// </summary>
    public static string Escape(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var sb = new StringBuilder(text.Length + 16);
        foreach (char c in text)
        {
            sb.Append(c switch
            {
                '\\' => @"\textbackslash{}",
                '&' => @"\&",
                '%' => @"\%",
                '$' => @"\$",
                '#' => @"\#",
                '_' => @"\_",
                '{' => @"\{",
                '}' => @"\}",
                '~' => @"\textasciitilde{}",
                '^' => @"\textasciicircum{}",
                '<' => @"\textless{}",
                '>' => @"\textgreater{}",
                '\u2212' => "$-$",
                '\r' => "",
                '\n' => " ",
                _ => c.ToString(),
            });
        }
        return sb.ToString();
    }

    /// <summary>Escapes text and turns <c>**bold**</c> spans into <c>\textbf{...}</c>.</summary>
    internal static string EscapeInline(string text)
    {
        var sb = new StringBuilder();
        foreach (var run in Layout.InlineText.Parse(text))
        {
            sb.Append(run.Bold ? @"\textbf{" + Escape(run.Text) + "}" : Escape(run.Text));
        }
        return sb.ToString();
    }
}
