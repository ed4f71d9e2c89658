using Plumbline.Core.Language;

namespace Plumbline.Core.Tests.Doubles;

/// <summary>
/// A language model answering from scripts: explanations per (subject, answer), negations per
/// statement, p(True) per statement. An unscripted p(True) is a missing answer and throws
/// <see cref="ModelRequestException"/>, like a recording without the entry. Records every request
/// and the most requests ever in flight at once.
/// </summary>
internal sealed class ScriptedModel : ILanguageModel
{
    private readonly Lock gate = new();
    private int inFlight;

    public Dictionary<(string Subject, bool Answer), string[]> Explanations { get; } = [];

    public Func<GenerationRequest, IReadOnlyList<string>>? ExplainWith { get; init; }

    public Dictionary<string, string> Negations { get; } = [];

    public Dictionary<string, double> PTrue { get; } = [];

    public Func<string, double?>? PTrueWith { get; init; }

    /// <summary>Delay of every call, so that concurrent calls overlap.</summary>
    public TimeSpan Latency { get; init; } = TimeSpan.Zero;

    public List<GenerationRequest> Generations { get; } = [];

    public List<AnswerRequest> Answers { get; } = [];

    public int MaxInFlight { get; private set; }

    public string Describe => "scripted";

    /// <summary>A model that writes as many distinct explanations as asked for, named after subject and answer.</summary>
    public static ScriptedModel Growing(Func<string, double?> pTrue, TimeSpan latency = default) => new()
    {
        ExplainWith = r => [.. Enumerable.Range(0, r.Count).Select(k => $"{r.Subject} / {(r.Answer == true ? "T" : "F")}{k}")],
        PTrueWith = pTrue,
        Latency = latency,
    };

    public async Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken)
    {
        Enter(() => Generations.Add(request));
        try
        {
            await Pause(cancellationToken);
            IReadOnlyList<string> texts = request.Purpose switch
            {
                GenerationPurpose.Negation => Negations.TryGetValue(request.Subject, out var negation) ? [negation] : ["Not: " + request.Subject],
                _ when ExplainWith is not null => ExplainWith(request),
                _ => Explanations.TryGetValue((request.Subject, request.Answer!.Value), out var texts1) ? texts1 : [],
            };
            return new GenerationResult(texts, new TokenUsage(10, 5));
        }
        finally
        {
            Leave();
        }
    }

    public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
    {
        Enter(() => Answers.Add(request));
        try
        {
            await Pause(cancellationToken);
            var p = PTrue.TryGetValue(request.Statement, out var scripted) ? scripted : PTrueWith?.Invoke(request.Statement);
            return p is { } value
                ? AnswerProbabilities.FromRaw(value, 1 - value, usage: new TokenUsage(20, 1))
                : throw new ModelRequestException($"no answer recorded for \"{request.Statement}\"");
        }
        finally
        {
            Leave();
        }
    }

    private Task Pause(CancellationToken cancellationToken) =>
        Latency > TimeSpan.Zero ? Task.Delay(Latency, cancellationToken) : Task.CompletedTask;

    private void Enter(Action record)
    {
        lock (gate)
        {
            record();
            inFlight++;
            MaxInFlight = Math.Max(MaxInFlight, inFlight);
        }
    }

    private void Leave()
    {
        lock (gate)
        {
            inFlight--;
        }
    }
}
