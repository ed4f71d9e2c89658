using System.Text.Json.Serialization;
using Plumbline.Core.Language;

namespace Plumbline.Core.Trees;

/// <summary>Per-depth growth settings; <see cref="Levels"/>[0] is depth 1. The maximum depth is the number of levels.</summary>
public sealed record TreeShape(IReadOnlyList<LevelShape> Levels)
{
    /// <summary>
    /// Depth 1: three explanations per answer by nucleus sampling (p = 1.0, temperature 1.0), for
    /// variety; depth 2: one per answer, greedy, because deeper nodes only need to settle their parent.
    /// </summary>
    public static TreeShape Default { get; } = new(
    [
        new LevelShape(3, Decoding.Sampling(topP: 1.0, temperature: 1.0)),
        new LevelShape(1, Decoding.Greedy()),
    ]);

    [JsonIgnore]
    public int MaxDepth => Levels.Count;

    /// <summary>The most statements a tree of this shape can hold besides the root.</summary>
    [JsonIgnore]
    public int MaxStatements
    {
        get
        {
            int total = 0, parents = 1;
            foreach (var level in Levels)
            {
                parents *= 2 * level.Width;
                total += parents;
            }

            return total;
        }
    }

    public LevelShape AtDepth(int depth) => Levels[depth - 1];
}
