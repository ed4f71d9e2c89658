namespace Plumbline.Nli;

/// <summary>
/// Reads the description of a model directory: our nli-model.json first; failing that a config.json
/// with id2label as exported alongside most sequence-pair classifiers.
/// </summary>
internal static class NliModelCardReader
{
    public const string CardFileName = "nli-model.json";
    public const string ConfigFileName = "config.json";
    public const string TokenizerConfigFileName = "tokenizer_config.json";
    public const string WordPieceVocabulary = "vocab.txt";
    public const string BpeVocabulary = "vocab.json";
    public const string BpeMerges = "merges.txt";

    // Encoders of the BERT family are trained with at most 512 positions (common practice).
    private const int DefaultMaxLength = 512;

    // Below this a pair cannot hold its special tokens and a few words of each side.
    private const int SmallestMaxLength = 8;

    public static NliModelCard Read(string directory)
    {
        if (!Directory.Exists(directory))
        {
            throw new NliModelException(directory, "model directory not found");
        }

        var cardFile = Path.Combine(directory, CardFileName);
        if (File.Exists(cardFile))
        {
            return FromCard(directory, JsonFields.Parse(cardFile));
        }

        var configFile = Path.Combine(directory, ConfigFileName);
        if (File.Exists(configFile))
        {
            return FromConfig(directory, JsonFields.Parse(configFile));
        }

        throw new NliModelException(directory, $"no {CardFileName} or {ConfigFileName} describing the model");
    }

    private static NliModelCard FromCard(string directory, JsonFields card)
    {
        var tokenizer = card.String("tokenizer") is { } named ? ParseTokenizer(card, named) : DetectTokenizer(directory);
        var vocabulary = card.String("vocabulary") ?? DefaultVocabulary(tokenizer);
        var merges = tokenizer == NliTokenizerKind.ByteLevelBpe ? card.String("merges") ?? BpeMerges : null;
        var labels = card.Strings("labels") ?? throw card.Wrong("labels", "present: the output classes in order");
        return new NliModelCard(
            card.String("name") ?? Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(directory))),
            card.String("architecture") ?? "bert",
            tokenizer,
            Path.GetFullPath(Path.Combine(directory, vocabulary)),
            merges is null ? null : Path.GetFullPath(Path.Combine(directory, merges)),
            card.Bool("lower_case") ?? tokenizer == NliTokenizerKind.WordPiece,
            MaxLength(card, "max_length", card.Integer("max_length") ?? DefaultMaxLength),
            labels,
            card.String("output"),
            card.File,
            card.Number("temperature") ?? 1.0);
    }

    private static NliModelCard FromConfig(string directory, JsonFields config)
    {
        var tokenizer = DetectTokenizer(directory);
        var tokenizerConfigFile = Path.Combine(directory, TokenizerConfigFileName);
        var tokenizerConfig = File.Exists(tokenizerConfigFile) ? JsonFields.Parse(tokenizerConfigFile) : null;
        var architecture = config.String("model_type") ?? "bert";

        // RoBERTa-style position tables reserve two rows before the first real position.
        var positionOffset = architecture.Contains("roberta", StringComparison.OrdinalIgnoreCase) ? 2 : 0;
        var maxLength = (long)DefaultMaxLength;
        if (config.Integer("max_position_embeddings") is { } positions)
        {
            maxLength = Math.Min(maxLength, positions - positionOffset);
        }

        // Tokenizer configs write a huge sentinel when there is no limit; only a real limit counts.
        if (tokenizerConfig?.Integer("model_max_length") is { } tokenizerLimit && tokenizerLimit is > 0 and < 1_000_000)
        {
            maxLength = Math.Min(maxLength, tokenizerLimit);
        }

        var lowerCase = config.Bool("do_lower_case") ?? tokenizerConfig?.Bool("do_lower_case")
            ?? tokenizer == NliTokenizerKind.WordPiece;
        var labels = config.IndexedStrings("id2label") ?? throw config.Wrong("id2label", "present: the output classes by index");
        return new NliModelCard(
            config.String("_name_or_path") is { Length: > 0 } name ? name : Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(directory))),
            architecture,
            tokenizer,
            Path.GetFullPath(Path.Combine(directory, DefaultVocabulary(tokenizer))),
            tokenizer == NliTokenizerKind.ByteLevelBpe ? Path.GetFullPath(Path.Combine(directory, BpeMerges)) : null,
            lowerCase,
            MaxLength(config, "max_position_embeddings", maxLength),
            labels,
            null,
            config.File);
    }

    private static NliTokenizerKind ParseTokenizer(JsonFields card, string name) => name.ToLowerInvariant() switch
    {
        "wordpiece" => NliTokenizerKind.WordPiece,
        "bpe" or "byte-level-bpe" => NliTokenizerKind.ByteLevelBpe,
        _ => throw card.Wrong("tokenizer", "\"wordpiece\" or \"bpe\""),
    };

    // With neither vocabulary present, WordPiece is assumed so that the error names vocab.txt.
    private static NliTokenizerKind DetectTokenizer(string directory) =>
        !File.Exists(Path.Combine(directory, WordPieceVocabulary)) && File.Exists(Path.Combine(directory, BpeVocabulary))
            ? NliTokenizerKind.ByteLevelBpe
            : NliTokenizerKind.WordPiece;

    private static string DefaultVocabulary(NliTokenizerKind tokenizer) =>
        tokenizer == NliTokenizerKind.WordPiece ? WordPieceVocabulary : BpeVocabulary;

    private static int MaxLength(JsonFields file, string field, long value) =>
        value is >= SmallestMaxLength and <= DefaultMaxLength * 64
            ? (int)value
            : throw file.Wrong(field, $"give a maximum length of at least {SmallestMaxLength} tokens");
}
