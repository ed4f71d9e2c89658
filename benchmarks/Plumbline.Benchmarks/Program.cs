using Plumbline.Benchmarks.Engine;

// One benchmark per first argument; each takes its own options after the name.
var name = args.Length > 0 ? args[0] : string.Empty;
var options = args.Skip(1).ToArray();
return name switch
{
    "engine" => await EngineOverhead.RunAsync(options, Console.Out, Console.Error),
    "nli" => await Plumbline.Benchmarks.NliBenchmark.RunAsync(options, Console.Out, Console.Error),
    "calibrate" => await Plumbline.Benchmarks.NliCalibration.RunAsync(options, Console.Out, Console.Error),
    "pipeline-memory" => await Plumbline.Benchmarks.Pipeline.PipelineBenchmarks.MemoryAsync(options, Console.Out, Console.Error),
    "pipeline-throughput" => await Plumbline.Benchmarks.Pipeline.PipelineBenchmarks.ThroughputAsync(options, Console.Out, Console.Error),
    "trees" => await Plumbline.Benchmarks.Trees.TreeGridBenchmark.RunAsync(options, Console.Out, Console.Error),
    "local" => await Plumbline.Benchmarks.LocalModelBenchmark.RunAsync(options, Console.Out, Console.Error),
    "latency" => await Plumbline.Benchmarks.Live.LatencyBenchmark.RunAsync(options, Console.Out, Console.Error),
    _ => Usage(name),
};

static int Usage(string name)
{
    if (name.Length > 0)
    {
        Console.Error.WriteLine($"unknown benchmark '{name}'");
    }

    Console.Error.WriteLine("usage: Plumbline.Benchmarks <benchmark> [options]");
    Console.Error.WriteLine("  engine [--runs N] [--warmup N] [--workers N]   engine overhead per full-size tree (instant model and NLI, CP-SAT)");
    Console.Error.WriteLine("  pipeline-memory [--claims N M]   peak RSS of whole runs of N and M generated claims (default 1000, 10000), side by side");
    Console.Error.WriteLine("  pipeline-throughput [--claims N] [--in-flight K] [--nli-model DIR]   claims/min on full-size trees (shipped NLI model unless DIR); time shares");
    Console.Error.WriteLine("  nli [--model DIR] [--pairs N] [--batch N] [--runs N]   NLI scorer pairs/s against session.Run alone; cold start");
    Console.Error.WriteLine("  calibrate --model DIR --fit FILE --check FILE   fit an NLI model's calibration temperature with the C# scorer; NLL and ECE before and after");
    Console.Error.WriteLine("  trees --trees DIR [--nli-model DIR] [--cache DIR] [--grid defaults|full] [--workers N] [--limit N] [--check-solver]");
    Console.Error.WriteLine("        the engine over recorded trees with gold labels: accuracies, overturns, link health; NLI scores cached per model");
    Console.Error.WriteLine("  local [--model DIR] [--threads N] [--runs N] [--claims N] [--tokens N]   local model: load, memory, tokens/s, answer time, calls per claim");
    Console.Error.WriteLine("  latency [--delay-ms L] [--claims N] [--cap K] [--in-flight N]   live endpoint on 127.0.0.1 answering after L ms: one claim against its dependent rounds, N claims against total calls / K");
    return 2;
}
