using System.Buffers.Binary;
using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Plumbline.Core.Language;

namespace Plumbline.LocalModel;

/// <summary>
/// One sampling seed per request, derived from the run's seed and everything the request says (prompt,
/// decoding, count, sample index). Requests of a run arrive in an order that depends on timing; seeding each from its own
/// content makes every request's samples the same in every run with the same seed.
/// </summary>
internal static class SamplingSeed
{
    public static int For(int runSeed, GenerationRequest request)
    {
        var text = new StringBuilder();
        text.Append(runSeed.ToString(CultureInfo.InvariantCulture)).Append('\0')
            .Append(request.Prompt).Append('\0')
            .Append(request.Decoding.Temperature.ToString("R", CultureInfo.InvariantCulture)).Append('\0')
            .Append(request.Decoding.TopP.ToString("R", CultureInfo.InvariantCulture)).Append('\0')
            .Append(request.Decoding.MaxTokens.ToString(CultureInfo.InvariantCulture)).Append('\0')
            .Append(request.Count.ToString(CultureInfo.InvariantCulture)).Append('\0')
            .Append(request.SampleIndex.ToString(CultureInfo.InvariantCulture));
        foreach (var stop in request.Decoding.Stop)
        {
            text.Append('\0').Append(stop);
        }

        var hash = SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString()));
        return (int)(BinaryPrimitives.ReadUInt32LittleEndian(hash) & int.MaxValue);
    }
}
