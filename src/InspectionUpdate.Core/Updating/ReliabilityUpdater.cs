using InspectionUpdate.Degradation;
using InspectionUpdate.Reliability;

namespace InspectionUpdate.Updating;

/// <summary>
/// Updates a component's failure probability with its findings: P(F(t) | I, E) = P(F(t) ∩ I | E) / P(I | E)
/// (DESIGN §3), by the first-order route (FORM on each event, Gaussian conditioning on the equalities,
/// multinormal probabilities of the inequalities; Madsen 1987) or the simulation route (likelihood-weighted importance
/// sampling), chosen by <see cref="UpdatingOptions.Route"/>. With <see cref="UpdatingRoute.Auto"/> the simulation
/// route replaces a first-order result that is flagged unreliable (non-converged FORM, events whose linearizations
/// disagree with the functions at the other events' design points and whose joint re-linearization changes the result).
/// </summary>
/// <remarks>
/// Every estimate carries its route, its convergence and, when simulated, its CoV. Results support, and never
/// replace, engineering judgement. Thread-safe; the work is done in an <see cref="UpdatingSession"/>. The
/// <see cref="IReliabilityUpdater"/> methods keep the last few sessions (same model instance, equal findings), so a
/// planner that asks for many times on one set of findings pays for linearizing the findings once.
/// </remarks>
public sealed class ReliabilityUpdater : IReliabilityUpdater
{
    /// <summary>Creates an updater.</summary>
    /// <exception cref="ArgumentOutOfRangeException">An option is out of range (the message names it).</exception>
    public ReliabilityUpdater(UpdatingOptions? options = null)
    {
        options ??= UpdatingOptions.Default;
        options.Validate();
        Options = options;
    }

    private const int CachedSessions = 8;
    private readonly Lock _cacheGate = new();
    private readonly LinkedList<(IDegradationModel Model, InspectionOutcome[] Evidence, UpdatingSession Session)> _recent = new();

    /// <summary>The settings.</summary>
    public UpdatingOptions Options { get; }

    /// <summary>Builds the events of a case once, for many estimates.</summary>
    public UpdatingSession Prepare(UpdatingCase updatingCase)
    {
        ArgumentNullException.ThrowIfNull(updatingCase);
        return new UpdatingSession(updatingCase, Options);
    }

    /// <summary>Builds the events of a single component once, for many estimates (component id <see cref="UpdatingCase.SingleComponentId"/>).</summary>
    public UpdatingSession Prepare(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(evidence);
        return Prepare(UpdatingCase.Single(model, evidence));
    }

    /// <inheritdoc />
    public UpdatedEstimate Estimate(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, double timeYears) =>
        Cached(model, evidence).Estimate(UpdatingCase.SingleComponentId, timeYears);

    /// <inheritdoc />
    public ReliabilityProfile Profile(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence, IReadOnlyList<double> timesYears, string label) =>
        Cached(model, evidence).Profile(UpdatingCase.SingleComponentId, timesYears, label);

    /// <summary>Posterior summaries of a single component's inputs given its findings.</summary>
    public PosteriorSummary Posterior(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence) => Cached(model, evidence).Posterior();

    private UpdatingSession Cached(IDegradationModel model, IReadOnlyList<InspectionOutcome> evidence)
    {
        ArgumentNullException.ThrowIfNull(model);
        ArgumentNullException.ThrowIfNull(evidence);
        lock (_cacheGate)
        {
            for (var node = _recent.First; node is not null; node = node.Next)
            {
                if (ReferenceEquals(node.Value.Model, model) && node.Value.Evidence.SequenceEqual(evidence))
                {
                    _recent.Remove(node);
                    _recent.AddFirst(node);
                    return node.Value.Session;
                }
            }
        }

        var session = Prepare(model, evidence);
        lock (_cacheGate)
        {
            _recent.AddFirst((model, evidence.ToArray(), session));
            while (_recent.Count > CachedSessions) _recent.RemoveLast();
        }

        return session;
    }
}
