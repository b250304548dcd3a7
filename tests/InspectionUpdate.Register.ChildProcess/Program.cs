using System.Globalization;
using InspectionUpdate.Register;

// Commands (all paths absolute):
//   add-findings <register> <component> <method> <count> <tag> [<partner>]   prints "ready", waits for the file
//       <register>.go, then writes one transaction per finding (in rounds of ten kept in step with the partner's);
//       prints "done <count>"
//   import-and-hang <register> <csv> <hangAtRow>                  prints "hanging" inside the import transaction, then blocks
// <register> is a SQLite file or a postgresql:// URI; the signal files (.go, rounds) are named after
// IU_TEST_SIGNAL when set (a URI is no file name), else after <register>.
if (args.Length < 1)
{
    Console.Error.WriteLine("usage: add-findings | import-and-hang ...");
    return 2;
}

using var store = RegisterLocation.Open(args[1], RegisterOpenMode.OpenExisting);
var signal = Environment.GetEnvironmentVariable("IU_TEST_SIGNAL") ?? args[1];
switch (args[0])
{
    case "add-findings":
        {
            var count = int.Parse(args[4], CultureInfo.InvariantCulture);
            var start = new DateOnly(2020, 1, 1);
            // A start barrier, so the writers really overlap instead of one finishing before the other has started.
            Console.WriteLine("ready");
            Console.Out.Flush();
            var deadline = DateTime.UtcNow.AddMinutes(2);
            while (!File.Exists(signal + ".go"))
            {
                if (DateTime.UtcNow > deadline)
                {
                    Console.Error.WriteLine("no start signal");
                    return 3;
                }

                Thread.Sleep(5);
            }

            // With a partner tag, the two writers go in rounds of ten findings: each waits at the end of a round until
            // the partner has finished that round too, so both write within every round whatever the scheduler does
            // on a loaded machine (inside a round the SQLite lock decides who goes first).
            var partner = args.Length > 6 ? args[6] : null;
            for (var i = 0; i < count; i++)
            {
                var finding = new NewFinding(args[2], start.AddDays(i), FindingKind.NoIndication, args[3], Location: $"{args[5]}-{i}");
                store.AddFinding(finding, args[5], "concurrent writer test").Require();

                // A short pause between transactions, as between two users' writes: SQLite's lock is not fair, and a
                // writer looping without pause can hold it for long runs.
                Thread.Sleep(2);
                if (partner is not null && i % 10 == 9)
                {
                    var round = (i / 10).ToString(CultureInfo.InvariantCulture);
                    File.WriteAllText($"{signal}.{args[5]}.{round}", "");
                    while (!File.Exists($"{signal}.{partner}.{round}"))
                    {
                        if (DateTime.UtcNow > deadline.AddMinutes(2))
                        {
                            Console.Error.WriteLine("partner did not finish round " + round);
                            return 4;
                        }

                        Thread.Sleep(2);
                    }
                }
            }

            Console.WriteLine($"done {count}");
            return 0;
        }

    case "import-and-hang":
        {
            var hangAt = int.Parse(args[3], CultureInfo.InvariantCulture);
            var result = store.ImportFindingsCsv(args[2], "child", "killed import test", new Hang(hangAt));
            Console.WriteLine(result.Succeeded ? "imported (not expected)" : "refused: " + string.Join("; ", result.Problems));
            return 1;
        }

    default:
        Console.Error.WriteLine($"unknown command {args[0]}");
        return 2;
}

/// <summary>Blocks forever, inside the import transaction, once the given number of rows is written.</summary>
internal sealed class Hang(int atRow) : IProgress<int>
{
    public void Report(int value)
    {
        if (value == atRow)
        {
            Console.WriteLine("hanging");
            Console.Out.Flush();
            Thread.Sleep(Timeout.Infinite);
        }
    }
}
