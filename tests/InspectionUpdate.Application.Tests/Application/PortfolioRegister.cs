using InspectionUpdate.Application;
using InspectionUpdate.Register;
using Microsoft.Data.Sqlite;

namespace InspectionUpdate.Tests.Application;

/// <summary>A temporary register of a few invented components, recorded on 2025-01-01; deleted on dispose.</summary>
internal sealed class PortfolioRegister : IDisposable
{
    public static readonly DateOnly Recorded = new(2025, 1, 1);
    public static readonly DateOnly AsOf = new(2025, 6, 30);

    public PortfolioRegister(int components, int seed = 7)
    {
        Path = TempPath("register");
        Store = RegisterStore.Open(Path, RegisterOpenMode.CreateNew, new RegisterOptions(new FixedClock(Recorded)));
        InventedPortfolio.Create(Store, components, seed, new DateOnly(2024, 6, 30));
    }

    private PortfolioRegister(string path)
    {
        Path = path;
        Store = RegisterStore.Open(Path, RegisterOpenMode.OpenExisting, new RegisterOptions(new FixedClock(Recorded)));
    }

    public string Path { get; }

    public RegisterStore Store { get; }

    /// <summary>First-order route: the numbers are carried, not checked, in these tests.</summary>
    public static PortfolioOptions Options => new(AsOf, InspectionUpdate.Planning.AnnualTarget.FromAnnualPf(1e-4, InspectionUpdate.Planning.AnnualMeasure.IntervalPf), InspectionUpdate.Updating.UpdatingRoute.FirstOrder)
    {
        Parallelism = 2,
    };

    public static string TempPath(string what) => System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"iu-portfolio-{what}-{Guid.NewGuid():N}.sqlite");

    /// <summary>A byte copy of this register (checkpointed first), opened as another register.</summary>
    public PortfolioRegister Copy()
    {
        SqliteConnection.ClearAllPools();
        using (var c = new SqliteConnection($"Data Source={Path};Pooling=False"))
        {
            c.Open();
            using var command = c.CreateCommand();
            command.CommandText = "PRAGMA wal_checkpoint(TRUNCATE)";
            command.ExecuteNonQuery();
        }

        var copy = TempPath("copy");
        File.Copy(Path, copy);
        return new PortfolioRegister(copy);
    }

    public static void Delete(string path)
    {
        SqliteConnection.ClearAllPools();
        foreach (var suffix in new[] { "", "-wal", "-shm", "-journal" })
        {
            File.Delete(path + suffix);
        }
    }

    public void Dispose()
    {
        Store.Dispose();
        Delete(Path);
    }
}
