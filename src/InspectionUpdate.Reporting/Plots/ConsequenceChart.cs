using System.Globalization;
using ScottPlot;

namespace InspectionUpdate.Reporting.Plots;

/// <summary>
/// The probability–consequence chart of the register page, of our own design: one column per consequence class
/// (1–5, the owner's scale), each component a point at its annual Pf now (log axis), and each class's own target drawn
/// as a bar across its column ("target steps"). A point above its column's bar is above its target (filled, red);
/// below it, open and blue. No coloured grid of cells: the steps carry the owner's targets as they are.
/// </summary>
public static class ConsequenceChart
{
    /// <summary>Draws the chart; rows without a class or an annual Pf are left out.</summary>
    /// <exception cref="ArgumentException">No row has both a class and an annual Pf.</exception>
    public static byte[] Draw(IReadOnlyList<PortfolioRow> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var usable = rows.Where(r => r.ConsequenceClass is not null && r.CurrentAnnualPf is not null).ToArray();
        if (usable.Length == 0) throw new ArgumentException("No row has both a consequence class and an annual Pf.", nameof(rows));
        using var plot = PlotStyle.NewPlot("Probability and consequence", "Consequence class (owner's scale, 1 least to 5 most severe)", "Annual Pf now (log scale)");
        PlotStyle.UseLogLeftAxis(plot);
        var ys = new List<double>();
        foreach (var k in Enumerable.Range(1, 5))
        {
            var inClass = usable.Where(r => r.ConsequenceClass == k).OrderBy(r => r.ComponentId, StringComparer.Ordinal).ToArray();
            var target = inClass.Select(r => r.TargetAnnualPf).FirstOrDefault(t => t is > 0);
            if (target is { } t)
            {
                var y = PlotStyle.Log10(t);
                var bar = plot.Add.Line(k - 0.42, y, k + 0.42, y);
                bar.LineWidth = 3;
                bar.LineColor = PlotStyle.Target;
                ys.Add(y);
            }

            // Points of one class spread across the column so that equal values stay apart.
            for (var i = 0; i < inClass.Length; i++)
            {
                var r = inClass[i];
                var x = k + (inClass.Length == 1 ? 0 : -0.3 + 0.6 * i / (inClass.Length - 1));
                var y = PlotStyle.Log10(r.CurrentAnnualPf!.Value);
                ys.Add(y);
                var above = r.RatioToTarget is >= 1;
                var m = plot.Add.Marker(x, y, above ? MarkerShape.FilledCircle : MarkerShape.OpenCircle, 12, above ? PlotStyle.Target : PlotStyle.Prior);
                var text = plot.Add.Text(r.ComponentId, x, y);
                text.LabelFontSize = 12;
                text.LabelFontColor = PlotStyle.Ink;
                text.OffsetX = 8;
                text.OffsetY = -8;
            }
        }

        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
            Enumerable.Range(1, 5).Select(k => (double)k).ToArray(), Enumerable.Range(1, 5).Select(k => k.ToString(CultureInfo.InvariantCulture)).ToArray());
        var (bottom, top) = ReportCharts.ProbabilityAxis(ys.Min(), ys.Max(), 0.5);
        plot.Axes.SetLimits(0.4, 5.9, bottom, top);
        return PlotStyle.Png(plot);
    }
}
