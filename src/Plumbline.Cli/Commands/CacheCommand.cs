using System.CommandLine;
using Plumbline.Application;
using System.Globalization;
using System.Text;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Core.Coherence;
using Plumbline.Models.Cache;

namespace Plumbline.Cli.Commands;

/// <summary>
/// <c>plumb cache inspect|export|import|prune</c>: look into the response cache, turn one model's cached
/// answers into a recording (to replay offline with <c>--model recording:FILE</c>), file a recording's
/// answers under a model, and delete entries.
/// </summary>
internal static class CacheCommand
{
    public static Command Create(CliContext context, CompositionRoot composition)
    {
        var command = new Command("cache", "Inspect, export, import or prune the response cache.");
        command.Subcommands.Add(Inspect(context, composition));
        command.Subcommands.Add(Export(context, composition));
        command.Subcommands.Add(Import(context, composition));
        command.Subcommands.Add(Prune(context, composition));
        return command;
    }

    private static Option<string?> IdentityOption() => new("--identity")
    {
        Description = "The model identity, by a unique start of its key (see plumb cache inspect); needed when the cache holds several.",
        HelpName = "KEY",
    };

    private static Command Inspect(CliContext context, CompositionRoot composition)
    {
        var cache = new CacheOptions();
        var command = new Command("inspect", "List the model identities in the cache with their counts.");
        cache.AddTo(command, judging: false);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            await using var store = await OpenAsync(composition, cache.Read(parse), cancellationToken);
            var identities = await store.InspectAsync(cancellationToken);
            var text = new StringBuilder();
            text.Append(CultureInfo.InvariantCulture, $"cache {store.FilePath} ({new FileInfo(store.FilePath).Length} bytes, {identities.Count} model identities)\n");
            foreach (var identity in identities)
            {
                text.Append(CultureInfo.InvariantCulture,
                    $"  {identity.Key[..12]}  {identity.Generations} texts, {identity.Answers} answers, {identity.Oldest:yyyy-MM-dd HH:mm} .. {identity.Newest:yyyy-MM-dd HH:mm} UTC\n");
                text.Append(CultureInfo.InvariantCulture, $"      {identity.Identity}\n");
            }

            await context.Output.WriteAsync(text.ToString());
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    private static Command Export(CliContext context, CompositionRoot composition)
    {
        var file = new Argument<string>("file") { Description = "The recording to write (must not exist).", HelpName = "FILE" };
        var identity = IdentityOption();
        var cache = new CacheOptions();
        var command = new Command("export", "Write one model's cached answers as a recording file.");
        command.Arguments.Add(file);
        command.Options.Add(identity);
        cache.AddTo(command, judging: false);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var path = parse.GetValue(file)!;
            if (File.Exists(path))
            {
                throw new UsageException($"{path}: already exists; export writes a new recording");
            }

            await using var store = await OpenAsync(composition, cache.Read(parse), cancellationToken);
            var chosen = await store.ResolveAsync(parse.GetValue(identity), cancellationToken);
            var lines = await store.ExportAsync(chosen.Key, path, cancellationToken);
            await context.Error.WriteLineAsync(CliErrors.Line($"cache: {lines} answers of {chosen.Key[..12]} written to {path}"));
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    private static Command Import(CliContext context, CompositionRoot composition)
    {
        var file = new Argument<string>("file") { Description = "A recording file.", HelpName = "FILE" };
        var model = new ModelOptions();
        var command = new Command("import", "File a recording's answers in the cache under the model that --model and its options name.");
        command.Arguments.Add(file);
        model.AddTo(command, judging: false);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var path = parse.GetValue(file)!;
            if (!File.Exists(path))
            {
                throw new UsageException($"{path}: recording file not found");
            }

            var settings = model.Read(parse);
            var kind = ModelComposition.Registry(settings, composition.Environment, composition.Time).Resolve(settings.Source);
            var identity = kind.Identify(settings.Source!);
            await using var store = await OpenAsync(composition, settings.Cache, cancellationToken);
            var added = await store.ImportAsync(path, identity, PromptBook.PromptVersion, cancellationToken);
            await context.Error.WriteLineAsync(CliErrors.Line($"cache: {added} answers added under {identity.Key[..12]} in {store.FilePath}"));
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    private static Command Prune(CliContext context, CompositionRoot composition)
    {
        var identity = IdentityOption();
        var olderThan = new Option<double?>("--older-than")
        {
            Description = "Only entries stored more than DAYS ago.",
            HelpName = "DAYS",
        };
        olderThan.CustomParser = r => NumberParsing.Parse(r, "--older-than", "a number of days (0 or more)", v => v >= 0);
        var all = new Option<bool>("--all") { Description = "Every entry of every identity." };
        var cache = new CacheOptions();
        var command = new Command("prune", "Delete cached answers: of one identity, older than some days, or all.");
        command.Options.Add(identity);
        command.Options.Add(olderThan);
        command.Options.Add(all);
        cache.AddTo(command, judging: false);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, async () =>
        {
            var prefix = parse.GetValue(identity);
            var days = parse.GetValue(olderThan);
            if (prefix is null && days is null && !parse.GetValue(all))
            {
                throw new UsageException("cache prune: say what to delete: --identity KEY, --older-than DAYS or --all");
            }

            await using var store = await OpenAsync(composition, cache.Read(parse), cancellationToken);
            var key = prefix is null ? null : (await store.ResolveAsync(prefix, cancellationToken)).Key;
            var before = days is { } d ? composition.Time.GetUtcNow() - TimeSpan.FromDays(d) : (DateTimeOffset?)null;
            var removed = await store.PruneAsync(key, before, cancellationToken);
            await context.Error.WriteLineAsync(CliErrors.Line($"cache: {removed} answers deleted from {store.FilePath}"));
            return ExitCodes.Success;
        }, cancellationToken));
        return command;
    }

    private static Task<ResponseCache> OpenAsync(CompositionRoot composition, CacheSettings settings, CancellationToken cancellationToken) =>
        ResponseCache.OpenAsync(settings.FilePath(composition.Environment), composition.Time, cancellationToken);
}
