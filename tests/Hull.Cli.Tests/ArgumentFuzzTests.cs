using System.CommandLine;
using Hull.Cli.Commands;

namespace Hull.Cli.Tests;

/// <summary>
/// Every command's options given random values (seeded): the CLI always answers with one of its documented exit codes
/// and never lets an exception or a .NET type name reach the user.
/// </summary>
public sealed class ArgumentFuzzTests
{
    private const int Seed = 20261202;
    private const int RunsPerCommand = 14;

    /// <summary>Values a user might type by mistake, and some no one would.</summary>
    private static readonly string[] Tokens =
    [
        "abc", "", " ", "-1", "0", "1", "2.5", "1e309", "-1e-320", "NaN", "Infinity", "-Infinity", "0x10", "12abc", "1,5",
        "9223372036854775808", "-9223372036854775809", "2147483648", "--", "-", "--json", "-q", "é", "\t", "true", "yes",
        "reject", "total_per_atom", "Li-Co-O", "LiCoO2", "http://", "https://example.invalid:1", "::1", "/dev/null",
    ];

    /// <summary>Words that only appear when an exception or a type leaks into a message.</summary>
    private static readonly string[] Leaks = ["Exception", "System.", "`1", "Nullable", "Int32", "Int64", "Boolean", "Unhandled", "   at "];

    [Fact]
    public async Task Random_option_values_on_every_command_give_a_documented_exit_code_and_no_leaked_type_names()
    {
        var random = new Random(Seed);
        string closed = $"http://127.0.0.1:{CliRun.ClosedPort()}";
        string scratch = Path.Combine(Path.GetTempPath(), "hull-fuzz-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(scratch);
        var global = new GlobalOptions();
        RootCommand root = CommandTree.Build(global, _ => (_, _) => Task.FromResult(0));
        var failures = new List<string>();
        int runs = 0;
        try
        {
            foreach ((string[] path, Command command) in Leaves(root, []))
            {
                // serve and demo would run a server or the whole demo: they get a cancelled token and their own folder.
                bool runsLocally = path[0] is "serve" or "demo";
                Option[] options = [.. command.Options.Where(o => o is not System.CommandLine.Help.HelpOption && o.Name != "--data-dir"), .. global.All];
                for (int run = 0; run < RunsPerCommand; run++)
                {
                    var args = new List<string>(path);
                    foreach (Argument argument in command.Arguments) args.Add(Pick(random));
                    int count = 1 + random.Next(3);
                    for (int k = 0; k < count; k++)
                    {
                        Option option = options[random.Next(options.Length)];
                        args.Add(option.Name);
                        if (random.Next(5) > 0) args.Add(Pick(random));
                    }
                    if (!args.Contains("--server")) args.AddRange(["--server", closed]);
                    if (path[0] == "serve") args.AddRange(["--data-dir", Path.Combine(scratch, $"serve-{run}")]);

                    using var cancel = new CancellationTokenSource();
                    if (runsLocally) cancel.Cancel();
                    var stdout = new StringWriter();
                    var stderr = new StringWriter();
                    int code;
                    try
                    {
                        code = await CliApp.RunAsync([.. args], stdout, stderr, cancel.Token).WaitAsync(TimeSpan.FromSeconds(60));
                    }
                    catch (Exception e)
                    {
                        failures.Add($"{Show(args)}: escaped {e.GetType().Name}: {e.Message}");
                        continue;
                    }

                    runs++;
                    string text = stdout + "\n" + stderr;
                    if (code is < ExitCodes.Ok or > ExitCodes.NotConfirmed) failures.Add($"{Show(args)}: exit {code}");
                    foreach (string leak in Leaks)
                    {
                        if (text.Contains(leak, StringComparison.Ordinal))
                        {
                            failures.Add($"{Show(args)}: '{leak}' in: {text.Trim()}");
                            break;
                        }
                    }
                }
            }
        }
        finally
        {
            Directory.Delete(scratch, recursive: true);
        }

        Assert.True(runs > 200, $"only {runs} runs");
        Assert.True(failures.Count == 0, string.Join(Environment.NewLine, failures.Take(20)));
    }

    private static IEnumerable<(string[] Path, Command Command)> Leaves(Command command, string[] path)
    {
        foreach (Command sub in command.Subcommands)
        {
            string[] subPath = [.. path, sub.Name];
            if (sub.Action is not null) yield return (subPath, sub);
            foreach (var leaf in Leaves(sub, subPath)) yield return leaf;
        }
    }

    private static string Pick(Random random) =>
        random.Next(4) == 0 ? new string(Enumerable.Range(0, 1 + random.Next(8)).Select(_ => (char)random.Next(33, 127)).ToArray()) : Tokens[random.Next(Tokens.Length)];

    private static string Show(IEnumerable<string> args) => "hull " + string.Join(' ', args.Select(a => a.Length == 0 || a.Contains(' ') ? $"'{a}'" : a));
}
