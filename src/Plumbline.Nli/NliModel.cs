using System.Globalization;
using System.Security.Cryptography;
using Microsoft.ML.OnnxRuntime;
using Plumbline.Core.Entailment;
using Plumbline.Nli.Tokenization;

namespace Plumbline.Nli;

/// <summary>
/// A loaded sequence-pair classifier: the ONNX session, its tokenizer and its description. Running a batch is
/// thread-safe; <see cref="OnnxEntailmentScorer"/> adds batching, the score cache and the truncation count.
/// </summary>
public sealed class NliModel : IDisposable
{
    public const string ModelFileName = "model.onnx";

    private readonly IPairEncoder encoder;
    private readonly ModelInputs inputs;
    private readonly string[] outputNames;
    private readonly SemaphoreSlim runSlots;

    private NliModel(NliModelCard card, string modelFile, string sha256, InferenceSession session, IPairEncoder encoder, ModelInputs inputs, string outputName, LabelOrder labels, int concurrentRuns)
    {
        ConcurrentRuns = concurrentRuns;
        runSlots = new SemaphoreSlim(concurrentRuns, concurrentRuns);
        Card = card;
        ModelFile = modelFile;
        ModelSha256 = sha256;
        Session = session;
        this.encoder = encoder;
        this.inputs = inputs;
        outputNames = [outputName];
        Labels = labels;
    }

    public NliModelCard Card { get; }

    public string ModelFile { get; }

    /// <summary>SHA-256 of model.onnx, lower-case hex.</summary>
    public string ModelSha256 { get; }

    /// <summary>Model name and a short hash of its weights, so a report pins the exact model.</summary>
    /// <remarks>The calibration temperature is named when the card sets one: it changes every probability, so two runs
    /// with the same model.onnx but different temperatures must not look alike in reports or comparisons.</remarks>
    public string Describe => Card.Temperature == 1.0
        ? $"{Card.Name} (model.onnx sha256 {ModelSha256[..12]})"
        : string.Create(CultureInfo.InvariantCulture, $"{Card.Name} (model.onnx sha256 {ModelSha256[..12]}, temperature {Card.Temperature:0.####})");

    /// <summary>Most batches this model runs at once, across all callers (<see cref="NliModelOptions.ConcurrentRuns"/>).</summary>
    public int ConcurrentRuns { get; }

    /// <summary>The raw session, for benchmarks that time it against the scorer.</summary>
    public InferenceSession Session { get; }

    /// <summary>The graph output holding the logits, as the output-name list of a session run.</summary>
    public IReadOnlyList<string> OutputNames => outputNames;

    internal LabelOrder Labels { get; }

    internal int LabelCount => Card.Labels.Count;

    /// <summary>Loads a model directory (see README.md for its layout); any unusable file raises <see cref="NliModelException"/>.</summary>
    public static NliModel Load(string directory, NliModelOptions? options = null)
    {
        options ??= new NliModelOptions();
        ArgumentOutOfRangeException.ThrowIfLessThan(options.IntraOpThreads, 1, nameof(options));
        ArgumentOutOfRangeException.ThrowIfLessThan(options.EffectiveConcurrentRuns, 1, nameof(options));
        var card = NliModelCardReader.Read(directory);
        var modelFile = Path.GetFullPath(Path.Combine(directory, ModelFileName));
        if (!File.Exists(modelFile))
        {
            throw new NliModelException(modelFile, "model file not found");
        }

        var encoder = PairEncoders.For(card);
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(modelFile);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new NliModelException(modelFile, $"cannot read: {e.Message}", e);
        }

        // Hashing tens of megabytes overlaps with building the session, which matters for cold start.
        var hashing = Task.Run(() => Convert.ToHexStringLower(SHA256.HashData(bytes)));
        var session = OpenSession(modelFile, bytes, options);
        try
        {
            var inputs = ModelInputs.Of(session.InputMetadata, modelFile);
            PairEncoders.CheckSegments(encoder, inputs, card, modelFile);
            var outputName = CheckOutput(session, card, modelFile);
            var labels = LabelOrder.From(card.Labels, card.SourceFile, card.Temperature);
            return new NliModel(card, modelFile, hashing.GetAwaiter().GetResult(), session, encoder, inputs, outputName, labels, options.EffectiveConcurrentRuns);
        }
        catch
        {
            session.Dispose();
            throw;
        }
    }

    /// <summary>
    /// Tokenises pairs and batches them as <see cref="OnnxEntailmentScorer"/> does (sorted by length, at most
    /// <paramref name="batchSize"/> per batch, each padded to its longest pair), so benchmarks can time
    /// <see cref="Session"/> alone on the very tensors the scorer runs. The caller disposes the batches.
    /// </summary>
    public IReadOnlyList<NliTensorBatch> CreateBatches(IReadOnlyList<SentencePair> pairs, int batchSize)
    {
        var encoded = pairs.Select(Encode).ToArray();
        return LengthBuckets.Plan(encoded, batchSize)
            .Select(batch => CreateBatch(batch.Select(index => encoded[index]).ToArray()))
            .ToArray();
    }

    internal EncodedPair Encode(SentencePair pair) => encoder.Encode(pair.Premise, pair.Hypothesis);

    /// <summary>One side's token ids, for callers that frame many pairs from the same statements.</summary>
    internal IReadOnlyList<int> Tokenize(string text) => encoder.Tokenize(text);

    internal EncodedPair Frame(IReadOnlyList<int> premise, IReadOnlyList<int> hypothesis) => encoder.Frame(premise, hypothesis);

    internal NliTensorBatch CreateBatch(IReadOnlyList<EncodedPair> pairs) => NliTensorBatch.Create(pairs, inputs, encoder.PaddingId);

    /// <summary>Runs one batch; returns the logits row by row, <see cref="LabelCount"/> per pair.</summary>
    internal float[] Run(NliTensorBatch batch)
    {
        runSlots.Wait();
        try
        {
            return RunNow(batch);
        }
        finally
        {
            runSlots.Release();
        }
    }

    private float[] RunNow(NliTensorBatch batch)
    {
        using var runOptions = new RunOptions();
        using var outputs = Session.Run(runOptions, batch.InputNames, batch.Values, outputNames);
        var output = outputs[0];
        var shape = output.GetTensorTypeAndShape().Shape;
        if (shape.Length != 2 || shape[0] != batch.Count || shape[1] != LabelCount)
        {
            throw new NliModelException(ModelFile, $"output '{outputNames[0]}' has shape [{string.Join(", ", shape)}]; expected [{batch.Count}, {LabelCount}]");
        }

        return output.GetTensorDataAsSpan<float>().ToArray();
    }

    public void Dispose()
    {
        Session.Dispose();
        runSlots.Dispose();
    }

    private static InferenceSession OpenSession(string modelFile, byte[] bytes, NliModelOptions options)
    {
        using var sessionOptions = new SessionOptions
        {
            GraphOptimizationLevel = GraphOptimizationLevel.ORT_ENABLE_EXTENDED,
            IntraOpNumThreads = options.IntraOpThreads,
            // A batch's operators run one after another; the cores are shared out by running several batches at
            // once (ConcurrentRuns), so parallelism between operators would only add contention.
            InterOpNumThreads = 1,
            ExecutionMode = ExecutionMode.ORT_SEQUENTIAL,
        };

        // The optimiser's QDQ rewrite would turn a model's QuantizeLinear / DequantizeLinear pairs into its own int8
        // kernels: a model of the recipe's "weights" form (int8 weights behind DequantizeLinear) would then also
        // quantise its activations, and its scores would drift from the model's own reference logits. The shipped
        // model has no such pairs; with the rewrite off its per-row QuantizeLinear also runs exactly as written.
        sessionOptions.AddSessionConfigEntry("session.disable_quant_qdq", "1");
        // Several claims score at once (--in-flight), each run on the same intra-op pool; threads that spin while
        // waiting for work take the cores the other runs need. Without spinning the pipeline-throughput benchmark
        // judged 54.3, 58.9 and 57.2 claims/min against 53.4, 47.1 and 45.4 with it (alternating builds, one
        // sitting); a single stream of batches (the nli benchmark) stayed within the machine's noise.
        sessionOptions.AddSessionConfigEntry("session.intra_op.allow_spinning", "0");
        try
        {
            return new InferenceSession(bytes, sessionOptions);
        }
        catch (OnnxRuntimeException e)
        {
            throw new NliModelException(modelFile, $"not a loadable ONNX model: {FirstLine(e.Message)}", e);
        }
    }

    private static string CheckOutput(InferenceSession session, NliModelCard card, string modelFile)
    {
        var name = card.OutputName ?? session.OutputMetadata.Keys.First();
        if (!session.OutputMetadata.TryGetValue(name, out var output))
        {
            throw new NliModelException(card.SourceFile, $"names output '{name}', which {ModelFileName} does not have");
        }

        if (!output.IsTensor || output.ElementType != typeof(float) || output.Dimensions.Length != 2)
        {
            throw new NliModelException(modelFile, $"output '{name}' must be a float tensor [batch, classes]");
        }

        var width = output.Dimensions[1];
        if (width > 0 && width != card.Labels.Count)
        {
            throw new NliModelException(card.SourceFile, $"lists {card.Labels.Count} labels but {ModelFileName} outputs {width} classes");
        }

        return name;
    }

    private static string FirstLine(string text) => text.Split('\n', 2)[0].Trim();
}
