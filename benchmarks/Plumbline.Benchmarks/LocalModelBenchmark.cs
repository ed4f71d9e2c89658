using System.Diagnostics;
using System.Globalization;
using Plumbline.Core.Claims;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.LocalModel;
using Plumbline.Nli;
using Plumbline.Solver;

namespace Plumbline.Benchmarks;

/// <summary>
/// A local model folder on this machine's CPU: load time and memory, prompt processing, generation tokens per
/// second, time to answer probabilities, and whole claims judged with the real NLI model and solver (model
/// calls, tokens and wall time per claim).
/// </summary>
internal static class LocalModelBenchmark
{
    private static readonly string[] Statements =
    [
        "The lake is frozen in winter.",
        "Every bakery in Thornvale opens on Sunday.",
        "The clock tower has four faces.",
    ];

    public static async Task<int> RunAsync(string[] args, TextWriter output, TextWriter error)
    {
        int runs = 5, claims = 1, maxTokens = 64;
        int? threads = null;
        string? directory = null;
        for (var i = 0; i < args.Length; i++)
        {
            var next = i + 1 < args.Length ? args[i + 1] : null;
            var value = next is not null && int.TryParse(next, NumberStyles.None, CultureInfo.InvariantCulture, out var parsed) ? parsed : (int?)null;
            switch (args[i])
            {
                case "--model" when next is not null: directory = next; i++; break;
                case "--threads" when value is > 0: threads = value; i++; break;
                case "--runs" when value is > 0: runs = value.Value; i++; break;
                case "--claims" when value is >= 0: claims = value.Value; i++; break;
                case "--tokens" when value is > 0: maxTokens = value.Value; i++; break;
                default:
                    error.WriteLine($"local: bad option '{args[i]}' (expected --model DIR, --threads N, --runs N, --claims N or --tokens N)");
                    return 2;
            }
        }

        directory ??= Path.Combine(RepositoryRoot(), "models", "tiny-decoder");
        var before = SystemMemory.Resident();
        var load = Stopwatch.StartNew();
        LocalLanguageModel model;
        try
        {
            model = LocalLanguageModel.Open(directory, new LocalModelOptions(Threads: threads, Seed: 1));
        }
        catch (LocalModelException e)
        {
            error.WriteLine($"local: {e.Message}");
            return 2;
        }

        load.Stop();
        var loaded = SystemMemory.Resident();
        await using (model)
        {
            var folder = model.Folder;
            output.WriteLine($"local model: {folder}");
            output.WriteLine(FormattableString.Invariant(
                $"{Environment.ProcessorCount} cores, {threads?.ToString(CultureInfo.InvariantCulture) ?? "all"} threads per run, {model.Concurrency} request(s) at once, {runs} runs"));
            output.WriteLine(FormattableString.Invariant(
                $"load (check, load, one-token probe) {load.Elapsed.TotalSeconds:0.000} s; resident memory {SystemMemory.Format(before)} -> {SystemMemory.Format(loaded)} (+{SystemMemory.Format(loaded - before)}), weights on disk {SystemMemory.Format(folder.WeightBytes)}"));

            var abduction = PromptBook.Abduction(Statements[0], true);
            var answer = PromptBook.Answer(Statements[0]);
            var abductionTokens = model.Encode(abduction).Length;
            var answerTokens = model.Encode(answer).Length;

            // Warm up every path once.
            model.NextTokenProbabilities(answer);
            await model.ScoreAnswersAsync(new AnswerRequest(Statements[0], answer), CancellationToken.None);
            model.Generate(Request(abduction, 0.0, maxTokens, 1), CancellationToken.None);

            var prefill = Measure(runs, () => model.NextTokenProbabilities(abduction));
            var answers = new List<TimeSpan>(runs);
            for (var run = 0; run < runs; run++)
            {
                var watch = Stopwatch.StartNew();
                await model.ScoreAnswersAsync(new AnswerRequest(Statements[run % Statements.Length], PromptBook.Answer(Statements[run % Statements.Length])), CancellationToken.None);
                answers.Add(watch.Elapsed);
            }

            // Decoding alone: each run times a one-token and a full generation back to back; the difference is
            // the time of the other tokens (prompt processing cancels out within the pair).
            var greedyTokens = 0;
            var greedy = new List<TimeSpan>(runs);
            var decoding = new List<TimeSpan>(runs);
            for (var run = 0; run < runs; run++)
            {
                var watch = Stopwatch.StartNew();
                model.Generate(Request(abduction, 0.0, 1, 1), CancellationToken.None);
                var first = watch.Elapsed;
                watch.Restart();
                greedyTokens = model.Generate(Request(abduction, 0.0, maxTokens, 1), CancellationToken.None).Result.Usage.CompletionTokens;
                greedy.Add(watch.Elapsed);
                decoding.Add(watch.Elapsed - first);
            }

            var sampledTokens = 0;
            var sampled = Measure(runs, () => sampledTokens = model.Generate(Request(abduction, 1.0, maxTokens, 3), CancellationToken.None).Result.Usage.CompletionTokens);

            var prefillMs = Timing.Of(prefill).Median;
            var greedyMs = Timing.Of(greedy).Median;
            var decodingMs = Timing.Of(decoding).Median;
            var sampledMs = Timing.Of(sampled).Median;
            output.WriteLine($"prompt processing, abduction prompt of {abductionTokens} tokens: {Timing.Of(prefill)}");
            output.WriteLine($"answer probabilities, answer prompt of {answerTokens} tokens: {Timing.Of(answers)}");
            output.WriteLine($"greedy generation, {greedyTokens} tokens (no stop string): {Timing.Of(greedy)}");
            output.WriteLine($"sampled generation, 3 samples, {sampledTokens} tokens in all: {Timing.Of(sampled)}");
            var decodingRate = decodingMs > 0
                ? FormattableString.Invariant($"{(greedyTokens - 1) / (decodingMs / 1000):0.0}")
                : "below the timer's noise";
            output.WriteLine(FormattableString.Invariant(
                $"tokens/s: greedy {greedyTokens / (greedyMs / 1000):0.0} with the prompt, {decodingRate} decoding alone; 3 samples {sampledTokens / (sampledMs / 1000):0.0}"));
            output.WriteLine(FormattableString.Invariant($"prompt processing {abductionTokens / (prefillMs / 1000):0} tokens/s"));

            if (claims > 0)
            {
                await JudgeClaimsAsync(model, claims, output);
            }

            output.WriteLine($"peak resident memory {(SystemMemory.PeakResident() is { } peak ? SystemMemory.Format(peak) : "unknown")}");
        }

        return 0;
    }

    private static async Task JudgeClaimsAsync(LocalLanguageModel model, int claims, TextWriter output)
    {
        using var scorer = OnnxEntailmentScorer.Load(Path.Combine(RepositoryRoot(), "models", "nli-minilm-int8"));
        // A random model's explanations rarely end a sentence; keeping them cut off lets the tree grow to the
        // default shape, so the calls counted are those a real model's claim makes.
        var options = CoherenceOptions.Default with { DiscardCutOff = false };
        output.WriteLine("claims: default tree shape, cut-off explanations kept (see the benchmark's source)");
        var engine = new CoherenceEngine(model, scorer, new CpSatMaxSatSolver(CpSatOptions.Default with { Workers = 1 }), options, TimeProvider.System);
        for (var i = 0; i < claims; i++)
        {
            var watch = Stopwatch.StartNew();
            var verdict = await engine.JudgeAsync(new Claim($"b{i}", Statements[i % Statements.Length]), CancellationToken.None);
            watch.Stop();
            output.WriteLine(FormattableString.Invariant(
                $"claim {i + 1}: {verdict.Status}, {verdict.Tree?.Statements.Count ?? 0} statements, {verdict.ModelCalls} model calls, {verdict.Tokens.PromptTokens} prompt + {verdict.Tokens.CompletionTokens} completion tokens, {watch.Elapsed.TotalSeconds:0.0} s"));
        }
    }

    private static GenerationRequest Request(string prompt, double temperature, int maxTokens, int count) =>
        new(GenerationPurpose.Abduction, "bench", true, prompt, new Decoding(temperature, 1.0, maxTokens, []), count);

    private static List<TimeSpan> Measure(int runs, Action action)
    {
        var samples = new List<TimeSpan>(runs);
        for (var run = 0; run < runs; run++)
        {
            var watch = Stopwatch.StartNew();
            action();
            samples.Add(watch.Elapsed);
        }

        return samples;
    }

    private static string RepositoryRoot()
    {
        for (var folder = new DirectoryInfo(Environment.CurrentDirectory); folder is not null; folder = folder.Parent)
        {
            if (File.Exists(Path.Combine(folder.FullName, "Plumbline.slnx")))
            {
                return folder.FullName;
            }
        }

        return Environment.CurrentDirectory;
    }
}
