using InspectionUpdate.Cli.Infrastructure;

namespace InspectionUpdate.Cli.Commands;

/// <summary>Assesses a component: prior and updated profiles.</summary>
public sealed class AssessCommand(CliHost host) : CliCommand<AssessSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(AssessSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("component models (issue 4) and the updater (issue 5) have not landed.");
}

/// <summary>Plans the next inspection of a component.</summary>
public sealed class PlanCommand(CliHost host) : CliCommand<PlanSettings>(host)
{
    /// <inheritdoc />
    protected override int Run(PlanSettings settings, CancellationToken cancellation) =>
        throw CliException.NotAvailable("component models (issue 4), the updater (issue 5) and the planner (issue 6) have not landed.");
}
