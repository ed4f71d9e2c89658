using Microsoft.ML.OnnxRuntime;
using Plumbline.Nli.Tokenization;

namespace Plumbline.Nli;

/// <summary>
/// A tokenised, padded batch as the graph's named inputs. Benchmarks can hand <see cref="InputNames"/> and
/// <see cref="Values"/> straight to <see cref="InferenceSession.Run(RunOptions, IReadOnlyCollection{string}, IReadOnlyCollection{OrtValue}, IReadOnlyCollection{string})"/>.
/// </summary>
public sealed class NliTensorBatch : IDisposable
{
    private readonly OrtValue[] values;

    private NliTensorBatch(IReadOnlyList<string> inputNames, OrtValue[] values, int count, int sequenceLength)
    {
        InputNames = inputNames;
        this.values = values;
        Count = count;
        SequenceLength = sequenceLength;
    }

    public IReadOnlyList<string> InputNames { get; }

    public IReadOnlyList<OrtValue> Values => values;

    /// <summary>Pairs in the batch.</summary>
    public int Count { get; }

    /// <summary>Tokens per row after padding to the longest pair of the batch.</summary>
    public int SequenceLength { get; }

    /// <summary>Pads to the longest pair; padding has attention 0 so it does not change the other rows' logits.</summary>
    internal static NliTensorBatch Create(IReadOnlyList<EncodedPair> pairs, ModelInputs inputs, long paddingId)
    {
        var count = pairs.Count;
        var length = pairs.Max(pair => pair.Length);
        var ids = new long[count * length];
        var mask = new long[count * length];
        var types = inputs.TokenTypeIds ? new long[count * length] : null;
        Array.Fill(ids, paddingId);
        for (var row = 0; row < count; row++)
        {
            var pair = pairs[row];
            var offset = row * length;
            pair.InputIds.CopyTo(ids, offset);
            mask.AsSpan(offset, pair.Length).Fill(1);
            if (types is not null)
            {
                pair.TypeIds.CopyTo(types, offset);
            }
        }

        long[] shape = [count, length];
        var names = new List<string> { ModelInputs.InputIdsName };
        var values = new List<OrtValue> { OrtValue.CreateTensorValueFromMemory(ids, shape) };
        if (inputs.AttentionMask)
        {
            names.Add(ModelInputs.AttentionMaskName);
            values.Add(OrtValue.CreateTensorValueFromMemory(mask, shape));
        }

        if (types is not null)
        {
            names.Add(ModelInputs.TokenTypeIdsName);
            values.Add(OrtValue.CreateTensorValueFromMemory(types, shape));
        }

        return new NliTensorBatch(names, [.. values], count, length);
    }

    public void Dispose()
    {
        foreach (var value in values)
        {
            value.Dispose();
        }
    }
}
