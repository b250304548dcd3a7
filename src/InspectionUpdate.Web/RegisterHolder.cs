using InspectionUpdate.Application;
using InspectionUpdate.Register;

namespace InspectionUpdate.Web;

/// <summary>
/// The one register the web view serves, opened once through <see cref="Registers.Open"/> (thread-safe; every
/// operation uses its own pooled connection). This is the only place of the web view that names the store's type.
/// </summary>
public sealed class RegisterHolder : IDisposable
{
    private readonly Lazy<IRegister> _store;

    /// <summary>Creates the holder; the register is opened on first use (a missing or foreign file is a register failure then).</summary>
    public RegisterHolder(WebViewOptions options, TimeProvider clock)
    {
        ArgumentNullException.ThrowIfNull(options);
        Options = options;
        Clock = clock;
        _store = new Lazy<IRegister>(() => Registers.Open(options.RegisterPath, RegisterOpenMode.OpenExisting, clock), LazyThreadSafetyMode.ExecutionAndPublication);
    }

    /// <summary>The options the view was started with.</summary>
    public WebViewOptions Options { get; }

    /// <summary>The clock of recorded times and of "today".</summary>
    public TimeProvider Clock { get; }

    /// <summary>The register.</summary>
    public IRegister Store => _store.Value;

    /// <summary>The run options as of today (or the fixed evidence date).</summary>
    public PortfolioOptions Run => Options.Run(DateOnly.FromDateTime(Clock.GetUtcNow().UtcDateTime));

    /// <inheritdoc />
    public void Dispose()
    {
        if (_store.IsValueCreated) _store.Value.Dispose();
    }
}

/// <summary>Who records a write made through the web view.</summary>
public interface IRecorderIdentity
{
    /// <summary>The name recorded as recorded_by.</summary>
    string Name(HttpContext context);
}

/// <summary>
/// The operating-system user running the web view: the SQLite register knows no users, and the view listens on the
/// loopback address by default, so the person at the machine is the user the process runs as. (A store that signs
/// users in, such as PostgreSQL, supplies its own user instead.)
/// </summary>
public sealed class OperatingSystemUser : IRecorderIdentity
{
    /// <inheritdoc />
    public string Name(HttpContext context) => Environment.UserName;
}
