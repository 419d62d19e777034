using System.Globalization;

namespace ItemReduce.Report.Formatting;

/// <summary>
/// Number formatting for tables and text, following common reporting conventions in the behavioural
/// sciences: fixed decimals, a typographic minus sign (U+2212), and no leading zero for quantities that
/// cannot exceed 1 in absolute value (correlations, loadings, reliability coefficients, p-values).
/// Always invariant culture (decimal point), whatever the machine's locale.
/// </summary>
public static class NumberFormat
{
    /// <summary>Typographic minus sign (U+2212) used for negative numbers.</summary>
    public const string Minus = "\u2212";

    /// <summary>Printed for NaN / missing values.</summary>
    public const string Missing = "\u2014";

    /// <summary>
    /// Fixed-point number with <paramref name="decimals"/> decimals (0–6), e.g. 12.35 or −0.40.
    /// A value that rounds to zero is printed without sign. NaN gives <see cref="Missing"/>;
    /// infinities give "∞" / "−∞".
    /// </summary>
    public static string Fixed(double value, int decimals = 2)
    {
        CheckDecimals(decimals);
        if (double.IsNaN(value)) return Missing;
        if (double.IsInfinity(value)) return value > 0 ? "\u221E" : Minus + "\u221E";
        double rounded = Math.Round(value, decimals, MidpointRounding.AwayFromZero);
        string digits = Math.Abs(rounded).ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        return rounded < 0 ? Minus + digits : digits;
    }

    /// <summary>
    /// Value bounded by 1 in absolute value, printed without the leading zero: .85, −.12, 1.00.
    /// Throws <see cref="ArgumentOutOfRangeException"/> when |value| &gt; 1 (beyond rounding noise of
    /// 1e-9), because dropping the zero would then be wrong; use <see cref="Fixed"/> for such values
    /// (e.g. Heywood cases).
    /// </summary>
    public static string Bounded(double value, int decimals = 2)
    {
        CheckDecimals(decimals);
        if (double.IsNaN(value)) return Missing;
        if (!(Math.Abs(value) <= 1 + 1e-9))
            throw new ArgumentOutOfRangeException(nameof(value), value,
                "A value printed without leading zero must lie in [-1, 1]; use NumberFormat.Fixed for larger values.");
        return DropLeadingZero(Fixed(Math.Clamp(value, -1, 1), decimals));
    }

    /// <summary>
    /// p-value without leading zero and without the "p": "&lt; .001" below .001, "&gt; .999" above .999,
    /// otherwise three decimals (".034"). Throws <see cref="ArgumentOutOfRangeException"/> outside [0, 1].
    /// </summary>
    public static string PValue(double p)
    {
        if (double.IsNaN(p)) return Missing;
        if (!(p >= 0 && p <= 1))
            throw new ArgumentOutOfRangeException(nameof(p), p, "A p-value must lie in [0, 1].");
        if (p < 0.001) return "< .001";
        if (p > 0.999) return "> .999";
        return DropLeadingZero(Fixed(p, 3));
    }

    /// <summary>p-value as a statement for running text: "p &lt; .001", "p = .034".</summary>
    public static string PStatement(double p)
    {
        string s = PValue(p);
        return s.StartsWith('<') || s.StartsWith('>') ? "p " + s : "p = " + s;
    }

    /// <summary>Integer in plain invariant digits without grouping ("1234"), typographic minus for negatives.</summary>
    public static string Integer(long value)
        => value.ToString(CultureInfo.InvariantCulture).Replace("-", Minus, StringComparison.Ordinal);

    /// <summary>Fraction in [0, 1] (or beyond) as a percentage with <paramref name="decimals"/> decimals: 0.125 → "12.5%".</summary>
    public static string Percent(double fraction, int decimals = 1)
        => double.IsNaN(fraction) ? Missing : Fixed(fraction * 100, decimals) + "%";

    private static string DropLeadingZero(string s)
    {
        if (s.StartsWith("0.", StringComparison.Ordinal)) return s[1..];
        if (s.StartsWith(Minus + "0.", StringComparison.Ordinal)) return Minus + s[2..];
        return s;
    }

    private static void CheckDecimals(int decimals)
    {
        if (decimals is < 0 or > 6)
            throw new ArgumentOutOfRangeException(nameof(decimals), decimals, "Decimals must be between 0 and 6.");
    }
}
