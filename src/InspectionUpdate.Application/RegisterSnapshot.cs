using InspectionUpdate.Register;

namespace InspectionUpdate.Application;

/// <summary>
/// The register as known on one date, with what every component of a run shares read once: the register
/// fingerprint (computed on first use), the sites and the methods. Thread-safe.
/// </summary>
public sealed class RegisterSnapshot
{
    private readonly Lazy<string> _fingerprint;
    private readonly Lazy<IReadOnlyList<Site>> _sites;
    private readonly Lazy<IReadOnlyList<StoredMethod>> _methods;

    /// <summary>Creates the snapshot of <paramref name="store"/> as known at the end of <paramref name="asOf"/>.</summary>
    public RegisterSnapshot(RegisterStore store, DateOnly asOf)
    {
        ArgumentNullException.ThrowIfNull(store);
        Store = store;
        AsOf = asOf;
        Known = Registers.AsKnownOn(asOf);
        _fingerprint = new Lazy<string>(() => store.Fingerprint(Known));
        _sites = new Lazy<IReadOnlyList<Site>>(() => store.Sites(Known));
        _methods = new Lazy<IReadOnlyList<StoredMethod>>(() => store.Methods(Known));
    }

    /// <summary>The register.</summary>
    public RegisterStore Store { get; }

    /// <summary>The evidence date.</summary>
    public DateOnly AsOf { get; }

    /// <summary>The recorded instant reads are made at: the end of <see cref="AsOf"/> (UTC).</summary>
    public DateTimeOffset Known { get; }

    /// <summary>Fingerprint of the whole register as known then (hashed once).</summary>
    public string Fingerprint => _fingerprint.Value;

    /// <summary>Sites as known then.</summary>
    public IReadOnlyList<Site> Sites => _sites.Value;

    /// <summary>Methods as known then.</summary>
    public IReadOnlyList<StoredMethod> Methods => _methods.Value;
}
