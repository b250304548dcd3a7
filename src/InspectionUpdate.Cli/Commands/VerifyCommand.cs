using System.ComponentModel;
using System.Globalization;
using InspectionUpdate.Cli.Infrastructure;
using InspectionUpdate.Cli.Verification;
using InspectionUpdate.Probability;
using InspectionUpdate.Reliability;
using InspectionUpdate.Reliability.Verification;
using InspectionUpdate.Updating.Verification;
using Spectre.Console;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Settings of <c>verify</c>.</summary>
public sealed class VerifySettings : CommonSettings
{
    /// <summary>Write the table as Markdown.</summary>
    [CommandOption("--write-doc <FILE>")]
    [Description("Also write the table as Markdown to FILE (the project keeps it in docs/verification.md).")]
    public string? WriteDoc { get; init; }

    /// <summary>Which benchmark problems to run: all, quick or none.</summary>
    [CommandOption("--benchmarks <SET>")]
    [Description("Benchmark-collection problems to run with every route: all (default, about half a minute), quick (six problems, a few seconds) or none.")]
    [DefaultValue("all")]
    public string Benchmarks { get; init; } = "all";

    /// <summary>The parsed <see cref="Benchmarks"/>.</summary>
    public BenchmarkSet BenchmarkSet => Benchmarks.ToLowerInvariant() switch
    {
        "all" => BenchmarkSet.All,
        "quick" => BenchmarkSet.Quick,
        _ => BenchmarkSet.None,
    };

    /// <inheritdoc />
    public override ValidationResult Validate()
    {
        var baseResult = base.Validate();
        if (!baseResult.Successful) return baseResult;
        return Benchmarks.ToLowerInvariant() is "all" or "quick" or "none"
            ? ValidationResult.Success()
            : ValidationResult.Error($"--benchmarks '{Benchmarks}' must be all, quick or none.");
    }
}

/// <summary>
/// Runs published checks through the engine's side-by-side comparison (FORM, SORM, importance sampling, subset
/// simulation), then the updating and planning checks of <see cref="UpdatingVerificationCases"/>, and compares each
/// method with its expected value. The cases are data (a limit state, its inputs and
/// the published or closed-form value); every obtained number comes from the engine. Then the benchmark-collection
/// problems of <see cref="BenchmarkProblems"/> with every route (<see cref="BenchmarkRunner"/>): the command fails when
/// a case is outside its tolerance or a benchmark result is wrong and converged (flagged results do not fail it).
/// </summary>
public sealed class VerifyCommand(CliHost host) : CliCommand<VerifySettings>(host)
{
    private sealed record Case(string Name, string Source, ReliabilityProblem Problem, double FormBeta, string FormSource, double? ExactPf, string ExactSource,
        double? BreitungPf = null, PublishedSorm? Sorm = null);

    /// <summary>Published SORM probabilities of a case, by formula, with the relative tolerance their printed precision allows.</summary>
    private sealed record PublishedSorm(string Source, double Breitung, double HohenbichlerRackwitz, double Tvedt, double Tolerance);

    /// <inheritdoc />
    protected override int Run(VerifySettings settings, CancellationToken cancellation)
    {
        var cases = Cases();
        var rows = ProgressRunner.Run(Host, settings.Json, "Running verification cases", progress =>
        {
            var list = new List<VerificationTableRow>();
            for (var i = 0; i < cases.Count; i++)
            {
                var c = cases[i];
                var report = ReliabilityVerification.Run(c.Problem, VerificationOptions.Default, cancellation);
                foreach (var r in report.Rows)
                {
                    if (r.Route == ComputationRoute.FirstOrder)
                    {
                        // FORM is compared on β with a tight tolerance: the design point is exact to the solver's tolerance.
                        list.Add(new(c.Name, c.FormSource, "β (FORM)", c.FormBeta, r.GeneralizedBeta, 1e-4, r.Method, r.Converged ? null : "not converged"));
                    }
                    else if (r.Method.Contains("Breitung", StringComparison.Ordinal) && c.BreitungPf is { } b)
                    {
                        list.Add(new(c.Name, "docs/references.md: Breitung (1984) formula value [derived]", "Pf (SORM formula)", b, r.FailureProbability, 1e-3, r.Method, r.Note));
                    }
                    else if (r.Route == ComputationRoute.SecondOrder && c.Sorm is { } s && PublishedValue(s, r.Method) is { } published)
                    {
                        list.Add(new(c.Name, s.Source, "Pf (SORM formula)", published, r.FailureProbability, s.Tolerance, r.Method, r.Note));
                    }
                    else if (r.CoefficientOfVariation is { } cov && r.Converged && c.ExactPf is { } exactPf)
                    {
                        // Simulation against the exact Pf: within three estimated standard errors (relative tolerance 3·CoV).
                        list.Add(new(c.Name, c.ExactSource, "Pf", exactPf, r.FailureProbability, 3 * cov, r.Method,
                            "CoV " + cov.ToString("0.000", CultureInfo.InvariantCulture)));
                    }
                }

                progress((i + 1.0) / (cases.Count + 1));
            }

            list.AddRange(UpdatingVerificationCases.Run());
            list.AddRange(TimeVariantVerificationCases.Run());
            progress(1.0);
            return list;
        });

        var set = settings.BenchmarkSet;
        var problems = BenchmarkTable.Problems(set);
        var benchmarkRows = problems.Count == 0 ? []
            : ProgressRunner.Run(Host, settings.Json, "Running benchmark problems", progress =>
                BenchmarkRunner.Run(problems, BenchmarkOptions.Default, [.. BenchmarkRunner.DefaultRoutes, new SampleSetBenchmarkRoute()], progress, cancellation));
        var summaries = BenchmarkRunner.Summarize(benchmarkRows);
        var wrong = benchmarkRows.Count(r => r.Outcome == BenchmarkOutcome.WrongAndConverged);

        if (settings.WriteDoc is not null)
        {
            var path = Host.Resolve(settings.WriteDoc);
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
            var section = benchmarkRows.Count == 0 ? null : BenchmarkTable.Markdown(benchmarkRows, summaries, set);
            File.WriteAllText(path, VerificationTable.Markdown(rows, CliApp.Version, Host.Today(), section));
        }

        var failed = rows.Count(r => !r.Pass);
        if (settings.Json)
        {
            WriteJson(new VerifyDocument(rows.Select(r => new VerifyRowDocument(r.Case, r.Source, r.Quantity, r.Method, r.Expected, r.Obtained, r.RelativeDifference, r.Tolerance, r.Pass, r.Note)).ToArray(),
                rows.Count - failed, failed,
                new BenchmarkDocument(set.ToString().ToLowerInvariant(),
                    benchmarkRows.Select(r => new BenchmarkRowDocument(r.Problem.Id, r.Problem.ReferenceSource, r.RouteName, r.Problem.ReferencePf,
                        r.Result?.FailureProbability is { } p && double.IsFinite(p) ? p : null, r.Result?.CoefficientOfVariation is { } c && double.IsFinite(c) ? c : null,
                        r.Result?.LimitStateEvaluations, r.Result?.CheckEvaluations, r.Result?.Converged, BenchmarkTable.Outcome(r.Outcome).ToLowerInvariant().Replace(' ', '_'),
                        r.Result?.Flags ?? [], r.Result?.Note)).ToArray(),
                    summaries.Select(x => new BenchmarkSummaryDocument(x.Route, x.Passed, x.Flagged, x.FlaggedOnlyByCrossCheck, x.WrongAndConverged, x.NotRun,
                        double.IsFinite(x.MedianEvaluations) ? x.MedianEvaluations : null, double.IsFinite(x.MedianCheckEvaluations) ? x.MedianCheckEvaluations : null)).ToArray(),
                    wrong),
                Reporting.Cautions.Line));
        }
        else
        {
            Table(VerificationTable.Headers, rows.Select(VerificationTable.Cells));
            Line($"{rows.Count - failed} of {rows.Count} checks pass.");
            if (benchmarkRows.Count > 0)
            {
                Table(BenchmarkTable.Headers, benchmarkRows.Select(BenchmarkTable.Cells), "Benchmark collections: every route on every problem");
                Table(BenchmarkTable.SummaryHeaders, summaries.Select(BenchmarkTable.SummaryCells), "Per route");
                Line($"{wrong} benchmark results wrong and converged (pass: converged and within 5 %, simulation within 3 standard errors; flagged: outside, but said so by the engine).");
            }

            if (settings.WriteDoc is not null) Line("Written to " + Host.Resolve(settings.WriteDoc));
            Caution();
        }

        return failed == 0 && wrong == 0 ? ExitCodes.Ok : ExitCodes.VerificationFailed;
    }

    private static double? PublishedValue(PublishedSorm s, string method) =>
        method.Contains("Breitung", StringComparison.Ordinal) ? s.Breitung
        : method.Contains("Hohenbichler", StringComparison.Ordinal) ? s.HohenbichlerRackwitz
        : method.Contains("Tvedt", StringComparison.Ordinal) ? s.Tvedt
        : null;

    private static List<Case> Cases()
    {
        // 1. Linear margin of two normals: FORM is exact. Cornell (1969): β = (μR − μS)/√(σR² + σS²) = 100/√1300.
        var linear = new ReliabilityProblem(new StochasticModel([new NormalVariable("R", 200, 20), new NormalVariable("S", 100, 30)]),
            new LimitState("R − S", x => x[0] - x[1]));
        var cornell = 100 / Math.Sqrt(1300);

        // 2. g = X1·X2 − X3 (docs/references.md, non-trivial FORM case, derived): β_FORM = 3.049073, exact Pf = 1.176882e−3.
        var product = new ReliabilityProblem(new StochasticModel(
            [new NormalVariable("X1", 40, 5), new NormalVariable("X2", 50, 2.5), new NormalVariable("X3", 1000, 200)]),
            new LimitState("X1·X2 − X3", x => x[0] * x[1] - x[2]));

        // 3. Paraboloid in standard normal space, failure if u2 ≥ β + (κ/2)u1², β = 3, κ = 0.1 (docs/references.md, SORM exact
        //    paraboloid, derived by integration over χ²): exact 1.168962e−3, Breitung (1984) 1.183939e−3, β_FORM = 3.
        var parabola = new ReliabilityProblem(new StochasticModel([new NormalVariable("U1", 0, 1), new NormalVariable("U2", 0, 1)]),
            new LimitState("3 + 0.05·U1² − U2", x => 3 + 0.05 * x[0] * x[0] - x[1]));

        // 4. OpenTURNS' own SORM test (python/test/t_SORM_std.py, expected output t_SORM_std.expout): failure when the
        //    deflection F·L³/(3·E·I) exceeds 1.5, E, F, L, I normal (50, 1, 10, 5; σ = 1). Printed to six decimals: Hasofer
        //    β 0.115943, Breitung 0.451173, Hohenbichler 0.435230, Tvedt 0.433548. Tolerance 1e-5 relative: half a unit of
        //    the sixth decimal is 1.2e-6 of these values, plus the design-point search tolerance. No exact Pf is
        //    published, so the simulations are not compared.
        var deflection = new ReliabilityProblem(
            new StochasticModel([new NormalVariable("E", 50, 1), new NormalVariable("F", 1, 1), new NormalVariable("L", 10, 1), new NormalVariable("I", 5, 1)]),
            new LimitState("1.5 − F·L³/(3·E·I)", x => 1.5 - x[1] * x[2] * x[2] * x[2] / (3 * x[0] * x[3])));

        return
        [
            new("linear R − S, normal", "Cornell (1969)", linear, cornell, "Cornell (1969), closed form", StandardNormal.Ccdf(cornell), "closed form Φ(−β), exact for a linear normal margin"),
            new("X1·X2 − X3, normal", "docs/references.md (derived)", product, 3.049073, "docs/references.md: FORM check value [derived]", 1.176882e-3, "docs/references.md: exact Pf [derived]"),
            new("paraboloid β = 3, κ = 0.1", "docs/references.md (derived)", parabola, 3.0, "distance to the apex, exact", 1.168962e-3, "exact by integration over χ² (docs/references.md, derived)", 1.183939e-3),
            new("deflection F·L³/(3EI) > 1.5, normal", "OpenTURNS t_SORM_std", deflection, 0.115943, "OpenTURNS test t_SORM_std.expout (6 decimals)", null, "no exact value published",
                Sorm: new("OpenTURNS test t_SORM_std.expout (6 decimals)", 0.451173, 0.435230, 0.433548, 1e-5)),
        ];
    }
}

/// <summary>--json row of <c>verify</c>.</summary>
public sealed record VerifyRowDocument(string Case, string Source, string Quantity, string Method, double Expected, double Obtained, double RelativeDifference, double Tolerance, bool Pass, string? Note);

/// <summary>--json row of <c>verify</c>'s benchmark table (outcome: pass, flagged, wrong or not_run).</summary>
public sealed record BenchmarkRowDocument(string Problem, string Source, string Route, double Reference, double? Obtained, double? CoefficientOfVariation,
    long? Evaluations, long? CheckEvaluations, bool? Converged, string Outcome, IReadOnlyList<string> Flags, string? Note);

/// <summary>--json per-route summary of <c>verify</c>'s benchmark table.</summary>
public sealed record BenchmarkSummaryDocument(string Route, int Passed, int Flagged, int FlaggedOnlyByCrossCheck, int WrongAndConverged, int NotRun,
    double? MedianEvaluations, double? MedianCheckEvaluations);

/// <summary>--json benchmark part of <c>verify</c>.</summary>
public sealed record BenchmarkDocument(string Set, IReadOnlyList<BenchmarkRowDocument> Rows, IReadOnlyList<BenchmarkSummaryDocument> Summary, int WrongAndConverged);

/// <summary>--json of <c>verify</c>.</summary>
public sealed record VerifyDocument(IReadOnlyList<VerifyRowDocument> Rows, int Passed, int Failed, BenchmarkDocument Benchmarks, string Caution);
