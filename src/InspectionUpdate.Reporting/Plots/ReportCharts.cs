using System.Globalization;
using InspectionUpdate.Reliability;
using ScottPlot;

namespace InspectionUpdate.Reporting.Plots;

/// <summary>Which quantity of a profile a chart shows.</summary>
public enum ProfileQuantity
{
    /// <summary>Generalized reliability index β(t) = −Φ⁻¹(Pf(t)), linear axis.</summary>
    Beta,

    /// <summary>Annual failure probability ΔPf(t) = Pf(t) − Pf(t − 1), log axis.</summary>
    AnnualPf,

    /// <summary>Cumulative failure probability Pf(t), log axis.</summary>
    CumulativePf,
}

/// <summary>Events drawn as vertical markers on a profile chart.</summary>
/// <param name="InspectionYears">Times of findings (years since entry into service).</param>
/// <param name="RepairYears">Times of repairs.</param>
/// <param name="PlannedYears">Times of planned inspections.</param>
public sealed record ChartMarkers(IReadOnlyList<double> InspectionYears, IReadOnlyList<double> RepairYears, IReadOnlyList<double> PlannedYears)
{
    /// <summary>No markers.</summary>
    public static ChartMarkers None { get; } = new([], [], []);
}

/// <summary>
/// The report's plots as PNG bytes (900 × 460 px). Each method draws only what it is given: it computes no
/// reliability numbers of its own.
/// </summary>
public static class ReportCharts
{
    /// <summary>Lowest decade of a probability axis: log10(1e-12).</summary>
    public const double LogAxisFloor = -12;

    /// <summary>Legend text of a β rise with no repair: noise in the estimate, since the cumulative Pf cannot fall.</summary>
    public const string BetaRiseNoise = "β rises: estimate noise (cumulative Pf cannot fall)";

    /// <summary>Legend text of a β rise at a repair: the cumulative Pf restarts from the repaired state.</summary>
    public const string BetaRiseRepair = "β rises: repair (Pf restarts)";

    /// <summary>Largest |β| drawn; beyond it (Pf below about 1e-17) points sit at the edge.</summary>
    private const double BetaEdge = 8.5;

    /// <summary>A profile chart: prior against updated, with the target line (annual Pf only) and event markers.</summary>
    /// <param name="quantity">What to draw.</param>
    /// <param name="prior">Prior profile, or null.</param>
    /// <param name="updated">Updated profile, or null.</param>
    /// <param name="targetAnnualPf">Target annual failure probability, drawn on the annual Pf chart; null for none.</param>
    /// <param name="markers">Inspection, repair and planned-inspection times.</param>
    /// <exception cref="ArgumentException">Both profiles are null.</exception>
    public static byte[] Profile(ProfileQuantity quantity, ReliabilityProfile? prior, ReliabilityProfile? updated,
        double? targetAnnualPf, ChartMarkers markers)
    {
        if (prior is null && updated is null) throw new ArgumentException("At least one profile is needed.", nameof(prior));
        ArgumentNullException.ThrowIfNull(markers);
        var (title, yLabel) = quantity switch
        {
            ProfileQuantity.Beta => ("Reliability index β(t)", "β (cumulative, generalized; drawn at most 8.5)"),
            ProfileQuantity.AnnualPf => ("Annual failure probability ΔPf(t)", "ΔPf per year (log scale)"),
            _ => ("Cumulative failure probability Pf(t)", "Pf(t) (log scale)"),
        };
        using var plot = PlotStyle.NewPlot(title, "Time in service (years)", yLabel);
        var log = quantity != ProfileQuantity.Beta;
        if (log) PlotStyle.UseLogLeftAxis(plot);

        var yMin = double.PositiveInfinity;
        var yMax = double.NegativeInfinity;
        var xMax = 0.0;
        foreach (var (profile, colour, pattern, width, name) in new[]
                 {
                     (prior, PlotStyle.Prior, LinePattern.Dashed, 2f, "prior"),
                     (updated, PlotStyle.Updated, LinePattern.Solid, 3f, "updated"),
                 })
        {
            if (profile is null) continue;
            var points = profile.Points.Where(p => p.TimeYears > 0).ToArray();
            if (points.Length == 0) continue;
            var xs = points.Select(p => p.TimeYears).ToArray();
            var ys = points.Select(p => Value(quantity, p)).ToArray();
            var line = plot.Add.ScatterLine(xs, ys, colour);
            line.LinePattern = pattern;
            line.LineWidth = width;
            line.LegendText = name + (profile.AllConverged ? string.Empty : " (some steps not converged)");
            var flagged = points.Where(p => !p.Converged).ToArray();
            if (flagged.Length > 0)
            {
                var m = plot.Add.Markers(flagged.Select(p => p.TimeYears).ToArray(), flagged.Select(p => Value(quantity, p)).ToArray(),
                    MarkerShape.Eks, 10, PlotStyle.Target);
                m.LegendText = name + ": not converged";
            }

            if (quantity == ProfileQuantity.Beta) MarkBetaRises(plot, points, markers.RepairYears, name);
            yMin = Math.Min(yMin, ys.Where(double.IsFinite).DefaultIfEmpty(0).Min());
            yMax = Math.Max(yMax, ys.Where(double.IsFinite).DefaultIfEmpty(1).Max());
            xMax = Math.Max(xMax, xs.Max());
        }

        if (quantity == ProfileQuantity.AnnualPf && targetAnnualPf is { } target && target > 0)
        {
            var y = PlotStyle.Log10(target);
            var h = plot.Add.HorizontalLine(y, 2, PlotStyle.Target, LinePattern.DenselyDashed);
            h.LegendText = "target " + Probability(target) + " per year";
            yMin = Math.Min(yMin, y);
            yMax = Math.Max(yMax, y);
        }

        AddMarkers(plot, markers.InspectionYears, PlotStyle.Inspection, LinePattern.Dotted, "inspection");
        AddMarkers(plot, markers.RepairYears, PlotStyle.Repair, LinePattern.Dashed, "repair");
        AddMarkers(plot, markers.PlannedYears, PlotStyle.Planned, LinePattern.DenselyDashed, "planned inspection");

        if (double.IsFinite(yMin) && double.IsFinite(yMax))
        {
            var pad = Math.Max(0.05 * (yMax - yMin), log ? 0.5 : 0.1);
            // Probabilities live in [1e-12, 1] (log10: [-12, 0]); the axis never runs beyond.
            plot.Axes.SetLimits(0, Math.Max(xMax, markers.PlannedYears.DefaultIfEmpty(0).Max()) * 1.02 + 0.1,
                log ? ProbabilityAxis(yMin, yMax, pad).Bottom : yMin - pad, log ? ProbabilityAxis(yMin, yMax, pad).Top : yMax + pad);
        }

        // β falls with time (curves end low on the right), failure probabilities rise (curves end high on the right):
        // the legend goes to the corner the curves leave empty.
        plot.ShowLegend(quantity == ProfileQuantity.Beta ? Alignment.UpperRight : Alignment.LowerRight);
        return PlotStyle.Png(plot);
    }

    /// <summary>Importance factors as horizontal bars, largest on top.</summary>
    public static byte[] Importance(ReportImportance importance)
    {
        ArgumentNullException.ThrowIfNull(importance);
        if (importance.Names.Count == 0 || importance.Names.Count != importance.Values.Count)
        {
            throw new ArgumentException("Names and values must be non-empty and of equal length.", nameof(importance));
        }

        using var plot = PlotStyle.NewPlot("Importance factors α² — " + importance.Label, "α² (share of the variance of the linearized margin)", string.Empty);
        var order = Enumerable.Range(0, importance.Names.Count).OrderBy(i => importance.Values[i]).ToArray();
        var bars = order.Select((i, k) => new Bar
        {
            Position = k,
            Value = importance.Values[i],
            FillColor = PlotStyle.Bars,
            LineColor = PlotStyle.Ink,
            Orientation = Orientation.Horizontal,
            Label = importance.Values[i].ToString("0.000", CultureInfo.InvariantCulture),
            Size = 0.7,
        }).ToArray();
        var barPlot = plot.Add.Bars(bars);
        barPlot.Horizontal = true;
        barPlot.ValueLabelStyle.FontSize = 12;
        plot.Axes.Left.TickGenerator = new ScottPlot.TickGenerators.NumericManual(
            Enumerable.Range(0, order.Length).Select(k => (double)k).ToArray(), order.Select(i => importance.Names[i]).ToArray());
        // α² lies in [0, 1]: the axis never runs beyond.
        plot.Axes.SetLimits(0, 1, -0.6, order.Length - 0.4);
        return PlotStyle.Png(plot);
    }

    /// <summary>Probability-of-detection curves of the methods.</summary>
    public static byte[] PodCurves(IReadOnlyList<ReportPodCurve> curves)
    {
        ArgumentNullException.ThrowIfNull(curves);
        if (curves.Count == 0) throw new ArgumentException("At least one curve is needed.", nameof(curves));
        using var plot = PlotStyle.NewPlot("Probability of detection", "Defect size (mm)", "PoD");
        for (var i = 0; i < curves.Count; i++)
        {
            var line = plot.Add.ScatterLine(curves[i].SizesMm.ToArray(), curves[i].Probabilities.ToArray(), PlotStyle.Series[i % PlotStyle.Series.Length]);
            line.LineWidth = 2.5f;
            line.LinePattern = PlotStyle.Patterns[i % PlotStyle.Patterns.Length];
            line.LegendText = curves[i].Method;
        }

        plot.Axes.SetLimitsY(0, 1.05);
        plot.Axes.SetLimitsX(0, curves.Max(c => c.SizesMm.DefaultIfEmpty(1).Max()));
        plot.ShowLegend(Alignment.LowerRight);
        return PlotStyle.Png(plot);
    }

    /// <summary>Prior and posterior samples of one input as overlaid normalized histograms.</summary>
    public static byte[] Posterior(ReportPosterior posterior)
    {
        ArgumentNullException.ThrowIfNull(posterior);
        var all = posterior.Prior.Concat(posterior.Posterior).Where(double.IsFinite).ToArray();
        if (all.Length < 2) throw new ArgumentException("At least two finite samples are needed.", nameof(posterior));
        var lo = all.Min();
        var hi = all.Max();
        if (!(hi > lo)) hi = lo + 1;
        using var plot = PlotStyle.NewPlot("Prior and posterior of " + posterior.Variable, posterior.Variable, "Probability density");
        const int binCount = 40;
        var width = (hi - lo) / binCount;
        foreach (var (samples, colour, name) in new[] { (posterior.Prior, PlotStyle.Prior, "prior"), (posterior.Posterior, PlotStyle.Updated, "posterior (" + posterior.Route + ")") })
        {
            var finite = samples.Where(double.IsFinite).ToArray();
            if (finite.Length == 0) continue;
            var counts = new double[binCount];
            foreach (var v in finite) counts[Math.Min(binCount - 1, (int)((v - lo) / width))]++;
            var xs = new double[2 * binCount];
            var ys = new double[2 * binCount];
            for (var b = 0; b < binCount; b++)
            {
                var density = counts[b] / (finite.Length * width);
                xs[2 * b] = lo + b * width;
                xs[2 * b + 1] = lo + (b + 1) * width;
                ys[2 * b] = density;
                ys[2 * b + 1] = density;
            }

            // Drawn as a filled step outline so that both distributions stay visible where they overlap.
            var s = plot.Add.ScatterLine(xs, ys, colour);
            s.LineWidth = 2;
            s.FillY = true;
            s.FillYColor = colour.WithAlpha(0.25);
            s.LegendText = name;
        }

        plot.Axes.AutoScale();
        plot.ShowLegend(Alignment.UpperRight);
        return PlotStyle.Png(plot);
    }

    /// <summary>
    /// Risk ranking of the register: current annual failure probability (log axis) against the years left until the
    /// annual failure probability reaches the target. Rows without both numbers are left out.
    /// </summary>
    public static byte[] RiskRanking(IReadOnlyList<PortfolioRow> rows, double? targetAnnualPf, double horizonYears = 50)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var usable = rows.Where(r => r.CurrentAnnualPf is not null && r.YearsToTarget is not null).ToArray();
        if (usable.Length == 0) throw new ArgumentException("No row has both a current annual Pf and years to target.", nameof(rows));
        using var plot = PlotStyle.NewPlot("Risk ranking", "Years until the annual Pf reaches the target (capped at the horizon)", "Current annual Pf (log scale)");
        PlotStyle.UseLogLeftAxis(plot);
        var xs = usable.Select(r => Math.Min(r.YearsToTarget!.Value, horizonYears)).ToArray();
        var ys = usable.Select(r => PlotStyle.Log10(r.CurrentAnnualPf!.Value)).ToArray();
        var m = plot.Add.Markers(xs, ys, MarkerShape.FilledCircle, 11, PlotStyle.Prior);
        m.LegendText = "component";
        var yMin = ys.Min();
        var yMax = ys.Max();
        if (targetAnnualPf is { } target && target > 0)
        {
            var y = PlotStyle.Log10(target);
            var h = plot.Add.HorizontalLine(y, 2, PlotStyle.Target, LinePattern.DenselyDashed);
            h.LegendText = "target " + Probability(target) + " per year";
            yMin = Math.Min(yMin, y);
            yMax = Math.Max(yMax, y);
        }

        var axis = ProbabilityAxis(yMin, yMax, 0.5);
        var limits = (XMin: -1.0, XMax: Math.Max(xs.Max(), 1) * 1.15 + 1, YMin: axis.Bottom, YMax: axis.Top);
        plot.Axes.SetLimits(limits.XMin, limits.XMax, limits.YMin, limits.YMax);
        // Labels of points at or near the same spot are stacked so that none hides another.
        foreach (var label in RankingLabels(usable.Select((r, i) => (r.ComponentId, xs[i], ys[i])).ToArray(), limits.XMin, limits.XMax, limits.YMin, limits.YMax))
        {
            var t = plot.Add.Text(label.Text, label.X, label.Y);
            t.LabelFontSize = RankingLabelFontSize;
            t.LabelFontColor = PlotStyle.Ink;
            t.OffsetX = label.OffsetX;
            t.OffsetY = label.OffsetY;
        }

        plot.ShowLegend(Alignment.UpperRight);
        return PlotStyle.Png(plot);
    }

    private const float RankingLabelFontSize = 12;

    /// <summary>
    /// Places the labels of the ranking plot: each beside its point, moved down or up in steps of one text line when
    /// its box would overlap a label already placed (points at the same spot get one label per line).
    /// </summary>
    /// <param name="points">Label text and point in data units (x in years, y in log10 of the probability).</param>
    /// <param name="xMin">Left axis limit.</param>
    /// <param name="xMax">Right axis limit.</param>
    /// <param name="yMin">Bottom axis limit.</param>
    /// <param name="yMax">Top axis limit.</param>
    /// <returns>One label per point with its pixel offset and its approximate box in pixels of the data area.</returns>
    internal static IReadOnlyList<RankingLabel> RankingLabels(IReadOnlyList<(string Text, double X, double Y)> points, double xMin, double xMax, double yMin, double yMax)
    {
        // Approximate data area of a 900 × 460 plot after axes, labels and title; enough to keep labels apart.
        const double areaWidth = PlotStyle.Width - 110;
        const double areaHeight = PlotStyle.Height - 110;
        const float lineHeight = RankingLabelFontSize + 5;
        const float offsetX = 8;
        const float firstOffsetY = -8;
        var placed = new List<RankingLabel>();
        var order = Enumerable.Range(0, points.Count)
            .OrderByDescending(i => points[i].Y).ThenBy(i => points[i].X).ThenBy(i => points[i].Text, StringComparer.Ordinal);
        foreach (var i in order)
        {
            var (text, x, y) = points[i];
            var px = (x - xMin) / (xMax - xMin) * areaWidth;
            var py = (yMax - y) / (yMax - yMin) * areaHeight;
            var width = 7.5 * text.Length + 4;
            RankingLabel? chosen = null;
            // Try the usual place, then one line lower, one higher, two lower, ...
            for (var k = 0; k < 4 * points.Count + 1 && chosen is null; k++)
            {
                var shift = k == 0 ? 0 : (k % 2 == 1 ? 1 : -1) * ((k + 1) / 2);
                var offsetY = firstOffsetY + shift * lineHeight;
                var candidate = new RankingLabel(text, x, y, offsetX, offsetY, px + offsetX, py + offsetY, width, lineHeight);
                if (!placed.Any(p => p.Overlaps(candidate))) chosen = candidate;
            }

            placed.Add(chosen ?? new RankingLabel(text, x, y, offsetX, firstOffsetY + placed.Count * lineHeight, px + offsetX, py + firstOffsetY + placed.Count * lineHeight, width, lineHeight));
        }

        return placed;
    }

    /// <summary>A probability as text: 3 significant digits, exponent form below 1e-3.</summary>
    public static string Probability(double p) => NumberText.Format(p);

    private static double Value(ProfileQuantity quantity, ProfilePoint p) => quantity switch
    {
        // Pf = 0 has β = ∞; every β beyond ±8.5 (Pf below about 1e-17) is drawn at the edge, so a finite 12 never
        // plots above an infinite one.
        ProfileQuantity.Beta => double.IsFinite(p.Beta) ? Math.Clamp(p.Beta, -BetaEdge, BetaEdge) : Math.Sign(p.Beta) * BetaEdge,
        ProfileQuantity.AnnualPf => PlotStyle.Log10(p.IntervalPf),
        _ => PlotStyle.Log10(p.CumulativePf),
    };

    /// <summary>
    /// The log10 limits of a probability axis for data spanning [<paramref name="yMin"/>, <paramref name="yMax"/>]
    /// (log10 values) with <paramref name="pad"/> decades around: whole decades, never below 1e-12 nor above 1.
    /// </summary>
    public static (double Bottom, double Top) ProbabilityAxis(double yMin, double yMax, double pad)
    {
        var bottom = Math.Max(Math.Floor(yMin - pad), LogAxisFloor);
        var top = Math.Min(Math.Ceiling(yMax + pad), 0);
        return top > bottom ? (bottom, top) : (Math.Max(top - 1, LogAxisFloor), top);
    }

    /// <summary>
    /// The steps where β(t) of the cumulative Pf rises (as drawn, β clamped at ±8.5), split into those with a repair
    /// in the step (Pf restarts) and the others (noise of the estimate: the cumulative Pf cannot fall).
    /// </summary>
    public static (IReadOnlyList<ProfilePoint> Noise, IReadOnlyList<ProfilePoint> AtRepair) BetaRises(IReadOnlyList<ProfilePoint> points, IReadOnlyList<double> repairs)
    {
        ArgumentNullException.ThrowIfNull(points);
        ArgumentNullException.ThrowIfNull(repairs);
        var noise = new List<ProfilePoint>();
        var repaired = new List<ProfilePoint>();
        for (var i = 1; i < points.Count; i++)
        {
            var (a, b) = (Value(ProfileQuantity.Beta, points[i - 1]), Value(ProfileQuantity.Beta, points[i]));
            if (!(b > a + 1e-9)) continue;
            var t0 = points[i - 1].TimeYears;
            var t1 = points[i].TimeYears;
            (repairs.Any(r => r > t0 - 1e-9 && r <= t1 + 1e-9) ? repaired : noise).Add(points[i]);
        }

        return (noise, repaired);
    }

    /// <summary>
    /// Marks every step where β(t) of the cumulative Pf rises (the cumulative Pf fell): at a repair it restarts, and
    /// otherwise it is noise of the estimate, which the chart must not show without a word.
    /// </summary>
    private static void MarkBetaRises(Plot plot, ProfilePoint[] points, IReadOnlyList<double> repairs, string name)
    {
        var (noise, repaired) = BetaRises(points, repairs);

        foreach (var (list, shape, text) in new[] { (noise, MarkerShape.OpenTriangleUp, BetaRiseNoise), (repaired, MarkerShape.OpenDiamond, BetaRiseRepair) })
        {
            if (list.Count == 0) continue;
            var m = plot.Add.Markers(list.Select(p => p.TimeYears).ToArray(), list.Select(p => Value(ProfileQuantity.Beta, p)).ToArray(), shape, 11, PlotStyle.Target);
            m.LegendText = name + ": " + text;
        }
    }

    private static void AddMarkers(Plot plot, IReadOnlyList<double> times, Color colour, LinePattern pattern, string name)
    {
        for (var i = 0; i < times.Count; i++)
        {
            var v = plot.Add.VerticalLine(times[i], 1.5f, colour, pattern);
            // One legend entry per kind of event.
            if (i == 0) v.LegendText = name;
            else v.ExcludeFromLegend = true;
        }
    }
}

/// <summary>A label of the ranking plot: its point in data units, its offset in pixels and its approximate box in pixels.</summary>
/// <param name="Text">Component identifier.</param>
/// <param name="X">Point x (years).</param>
/// <param name="Y">Point y (log10 of the probability).</param>
/// <param name="OffsetX">Horizontal offset of the text from the point, pixels.</param>
/// <param name="OffsetY">Vertical offset of the text from the point, pixels (down is positive).</param>
/// <param name="Left">Left of the text box in the data area, pixels.</param>
/// <param name="Top">Top of the text box in the data area, pixels.</param>
/// <param name="Width">Box width, pixels.</param>
/// <param name="Height">Box height, pixels.</param>
internal sealed record RankingLabel(string Text, double X, double Y, float OffsetX, float OffsetY, double Left, double Top, double Width, double Height)
{
    /// <summary>True when the two boxes share some area.</summary>
    public bool Overlaps(RankingLabel other) =>
        Left < other.Left + other.Width && other.Left < Left + Width && Top < other.Top + other.Height && other.Top < Top + Height;
}
