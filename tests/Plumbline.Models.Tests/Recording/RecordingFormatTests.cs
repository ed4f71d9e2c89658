using Plumbline.Core.Language;
using Plumbline.Models.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

/// <summary>Every malformed line must be reported as "file:line: field: problem" before replay starts.</summary>
public sealed class RecordingFormatTests : IDisposable
{
    private const string Good = """{"request":{"kind":"answer","statement":"Bats can fly.","prompt_version":"test-1"},"response":{"p_true":0.9,"p_false":0.1}}""";
    private const string Gen = """{"kind":"generate","purpose":"abduction","subject":"S.","answer":true,"n":2,"temperature":1.0,"top_p":1.0,"max_tokens":64,"stop":["\n"],"prompt_version":"test-1"}""";
    private const string Ans = """{"kind":"answer","statement":"S.","prompt_version":"test-1"}""";

    private readonly TempDirectory temp = new();

    public void Dispose() => temp.Dispose();

    public static TheoryData<string, string?, string> Malformed() => new()
    {
        { """{"request": """, null, "invalid JSON at byte" },
        { "[1,2]", null, "expected a JSON object" },
        { """{"response":{"p_true":0.9,"p_false":0.1}}""", "request", "missing" },
        { """{"request":{"kind":"answer","statement":"S.","prompt_version":"test-1"}}""", "response", "missing" },
        { """{"request":[],"response":{}}""", "request", "expected an object" },
        { """{"request":{"kind":"ask"},"response":{}}""", "request.kind", "unknown kind \"ask\" (expected \"generate\" or \"answer\")" },
        { """{"request":{"statement":"S."},"response":{}}""", "request.kind", "missing" },
        { """{"note":"x","request":""" + Ans + ""","response":{"p_true":0.9,"p_false":0.1}}""", "note", "unknown field" },
        { """{"request":""" + Ans.Replace("\"statement\":\"S.\",", "", StringComparison.Ordinal) + ""","response":{"p_true":0.9,"p_false":0.1}}""", "request.statement", "missing" },
        { """{"request":""" + Ans.Replace("\"S.\"", "3", StringComparison.Ordinal) + ""","response":{"p_true":0.9,"p_false":0.1}}""", "request.statement", "expected a string" },
        { """{"request":""" + Ans.Replace("test-1", "test-0", StringComparison.Ordinal) + ""","response":{"p_true":0.9,"p_false":0.1}}""", "request.prompt_version", "recorded for prompt version \"test-0\", but this build uses \"test-1\"" },
        { """{"request":""" + Ans + ""","response":{"p_true":1.5,"p_false":0.1}}""", "response.p_true", "expected a number between 0 and 1" },
        { """{"request":""" + Ans + ""","response":{"p_true":"high","p_false":0.1}}""", "response.p_true", "expected a number between 0 and 1" },
        { """{"request":""" + Ans + ""","response":{"p_true":0.9}}""", "response.p_false", "missing" },
        { """{"request":""" + Ans + ""","response":{"p_true":0,"p_false":0}}""", "response.p_false", "p_true and p_false are both 0" },
        { """{"request":""" + Ans + ""","response":{"p_true":0.9,"p_false":0.1,"estimated":1}}""", "response.estimated", "expected true or false" },
        { """{"request":""" + Ans + ""","response":{"p_true":0.9,"p_false":0.1,"prompt_tokens":-1}}""", "response.prompt_tokens", "expected a whole number of at least 0" },
        { """{"request":""" + Ans + ""","response":{"p_true":0.9,"p_false":0.1,"texts":[]}}""", "response.texts", "unknown field" },
        { """{"key":42,"request":""" + Ans + ""","response":{"p_true":0.9,"p_false":0.1}}""", "key", "expected a string" },
        { """{"request":""" + Gen.Replace("abduction", "deduction", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.purpose", "unknown purpose \"deduction\"" },
        { """{"request":""" + Gen.Replace("\"answer\":true", "\"answer\":\"yes\"", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.answer", "expected true, false or null" },
        { """{"request":""" + Gen.Replace("\"n\":2", "\"n\":0", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.n", "expected a whole number of at least 1" },
        { """{"request":""" + Gen.Replace("\"n\":2", "\"n\":2.5", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.n", "expected a whole number of at least 1" },
        { """{"request":""" + Gen.Replace("\"temperature\":1.0", "\"temperature\":\"hot\"", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.temperature", "expected a number of at least 0" },
        { """{"request":""" + Gen.Replace("\"top_p\":1.0", "\"top_p\":0", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.top_p", "expected a number above 0 and at most 1" },
        { """{"request":""" + Gen.Replace("\"max_tokens\":64,", "", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.max_tokens", "missing" },
        { """{"request":""" + Gen.Replace("[\"\\n\"]", "[1]", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.stop[0]", "expected a string" },
        { """{"request":""" + Gen.Replace("\"n\":2", "\"n\":2,\"prompt\":\"x\"", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.prompt", "unknown field" },
        { """{"request":""" + Gen.Replace("\"n\":2", "\"n\":2,\"n\":2", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.n", "appears twice" },
        { """{"request":""" + Gen + ""","response":{"texts":["a"]}}""", "response.texts", "expected at least 2 texts (n), found 1" },
        { """{"request":""" + Gen.Replace("\"n\":2", "\"n\":2,\"sample\":-1", StringComparison.Ordinal) + ""","response":{"texts":["a","b"]}}""", "request.sample", "expected a whole number of at least 0" },
        { """{"request":""" + Gen + ""","response":{"texts":["a",null]}}""", "response.texts[1]", "expected a string" },
        { """{"request":""" + Gen + ""","response":{"texts":"a"}}""", "response.texts", "expected an array of strings" },
        { """{"request":""" + Gen + ""","response":{"p_true":0.9,"p_false":0.1}}""", "response.p_true", "unknown field" },
    };

    [Theory]
    [MemberData(nameof(Malformed))]
    public async Task LoadAsync_MalformedLine_OneLineErrorNamesFileLineAndField(string line, string? field, string problem)
    {
        // A good line, a blank line, then the bad one: the reported line number counts blank lines too.
        var path = temp.Write("rec.jsonl", Good, "", line);

        var error = await Assert.ThrowsAsync<RecordingFormatException>(() =>
            RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None));

        Assert.Equal(path, error.File);
        Assert.Equal(3, error.Line);
        Assert.Equal(field, error.Field);
        var prefix = field is null ? $"{path}:3: " : $"{path}:3: {field}: ";
        Assert.StartsWith(prefix + problem, error.Message, StringComparison.Ordinal);
        Assert.DoesNotContain('\n', error.Message);
    }

    [Fact]
    public async Task LoadAsync_WrongKey_ErrorGivesTheComputedKey()
    {
        var computed = RequestFingerprint.ForAnswer("S.", Requests.Version).Key;
        var wrong = new string('0', 64);
        var path = temp.Write("rec.jsonl", "{\"key\":\"" + wrong + "\",\"request\":" + Ans + ",\"response\":{\"p_true\":0.9,\"p_false\":0.1}}");

        var error = await Assert.ThrowsAsync<RecordingFormatException>(() =>
            RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None));

        Assert.Equal($"{path}:1: key: does not match the request (its key is {computed}); fix or remove it", error.Message);
    }

    [Fact]
    public async Task LoadAsync_CorrectKey_Accepted()
    {
        var computed = RequestFingerprint.ForAnswer("S.", Requests.Version).Key;
        var path = temp.Write("rec.jsonl", "{\"key\":\"" + computed + "\",\"request\":" + Ans + ",\"response\":{\"p_true\":0.9,\"p_false\":0.1}}");

        var model = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);

        Assert.Equal(1, model.Count);
    }

    [Fact]
    public async Task LoadAsync_MissingFile_Throws()
    {
        await Assert.ThrowsAsync<FileNotFoundException>(() =>
            RecordingLanguageModel.LoadAsync(temp.File("absent.jsonl"), Requests.Version, CancellationToken.None));
    }
}
