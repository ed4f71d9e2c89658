using Microsoft.ML.OnnxRuntime;

namespace Plumbline.Nli;

/// <summary>Which of the usual encoder inputs the graph takes; input_ids is always required, the others are optional.</summary>
internal sealed record ModelInputs(bool AttentionMask, bool TokenTypeIds)
{
    public const string InputIdsName = "input_ids";
    public const string AttentionMaskName = "attention_mask";
    public const string TokenTypeIdsName = "token_type_ids";

    public static ModelInputs Of(IReadOnlyDictionary<string, NodeMetadata> inputs, string modelFile)
    {
        foreach (var (name, metadata) in inputs)
        {
            if (name is not (InputIdsName or AttentionMaskName or TokenTypeIdsName))
            {
                throw new NliModelException(modelFile, $"unsupported graph input '{name}'; expected {InputIdsName}, {AttentionMaskName}, {TokenTypeIdsName}");
            }

            if (!metadata.IsTensor || metadata.ElementType != typeof(long) || metadata.Dimensions.Length != 2)
            {
                throw new NliModelException(modelFile, $"graph input '{name}' must be an int64 tensor [batch, sequence]");
            }
        }

        if (!inputs.ContainsKey(InputIdsName))
        {
            throw new NliModelException(modelFile, $"graph has no '{InputIdsName}' input");
        }

        return new ModelInputs(inputs.ContainsKey(AttentionMaskName), inputs.ContainsKey(TokenTypeIdsName));
    }
}
