using Plumbline.Core.Language;

namespace Plumbline.LocalModel.Tests;

public sealed class StopTextTests
{
    [Theory]
    [InlineData("the lake. And more", new[] { "." }, "the lake")]
    [InlineData("a\nb.c", new[] { ".", "\n" }, "a")]
    [InlineData("abc", new[] { "abc" }, "")]
    public void Cut_TextWithStops_EndsBeforeTheEarliest(string text, string[] stops, string expected) =>
        Assert.Equal(expected, StopText.Cut(text, stops));

    [Fact]
    public void Cut_NoStopInText_IsNull()
    {
        Assert.Null(StopText.Cut("no stop here", ["\n", "Q:"]));
        Assert.Null(StopText.Cut("anything", [""]));
    }
}

public sealed class AnswerVariantsTests
{
    // A character tokenizer that merges "Tr" after a colon, so the prompt's own tokens change when a spelling follows.
    private static int[] Encode(string text)
    {
        var ids = new List<int>();
        for (var i = 0; i < text.Length; i++)
        {
            if (text[i] == ':' && i + 2 < text.Length && text.Substring(i + 1, 2) == "Tr")
            {
                ids.Add(1000);
                i += 2;
                continue;
            }

            ids.Add(text[i]);
        }

        return [.. ids];
    }

    [Fact]
    public void Sequences_SpellingMergingWithThePrompt_IsTokenisedAlone()
    {
        var prompt = "A:";
        var sequences = AnswerVariants.Sequences(Encode, prompt, Encode(prompt), ["True"]);

        // "A:True" merges ":Tr", so "True" is tokenised on its own; " True" follows the prompt's tokens.
        Assert.Equal(new[] { new[] { 'T', 'r', 'u', 'e' }.Select(c => (int)c).ToArray(), " True".Select(c => (int)c).ToArray() }.OrderBy(s => s.Length), sequences);
    }

    [Fact]
    public void Sequences_OneSpellingExtendingAnother_CountsOnlyTheShorter()
    {
        static int[] Words(string text) => text.Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(w => w.Length).ToArray();

        // Every word becomes its length: "True" and "true" are both [4], and "TRUE" too.
        var sequences = AnswerVariants.Sequences(Words, "Q", Words("Q"), AnswerVariants.TrueWords);

        Assert.Equal([[4]], sequences);
    }
}

public sealed class SamplingSeedTests
{
    private static GenerationRequest Request(string prompt, double topP = 1.0) =>
        new(GenerationPurpose.Abduction, "s", true, prompt, new Decoding(1.0, topP, 16, ["\n"]), 3);

    [Fact]
    public void For_SameSeedAndRequest_IsTheSame() =>
        Assert.Equal(SamplingSeed.For(7, Request("Q: x")), SamplingSeed.For(7, Request("Q: x")));

    [Fact]
    public void For_AnyDifference_ChangesTheSeed()
    {
        var seed = SamplingSeed.For(7, Request("Q: x"));

        Assert.NotEqual(seed, SamplingSeed.For(8, Request("Q: x")));
        Assert.NotEqual(seed, SamplingSeed.For(7, Request("Q: y")));
        Assert.NotEqual(seed, SamplingSeed.For(7, Request("Q: x", topP: 0.9)));
        Assert.NotEqual(seed, SamplingSeed.For(7, Request("Q: x") with { SampleIndex = 1 }));
        Assert.True(seed >= 0);
    }
}

public sealed class OnnxSignatureTests
{
    [Fact]
    public void Read_TinyDecoder_ListsItsCacheInputsAndOutputs()
    {
        // The names make_decoder.py exports (decoder.input_names / output_names, two layers).
        var signature = OnnxSignature.Read(Path.Combine(TinyModel.Directory, "model.onnx"));

        Assert.Equal(
            ["input_ids", "attention_mask", "position_ids", "past_key_values.0.key", "past_key_values.0.value", "past_key_values.1.key", "past_key_values.1.value"],
            signature.Inputs);
        Assert.Equal(["logits", "present.0.key", "present.0.value", "present.1.key", "present.1.value"], signature.Outputs);
    }

    [Fact]
    public void Read_NliEncoder_ListsItsInputs()
    {
        // models/README.md: inputs input_ids, attention_mask, token_type_ids; output logits.
        var signature = OnnxSignature.Read(Path.Combine(TinyModel.NliDirectory, "model.onnx"));

        Assert.Equal(["input_ids", "attention_mask", "token_type_ids"], signature.Inputs);
        Assert.Equal(["logits"], signature.Outputs);
    }

    [Fact]
    public void Read_TextFile_IsRefused()
    {
        using var folder = new TempDirectory();
        File.WriteAllText(folder.File("x.onnx"), "not a model at all");

        Assert.Throws<InvalidDataException>(() => OnnxSignature.Read(folder.File("x.onnx")));
    }
}
