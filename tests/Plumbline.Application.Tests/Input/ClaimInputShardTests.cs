using Plumbline.Application.Input;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Tests.Input;

public sealed class ClaimInputShardTests
{
    /// <summary>
    /// SHA-256 of the two claims below in the digest's layout (per claim: id, text as 4-byte little-endian length and
    /// UTF-8 bytes, gold as one byte 1/0/2, tag count, tags), computed with Python's hashlib and struct.pack('&lt;i').
    /// </summary>
    private const string TwoClaimsDigest = "sha256:0ba2aca6b90f97a6fc31d42afdade58e86b6761d8feb79c18ab7a82152880ec9";

    [Fact]
    public async Task Identity_SameClaimsAsJsonLinesOrCsv_SameDigestAsAnOutsideComputation()
    {
        using var folder = new TempDirectory();
        using var jsonl = await ClaimInput.OpenFileAsync(folder.Write("a.jsonl",
            "{\"id\": \"bats\", \"claim\": \"Bats are mammals.\", \"gold\": true, \"tags\": [\"biology\"]}\n\n{\"id\": \"sun\", \"claim\": \"The sun orbits the earth.\"}\n"),
            ClaimFileFormat.Auto, CancellationToken.None);
        using var csv = await ClaimInput.OpenFileAsync(folder.Write("b.csv",
            "id,claim,gold,tags\r\nbats,Bats are mammals.,yes,biology\r\nsun,The sun orbits the earth.,,\r\n"),
            ClaimFileFormat.Auto, CancellationToken.None);

        Assert.Equal(TwoClaimsDigest, jsonl.Identity.Digest);
        Assert.Equal(TwoClaimsDigest, csv.Identity.Digest);
        Assert.Equal((2, (ClaimShard?)null), (jsonl.Identity.Claims, jsonl.Identity.Shard));
    }

    [Fact]
    public void Identity_OneClaimChanged_DigestChanges()
    {
        var one = ClaimInput.FromClaims("x", [new Claim("a", "Bats are mammals.", true)]);
        var other = ClaimInput.FromClaims("x", [new Claim("a", "Bats are mammals.", false)]);

        Assert.NotEqual(one.Identity.Digest, other.Identity.Digest);
    }

    [Fact]
    public async Task Sharded_EveryClaimInOneShardWithItsPlaceInTheWhole()
    {
        var claims = Enumerable.Range(1, 40).Select(i => new Claim($"q{i}", $"Claim {i}.")).ToList();
        using var whole = ClaimInput.FromClaims("file", claims);

        var seen = new List<NumberedClaim>();
        for (var k = 1; k <= 3; k++)
        {
            var shard = whole.Sharded(new ClaimShard(k, 3));
            var numbered = await shard.ReadNumberedAsync(CancellationToken.None).ToListAsync();
            Assert.Equal(numbered.Count, shard.Count);
            Assert.Equal(40, shard.TotalCount);
            Assert.Equal(new ClaimShard(k, 3), shard.Identity.Shard);
            Assert.Equal(whole.Identity.Digest, shard.Identity.Digest);
            Assert.All(numbered, n => Assert.Equal(k, ClaimShard.Of(n.Claim.Id, 3)));
            Assert.Equal(numbered.Select(n => n.Position).Order(), numbered.Select(n => n.Position));
            seen.AddRange(numbered);
        }

        Assert.Equal(Enumerable.Range(1, 40), seen.Select(n => n.Position).Order());
        Assert.All(seen, n => Assert.Equal($"q{n.Position}", n.Claim.Id));
    }

    [Fact]
    public async Task ReadNumbered_BadLinesAreNotCounted()
    {
        using var folder = new TempDirectory();
        using var input = await ClaimInput.OpenFileAsync(folder.Write("c.jsonl",
            "{\"id\": \"a\", \"claim\": \"One.\"}\n{\"id\": \"b\"}\n{\"id\": \"c\", \"claim\": \"Three.\"}\n"), ClaimFileFormat.Auto, CancellationToken.None);

        var numbered = await input.ReadNumberedAsync(CancellationToken.None).ToListAsync();

        Assert.Equal([(1, "a"), (2, "c")], numbered.Select(n => (n.Position, n.Claim.Id)));
    }
}
