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

    /// <summary>
    /// Creates the snapshot of <paramref name="store"/> as recorded at the end of <paramref name="knownOn"/> (default:
    /// <paramref name="asOf"/>), for evidence up to <paramref name="asOf"/>.
    /// </summary>
    public RegisterSnapshot(IRegister store, DateOnly asOf, DateOnly? knownOn = null)
    {
        ArgumentNullException.ThrowIfNull(store);
        Store = store;
        AsOf = asOf;
        KnownOn = knownOn ?? asOf;
        Known = Registers.AsKnownOn(KnownOn);
        _fingerprint = new Lazy<string>(() => store.Fingerprint(Known));
        _sites = new Lazy<IReadOnlyList<Site>>(() => store.Sites(Known));
        _methods = new Lazy<IReadOnlyList<StoredMethod>>(() => store.Methods(Known));
    }

    /// <summary>The register.</summary>
    public IRegister Store { get; }

    /// <summary>The evidence date.</summary>
    public DateOnly AsOf { get; }

    /// <summary>The date the register is read as recorded on (defaults to <see cref="AsOf"/>).</summary>
    public DateOnly KnownOn { get; }

    /// <summary>The recorded instant reads are made at: the end of <see cref="KnownOn"/> (UTC).</summary>
    public DateTimeOffset Known { get; }

    /// <summary>Fingerprint of the whole register as known then (hashed once).</summary>
    public string Fingerprint => _fingerprint.Value;

    /// <summary>Sites as known then.</summary>
    public IReadOnlyList<Site> Sites => _sites.Value;

    /// <summary>Methods as known then.</summary>
    public IReadOnlyList<StoredMethod> Methods => _methods.Value;
}
