using System.Collections.Concurrent;
using System.Diagnostics;
using System.Net.WebSockets;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using System.Text.RegularExpressions;

namespace Plumbline.Cli.Tests.EndToEnd;

/// <summary>
/// A real headless Chromium (Debian's <c>chromium</c>, which .ci/run installs) driven over its DevTools protocol on
/// loopback: open a page, evaluate script, type, collect console errors and uncaught exceptions, take a screenshot.
/// </summary>
internal sealed partial class HeadlessBrowser : IAsyncDisposable
{
    private readonly Process process;
    private readonly ClientWebSocket socket = new();
    private readonly ConcurrentDictionary<int, TaskCompletionSource<JsonNode>> pending = new();
    private readonly CancellationTokenSource closing = new();
    private readonly string profile;
    private Task? receiving;
    private int nextId;
    private string? session;

    private HeadlessBrowser(Process process, string profile)
    {
        this.process = process;
        this.profile = profile;
    }

    /// <summary>Console errors, uncaught exceptions and error log entries of the page, as text.</summary>
    public ConcurrentQueue<string> Errors { get; } = new();

    private TaskCompletionSource Loaded { get; set; } = new(TaskCreationOptions.RunContinuationsAsynchronously);

    public static async Task<HeadlessBrowser> StartAsync()
    {
        var profile = Path.Combine(Path.GetTempPath(), "plumb-chromium-" + Guid.NewGuid().ToString("N"));
        var start = new ProcessStartInfo("chromium")
        {
            RedirectStandardError = true,
            RedirectStandardOutput = true,
            UseShellExecute = false,
        };
        foreach (var arg in new[]
        {
            "--headless=new", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--no-first-run",
            "--disable-extensions", "--remote-debugging-address=127.0.0.1", "--remote-debugging-port=0",
            $"--user-data-dir={profile}", "--window-size=1280,2000", "about:blank",
        })
        {
            start.ArgumentList.Add(arg);
        }

        var process = Process.Start(start) ?? throw new InvalidOperationException("chromium did not start");
        var browser = new HeadlessBrowser(process, profile);
        using var timeout = new CancellationTokenSource(TimeSpan.FromSeconds(60));
        string? endpoint = null;
        while (endpoint is null && await process.StandardError.ReadLineAsync(timeout.Token) is { } line)
        {
            if (DevToolsLine().Match(line) is { Success: true } match)
            {
                endpoint = match.Groups[1].Value;
            }
        }

        if (endpoint is null)
        {
            await browser.DisposeAsync();
            throw new InvalidOperationException("chromium printed no DevTools address");
        }

        _ = process.StandardError.ReadToEndAsync(CancellationToken.None);
        await browser.socket.ConnectAsync(new Uri(endpoint), timeout.Token);
        browser.receiving = browser.ReceiveAsync();
        var target = await browser.SendAsync("Target.createTarget", new JsonObject { ["url"] = "about:blank" }, toPage: false);
        var attached = await browser.SendAsync("Target.attachToTarget", new JsonObject { ["targetId"] = target["targetId"]!.GetValue<string>(), ["flatten"] = true }, toPage: false);
        browser.session = attached["sessionId"]!.GetValue<string>();
        await browser.SendAsync("Runtime.enable");
        await browser.SendAsync("Log.enable");
        await browser.SendAsync("Page.enable");
        return browser;
    }

    public async Task OpenAsync(string path)
    {
        Loaded = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);
        await SendAsync("Page.navigate", new JsonObject { ["url"] = new Uri(path).AbsoluteUri });
        await Loaded.Task.WaitAsync(TimeSpan.FromSeconds(60));
    }

    /// <summary>The value of a JavaScript expression (JSON-serialisable).</summary>
    public async Task<JsonNode?> EvaluateAsync(string expression)
    {
        var result = await SendAsync("Runtime.evaluate", new JsonObject { ["expression"] = expression, ["returnByValue"] = true, ["awaitPromise"] = true });
        if (result["exceptionDetails"] is { } exception)
        {
            throw new InvalidOperationException($"page script failed: {exception.ToJsonString()}");
        }

        return result["result"]?["value"];
    }

    /// <summary>Types text into the focused element, as a keyboard would.</summary>
    public Task TypeAsync(string text) => SendAsync("Input.insertText", new JsonObject { ["text"] = text });

    public async Task ScreenshotAsync(string path)
    {
        var shot = await SendAsync("Page.captureScreenshot", new JsonObject { ["format"] = "png", ["captureBeyondViewport"] = true });
        Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        await File.WriteAllBytesAsync(path, Convert.FromBase64String(shot["data"]!.GetValue<string>()));
    }

    public async ValueTask DisposeAsync()
    {
        await closing.CancelAsync();
        if (!process.HasExited)
        {
            process.Kill(entireProcessTree: true);
            await process.WaitForExitAsync();
        }

        if (receiving is not null)
        {
            try
            {
                await receiving;
            }
            catch (Exception e) when (e is OperationCanceledException or WebSocketException)
            {
                // The browser is gone; nothing more to read.
            }
        }

        socket.Dispose();
        process.Dispose();
        closing.Dispose();
        try
        {
            Directory.Delete(profile, recursive: true);
        }
        catch (IOException)
        {
            // A leftover profile folder in the temp folder is harmless.
        }
    }

    private async Task<JsonNode> SendAsync(string method, JsonObject? parameters = null, bool toPage = true)
    {
        var id = Interlocked.Increment(ref nextId);
        var message = new JsonObject { ["id"] = id, ["method"] = method, ["params"] = parameters ?? new JsonObject() };
        if (toPage)
        {
            message["sessionId"] = session;
        }

        var reply = new TaskCompletionSource<JsonNode>(TaskCreationOptions.RunContinuationsAsynchronously);
        pending[id] = reply;
        await socket.SendAsync(Encoding.UTF8.GetBytes(message.ToJsonString()), WebSocketMessageType.Text, true, closing.Token);
        return await reply.Task.WaitAsync(TimeSpan.FromSeconds(60));
    }

    private async Task ReceiveAsync()
    {
        var buffer = new byte[1 << 16];
        using var message = new MemoryStream();
        while (!closing.IsCancellationRequested && socket.State == WebSocketState.Open)
        {
            var received = await socket.ReceiveAsync(buffer, closing.Token);
            message.Write(buffer, 0, received.Count);
            if (!received.EndOfMessage)
            {
                continue;
            }

            var node = JsonNode.Parse(message.ToArray())!;
            message.SetLength(0);
            if (node["id"] is { } id && pending.TryRemove(id.GetValue<int>(), out var reply))
            {
                if (node["error"] is { } error)
                {
                    reply.SetException(new InvalidOperationException(error.ToJsonString()));
                }
                else
                {
                    reply.SetResult(node["result"] ?? new JsonObject());
                }

                continue;
            }

            Observe(node["method"]?.GetValue<string>(), node["params"]);
        }
    }

    private void Observe(string? method, JsonNode? parameters)
    {
        switch (method)
        {
            case "Page.loadEventFired":
                Loaded.TrySetResult();
                break;
            case "Runtime.exceptionThrown":
                Errors.Enqueue("exception: " + parameters?["exceptionDetails"]?.ToJsonString());
                break;
            case "Runtime.consoleAPICalled" when (parameters?["type"]?.GetValue<string>() is "error" or "assert"):
                Errors.Enqueue("console: " + parameters["args"]?.ToJsonString());
                break;
            case "Log.entryAdded" when (parameters?["entry"]?["level"]?.GetValue<string>() == "error"):
                Errors.Enqueue("log: " + parameters["entry"]?["text"]?.GetValue<string>());
                break;
        }
    }

    [GeneratedRegex(@"DevTools listening on (ws://\S+)")]
    private static partial Regex DevToolsLine();
}
