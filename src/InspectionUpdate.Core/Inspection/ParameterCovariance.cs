using System.Globalization;

namespace InspectionUpdate.Inspection;

/// <summary>An immutable, named covariance matrix of fitted parameters.</summary>
public sealed class ParameterCovariance
{
    private readonly double[,] _values;

    /// <summary>Copies a square matrix with one name per row.</summary>
    /// <exception cref="ArgumentException">The matrix is not square or the names do not match its size.</exception>
    public ParameterCovariance(IReadOnlyList<string> names, double[,] values)
    {
        ArgumentNullException.ThrowIfNull(names);
        ArgumentNullException.ThrowIfNull(values);
        if (values.GetLength(0) != values.GetLength(1) || values.GetLength(0) != names.Count)
        {
            throw new ArgumentException("A covariance matrix must be square with one name per row.", nameof(values));
        }

        Names = names.ToArray();
        _values = (double[,])values.Clone();
    }

    /// <summary>Parameter names, in row order.</summary>
    public IReadOnlyList<string> Names { get; }

    /// <summary>Number of parameters.</summary>
    public int Dimension => Names.Count;

    /// <summary>Covariance of parameters i and j.</summary>
    public double this[int i, int j] => _values[i, j];

    /// <summary>Covariance of two parameters by name.</summary>
    public double this[string a, string b] => _values[IndexOf(a), IndexOf(b)];

    /// <summary>Standard error √Var of parameter i.</summary>
    public double StandardError(int i) => Math.Sqrt(_values[i, i]);

    /// <summary>Standard error of a parameter by name.</summary>
    public double StandardError(string name) => StandardError(IndexOf(name));

    /// <summary>The quadratic form gᵀ Σ g (first-order variance of a function with gradient g).</summary>
    public double QuadraticForm(IReadOnlyList<double> gradient)
    {
        ArgumentNullException.ThrowIfNull(gradient);
        if (gradient.Count != Dimension)
        {
            throw new ArgumentException("The gradient must have one entry per parameter.", nameof(gradient));
        }

        var sum = 0.0;
        for (var i = 0; i < Dimension; i++)
        {
            for (var j = 0; j < Dimension; j++)
            {
                sum += gradient[i] * _values[i, j] * gradient[j];
            }
        }

        return sum;
    }

    /// <summary>J Σ Jᵀ: the first-order covariance of new parameters with Jacobian J (rows: new, columns: these).</summary>
    public ParameterCovariance Transform(IReadOnlyList<string> newNames, double[,] jacobian)
    {
        ArgumentNullException.ThrowIfNull(newNames);
        ArgumentNullException.ThrowIfNull(jacobian);
        var m = jacobian.GetLength(0);
        if (jacobian.GetLength(1) != Dimension || m != newNames.Count)
        {
            throw new ArgumentException("The Jacobian must have one row per new parameter and one column per parameter.", nameof(jacobian));
        }

        var result = new double[m, m];
        for (var a = 0; a < m; a++)
        {
            for (var b = 0; b < m; b++)
            {
                var sum = 0.0;
                for (var i = 0; i < Dimension; i++)
                {
                    for (var j = 0; j < Dimension; j++)
                    {
                        sum += jacobian[a, i] * _values[i, j] * jacobian[b, j];
                    }
                }

                result[a, b] = sum;
            }
        }

        return new ParameterCovariance(newNames, result);
    }

    private int IndexOf(string name)
    {
        for (var i = 0; i < Names.Count; i++)
        {
            if (Names[i] == name)
            {
                return i;
            }
        }

        throw new ArgumentException(string.Create(CultureInfo.InvariantCulture, $"No parameter named '{name}'; known: {string.Join(", ", Names)}."), nameof(name));
    }
}
