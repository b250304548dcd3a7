using InspectionUpdate.Inspection;
using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Register;

/// <summary>A clock the test moves by hand, so recorded times and as-of reads are exact.</summary>
internal sealed class ManualClock(DateTimeOffset start) : TimeProvider
{
    public DateTimeOffset UtcNow { get; set; } = start;

    public override DateTimeOffset GetUtcNow() => UtcNow;

    public void Advance(TimeSpan by) => UtcNow += by;
}

/// <summary>A register in a temporary file with an invented site, one component and two methods; deleted on dispose.</summary>
internal sealed class TestRegister : IDisposable
{
    public const string Component = "P-101-W3";
    public const string Ut = "UT-PA";
    public const string Mpi = "MPI-WET";
    public static readonly DateOnly InstallDate = new(2010, 6, 1);
    public const double WallMm = 12.7;
    // A small valid corrosion model (docs/models.md): the register refuses what an assessment would refuse.
    public const string ModelJson = """
        {"schemaVersion":1,"name":"line 101 weld corrosion (invented)","serviceLife_years":30,
         "mechanism":{"type":"corrosion","growthLaw":"linear","failureMode":"burstDnvRpF101","lengthGrows":false,"capacityFactor":1.0},
         "inputs":{"wallThickness_mm":12.7,"diameter_mm":273.1,"initiationTime_years":0,
           "rate_mmPerYear":{"family":"Lognormal","mean":0.1,"cov":0.5},"defectLength_mm":{"family":"Lognormal","mean":50,"cov":0.4},
           "tensileStrength_MPa":{"family":"Lognormal","mean":530,"cov":0.04},"modelFactor":{"family":"Lognormal","mean":1.0,"cov":0.1},
           "pressure_MPa":{"family":"Normal","mean":10,"sd":0.5}}}
        """;

    public TestRegister(bool seed = true)
        : this(RegisterStoreKind.Sqlite, seed)
    {
    }

    /// <summary>
    /// A register of the given kind: a temporary SQLite file, or a new PostgreSQL database on the test server
    /// (<see cref="PostgresServer"/>; the test skips, saying why, when no server is available).
    /// </summary>
    public TestRegister(RegisterStoreKind kind, bool seed = true)
    {
        Kind = kind;
        Path = TempPath();
        Clock = new ManualClock(new DateTimeOffset(2026, 3, 1, 8, 0, 0, TimeSpan.Zero));
        if (kind == RegisterStoreKind.PostgreSql)
        {
            Database = PostgresServer.CreateDatabase();
            Location = PostgresServer.Uri(Database);
        }
        else
        {
            Location = Path;
        }

        Store = kind == RegisterStoreKind.PostgreSql
            ? RegisterStore.OpenPostgres(Location, RegisterOpenMode.CreateNew, new RegisterOptions(Clock))
            : RegisterStore.Open(Path, RegisterOpenMode.CreateNew, new RegisterOptions(Clock));
        if (seed)
        {
            Seed(Store);
        }
    }

    public RegisterStoreKind Kind { get; }

    /// <summary>A temporary file path: the register on SQLite; side files (CSV) on both.</summary>
    public string Path { get; }

    public ManualClock Clock { get; }

    public RegisterStore Store { get; }

    public long ComponentId => Store.FindComponent(Component)!.Id;

    /// <summary>The register's location: the SQLite file, or the PostgreSQL URI.</summary>
    public string Location { get; }

    /// <summary>The PostgreSQL database (null for SQLite).</summary>
    public string? Database { get; }

    /// <summary>Who a row's recorded_by names: the actor on SQLite, the database user on PostgreSQL.</summary>
    public string By(string actor) => Kind == RegisterStoreKind.PostgreSql ? PostgresServer.User : actor;

    /// <summary>Runs SQL through a separate raw connection (the test's independent view of the database).</summary>
    public void Exec(string sql)
    {
        using var connection = RawConnection();
        using var command = connection.CreateCommand();
        command.CommandText = sql;
        command.ExecuteNonQuery();
    }

    private System.Data.Common.DbConnection RawConnection()
    {
        System.Data.Common.DbConnection connection = Kind == RegisterStoreKind.PostgreSql
            ? new Npgsql.NpgsqlConnection(PostgresServer.ConnectionString(Database!))
            : new SqliteConnection($"Data Source={Path};Pooling=False;Foreign Keys=True");
        connection.Open();
        return connection;
    }

    public static string TempPath() => System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"iu-register-test-{Guid.NewGuid():N}.sqlite");

    public static void Seed(RegisterStore store)
    {
        store.AddSite(new NewSite("NORTH", "North tank farm (invented)"), "tester").Require();
        store.AddComponent(new NewComponent("NORTH", Component, "Weld 3 of line 101", InstallDate, WallMm, ModelJson, "corrosion-1", "line-101-water"), "tester").Require();
        store.AddComponent(new NewComponent("NORTH", "P-101-W4", "Weld 4 of line 101", InstallDate, WallMm, ModelJson, "corrosion-1", "line-101-water"), "tester").Require();
        store.AddMethod(new NewMethod(Ut, "Phased-array UT (invented qualification)",
            new PodSpec(PodForms.LogLogistic, Math.Log(1.16), 1 / 0.9, null, LowerLimitMm: 0.2), new SizingError(SizingErrorKind.AdditiveNormal, 0.1, 0.5)), "tester").Require();
        store.AddMethod(new NewMethod(Mpi, "Wet magnetic particle (invented)",
            new PodSpec(PodForms.Exponential, null, null, 0.95, MaxPod: 0.95), new SizingError(SizingErrorKind.MultiplicativeLognormal, 0.0, 0.2)), "tester").Require();
    }

    /// <summary>Counts rows of a table through a separate raw connection (the test's independent view of the file).</summary>
    public long Count(string table)
    {
        using var connection = RawConnection();
        using var command = connection.CreateCommand();
        command.CommandText = "SELECT COUNT(*) FROM " + table; // table names are test constants
        return Convert.ToInt64(command.ExecuteScalar(), System.Globalization.CultureInfo.InvariantCulture);
    }

    public static void Delete(string path)
    {
        SqliteConnection.ClearAllPools();
        foreach (var suffix in new[] { "", "-wal", "-shm", "-journal", ".go", ".csv" })
        {
            File.Delete(path + suffix);
        }
    }

    public void Dispose()
    {
        Store.Dispose();
        Delete(Path);
        if (Database is not null) PostgresServer.DropDatabase(Database);
    }
}
