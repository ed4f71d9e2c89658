using Microsoft.ML.OnnxRuntime;
using Microsoft.ML.OnnxRuntime.Tensors;
using Plumbline.Core.Language;

namespace Plumbline.LocalModel.Tests;

/// <summary>
/// The tiny model run through the runtime (with its key/value cache) against references computed without a
/// cache: the recipe's PyTorch forward passes, and a plain ONNX Runtime loop in this test that feeds the whole
/// sequence every step.
/// </summary>
public sealed class ReferenceTests : IDisposable
{
    private readonly LocalLanguageModel model = TinyModel.Open();

    public void Dispose() => model.Dispose();

    [Fact]
    public void Open_TinyModel_ReadsTheFolderConfig()
    {
        // Shape written by make_decoder.py (tiny): 479-token vocabulary, context 1024, no chat template.
        Assert.Equal(479, model.Folder.VocabularySize);
        Assert.Equal(1024, model.Folder.ContextLength);
        Assert.Equal("llama", model.Folder.ModelType);
        Assert.False(model.UsesChatTemplate);
        Assert.Equal("onnx:" + TinyModel.Directory, model.Describe);
    }

    [Fact]
    public void Encode_SampleTexts_EqualsTheRecipeTokenizer()
    {
        foreach (var sample in TinyModel.Reference.Tokens)
        {
            Assert.Equal(sample.Ids, model.Encode(sample.Text));
        }
    }

    [Fact]
    public void Generate_Greedy_EqualsTheRecipeContinuationWithoutCache()
    {
        foreach (var reference in TinyModel.Reference.Greedy)
        {
            var generated = model.Generate(Greedy(reference.Prompt, reference.MaxTokens, stop: []), CancellationToken.None);

            Assert.Equal(reference.Ids, generated.Ids[0]);
            Assert.Equal(reference.Text, generated.Result.Texts[0]);
            Assert.Equal(new TokenUsage(reference.PromptIds.Length, reference.Ids.Length), generated.Result.Usage);
        }
    }

    [Fact]
    public void Generate_Greedy_EqualsAnUncachedOnnxRuntimeLoopTokenForToken()
    {
        using var session = new InferenceSession(Path.Combine(TinyModel.Directory, "model.onnx"));
        foreach (var reference in TinyModel.Reference.Greedy)
        {
            var uncached = UncachedGreedy(session, reference.PromptIds, reference.MaxTokens);

            var cached = model.Generate(Greedy(reference.Prompt, reference.MaxTokens, stop: []), CancellationToken.None);

            Assert.Equal(uncached, cached.Ids[0]);
        }
    }

    [Fact]
    public void Generate_MaxTokens_StopsAfterThatMany()
    {
        var reference = TinyModel.Reference.Greedy[0];

        var generated = model.Generate(Greedy(reference.Prompt, 5, stop: []), CancellationToken.None);

        Assert.Equal(reference.Ids[..5], generated.Ids[0]);
    }

    [Fact]
    public void Generate_StopString_CutsTheTextBeforeIt()
    {
        var reference = TinyModel.Reference.Greedy[0];
        var stop = reference.Text.Substring(10, 3);

        var text = model.Generate(Greedy(reference.Prompt, reference.MaxTokens, stop: ["never in this text", stop]), CancellationToken.None).Result.Texts[0];

        Assert.Equal(reference.Text[..reference.Text.IndexOf(stop, StringComparison.Ordinal)], text);
    }

    [Fact]
    public void Generate_StopString_EndsGenerationEarly()
    {
        var reference = TinyModel.Reference.Greedy[0];
        var stop = reference.Text.Substring(4, 2);

        var generated = model.Generate(Greedy(reference.Prompt, reference.MaxTokens, stop: [stop]), CancellationToken.None);

        Assert.True(generated.Ids[0].Length < reference.Ids.Length, "generation went on past the stop string");
        Assert.Equal(reference.Ids[..generated.Ids[0].Length], generated.Ids[0]);
    }

    [Fact]
    public void NextTokenProbabilities_AnswerPrompts_EqualTheRecipeSoftmaxWithin1e4()
    {
        foreach (var reference in TinyModel.Reference.Answers)
        {
            var probabilities = model.NextTokenProbabilities(reference.Prompt);

            Assert.Equal(reference.NextTokenProbabilities.Length, probabilities.Length);
            Assert.Equal(1.0, probabilities.Sum(), 9);
            for (var i = 0; i < probabilities.Length; i++)
            {
                Assert.True(Math.Abs(reference.NextTokenProbabilities[i] - probabilities[i]) <= 1e-4, $"token {i}: {probabilities[i]} vs {reference.NextTokenProbabilities[i]}");
            }
        }
    }

    [Fact]
    public async Task ScoreAnswers_AnswerPrompts_EqualTheRecipeMassesRenormalised()
    {
        foreach (var reference in TinyModel.Reference.Answers)
        {
            var answer = await model.ScoreAnswersAsync(new AnswerRequest(reference.Statement, reference.Prompt), CancellationToken.None);

            Assert.Equal(1.0, answer.True + answer.False, 12);
            Assert.True(Math.Abs(reference.PTrue - answer.True) <= 1e-4, $"{answer.True} vs {reference.PTrue}");
            Assert.False(answer.Estimated);

            // The prompt, plus one extra token for each further token of a multi-token spelling.
            var extra = reference.TrueSequences.Concat(reference.FalseSequences).Sum(s => s.Length - 1);
            Assert.Equal(reference.PromptIds.Length + extra, answer.Usage.PromptTokens);
        }
    }

    [Fact]
    public void AnswerVariants_AnswerPrompts_EqualTheRecipeSequences()
    {
        foreach (var reference in TinyModel.Reference.Answers)
        {
            var ids = model.Encode(reference.Prompt);

            Assert.Equal(Sorted(reference.TrueSequences), Sorted(AnswerVariants.Sequences(model.Encode, reference.Prompt, ids, AnswerVariants.TrueWords)));
            Assert.Equal(Sorted(reference.FalseSequences), Sorted(AnswerVariants.Sequences(model.Encode, reference.Prompt, ids, AnswerVariants.FalseWords)));
        }
    }

    [Fact]
    public async Task ScoreAnswers_ConcurrentRequests_GiveWhatSequentialOnesGive()
    {
        var prompts = TinyModel.Reference.Answers.Select(a => a.Prompt).ToArray();
        var sequential = new List<double>();
        foreach (var prompt in prompts)
        {
            sequential.Add((await model.ScoreAnswersAsync(new AnswerRequest("s", prompt), CancellationToken.None)).True);
        }

        using var shared = TinyModel.Open(new LocalModelOptions(Threads: 1, Concurrency: 4));
        var concurrent = await Task.WhenAll(Enumerable.Range(0, 12).Select(i =>
            shared.ScoreAnswersAsync(new AnswerRequest("s", prompts[i % prompts.Length]), CancellationToken.None)));

        for (var i = 0; i < concurrent.Length; i++)
        {
            Assert.Equal(sequential[i % prompts.Length], concurrent[i].True, 6);
        }
    }

    [Fact]
    public async Task Generate_PromptLongerThanTheContext_FailsTheRequest()
    {
        var prompt = string.Concat(Enumerable.Repeat("Lanterns on Mossberry Lane. ", 400));

        var error = await Assert.ThrowsAsync<ModelRequestException>(() => model.GenerateAsync(Greedy(prompt, 8, stop: []), CancellationToken.None));

        Assert.Contains("context of 1024", error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task Generate_Cancelled_Throws()
    {
        using var cancelled = new CancellationTokenSource();
        await cancelled.CancelAsync();

        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => model.GenerateAsync(Greedy("Q:", 8, stop: []), cancelled.Token));
    }

    [Fact]
    public async Task Dispose_ThenRequest_Throws()
    {
        var opened = TinyModel.Open();
        await opened.DisposeAsync();

        await Assert.ThrowsAsync<ObjectDisposedException>(() => opened.ScoreAnswersAsync(new AnswerRequest("s", "Q:"), CancellationToken.None));
    }

    // The order of the spellings does not matter; compare them as sets.
    private static string[] Sorted(IEnumerable<int[]> sequences) =>
        sequences.Select(s => string.Join(',', s)).Order(StringComparer.Ordinal).ToArray();

    internal static GenerationRequest Greedy(string prompt, int maxTokens, IReadOnlyList<string> stop, int count = 1) =>
        new(GenerationPurpose.Abduction, "subject", true, prompt, new Decoding(0.0, 1.0, maxTokens, stop), count);

    private static int EndOfText { get; } = System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(TinyModel.Directory, "genai_config.json")))
        .RootElement.GetProperty("model").GetProperty("eos_token_id").GetInt32();

    // Every step feeds the whole sequence with empty past key/values: no cache at all.
    private static int[] UncachedGreedy(InferenceSession session, int[] prompt, int maxTokens)
    {
        var sequence = prompt.Select(id => (long)id).ToList();
        var generated = new List<int>();
        var layers = session.InputNames.Count(n => n.EndsWith(".key", StringComparison.Ordinal));
        var pastShape = session.InputMetadata["past_key_values.0.key"].Dimensions;
        for (var step = 0; step < maxTokens; step++)
        {
            var length = sequence.Count;
            var inputs = new List<NamedOnnxValue>
            {
                NamedOnnxValue.CreateFromTensor("input_ids", new DenseTensor<long>(sequence.ToArray(), [1, length])),
                NamedOnnxValue.CreateFromTensor("attention_mask", new DenseTensor<long>(Enumerable.Repeat(1L, length).ToArray(), [1, length])),
                NamedOnnxValue.CreateFromTensor("position_ids", new DenseTensor<long>(Enumerable.Range(0, length).Select(i => (long)i).ToArray(), [1, length])),
            };
            for (var layer = 0; layer < layers; layer++)
            {
                foreach (var kind in new[] { "key", "value" })
                {
                    inputs.Add(NamedOnnxValue.CreateFromTensor($"past_key_values.{layer}.{kind}", new DenseTensor<float>([1, pastShape[1], 0, pastShape[3]])));
                }
            }

            using var outputs = session.Run(inputs);
            var logits = outputs.First(o => o.Name == "logits").AsTensor<float>();
            var vocabulary = logits.Dimensions[2];
            var best = 0;
            for (var i = 1; i < vocabulary; i++)
            {
                if (logits[0, length - 1, i] > logits[0, length - 1, best])
                {
                    best = i;
                }
            }

            generated.Add(best);
            sequence.Add(best);
            if (best == EndOfText)
            {
                break;
            }
        }

        return [.. generated];
    }
}
