using System.Runtime.CompilerServices;
using Plumbline.Models.Recording;
using Xunit;

namespace Plumbline.Models.Tests.Recording;

/// <summary>Resident memory of a loaded recording; in a collection that runs alone, as it measures the whole heap.</summary>
[Collection(ManagedHeapCollection.Name)]
public sealed class RecordingLanguageModelMemoryTests : IDisposable
{
    private const int Subjects = 5_000;
    private const int Entries = 4 * Subjects;

    // What a loaded recording may keep per distinct request. The index holds a 16-byte key and a 16-byte line position
    // in a frozen table with its hash codes and buckets, and an 8-byte topic hash and a line number in another: about
    // 95 bytes. Just after loading, the dictionaries they were frozen from (about 170 bytes a request) can still be
    // reachable from the thread-pool thread that ran the load's last step, and the shared array pool keeps the scratch
    // arrays of freezing: measured here, 145 to 292 bytes a request. The bound leaves twice the larger. A loader that
    // keeps every line parsed holds about 2,600 bytes a request of this shape (the one before the index: 52 MB for
    // this 5 MB file), so it fails by a factor of four.
    private const long BytesPerEntry = 600;

    private readonly TempDirectory temp = new();

    public void Dispose() => temp.Dispose();

    /// <summary>The shape of a benchmark recording: for each claim its answer and its negation's, and an explanation each
    /// way. A method of its own, so that the lines written are no longer referenced from the test's frame when the
    /// heap is measured.</summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private string WriteRecording() => temp.Write("rec.jsonl", [.. Enumerable.Range(1, Subjects).SelectMany(i =>
    {
        var claim = $"Appliance model {i} ships with a {2 + i % 4}-year warranty.";
        return new[]
        {
            Requests.AnswerLine(claim, "0.7", "0.30000000000000004"),
            Requests.AnswerLine("It is not true that " + claim, "0.30000000000000004", "0.7"),
            Requests.AbductionLine(claim, true, 1, "Reason 0 for: " + claim),
            Requests.AbductionLine(claim, false, 1, "Reason 0 against: " + claim),
        };
    })]);

    [Fact]
    public async Task LoadAsync_TwentyThousandEntries_ResidentManagedMemoryWithinTheIndexBound()
    {
        var path = WriteRecording();

        var before = GC.GetTotalMemory(forceFullCollection: true);
        var model = await RecordingLanguageModel.LoadAsync(path, Requests.Version, CancellationToken.None);
        var resident = GC.GetTotalMemory(forceFullCollection: true) - before;
        var count = model.Count;
        GC.KeepAlive(model);

        Assert.Equal(Entries, count);
        Assert.True(resident < Entries * BytesPerEntry,
            $"{resident:N0} bytes resident for {Entries:N0} entries ({resident / Entries:N0} a request) in a file of {new FileInfo(path).Length:N0} bytes");
    }
}
