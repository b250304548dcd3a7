using InspectionUpdate.Probability.Numerics;

namespace InspectionUpdate.Tests.Probability;

public class GaussHermiteRuleTests
{
    [Theory]
    [InlineData(48)]
    [InlineData(128)]
    [Reference("Standard normal moments E[Z^(2m)] = (2m − 1)!! (closed form); an n-point Gauss rule is exact to degree 2n − 1")]
    public void Rule_reproduces_the_even_moments_of_the_standard_normal(int n)
    {
        var rule = new GaussHermiteRule(n);
        double sum0 = 0, odd = 0;
        for (var i = 0; i < rule.Count; i++)
        {
            sum0 += rule.Weights[i];
            odd += rule.Weights[i] * Math.Pow(rule.Nodes[i], 3);
        }

        Assert.Equal(1, sum0, 1e-14);
        Assert.Equal(0, odd, 1e-12);
        var doubleFactorial = 1.0;
        for (var m = 1; m <= 10; m++)
        {
            doubleFactorial *= 2 * m - 1;
            var moment = 0.0;
            for (var i = 0; i < rule.Count; i++) moment += rule.Weights[i] * Math.Pow(rule.Nodes[i], 2 * m);
            Assert.Equal(doubleFactorial, moment, doubleFactorial * 1e-11);
        }
    }

    [Fact]
    [Reference("E[exp(tZ)] = exp(t²/2) for the standard normal (moment generating function, closed form)")]
    public void Rule_integrates_an_exponential_to_near_rounding()
    {
        var rule = GaussHermiteRule.Nodes48;
        var s = 0.0;
        for (var i = 0; i < rule.Count; i++) s += rule.Weights[i] * Math.Exp(0.8 * rule.Nodes[i]);
        Assert.Equal(Math.Exp(0.32), s, 1e-13);
    }
}
