using System.CommandLine;
using System.Globalization;
using Plumbline.Application.Input;
using Plumbline.Cli.Composition;
using Plumbline.Cli.Options;
using Plumbline.Core.Claims;

namespace Plumbline.Cli.Commands;

/// <summary><c>plumb check "claim" ...</c>: judges the claims given as arguments, with ids c1, c2, ...</summary>
internal static class CheckCommand
{
    public static Command Create(CliContext context, CompositionRoot root)
    {
        var claims = new Argument<string[]>("claims")
        {
            Description = "The claims to judge, each one argument (quote it).",
            HelpName = "CLAIM",
            Arity = ArgumentArity.OneOrMore,
        };
        var options = new JudgeOptions(root.Reports.Formats);
        var command = new Command("check", "Judge claims given on the command line.");
        command.Arguments.Add(claims);
        options.AddTo(command);
        command.SetAction((parse, cancellationToken) => Guarded.RunAsync(context, () =>
        {
            var given = ClaimsOf(parse.GetValue(claims) ?? []);
            var settings = options.Read(parse);
            return root.JudgeAsync(settings, () => Task.FromResult(ClaimInput.FromClaims("command line", given)), context, cancellationToken);
        }, cancellationToken));
        return command;
    }

    /// <exception cref="UsageException">A claim is empty.</exception>
    internal static IReadOnlyList<Claim> ClaimsOf(IReadOnlyList<string> texts)
    {
        var claims = new List<Claim>(texts.Count);
        for (var i = 0; i < texts.Count; i++)
        {
            var id = string.Create(CultureInfo.InvariantCulture, $"c{i + 1}");
            if (string.IsNullOrWhiteSpace(texts[i]))
            {
                throw new UsageException($"claim {id} (argument {i + 1}): empty; give the statement to judge");
            }

            claims.Add(new Claim(id, texts[i].Trim()));
        }

        return claims;
    }
}
