using System.CommandLine;
using Plumbline.Application;
using System.CommandLine.Parsing;
using System.Globalization;
using Plumbline.Models.Http;

namespace Plumbline.Cli.Options;

/// <summary>
/// Where the model's answers come from and how calls to it are made: the source, the endpoint's model
/// name and protocol, the key's variable, retries and limits, the run's budgets, and the response cache.
/// The API key itself is never an option: it is read from an environment variable.
/// </summary>
internal sealed class ModelOptions
{
    public const int DefaultConcurrentCalls = 16;

    private readonly Option<string?> model = new("--model")
    {
        Description = "Where the model's answers come from: recording:PATH replays a recording file; an endpoint's base URL " +
                      "(http://127.0.0.1:8080/v1) asks an OpenAI-compatible server (with --model-name); onnx:DIR runs a " +
                      "decoder-only ONNX model folder in this process.",
        HelpName = "SOURCE",
    };

    private readonly Option<string?> modelName = new("--model-name")
    {
        Description = "The model's name as the endpoint knows it.",
        HelpName = "NAME",
    };

    private readonly Option<string> api = new("--api")
    {
        Description = "Endpoint route: chat (chat completions) or completions (plain completions).",
        HelpName = "ROUTE",
        DefaultValueFactory = _ => "chat",
    };

    private readonly Option<string> keyVariable = new("--api-key-env")
    {
        Description = $"Environment variable holding the API key (default {HttpModelOptions.DefaultKeyVariable}); the key is never a flag value.",
        HelpName = "VAR",
        DefaultValueFactory = _ => HttpModelOptions.DefaultKeyVariable,
    };

    private readonly Option<string[]> headers = new("--header")
    {
        Description = "Extra request header NAME whose value is read from environment variable VAR; repeatable.",
        HelpName = "NAME=VAR",
        AllowMultipleArgumentsPerToken = false,
    };

    private readonly Option<int?> seed = new("--seed")
    {
        Description = "Sampling seed: sent to an endpoint, or seeding a local model's sampling (and part of the cache key).",
        HelpName = "N",
    };

    private readonly Option<int?> modelThreads = new("--model-threads")
    {
        Description = "CPU threads for each run of a local model (onnx:DIR); default: every core.",
        HelpName = "N",
    };

    private readonly Option<int> votes = new("--votes")
    {
        Description = "Sampled answers per statement when the endpoint gives no log-probabilities (such beliefs are marked estimated).",
        HelpName = "N",
        DefaultValueFactory = _ => 10,
    };

    private readonly Option<int> retries = new("--retries")
    {
        Description = "Retries of a failed call (429, 5xx, broken connection, timeout, garbled answer), with backoff.",
        HelpName = "N",
        DefaultValueFactory = _ => Models.Http.CallResilienceOptions.Default.MaxRetries,
    };

    private readonly Option<double> retryDelay = new("--retry-delay")
    {
        Description = "Seconds before the first retry; each further retry waits about twice as long (with jitter), unless the endpoint says (Retry-After).",
        HelpName = "SECONDS",
        DefaultValueFactory = _ => Models.Http.CallResilienceOptions.Default.BaseDelay.TotalSeconds,
    };

    private readonly Option<double> callTimeout = new("--call-timeout")
    {
        Description = "Seconds one request may take before it is retried.",
        HelpName = "SECONDS",
        DefaultValueFactory = _ => Models.Http.CallResilienceOptions.Default.AttemptTimeout.TotalSeconds,
    };

    private readonly Option<int?> requestsPerMinute = new("--requests-per-minute")
    {
        Description = "Send at most N requests a minute.",
        HelpName = "N",
    };

    private readonly Option<int?> tokensPerMinute = new("--tokens-per-minute")
    {
        Description = "Spend at most about N tokens a minute (estimated before each request).",
        HelpName = "N",
    };

    private readonly Option<int> concurrentCalls = new("--concurrent-calls")
    {
        Description = "Model calls in flight at once, all claims together.",
        HelpName = "N",
        DefaultValueFactory = _ => DefaultConcurrentCalls,
    };

    private readonly Option<int?> maxCalls = new("--max-calls")
    {
        Description = "Stop the run (exit 3) before making more than N model calls; cached answers are free.",
        HelpName = "N",
    };

    private readonly Option<long?> maxTokens = new("--max-tokens")
    {
        Description = "Stop the run (exit 3) once N tokens are spent; cached answers are free.",
        HelpName = "N",
    };

    public ModelOptions()
    {
        api.AcceptOnlyFromAmong("chat", "completions");
        Cache = new CacheOptions();
        Positive(votes, "--votes");
        Positive(concurrentCalls, "--concurrent-calls");
        Positive(requestsPerMinute, "--requests-per-minute");
        Positive(tokensPerMinute, "--tokens-per-minute");
        Positive(maxCalls, "--max-calls", allowZero: true);
        Positive(maxTokens, "--max-tokens", allowZero: true);
        retries.Validators.Add(r =>
        {
            if (r.GetValueOrDefault<int>() < 0)
            {
                r.AddError("--retries: must be 0 or more");
            }
        });
        retryDelay.CustomParser = r => NumberParsing.Parse(r, "--retry-delay", "a number of seconds (0 or more)", v => v >= 0);
        callTimeout.CustomParser = r => NumberParsing.Parse(r, "--call-timeout", "a number of seconds above 0", v => v > 0);
        headers.Validators.Add(r =>
        {
            foreach (var value in r.GetValueOrDefault<string[]>() ?? [])
            {
                if (HeaderOf(value) is null)
                {
                    r.AddError($"--header: '{value}' is not NAME=VAR (a header name and the environment variable holding its value)");
                }
            }
        });
    }

    public CacheOptions Cache { get; }

    /// <summary>Adds the options a run needs; <paramref name="judging"/> false leaves out budgets,
    /// retries and limits (for commands that only need the model's identity).</summary>
    public void AddTo(Command command, bool judging = true)
    {
        command.Options.Add(model);
        command.Options.Add(modelName);
        command.Options.Add(api);
        command.Options.Add(seed);
        command.Options.Add(votes);
        command.Options.Add(modelThreads);
        if (judging)
        {
            command.Options.Add(keyVariable);
            command.Options.Add(headers);
            command.Options.Add(retries);
            command.Options.Add(retryDelay);
            command.Options.Add(callTimeout);
            command.Options.Add(requestsPerMinute);
            command.Options.Add(tokensPerMinute);
            command.Options.Add(concurrentCalls);
            command.Options.Add(maxCalls);
            command.Options.Add(maxTokens);
        }

        Cache.AddTo(command, judging);
    }

    /// <exception cref="UsageException">--model-threads is below 1 or given for a source that is not a local model.</exception>
    public ModelSettings Read(ParseResult parse)
    {
        var source = parse.GetValue(model);
        var threads = parse.GetValue(modelThreads);
        if (threads is < 1)
        {
            throw new UsageException("--model-threads: give 1 or more");
        }

        if (threads is not null && source?.StartsWith(Plumbline.LocalModel.LocalSourceKind.Prefix, StringComparison.OrdinalIgnoreCase) != true)
        {
            throw new UsageException("--model-threads: only a local model (--model onnx:DIR) runs here");
        }

        var name = parse.GetValue(modelName);
        var route = parse.GetValue(api) == "completions" ? HttpApi.Completions : HttpApi.Chat;
        var calls = Models.Http.CallResilienceOptions.Default with
        {
            MaxRetries = Given(parse, retries),
            BaseDelay = TimeSpan.FromSeconds(Given(parse, retryDelay)),
            AttemptTimeout = TimeSpan.FromSeconds(Given(parse, callTimeout)),
            RequestsPerMinute = Given(parse, requestsPerMinute),
            TokensPerMinute = Given(parse, tokensPerMinute),
        };
        var http = new HttpModelOptions(
            name ?? "",
            route,
            Given(parse, keyVariable) ?? HttpModelOptions.DefaultKeyVariable,
            [.. (Given(parse, headers) ?? []).Select(h => HeaderOf(h)!)],
            parse.GetValue(seed),
            // The legacy completions route lists at most 5 alternatives on some servers; 5 still holds both answers.
            TopAlternatives: route == HttpApi.Chat ? 20 : 5,
            Votes: parse.GetValue(votes),
            Resilience: calls);
        return new ModelSettings(
            source,
            parse.GetValue(seed),
            threads,
            http,
            Given(parse, concurrentCalls),
            Given(parse, maxCalls),
            Given(parse, maxTokens),
            Cache.Read(parse));
    }

    /// <summary>The option's value, or its default when the command does not carry it (cache import takes only the identity's options).</summary>
    private static T? Given<T>(ParseResult parse, Option<T> option) =>
        parse.CommandResult.Command.Options.Contains(option) ? parse.GetValue(option) : option.DefaultValueFactory is { } make ? make(null!) : default;

    private static HeaderFromVariable? HeaderOf(string text)
    {
        var equals = text.IndexOf('=', StringComparison.Ordinal);
        return equals > 0 && equals < text.Length - 1 ? new HeaderFromVariable(text[..equals].Trim(), text[(equals + 1)..].Trim()) : null;
    }

    private static void Positive<T>(Option<T> option, string name, bool allowZero = false)
    {
        option.Validators.Add(r =>
        {
            var value = r.GetValueOrDefault<T>();
            if (value is not null && Convert.ToDouble(value, CultureInfo.InvariantCulture) is var v && (allowZero ? v < 0 : v < 1))
            {
                r.AddError($"{name}: must be {(allowZero ? "0 or more" : "1 or more")}");
            }
        });
    }
}

/// <summary>The model options, read and checked.</summary>
/// <param name="Source">The <c>--model</c> value (checked by the source registry).</param>
/// <param name="Seed">Sampling seed, for any source that samples; null for none.</param>
/// <param name="ModelThreads">CPU threads per run of a local model; null for every core.</param>
/// <param name="Http">Settings of an endpoint source.</param>
/// <param name="ConcurrentCalls">Model calls in flight at once.</param>
/// <param name="MaxCalls">Call budget; null for none.</param>
/// <param name="MaxTokens">Token budget; null for none.</param>
/// <param name="Cache">Response cache settings.</param>
internal sealed record ModelSettings(
    string? Source,
    int? Seed,
    int? ModelThreads,
    HttpModelOptions Http,
    int ConcurrentCalls,
    int? MaxCalls,
    long? MaxTokens,
    CacheSettings Cache);
