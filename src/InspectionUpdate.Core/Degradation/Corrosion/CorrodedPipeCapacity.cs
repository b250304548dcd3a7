namespace InspectionUpdate.Degradation.Corrosion;

/// <summary>Burst capacity of a pipe with one longitudinal corrosion defect, and its partial derivatives.</summary>
/// <param name="PressureMPa">Capacity (burst pressure) in MPa.</param>
/// <param name="DWallThickness">∂p/∂t (MPa/mm).</param>
/// <param name="DDiameter">∂p/∂D (MPa/mm).</param>
/// <param name="DStrength">∂p/∂(material strength) (MPa/MPa).</param>
/// <param name="DDepth">∂p/∂d (MPa/mm).</param>
/// <param name="DLength">∂p/∂L (MPa/mm).</param>
public readonly record struct CapacityWithGradient(
    double PressureMPa, double DWallThickness, double DDiameter, double DStrength, double DDepth, double DLength);

/// <summary>
/// Published burst-capacity equations for corroded pipelines. Inputs in mm and MPa.
/// </summary>
/// <remarks>
/// Both equations are valid for depths up to about 80–85 % of the wall. Past the full wall (d/t &gt; 1) the
/// capacity is continued linearly with its slope at d/t = 1, so the limit state stays continuous and monotone in
/// the depth for the reliability search; such values are outside the equations' validity and only mark failure.
/// </remarks>
public static class CorrodedPipeCapacity
{
    /// <summary>Added to SMYS for the flow stress of the modified B31G method: 10 ksi = 68.95 MPa (Kiefner &amp; Vieth 1989).</summary>
    public const double ModifiedB31GFlowStressAdderMPa = 68.95;

    /// <summary>
    /// DNV-RP-F101 single longitudinal defect capacity: p = c·(2t·f_u/(D − t))·(1 − d/t)/(1 − (d/t)/Q) with
    /// Q = √(1 + 0.31(l/√(Dt))²).
    /// </summary>
    /// <param name="diameterMm">Outside diameter D (mm), &gt; t.</param>
    /// <param name="wallThicknessMm">Wall thickness t (mm), &gt; 0.</param>
    /// <param name="tensileStrengthMPa">Tensile strength f_u (MPa), &gt; 0.</param>
    /// <param name="depthMm">Defect depth d (mm), ≥ 0.</param>
    /// <param name="lengthMm">Defect length l (mm), ≥ 0.</param>
    /// <param name="capacityFactor">Factor c in front of the equation (1 by default; some editions print 1.05).</param>
    /// <remarks>DNV-RP-F101, capacity equation of a single longitudinal defect (equation recalled from memory, confirmed by the check value in docs/references.md).</remarks>
    public static double DnvRpF101(double diameterMm, double wallThicknessMm, double tensileStrengthMPa, double depthMm,
        double lengthMm, double capacityFactor = 1.0)
    {
        ValidatePipe(diameterMm, wallThicknessMm, tensileStrengthMPa, depthMm, lengthMm, nameof(tensileStrengthMPa));
        if (!(diameterMm > wallThicknessMm))
        {
            throw new ArgumentOutOfRangeException(nameof(diameterMm), diameterMm, "The diameter must exceed the wall thickness.");
        }

        return DnvRpF101WithGradient(diameterMm, wallThicknessMm, tensileStrengthMPa, depthMm, lengthMm, capacityFactor).PressureMPa;
    }

    /// <summary>
    /// Modified B31G (Kiefner &amp; Vieth 1989; ASME B31G-2012): σ_f = (SMYS + 68.95)(1 − 0.85d/t)/(1 − 0.85(d/t)/M),
    /// p = 2tσ_f/D, M = √(1 + 0.6275z − 0.003375z²) for z = L²/(Dt) ≤ 50, else M = 0.032z + 3.3.
    /// </summary>
    /// <param name="diameterMm">Outside diameter D (mm).</param>
    /// <param name="wallThicknessMm">Wall thickness t (mm).</param>
    /// <param name="yieldStrengthMPa">Specified minimum yield strength SMYS (MPa).</param>
    /// <param name="depthMm">Defect depth d (mm).</param>
    /// <param name="lengthMm">Defect length L (mm).</param>
    /// <param name="flowStressAdderMPa">Added to SMYS for the flow stress (68.95 MPa = 10 ksi).</param>
    /// <remarks>Equations as given in Bai (2001), Pipelines and Risers, ch. 14.</remarks>
    public static double ModifiedB31G(double diameterMm, double wallThicknessMm, double yieldStrengthMPa, double depthMm,
        double lengthMm, double flowStressAdderMPa = ModifiedB31GFlowStressAdderMPa)
    {
        ValidatePipe(diameterMm, wallThicknessMm, yieldStrengthMPa, depthMm, lengthMm, nameof(yieldStrengthMPa));
        return ModifiedB31GWithGradient(diameterMm, wallThicknessMm, yieldStrengthMPa, depthMm, lengthMm, flowStressAdderMPa).PressureMPa;
    }

    /// <summary>DNV-RP-F101 capacity and its partial derivatives (no validation; for the reliability inner loop).</summary>
    public static CapacityWithGradient DnvRpF101WithGradient(double diameterMm, double wallThicknessMm, double tensileStrengthMPa,
        double depthMm, double lengthMm, double capacityFactor = 1.0)
    {
        double d = diameterMm, t = wallThicknessMm, f = tensileStrengthMPa, dep = depthMm, l = lengthMm;
        var dmt = d - t;
        var p0 = capacityFactor * 2 * t * f / dmt;
        var dP0dT = capacityFactor * 2 * f * d / (dmt * dmt);
        var dP0dD = -p0 / dmt;
        var dP0dF = capacityFactor * 2 * t / dmt;

        var q2 = 1 + 0.31 * l * l / (d * t);
        // Q = 1 exactly (no length) makes the ratio identically 1 below the wall; keep Q > 1 for the continuation.
        var q = Math.Max(Math.Sqrt(q2), 1 + 1e-12);
        var dQdL = 0.31 * l / (d * t * q);
        var dQdD = -0.31 * l * l / (2 * d * d * t * q);
        var dQdT = -0.31 * l * l / (2 * d * t * t * q);

        var delta = dep / t;
        double r, dRdDelta, dRdQ;
        if (delta <= 1)
        {
            var den = 1 - delta / q;
            r = (1 - delta) / den;
            dRdDelta = (-1 + 1 / q) / (den * den);
            dRdQ = -(1 - delta) * (delta / (q * q)) / (den * den);
        }
        else
        {
            var qm1 = q - 1;
            r = -(delta - 1) * q / qm1;
            dRdDelta = -q / qm1;
            dRdQ = (delta - 1) / (qm1 * qm1);
        }

        var dDeltaDdep = 1 / t;
        var dDeltaDt = -dep / (t * t);
        return new CapacityWithGradient(
            p0 * r,
            dP0dT * r + p0 * (dRdDelta * dDeltaDt + dRdQ * dQdT),
            dP0dD * r + p0 * dRdQ * dQdD,
            dP0dF * r,
            p0 * dRdDelta * dDeltaDdep,
            p0 * dRdQ * dQdL);
    }

    /// <summary>Modified B31G capacity and its partial derivatives (no validation; for the reliability inner loop).</summary>
    public static CapacityWithGradient ModifiedB31GWithGradient(double diameterMm, double wallThicknessMm, double yieldStrengthMPa,
        double depthMm, double lengthMm, double flowStressAdderMPa = ModifiedB31GFlowStressAdderMPa)
    {
        double d = diameterMm, t = wallThicknessMm, s = yieldStrengthMPa, dep = depthMm, l = lengthMm;
        var flow = s + flowStressAdderMPa;
        var p0 = 2 * t * flow / d;
        var dP0dT = 2 * flow / d;
        var dP0dD = -p0 / d;
        var dP0dS = 2 * t / d;

        var z = l * l / (d * t);
        double m, dMdz;
        if (z <= 50)
        {
            m = Math.Sqrt(1 + 0.6275 * z - 0.003375 * z * z);
            dMdz = (0.6275 - 0.00675 * z) / (2 * m);
        }
        else
        {
            m = 0.032 * z + 3.3;
            dMdz = 0.032;
        }

        var dzdL = 2 * l / (d * t);
        var dzdD = -z / d;
        var dzdT = -z / t;

        var delta = dep / t;
        double r, dRdDelta, dRdM;
        if (delta <= 1)
        {
            var den = 1 - 0.85 * delta / m;
            r = (1 - 0.85 * delta) / den;
            dRdDelta = 0.85 * (-1 + 1 / m) / (den * den);
            dRdM = -(1 - 0.85 * delta) * (0.85 * delta / (m * m)) / (den * den);
        }
        else
        {
            // Linear continuation from d/t = 1: r = r1 + s1·(δ − 1).
            var u = 1 - 0.85 / m;
            var du = 0.85 / (m * m);
            var r1 = 0.15 / u;
            var s1 = 0.85 * (1 / m - 1) / (u * u);
            var dr1 = -0.15 * du / (u * u);
            var ds1 = 0.85 * (-1 / (m * m) / (u * u) - 2 * (1 / m - 1) * du / (u * u * u));
            r = r1 + s1 * (delta - 1);
            dRdDelta = s1;
            dRdM = dr1 + ds1 * (delta - 1);
        }

        var dRdMz = dRdM * dMdz;
        return new CapacityWithGradient(
            p0 * r,
            dP0dT * r + p0 * (dRdDelta * (-dep / (t * t)) + dRdMz * dzdT),
            dP0dD * r + p0 * dRdMz * dzdD,
            dP0dS * r,
            p0 * dRdDelta / t,
            p0 * dRdMz * dzdL);
    }

    /// <summary>
    /// The depth ratio d/t at which <c>factor · capacity</c> falls to <paramref name="pressureMPa"/> on the intact-wall
    /// branch (d/t ≤ 1) of DNV-RP-F101, for a fixed defect length: with k = p/(factor·p₀) the equation
    /// (1 − δ)/(1 − δ/Q) = k gives δ* = (1 − k)/(1 − k/Q). NaN where there is no such root on that branch (k ≥ 1: the
    /// intact pipe already fails; k &lt; 0; degenerate inputs): the caller then searches for the root.
    /// </summary>
    public static double DnvRpF101CriticalDepthRatio(double diameterMm, double wallThicknessMm, double tensileStrengthMPa,
        double lengthMm, double capacityFactor, double factor, double pressureMPa)
    {
        double d = diameterMm, t = wallThicknessMm, l = lengthMm;
        var p0 = factor * capacityFactor * 2 * t * tensileStrengthMPa / (d - t);
        var q = Math.Max(Math.Sqrt(1 + 0.31 * l * l / (d * t)), 1 + 1e-12);
        return CriticalRatio(pressureMPa / p0, 1, q);
    }

    /// <summary>
    /// The depth ratio d/t at which <c>factor · capacity</c> falls to <paramref name="pressureMPa"/> on the intact-wall
    /// branch of modified B31G, for a fixed defect length: (1 − 0.85δ)/(1 − 0.85δ/M) = k gives
    /// δ* = (1 − k)/(0.85(1 − k/M)); NaN where that root is not on the branch δ ∈ [0, 1] (the caller searches).
    /// </summary>
    public static double ModifiedB31GCriticalDepthRatio(double diameterMm, double wallThicknessMm, double yieldStrengthMPa,
        double lengthMm, double flowStressAdderMPa, double factor, double pressureMPa)
    {
        double d = diameterMm, t = wallThicknessMm, l = lengthMm;
        var p0 = factor * 2 * t * (yieldStrengthMPa + flowStressAdderMPa) / d;
        var z = l * l / (d * t);
        var m = z <= 50 ? Math.Sqrt(1 + 0.6275 * z - 0.003375 * z * z) : 0.032 * z + 3.3;
        return CriticalRatio(pressureMPa / p0, 0.85, m);
    }

    /// <summary>Root δ ∈ [0, 1] of (1 − aδ)/(1 − aδ/Q) = k, or NaN.</summary>
    private static double CriticalRatio(double k, double a, double q)
    {
        if (!(double.IsFinite(k) && k >= 0 && k < 1 && q > 1 && double.IsFinite(q))) return double.NaN;
        var delta = (1 - k) / (a * (1 - k / q));
        return delta is >= 0 and <= 1 ? delta : double.NaN;
    }

    private static void ValidatePipe(double diameterMm, double wallThicknessMm, double strengthMPa, double depthMm, double lengthMm, string strengthName)
    {
        if (!(double.IsFinite(diameterMm) && diameterMm > 0)) throw new ArgumentOutOfRangeException(nameof(diameterMm), diameterMm, "Must be finite and > 0.");
        if (!(double.IsFinite(wallThicknessMm) && wallThicknessMm > 0)) throw new ArgumentOutOfRangeException(nameof(wallThicknessMm), wallThicknessMm, "Must be finite and > 0.");
        if (!(double.IsFinite(strengthMPa) && strengthMPa > 0)) throw new ArgumentOutOfRangeException(strengthName, strengthMPa, "Must be finite and > 0.");
        if (!(double.IsFinite(depthMm) && depthMm >= 0)) throw new ArgumentOutOfRangeException(nameof(depthMm), depthMm, "Must be finite and ≥ 0.");
        if (!(double.IsFinite(lengthMm) && lengthMm >= 0)) throw new ArgumentOutOfRangeException(nameof(lengthMm), lengthMm, "Must be finite and ≥ 0.");
    }
}
