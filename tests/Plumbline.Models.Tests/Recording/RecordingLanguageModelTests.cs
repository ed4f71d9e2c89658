using System.Diagnostics;
using System.Text;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;
using Plumbline.Models.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

public sealed class RecordingLanguageModelTests : IDisposable
{
    private readonly TempDirectory temp = new();

    public void Dispose() => temp.Dispose();

    private static Task<RecordingLanguageModel> Load(string path) =>
        RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);

    [Fact]
    public async Task LoadAsync_LinesWithAndWithoutKey_ReplaysRecordedResponses()
    {
        var keyed = RequestFingerprint.Of(Requests.Answer("Bats can fly."), Requests.Version);
        var path = temp.Write("rec.jsonl",
            Requests.AbductionLine("Bats are mammals.", true, 2, "they nurse their young.", "they have fur."),
            "{\"key\":\"" + keyed.Key + "\",\"request\":" + keyed.CanonicalJson
                + ",\"response\":{\"p_true\":0.83,\"p_false\":0.17,\"prompt_tokens\":12,\"completion_tokens\":1}}");

        var model = await Load(path);
        var generation = await model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 2), CancellationToken.None);
        var answer = await model.ScoreAnswersAsync(Requests.Answer("Bats can fly."), CancellationToken.None);

        Assert.Equal(2, model.Count);
        Assert.Equal(["they nurse their young.", "they have fur."], generation.Texts);
        Assert.Equal(TokenUsage.None, generation.Usage);
        Assert.Equal(0.83, answer.True);
        Assert.Equal(0.17, answer.False);
        Assert.False(answer.Estimated);
        Assert.Equal(new TokenUsage(12, 1), answer.Usage);
    }

    // The two example lines of src/Plumbline.Models/Recording/README.md; the key there was computed
    // with coreutils sha256sum over the canonical request.
    [Fact]
    public async Task LoadAsync_FormatDocumentExample_LoadsAndReplays()
    {
        var path = temp.Write("example.jsonl",
            """{"key":"f4d379ee403883e5a78a2acb4b98fe1bb62676d85314eea96769bc4c957de184","request":{"kind":"generate","purpose":"abduction","subject":"Bats are mammals.","answer":true,"n":2,"temperature":1.0,"top_p":1.0,"max_tokens":64,"stop":["\n"],"prompt_version":"1"},"response":{"texts":["they nurse their young.","they have fur."],"prompt_tokens":40,"completion_tokens":12}}""",
            """{"request":{"kind":"answer","statement":"Bats are mammals.","prompt_version":"1"},"response":{"p_true":0.83,"p_false":0.17}}""");

        var model = await RecordingLanguageModel.LoadAsync(path, "1", CancellationToken.None);
        var texts = await model.GenerateAsync(
            new GenerationRequest(GenerationPurpose.Abduction, "Bats are mammals.", true, "p", Decoding.Sampling(), 2), CancellationToken.None);
        var answer = await model.ScoreAnswersAsync(new AnswerRequest("Bats are mammals.", "p"), CancellationToken.None);

        Assert.Equal(["they nurse their young.", "they have fur."], texts.Texts);
        Assert.Equal(new TokenUsage(40, 12), texts.Usage);
        Assert.Equal(0.83, answer.True);
    }

    [Fact]
    public async Task LoadAsync_IntegerSpelledReals_SameKeyAsEngineRequest()
    {
        var line = Requests.AbductionLine("Whales are fish.", false, 1, "whales breathe air.")
            .Replace("\"temperature\":1.0,\"top_p\":1.0", "\"temperature\":1,\"top_p\":1e0", StringComparison.Ordinal);
        var model = await Load(temp.Write("rec.jsonl", line));

        var result = await model.GenerateAsync(Requests.Abduction("Whales are fish.", false, 1), CancellationToken.None);

        Assert.Equal(["whales breathe air."], result.Texts);
    }

    [Fact]
    public async Task LoadAsync_UnnormalisedProbabilities_Renormalised()
    {
        var model = await Load(temp.Write("rec.jsonl", Requests.AnswerLine("Bats can fly.", "0.6", "0.2")));

        var answer = await model.ScoreAnswersAsync(Requests.Answer("Bats can fly."), CancellationToken.None);

        Assert.Equal(0.75, answer.True, 12);
        Assert.Equal(0.25, answer.False, 12);
    }

    [Fact]
    public async Task GenerateAsync_MoreTextsThanN_ReturnsFirstN()
    {
        var model = await Load(temp.Write("rec.jsonl", Requests.AbductionLine("Bats are mammals.", true, 2, "one", "two", "three")));

        var result = await model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 2), CancellationToken.None);

        Assert.Equal(["one", "two"], result.Texts);
    }

    [Fact]
    public async Task GenerateAsync_MissingEntry_MessageNamesPurposeAnswerCountSubjectAndFile()
    {
        var model = await Load(temp.Write("rec.jsonl", Requests.AnswerLine("Bats can fly.", "0.9", "0.1")));

        var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 3), CancellationToken.None));

        Assert.Equal("no recorded response for abduction (answer True, n=3) of \"Bats are mammals.\" in rec.jsonl", error.Message);
    }

    [Fact]
    public async Task GenerateAsync_SameSubjectRecordedWithOtherN_MessagePointsAtThatLine()
    {
        var path = temp.Write("rec.jsonl",
            Requests.AnswerLine("Bats can fly.", "0.9", "0.1"),
            "",
            Requests.AbductionLine("Bats are mammals.", true, 2, "a", "b"));
        var model = await Load(path);

        var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 3), CancellationToken.None));

        Assert.EndsWith("(line 3 has it with other decoding settings, n or sample)", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task GenerateAsync_SecondSample_ReplaysItsOwnLineNotTheFirstSample()
    {
        var second = Requests.AbductionLine("Bats are mammals.", true, 1, "they have fur.")
            .Replace("\"n\":1", "\"n\":1,\"sample\":1", StringComparison.Ordinal);
        var model = await Load(temp.Write("rec.jsonl", Requests.AbductionLine("Bats are mammals.", true, 1, "they nurse their young."), second));

        var first = await model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 1), CancellationToken.None);
        var other = await model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 1) with { SampleIndex = 1 }, CancellationToken.None);
        var missing = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 1) with { SampleIndex = 2 }, CancellationToken.None));

        Assert.Equal(["they nurse their young."], first.Texts);
        Assert.Equal(["they have fur."], other.Texts);
        Assert.StartsWith("no recorded response for abduction (answer True, n=1, sample 2) of \"Bats are mammals.\"", missing.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task GenerateAsync_NegationMissing_MessageNamesNegationWithoutAnswer()
    {
        var model = await Load(temp.Write("rec.jsonl", Requests.AnswerLine("Bats can fly.", "0.9", "0.1")));

        var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Negation("Bats can fly."), CancellationToken.None));

        Assert.Equal("no recorded response for negation (n=1) of \"Bats can fly.\" in rec.jsonl", error.Message);
    }

    [Fact]
    public async Task ScoreAnswersAsync_MissingEntry_MessageNamesStatement()
    {
        var model = await Load(temp.Write("rec.jsonl", Requests.AbductionLine("Bats can fly.", true, 1, "they have wings.")));

        var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.ScoreAnswersAsync(Requests.Answer("Bats can fly."), CancellationToken.None));

        Assert.Equal("no recorded answer probabilities for \"Bats can fly.\" in rec.jsonl", error.Message);
    }

    [Fact]
    public async Task Describe_Loaded_IsRecordingAndFileName()
    {
        var model = await Load(temp.Write("demo.jsonl", Requests.AnswerLine("Bats can fly.", "0.9", "0.1")));

        Assert.Equal("recording:demo.jsonl", model.Describe);
    }

    [Fact]
    public async Task LoadAsync_DuplicateKeySameResponse_KeepsOneEntry()
    {
        var line = Requests.AnswerLine("Bats can fly.", "0.9", "0.1");

        var model = await Load(temp.Write("rec.jsonl", line, line.Replace("0.9", "9e-1", StringComparison.Ordinal)));

        Assert.Equal(1, model.Count);
    }

    [Fact]
    public async Task LoadAsync_DuplicateKeyDifferentResponse_NamesBothLines()
    {
        var path = temp.Write("rec.jsonl",
            Requests.AnswerLine("Bats can fly.", "0.9", "0.1"),
            Requests.AnswerLine("Bats can fly.", "0.8", "0.2"));

        var error = await Assert.ThrowsAsync<RecordingFormatException>(() => Load(path));

        Assert.Equal($"{path}:2: key: same request as line 1 but a different response", error.Message);
    }

    [Fact]
    public async Task LoadAsync_EmptyFile_NoEntries()
    {
        var path = temp.File("empty.jsonl");
        await File.WriteAllTextAsync(path, "");

        var model = await Load(path);

        Assert.Equal(0, model.Count);
    }

    [Fact]
    public async Task GenerateAsync_ManyParallelLookups_EachGetsItsOwnResponse()
    {
        const int subjects = 200;
        var lines = Enumerable.Range(0, subjects)
            .SelectMany(i => new[]
            {
                Requests.AbductionLine($"Statement {i}.", true, 1, $"true-{i}"),
                Requests.AbductionLine($"Statement {i}.", false, 1, $"false-{i}"),
                Requests.AnswerLine($"Statement {i}.", $"0.{i % 9 + 1}", $"0.{9 - i % 9}"),
            })
            .ToArray();
        var model = await Load(temp.Write("rec.jsonl", lines));
        var failures = 0;

        await Parallel.ForEachAsync(Enumerable.Range(0, 4000), new ParallelOptions { MaxDegreeOfParallelism = 8 }, async (k, ct) =>
        {
            var i = k % subjects;
            var answer = k % 2 == 0;
            var generation = await model.GenerateAsync(Requests.Abduction($"Statement {i}.", answer, 1), ct);
            var probabilities = await model.ScoreAnswersAsync(Requests.Answer($"Statement {i}."), ct);
            if (generation.Texts.Single() != $"{(answer ? "true" : "false")}-{i}" || Math.Abs(probabilities.True - (i % 9 + 1) / 10.0) > 1e-9)
            {
                Interlocked.Increment(ref failures);
            }
        });

        Assert.Equal(3 * subjects, model.Count);
        Assert.Equal(0, failures);
    }

    [Fact]
    public async Task LoadAsync_ThistlewickSample_EveryRequestReplaysWhatAWholeFileParseHolds()
    {
        var path = Path.Combine(AppContext.BaseDirectory, "data", "thistlewick", "recording.jsonl");

        // What the loader used to keep in memory: every line as a StreamReader reads it, parsed, the first of any repeats.
        var expected = new Dictionary<string, RecordedEntry>(StringComparer.Ordinal);
        var number = 0;
        foreach (var line in File.ReadLines(path))
        {
            number++;
            if (!string.IsNullOrWhiteSpace(line))
            {
                var entry = RecordingReader.ParseLine(path, number, PromptBook.PromptVersion, line);
                expected.TryAdd(entry.Fingerprint.Key, entry);
            }
        }

        await using var model = await RecordingLanguageModel.LoadAsync(path, PromptBook.PromptVersion, CancellationToken.None);

        Assert.Equal(expected.Count, model.Count);
        Assert.Contains(expected.Values, e => e.GenerationAsked is not null);
        Assert.Contains(expected.Values, e => e.AnswerAsked is not null);
        foreach (var entry in expected.Values)
        {
            if (entry.GenerationAsked is { } asked)
            {
                var result = await model.GenerateAsync(asked, CancellationToken.None);
                Assert.Equal(entry.Generation!.Texts.Take(asked.Count), result.Texts);
                Assert.Equal(entry.Generation.Usage, result.Usage);
            }
            else
            {
                Assert.Equal(entry.Answer, await model.ScoreAnswersAsync(entry.AnswerAsked!, CancellationToken.None));
            }
        }
    }

    [Fact]
    public async Task LoadAsync_BomCrLfBlankLinesAndMultiByteText_ReplaysEachLineAndNumbersLinesAsAnEditorDoes()
    {
        // Lines 1, 3, 5 and 7 hold requests; 2 and 6 are empty, 4 is spaces; the last has no line end.
        var text = string.Join("\r\n",
            Requests.AnswerLine("Die Bärin ist groß.", "0.7", "0.3"),
            "",
            Requests.AbductionLine("熊は哺乳類です。", true, 2, "子に乳を与える 🐻", "毛がある"),
            "   ",
            Requests.AnswerLine("Ça va — naïve café.", "0.25", "0.75"),
            "",
            Requests.AbductionLine("Bats are mammals.", false, 1, "they fly 🦇"));
        var path = temp.File("rec.jsonl");
        await File.WriteAllBytesAsync(path, [0xEF, 0xBB, 0xBF, .. Encoding.UTF8.GetBytes(text)]);

        var model = await Load(path);
        var bear = await model.GenerateAsync(Requests.Abduction("熊は哺乳類です。", true, 2), CancellationToken.None);
        var bats = await model.GenerateAsync(Requests.Abduction("Bats are mammals.", false, 1), CancellationToken.None);
        var bearMissing = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Abduction("熊は哺乳類です。", true, 3), CancellationToken.None));
        var batsMissing = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Abduction("Bats are mammals.", false, 2), CancellationToken.None));

        Assert.Equal(4, model.Count);
        Assert.Equal(0.7, (await model.ScoreAnswersAsync(Requests.Answer("Die Bärin ist groß."), CancellationToken.None)).True);
        Assert.Equal(0.25, (await model.ScoreAnswersAsync(Requests.Answer("Ça va — naïve café."), CancellationToken.None)).True);
        Assert.Equal(["子に乳を与える 🐻", "毛がある"], bear.Texts);
        Assert.Equal(["they fly 🦇"], bats.Texts);
        Assert.EndsWith("(line 3 has it with other decoding settings, n or sample)", bearMissing.Message, StringComparison.Ordinal);
        Assert.EndsWith("(line 7 has it with other decoding settings, n or sample)", batsMissing.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task LoadAsync_BomAndCrLfBeforeAMalformedLine_ErrorNamesTheLineAnEditorShows()
    {
        var text = Requests.AnswerLine("Bären können schwimmen.", "0.9", "0.1") + "\r\n\r\n" + Requests.AnswerLine("Bats can fly.", "0.9", "x");
        var path = temp.File("rec.jsonl");
        await File.WriteAllBytesAsync(path, [0xEF, 0xBB, 0xBF, .. Encoding.UTF8.GetBytes(text)]);

        var error = await Assert.ThrowsAsync<RecordingFormatException>(() => Load(path));

        Assert.StartsWith($"{path}:3: ", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task GenerateAsync_ThousandsOfTasksAtOnce_EachReadsItsOwnLine()
    {
        // Lines of many lengths with multi-byte text: a read at another line's offset or length could not parse.
        const int subjects = 300;
        static string Subject(int i) => $"Statement {i} {new string('é', i)}.";
        static string Reason(int i) => $"why-{i} {new string('熊', i % 37)}";
        var lines = Enumerable.Range(0, subjects)
            .SelectMany(i => new[]
            {
                Requests.AbductionLine(Subject(i), true, 1, Reason(i)),
                Requests.AnswerLine(Subject(i), $"0.{i % 9 + 1}", $"0.{9 - i % 9}"),
            })
            .ToArray();
        var model = await Load(temp.Write("rec.jsonl", lines));
        var start = new TaskCompletionSource(TaskCreationOptions.RunContinuationsAsynchronously);

        var lookups = Enumerable.Range(0, 3_000).Select(k => Task.Run(async () =>
        {
            await start.Task;
            var i = k * 7 % subjects;
            var generation = await model.GenerateAsync(Requests.Abduction(Subject(i), true, 1), CancellationToken.None);
            var answer = await model.ScoreAnswersAsync(Requests.Answer(Subject(i)), CancellationToken.None);
            return generation.Texts.Single() == Reason(i) && Math.Abs(answer.True - (i % 9 + 1) / 10.0) < 1e-9;
        })).ToArray();
        start.SetResult();
        var results = await Task.WhenAll(lookups);

        Assert.Equal(0, results.Count(ok => !ok));
    }

    [Fact]
    public async Task GenerateAsync_FileWrittenOverAfterLoading_FailsSayingItChanged()
    {
        var path = temp.Write("rec.jsonl",
            Requests.AnswerLine("Bats can fly.", "0.9", "0.1"),
            Requests.AbductionLine("Bats are mammals.", true, 1, "they have fur."));
        var model = await Load(path);

        // Same lengths, so line 2 still parses where it was, but it now holds another request.
        await File.WriteAllTextAsync(path, string.Join('\n',
            Requests.AnswerLine("Bats can fly.", "0.9", "0.1"),
            Requests.AbductionLine("Cats are mammals.", true, 1, "they have fur.")) + "\n");
        var error = await Assert.ThrowsAsync<ModelRequestException>(() =>
            model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 1), CancellationToken.None));

        Assert.Equal("rec.jsonl changed since it was loaded: line 2 no longer holds the request it held; load the recording again", error.Message);
    }

    [Fact]
    public async Task LoadAsync_NamedPipe_ReplaysFromACopy()
    {
        // A named pipe stands for a shell's <(zcat recording.jsonl.gz): it can be read once, and not by position.
        var pipe = temp.File("rec.pipe");
        using (var mkfifo = Process.Start("mkfifo", [pipe]))
        {
            await mkfifo.WaitForExitAsync();
            Assert.Equal(0, mkfifo.ExitCode);
        }

        var writing = Task.Run(() => File.WriteAllText(pipe,
            Requests.AnswerLine("Bats can fly.", "0.9", "0.1") + "\n" + Requests.AbductionLine("Bats are mammals.", true, 1, "they have fur.") + "\n"));
        await using var model = await Load(pipe);
        await writing;

        var generation = await model.GenerateAsync(Requests.Abduction("Bats are mammals.", true, 1), CancellationToken.None);
        var answer = await model.ScoreAnswersAsync(Requests.Answer("Bats can fly."), CancellationToken.None);

        Assert.Equal(["they have fur."], generation.Texts);
        Assert.Equal(0.9, answer.True);
    }
}
