using InspectionUpdate.Degradation;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Updating;

namespace InspectionUpdate.Tests.Planning.Doubles;

/// <summary>
/// Exact updater for <see cref="LogLinearGrowthModel"/>: P(F(t) | E) = P(F(t) ∩ E)/P(E) by Gauss–Legendre
/// quadrature over the two standard normal coordinates (z₂ of the shared rate outside, z₁ of each renewal
/// segment's initial depth inside). Given X the findings are independent, so the likelihood is the product of
/// 1 − PoD(a(t_k)) (no indication) and PoD(a(t_k)) (unsized indication); a repair starts a new segment with a new
/// X₁. Without likelihood events it returns the closed form. Sized indications are not supported.
/// </summary>
internal sealed class LogLinearGaussianUpdater : IReliabilityUpdater
{
    private const double Bound = 9.0;
    private readonly double[] _outerZ;
    private readonly double[] _outerW;
    private readonly double[] _innerX;
    private readonly double[] _innerW;

    public LogLinearGaussianUpdater(int outerOrder = 64, int innerOrder = 48)
    {
        var rule = new MathNet.Numerics.Integration.GaussLegendreRule(-Bound, Bound, outerOrder);
        _outerZ = rule.Abscissas;
        _outerW = rule.Weights;
        var unit = new MathNet.Numerics.Integration.GaussLegendreRule(-1, 1, innerOrder);
        _innerX = unit.Abscissas;
        _innerW = unit.Weights;
    }

    public int Calls { get; private set; }

    public UpdatedEstimate Estimate(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double timeYears)
    {
        Calls++;
        var m = (LogLinearGrowthModel)model;
        var segments = Segments(evidence);
        var query = segments.FindLastIndex(s => s.Start <= timeYears);
        if (query < 0) query = 0;
        double pf, pe;
        if (segments.All(s => s.Events.Count == 0))
        {
            pf = m.PriorPf(timeYears - segments[query].Start);
            pe = 1;
        }
        else
        {
            var lnAc = Math.Log(m.CriticalDepthMm);
            double joint = 0, marginal = 0;
            for (var i = 0; i < _outerZ.Length; i++)
            {
                var x2 = m.MeanRate + m.SdRate * _outerZ[i];
                var w = _outerW[i] * StandardNormal.Pdf(_outerZ[i]);
                double others = 1, queryAll = 1, queryFail = 1;
                for (var s = 0; s < segments.Count; s++)
                {
                    if (s == query)
                    {
                        var cut = (lnAc - x2 * (timeYears - segments[s].Start) - m.MeanLogInitialDepth) / m.SdLogInitialDepth;
                        queryAll = Inner(m, segments[s], x2, double.NegativeInfinity);
                        queryFail = Inner(m, segments[s], x2, cut);
                    }
                    else
                    {
                        others *= Inner(m, segments[s], x2, double.NegativeInfinity);
                    }
                }

                joint += w * others * queryFail;
                marginal += w * others * queryAll;
            }

            pf = joint / marginal;
            pe = marginal;
        }

        return new UpdatedEstimate
        {
            CumulativePf = pf,
            Beta = -StandardNormal.InverseCdf(pf),
            EvidenceProbability = pe,
            Route = ComputationRoute.Exact,
            Converged = true,
            Note = "test double: exact by quadrature",
        };
    }

    public ReliabilityProfile Profile(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, IReadOnlyList<double> timesYears, string label)
    {
        var points = new List<ProfilePoint>();
        var previous = 0.0;
        foreach (var t in timesYears)
        {
            var e = Estimate(model, evidence, t);
            points.Add(new ProfilePoint
            {
                TimeYears = t,
                Beta = e.Beta,
                CumulativePf = e.CumulativePf,
                IntervalPf = e.CumulativePf - previous,
                Hazard = (e.CumulativePf - previous) / (1 - previous),
                Route = e.Route,
                Converged = e.Converged,
            });
            previous = e.CumulativePf;
        }

        return new ReliabilityProfile { Label = label, VariableNames = ["lnInitialDepth", "lnRate_perYear"], Points = points };
    }

    // ∫_{lower}^{∞} φ(z₁) Π L_k(x₁, x₂) dz₁ for one renewal segment, x₁ = m₁ + s₁z₁.
    private double Inner(LogLinearGrowthModel m, Segment segment, double x2, double lowerZ)
    {
        if (segment.Events.Count == 0) return StandardNormal.Ccdf(lowerZ);
        var lo = Math.Max(lowerZ, -Bound);
        if (lo >= Bound) return 0;
        var half = 0.5 * (Bound - lo);
        var mid = 0.5 * (Bound + lo);
        var sum = 0.0;
        for (var j = 0; j < _innerX.Length; j++)
        {
            var z1 = mid + half * _innerX[j];
            var x1 = m.MeanLogInitialDepth + m.SdLogInitialDepth * z1;
            var l = 1.0;
            foreach (var (tau, outcome) in segment.Events)
            {
                var lnA = x1 + x2 * tau;
                l *= outcome switch
                {
                    NoIndication n => 1 - Pod(n.Method.Detection, lnA),
                    IndicationNotSized i => Pod(i.Method.Detection, lnA),
                    SurvivedInService => lnA < Math.Log(m.CriticalDepthMm) ? 1 : 0,
                    _ => throw new NotSupportedException(outcome.GetType().Name),
                };
            }

            sum += _innerW[j] * StandardNormal.Pdf(z1) * l;
        }

        return half * sum;
    }

    // The probit curve is evaluated on ln a directly (same value as Evaluate(exp(ln a)), without the round trip).
    private static double Pod(InspectionUpdate.Inspection.ProbabilityOfDetection pod, double lnA) =>
        pod is ProbitLogPod p ? StandardNormal.Cdf((lnA - p.Mu) / p.Sigma) : pod.Evaluate(Math.Exp(lnA));

    private static List<Segment> Segments(IReadOnlyList<InspectionOutcome> evidence)
    {
        var list = new List<Segment> { new(0, []) };
        foreach (var e in evidence)
        {
            if (e is Repair) list.Add(new Segment(e.TimeYears, []));
            else if (e is SizedIndication) throw new NotSupportedException("The test double does not handle sized indications.");
            else list[^1].Events.Add((e.TimeYears - list[^1].Start, e));
        }

        return list;
    }

    private sealed record Segment(double Start, List<(double Tau, InspectionOutcome Outcome)> Events);
}
