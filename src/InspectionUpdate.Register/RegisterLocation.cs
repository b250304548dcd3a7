namespace InspectionUpdate.Register;

/// <summary>
/// Where a register lives, from the text a user gives (-r or INSPECTION_UPDATE_REGISTER): a <c>postgresql://</c> or
/// <c>postgres://</c> URI names a PostgreSQL register; anything else is the path of a SQLite file.
/// </summary>
public static class RegisterLocation
{
    /// <summary>Whether <paramref name="location"/> is a PostgreSQL connection URI.</summary>
    public static bool IsPostgres(string? location) =>
        location is not null && (location.StartsWith("postgresql://", StringComparison.OrdinalIgnoreCase) || location.StartsWith("postgres://", StringComparison.OrdinalIgnoreCase));

    /// <summary>Opens the register at <paramref name="location"/>: the PostgreSQL store for a URI, else the SQLite file.</summary>
    /// <exception cref="RegisterFileException">The register cannot be opened (see the two stores' Open methods).</exception>
    public static IRegister Open(string location, RegisterOpenMode mode = RegisterOpenMode.OpenOrCreate, RegisterOptions? options = null) =>
        IsPostgres(location) ? RegisterStore.OpenPostgres(location, mode, options) : RegisterStore.Open(location, mode, options);
}
