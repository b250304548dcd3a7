using System.Globalization;
using InspectionUpdate.Register;
using Npgsql;

namespace InspectionUpdate.Tests.Register;

/// <summary>
/// The PostgreSQL server of the tests: its URI comes from INSPECTION_UPDATE_PG_URI (set by .ci/run from
/// .ci/start-postgres.sh; a login that may create databases and roles). When the variable is missing or says
/// "unavailable: why", every PostgreSQL test skips with that reason printed; a URI that does not answer fails the tests.
/// </summary>
internal static class PostgresServer
{
    public const string Variable = "INSPECTION_UPDATE_PG_URI";

    private static string? Value => Environment.GetEnvironmentVariable(Variable);

    /// <summary>Why the PostgreSQL tests cannot run here, or null when a server was given.</summary>
    public static string? Unavailable => Value switch
    {
        null or "" => $"{Variable} is not set: no PostgreSQL server for the PostgreSQL register tests (bash .ci/run starts one with .ci/start-postgres.sh; or export {Variable}=$(.ci/start-postgres.sh | tail -n 1 | cut -d= -f2-))",
        var v when !RegisterLocation.IsPostgres(v) => $"no PostgreSQL server for the PostgreSQL register tests: {Variable}={v}",
        _ => null,
    };

    /// <summary>Skips the calling test, printing why, when no server is available.</summary>
    public static void RequireServer() => Skip.If(Unavailable is not null, Unavailable);

    /// <summary>The login of the tests.</summary>
    public static string User => RegisterStore.PostgresConnectionUser(Value!);

    /// <summary>The register URI of a database on the test server.</summary>
    public static string Uri(string database)
    {
        var u = new UriBuilder(Value!) { Path = "/" + database };
        return u.Uri.ToString().TrimEnd('/');
    }

    /// <summary>An Npgsql connection string to a database of the test server.</summary>
    public static string ConnectionString(string database) => RegisterStore.PostgresConnectionString(Uri(database));

    /// <summary>Creates an empty database with a unique name.</summary>
    public static string CreateDatabase()
    {
        RequireServer();
        var name = "iu_t_" + Guid.NewGuid().ToString("N")[..20];
        using var connection = new NpgsqlConnection(RegisterStore.PostgresConnectionString(Value!));
        connection.Open();
        using var command = new NpgsqlCommand($"CREATE DATABASE {name}", connection); // name made here, never input
        command.ExecuteNonQuery();
        return name;
    }

    /// <summary>Drops a test database and the register roles named after it.</summary>
    public static void DropDatabase(string name)
    {
        NpgsqlConnection.ClearAllPools();
        using var connection = new NpgsqlConnection(RegisterStore.PostgresConnectionString(Value!));
        connection.Open();
        using var command = new NpgsqlCommand(string.Create(CultureInfo.InvariantCulture,
            $"DROP DATABASE IF EXISTS {name} WITH (FORCE); DROP ROLE IF EXISTS {name}_reader, {name}_recorder, {name}_modeller"), connection);
        // Clean-up only: a server process of another role (an autovacuum worker, say) on the test database makes FORCE
        // fail for a user without pg_signal_backend; it is gone a moment later. A database left behind lives in the
        // throw-away test cluster and never fails a test.
        for (var attempt = 1; ; attempt++)
        {
            try
            {
                command.ExecuteNonQuery();
                return;
            }
            catch (PostgresException e) when (e.SqlState == "42501" || e.SqlState == "55006")
            {
                if (attempt == 5) return;
                Thread.Sleep(200 * attempt);
            }
        }
    }
}
