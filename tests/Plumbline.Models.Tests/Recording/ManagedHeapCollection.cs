using Xunit;

namespace Plumbline.Models.Tests.Recording;

/// <summary>Tests that measure the whole managed heap: they run alone, since tests running beside them would add to it.</summary>
[CollectionDefinition(Name, DisableParallelization = true)]
public sealed class ManagedHeapCollection
{
    public const string Name = "managed heap";
}
