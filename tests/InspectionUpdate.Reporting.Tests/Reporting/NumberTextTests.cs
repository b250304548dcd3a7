using InspectionUpdate.Reporting;

namespace InspectionUpdate.Tests.Reporting;

public sealed class NumberTextTests
{
    // The rule of docs/reports.md: three significant figures, scientific below 1e-3 and from 1e4; the expected strings
    // are the values rounded by hand to three significant figures.
    [Theory]
    [Reference("docs/reports.md, number format (three significant figures, scientific below 1e-3); rounding by hand")]
    [InlineData(2.4534e-7, "2.45e-7")]
    [InlineData(1e-4, "1.00e-4")]
    [InlineData(8.832e-4, "8.83e-4")]
    [InlineData(0.0023, "0.00230")]
    [InlineData(0.0436987, "0.0437")]
    [InlineData(6.187, "6.19")]
    [InlineData(9.996, "10.0")]
    [InlineData(23.83, "23.8")]
    [InlineData(-3.04, "-3.04")]
    [InlineData(999.6, "1000")]
    [InlineData(32000, "3.20e4")]
    [InlineData(0, "0")]
    public void Formats_with_three_significant_figures_and_scientific_below_one_thousandth(double value, string expected) =>
        Assert.Equal(expected, NumberText.Format(value));

    [Fact]
    public void A_sampled_zero_shows_its_bound_and_an_exact_zero_says_it_is_exact()
    {
        Assert.Equal("< 2.34e-9", NumberText.Probability(0, 2.341e-9, simulated: true));
        Assert.Equal(NumberText.ExactZero, NumberText.Probability(0, null, simulated: false));
        Assert.DoesNotContain("converged", NumberText.Probability(0, null, simulated: true), StringComparison.Ordinal);
        Assert.Equal("3.46e-15", NumberText.Probability(3.46e-15, 2.341e-9, simulated: true));
    }

    [Fact]
    public void Numbers_in_other_formats_are_rewritten_and_each_number_and_date_sits_in_one_span()
    {
        Assert.Equal("the annual ΔPf is 8.22e-4, 8.22 times the target 1.00e-4.", NumberText.Normalize("the annual ΔPf is 8.218E-004, 8.22 times the target 1.0E-004."));
        var html = NumberText.Html("Pf < 2.341E-09 on 2025-06-30 for HR1-J118");
        Assert.Contains("<span class=\"num\">&lt; 2.34e-9</span>", html, StringComparison.Ordinal);
        Assert.Contains("<span class=\"num\">2025-06-30</span>", html, StringComparison.Ordinal);
        Assert.Contains("HR1-J118", html, StringComparison.Ordinal);
    }
}
