using System.Globalization;
using ScottPlot;

namespace InspectionUpdate.Reporting.Plots;

/// <summary>Plots of a whole register's stored results (distributions and counts), PNG bytes like <see cref="ReportCharts"/>.</summary>
public static class RegisterCharts
{
    /// <summary>Counts of values in equal bins: (lower edges, counts). Bins of <paramref name="width"/> from <paramref name="start"/>; the last bin takes every value at or above its lower edge.</summary>
    public static (double[] Lower, int[] Counts) Bin(IEnumerable<double> values, double start, double width, int bins)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (!(width > 0) || bins < 1) throw new ArgumentOutOfRangeException(nameof(width), "width must be positive and bins at least 1");
        var counts = new int[bins];
        foreach (var v in values)
        {
            var k = (int)Math.Floor((v - start) / width);
            counts[Math.Clamp(k, 0, bins - 1)]++;
        }

        return (Enumerable.Range(0, bins).Select(k => start + k * width).ToArray(), counts);
    }

    /// <summary>Distribution of the current annual Pf over the register: components per half decade (log axis of Pf), with the target line.</summary>
    public static byte[] AnnualPfDistribution(IReadOnlyList<double> annualPf, double targetAnnualPf)
    {
        ArgumentNullException.ThrowIfNull(annualPf);
        using var plot = PlotStyle.NewPlot("Distribution of the current annual Pf", "Annual Pf (log scale; half-decade bins; zeros and values below 1e-12 in the first bin)", "Components");
        var logs = annualPf.Select(PlotStyle.Log10).ToArray();
        var low = logs.Length == 0 ? -8 : Math.Floor(Math.Min(logs.Min(), Math.Log10(targetAnnualPf)));
        var high = logs.Length == 0 ? 0 : Math.Ceiling(Math.Max(logs.Max(), Math.Log10(targetAnnualPf)) + 1e-9);
        var bins = Math.Max(1, (int)Math.Round((high - low) / 0.5));
        var (lower, counts) = Bin(logs, low, 0.5, bins);
        AddBars(plot, lower.Select(x => x + 0.25).ToArray(), counts, 0.45);
        var t = plot.Add.VerticalLine(Math.Log10(targetAnnualPf), 2, PlotStyle.Target, LinePattern.DenselyDashed);
        t.LegendText = "target " + ReportCharts.Probability(targetAnnualPf) + " per year";
        plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
            Enumerable.Range((int)low, (int)(high - low) + 1).Select(d => (double)d).ToArray(),
            Enumerable.Range((int)low, (int)(high - low) + 1).Select(d => FormattableString.Invariant($"1e{d}")).ToArray());
        plot.Axes.SetLimits(low - 0.1, high + 0.1, 0, Math.Max(1, counts.Max()) * 1.12);
        plot.ShowLegend(Alignment.UpperRight);
        return PlotStyle.Png(plot);
    }

    /// <summary>Distribution of the years until the annual Pf reaches the target: components per bin; those beyond the horizon are counted in the caption, not drawn.</summary>
    public static byte[] YearsToTargetDistribution(IReadOnlyList<double> years)
    {
        ArgumentNullException.ThrowIfNull(years);
        using var plot = PlotStyle.NewPlot("Distribution of the years to target", "Years from the evidence date until the annual Pf reaches the target (1-year bins up to 10, then 5-year bins)", "Components");
        // Uneven bins: single years where decisions are made, five-year bins after.
        var edges = Enumerable.Range(0, 11).Select(y => (double)y).Concat(Enumerable.Range(3, 18).Select(k => 5.0 * k)).ToArray();
        var top = years.Count == 0 ? 15 : Math.Max(15, Math.Ceiling(years.Max() / 5) * 5 + 5);
        edges = edges.Where(e => e <= top).ToArray();
        var counts = new int[edges.Length];
        foreach (var y in years)
        {
            var k = Array.FindLastIndex(edges, e => e <= Math.Max(y, 0));
            counts[Math.Max(k, 0)]++;
        }

        var centres = edges.Select((e, i) => i + 1 < edges.Length ? (e + edges[i + 1]) / 2 : e + 2.5).ToArray();
        var widths = edges.Select((e, i) => (i + 1 < edges.Length ? edges[i + 1] - e : 5) * 0.9).ToArray();
        var bars = centres.Select((c, i) => new Bar { Position = c, Value = counts[i], Size = widths[i], FillColor = PlotStyle.Bars, LineColor = PlotStyle.Ink }).ToArray();
        plot.Add.Bars(bars);
        plot.Axes.SetLimits(-0.5, edges[^1] + 5.5, 0, Math.Max(1, counts.Max()) * 1.12);
        return PlotStyle.Png(plot);
    }

    /// <summary>Next inspections due per calendar year (bars), from the stored next-due dates.</summary>
    public static byte[] DuePerYear(IReadOnlyList<(int Year, int Count)> perYear)
    {
        ArgumentNullException.ThrowIfNull(perYear);
        using var plot = PlotStyle.NewPlot("Next inspections due per year", "Calendar year of the latest date of the next inspection", "Components");
        if (perYear.Count > 0)
        {
            AddBars(plot, perYear.Select(p => (double)p.Year).ToArray(), perYear.Select(p => p.Count).ToArray(), 0.8);
            var first = perYear.Min(p => p.Year);
            var last = perYear.Max(p => p.Year);
            var step = Math.Max(1, (last - first + 1) / 15);
            var ticks = Enumerable.Range(0, (last - first) / step + 1).Select(k => first + k * step).ToArray();
            plot.Axes.Bottom.TickGenerator = new ScottPlot.TickGenerators.NumericManual(ticks.Select(y => (double)y).ToArray(),
                ticks.Select(y => y.ToString(CultureInfo.InvariantCulture)).ToArray());
            plot.Axes.SetLimits(first - 0.8, last + 0.8, 0, Math.Max(1, perYear.Max(p => p.Count)) * 1.12);
        }

        return PlotStyle.Png(plot);
    }

    private static void AddBars(Plot plot, double[] positions, int[] counts, double size)
    {
        var bars = positions.Select((x, i) => new Bar { Position = x, Value = counts[i], Size = size, FillColor = PlotStyle.Bars, LineColor = PlotStyle.Ink }).ToArray();
        plot.Add.Bars(bars);
    }
}
