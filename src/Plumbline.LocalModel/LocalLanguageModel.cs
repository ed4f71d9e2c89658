using System.Text.Json;
using Microsoft.ML.OnnxRuntimeGenAI;
using Plumbline.Core.Language;

namespace Plumbline.LocalModel;

/// <summary>
/// A decoder-only ONNX model run in this process on the CPU with ONNX Runtime GenAI, which keeps the
/// key/value cache, samples, and reads the folder's own config and tokenizer. The model is loaded once and
/// shared: every request gets its own generator over it, and at most <see cref="Concurrency"/> requests
/// compute at once. Answer probabilities are exact: the mass of the True/False spellings in the model's own
/// next-token distribution after the answer prompt, renormalised over the two.
/// </summary>
public sealed class LocalLanguageModel : ILanguageModel, IDisposable, IAsyncDisposable
{
    private readonly Config config;
    private readonly Model model;
    private readonly Tokenizer tokenizer;
    private readonly Lock tokenizerLock = new();
    private readonly SemaphoreSlim gate;
    private readonly int[] endTokens;
    private int disposed;

    private LocalLanguageModel(ModelFolder folder, LocalModelOptions options, Config config, Model model, Tokenizer tokenizer)
    {
        Folder = folder;
        Options = options;
        this.config = config;
        this.model = model;
        this.tokenizer = tokenizer;
        Concurrency = options.EffectiveConcurrency;
        gate = new SemaphoreSlim(Concurrency, Concurrency);
        endTokens = tokenizer.GetEosTokenIds().ToArray();
    }

    public ModelFolder Folder { get; }

    public LocalModelOptions Options { get; }

    /// <summary>Requests computed at the same time.</summary>
    public int Concurrency { get; }

    /// <summary>True when prompts are wrapped in the folder's chat template as one user message.</summary>
    public bool UsesChatTemplate => Folder.ChatTemplate is not null;

    public string Describe => "onnx:" + Folder.Directory;

    /// <summary>Checks the folder, loads the model once and runs it on one token, so that any set-up problem
    /// shows now rather than at the first claim.</summary>
    /// <exception cref="LocalModelException">The folder cannot be used; the message names it and what is missing.</exception>
    public static LocalLanguageModel Open(string directory, LocalModelOptions? options = null)
    {
        options ??= LocalModelOptions.Default;
        if (options.Threads is < 1 || options.Concurrency is < 1)
        {
            throw new ArgumentOutOfRangeException(nameof(options), "threads and concurrency must be at least 1");
        }

        var folder = ModelFolder.Inspect(directory, options.AvailableMemory ?? SystemMemory.Available());
        Config? config = null;
        Model? model = null;
        Tokenizer? tokenizer = null;
        LocalLanguageModel? opened = null;
        try
        {
            config = new Config(directory);
            config.ClearProviders();
            config.Overlay(SessionOverlay(options));
            model = new Model(config);
            tokenizer = new Tokenizer(model);
            opened = new LocalLanguageModel(folder, options, config, model, tokenizer);
            opened.Probe();
            return opened;
        }
        catch (Exception e) when (e is OnnxRuntimeGenAIException or LocalModelException)
        {
            if (opened is not null)
            {
                opened.Dispose();
            }
            else
            {
                tokenizer?.Dispose();
                model?.Dispose();
                config?.Dispose();
            }

            throw e as LocalModelException
                ?? new LocalModelException(directory, "the runtime cannot run this model: " + OneLine(e.Message), e);
        }
    }

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        ArgumentOutOfRangeException.ThrowIfLessThan(request.Count, 1, nameof(request));
        ArgumentOutOfRangeException.ThrowIfLessThan(request.Decoding.MaxTokens, 1, nameof(request));
        if (request.Decoding.TopP is <= 0 or > 1 || request.Decoding.Temperature < 0)
        {
            throw new ArgumentOutOfRangeException(nameof(request), "top_p must be in (0, 1] and temperature 0 or more");
        }

        var generated = await RunAsync(() => Generate(request, cancellationToken), request.Purpose.ToString(), cancellationToken);
        return generated.Result;
    }

    public Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(request);
        return RunAsync(() => ScoreAnswers(request.Prompt), "answer", cancellationToken);
    }

    public void Dispose()
    {
        if (Interlocked.Exchange(ref disposed, 1) != 0)
        {
            return;
        }

        // Requests still computing hold gate slots; the native model must outlive them.
        for (var i = 0; i < Concurrency; i++)
        {
            gate.Wait();
        }

        tokenizer.Dispose();
        model.Dispose();
        config.Dispose();
        gate.Dispose();
    }

    public ValueTask DisposeAsync()
    {
        Dispose();
        return ValueTask.CompletedTask;
    }

    /// <summary>The prompt as the model sees it: wrapped in the chat template when the folder has one.</summary>
    internal string Render(string prompt)
    {
        if (Folder.ChatTemplate is not { } template)
        {
            return prompt;
        }

        var messages = JsonSerializer.Serialize(new[] { new { role = "user", content = prompt } });
        lock (tokenizerLock)
        {
            return tokenizer.ApplyChatTemplate(template, messages, string.Empty, true);
        }
    }

    internal int[] Encode(string text)
    {
        int[] ids;
        lock (tokenizerLock)
        {
            using var sequences = tokenizer.Encode(text);
            ids = sequences[0].ToArray();
        }

        // A chat template may write the begin-of-text token that the tokenizer adds again.
        var bos = tokenizer.GetBosTokenId();
        return ids.Length > 1 && ids[0] == bos && ids[1] == bos ? ids[1..] : ids;
    }

    internal string Decode(IReadOnlyList<int> ids)
    {
        lock (tokenizerLock)
        {
            return tokenizer.Decode(ids.ToArray());
        }
    }

    /// <summary>The model's next-token distribution after <paramref name="prompt"/> (rendered), in double precision.</summary>
    internal double[] NextTokenProbabilities(string prompt)
    {
        var ids = Encode(Render(prompt));
        using var search = NewSearch(ids.Length + 1);
        using var generator = new Generator(model, search);
        generator.AppendTokens(ids);
        return LastDistribution(generator);
    }

    /// <summary>Generation as <see cref="GenerateAsync"/> does it, with the token ids of each text.</summary>
    internal GeneratedTexts Generate(GenerationRequest request, CancellationToken cancellationToken)
    {
        var decoding = request.Decoding;
        var promptIds = Encode(Render(request.Prompt));
        RequireRoom(promptIds.Length, 1);
        var maxNew = Math.Min(decoding.MaxTokens, Folder.ContextLength - promptIds.Length);
        using var search = NewSearch(promptIds.Length + maxNew);
        if (!decoding.IsGreedy)
        {
            search.SetSearchOption("do_sample", true);
            search.SetSearchOption("temperature", decoding.Temperature);
            search.SetSearchOption("top_p", decoding.TopP);
            // No top-k cut, whatever the folder's search defaults say. The runtime applies top-p only
            // together with a top-k, so nucleus sampling takes top_k = vocabulary; with top_p = 1, top_k = 0
            // draws from the same full distribution without sorting it (measured: 46 against 80 ms per token
            // with a 49,152-token vocabulary).
            search.SetSearchOption("top_k", decoding.TopP < 1 ? Folder.VocabularySize : 0);
            if (Options.Seed is { } seed)
            {
                search.SetSearchOption("random_seed", SamplingSeed.For(seed, request));
            }
        }

        using var generator = new Generator(model, search);
        generator.AppendTokens(promptIds);

        // Greedy decoding gives the same text every time: compute it once. Samples share the prompt's cache:
        // each one rewinds to the end of the prompt and draws on.
        var draws = decoding.IsGreedy ? 1 : request.Count;
        var texts = new List<string>(request.Count);
        var ids = new List<int[]>(request.Count);
        var completionTokens = 0;
        for (var draw = 0; draw < draws; draw++)
        {
            if (draw > 0)
            {
                generator.RewindTo((ulong)promptIds.Length - 1);
                generator.AppendTokens(promptIds.AsSpan(promptIds.Length - 1));
            }

            var (text, tokens) = Continue(generator, maxNew, decoding.Stop, cancellationToken);
            texts.Add(text);
            ids.Add(tokens);
            completionTokens += tokens.Length;
        }

        while (texts.Count < request.Count)
        {
            texts.Add(texts[0]);
            ids.Add(ids[0]);
        }

        return new GeneratedTexts(new GenerationResult(texts, new TokenUsage(promptIds.Length, completionTokens)), ids);
    }

    private (string Text, int[] Ids) Continue(Generator generator, int maxNew, IReadOnlyList<string> stops, CancellationToken cancellationToken)
    {
        var ids = new List<int>(maxNew);
        while (ids.Count < maxNew && !generator.IsDone())
        {
            cancellationToken.ThrowIfCancellationRequested();
            generator.GenerateNextToken();
            var token = generator.GetNextTokens()[0];
            if (endTokens.Contains(token))
            {
                break;
            }

            ids.Add(token);
            if (stops.Count > 0 && StopText.Cut(Decode(ids), stops) is { } cut)
            {
                return (cut, [.. ids]);
            }
        }

        return (Decode(ids), [.. ids]);
    }

    private AnswerProbabilities ScoreAnswers(string prompt)
    {
        var rendered = Render(prompt);
        var ids = Encode(rendered);
        var trueSequences = AnswerVariants.Sequences(Encode, rendered, ids, AnswerVariants.TrueWords);
        var falseSequences = AnswerVariants.Sequences(Encode, rendered, ids, AnswerVariants.FalseWords);
        var longest = trueSequences.Concat(falseSequences).Max(s => s.Length);
        RequireRoom(ids.Length, longest);
        using var search = NewSearch(ids.Length + longest);
        using var generator = new Generator(model, search);
        generator.AppendTokens(ids);
        var next = LastDistribution(generator);
        var extraTokens = 0;

        // A spelling of several tokens has the product of its tokens' conditional probabilities; the cache
        // is rewound to the end of the prompt after each.
        double Mass(IReadOnlyList<int[]> sequences)
        {
            var mass = 0.0;
            foreach (var sequence in sequences)
            {
                var p = next[sequence[0]];
                for (var i = 1; i < sequence.Length && p > 0; i++)
                {
                    generator.AppendTokens(sequence.AsSpan(i - 1, 1));
                    extraTokens++;
                    p *= LastDistribution(generator)[sequence[i]];
                }

                if (sequence.Length > 1)
                {
                    generator.RewindTo((ulong)ids.Length);
                }

                mass += p;
            }

            return mass;
        }

        var pTrue = Mass(trueSequences);
        var pFalse = Mass(falseSequences);
        return AnswerProbabilities.FromRaw(pTrue, pFalse, estimated: false, new TokenUsage(ids.Length + extraTokens, 0));
    }

    private double[] LastDistribution(Generator generator)
    {
        using var logits = generator.GetOutput("logits");
        var shape = logits.Shape();
        var width = (int)shape[^1];
        var all = logits.GetData<float>();
        var last = all.Slice(all.Length - width, width);
        var max = float.NegativeInfinity;
        foreach (var value in last)
        {
            max = Math.Max(max, value);
        }

        var probabilities = new double[width];
        var sum = 0.0;
        for (var i = 0; i < width; i++)
        {
            probabilities[i] = Math.Exp(last[i] - (double)max);
            sum += probabilities[i];
        }

        for (var i = 0; i < width; i++)
        {
            probabilities[i] /= sum;
        }

        return probabilities;
    }

    private GeneratorParams NewSearch(int maxLength)
    {
        var search = new GeneratorParams(model);
        search.SetSearchOption("max_length", maxLength);
        search.SetSearchOption("do_sample", false);
        return search;
    }

    private void RequireRoom(int promptTokens, int moreTokens)
    {
        if (promptTokens + moreTokens > Folder.ContextLength)
        {
            throw new ModelRequestException(
                $"the prompt takes {promptTokens} tokens; with {moreTokens} more it exceeds the model's context of {Folder.ContextLength}");
        }
    }

    private async Task<T> RunAsync<T>(Func<T> work, string what, CancellationToken cancellationToken)
    {
        ObjectDisposedException.ThrowIf(Volatile.Read(ref disposed) != 0, this);
        await gate.WaitAsync(cancellationToken);
        try
        {
            return await Task.Run(work, cancellationToken);
        }
        catch (OnnxRuntimeGenAIException e)
        {
            throw new ModelRequestException($"{Describe}: the {what} request failed: {OneLine(e.Message)}", e);
        }
        finally
        {
            gate.Release();
        }
    }

    // One token through the model: a graph whose inputs or outputs do not fit the config (names, shapes,
    // vocabulary size) fails here, as does a chat template the runtime cannot render.
    private void Probe()
    {
        if (Folder.ChatTemplate is not null)
        {
            _ = Render("True or False?");
        }

        _ = NextTokenProbabilities("True");
    }

    private static string SessionOverlay(LocalModelOptions options)
    {
        // Level 4 (fatal only) keeps the runtime's own log lines off standard error: every error reaches the
        // user once, as an exception turned into one line.
        var session = new Dictionary<string, object> { ["log_severity_level"] = 4, ["inter_op_num_threads"] = 1 };
        if (options.Threads is { } threads)
        {
            session["intra_op_num_threads"] = threads;
        }

        return JsonSerializer.Serialize(new { model = new { decoder = new { session_options = session } } });
    }

    private static string OneLine(string message) =>
        string.Join(' ', message.Split(['\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));
}
