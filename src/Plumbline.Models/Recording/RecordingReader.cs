using System.Runtime.CompilerServices;
using System.Text.Json;
using Microsoft.Win32.SafeHandles;
using Plumbline.Core.Coherence;
using Plumbline.Core.Language;

namespace Plumbline.Models.Recording;

/// <summary>
/// Reads and validates a whole recording. Every problem is reported as a
/// <see cref="RecordingFormatException"/> naming file, line and field, at load time, so that a
/// broken hand-written recording fails before any claim is judged.
/// </summary>
internal static class RecordingReader
{
    private static readonly string[] LineFields = ["key", "request", "response"];
    private static readonly string[] GenerateFields =
        ["kind", "purpose", "subject", "answer", "n", "temperature", "top_p", "max_tokens", "stop", "sample", "prompt_version"];
    private static readonly string[] AnswerFields = ["kind", "statement", "prompt_version"];
    private static readonly string[] GenerationResponseFields = ["texts", "prompt_tokens", "completion_tokens"];
    private static readonly string[] AnswerResponseFields = ["p_true", "p_false", "estimated", "prompt_tokens", "completion_tokens"];

    /// <summary>Every distinct request of the file, parsed, in file order: what the response cache imports.</summary>
    public static async Task<IReadOnlyList<RecordedEntry>> ReadAsync(string path, string promptVersion, CancellationToken cancellationToken)
    {
        var entries = new List<RecordedEntry>();
        var byKey = new Dictionary<string, RecordedEntry>(StringComparer.Ordinal);
        using var file = await RecordingFileLines.OpenAsync(path, cancellationToken).ConfigureAwait(false);
        await foreach (var (entry, _) in ParseAllAsync(file, path, promptVersion, cancellationToken).ConfigureAwait(false))
        {
            if (byKey.TryGetValue(entry.Fingerprint.Key, out var earlier))
            {
                CheckRepeat(path, earlier, entry);
                continue;
            }

            byKey.Add(entry.Fingerprint.Key, entry);
            entries.Add(entry);
        }

        return entries;
    }

    /// <summary>Parses and validates every line of the file that is not blank, with its position.</summary>
    /// <exception cref="RecordingFormatException">A line is malformed.</exception>
    public static async IAsyncEnumerable<(RecordedEntry Entry, LinePosition Position)> ParseAllAsync(
        SafeFileHandle file, string path, string promptVersion, [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        await foreach (var (position, text) in RecordingFileLines.ReadAllAsync(file, path, cancellationToken).ConfigureAwait(false))
        {
            if (!string.IsNullOrWhiteSpace(text))
            {
                yield return (new LineParser(path, position.Number, promptVersion).Parse(text), position);
            }
        }
    }

    /// <summary>A request recorded twice must have the same response both times (compared in one spelling, so
    /// <c>0.9</c> and <c>9e-1</c> are the same).</summary>
    /// <exception cref="RecordingFormatException">The responses differ; the message names both lines.</exception>
    public static void CheckRepeat(string path, RecordedEntry earlier, RecordedEntry later)
    {
        if (earlier.ResponseJson != later.ResponseJson)
        {
            throw new RecordingFormatException(path, later.Line, "key", $"same request as line {earlier.Line} but a different response");
        }
    }

    /// <summary>Parses and validates one line, as <see cref="ReadAsync"/> does for each line of a file.</summary>
    /// <exception cref="RecordingFormatException">The line is malformed.</exception>
    public static RecordedEntry ParseLine(string file, int line, string promptVersion, string text) =>
        new LineParser(file, line, promptVersion).Parse(text);

    /// <summary>What a request is about, without its settings: lets a failed lookup point at a
    /// line that holds the same question asked with other settings.</summary>
    public static string TopicOf(string kind, string purpose, string text, bool? answer) =>
        string.Join('\u001f', kind, purpose, text, answer?.ToString() ?? "-");

    private sealed class LineParser(string file, int line, string promptVersion)
    {
        public RecordedEntry Parse(string text)
        {
            JsonDocument document;
            try
            {
                document = JsonDocument.Parse(text);
            }
            catch (JsonException e)
            {
                throw new RecordingFormatException(file, line, null, $"invalid JSON at byte {e.BytePositionInLine + 1} of the line");
            }

            using (document)
            {
                var root = document.RootElement;
                if (root.ValueKind != JsonValueKind.Object)
                {
                    throw Error(null, "expected a JSON object with \"request\" and \"response\"");
                }

                CheckFields(root, null, LineFields);
                var request = RequireObject(root, null, "request");
                var kind = RequireString(request, "request", "kind");
                return kind switch
                {
                    RequestFingerprint.GenerateKind => ParseGeneration(root, request),
                    RequestFingerprint.AnswerKind => ParseAnswer(root, request),
                    _ => throw Error("request.kind", $"unknown kind \"{kind}\" (expected \"generate\" or \"answer\")"),
                };
            }
        }

        private RecordedEntry ParseGeneration(JsonElement root, JsonElement request)
        {
            CheckFields(request, "request", GenerateFields);
            var purposeName = RequireString(request, "request", "purpose");
            if (!RequestFingerprint.TryParsePurpose(purposeName, out var purpose))
            {
                throw Error("request.purpose", $"unknown purpose \"{purposeName}\" (expected \"abduction\" or \"negation\")");
            }

            var subject = RequireString(request, "request", "subject");
            bool? answer = request.TryGetProperty("answer", out var answerElement)
                ? answerElement.ValueKind switch
                {
                    JsonValueKind.True => true,
                    JsonValueKind.False => false,
                    JsonValueKind.Null => null,
                    _ => throw Error("request.answer", "expected true, false or null"),
                }
                : null;
            var count = RequireInteger(request, "request", "n", minimum: 1);
            var sample = request.TryGetProperty("sample", out _) ? RequireInteger(request, "request", "sample", minimum: 0) : 0;
            var temperature = RequireNumber(request, "request", "temperature", 0, double.MaxValue, "a number of at least 0");
            var topP = RequireNumber(request, "request", "top_p", double.Epsilon, 1, "a number above 0 and at most 1");
            var maxTokens = RequireInteger(request, "request", "max_tokens", minimum: 1);
            var stop = RequireStrings(request, "request", "stop");
            var decoding = new Decoding(temperature, topP, maxTokens, stop);
            var fingerprint = RequestFingerprint.ForGeneration(
                purpose, subject, answer, count, decoding, RequirePromptVersion(request), sample);
            CheckKey(root, fingerprint);

            var response = RequireObject(root, null, "response");
            CheckFields(response, "response", GenerationResponseFields);
            var texts = RequireStrings(response, "response", "texts");
            if (texts.Length < count)
            {
                throw Error("response.texts", $"expected at least {count} texts (n), found {texts.Length}");
            }

            var result = new GenerationResult(texts, ReadUsage(response));
            var asked = new GenerationRequest(purpose, subject, answer, PromptBook.Render(purpose, subject, answer), decoding, count, sample);
            return new RecordedEntry(fingerprint, line,
                TopicOf(RequestFingerprint.GenerateKind, purposeName, subject, answer),
                result, null, RecordingLine.Response(result), asked, null);
        }

        private RecordedEntry ParseAnswer(JsonElement root, JsonElement request)
        {
            CheckFields(request, "request", AnswerFields);
            var statement = RequireString(request, "request", "statement");
            var fingerprint = RequestFingerprint.ForAnswer(statement, RequirePromptVersion(request));
            CheckKey(root, fingerprint);

            var response = RequireObject(root, null, "response");
            CheckFields(response, "response", AnswerResponseFields);
            const string Probability = "a number between 0 and 1";
            var pTrue = RequireNumber(response, "response", "p_true", 0, 1, Probability);
            var pFalse = RequireNumber(response, "response", "p_false", 0, 1, Probability);
            if (pTrue + pFalse <= 0)
            {
                throw Error("response.p_false", "p_true and p_false are both 0");
            }

            var estimated = false;
            if (response.TryGetProperty("estimated", out var estimatedElement))
            {
                estimated = estimatedElement.ValueKind switch
                {
                    JsonValueKind.True => true,
                    JsonValueKind.False => false,
                    _ => throw Error("response.estimated", "expected true or false"),
                };
            }

            // Probabilities that already sum to 1 are kept bit for bit, so that a recording written
            // from a live run replays exactly what that run saw.
            var usage = ReadUsage(response);
            var probabilities = Math.Abs(pTrue + pFalse - 1) <= 1e-9
                ? new AnswerProbabilities(pTrue, pFalse, estimated, usage)
                : AnswerProbabilities.FromRaw(pTrue, pFalse, estimated, usage);
            return new RecordedEntry(fingerprint, line,
                TopicOf(RequestFingerprint.AnswerKind, "", statement, null),
                null, probabilities, RecordingLine.Response(probabilities), null, new AnswerRequest(statement, PromptBook.Answer(statement)));
        }

        private string RequirePromptVersion(JsonElement request)
        {
            var version = RequireString(request, "request", "prompt_version");
            if (version != promptVersion)
            {
                throw Error("request.prompt_version",
                    $"recorded for prompt version \"{version}\", but this build uses \"{promptVersion}\"; record it again");
            }

            return version;
        }

        private void CheckKey(JsonElement root, RequestFingerprint fingerprint)
        {
            if (!root.TryGetProperty("key", out var key))
            {
                return;
            }

            if (key.ValueKind != JsonValueKind.String)
            {
                throw Error("key", "expected a string");
            }

            if (key.GetString() != fingerprint.Key)
            {
                throw Error("key", $"does not match the request (its key is {fingerprint.Key}); fix or remove it");
            }
        }

        private TokenUsage ReadUsage(JsonElement response) => new(
            OptionalCount(response, "prompt_tokens"),
            OptionalCount(response, "completion_tokens"));

        private int OptionalCount(JsonElement response, string name) =>
            response.TryGetProperty(name, out _) ? RequireInteger(response, "response", name, minimum: 0) : 0;

        private void CheckFields(JsonElement element, string? parent, string[] allowed)
        {
            var seen = new HashSet<string>(StringComparer.Ordinal);
            foreach (var property in element.EnumerateObject())
            {
                var path = Path(parent, property.Name);
                if (Array.IndexOf(allowed, property.Name) < 0)
                {
                    throw Error(path, "unknown field");
                }

                if (!seen.Add(property.Name))
                {
                    throw Error(path, "appears twice");
                }
            }
        }

        private JsonElement Require(JsonElement parent, string? parentPath, string name)
        {
            if (!parent.TryGetProperty(name, out var value))
            {
                throw Error(Path(parentPath, name), "missing");
            }

            return value;
        }

        private JsonElement RequireObject(JsonElement parent, string? parentPath, string name)
        {
            var value = Require(parent, parentPath, name);
            return value.ValueKind == JsonValueKind.Object ? value : throw Error(Path(parentPath, name), "expected an object");
        }

        private string RequireString(JsonElement parent, string parentPath, string name)
        {
            var value = Require(parent, parentPath, name);
            return value.ValueKind == JsonValueKind.String
                ? value.GetString()!
                : throw Error(Path(parentPath, name), "expected a string");
        }

        private string[] RequireStrings(JsonElement parent, string parentPath, string name)
        {
            var path = Path(parentPath, name);
            var value = Require(parent, parentPath, name);
            if (value.ValueKind != JsonValueKind.Array)
            {
                throw Error(path, "expected an array of strings");
            }

            var strings = new string[value.GetArrayLength()];
            var i = 0;
            foreach (var item in value.EnumerateArray())
            {
                strings[i] = item.ValueKind == JsonValueKind.String
                    ? item.GetString()!
                    : throw Error($"{path}[{i}]", "expected a string");
                i++;
            }

            return strings;
        }

        private int RequireInteger(JsonElement parent, string parentPath, string name, int minimum)
        {
            var value = Require(parent, parentPath, name);
            return value.ValueKind == JsonValueKind.Number && value.TryGetInt32(out var number) && number >= minimum
                ? number
                : throw Error(Path(parentPath, name), $"expected a whole number of at least {minimum}");
        }

        private double RequireNumber(JsonElement parent, string parentPath, string name, double minimum, double maximum, string expected)
        {
            var value = Require(parent, parentPath, name);
            return value.ValueKind == JsonValueKind.Number && value.TryGetDouble(out var number)
                   && double.IsFinite(number) && number >= minimum && number <= maximum
                ? number
                : throw Error(Path(parentPath, name), $"expected {expected}");
        }

        private static string Path(string? parent, string name) => parent is null ? name : $"{parent}.{name}";

        private RecordingFormatException Error(string? field, string problem) => new(file, line, field, problem);
    }
}
