using System.Globalization;
using System.Net;
using System.Net.Http.Headers;
using System.Net.Sockets;
using System.Text;
using System.Text.Json;
using System.Threading.RateLimiting;
using Plumbline.Core.Language;
using Polly;
using Polly.Retry;
using Polly.Timeout;

namespace Plumbline.Models.Http;

/// <summary>
/// Sends request bodies to one OpenAI-compatible endpoint through a Polly pipeline: bounded retries
/// with exponential backoff and jitter on 429, 5xx, broken connections, timeouts and garbled bodies
/// (a Retry-After is honoured), optional requests- and tokens-per-minute limits, and a timeout per
/// attempt. Everything it says about a failure has the credentials redacted.
/// </summary>
internal sealed class EndpointClient : IDisposable
{
    private readonly HttpClient http;
    private readonly EndpointCredentials credentials;
    private readonly HttpModelOptions options;
    private readonly ResiliencePipeline<WireResponse> pipeline;
    private readonly ResiliencePipeline<WireResponse> probePipeline;
    private readonly RateLimiter? requestLimiter;
    private readonly TokenBucketRateLimiter? tokenLimiter;
    private readonly TimeProvider clock;

    public EndpointClient(Uri baseUrl, HttpModelOptions options, EndpointCredentials credentials, TimeProvider time, HttpMessageHandler? handler = null)
    {
        this.options = options;
        this.credentials = credentials;
        clock = time;
        BaseUrl = baseUrl.AbsoluteUri.EndsWith('/') ? baseUrl : new Uri(baseUrl.AbsoluteUri + "/");
        Route = new Uri(BaseUrl, WireRequest.PathOf(options.Api));
        http = new HttpClient(handler ?? new SocketsHttpHandler { PooledConnectionLifetime = TimeSpan.FromMinutes(5) }, disposeHandler: true)
        {
            // The pipeline times each attempt; the client's own clock would cut retries short.
            Timeout = Timeout.InfiniteTimeSpan,
        };
        var calls = options.Calls;
        if (calls.RequestsPerMinute is { } rpm)
        {
            requestLimiter = PerMinute(rpm);
        }

        if (calls.TokensPerMinute is { } tpm)
        {
            tokenLimiter = PerMinute(tpm);
        }

        pipeline = Build(calls, calls.MaxRetries, IsWorthRetrying, time, requestLimiter);
        // The set-up check gives a down server no second chance (it should be reported at once), but a
        // busy one (429, 5xx) or a slow one a few.
        probePipeline = Build(calls, Math.Min(calls.MaxRetries, 2), e => e is EndpointFailure { Transient: true, Status: not null } or TimeoutRejectedException, time, null);
    }

    public Uri BaseUrl { get; }

    /// <summary>The full URL requests go to.</summary>
    public Uri Route { get; }

    /// <summary>The endpoint as reports show it: no user info, no query (either may hold a secret).</summary>
    public string Shown => $"{BaseUrl.Scheme}://{BaseUrl.Authority}{BaseUrl.AbsolutePath.TrimEnd('/')}";

    /// <summary>Sends one body, retrying as configured.</summary>
    /// <param name="requireAlternatives">A response without log-probabilities is treated as garbled (and retried).</param>
    /// <exception cref="ModelRequestException">Every attempt failed, or the endpoint refused the request; the message says why.</exception>
    public async Task<WireResponse> SendAsync(byte[] body, int estimatedTokens, bool requireAlternatives, CancellationToken cancellationToken)
    {
        var attempt = new Attempt(this, body, estimatedTokens, requireAlternatives);
        try
        {
            return await pipeline.ExecuteAsync(static (a, ct) => a.RunAsync(ct), attempt, cancellationToken).ConfigureAwait(false);
        }
        catch (Exception e) when (e is not OperationCanceledException || !cancellationToken.IsCancellationRequested)
        {
            var tries = attempt.Count == 1 ? "" : $" after {attempt.Count} attempts";
            throw new ModelRequestException(credentials.Redact($"POST {WireRequest.PathOf(options.Api)} failed{tries}: {Reason(e)}"));
        }
    }

    /// <summary>Sends the set-up check's body once (a busy endpoint gets a few more tries) and lets the
    /// failure through as it is, for the caller to explain.</summary>
    public Task<WireResponse> ProbeAsync(byte[] body, CancellationToken cancellationToken)
    {
        var attempt = new Attempt(this, body, 0, requireAlternatives: false);
        return probePipeline.ExecuteAsync(static (a, ct) => a.RunAsync(ct), attempt, cancellationToken).AsTask();
    }

    /// <summary>Why a request failed, on one line, credentials redacted.</summary>
    public string Reason(Exception e) => credentials.Redact(e switch
    {
        EndpointFailure failure => failure.Message,
        TimeoutRejectedException => $"no response within {Seconds(options.Calls.AttemptTimeout)}",
        HttpRequestException { InnerException: SocketException socket } => $"cannot connect to {Shown} ({socket.SocketErrorCode})",
        HttpRequestException request => $"connection to {Shown} failed ({request.HttpRequestError}: {OneLine(request.Message)})",
        _ => $"{e.GetType().Name}: {OneLine(e.Message)}",
    });

    public void Dispose()
    {
        http.Dispose();
        requestLimiter?.Dispose();
        tokenLimiter?.Dispose();
    }

    private static string Seconds(TimeSpan span) => string.Create(CultureInfo.InvariantCulture, $"{span.TotalSeconds:0.###} s");

    private static string OneLine(string text) => string.Join(' ', text.Split(['\r', '\n'], StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries));

    /// <summary>A bucket holding a minute's allowance, refilled evenly: whole tokens at a time, at the
    /// allowance's own rate (one every 10 s for 6 a minute, 2 a second for 120 a minute).</summary>
    private static TokenBucketRateLimiter PerMinute(int perMinute)
    {
        var perPeriod = Math.Max(1, perMinute / 60);
        return new TokenBucketRateLimiter(new TokenBucketRateLimiterOptions
        {
            TokenLimit = perMinute,
            TokensPerPeriod = perPeriod,
            ReplenishmentPeriod = TimeSpan.FromSeconds(60.0 * perPeriod / perMinute),
            QueueLimit = int.MaxValue,
            QueueProcessingOrder = QueueProcessingOrder.OldestFirst,
            AutoReplenishment = true,
        });
    }

    private static bool IsWorthRetrying(Exception? e) => e switch
    {
        EndpointFailure failure => failure.Transient,
        TimeoutRejectedException => true,
        HttpRequestException => true,
        IOException => true,
        _ => false,
    };

    private static ResiliencePipeline<WireResponse> Build(
        CallResilienceOptions calls, int retries, Func<Exception?, bool> worthRetrying, TimeProvider time, RateLimiter? limiter)
    {
        var builder = new ResiliencePipelineBuilder<WireResponse> { TimeProvider = time };
        if (retries > 0)
        {
            builder.AddRetry(new RetryStrategyOptions<WireResponse>
            {
                MaxRetryAttempts = retries,
                BackoffType = DelayBackoffType.Exponential,
                UseJitter = true,
                Delay = calls.BaseDelay,
                MaxDelay = calls.MaxDelay,
                ShouldHandle = args => ValueTask.FromResult(worthRetrying(args.Outcome.Exception)),
                // A server that says when to come back knows better than our backoff; it is still capped.
                DelayGenerator = args => ValueTask.FromResult(
                    args.Outcome.Exception is EndpointFailure { RetryAfter: { } after }
                        ? (TimeSpan?)(after < calls.MaxDelay ? after : calls.MaxDelay)
                        : null),
            });
        }

        if (limiter is not null)
        {
            builder.AddRateLimiter(limiter);
        }

        builder.AddTimeout(calls.AttemptTimeout);
        return builder.Build();
    }

    private sealed class Attempt(EndpointClient client, byte[] body, int estimatedTokens, bool requireAlternatives)
    {
        private int count;

        public int Count => Volatile.Read(ref count);

        public async ValueTask<WireResponse> RunAsync(CancellationToken cancellationToken)
        {
            Interlocked.Increment(ref count);
            RateLimitLease? tokens = null;
            if (client.tokenLimiter is { } limiter && estimatedTokens > 0)
            {
                tokens = await limiter.AcquireAsync(Math.Min(estimatedTokens, client.options.Calls.TokensPerMinute!.Value), cancellationToken).ConfigureAwait(false);
            }

            using (tokens)
            {
                using var request = new HttpRequestMessage(HttpMethod.Post, client.Route)
                {
                    Content = new ByteArrayContent(body) { Headers = { ContentType = new MediaTypeHeaderValue("application/json") } },
                };
                client.credentials.ApplyTo(request.Headers);
                using var response = await client.http.SendAsync(request, HttpCompletionOption.ResponseContentRead, cancellationToken).ConfigureAwait(false);
                var bytes = await response.Content.ReadAsByteArrayAsync(cancellationToken).ConfigureAwait(false);
                if (!response.IsSuccessStatusCode)
                {
                    throw Failure(response, bytes);
                }

                var parsed = WireResponse.Parse(bytes, client.options.Api);
                if (requireAlternatives && parsed.FirstTokenAlternatives is null)
                {
                    throw new EndpointFailure("the response has no log-probabilities for the answer token", transient: true);
                }

                return parsed;
            }
        }

        private EndpointFailure Failure(HttpResponseMessage response, byte[] body)
        {
            var status = (int)response.StatusCode;
            var transient = status is 408 or 409 or 425 or 429 || status >= 500;
            var said = ServerMessage(body);
            var message = $"{status} {response.ReasonPhrase ?? response.StatusCode.ToString()}{(said.Length > 0 ? ": " + said : "")}";
            return new EndpointFailure(client.credentials.Redact(message), transient, status, RetryAfterOf(response));
        }

        private TimeSpan? RetryAfterOf(HttpResponseMessage response)
        {
            if (response.Headers.RetryAfter is not { } after)
            {
                return null;
            }

            if (after.Delta is { } delta)
            {
                return delta < TimeSpan.Zero ? TimeSpan.Zero : delta;
            }

            if (after.Date is { } date)
            {
                var wait = date - client.clock.GetUtcNow();
                return wait < TimeSpan.Zero ? TimeSpan.Zero : wait;
            }

            return null;
        }

        /// <summary>The endpoint's own explanation (<c>error.message</c>, or the start of the body), one line, at most 200 characters.</summary>
        private static string ServerMessage(byte[] body)
        {
            string text;
            try
            {
                using var document = JsonDocument.Parse(body);
                text = document.RootElement.ValueKind == JsonValueKind.Object
                       && document.RootElement.TryGetProperty("error", out var error)
                    ? error.ValueKind == JsonValueKind.Object && error.TryGetProperty("message", out var m) && m.ValueKind == JsonValueKind.String
                        ? m.GetString()!
                        : error.ToString()
                    : Encoding.UTF8.GetString(body);
            }
            catch (JsonException)
            {
                text = Encoding.UTF8.GetString(body);
            }

            text = OneLine(text);
            return text.Length <= 200 ? text : text[..200] + "...";
        }
    }

}
