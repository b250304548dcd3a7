using System.Buffers.Binary;
using System.Globalization;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Register.Schema;

/// <summary>
/// What a file is, read before SQLite touches it: the register carries its own <c>PRAGMA application_id</c>
/// (<see cref="ApplicationId"/>), so that a foreign SQLite file or an empty file is refused untouched (same bytes, no
/// side files) instead of being converted into a register.
/// </summary>
/// <remarks>
/// The SQLite file header (sqlite.org/fileformat2.html §1.3): 16 bytes "SQLite format 3\0", the user version at
/// offset 60 and the application id at offset 68, both 4-byte big-endian integers; bytes 18 and 19 are 2 in WAL mode.
/// Registers written before the application id existed (schema 1, 2 and 3, application id 0) are recognised by their
/// tables, read through an immutable connection that neither locks nor creates side files.
/// </remarks>
internal static class RegisterIdentity
{
    /// <summary>The register's application id: the ASCII letters "IURG" (inspection-update register).</summary>
    public const int ApplicationId = 0x49555247;

    private static readonly byte[] Magic = "SQLite format 3\0"u8.ToArray();

    /// <summary>Tables every register has had since schema version 1.</summary>
    private static readonly string[] CoreTables = ["site", "component", "component_model_revision", "inspection_method", "finding", "finding_revision", "audit_log"];

    /// <summary>The header's facts of an existing file.</summary>
    public readonly record struct Header(int UserVersion, int ApplicationId);

    /// <summary>
    /// Refuses, with a sentence naming the file, anything that is not a register of this program: an empty file, a
    /// file that is not SQLite, a SQLite file of another application, or one with a negative schema version.
    /// Reads only; never opens the file for writing.
    /// </summary>
    public static Header Require(string path)
    {
        var header = new byte[100];
        int read;
        using (var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite | FileShare.Delete))
        {
            read = stream.ReadAtLeast(header, header.Length, throwOnEndOfStream: false);
        }

        if (read == 0)
            throw new RegisterFileException($"Register file '{path}' is empty: it is not a register, and it was left as it is. Create a register with 'register create'.");
        if (read < header.Length || !header.AsSpan(0, Magic.Length).SequenceEqual(Magic))
            throw new RegisterFileException($"Register file '{path}' is not a register (not a SQLite database); it was left as it is.");

        var applicationId = BinaryPrimitives.ReadInt32BigEndian(header.AsSpan(68, 4));
        if (applicationId != ApplicationId && applicationId != 0) throw Foreign(path, applicationId);

        // The header of a file in WAL mode may lag behind its -wal file (not yet checkpointed): read through SQLite.
        var (userVersion, tables) = ReadSchema(path, BinaryPrimitives.ReadInt32BigEndian(header.AsSpan(60, 4)), ref applicationId);
        if (applicationId != ApplicationId && applicationId != 0) throw Foreign(path, applicationId);
        if (userVersion < 0)
            throw new RegisterFileException(string.Create(CultureInfo.InvariantCulture,
                $"Register file '{path}' has schema version {userVersion}, which no program writes: it is damaged or not a register; it was left as it is."));
        var early = applicationId == 0 && userVersion >= 1 && userVersion <= Migrations.Current && tables is not null && CoreTables.All(tables.Contains);
        if (applicationId == 0 && !early)
            throw new RegisterFileException($"Register file '{path}' is a SQLite database but not a register (it lacks the register's application id and tables); it was left as it is.");
        return new Header(userVersion, applicationId);
    }

    private static RegisterFileException Foreign(string path, int applicationId) => new(string.Create(CultureInfo.InvariantCulture,
        $"Register file '{path}' is a SQLite database of another application (application id 0x{applicationId:X8}, a register has 0x{ApplicationId:X8}); it was left as it is."));

    /// <summary>
    /// The schema version, application id and table names as SQLite sees them. Without a -wal file the file is read
    /// immutable (no locks, no side files); with one, through a read-only connection that uses the existing -shm.
    /// On failure the header's values stand and the tables are unknown.
    /// </summary>
    private static (int UserVersion, HashSet<string>? Tables) ReadSchema(string path, int headerVersion, ref int applicationId)
    {
        try
        {
            var connectionString = File.Exists(path + "-wal")
                ? new SqliteConnectionStringBuilder { DataSource = path, Mode = SqliteOpenMode.ReadOnly, Pooling = false }.ToString()
                : ImmutableConnectionString(path);
            using var connection = new SqliteConnection(connectionString);
            connection.Open();
            using var command = connection.CreateCommand();
            command.CommandText = "PRAGMA application_id";
            applicationId = Convert.ToInt32(command.ExecuteScalar(), CultureInfo.InvariantCulture);
            command.CommandText = "PRAGMA user_version";
            var version = Convert.ToInt32(command.ExecuteScalar(), CultureInfo.InvariantCulture);
            command.CommandText = "SELECT name FROM sqlite_schema WHERE type = 'table'";
            var tables = new HashSet<string>(StringComparer.Ordinal);
            using var reader = command.ExecuteReader();
            while (reader.Read()) tables.Add(reader.GetString(0));
            return (version, tables);
        }
        catch (SqliteException)
        {
            return (headerVersion, null);
        }
    }

    /// <summary>Whether the file header says WAL mode (bytes 18 and 19 are 2).</summary>
    public static bool IsWalFile(string path)
    {
        var header = new byte[20];
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite | FileShare.Delete);
        return stream.ReadAtLeast(header, header.Length, throwOnEndOfStream: false) == header.Length && header[18] == 2 && header[19] == 2;
    }

    /// <summary>A connection string that reads <paramref name="path"/> without locking or creating -wal/-shm files.</summary>
    public static string ImmutableConnectionString(string path) => new SqliteConnectionStringBuilder
    {
        DataSource = new Uri(path).AbsoluteUri + "?immutable=1",
        Mode = SqliteOpenMode.ReadOnly,
        Pooling = false,
    }.ToString();
}
