using InspectionUpdate.Degradation.Corrosion;
using InspectionUpdate.Degradation.Expressions;
using InspectionUpdate.TimeVariant;
using static InspectionUpdate.Tests.Degradation.TestInputs;

namespace InspectionUpdate.Tests.Degradation;

public class ExpressionModelTests
{
    private static readonly InspectionUpdate.Probability.StochasticModel LeakInputs = Model(
        N("wallThickness_mm", 12, 0.3), Ln("initiationTime_years", 4, 0.5), Ln("rate_mmPerYear", 0.2, 0.4));

    private const string LeakExpression = "0.8*wallThickness_mm - rate_mmPerYear*max(0, t - initiationTime_years)";

    [Fact]
    [Reference("Same limit state as the built-in linear-rate leak model, g = 0.8·t_w − r·max(0, t − T0)")]
    public void Expression_equals_the_built_in_leak_model_pointwise_and_in_the_profile()
    {
        var builtIn = new CorrosionModel(LeakInputs);
        var expr = new ExpressionModel(LeakInputs, LeakExpression, "min(rate_mmPerYear*max(0, t - initiationTime_years), wallThickness_mm)");
        var rng = new Random(7);
        for (var k = 0; k < 50; k++)
        {
            double[] x = [12 + rng.NextDouble(), 1 + 6 * rng.NextDouble(), 0.05 + 0.5 * rng.NextDouble()];
            var t = 30 * rng.NextDouble();
            Assert.Equal(builtIn.Margin(x, t), expr.Margin(x, t), 1e-12);
            Assert.Equal(builtIn.Size(x, t), expr.Size(x, t), 1e-12);
        }

        var grid = TimeGrid.Yearly(30);
        var a = TimeVariantReliability.Profile(builtIn, grid);
        var b = TimeVariantReliability.Profile(expr, grid);
        for (var i = 0; i < grid.TimesYears.Count; i++)
        {
            Assert.Equal(a.Points[i].Beta, b.Points[i].Beta, 1e-5);
        }
    }

    [Fact]
    public void Integer_literals_are_doubles_so_one_half_is_not_zero()
    {
        var f = ExpressionCompiler.Compile("1/2 * a + t", ["a"]);
        Assert.Equal(1.5, f([2.0], 0.5), 1e-15);
    }

    [Fact]
    public void Functions_and_constants_are_available()
    {
        var f = ExpressionCompiler.Compile("exp(ln(a)) + sqrt(pow(b, 2)) + abs(-1) + pi - phi(0)", ["a", "b"]);
        Assert.Equal(2 + 3 + 1 + Math.PI - 0.5, f([2.0, 3.0], 0), 1e-12);
    }

    [Fact]
    public void Unknown_name_gives_its_position_and_token()
    {
        var e = Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("a + rate * t", ["a"], "limitState"));
        Assert.Equal(4, e.Position);
        Assert.Equal("rate", e.Token);
        Assert.Contains("unknown name 'rate'", e.Message);
        Assert.Contains("position 4", e.Message);
        Assert.Equal("limitState", e.ParamName);
    }

    [Fact]
    public void Syntax_error_gives_its_position_and_token()
    {
        var e = Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("a * (t + 2", ["a"]));
        Assert.True(e.Position >= 0 && e.Position <= 10, $"position {e.Position}");
        Assert.Contains("Expression 'expression'", e.Message);
        var e2 = Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("a ** 2", ["a"]));
        Assert.Equal("*", e2.Token);
        Assert.Equal(3, e2.Position);
    }

    [Fact]
    public void Conditions_assignments_and_empty_text_are_refused()
    {
        Assert.Contains("condition", Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("a > t", ["a"])).Message);
        Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("a = 2", ["a"]));
        Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("  ", ["a"]));
        Assert.Throws<ExpressionParseException>(() => ExpressionCompiler.Compile("System.IO.File.Exists(\"x\") ? 1 : 0", ["a"]));
    }

    [Fact]
    public void Reserved_and_malformed_input_names_are_refused()
    {
        Assert.Contains("reserved", Assert.Throws<ArgumentException>(() => ExpressionCompiler.Compile("t", ["t"])).Message);
        Assert.Contains("cannot be used", Assert.Throws<ArgumentException>(() => ExpressionCompiler.Compile("1", ["rate-mm"])).Message);
    }

    [Fact]
    public void Model_without_a_size_expression_says_so()
    {
        var m = new ExpressionModel(LeakInputs, LeakExpression);
        Assert.Throws<InvalidOperationException>(() => m.Size([12, 4, 0.2], 10));
        Assert.Throws<ArgumentException>(() => new ExpressionModel(LeakInputs, LeakExpression, settings: new ExpressionModelSettings { RenewedOnRepair = ["nope"] }));
    }
}
