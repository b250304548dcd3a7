using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Tests.Probability;

public class ElementaryFunctionsTests
{
    [Theory]
    [InlineData(1e-12)]
    [InlineData(-3e-9)]
    [InlineData(1e-4)]
    [InlineData(0.00995)]
    [InlineData(-0.3)]
    [Reference("Taylor series exp(x) − 1 = Σ xⁿ/n! (closed form, summed to 25 terms in the test)")]
    public void Expm1_keeps_full_relative_precision_near_zero(double x)
    {
        double sum = 0, term = 1;
        for (var n = 1; n <= 25; n++)
        {
            term *= x / n;
            sum += term;
        }

        Assert.Equal(sum, ElementaryFunctions.Expm1(x), Math.Abs(sum) * 4e-16);
    }

    [Theory]
    [InlineData(1e-12)]
    [InlineData(-3e-9)]
    [InlineData(1e-4)]
    [InlineData(0.2)]
    [Reference("Taylor series ln(1 + x) = Σ (−1)ⁿ⁺¹xⁿ/n (closed form, summed to 60 terms in the test)")]
    public void Log1p_keeps_full_relative_precision_near_zero(double x)
    {
        double sum = 0, power = 1;
        for (var n = 1; n <= 60; n++)
        {
            power *= x;
            sum += (n % 2 == 1 ? 1 : -1) * power / n;
        }

        Assert.Equal(sum, ElementaryFunctions.Log1p(x), Math.Abs(sum) * 4e-16);
    }

    [Fact]
    [Reference("exp(ln 1.01) − 1 = 0.01 (identity); MathNet 5.0.0's Expm1 gives 0.009999999999186 here, which is why this class exists")]
    public void Expm1_of_ln_1_01_is_one_hundredth()
    {
        Assert.Equal(0.01, ElementaryFunctions.Expm1(Math.Log(1.01)), 1e-17);
    }
}
