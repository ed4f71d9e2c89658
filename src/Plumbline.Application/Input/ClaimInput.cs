using System.Runtime.CompilerServices;
using System.Text;
using Plumbline.Core.Claims;

namespace Plumbline.Application.Input;

/// <summary>
/// A claim input checked up front: every record is read once before anything is judged, so that bad lines and
/// duplicate ids are known (and, in strict mode, refused) before a model call is spent, and so the run knows how
/// many claims lie ahead. Judging then reads the input again, lazily, skipping the bad lines. Standard input is
/// copied to a temporary file first so it can be read twice. Only the ids seen are held in memory.
/// </summary>
public sealed class ClaimInput : IDisposable
{
    /// <summary>The name standard input goes by in messages.</summary>
    public const string StandardInputName = "stdin";

    private readonly Func<CancellationToken, IAsyncEnumerable<ClaimLine>> open;
    private readonly HashSet<int> badLines;
    private readonly string? temporaryFile;

    private ClaimInput(
        string name,
        Func<CancellationToken, IAsyncEnumerable<ClaimLine>> open,
        int count,
        IReadOnlyList<ClaimFileException> problems,
        HashSet<int> badLines,
        string? temporaryFile)
    {
        Name = name;
        this.open = open;
        Count = count;
        Problems = problems;
        this.badLines = badLines;
        this.temporaryFile = temporaryFile;
    }

    /// <summary>The input's name in messages: the file's path, "stdin", or "command line".</summary>
    public string Name { get; }

    /// <summary>Usable claims.</summary>
    public int Count { get; }

    /// <summary>Records that cannot be used (malformed, duplicate id ...), in input order.</summary>
    public IReadOnlyList<ClaimFileException> Problems { get; }

    /// <summary>Claims given directly (command-line arguments); their ids must be distinct.</summary>
    public static ClaimInput FromClaims(string name, IReadOnlyList<Claim> claims)
    {
        ArgumentNullException.ThrowIfNull(claims);
        if (claims.Select(c => c.Id).Distinct(StringComparer.Ordinal).Count() != claims.Count)
        {
            throw new ArgumentException("claim ids must be distinct", nameof(claims));
        }

        return new ClaimInput(name, ct => Lines(claims), claims.Count, [], [], null);
    }

    /// <summary>Opens and checks a claim file.</summary>
    /// <exception cref="ClaimFileException">The input as a whole cannot be read (a CSV header without a claim column ...).</exception>
    /// <exception cref="FileNotFoundException">The file does not exist.</exception>
    public static Task<ClaimInput> OpenFileAsync(string path, ClaimFileFormat format, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        var chosen = format == ClaimFileFormat.Auto ? FormatOf(path) : format;
        return CheckAsync(path, path, chosen, temporaryFile: null, cancellationToken);
    }

    /// <summary>Copies standard input to a temporary file, then checks it like a file. Auto format looks at the first line.</summary>
    public static async Task<ClaimInput> OpenStreamAsync(Stream input, ClaimFileFormat format, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(input);
        var copy = Path.Combine(Path.GetTempPath(), $"plumb-stdin-{Guid.NewGuid():N}.txt");
        try
        {
            await using (var file = new FileStream(copy, FileMode.CreateNew, FileAccess.Write, FileShare.None))
            {
                await input.CopyToAsync(file, cancellationToken);
            }

            var chosen = format == ClaimFileFormat.Auto ? await SniffAsync(copy, cancellationToken) : format;
            return await CheckAsync(StandardInputName, copy, chosen, copy, cancellationToken);
        }
        catch
        {
            File.Delete(copy);
            throw;
        }
    }

    /// <summary>The format a file name suggests: .csv, .txt, else JSON Lines.</summary>
    public static ClaimFileFormat FormatOf(string path) => Path.GetExtension(path).ToLowerInvariant() switch
    {
        ".csv" => ClaimFileFormat.Csv,
        ".txt" => ClaimFileFormat.PlainText,
        _ => ClaimFileFormat.JsonLines,
    };

    /// <summary>The usable claims, in input order, read lazily.</summary>
    public async IAsyncEnumerable<Claim> ReadAsync([EnumeratorCancellation] CancellationToken cancellationToken)
    {
        await foreach (var line in open(cancellationToken).WithCancellation(cancellationToken))
        {
            if (line.Claim is { } claim && !badLines.Contains(line.Line))
            {
                yield return claim;
            }
        }
    }

    public void Dispose()
    {
        if (temporaryFile is not null)
        {
            File.Delete(temporaryFile);
        }
    }

    private static async Task<ClaimInput> CheckAsync(string name, string path, ClaimFileFormat format, string? temporaryFile, CancellationToken cancellationToken)
    {
        IAsyncEnumerable<ClaimLine> Open(CancellationToken ct) => ReadFileAsync(path, name, format, ct);

        var seen = new Dictionary<string, int>(StringComparer.Ordinal);
        var problems = new List<ClaimFileException>();
        var bad = new HashSet<int>();
        await foreach (var line in Open(cancellationToken).WithCancellation(cancellationToken))
        {
            if (line.Problem is { } problem)
            {
                problems.Add(problem);
                bad.Add(line.Line);
            }
            else if (!seen.TryAdd(line.Claim!.Id, line.Line))
            {
                problems.Add(new ClaimFileException(name, line.Line, "id", $"duplicate id '{line.Claim.Id}' (first used on line {seen[line.Claim.Id]})"));
                bad.Add(line.Line);
            }
        }

        if (seen.Count == 0 && problems.Count == 0)
        {
            throw new ClaimFileException(name, 1, null, "the input holds no claim");
        }

        return new ClaimInput(name, Open, seen.Count, problems, bad, temporaryFile);
    }

    private static async IAsyncEnumerable<ClaimLine> ReadFileAsync(
        string path,
        string name,
        ClaimFileFormat format,
        [EnumeratorCancellation] CancellationToken cancellationToken)
    {
        // A UTF-8 byte order mark is dropped; invalid bytes become U+FFFD rather than stop the read.
        using var reader = new StreamReader(path, Encoding.UTF8, detectEncodingFromByteOrderMarks: true);
        var lines = format switch
        {
            ClaimFileFormat.Csv => CsvClaims.ReadAsync(reader, name, cancellationToken),
            ClaimFileFormat.PlainText => PlainTextClaims.ReadAsync(reader, name, cancellationToken),
            _ => JsonLinesClaims.ReadAsync(reader, name, cancellationToken),
        };
        await foreach (var line in lines)
        {
            yield return line;
        }
    }

    /// <summary>JSON Lines when the first non-blank line opens an object; CSV when it is a header with a claim column; else plain text.</summary>
    private static async Task<ClaimFileFormat> SniffAsync(string path, CancellationToken cancellationToken)
    {
        using var reader = new StreamReader(path, Encoding.UTF8, detectEncodingFromByteOrderMarks: true);
        while (await reader.ReadLineAsync(cancellationToken) is { } line)
        {
            var text = line.Trim();
            if (text.Length == 0)
            {
                continue;
            }

            if (text.StartsWith('{'))
            {
                return ClaimFileFormat.JsonLines;
            }

            var columns = text.Split(',', StringSplitOptions.TrimEntries);
            return columns.Length > 1 && columns.Contains("claim", StringComparer.OrdinalIgnoreCase)
                ? ClaimFileFormat.Csv
                : ClaimFileFormat.PlainText;
        }

        return ClaimFileFormat.JsonLines;
    }

    private static async IAsyncEnumerable<ClaimLine> Lines(IReadOnlyList<Claim> claims)
    {
        for (var i = 0; i < claims.Count; i++)
        {
            yield return ClaimLine.Good(i + 1, claims[i]);
        }

        await Task.CompletedTask;
    }
}
