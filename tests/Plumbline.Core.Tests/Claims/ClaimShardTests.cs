using Plumbline.Core.Claims;

namespace Plumbline.Core.Tests.Claims;

public sealed class ClaimShardTests
{
    /// <summary>
    /// Expected shards computed outside .NET: the first 16 hex digits of `printf %s ID | sha256sum` (GNU coreutils)
    /// read as an unsigned 64-bit number h in Python, then 1 + h % N. "abc" is the FIPS 180-4 example message, whose
    /// digest begins ba7816bf8f01cfea. These pin the assignment across machines and .NET versions.
    /// </summary>
    [Theory]
    [InlineData("abc", 2, 1)]
    [InlineData("abc", 3, 1)]
    [InlineData("abc", 5, 5)]
    [InlineData("abc", 7, 3)]
    [InlineData("kettle-warranty", 3, 1)]
    [InlineData("kettle-warranty", 7, 4)]
    [InlineData("toaster-slots", 3, 2)]
    [InlineData("toaster-slots", 5, 5)]
    [InlineData("toaster-slots", 7, 7)]
    [InlineData("c1", 3, 3)]
    [InlineData("c1", 5, 1)]
    public void Of_KnownIds_ShardFromTheSha256Digest(string id, int count, int shard) =>
        Assert.Equal(shard, ClaimShard.Of(id, count));

    [Fact]
    public void Of_ManyIds_EachInExactlyOneShardAndEveryShardUsed()
    {
        var ids = Enumerable.Range(0, 600).Select(i => $"claim-{i}").ToList();

        var owners = ids.Select(id => Enumerable.Range(1, 4).Where(k => new ClaimShard(k, 4).Contains(id)).ToList()).ToList();

        Assert.All(owners, o => Assert.Single(o));
        var sizes = owners.GroupBy(o => o[0]).ToDictionary(g => g.Key, g => g.Count());
        Assert.Equal([1, 2, 3, 4], sizes.Keys.Order());
        // A fair split of 600 puts 150 in each; a hash this uneven would be a bug, not bad luck (p < 1e-6).
        Assert.All(sizes.Values, n => Assert.InRange(n, 100, 200));
    }

    [Fact]
    public void Of_OneShard_EverythingInIt() => Assert.Equal(1, ClaimShard.Of("anything", 1));

    [Theory]
    [InlineData("2/5", 2, 5)]
    [InlineData(" 1 / 1 ", 1, 1)]
    [InlineData("10/10", 10, 10)]
    public void Parse_Valid(string text, int index, int count) => Assert.Equal(new ClaimShard(index, count), ClaimShard.Parse(text));

    [Theory]
    [InlineData("4/3", "'4/3': K must be from 1 to N (3)")]
    [InlineData("0/2", "'0/2': K must be from 1 to N (2)")]
    [InlineData("1/0", "'1/0': N must be from 1 to 10000")]
    [InlineData("-1/3", "'-1/3' is not K/N (shard K of N, for example 2/5)")]
    [InlineData("2", "'2' is not K/N (shard K of N, for example 2/5)")]
    [InlineData("a/b", "'a/b' is not K/N (shard K of N, for example 2/5)")]
    public void Parse_Invalid_SaysWhy(string text, string message) =>
        Assert.Equal(message, Assert.Throws<FormatException>(() => ClaimShard.Parse(text)).Message);
}
