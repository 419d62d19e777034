using System.Text;

namespace ItemReduce.Report.Export;

/// <summary>Escaping of plain text for LaTeX (text mode).</summary>
internal static class LatexText
{
    /// <summary>
    /// Escapes the ten LaTeX special characters <c>&amp; % $ # _ { } ~ ^ \</c> so they print literally,
    /// and replaces characters that print wrongly in the default font encoding: &lt; and &gt;
    /// (→ <c>\textless{}</c>, <c>\textgreater{}</c>), the typographic minus U+2212 (→ <c>$-$</c>).
    /// Line breaks become spaces; a hyphen before another hyphen becomes <c>-{}</c> so option names keep both hyphens. Greek letters and mathematical signs that text fonts lack (α, ω, χ, λ, ≥, ≤, ±, ×,
    /// superscript digits, …) are set in math mode (<c>$\alpha$</c>, <c>$\geq$</c>, <c>$^{2}$</c>), so the file
    /// compiles with pdflatex. Other Unicode passes through unchanged (UTF-8 input is the default since LaTeX 2018).
    /// </summary>
    public static string Escape(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var sb = new StringBuilder(text.Length + 16);
        for (int i = 0; i < text.Length; i++)
        {
            char c = text[i];
            sb.Append(c switch
            {
                // "--" would print as a dash: keep option names such as --cutoff-p as typed.
                '-' when i + 1 < text.Length && text[i + 1] == '-' => "-{}",
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
                _ when MathSigns.TryGetValue(c, out string? math) => "$" + math + "$",
                '\r' => "",
                '\n' => " ",
                _ => c.ToString(),
            });
        }
        return sb.ToString();
    }

    /// <summary>Characters set in math mode, with their math-mode commands.</summary>
    private static readonly Dictionary<char, string> MathSigns = BuildMathSigns();

    private static Dictionary<char, string> BuildMathSigns()
    {
        var map = new Dictionary<char, string>
        {
            ['≥'] = @"\geq",
            ['≤'] = @"\leq",
            ['≠'] = @"\neq",
            ['≈'] = @"\approx",
            ['±'] = @"\pm",
            ['×'] = @"\times",
            ['·'] = @"\cdot",
            ['→'] = @"\rightarrow",
            ['∞'] = @"\infty",
            ['√'] = @"\surd",
            ['∑'] = @"\sum",
            ['²'] = "^{2}",
            ['³'] = "^{3}",
            ['¹'] = "^{1}",
            ['⁰'] = "^{0}",
            ['′'] = "'",
            ['₀'] = "_{0}",
            ['₁'] = "_{1}",
            ['₂'] = "_{2}",
        };
        // Greek letters (U+03B1–U+03C9 and the capitals that differ from Latin ones), by name.
        string[] lower = ["alpha", "beta", "gamma", "delta", "epsilon", "zeta", "eta", "theta", "iota", "kappa", "lambda", "mu", "nu", "xi",
            "omicron", "pi", "rho", "varsigma", "sigma", "tau", "upsilon", "phi", "chi", "psi", "omega"];
        for (int i = 0; i < lower.Length; i++) map[(char)(0x03B1 + i)] = lower[i] == "omicron" ? "o" : "\\" + lower[i];
        foreach (var (ch, name) in new[] { ('Γ', "Gamma"), ('Δ', "Delta"), ('Θ', "Theta"), ('Λ', "Lambda"), ('Ξ', "Xi"), ('Π', "Pi"),
            ('Σ', "Sigma"), ('Υ', "Upsilon"), ('Φ', "Phi"), ('Ψ', "Psi"), ('Ω', "Omega") })
            map[ch] = "\\" + name;
        return map;
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
