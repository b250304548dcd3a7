using InspectionUpdate.Cli;
using InspectionUpdate.Cli.Infrastructure;

return CliApp.Run(args, CliHost.FromProcess());
