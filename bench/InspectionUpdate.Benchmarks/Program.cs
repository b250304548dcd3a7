using BenchmarkDotNet.Running;

// Run all benchmarks with: dotnet run -c Release --project bench/InspectionUpdate.Benchmarks -- --filter '*'
BenchmarkSwitcher.FromAssembly(typeof(Program).Assembly).Run(args);
