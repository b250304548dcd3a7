using InspectionUpdate.Cli.Commands;
using InspectionUpdate.Cli.Infrastructure;
using Spectre.Console.Cli;

namespace InspectionUpdate.Cli;

/// <summary>The command tree of inspection-update. Verbs on the nouns of the work (docs/cli.md).</summary>
public static class CliApp
{
    /// <summary>The tool version shown in reports and --version.</summary>
    public static string Version => Application.ToolInfo.Version;

    /// <summary>Runs the command line on <paramref name="host"/> and returns the exit code.</summary>
    public static int Run(string[] args, CliHost host)
    {
        ArgumentNullException.ThrowIfNull(args);
        ArgumentNullException.ThrowIfNull(host);
        var registrar = new TypeRegistrar();
        registrar.RegisterInstance(typeof(CliHost), host);
        var app = new CommandApp(registrar);
        var verbose = args.Contains("--verbose");
        var strict = new StrictCommandLine();
        app.Configure(config =>
        {
            config.SetApplicationName("inspection-update");
            config.SetApplicationVersion(Version);
            config.ConfigureConsole(host.Console);
            // An unknown option or an extra argument is an error, never silently ignored (docs/cli.md).
            config.UseStrictParsing();
            config.SetExceptionHandler((e, _) =>
            {
                // Parse and binding errors: one sentence, exit code for bad input.
                host.Error.WriteLine("error: " + strict.Sentence(NameTheOption(OneLine(e.Message), args), args));
                if (verbose) host.Error.WriteLine(e.ToString());
                return e is CommandAppException ? ExitCodes.BadInput : ExitCodes.InternalError;
            });

            strict.Branch("register");
            config.AddBranch("register", b =>
            {
                b.SetDescription("Create, check and assess a register (a SQLite file or a PostgreSQL database of sites, components, methods, findings, repairs and stored results).");
                Add<RegisterCreateCommand>(b, "register create").WithDescription("Create an empty register: a SQLite file, or a PostgreSQL database named by a postgresql:// URI (tables, roles and grants).")
                    .WithExample("register", "create", "plant.register");
                Add<RegisterCheckCommand>(b, "register check").WithDescription("Check the register's integrity and print its fingerprint.")
                    .WithExample("register", "check", "-r", "plant.register");
                Add<RegisterAssessCommand>(b, "register assess").WithDescription("Assess and plan every component in service as of a date; store each result under its key (reruns recompute only what changed).")
                    .WithExample("register", "assess", "--as-of", "2025-06-30", "-r", "plant.register")
                    .WithExample("register", "assess", "--shard", "0/4", "-r", "plant.register");
                Add<RegisterMergeCommand>(b, "register merge").WithDescription("Fold shard results files into the register, refusing results whose keys no longer match.")
                    .WithExample("register", "merge", "plant.register.shard-0-of-4.results", "plant.register.shard-1-of-4.results", "-r", "plant.register");
                Add<RegisterReportCommand>(b, "register report").WithDescription("Write the register report from stored results (ranking, due dates, distributions, due inspections per year and site); component pages only on request.")
                    .WithExample("register", "report", "--as-of", "2025-06-30", "-r", "plant.register", "-o", "reports")
                    .WithExample("register", "report", "--as-of", "2025-06-30", "-r", "plant.register", "--above", "1e-4");
                Add<RegisterCopyCommand>(b, "register copy").WithDescription("Copy a whole register (all revisions, audit trail, stored results) between a SQLite file and a PostgreSQL database; the fingerprints match.")
                    .WithExample("register", "copy", "plant.register", "postgresql://owner@db.example:5432/plant");
                Add<RegisterDocumentCommand>(b, "register document").WithDescription("Record the document control of the register's reports (title, owner, author, checker, approver, revision, target source), kept with its history.")
                    .WithExample("register", "document", "--title", "Line IL-3 integrity report", "--author", "A. Author", "--revision", "2", "--revision-date", "2025-07-01", "--reason", "annual issue", "-r", "plant.register");
                Add<ConsequenceClassCommand>(b, "register consequence-class").WithDescription("Record the meaning of one of the owner's consequence classes (1–5) and the target preset it chooses.")
                    .WithExample("register", "consequence-class", "4", "--meaning", "\"leak to open water\"", "--target-preset", "jcss-normal-large", "--reason", "\"owner's scale\"", "-r", "plant.register");
                Add<RegisterInventCommand>(b, "register invent").WithDescription("Create a register of invented components (benchmarks and trials).")
                    .WithExample("register", "invent", "trial.register", "--components", "1000");
            });
            strict.Branch("site");
            config.AddBranch("site", b =>
            {
                b.SetDescription("Sites: places that hold components.");
                Add<SiteAddCommand>(b, "site add").WithDescription("Add a site.")
                    .WithExample("site", "add", "NORTH-BAY", "--name", "\"North Bay injection station\"", "-r", "plant.register");
                Add<SiteCorrectCommand>(b, "site correct").WithDescription("Correct a site's name: records a new revision with who and why.")
                    .WithExample("site", "correct", "NORTH-BAY", "--name", "\"North Bay injection and metering station\"", "--reason", "\"name from the asset list\"", "-r", "plant.register");
                Add<SiteListCommand>(b, "site list").WithDescription("List the sites.").WithExample("site", "list", "-r", "plant.register");
            });
            strict.Branch("component");
            config.AddBranch("component", b =>
            {
                b.SetDescription("Components and their degradation models.");
                Add<ComponentAddCommand>(b, "component add").WithDescription("Add a component with its model file.")
                    .WithExample("component", "add", "WI-03", "--site", "NORTH-BAY", "--name", "\"Injection line spool 3\"", "--model", "wi-03.model.json", "--in-service", "2011-04-01", "-r", "plant.register");
                Add<ComponentReviseCommand>(b, "component revise").WithDescription("Revise a component's model (a new revision; the old one stays readable).")
                    .WithExample("component", "revise", "WI-03", "--model", "wi-03.model.json", "--reason", "\"new coating survey\"", "-r", "plant.register");
                Add<ComponentRetireCommand>(b, "component retire").WithDescription("Retire a component: it leaves reports and runs, and stays readable as of earlier dates.")
                    .WithExample("component", "retire", "WI-03", "--reason", "\"spool replaced\"", "-r", "plant.register");
                Add<ComponentReinstateCommand>(b, "component reinstate").WithDescription("Reinstate a retired component.")
                    .WithExample("component", "reinstate", "WI-03", "--reason", "\"retired in error\"", "-r", "plant.register");
                Add<ComponentConsequenceCommand>(b, "component consequence").WithDescription("Set a component's consequence class (1–5) and optional cost of failure.")
                    .WithExample("component", "consequence", "WI-03", "--class", "4", "--cost-of-failure", "2500000", "--reason", "\"consequence survey\"", "-r", "plant.register");
                Add<ComponentListCommand>(b, "component list").WithDescription("List the components.").WithExample("component", "list", "-r", "plant.register");
            });
            strict.Branch("method");
            config.AddBranch("method", b =>
            {
                b.SetDescription("Inspection methods: probability of detection and sizing error.");
                Add<MethodAddCommand>(b, "method add").WithDescription("Add a method from a method file.")
                    .WithExample("method", "add", "UT-AUTO", "--file", "ut-auto.method.json", "-r", "plant.register");
                Add<MethodFitCommand>(b, "method fit").WithDescription("Fit a method's PoD curve from qualification data and add it.")
                    .WithExample("method", "fit", "EC-SPLASH", "--data", "ec-trials.csv", "--kind", "hit-miss", "-r", "plant.register");
                Add<MethodCorrectCommand>(b, "method correct").WithDescription("Correct a method's PoD curve, sizing error or description: records a new revision with who and why.")
                    .WithExample("method", "correct", "UT-AUTO", "--file", "ut-auto.method.json", "--reason", "\"sizing sd from the 2025 qualification\"", "-r", "plant.register");
                Add<MethodListCommand>(b, "method list").WithDescription("List the methods.").WithExample("method", "list", "-r", "plant.register");
            });
            strict.Branch("finding");
            config.AddBranch("finding", b =>
            {
                b.SetDescription("Inspection findings (never overwritten: a correction is a new revision).");
                Add<FindingLogCommand>(b, "finding log").WithDescription("Log one finding.")
                    .WithExample("finding", "log", "WI-03", "--date", "2024-05-14", "--method", "UT-AUTO", "--outcome", "sized", "--size-mm", "2.4", "--by", "a.engineer", "-r", "plant.register");
                Add<FindingImportCommand>(b, "finding import").WithDescription("Import findings from a CSV file (all rows or none).")
                    .WithExample("finding", "import", "campaign-2024.csv", "--by", "a.engineer", "-r", "plant.register");
                Add<FindingCorrectCommand>(b, "finding correct").WithDescription("Correct a finding: records a new revision with who and why.")
                    .WithExample("finding", "correct", "7", "--size-mm", "2.1", "--by", "a.engineer", "--reason", "\"transcription error\"", "-r", "plant.register");
                Add<FindingListCommand>(b, "finding list").WithDescription("List findings.").WithExample("finding", "list", "WI-03", "--all-revisions", "-r", "plant.register");
            });
            strict.Branch("repair");
            config.AddBranch("repair", b =>
            {
                b.SetDescription("Repairs (the component's degradation restarts).");
                Add<RepairListCommand>(b, "repair list").WithDescription("List repairs.").WithExample("repair", "list", "WI-03", "--all-revisions", "-r", "plant.register");
                Add<RepairCorrectCommand>(b, "repair correct").WithDescription("Correct a repair: records a new revision with who and why.")
                    .WithExample("repair", "correct", "3", "--date", "2023-09-04", "--reason", "\"date from the work order\"", "-r", "plant.register");
                Add<RepairWithdrawCommand>(b, "repair withdraw").WithDescription("Withdraw a repair logged in error (kept in the history).")
                    .WithExample("repair", "withdraw", "3", "--reason", "\"logged on the wrong component\"", "-r", "plant.register");
                Add<RepairLogCommand>(b, "repair log").WithDescription("Log a repair.")
                    .WithExample("repair", "log", "WI-03", "--date", "2023-09-02", "--description", "\"clamp and sleeve fitted\"", "--by", "a.engineer", "-r", "plant.register");
            });
            Top<AssessCommand>(config, "assess").WithDescription("Assess: prior and updated profile Pf(t), ΔPf(t), β(t) of a component.")
                .WithExample("assess", "WI-03", "-r", "plant.register")
                .WithExample("assess", "--model", "wi-03.model.json", "--findings", "wi-03.findings.csv");
            Top<PlanCommand>(config, "plan").WithDescription("Plan: the latest date of the next inspection and a schedule over the remaining life.")
                .WithExample("plan", "WI-03", "--target-annual-pf", "1e-4", "-r", "plant.register")
                .WithExample("plan", "--model", "wi-03.model.json", "--target-annual-pf", "1e-4");
            Top<ReportCommand>(config, "report").WithDescription("Write HTML reports (one per component and one for the register) with CSV and JSON exports.")
                .WithExample("report", "--out", "reports", "-r", "plant.register");
            Top<VerifyCommand>(config, "verify").WithDescription("Run the verification cases and the benchmark-collection problems on this installation.")
                .WithExample("verify").WithExample("verify", "--benchmarks", "quick").WithExample("verify", "--write-doc", "docs/verification.md");
            Top<ServeCommand>(config, "serve").WithDescription("Serve the local web view of a register (127.0.0.1 by default): the register, components, logging and correcting findings, CSV import.")
                .WithExample("serve", "-r", "plant.register").WithExample("serve", "-r", "plant.register", "--port", "8080");
            Top<DemoCommand>(config, "demo").WithDescription("Build a demo register from sample-data, assess, plan and report.")
                .WithExample("demo").WithExample("demo", "--out", "demo-output");
        });

        return app.Run(args);

        ICommandConfigurator Add<TCommand>(IConfigurator<CommandSettings> branch, string path)
            where TCommand : class, ICommandLimiter<CommandSettings>
        {
            strict.Command<TCommand>(path);
            return branch.AddCommand<TCommand>(path[(path.LastIndexOf(' ') + 1)..]);
        }

        ICommandConfigurator Top<TCommand>(IConfigurator configurator, string name)
            where TCommand : class, ICommand
        {
            strict.Command<TCommand>(name);
            return configurator.AddCommand<TCommand>(name);
        }
    }

    private static string OneLine(string s) => s.ReplaceLineEndings(" ").Trim();

    /// <summary>
    /// Spectre reports a value it cannot convert without the option's name ("Failed to convert 'abc' to Double."):
    /// add the option that preceded the value so that the sentence names the field and the value.
    /// </summary>
    internal static string NameTheOption(string message, IReadOnlyList<string> args)
    {
        const string prefix = "Failed to convert '";
        if (!message.StartsWith(prefix, StringComparison.Ordinal)) return message;
        var end = message.IndexOf('\'', prefix.Length);
        if (end < 0) return message;
        var value = message[prefix.Length..end];
        for (var i = 1; i < args.Count; i++)
        {
            if (args[i] == value && args[i - 1].StartsWith('-'))
            {
                var kind = message.Contains("Double", StringComparison.Ordinal) ? "a number"
                    : message.Contains("Int32", StringComparison.Ordinal) ? "a whole number" : "of the expected type";
                return $"{args[i - 1]} '{value}' is not {kind}.";
            }
        }

        return message;
    }
}
