namespace InspectionUpdate.Probability;

/// <summary>
/// Thrown when a random variable, a correlation matrix or a transformation is given an invalid parameter.
/// The message names the variable, the parameter and the offending value.
/// </summary>
public sealed class DistributionParameterException : ArgumentException
{
    /// <summary>Creates the exception for one bad parameter of one variable.</summary>
    /// <param name="variableName">Name of the random variable (or "correlation" for a matrix).</param>
    /// <param name="parameterName">Name of the parameter, e.g. "standardDeviation".</param>
    /// <param name="value">The offending value.</param>
    /// <param name="requirement">What the value must satisfy, e.g. "must be finite and > 0".</param>
    public DistributionParameterException(string variableName, string parameterName, double value, string requirement)
        : base(FormattableString.Invariant($"Variable '{variableName}': parameter '{parameterName}' = {value:R} is invalid; it {requirement}."), parameterName)
    {
        VariableName = variableName;
        Value = value;
    }

    /// <summary>Creates the exception with a free-form reason (e.g. for matrices).</summary>
    public DistributionParameterException(string variableName, string parameterName, string reason)
        : base($"Variable '{variableName}': parameter '{parameterName}' is invalid; {reason}.", parameterName)
    {
        VariableName = variableName;
        Value = double.NaN;
    }

    /// <summary>Name of the random variable concerned.</summary>
    public string VariableName { get; }

    /// <summary>The offending value, NaN when the problem is not a single number.</summary>
    public double Value { get; }

    /// <summary>Throws unless <paramref name="value"/> is finite and strictly positive.</summary>
    internal static void RequirePositive(string variable, string parameter, double value)
    {
        if (!double.IsFinite(value) || value <= 0)
        {
            throw new DistributionParameterException(variable, parameter, value, "must be finite and > 0");
        }
    }

    /// <summary>Throws unless <paramref name="value"/> is finite.</summary>
    internal static void RequireFinite(string variable, string parameter, double value)
    {
        if (!double.IsFinite(value))
        {
            throw new DistributionParameterException(variable, parameter, value, "must be finite");
        }
    }
    /// <summary>Throws unless <paramref name="value"/> is finite and ≥ 0.</summary>
    internal static void RequireNonNegative(string variable, string parameter, double value)
    {
        if (!double.IsFinite(value) || value < 0)
        {
            throw new DistributionParameterException(variable, parameter, value, "must be finite and >= 0");
        }
    }

    /// <summary>Throws unless <paramref name="value"/> is not NaN (infinities allowed, e.g. for open bounds).</summary>
    internal static void RequireNotNaN(string variable, string parameter, double value)
    {
        if (double.IsNaN(value))
        {
            throw new DistributionParameterException(variable, parameter, value, "must be a number");
        }
    }

    /// <summary>Throws unless lower &lt; upper; the error names the upper bound.</summary>
    internal static void RequireOrdered(string variable, string lowerName, double lower, string upperName, double upper)
    {
        if (!(lower < upper))
        {
            throw new DistributionParameterException(variable, upperName, upper,
                FormattableString.Invariant($"must be greater than '{lowerName}' = {lower:R}"));
        }
    }
}
