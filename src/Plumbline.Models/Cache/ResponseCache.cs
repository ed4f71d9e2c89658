using System.Globalization;
using System.Text;
using System.Threading.Channels;
using Microsoft.Data.Sqlite;
using Plumbline.Core.Language;
using Plumbline.Models.Recording;

namespace Plumbline.Models.Cache;

/// <summary>
/// Model responses kept in one SQLite file (write-ahead log, so readers never wait for the writer and
/// several processes can share the file). Within a process one writer task commits everything queued
/// in one transaction; a store completes only once its row is committed, so a response the engine has
/// seen survives the process being killed. Rows hold the recording format's canonical request and
/// response, so the cache exports to a recording and imports from one without translation.
/// </summary>
public sealed class ResponseCache : IAsyncDisposable
{
    private const string Format = "plumbline-responses";
    private const string Version = "1";
    private static readonly byte[] SqliteHeader = "SQLite format 3\0"u8.ToArray();

    private readonly string connectionString;
    private readonly TimeProvider time;
    private readonly SqliteConnection writer;
    private readonly Channel<PendingRow> queue = Channel.CreateUnbounded<PendingRow>(new UnboundedChannelOptions { SingleReader = true });
    private readonly Task writing;

    private ResponseCache(string path, string connectionString, SqliteConnection writer, TimeProvider time)
    {
        FilePath = path;
        this.connectionString = connectionString;
        this.writer = writer;
        this.time = time;
        writing = Task.Run(WriteLoopAsync);
    }

    public string FilePath { get; }

    /// <summary>Opens the cache file, creating it (and its folder) when missing.</summary>
    /// <exception cref="ResponseCacheException">The file is not a response cache, or cannot be created.</exception>
    public static async Task<ResponseCache> OpenAsync(string path, TimeProvider time, CancellationToken cancellationToken)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        ArgumentNullException.ThrowIfNull(time);
        path = Path.GetFullPath(path);
        CheckHeader(path);
        try
        {
            Directory.CreateDirectory(Path.GetDirectoryName(path)!);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new ResponseCacheException($"cache: cannot create folder '{Path.GetDirectoryName(path)}': {e.Message}", e);
        }

        var connectionString = new SqliteConnectionStringBuilder
        {
            DataSource = path,
            Mode = SqliteOpenMode.ReadWriteCreate,
            Pooling = true,
            // Another process may hold the write lock; wait for it rather than fail.
            DefaultTimeout = 60,
        }.ToString();
        var writer = new SqliteConnection(connectionString);
        try
        {
            await writer.OpenAsync(cancellationToken).ConfigureAwait(false);
            Prepare(writer, path);
        }
        catch (SqliteException e)
        {
            await writer.DisposeAsync().ConfigureAwait(false);
            throw e.SqliteErrorCode == 26
                ? NotACache(path, "not an SQLite database")
                : new ResponseCacheException($"cache: '{path}' cannot be opened ({e.Message})", e);
        }
        catch
        {
            await writer.DisposeAsync().ConfigureAwait(false);
            throw;
        }

        return new ResponseCache(path, connectionString, writer, time);
    }

    /// <summary>The stored response JSON of a key, or null.</summary>
    internal async Task<string?> FindAsync(string key, CancellationToken cancellationToken)
    {
        await using var connection = new SqliteConnection(connectionString);
        await connection.OpenAsync(cancellationToken).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT response FROM responses WHERE key = $key";
        command.Parameters.AddWithValue("$key", key);
        return await command.ExecuteScalarAsync(cancellationToken).ConfigureAwait(false) as string;
    }

    /// <summary>Stores a response and completes once it is committed. An existing row for the key is kept
    /// unless <paramref name="replace"/>.</summary>
    internal Task StoreAsync(ModelIdentity identity, string key, RequestFingerprint request, string responseJson, bool replace)
    {
        var pending = new PendingRow(identity, key, request.Key, request.Kind, request.CanonicalJson, responseJson, replace);
        return queue.Writer.TryWrite(pending)
            ? pending.Committed.Task
            : Task.FromException(new ObjectDisposedException(nameof(ResponseCache)));
    }

    /// <summary>Every identity in the cache with its counts, newest first.</summary>
    public async Task<IReadOnlyList<CachedIdentity>> InspectAsync(CancellationToken cancellationToken)
    {
        await using var connection = await OpenReaderAsync(cancellationToken).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = """
            SELECT i.key, i.identity,
                   SUM(r.kind = 'generate'), SUM(r.kind = 'answer'), MIN(r.created), MAX(r.created)
            FROM identities i JOIN responses r ON r.identity = i.key
            GROUP BY i.key ORDER BY MAX(r.created) DESC, i.key
            """;
        var identities = new List<CachedIdentity>();
        await using var reader = await command.ExecuteReaderAsync(cancellationToken).ConfigureAwait(false);
        while (await reader.ReadAsync(cancellationToken).ConfigureAwait(false))
        {
            identities.Add(new CachedIdentity(
                reader.GetString(0), reader.GetString(1), reader.GetInt32(2), reader.GetInt32(3),
                ParseTime(reader.GetString(4)), ParseTime(reader.GetString(5))));
        }

        return identities;
    }

    /// <summary>The identity a key prefix names.</summary>
    /// <exception cref="ResponseCacheException">No identity or several identities start with the prefix.</exception>
    public async Task<CachedIdentity> ResolveAsync(string? keyPrefix, CancellationToken cancellationToken)
    {
        var all = await InspectAsync(cancellationToken).ConfigureAwait(false);
        var matching = all.Where(i => keyPrefix is null || i.Key.StartsWith(keyPrefix, StringComparison.OrdinalIgnoreCase)).ToList();
        return matching.Count switch
        {
            1 => matching[0],
            0 => throw new ResponseCacheException(keyPrefix is null
                ? $"cache: '{FilePath}' is empty"
                : $"cache: no model identity in '{FilePath}' starts with '{keyPrefix}' (see plumb cache inspect)"),
            _ => throw new ResponseCacheException(
                $"cache: {matching.Count} model identities match{(keyPrefix is null ? "" : $" '{keyPrefix}'")}; name one with --identity (see plumb cache inspect)"),
        };
    }

    /// <summary>Writes every response of one identity to a new recording file, oldest first. Returns the lines written.</summary>
    public async Task<int> ExportAsync(string identityKey, string recordingPath, CancellationToken cancellationToken)
    {
        await using var connection = await OpenReaderAsync(cancellationToken).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT request_key, request, response FROM responses WHERE identity = $identity ORDER BY created, key";
        command.Parameters.AddWithValue("$identity", identityKey);
        await using var file = new FileStream(recordingPath, FileMode.CreateNew, FileAccess.Write, FileShare.Read);
        await using var text = new StreamWriter(file, new UTF8Encoding(false)) { NewLine = "\n" };
        var lines = 0;
        await using var reader = await command.ExecuteReaderAsync(cancellationToken).ConfigureAwait(false);
        var written = new HashSet<string>(StringComparer.Ordinal);
        while (await reader.ReadAsync(cancellationToken).ConfigureAwait(false))
        {
            // Two rendered prompts of one request (a template change without a version bump) would give one
            // recording key two responses; the first is kept, as a recording allows one.
            if (written.Add(reader.GetString(0)))
            {
                await text.WriteLineAsync(RecordingLine.Format(reader.GetString(0), reader.GetString(1), reader.GetString(2)).AsMemory(), cancellationToken).ConfigureAwait(false);
                lines++;
            }
        }

        return lines;
    }

    /// <summary>Files every line of a recording under <paramref name="identity"/>, keyed with the prompt this build
    /// renders for it. Entries already cached are kept. Returns how many were added.</summary>
    /// <exception cref="RecordingFormatException">A line of the recording is malformed.</exception>
    public async Task<int> ImportAsync(string recordingPath, ModelIdentity identity, string promptVersion, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(identity);
        var entries = await RecordingReader.ReadAsync(recordingPath, promptVersion, cancellationToken).ConfigureAwait(false);
        var before = await CountAsync(cancellationToken).ConfigureAwait(false);
        await Task.WhenAll(entries.Select(entry =>
        {
            var prompt = entry.GenerationAsked?.Prompt ?? entry.AnswerAsked!.Prompt;
            return StoreAsync(identity, ResponseCacheKey.Of(identity, entry.Fingerprint, prompt), entry.Fingerprint, entry.ResponseJson, replace: false);
        })).ConfigureAwait(false);
        return await CountAsync(cancellationToken).ConfigureAwait(false) - before;
    }

    /// <summary>Deletes the responses of one identity (all when null) stored before <paramref name="olderThan"/> (any time when null). Returns how many.</summary>
    public async Task<int> PruneAsync(string? identityKey, DateTimeOffset? olderThan, CancellationToken cancellationToken)
    {
        int removed;
        await using (var connection = await OpenReaderAsync(cancellationToken).ConfigureAwait(false))
        {
            await using var command = connection.CreateCommand();
            command.CommandText = "DELETE FROM responses WHERE ($identity IS NULL OR identity = $identity) AND ($before IS NULL OR created < $before)";
            command.Parameters.AddWithValue("$identity", (object?)identityKey ?? DBNull.Value);
            command.Parameters.AddWithValue("$before", olderThan is { } t ? TimeText(t) : DBNull.Value);
            removed = await command.ExecuteNonQueryAsync(cancellationToken).ConfigureAwait(false);
            command.CommandText = "DELETE FROM identities WHERE key NOT IN (SELECT DISTINCT identity FROM responses)";
            command.Parameters.Clear();
            await command.ExecuteNonQueryAsync(cancellationToken).ConfigureAwait(false);
        }

        return removed;
    }

    /// <summary>Responses stored, all identities together.</summary>
    public async Task<int> CountAsync(CancellationToken cancellationToken)
    {
        await using var connection = await OpenReaderAsync(cancellationToken).ConfigureAwait(false);
        await using var command = connection.CreateCommand();
        command.CommandText = "SELECT COUNT(*) FROM responses";
        return Convert.ToInt32(await command.ExecuteScalarAsync(cancellationToken).ConfigureAwait(false), CultureInfo.InvariantCulture);
    }

    public async ValueTask DisposeAsync()
    {
        queue.Writer.TryComplete();
        await writing.ConfigureAwait(false);
        await writer.DisposeAsync().ConfigureAwait(false);
        // Pooled connections keep the file (and its WAL) open; let go of them so the file can be moved or removed.
        SqliteConnection.ClearPool(new SqliteConnection(connectionString));
    }

    private async Task<SqliteConnection> OpenReaderAsync(CancellationToken cancellationToken)
    {
        var connection = new SqliteConnection(connectionString);
        await connection.OpenAsync(cancellationToken).ConfigureAwait(false);
        return connection;
    }

    private async Task WriteLoopAsync()
    {
        var reader = queue.Reader;
        var batch = new List<PendingRow>();
        while (await reader.WaitToReadAsync().ConfigureAwait(false))
        {
            batch.Clear();
            while (batch.Count < 512 && reader.TryRead(out var row))
            {
                batch.Add(row);
            }

            try
            {
                Commit(batch);
                foreach (var row in batch)
                {
                    row.Committed.TrySetResult();
                }
            }
            catch (Exception e)
            {
                foreach (var row in batch)
                {
                    row.Committed.TrySetException(e);
                }
            }
        }
    }

    private void Commit(List<PendingRow> batch)
    {
        var created = TimeText(time.GetUtcNow());
        using var transaction = writer.BeginTransaction(deferred: false);
        using var identity = writer.CreateCommand();
        identity.Transaction = transaction;
        identity.CommandText = "INSERT OR IGNORE INTO identities(key, identity) VALUES ($key, $identity)";
        var identityKey = identity.Parameters.Add("$key", SqliteType.Text);
        var identityJson = identity.Parameters.Add("$identity", SqliteType.Text);
        using var keep = writer.CreateCommand();
        keep.Transaction = transaction;
        using var replace = writer.CreateCommand();
        replace.Transaction = transaction;
        const string Columns = "responses(key, identity, request_key, kind, request, response, created) VALUES ($key, $identity, $request_key, $kind, $request, $response, $created)";
        keep.CommandText = "INSERT OR IGNORE INTO " + Columns;
        replace.CommandText = "INSERT OR REPLACE INTO " + Columns;
        foreach (var row in batch)
        {
            identityKey.Value = row.Identity.Key;
            identityJson.Value = row.Identity.CanonicalJson;
            identity.ExecuteNonQuery();
            var insert = row.Replace ? replace : keep;
            insert.Parameters.Clear();
            insert.Parameters.AddWithValue("$key", row.Key);
            insert.Parameters.AddWithValue("$identity", row.Identity.Key);
            insert.Parameters.AddWithValue("$request_key", row.RequestKey);
            insert.Parameters.AddWithValue("$kind", row.Kind);
            insert.Parameters.AddWithValue("$request", row.Request);
            insert.Parameters.AddWithValue("$response", row.Response);
            insert.Parameters.AddWithValue("$created", created);
            insert.ExecuteNonQuery();
        }

        transaction.Commit();
    }

    private static void CheckHeader(string path)
    {
        if (Directory.Exists(path))
        {
            throw new ResponseCacheException($"cache: '{path}' is a folder, not a cache file");
        }

        if (!File.Exists(path) || new FileInfo(path).Length == 0)
        {
            return;
        }

        var header = new byte[SqliteHeader.Length];
        using (var file = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite))
        {
            if (file.ReadAtLeast(header, header.Length, throwOnEndOfStream: false) < header.Length || !header.AsSpan().SequenceEqual(SqliteHeader))
            {
                throw NotACache(path, "not an SQLite database");
            }
        }
    }

    private static void Prepare(SqliteConnection connection, string path)
    {
        using var command = connection.CreateCommand();
        command.CommandText = "PRAGMA journal_mode=WAL; PRAGMA synchronous=NORMAL;";
        command.ExecuteNonQuery();

        command.CommandText = "SELECT name FROM sqlite_master WHERE type = 'table'";
        var tables = new List<string>();
        using (var reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                tables.Add(reader.GetString(0));
            }
        }

        if (tables.Count > 0 && !tables.Contains("plumbline_cache"))
        {
            throw NotACache(path, "an SQLite database of something else");
        }

        using var transaction = connection.BeginTransaction(deferred: false);
        command.Transaction = transaction;
        command.CommandText = """
            CREATE TABLE IF NOT EXISTS plumbline_cache(name TEXT PRIMARY KEY, value TEXT NOT NULL);
            INSERT OR IGNORE INTO plumbline_cache(name, value) VALUES ('format', $format), ('version', $version);
            CREATE TABLE IF NOT EXISTS identities(key TEXT PRIMARY KEY, identity TEXT NOT NULL);
            CREATE TABLE IF NOT EXISTS responses(
                key TEXT PRIMARY KEY, identity TEXT NOT NULL, request_key TEXT NOT NULL, kind TEXT NOT NULL,
                request TEXT NOT NULL, response TEXT NOT NULL, created TEXT NOT NULL);
            CREATE INDEX IF NOT EXISTS responses_by_identity ON responses(identity, created);
            """;
        command.Parameters.AddWithValue("$format", Format);
        command.Parameters.AddWithValue("$version", Version);
        command.ExecuteNonQuery();
        command.Parameters.Clear();
        command.CommandText = "SELECT value FROM plumbline_cache WHERE name = 'format' UNION ALL SELECT value FROM plumbline_cache WHERE name = 'version'";
        var values = new List<string>();
        using (var reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                values.Add(reader.GetString(0));
            }
        }

        if (values.Count != 2 || values[0] != Format)
        {
            throw NotACache(path, "marked as something else");
        }

        if (values[1] != Version)
        {
            throw new ResponseCacheException($"cache: '{path}' has format version {values[1]}, this build reads {Version}; use another --cache-dir");
        }

        transaction.Commit();
    }

    private static ResponseCacheException NotACache(string path, string what) =>
        new($"cache: '{path}' is not a Plumbline response cache ({what}); move it away or give --cache-dir another folder");

    private static string TimeText(DateTimeOffset time) => time.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'", CultureInfo.InvariantCulture);

    private static DateTimeOffset ParseTime(string text) =>
        DateTimeOffset.ParseExact(text, "yyyy-MM-dd'T'HH:mm:ss.fffffff'Z'", CultureInfo.InvariantCulture, DateTimeStyles.AssumeUniversal);

    private sealed record PendingRow(ModelIdentity Identity, string Key, string RequestKey, string Kind, string Request, string Response, bool Replace)
    {
        public TaskCompletionSource Committed { get; } = new(TaskCreationOptions.RunContinuationsAsynchronously);
    }
}
