using System.Diagnostics;
using System.Globalization;
using InspectionUpdate.Register;

// Findings logged per second by concurrent writer processes on one register (a PostgreSQL URI or a SQLite file).
//
//   dotnet run -c Release --project bench/InspectionUpdate.RegisterWriters -- <register> <writers,...> <findings-per-writer>
//
// The register must exist and hold components and a method (e.g. 'inspection-update register invent'); findings are
// added to them (no-indication, dated from the day after each component's install date on, a location unique to the run, writer and finding), one
// write transaction each, through the public API (validation, duplicate check, audit row: what 'finding log' does).
// For each writer count the writers are started as separate processes, wait at a start barrier, write, and report;
// the figure is all findings / wall-clock seconds from the barrier to the last writer's end.
if (args.Length >= 1 && args[0] == "writer")
{
    // writer <register> <barrier-file> <tag> <count>
    using var store = RegisterLocation.Open(args[1], RegisterOpenMode.OpenExisting);
    var components = store.ComponentIndex(DateTimeOffset.MaxValue).ToArray();
    var method = store.Methods()[0].Name;
    var count = int.Parse(args[4], CultureInfo.InvariantCulture);
    Console.WriteLine("ready");
    while (!File.Exists(args[2])) Thread.Sleep(1);
    var watch = Stopwatch.StartNew();
    for (var i = 0; i < count; i++)
    {
        var component = components[i % components.Length];
        var finding = new NewFinding(component.Code, component.InstallDate.AddDays(1 + (i / components.Length)), FindingKind.NoIndication, method,
            Location: FormattableString.Invariant($"{args[3]}-{i}"));
        store.AddFinding(finding, "bench", "writer benchmark").Require();
    }

    Console.WriteLine(FormattableString.Invariant($"done {count} {watch.Elapsed.TotalSeconds:F3}"));
    return 0;
}

if (args.Length != 3)
{
    Console.Error.WriteLine("usage: <register> <writers,...> <findings-per-writer>");
    return 2;
}

var register = args[0];
var perWriter = int.Parse(args[2], CultureInfo.InvariantCulture);
var self = typeof(Program).Assembly.Location;
var run = DateTime.UtcNow.ToString("HHmmss", CultureInfo.InvariantCulture);
Console.WriteLine($"register {(RegisterLocation.IsPostgres(register) ? "PostgreSQL" : "SQLite")}, {perWriter} findings per writer, {Environment.ProcessorCount} cores, load average {File.ReadAllText("/proc/loadavg").Split(' ')[0]} at start");
Console.WriteLine("writers  findings  seconds  findings/s  slowest writer s");
foreach (var writers in args[1].Split(',').Select(w => int.Parse(w, CultureInfo.InvariantCulture)))
{
    var barrier = Path.Combine(Path.GetTempPath(), $"iu-writers-{Environment.ProcessId}-{writers}");
    File.Delete(barrier);
    var processes = Enumerable.Range(0, writers).Select(k =>
    {
        var info = new ProcessStartInfo(Environment.ProcessPath!) { RedirectStandardOutput = true, UseShellExecute = false };
        if (Path.GetFileNameWithoutExtension(Environment.ProcessPath!) == "dotnet") info.ArgumentList.Add(self);
        foreach (var a in new[] { "writer", register, barrier, $"r{run}w{writers}k{k}", perWriter.ToString(CultureInfo.InvariantCulture) }) info.ArgumentList.Add(a);
        return Process.Start(info)!;
    }).ToList();
    foreach (var p in processes)
    {
        if (p.StandardOutput.ReadLine() != "ready") throw new InvalidOperationException("a writer did not start: " + p.StandardError);
    }

    var watch = Stopwatch.StartNew();
    File.WriteAllText(barrier, "");
    var slowest = 0.0;
    foreach (var p in processes)
    {
        var line = p.StandardOutput.ReadLine() ?? "";
        p.WaitForExit();
        if (p.ExitCode != 0 || !line.StartsWith("done", StringComparison.Ordinal)) throw new InvalidOperationException($"a writer failed (exit {p.ExitCode}): {line}");
        slowest = Math.Max(slowest, double.Parse(line.Split(' ')[2], CultureInfo.InvariantCulture));
    }

    var seconds = watch.Elapsed.TotalSeconds;
    File.Delete(barrier);
    Console.WriteLine(FormattableString.Invariant($"{writers,7}  {writers * perWriter,8}  {seconds,7:F2}  {writers * perWriter / seconds,10:F1}  {slowest,16:F2}"));
}

Console.WriteLine($"load average {File.ReadAllText("/proc/loadavg").Split(' ')[0]} at end");
return 0;
