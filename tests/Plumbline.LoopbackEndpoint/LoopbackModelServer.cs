using System.Collections.Concurrent;
using System.Globalization;
using System.Text;
using System.Text.Json;
using Microsoft.AspNetCore.Builder;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Hosting.Server;
using Microsoft.AspNetCore.Hosting.Server.Features;
using Microsoft.AspNetCore.Http;
using Microsoft.Extensions.DependencyInjection;
using Microsoft.Extensions.Logging;

namespace Plumbline.LoopbackEndpoint;

/// <summary>
/// An OpenAI-compatible endpoint on 127.0.0.1 (Kestrel, a free port): <c>POST /v1/chat/completions</c>
/// and <c>POST /v1/completions</c>, answered by <see cref="ScriptedAnswers"/>, with faults injected by a
/// <see cref="FaultPlan"/>. It counts every request, per prompt too, and keeps the Authorization headers
/// it saw, so tests can check retries, the cache and the key.
/// </summary>
public sealed class LoopbackModelServer : IAsyncDisposable
{
    /// <summary>The answer prompt's ending, as the engine's templates write it.</summary>
    private const string AnswerEnding = " True or False?\nA:";

    private readonly WebApplication app;
    private readonly LoopbackOptions options;
    private readonly ConcurrentDictionary<string, int> byPrompt = new(StringComparer.Ordinal);
    private readonly ConcurrentQueue<string> authorizations = new();
    private readonly ConcurrentQueue<Fault> faults = new();
    private readonly ConcurrentQueue<int?> seeds = new();
    private readonly ConcurrentQueue<string> extraHeaders = new();
    private int requests;
    private int inFlight;
    private int mostInFlight;

    private LoopbackModelServer(WebApplication app, LoopbackOptions options)
    {
        this.app = app;
        this.options = options;
    }

    public Uri BaseUrl { get; private set; } = null!;

    /// <summary>Requests received, faulty ones included.</summary>
    public int Requests => Volatile.Read(ref requests);

    /// <summary>The most requests that were being answered at one time.</summary>
    public int MostInFlight => Volatile.Read(ref mostInFlight);

    /// <summary>How often each prompt was sent (the chat system message left out).</summary>
    public IReadOnlyDictionary<string, int> RequestsByPrompt => byPrompt;

    public IReadOnlyCollection<string> Authorizations => authorizations;

    public IReadOnlyCollection<Fault> InjectedFaults => faults;

    /// <summary>The <c>seed</c> of every request (null where none was sent).</summary>
    public IReadOnlyCollection<int?> Seeds => seeds;

    /// <summary>Every request header whose name starts with "X-", as "Name: value".</summary>
    public IReadOnlyCollection<string> ExtraHeaders => extraHeaders;

    public static async Task<LoopbackModelServer> StartAsync(LoopbackOptions? options = null)
    {
        options ??= new LoopbackOptions();
        var builder = WebApplication.CreateSlimBuilder();
        builder.Logging.ClearProviders();
        builder.WebHost.UseUrls("http://127.0.0.1:0");
        builder.Services.Configure<Microsoft.AspNetCore.Server.Kestrel.Core.KestrelServerOptions>(k => k.Limits.MaxConcurrentConnections = null);
        var app = builder.Build();
        var server = new LoopbackModelServer(app, options);
        app.MapPost("/v1/chat/completions", context => server.HandleAsync(context, chat: true));
        app.MapPost("/v1/completions", context => server.HandleAsync(context, chat: false));
        await app.StartAsync().ConfigureAwait(false);
        var address = app.Services.GetRequiredService<IServer>().Features.Get<IServerAddressesFeature>()!.Addresses.First();
        server.BaseUrl = new Uri(address.TrimEnd('/') + "/v1");
        return server;
    }

    public int CountOf(string promptFragment) =>
        byPrompt.Where(p => p.Key.Contains(promptFragment, StringComparison.Ordinal)).Sum(p => p.Value);

    public async ValueTask DisposeAsync()
    {
        await app.StopAsync().ConfigureAwait(false);
        await app.DisposeAsync().ConfigureAwait(false);
    }

    private async Task HandleAsync(HttpContext context, bool chat)
    {
        var sequence = Interlocked.Increment(ref requests);
        var now = Interlocked.Increment(ref inFlight);
        int seen;
        while (now > (seen = Volatile.Read(ref mostInFlight)) && Interlocked.CompareExchange(ref mostInFlight, now, seen) != seen)
        {
        }

        try
        {
            await AnswerAsync(context, chat, sequence).ConfigureAwait(false);
        }
        finally
        {
            Interlocked.Decrement(ref inFlight);
        }
    }

    private async Task AnswerAsync(HttpContext context, bool chat, int sequence)
    {
        using var document = await JsonDocument.ParseAsync(context.Request.Body).ConfigureAwait(false);
        var body = document.RootElement;
        var prompt = chat ? LastUserMessage(body) : body.GetProperty("prompt").GetString()!;
        byPrompt.AddOrUpdate(prompt, 1, (_, n) => n + 1);
        var authorization = context.Request.Headers.Authorization.ToString();
        authorizations.Enqueue(authorization);
        seeds.Enqueue(body.TryGetProperty("seed", out var seed) ? seed.GetInt32() : null);
        foreach (var header in context.Request.Headers.Where(h => h.Key.StartsWith("X-", StringComparison.OrdinalIgnoreCase)))
        {
            extraHeaders.Enqueue($"{header.Key}: {header.Value}");
        }
        if (options.Delay > TimeSpan.Zero)
        {
            await Task.Delay(options.Delay).ConfigureAwait(false);
        }

        if (options.RequiredKey is { } key && authorization != "Bearer " + key)
        {
            await Error(context, 401, "invalid api key").ConfigureAwait(false);
            return;
        }

        var model = body.GetProperty("model").GetString()!;
        if (options.Models is { } models && !models.Contains(model))
        {
            await Error(context, 404, $"The model '{model}' does not exist").ConfigureAwait(false);
            return;
        }

        var fault = options.Faults(sequence, prompt);
        if (fault != Fault.None)
        {
            faults.Enqueue(fault);
        }

        switch (fault)
        {
            case Fault.TooManyRequests:
                context.Response.Headers.RetryAfter = options.RetryAfterSeconds.ToString(CultureInfo.InvariantCulture);
                await Error(context, 429, "rate limited").ConfigureAwait(false);
                return;
            case Fault.ServerError:
                await Error(context, 500, "internal error").ConfigureAwait(false);
                return;
            case Fault.Unavailable:
                await Error(context, 503, "overloaded").ConfigureAwait(false);
                return;
            case Fault.Reset:
                context.Abort();
                return;
            case Fault.Slow:
                try
                {
                    await Task.Delay(options.SlowBy ?? TimeSpan.FromSeconds(5), context.RequestAborted).ConfigureAwait(false);
                }
                catch (OperationCanceledException)
                {
                    return;
                }

                break;
            case Fault.MalformedJson:
                context.Response.ContentType = "application/json";
                await context.Response.WriteAsync("{\"choices\": [ {\"text\": \"tru").ConfigureAwait(false);
                return;
        }

        var n = body.TryGetProperty("n", out var nElement) ? nElement.GetInt32() : 1;
        var wantsLogprobs = chat
            ? body.TryGetProperty("logprobs", out var lp) && lp.ValueKind == JsonValueKind.True
            : body.TryGetProperty("logprobs", out var lp2) && lp2.ValueKind == JsonValueKind.Number;
        var giveLogprobs = wantsLogprobs && options.Logprobs && fault != Fault.MissingLogprobs;
        context.Response.ContentType = "application/json";
        await context.Response.Body.WriteAsync(Respond(prompt, chat, n, giveLogprobs)).ConfigureAwait(false);
    }

    private byte[] Respond(string prompt, bool chat, int n, bool giveLogprobs)
    {
        var answers = options.Answers;
        var texts = new List<string>();
        List<(string Token, double Logprob)>? top = null;
        if (prompt.EndsWith(AnswerEnding, StringComparison.Ordinal))
        {
            var statement = LastAfter(prompt[..^AnswerEnding.Length], "Q: ").TrimEnd('?');
            var p = answers.BeliefOf(statement);
            if (giveLogprobs)
            {
                top = new List<(string, double)>
                {
                    (" True", Math.Log(0.8 * p)), ("True", Math.Log(0.15 * p)),
                    (" False", Math.Log(0.8 * (1 - p))), (" false", Math.Log(0.15 * (1 - p))),
                };
                top.Sort((a, b) => b.Logprob.CompareTo(a.Logprob));
                texts.Add(top[0].Token);
            }
            else
            {
                for (var k = 0; k < n; k++)
                {
                    texts.Add((k + 0.5) / n < p ? " True" : " False");
                }
            }
        }
        else if (prompt.EndsWith("\nOpposite:", StringComparison.Ordinal))
        {
            var statement = LastAfter(prompt[..^"\nOpposite:".Length], "Statement: ");
            texts.AddRange(Enumerable.Repeat(ScriptedAnswers.Negation(statement), n));
        }
        else if (prompt.EndsWith(", because", StringComparison.Ordinal))
        {
            var tail = LastAfter(prompt, "Q: ");
            var question = tail[..tail.IndexOf("?\nA: ", StringComparison.Ordinal)];
            var answer = tail.Contains("\nA: True,", StringComparison.Ordinal);
            for (var k = 0; k < n; k++)
            {
                texts.Add(answers.Explanation(question, answer, k));
            }
        }
        else
        {
            texts.AddRange(Enumerable.Repeat(" True", n));
        }

        using var buffer = new MemoryStream();
        using (var json = new Utf8JsonWriter(buffer))
        {
            json.WriteStartObject();
            json.WriteString("id", "loopback");
            json.WriteString("object", chat ? "chat.completion" : "text_completion");
            json.WriteStartArray("choices");
            for (var i = 0; i < texts.Count; i++)
            {
                json.WriteStartObject();
                json.WriteNumber("index", i);
                if (chat)
                {
                    json.WriteStartObject("message");
                    json.WriteString("role", "assistant");
                    json.WriteString("content", texts[i]);
                    json.WriteEndObject();
                }
                else
                {
                    json.WriteString("text", texts[i]);
                }

                if (top is not null)
                {
                    WriteLogprobs(json, chat, top);
                }

                json.WriteString("finish_reason", "stop");
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteStartObject("usage");
            json.WriteNumber("prompt_tokens", prompt.Length / 4);
            json.WriteNumber("completion_tokens", texts.Sum(t => Math.Max(1, t.Length / 4)));
            json.WriteNumber("total_tokens", prompt.Length / 4 + texts.Sum(t => Math.Max(1, t.Length / 4)));
            json.WriteEndObject();
            json.WriteEndObject();
        }

        return buffer.ToArray();
    }

    private static void WriteLogprobs(Utf8JsonWriter json, bool chat, List<(string Token, double Logprob)> top)
    {
        json.WriteStartObject("logprobs");
        if (chat)
        {
            json.WriteStartArray("content");
            json.WriteStartObject();
            json.WriteString("token", top[0].Token);
            json.WriteNumber("logprob", top[0].Logprob);
            json.WriteStartArray("top_logprobs");
            foreach (var (token, logprob) in top)
            {
                json.WriteStartObject();
                json.WriteString("token", token);
                json.WriteNumber("logprob", logprob);
                json.WriteEndObject();
            }

            json.WriteEndArray();
            json.WriteEndObject();
            json.WriteEndArray();
        }
        else
        {
            json.WriteStartArray("tokens");
            json.WriteStringValue(top[0].Token);
            json.WriteEndArray();
            json.WriteStartArray("token_logprobs");
            json.WriteNumberValue(top[0].Logprob);
            json.WriteEndArray();
            json.WriteStartArray("top_logprobs");
            json.WriteStartObject();
            foreach (var (token, logprob) in top)
            {
                json.WriteNumber(token, logprob);
            }

            json.WriteEndObject();
            json.WriteEndArray();
        }

        json.WriteEndObject();
    }

    private static string LastUserMessage(JsonElement body) =>
        body.GetProperty("messages").EnumerateArray().Last(m => m.GetProperty("role").GetString() == "user").GetProperty("content").GetString()!;

    private static string LastAfter(string text, string marker) => text[(text.LastIndexOf(marker, StringComparison.Ordinal) + marker.Length)..];

    private static async Task Error(HttpContext context, int status, string message)
    {
        context.Response.StatusCode = status;
        context.Response.ContentType = "application/json";
        await context.Response.WriteAsync(JsonSerializer.Serialize(new { error = new { message, type = "loopback" } })).ConfigureAwait(false);
    }
}
