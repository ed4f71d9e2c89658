using Plumbline.Core.Entailment;

namespace Plumbline.Nli.Tests;

/// <summary>Our pair tokenisation against the recipe's reference tokenizer (models/recipe/wordpiece.py), via reference/token-ids.jsonl.</summary>
[Collection(RepositoryModelCollection.Name)]
public sealed class TokenizerParityTests(ModelFixture fixture)
{
    [Fact]
    public void Encode_ReferencePairs_MatchTokenIdsAndTypeIdsExactly()
    {
        var references = RepositoryModel.TokenReferences();
        Assert.NotEmpty(references);

        var mismatches = new List<string>();
        foreach (var reference in references)
        {
            var encoded = fixture.Model.Encode(new SentencePair(reference.Premise, reference.Hypothesis));
            if (!encoded.InputIds.SequenceEqual(reference.InputIds))
            {
                mismatches.Add($"ids of ({reference.Premise} | {reference.Hypothesis}): ours [{string.Join(' ', encoded.InputIds)}], reference [{string.Join(' ', reference.InputIds)}]");
            }

            if (!encoded.TypeIds.SequenceEqual(reference.TokenTypeIds))
            {
                mismatches.Add($"type ids of ({reference.Premise} | {reference.Hypothesis}) differ");
            }
        }

        Assert.True(mismatches.Count == 0, string.Join(Environment.NewLine, mismatches));
    }

    [Fact]
    public void Encode_ReferencePairsOverMaxLength_AreCutToMaxLengthAndFlagged()
    {
        var maxLength = fixture.Model.Card.MaxLength;
        var longPairs = RepositoryModel.TokenReferences().Where(reference => reference.InputIds.Length == maxLength).ToArray();
        Assert.NotEmpty(longPairs);

        foreach (var reference in longPairs)
        {
            // Tokenised alone, each side's length shows whether the pair as a whole had to be cut.
            var premiseAlone = fixture.Model.Encode(new SentencePair(reference.Premise, string.Empty)).Length - 3;
            var hypothesisAlone = fixture.Model.Encode(new SentencePair(string.Empty, reference.Hypothesis)).Length - 3;
            var encoded = fixture.Model.Encode(new SentencePair(reference.Premise, reference.Hypothesis));
            Assert.Equal(maxLength, encoded.Length);
            Assert.Equal(premiseAlone + hypothesisAlone + 3 > maxLength, encoded.Truncated);
        }
    }

    [Fact]
    public void Encode_ShortPair_IsNotFlaggedTruncated()
    {
        var encoded = fixture.Model.Encode(new SentencePair("A dog runs.", "An animal moves."));

        Assert.False(encoded.Truncated);
        Assert.True(encoded.Length < fixture.Model.Card.MaxLength);
    }
}
