using ScottPlot;

namespace InspectionUpdate.Reporting.Plots;

/// <summary>
/// The report's own look: a light, print-friendly style where every series differs by line pattern and width as well
/// as by colour, so that the plots stay readable on a grey-scale printer.
/// </summary>
internal static class PlotStyle
{
    public const int Width = 900;
    public const int Height = 460;

    /// <summary>Smallest probability drawn on a log axis; smaller values (and zeros) are drawn at this floor.</summary>
    public const double LogFloor = 1e-12;

    public static readonly Color Prior = Color.FromHex("#3D5A80");
    public static readonly Color Updated = Color.FromHex("#E07A1F");
    public static readonly Color Target = Color.FromHex("#9B2335");
    public static readonly Color Inspection = Color.FromHex("#2A7F62");
    public static readonly Color Repair = Color.FromHex("#5C4033");
    public static readonly Color Planned = Color.FromHex("#6A4C93");
    public static readonly Color Bars = Color.FromHex("#3D5A80");
    public static readonly Color Ink = Color.FromHex("#1F2430");
    public static readonly Color GridLine = Color.FromHex("#D9DCE3");

    /// <summary>Colours for curves of several methods, distinct in hue and lightness.</summary>
    public static readonly Color[] Series =
    [
        Color.FromHex("#3D5A80"), Color.FromHex("#E07A1F"), Color.FromHex("#2A7F62"), Color.FromHex("#9B2335"),
        Color.FromHex("#6A4C93"), Color.FromHex("#8A8D91"),
    ];

    /// <summary>Line patterns cycled with <see cref="Series"/>.</summary>
    public static readonly LinePattern[] Patterns =
        [LinePattern.Solid, LinePattern.Dashed, LinePattern.DenselyDashed, LinePattern.Dotted, LinePattern.Solid, LinePattern.Dashed];

    public static Plot NewPlot(string title, string xLabel, string yLabel)
    {
        var plot = new Plot();
        plot.Title(title, 16);
        plot.XLabel(xLabel, 13);
        plot.YLabel(yLabel, 13);
        plot.FigureBackground.Color = Colors.White;
        plot.DataBackground.Color = Colors.White;
        plot.Grid.MajorLineColor = GridLine;
        plot.Axes.Color(Ink);
        return plot;
    }

    /// <summary>
    /// Makes the left axis a base-10 log axis for data already transformed with <see cref="Log10"/>: integer decades
    /// labelled 1e-k, minor ticks at 2..9 × 10^k.
    /// </summary>
    public static void UseLogLeftAxis(Plot plot)
    {
        plot.Axes.Left.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
        {
            MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
            IntegerTicksOnly = true,
            LabelFormatter = y => FormattableString.Invariant($"1e{Math.Round(y):0}"),
        };
        plot.Grid.MinorLineWidth = 1;
        plot.Grid.MinorLineColor = Color.FromHex("#EEF0F4");
    }

    /// <summary>log10 of a probability, with zeros and values below <see cref="LogFloor"/> drawn at the floor.</summary>
    public static double Log10(double p) => Math.Log10(Math.Max(p, LogFloor));

    public static byte[] Png(Plot plot) => plot.GetImageBytes(Width, Height, ImageFormat.Png);
}
