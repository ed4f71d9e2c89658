using System.Text.Json;
using Plumbline.Core.Language;
using Plumbline.Models.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

public sealed class RecordingWriterTests : IDisposable
{
    private readonly TempDirectory temp = new();

    public void Dispose() => temp.Dispose();

    [Fact]
    public async Task WriteAsync_ThenLoad_ReplaysExactlyWhatWasWritten()
    {
        var path = temp.File("rec.jsonl");
        var abduction = Requests.Abduction("Ein \"Wal\" ist kein Fisch – oder?", false, 2, Decoding.Sampling(0.95, 0.7, 48));
        var written = new GenerationResult(["er atmet Luft,\nund säugt.", "emoji 🐋 and \\ backslash"], new TokenUsage(31, 17));
        var negation = Requests.Negation("Bats can fly.");
        var negated = new GenerationResult(["Bats cannot fly."], TokenUsage.None);
        var answer = Requests.Answer("Bats can fly.");
        var probabilities = new AnswerProbabilities(0.7, 0.30000000000000004, true, new TokenUsage(9, 0));

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            await writer.WriteAsync(abduction, written, CancellationToken.None);
            await writer.WriteAsync(negation, negated, CancellationToken.None);
            await writer.WriteAsync(answer, probabilities, CancellationToken.None);
        }

        var model = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        var replayed = await model.GenerateAsync(abduction with { Prompt = "another rendering" }, CancellationToken.None);
        var replayedNegation = await model.GenerateAsync(negation, CancellationToken.None);
        var replayedAnswer = await model.ScoreAnswersAsync(answer, CancellationToken.None);

        Assert.Equal(written.Texts, replayed.Texts);
        Assert.Equal(written.Usage, replayed.Usage);
        Assert.Equal(negated.Texts, replayedNegation.Texts);
        Assert.Equal(probabilities, replayedAnswer);
    }

    [Fact]
    public async Task WriteAsync_Line_HasKeyCanonicalRequestAndResponseInFormatOrder()
    {
        var path = temp.File("rec.jsonl");
        var request = Requests.Abduction("Bats are mammals.", true, 1);

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            await writer.WriteAsync(request, new GenerationResult(["they nurse."], TokenUsage.None), CancellationToken.None);
        }

        var fingerprint = RequestFingerprint.Of(request, Requests.Version);
        var text = await File.ReadAllTextAsync(path);
        Assert.Equal(
            "{\"key\":\"" + fingerprint.Key + "\",\"request\":" + fingerprint.CanonicalJson + ",\"response\":{\"texts\":[\"they nurse.\"]}}\n",
            text);
    }

    [Fact]
    public async Task WriteAsync_BeforeDispose_LineAlreadyOnDisk()
    {
        var path = temp.File("rec.jsonl");
        await using var writer = RecordingWriter.Create(path, Requests.Version);

        await writer.WriteAsync(Requests.Answer("Bats can fly."), AnswerProbabilities.FromRaw(0.9, 0.1), CancellationToken.None);

        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite);
        using var reader = new StreamReader(stream);
        var line = await reader.ReadLineAsync();
        Assert.NotNull(line);
        using var parsed = JsonDocument.Parse(line);
        Assert.Equal("Bats can fly.", parsed.RootElement.GetProperty("request").GetProperty("statement").GetString());
    }

    [Fact]
    public async Task WriteAsync_ManyConcurrentWriters_EveryLineWholeAndLoadable()
    {
        var path = temp.File("rec.jsonl");
        const int count = 300;

        await using (var writer = RecordingWriter.Create(path, Requests.Version))
        {
            await Parallel.ForEachAsync(Enumerable.Range(0, count), new ParallelOptions { MaxDegreeOfParallelism = 8 }, async (i, ct) =>
            {
                var text = new string('x', i * 7) + i;
                await writer.WriteAsync(Requests.Abduction($"Statement {i}.", i % 2 == 0, 1), new GenerationResult([text], TokenUsage.None), ct);
            });
        }

        var model = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        Assert.Equal(count, model.Count);
        Assert.Equal(count, (await File.ReadAllLinesAsync(path)).Length);
        var sample = await model.GenerateAsync(Requests.Abduction("Statement 123.", false, 1), CancellationToken.None);
        Assert.Equal(new string('x', 123 * 7) + 123, sample.Texts.Single());
    }

    [Fact]
    public void Create_ExistingFileWithoutOverwrite_Throws()
    {
        var path = temp.Write("rec.jsonl", "keep me");

        Assert.Throws<IOException>(() => RecordingWriter.Create(path, Requests.Version));
        Assert.Equal("keep me\n", File.ReadAllText(path));
    }

    [Fact]
    public async Task Create_ExistingFileWithOverwrite_StartsEmpty()
    {
        var path = temp.Write("rec.jsonl", "old");

        await using (RecordingWriter.Create(path, Requests.Version, overwrite: true))
        {
        }

        Assert.Equal("", await File.ReadAllTextAsync(path));
    }

    [Fact]
    public async Task WriteAsync_FewerTextsThanN_Rejected()
    {
        await using var writer = RecordingWriter.Create(temp.File("rec.jsonl"), Requests.Version);

        await Assert.ThrowsAsync<ArgumentException>(() =>
            writer.WriteAsync(Requests.Abduction("S.", true, 3), new GenerationResult(["a"], TokenUsage.None), CancellationToken.None));
    }
}
