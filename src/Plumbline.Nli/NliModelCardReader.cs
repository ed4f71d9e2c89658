using System.Text.RegularExpressions;

namespace Plumbline.Nli;

/// <summary>
/// Reads the description of a model directory: our nli-model.json first; failing that a config.json
/// with id2label as exported alongside most sequence-pair classifiers.
/// </summary>
internal static partial class NliModelCardReader
{
    public const string CardFileName = "nli-model.json";
    public const string ConfigFileName = "config.json";
    public const string TokenizerConfigFileName = "tokenizer_config.json";
    public const string WordPieceVocabulary = "vocab.txt";
    public const string BpeVocabulary = "vocab.json";
    public const string BpeMerges = "merges.txt";
    public const string FastTokenizerFile = "tokenizer.json";

    /// <summary>SentencePiece model file names as exports ship them (DeBERTa-v2/v3; XLM-R; ALBERT and T5; others).</summary>
    public static readonly IReadOnlyList<string> SentencePieceModels = ["spm.model", "sentencepiece.bpe.model", "spiece.model", "tokenizer.model"];

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
        var configFile = Path.Combine(directory, ConfigFileName);
        var config = File.Exists(configFile) ? JsonFields.Parse(configFile) : null;
        if (File.Exists(cardFile))
        {
            return FromCard(directory, JsonFields.Parse(cardFile), config);
        }

        if (config is not null)
        {
            return FromConfig(directory, config);
        }

        throw new NliModelException(directory, $"no {CardFileName} or {ConfigFileName} describing the model");
    }

    /// <summary>Our card; a config.json beside it supplies the labels when the card has none, and the embedding sizes.</summary>
    private static NliModelCard FromCard(string directory, JsonFields card, JsonFields? config)
    {
        var tokenizer = card.String("tokenizer") is { } named ? ParseTokenizer(card, named) : DetectTokenizer(directory);
        var vocabulary = card.String("vocabulary") ?? DefaultVocabulary(directory, tokenizer);
        var merges = tokenizer == NliTokenizerKind.ByteLevelBpe ? card.String("merges") ?? BpeMerges : null;
        var labels = card.Strings("labels") ?? (config is null ? null : ConfigLabels(config))
            ?? throw card.Wrong("labels", $"present (or {ConfigFileName} with id2label beside it): the output classes in order");
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
            card.Number("temperature") ?? 1.0,
            config?.Integer("vocab_size"),
            config?.Integer("type_vocab_size"),
            config?.Integer("pad_token_id"));
    }

    private static NliModelCard FromConfig(string directory, JsonFields config)
    {
        var tokenizer = DetectTokenizer(directory);
        var tokenizerConfigFile = Path.Combine(directory, TokenizerConfigFileName);
        var tokenizerConfig = File.Exists(tokenizerConfigFile) ? JsonFields.Parse(tokenizerConfigFile) : null;

        // DeBERTa-v2 tokenizers can split punctuation before SentencePiece; v3 exports turn that off.
        if (tokenizerConfig?.Bool("split_by_punct") == true)
        {
            throw tokenizerConfig.Wrong("split_by_punct", "false: splitting punctuation before SentencePiece is not supported");
        }
        var architecture = config.String("model_type") ?? "bert";

        // RoBERTa-style position tables reserve two rows before the first real position.
        var positionOffset = architecture.Contains("roberta", StringComparison.OrdinalIgnoreCase) ? 2 : 0;
        var maxLength = (long)DefaultMaxLength;
        if (config.Integer("max_position_embeddings") is { } positions)
        {
            maxLength = Math.Min(maxLength, positions - positionOffset);
        }

        // Tokenizer configs write a huge sentinel when there is no limit; only a real limit counts.
        if (tokenizerConfig?.Number("model_max_length") is { } tokenizerLimit && tokenizerLimit is > 0 and < 1_000_000)
        {
            maxLength = Math.Min(maxLength, (long)tokenizerLimit);
        }

        var lowerCase = config.Bool("do_lower_case") ?? tokenizerConfig?.Bool("do_lower_case")
            ?? tokenizer == NliTokenizerKind.WordPiece;
        var labels = ConfigLabels(config) ?? throw config.Wrong("id2label", "present: the output classes by index");
        return new NliModelCard(
            config.String("_name_or_path") is { Length: > 0 } name ? name : Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(directory))),
            architecture,
            tokenizer,
            Path.GetFullPath(Path.Combine(directory, DefaultVocabulary(directory, tokenizer))),
            tokenizer == NliTokenizerKind.ByteLevelBpe ? Path.GetFullPath(Path.Combine(directory, BpeMerges)) : null,
            lowerCase,
            MaxLength(config, "max_position_embeddings", maxLength),
            labels,
            null,
            config.File,
            VocabularySize: config.Integer("vocab_size"),
            TypeVocabularySize: config.Integer("type_vocab_size"),
            PaddingId: config.Integer("pad_token_id"));
    }

    /// <summary>
    /// Output classes in order from id2label, or else from label2id. Generic names (LABEL_0, ...) are refused:
    /// only the model's own documentation says which is which.
    /// </summary>
    private static IReadOnlyList<string>? ConfigLabels(JsonFields config)
    {
        var labels = config.IndexedStrings("id2label") ?? config.IndexedKeys("label2id");
        if (labels is not null && labels.All(label => GenericLabel().IsMatch(label)))
        {
            throw new NliModelException(config.File, $"id2label names only generic classes [{string.Join(", ", labels)}]; write {CardFileName} beside it with \"labels\" in output order, as the model's documentation gives them");
        }

        return labels;
    }

    [GeneratedRegex(@"^LABEL_\d+$", RegexOptions.IgnoreCase)]
    private static partial Regex GenericLabel();

    private static NliTokenizerKind ParseTokenizer(JsonFields card, string name) => name.ToLowerInvariant() switch
    {
        "wordpiece" => NliTokenizerKind.WordPiece,
        "bpe" or "byte-level-bpe" => NliTokenizerKind.ByteLevelBpe,
        "sentencepiece" => NliTokenizerKind.SentencePiece,
        _ => throw card.Wrong("tokenizer", "\"wordpiece\", \"bpe\" or \"sentencepiece\""),
    };

    private static NliTokenizerKind DetectTokenizer(string directory)
    {
        if (File.Exists(Path.Combine(directory, WordPieceVocabulary)))
        {
            return NliTokenizerKind.WordPiece;
        }

        if (File.Exists(Path.Combine(directory, BpeVocabulary)))
        {
            return NliTokenizerKind.ByteLevelBpe;
        }

        if (SentencePieceModel(directory) is not null)
        {
            return NliTokenizerKind.SentencePiece;
        }

        var fastTokenizer = Path.Combine(directory, FastTokenizerFile);
        if (File.Exists(fastTokenizer))
        {
            throw new NliModelException(fastTokenizer, $"is not read on its own; copy the tokenizer's own files beside it: {WordPieceVocabulary} (WordPiece), {BpeVocabulary} and {BpeMerges} (byte-level BPE) or the SentencePiece model ({string.Join(", ", SentencePieceModels)})");
        }

        // With no vocabulary at all, WordPiece is assumed so that the error names vocab.txt.
        return NliTokenizerKind.WordPiece;
    }

    /// <summary>The first of the usual SentencePiece file names present, else the folder's only *.model file.</summary>
    private static string? SentencePieceModel(string directory)
    {
        if (SentencePieceModels.FirstOrDefault(name => File.Exists(Path.Combine(directory, name))) is { } known)
        {
            return known;
        }

        var models = Directory.GetFiles(directory, "*.model");
        return models.Length == 1 ? Path.GetFileName(models[0]) : null;
    }

    private static string DefaultVocabulary(string directory, NliTokenizerKind tokenizer) => tokenizer switch
    {
        NliTokenizerKind.ByteLevelBpe => BpeVocabulary,
        NliTokenizerKind.SentencePiece => SentencePieceModel(directory) ?? SentencePieceModels[0],
        _ => WordPieceVocabulary,
    };

    private static int MaxLength(JsonFields file, string field, long value) =>
        value is >= SmallestMaxLength and <= DefaultMaxLength * 64
            ? (int)value
            : throw file.Wrong(field, $"give a maximum length of at least {SmallestMaxLength} tokens");
}
