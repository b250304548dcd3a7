using System.Globalization;
using System.Net;
using System.Text.RegularExpressions;

namespace InspectionUpdate.Reporting;

/// <summary>
/// The one number format of every report: three significant figures, scientific notation ("2.45e-7") below 1e-3 and
/// from 1e4 up, the invariant culture, "−" never a hyphen split from its digits. Pages keep each number in one
/// unbreakable span (<see cref="Html"/>).
/// </summary>
public static partial class NumberText
{
    /// <summary>A real number in the report format: NaN "-", infinities "∞" and "−∞", zero "0".</summary>
    public static string Format(double v)
    {
        if (double.IsNaN(v)) return "-";
        if (double.IsPositiveInfinity(v)) return "∞";
        if (double.IsNegativeInfinity(v)) return "−∞";
        if (v == 0) return "0";
        var a = Math.Abs(v);
        if (a < 1e-3 || a >= 1e4) return Scientific(v);
        // Round to three significant figures first, then show as many decimals as that needs (9.996 → 10.0, not 10.00).
        var rounded = double.Parse(v.ToString("G3", CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
        if (Math.Abs(rounded) >= 1e4) return Scientific(v);
        var magnitude = (int)Math.Floor(Math.Log10(Math.Abs(rounded)));
        var decimals = Math.Max(0, 2 - magnitude);
        return rounded.ToString("F" + decimals.ToString(CultureInfo.InvariantCulture), CultureInfo.InvariantCulture);
    }

    /// <summary>Mantissa with three significant figures and a plain exponent, e.g. 2.45e-7, 1.00e-4, 3.20e4.</summary>
    public static string Scientific(double v)
    {
        var s = v.ToString("0.00e0", CultureInfo.InvariantCulture);
        return s;
    }

    /// <summary>A cumulative Pf in words where it is zero: "< bound" when sampled and bounded, the exact zero said so.</summary>
    /// <param name="pf">The cumulative Pf.</param>
    /// <param name="upperBound">Its upper bound where it is only bounded (sample-set route), else null.</param>
    /// <param name="simulated">Whether the number was sampled (a sampled zero is not an exact zero).</param>
    public static string Probability(double pf, double? upperBound, bool simulated)
    {
        if (pf != 0) return Format(pf);
        if (upperBound is { } b && b > 0) return "< " + Format(b);
        return simulated ? "0 (no failure sampled; not a bound)" : ExactZero;
    }

    /// <summary>How an exact zero probability is written.</summary>
    public const string ExactZero = "0 (impossible given the findings)";

    /// <summary>
    /// Rewrites numbers written in other formats inside a sentence (1.0E-004, 8.832E-004, 2.341E-09) in the report
    /// format; dates and codes are left alone.
    /// </summary>
    public static string Normalize(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        return ExponentNumber().Replace(text, m =>
            double.TryParse(m.Value, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) ? Format(v) : m.Value);
    }

    /// <summary>
    /// Text as HTML with every number (and every ISO date) in one unbreakable span: encoded, numbers normalized, each
    /// wrapped in <c>&lt;span class="num"&gt;</c>.
    /// </summary>
    public static string Html(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var encoded = WebUtility.HtmlEncode(Normalize(text));
        return NumberToken().Replace(encoded, m => "<span class=\"num\">" + m.Value + "</span>");
    }

    [GeneratedRegex(@"(?<![\w.])[-+]?\d+(?:\.\d+)?[eE][-+]?\d+(?!\w|\.\d)")]
    private static partial Regex ExponentNumber();

    // An ISO date, or a number with optional sign ("−" or "-"), "&lt; " bound prefix, decimals and exponent.
    [GeneratedRegex(@"\d{4}-\d{2}-\d{2}|(?<![\w.;&#-])(?:&lt; )?[-−]?\d+(?:\.\d+)?(?:e[-+]?\d+)?(?![\w])")]
    private static partial Regex NumberToken();
}
