namespace InspectionUpdate.Tests.Updating.Sampling;

/// <summary>
/// Collects the comparisons of one sampled profile with an exact reference and judges them as a family. Each number
/// is held to the "within 2 % or three standard errors"; because a profile has some 50–100 such numbers from
/// one sample set, an honest standard error still puts one or two of them past 3σ in about one set in eight (seed
/// sweep of the corrosion quadrature cases, 30 seeds each: root-mean-square z 0.85–1.05, 13 % of the sets with some
/// |z| above 3). So the family fails when any number lies beyond 4.5 standard errors and 2 % (about 1e-3 per profile
/// for an honest error), when more than 5 % of the numbers lie beyond 3 standard errors and 2 %, or when the
/// root-mean-square z exceeds 1.5 (a standard error understated by half).
/// </summary>
internal sealed class ProfileAgreement
{
    private readonly List<string> _failures = [];
    private readonly List<(double Z, bool Outside3, string Line)> _checks = [];

    /// <summary>A failure that is not a comparison (a number not converged, a bound below the reference, ...).</summary>
    public void Fail(string message) => _failures.Add(message);

    /// <summary>One sampled value against its exact reference, with its sampled standard error.</summary>
    public void Compare(string what, double value, double exact, double standardError)
    {
        var error = Math.Abs(value - exact);
        var z = standardError > 0 ? error / standardError : error > 0 ? double.PositiveInfinity : 0;
        var withinShare = error <= 0.02 * exact;
        var line = $"{what}: {value:E4} against {exact:E4} (se {standardError:E2}, z {z:F2})";
        _checks.Add((withinShare ? 0 : z, !withinShare && z > 3, line));
        if (!withinShare && z > 4.5) _failures.Add(line + ": beyond 4.5 standard errors");
    }

    /// <summary>Fails the test with every problem found.</summary>
    public void AssertAgrees()
    {
        var beyond3 = _checks.Where(c => c.Outside3).ToList();
        if (beyond3.Count > Math.Max(1, 0.05 * _checks.Count))
        {
            _failures.Add($"{beyond3.Count} of {_checks.Count} numbers beyond three standard errors and 2 %: " + string.Join("; ", beyond3.Select(c => c.Line)));
        }

        var finite = _checks.Where(c => double.IsFinite(c.Z)).Select(c => c.Z * c.Z).ToList();
        var rms = finite.Count == 0 ? 0 : Math.Sqrt(finite.Average());
        if (rms > 1.5) _failures.Add($"root-mean-square z {rms:F2} over {finite.Count} numbers: the standard errors understate the error");
        Assert.True(_checks.Count > 0, "nothing was compared");
        Assert.True(_failures.Count == 0, string.Join(Environment.NewLine, _failures));
    }
}
