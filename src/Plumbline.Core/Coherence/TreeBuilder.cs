using Plumbline.Core.Language;
using Plumbline.Core.Trees;

namespace Plumbline.Core.Coherence;

/// <summary>
/// Grows the explanation tree of one claim level by level. Within a level the independent requests
/// go out together (all abductions, then all negations, then all answer probabilities), because a
/// remote model's latency, not our work, dominates the time of a claim.
/// </summary>
internal sealed class TreeBuilder(ILanguageModel model, TreeShape shape, NegationMode negationMode, TreeRules? rules = null)
{
    private readonly TreeRules rules = rules ?? TreeRules.Plain;

    /// <param name="sampleIndex">Which independent tree of the claim this is; it goes on every sampled
    /// request, so that each tree draws its own explanations. Greedy requests and answer probabilities are
    /// the same for every tree and keep index 0, so a cache answers them once.</param>
    public async Task<BuiltTree> BuildAsync(string claimText, CallMeter meter, CancellationToken cancellationToken, int sampleIndex = 0)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(sampleIndex);
        var statements = new List<Statement>();
        var keys = new Dictionary<StatementKey, int>();
        var root = new Draft(0, claimText.Trim(), 0, null, null);
        keys[StatementKey.Of(root.Text)] = 0;

        var (evaluatedRoot, rootAnswers) = await EvaluateAsync([root], meter, cancellationToken);
        statements.AddRange(evaluatedRoot);

        // The root is expanded whatever its integrity (it is the question being asked), unless the rules
        // say an integral claim is answered by its own belief.
        IReadOnlyList<Statement> toExpand = rules.ExpandIntegralClaim || !evaluatedRoot[0].IsIntegral ? evaluatedRoot : [];
        var cutOff = 0;
        for (var depth = 1; depth <= shape.MaxDepth && toExpand.Count > 0; depth++)
        {
            var (drafts, discarded) = await AbduceAsync(toExpand, depth, statements.Count, keys, sampleIndex, meter, cancellationToken);
            cutOff += discarded;
            var (evaluated, _) = await EvaluateAsync(drafts, meter, cancellationToken);
            statements.AddRange(evaluated);
            toExpand = [.. evaluated.Where(s => !s.IsIntegral)];
        }

        var rootStatement = evaluatedRoot[0];
        var direct = rootAnswers[0].Answer;
        var paired = rootStatement.PTrue == rootStatement.PTrueOfNegation ? direct : rootStatement.PTrue > rootStatement.PTrueOfNegation;
        return new BuiltTree(new ExplanationTree(Prune(statements)), direct, paired, cutOff);
    }

    /// <summary>
    /// True when a cleaned explanation ends a sentence: a full stop, question or exclamation mark or an
    /// ellipsis, optionally followed by closing quotes or brackets. A text that stops elsewhere was most
    /// likely cut off by the token limit and may say the opposite of what its full form would.
    /// </summary>
    public static bool EndsSentence(string text)
    {
        var end = text.Length;
        while (end > 0 && ClosingMarks.Contains(text[end - 1]))
        {
            end--;
        }

        return end > 0 && SentenceEnds.Contains(text[end - 1]);
    }

    private const string SentenceEnds = ".!?\u2026";
    private const string ClosingMarks = "\"')]\u201d\u2019";

    /// <summary>
    /// Removes leaves that failed the integrity test, repeatedly, since removing one can expose its
    /// parent as a new such leaf. The root always stays. Ids must equal positions.
    /// </summary>
    public static IReadOnlyList<Statement> Prune(IReadOnlyList<Statement> statements)
    {
        var kept = statements.Select(s => s.Kept).ToArray();
        var changed = true;
        while (changed)
        {
            changed = false;
            foreach (var statement in statements)
            {
                if (statement.IsRoot || statement.IsIntegral || !kept[statement.Id])
                {
                    continue;
                }

                if (!statements.Any(child => child.ParentId == statement.Id && kept[child.Id]))
                {
                    kept[statement.Id] = false;
                    changed = true;
                }
            }
        }

        return [.. statements.Select(s => s.Kept == kept[s.Id] ? s : s with { Kept = kept[s.Id] })];
    }

    /// <summary>Trims a generated sentence to its first line and capitalises it; empty when nothing is left.</summary>
    public static string Clean(string generated)
    {
        var text = generated.TrimStart();
        var newline = text.IndexOfAny(['\r', '\n']);
        if (newline >= 0)
        {
            text = text[..newline];
        }

        text = text.Trim().Trim('"').Trim();
        return text.Length == 0 ? text : char.ToUpperInvariant(text[0]) + text[1..];
    }

    private async Task<(List<Draft> Drafts, int CutOff)> AbduceAsync(
        IReadOnlyList<Statement> parents,
        int depth,
        int nextId,
        Dictionary<StatementKey, int> keys,
        int sampleIndex,
        CallMeter meter,
        CancellationToken cancellationToken)
    {
        var level = shape.AtDepth(depth);
        var asks = parents.SelectMany(parent => new[] { (Parent: parent, Answer: true), (Parent: parent, Answer: false) }).ToList();
        var results = await Task.WhenAll(asks.Select(ask => GenerateAsync(
            new GenerationRequest(
                GenerationPurpose.Abduction,
                ask.Parent.Text,
                ask.Answer,
                PromptBook.Abduction(ask.Parent.Text, ask.Answer),
                level.Decoding,
                level.Width,
                level.Decoding.IsGreedy ? 0 : sampleIndex),
            meter,
            cancellationToken)));

        var drafts = new List<Draft>();
        var cutOff = 0;
        for (var i = 0; i < asks.Count; i++)
        {
            foreach (var generated in results[i].Texts.Take(level.Width))
            {
                var text = Clean(generated);
                // One statement, one variable: an explanation already in the tree (the claim included) is not added again.
                if (text.Length == 0 || keys.ContainsKey(StatementKey.Of(text)))
                {
                    continue;
                }

                if (rules.DiscardCutOff && !EndsSentence(text))
                {
                    cutOff++;
                    continue;
                }

                keys.Add(StatementKey.Of(text), nextId + drafts.Count);

                drafts.Add(new Draft(nextId + drafts.Count, text, depth, asks[i].Parent.Id, asks[i].Answer));
            }
        }

        return (drafts, cutOff);
    }

    private async Task<(List<Statement> Statements, AnswerProbabilities[] StatementAnswers)> EvaluateAsync(
        IReadOnlyList<Draft> drafts,
        CallMeter meter,
        CancellationToken cancellationToken)
    {
        var negations = await Task.WhenAll(drafts.Select(d => NegateAsync(d.Text, meter, cancellationToken)));

        var texts = drafts.Select(d => d.Text).Concat(negations.Select(n => n.Text)).ToList();
        var answers = await Task.WhenAll(texts.Select(text => ScoreAsync(text, meter, cancellationToken)));

        var statements = new List<Statement>(drafts.Count);
        for (var i = 0; i < drafts.Count; i++)
        {
            var forStatement = answers[i];
            var forNegation = answers[drafts.Count + i];
            var draft = drafts[i];
            statements.Add(new Statement(
                draft.Id,
                draft.Text,
                negations[i].Text,
                negations[i].FromModel,
                draft.Depth,
                draft.ParentId,
                draft.GeneratedFor,
                forStatement.True,
                forNegation.True,
                Statement.IntegrityOf(forStatement.Answer, forNegation.Answer, forStatement.True, forNegation.True, rules.IntegrityGap),
                Statement.BeliefOf(forStatement.True, forNegation.True),
                Kept: true));
        }

        return (statements, answers[..drafts.Count]);
    }

    private async Task<(string Text, bool FromModel)> NegateAsync(string text, CallMeter meter, CancellationToken cancellationToken)
    {
        if (negationMode == NegationMode.Model)
        {
            var request = new GenerationRequest(GenerationPurpose.Negation, text, null, PromptBook.Negation(text), Decoding.Greedy(), 1);
            var result = await GenerateAsync(request, meter, cancellationToken);
            var written = result.Texts.Count == 0 ? string.Empty : Clean(result.Texts[0]);
            // An echo of the statement is no negation; the test would then compare a statement with itself.
            if (written.Length > 0 && StatementKey.Of(written) != StatementKey.Of(text))
            {
                return (written, true);
            }
        }

        return (PromptBook.PrefixNegation(text), false);
    }

    private async Task<GenerationResult> GenerateAsync(GenerationRequest request, CallMeter meter, CancellationToken cancellationToken)
    {
        meter.Started();
        var result = await model.GenerateAsync(request, cancellationToken);
        meter.Spent(result.Usage);
        return result;
    }

    private async Task<AnswerProbabilities> ScoreAsync(string statement, CallMeter meter, CancellationToken cancellationToken)
    {
        meter.Started();
        var result = await model.ScoreAnswersAsync(new AnswerRequest(statement, PromptBook.Answer(statement)), cancellationToken);
        meter.Spent(result.Usage, result.Estimated);
        return result;
    }

    private sealed record Draft(int Id, string Text, int Depth, int? ParentId, bool? GeneratedFor);
}
