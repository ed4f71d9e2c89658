using System.Globalization;
using System.Text.Json;

namespace Plumbline.LocalModel;

/// <summary>
/// A model folder in the layout ONNX Runtime GenAI reads, checked file by file before anything is loaded:
/// genai_config.json naming a decoder-only ONNX graph with a key/value cache, the tokenizer files, and weights
/// that fit in memory. Each failed check is one <see cref="LocalModelException"/> saying what is missing.
/// </summary>
public sealed record ModelFolder
{
    public const string ConfigFile = "genai_config.json";
    public const string TokenizerFile = "tokenizer.json";
    public const string SentencePieceFile = "tokenizer.model";
    public const string TokenizerConfigFile = "tokenizer_config.json";
    public const string ChatTemplateFile = "chat_template.jinja";

    private ModelFolder(string directory, string decoderFile, string modelType, int contextLength, int vocabularySize, long weightBytes, string? chatTemplate)
    {
        Directory = directory;
        DecoderFile = decoderFile;
        ModelType = modelType;
        ContextLength = contextLength;
        VocabularySize = vocabularySize;
        WeightBytes = weightBytes;
        ChatTemplate = chatTemplate;
    }

    /// <summary>The folder as the user named it.</summary>
    public string Directory { get; }

    /// <summary>The decoder's ONNX file name inside the folder.</summary>
    public string DecoderFile { get; }

    /// <summary>The architecture genai_config.json names ("llama", "phi3", "qwen2" ...).</summary>
    public string ModelType { get; }

    /// <summary>Tokens the model can attend to: prompt and continuation together.</summary>
    public int ContextLength { get; }

    public int VocabularySize { get; }

    /// <summary>Bytes of the decoder's ONNX file and its external weight files.</summary>
    public long WeightBytes { get; }

    /// <summary>The folder's chat template (tokenizer_config.json or chat_template.jinja); null when it has none.</summary>
    public string? ChatTemplate { get; }

    /// <summary>Checks the folder without loading the model.</summary>
    /// <param name="directory">The folder.</param>
    /// <param name="availableMemory">Bytes the model may take.</param>
    /// <exception cref="LocalModelException">Something the runtime needs is missing or wrong.</exception>
    public static ModelFolder Inspect(string directory, long availableMemory)
    {
        ArgumentException.ThrowIfNullOrEmpty(directory);
        if (!System.IO.Directory.Exists(directory))
        {
            throw new LocalModelException(directory, "folder not found");
        }

        var configPath = Path.Combine(directory, ConfigFile);
        if (!File.Exists(configPath))
        {
            throw WithoutConfig(directory);
        }

        using var config = ReadJson(directory, configPath, ConfigFile);
        var model = Member(config.RootElement, "model")
            ?? throw new LocalModelException(directory, $"{ConfigFile}: no \"model\" section");
        var type = Text(model, "type") ?? "unknown";
        if (Member(model, "encoder") is not null || Member(model, "decoder") is not { } decoder)
        {
            throw new LocalModelException(directory, $"not a decoder-only model: {ConfigFile} describes a model of type '{type}' with {(Member(model, "encoder") is null ? "no decoder" : "an encoder")}");
        }

        var decoderFile = Text(decoder, "filename")
            ?? throw new LocalModelException(directory, $"{ConfigFile}: model.decoder.filename is missing");
        var decoderPath = Path.Combine(directory, decoderFile);
        if (!File.Exists(decoderPath))
        {
            throw new LocalModelException(directory, $"no model: {ConfigFile} names '{decoderFile}', which is not there");
        }

        RequireKeyValueCache(directory, decoderFile, decoder);
        RequireTokenizer(directory);
        var weightBytes = WeightBytesOf(directory, decoderFile);
        if (weightBytes > availableMemory)
        {
            throw new LocalModelException(directory,
                $"too large for memory: the model's weights take {SystemMemory.Format(weightBytes)}, only {SystemMemory.Format(availableMemory)} is available");
        }

        var context = Number(model, "context_length")
            ?? throw new LocalModelException(directory, $"{ConfigFile}: model.context_length is missing");
        var vocabulary = Number(model, "vocab_size")
            ?? throw new LocalModelException(directory, $"{ConfigFile}: model.vocab_size is missing");
        return new ModelFolder(directory, decoderFile, type, context, vocabulary, weightBytes, FindChatTemplate(directory));
    }

    // A folder without the runtime's config may still hold an ONNX file; say whether it is a decoder at all.
    private static LocalModelException WithoutConfig(string directory)
    {
        var onnx = System.IO.Directory.EnumerateFiles(directory, "*.onnx").Order(StringComparer.Ordinal).FirstOrDefault();
        if (onnx is null)
        {
            return new LocalModelException(directory, $"no model: no {ConfigFile} and no .onnx file");
        }

        var name = Path.GetFileName(onnx);
        var signature = ReadSignature(directory, onnx, name);
        return signature.Inputs.Any(IsPastInput)
            ? new LocalModelException(directory, $"no {ConfigFile} beside the decoder '{name}': the runtime needs it to run the model")
            : new LocalModelException(directory, $"not a decoder-only model: '{name}' takes no past key/values (inputs: {string.Join(", ", signature.Inputs)})");
    }

    private static bool IsPastInput(string name) =>
        name.Contains("past", StringComparison.OrdinalIgnoreCase) || name.Contains("cache", StringComparison.OrdinalIgnoreCase);

    private static void RequireKeyValueCache(string directory, string decoderFile, JsonElement decoder)
    {
        var signature = ReadSignature(directory, Path.Combine(directory, decoderFile), decoderFile);
        var inputs = Member(decoder, "inputs");
        var outputs = Member(decoder, "outputs");
        var wanted = new (string Name, bool Input)[]
        {
            (Name(inputs, "input_ids", "input_ids"), true),
            (Name(inputs, "past_key_names", "past_key_values.%d.key").Replace("%d", "0", StringComparison.Ordinal), true),
            (Name(outputs, "logits", "logits"), false),
            (Name(outputs, "present_key_names", "present.%d.key").Replace("%d", "0", StringComparison.Ordinal), false),
        };
        foreach (var (name, input) in wanted)
        {
            if (!(input ? signature.Inputs : signature.Outputs).Contains(name, StringComparer.Ordinal))
            {
                throw new LocalModelException(directory,
                    $"not a decoder-only model with a key/value cache: '{decoderFile}' has no {(input ? "input" : "output")} '{name}'");
            }
        }
    }

    private static string Name(JsonElement? names, string key, string fallback) =>
        names is { } n ? Text(n, key) ?? fallback : fallback;

    private static void RequireTokenizer(string directory)
    {
        if (!File.Exists(Path.Combine(directory, TokenizerFile)) && !File.Exists(Path.Combine(directory, SentencePieceFile)))
        {
            throw new LocalModelException(directory, $"tokenizer missing: no {TokenizerFile} (or {SentencePieceFile})");
        }

        if (!File.Exists(Path.Combine(directory, TokenizerConfigFile)))
        {
            throw new LocalModelException(directory, $"tokenizer missing: no {TokenizerConfigFile}");
        }
    }

    // The decoder graph and its external weights (model.onnx.data, model.onnx_data ...); the loaded model
    // takes at least this much memory.
    private static long WeightBytesOf(string directory, string decoderFile) =>
        new DirectoryInfo(directory).EnumerateFiles()
            .Where(f => f.Name == decoderFile || f.Name.EndsWith(".data", StringComparison.Ordinal) || f.Name.EndsWith("_data", StringComparison.Ordinal))
            .Sum(f => f.Length);

    private static string? FindChatTemplate(string directory)
    {
        var jinja = Path.Combine(directory, ChatTemplateFile);
        if (File.Exists(jinja))
        {
            return File.ReadAllText(jinja);
        }

        using var config = ReadJson(directory, Path.Combine(directory, TokenizerConfigFile), TokenizerConfigFile);
        return Member(config.RootElement, "chat_template") switch
        {
            { ValueKind: JsonValueKind.String } text when text.GetString() is { Length: > 0 } template => template,

            // Some folders keep several named templates; the one called "default" is for plain chat.
            { ValueKind: JsonValueKind.Array } list => list.EnumerateArray()
                .Where(t => Text(t, "name") == "default")
                .Select(t => Text(t, "template"))
                .FirstOrDefault(),
            _ => null,
        };
    }

    private static OnnxSignature ReadSignature(string directory, string path, string name)
    {
        try
        {
            return OnnxSignature.Read(path);
        }
        catch (InvalidDataException e)
        {
            throw new LocalModelException(directory, $"'{name}' is not an ONNX model ({e.Message})", e);
        }
    }

    private static JsonDocument ReadJson(string directory, string path, string name)
    {
        try
        {
            return JsonDocument.Parse(File.ReadAllBytes(path), new JsonDocumentOptions { AllowTrailingCommas = true, CommentHandling = JsonCommentHandling.Skip });
        }
        catch (JsonException e)
        {
            throw new LocalModelException(directory, $"{name}: not valid JSON (line {e.LineNumber + 1}: {e.Message.Split('.')[0]})", e);
        }
    }

    private static JsonElement? Member(JsonElement element, string name) =>
        element.ValueKind == JsonValueKind.Object && element.TryGetProperty(name, out var value) && value.ValueKind != JsonValueKind.Null ? value : null;

    private static string? Text(JsonElement element, string name) =>
        Member(element, name) is { ValueKind: JsonValueKind.String } value ? value.GetString() : null;

    private static int? Number(JsonElement element, string name) =>
        Member(element, name) is { ValueKind: JsonValueKind.Number } value && value.TryGetInt32(out var number) && number > 0 ? number : null;

    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture, $"{Directory} ({ModelType}, {SystemMemory.Format(WeightBytes)}, context {ContextLength})");
}
