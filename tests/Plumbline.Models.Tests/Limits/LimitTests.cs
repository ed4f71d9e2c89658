using Plumbline.Core.Language;
using Plumbline.Core.Runs;
using Plumbline.Models.Limits;
using Xunit;

namespace Plumbline.Models.Tests.Limits;

public sealed class LimitTests
{
    [Fact]
    public async Task Cap_NeverLetsMoreCallsThroughThanAllowed()
    {
        var inner = new SlowModel();
        var capped = new CappedLanguageModel(inner, 3);

        await Task.WhenAll(Enumerable.Range(0, 20).Select(i => capped.ScoreAnswersAsync(new AnswerRequest($"s{i}", "p"), CancellationToken.None)));

        Assert.Equal(3, inner.MostAtOnce);
    }

    [Fact]
    public async Task Budget_RefusesTheCallPastTheLimit_AndHaltsTheRun()
    {
        var budget = new CallBudget(maxCalls: 2, maxTokens: null);
        var model = new BudgetedLanguageModel(new SlowModel(), budget);
        await model.ScoreAnswersAsync(new AnswerRequest("a", "p"), CancellationToken.None);
        await model.ScoreAnswersAsync(new AnswerRequest("b", "p"), CancellationToken.None);

        var refused = await Assert.ThrowsAsync<RunHaltedException>(() => model.ScoreAnswersAsync(new AnswerRequest("c", "p"), CancellationToken.None));

        Assert.Equal("the budget of 2 model calls is spent", refused.Message);
        Assert.Equal(refused.Message, budget.Reason);
        Assert.Equal(2, budget.Calls);
    }

    [Fact]
    public async Task Budget_TokensSpent_StopsFurtherCalls()
    {
        // Each call of the double costs 7 tokens: after two, 14 >= 10.
        var budget = new CallBudget(maxCalls: null, maxTokens: 10);
        var model = new BudgetedLanguageModel(new SlowModel(), budget);
        await model.ScoreAnswersAsync(new AnswerRequest("a", "p"), CancellationToken.None);
        await model.ScoreAnswersAsync(new AnswerRequest("b", "p"), CancellationToken.None);

        await Assert.ThrowsAsync<RunHaltedException>(() => model.ScoreAnswersAsync(new AnswerRequest("c", "p"), CancellationToken.None));
        Assert.Equal(14, budget.Tokens);
        Assert.Equal("the budget of 10 tokens is spent", budget.Reason);
    }

    private sealed class SlowModel : ILanguageModel
    {
        private int now;
        private int most;

        public int MostAtOnce => Volatile.Read(ref most);

        public string Describe => "slow";

        public Task<GenerationResult> GenerateAsync(GenerationRequest request, CancellationToken cancellationToken) => throw new NotSupportedException();

        public async Task<AnswerProbabilities> ScoreAnswersAsync(AnswerRequest request, CancellationToken cancellationToken)
        {
            var current = Interlocked.Increment(ref now);
            int seen;
            while (current > (seen = Volatile.Read(ref most)) && Interlocked.CompareExchange(ref most, current, seen) != seen)
            {
            }

            await Task.Delay(20, cancellationToken);
            Interlocked.Decrement(ref now);
            return AnswerProbabilities.FromRaw(0.6, 0.4, usage: new TokenUsage(5, 2));
        }
    }
}
