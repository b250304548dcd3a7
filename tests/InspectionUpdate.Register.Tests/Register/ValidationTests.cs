using InspectionUpdate.Inspection;
using InspectionUpdate.Register;

namespace InspectionUpdate.Tests.Register;

public abstract class ValidationTests
{
    protected abstract RegisterStoreKind Kind { get; }
    private static readonly DateOnly Date = new(2020, 5, 4);

    public static TheoryData<string, NewFinding, string, string?> InvalidFindings() => new()
    {
        { "unknown component", new NewFinding("P-999", Date, FindingKind.NoIndication, TestRegister.Ut), "component_code", "P-999" },
        { "date before install", new NewFinding(TestRegister.Component, new DateOnly(2009, 12, 31), FindingKind.NoIndication, TestRegister.Ut), "inspection_date", "2009-12-31" },
        { "date in the future", new NewFinding(TestRegister.Component, new DateOnly(2027, 1, 1), FindingKind.NoIndication, TestRegister.Ut), "inspection_date", "2027-01-01" },
        { "negative size", new NewFinding(TestRegister.Component, Date, FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: -0.5), "measured_size_mm", "-0.5" },
        { "size beyond the wall", new NewFinding(TestRegister.Component, Date, FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: 13.1), "measured_size_mm", "13.1" },
        { "wall reading beyond the wall", new NewFinding(TestRegister.Component, Date, FindingKind.WallThickness, TestRegister.Ut, RemainingWallMm: 14.0), "remaining_wall_mm", "14" },
        { "unknown method", new NewFinding(TestRegister.Component, Date, FindingKind.NoIndication, "EDDY-X"), "method", "EDDY-X" },
        { "missing method", new NewFinding(TestRegister.Component, Date, FindingKind.IndicationNotSized, null), "method", null },
        { "method on an in-service record", new NewFinding(TestRegister.Component, Date, FindingKind.InService, TestRegister.Ut), "method", TestRegister.Ut },
        { "missing size", new NewFinding(TestRegister.Component, Date, FindingKind.SizedIndication, TestRegister.Ut), "measured_size_mm", null },
        { "size on a no-indication", new NewFinding(TestRegister.Component, Date, FindingKind.NoIndication, TestRegister.Ut, MeasuredSizeMm: 1.0), "measured_size_mm", "1" },
        { "not-a-number size", new NewFinding(TestRegister.Component, Date, FindingKind.SizedIndication, TestRegister.Ut, MeasuredSizeMm: double.NaN), "measured_size_mm", "NaN" },
        { "duplicate", new NewFinding(TestRegister.Component, new DateOnly(2019, 4, 1), FindingKind.NoIndication, TestRegister.Ut, Location: " Weld toe "), "inspection_date", "2019-04-01" },
    };

    [SkippableTheory]
    [MemberData(nameof(InvalidFindings))]
    [Reference("Issue 5 register rules: every invalid finding is refused with a clear message naming the field and value, nothing written")]
    public void An_invalid_finding_is_refused_naming_the_field_and_value_and_nothing_is_written(string because, NewFinding finding, string field, string? value)
    {
        using var r = new TestRegister(Kind);
        // The existing finding the duplicate case collides with (location compared trimmed, case-insensitive).
        r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2019, 4, 1), FindingKind.NoIndication, TestRegister.Ut, Location: "weld toe"), "inspector A", "report IR-0").Require();
        var findings = r.Count("finding");
        var revisions = r.Count("finding_revision");
        var audit = r.Count("audit_log");

        var result = r.Store.AddFinding(finding, "inspector A", "report IR-1");

        Assert.False(result.Succeeded, because);
        var problem = Assert.Single(result.Problems, p => p.Field == field);
        Assert.Equal(value, problem.Value);
        Assert.Contains(field, problem.ToString(), StringComparison.Ordinal);
        Assert.Equal(findings, r.Count("finding"));
        Assert.Equal(revisions, r.Count("finding_revision"));
        Assert.Equal(audit, r.Count("audit_log"));
        Assert.Equal(result.Problems, r.Store.ValidateFinding(finding));
        var e = Assert.Throws<RegisterValidationException>(() => result.Require());
        Assert.Contains(field, e.Message, StringComparison.Ordinal);
    }

    [SkippableFact]
    [Reference("STYLE.md: a validation result lists every problem with its field, not only the first")]
    public void Every_problem_of_a_finding_is_listed_at_once()
    {
        using var r = new TestRegister(Kind);
        var result = r.Store.AddFinding(new NewFinding(TestRegister.Component, new DateOnly(2009, 1, 1), FindingKind.SizedIndication, "EDDY-X", MeasuredSizeMm: -1), " ", "");
        Assert.Equal(["inspection_date", "measured_size_mm", "method", "reason", "recorded_by"], result.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));
    }

    [SkippableFact]
    [Reference("Validation of a wall reading: it needs the component's nominal wall to become a depth")]
    public void A_wall_reading_on_a_component_without_a_nominal_wall_is_refused()
    {
        using var r = new TestRegister(Kind);
        r.Store.AddComponent(new NewComponent("NORTH", "SUPPORT-7", "Pipe support", TestRegister.InstallDate, null, TestRegister.ModelJson, "none"), "tester").Require();
        var result = r.Store.AddFinding(new NewFinding("SUPPORT-7", Date, FindingKind.WallThickness, TestRegister.Ut, RemainingWallMm: 8.0), "A", "r");
        Assert.Contains(result.Problems, p => p.Field == "remaining_wall_mm" && p.Message.Contains("no nominal wall", StringComparison.Ordinal));
    }

    [SkippableFact]
    [Reference("Validation of a revision: the corrected content is checked like a new finding, except against itself")]
    public void A_revision_is_validated_but_does_not_collide_with_the_finding_it_corrects()
    {
        using var r = new TestRegister(Kind);
        var f = r.Store.AddFinding(new NewFinding(TestRegister.Component, Date, FindingKind.SizedIndication, TestRegister.Ut, 2.0), "A", "r").Require();
        Assert.True(r.Store.ReviseFinding(f.FindingId, new NewFinding(TestRegister.Component, Date, FindingKind.SizedIndication, TestRegister.Ut, 2.2), "B", "fix").Succeeded);
        var bad = r.Store.ReviseFinding(f.FindingId, new NewFinding("P-101-W4", Date, FindingKind.SizedIndication, TestRegister.Ut, 20.0), "B", "fix");
        Assert.Equal(["component_code", "measured_size_mm"], bad.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));
        Assert.Equal(2, r.Count("finding_revision"));
    }

    [SkippableFact]
    [Reference("Validation of components, methods and repairs at the public boundary (STYLE.md)")]
    public void Invalid_components_methods_and_repairs_are_refused_with_every_problem()
    {
        using var r = new TestRegister(Kind);
        var component = r.Store.AddComponent(new NewComponent("SOUTH", TestRegister.Component, "", new DateOnly(2030, 1, 1), -3, "{not json", " "), "tester");
        Assert.Equal(["code", "install_date", "model $", "model_version", "site_code", "wall_thickness_mm"], component.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));

        var method = r.Store.AddMethod(new NewMethod(TestRegister.Ut, "", new PodSpec(PodForms.CumulativeLognormal, 0.0, -1.0, null),
            new SizingError(SizingErrorKind.AdditiveNormal, 0, 0)), "tester");
        Assert.Equal(["name", "pod_sigma_ln", "sizing_sd_mm"], method.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));

        var repair = r.Store.AddRepair(new NewRepair(TestRegister.Component, new DateOnly(2021, 1, 1), "sleeve",
            """{"inputs":{"d0_mm":{"family":"normal","mean":0,"sd":-1},"rate":{"family":"frechet","mean":1}}}"""), "A", "wo 9");
        Assert.Equal(["post_repair_prior_json.inputs.d0_mm.standardDeviation", "post_repair_prior_json.inputs.rate.family"], repair.Problems.Select(p => p.Field).Order(StringComparer.Ordinal));
        Assert.Equal(0, r.Count("repair"));
        Assert.Equal(2, r.Count("inspection_method"));
        Assert.Equal(2, r.Count("component"));
    }
}

/// <summary><see cref="ValidationTests"/> on a SQLite file.</summary>
public sealed class ValidationTestsOnSqlite : ValidationTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.Sqlite;
}

/// <summary><see cref="ValidationTests"/> on PostgreSQL (skips, saying why, without a server).</summary>
public sealed class ValidationTestsOnPostgres : ValidationTests
{
    protected override RegisterStoreKind Kind => RegisterStoreKind.PostgreSql;
}
