using System.Text.Json.Nodes;

namespace Plumbline.LocalModel.Tests;

/// <summary>A folder with a chat template wraps every prompt in it, as one user message with the assistant's turn opened.</summary>
public sealed class ChatTemplateTests
{
    // A minimal template in the Jinja syntax model folders use; rendered by hand below.
    private const string Template =
        "{% for m in messages %}<|{{ m['role'] }}|>{{ m['content'] }}\n{% endfor %}{% if add_generation_prompt %}<|assistant|>{% endif %}";

    [Fact]
    public void Open_TemplateInTokenizerConfig_WrapsPrompts()
    {
        using var folder = TempDirectory.WithTinyModel();
        var config = JsonNode.Parse(File.ReadAllText(folder.File("tokenizer_config.json")))!.AsObject();
        config["chat_template"] = Template;
        File.WriteAllText(folder.File("tokenizer_config.json"), config.ToJsonString());

        using var model = LocalLanguageModel.Open(folder.Path);

        Assert.True(model.UsesChatTemplate);
        Assert.Equal("<|user|>Is the lake frozen?\n<|assistant|>", model.Render("Is the lake frozen?"));
    }

    [Fact]
    public void Open_TemplateFile_WrapsPromptsAndTheModelSeesTheWrappedText()
    {
        using var folder = TempDirectory.WithTinyModel();
        File.WriteAllText(folder.File("chat_template.jinja"), Template);
        using var templated = LocalLanguageModel.Open(folder.Path);
        using var plain = TinyModel.Open();
        var prompt = TinyModel.Reference.Answers[1].Prompt;

        var wrapped = templated.NextTokenProbabilities(prompt);
        var byHand = plain.NextTokenProbabilities("<|user|>" + prompt + "\n<|assistant|>");

        Assert.Equal(byHand, wrapped);
        Assert.NotEqual(plain.NextTokenProbabilities(prompt), wrapped);
    }

    [Fact]
    public void Open_NoTemplate_LeavesPromptsAsTheyAre()
    {
        using var model = TinyModel.Open();

        Assert.Equal("Q: x?\nA:", model.Render("Q: x?\nA:"));
    }
}
