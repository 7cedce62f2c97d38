using System.CommandLine;
using System.Globalization;
using System.Text;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>
/// `hull corrections put|list|show|derive`: correction sets kept by the server (CorrectionService) and corrected
/// dataset versions derived with them. The CLI reads and writes the set documents as files; the server parses and
/// applies them.
/// </summary>
public static class CorrectionCommands
{
    public static Command Build(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap) =>
        new("corrections", "energy corrections: store correction sets, list and show them, derive a corrected dataset version")
        {
            PutCommand(wrap), ListCommand(wrap), ShowCommand(wrap), DeriveCommand(wrap),
        };

    private static Command PutCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var file = new Argument<string>("set-file") { Description = "the correction set's JSON document (set_schema 1; README, Energy corrections)" };
        var command = new Command("put", "store a correction set under the name and version its document gives (the same document again changes nothing)") { file };
        command.SetAction(wrap(async (c, t) =>
        {
            CorrectionSetInfo info = await c.Server.Corrections.PutCorrectionSetAsync(new PutCorrectionSetRequest { SetJson = DefectCommands.ReadText(c.Get(file)!) }, c.Server.Call(t));
            c.Emit(info, () => SetsTable([info]));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command ListCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var command = new Command("list", "every stored correction set, by name and version");
        command.SetAction(wrap(async (c, t) =>
        {
            ListCorrectionSetsResponse response = await c.Server.Corrections.ListCorrectionSetsAsync(new ListCorrectionSetsRequest(), c.Server.Call(t));
            c.Emit(response, () => SetsTable(response.Sets));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command ShowCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var set = SetArgument();
        var output = new Option<string?>("--out") { Description = "also write the set's document, exactly as stored, to this file" };
        var command = new Command("show", "one stored correction set and what it holds") { set, output };
        command.SetAction(wrap(async (c, t) =>
        {
            (string name, long version) = ParseSet(c.Get(set)!);
            CorrectionSetInfo info = await c.Server.Corrections.GetCorrectionSetAsync(new GetCorrectionSetRequest { Name = name, Version = version }, c.Server.Call(t));
            if (c.Get(output) is { } path)
            {
                await File.WriteAllTextAsync(path, info.SetJson, new UTF8Encoding(false), t);
                c.Err.WriteLine($"wrote {path}");
            }

            c.Emit(info, () => SetsTable([info]));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command DeriveCommand(Func<CommandTree.Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = CommandTree.DatasetArgument();
        var stored = new Option<string?>("--set") { Description = "a stored correction set, NAME@VERSION (e.g. demo-fit@1)" };
        var file = new Option<string?>("--set-file") { Description = "a correction set document to apply (stored with the new version)" };
        var from = ValueOptions.WholeNumber("--from", "the version to correct (default: the latest; an older one gives a version holding exactly its entries, corrected)", min: 0, max: long.MaxValue, fallback: 0, meaning: "a dataset version");
        var note = new Option<string>("--note") { Description = "note recorded with the new version" };
        var command = new Command("derive", "write the dataset's entries with corrected energies as its next version, recording the set; prints each moved entry's shift")
        {
            dataset, stored, file, from, note,
        };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new DeriveCorrectedVersionRequest { Dataset = c.Get(dataset)!, SourceVersion = c.Get(from), Note = c.Get(note) ?? string.Empty };
            (string? setText, string? setFile) = (c.Get(stored), c.Get(file));
            if ((setText is null) == (setFile is null)) throw new UsageException("give one of --set NAME@VERSION and --set-file FILE");
            if (setText is not null)
            {
                (string name, long version) = ParseSet(setText);
                request.Stored = new CorrectionSetName { Name = name, Version = version };
            }
            else
            {
                request.InlineSetJson = DefectCommands.ReadText(setFile!);
            }

            DeriveCorrectedVersionResponse response = await c.Server.Corrections.DeriveCorrectedVersionAsync(request, c.Server.Call(t));
            c.Emit(response, () => ShiftsTable(response), Caption(response));
            return ExitCodes.Ok;
        }));
        return command;
    }

    internal static string Caption(DeriveCorrectedVersionResponse r) =>
        $"dataset {r.Derived.Dataset}: version {r.Derived.Version} derived from version {r.Derived.Corrections.SourceVersion} with correction set "
        + $"{r.Derived.Corrections.SetName} v{r.Derived.Corrections.SetVersion}; {r.ChangedCount} of {r.EntryCount} entries moved";

    internal static Table ShiftsTable(DeriveCorrectedVersionResponse response)
    {
        var table = new Table("entry_id", "method", "method_shift_ev_per_atom", "species_shift_ev_per_atom", "reference_shift_ev_per_atom", "total_shift_ev_per_atom");
        foreach (EntryShift s in response.Shifts)
        {
            table.Add(s.EntryId, s.Method, s.MethodShiftEvPerAtom, s.SpeciesShiftEvPerAtom, s.ReferenceShiftEvPerAtom, s.TotalShiftEvPerAtom);
        }

        return table;
    }

    private static Table SetsTable(IEnumerable<CorrectionSetInfo> sets)
    {
        var table = new Table("name", "version", "base_method", "fitted_references", "species_shifts", "method_rules", "stored_utc");
        foreach (CorrectionSetInfo s in sets)
        {
            table.Add(s.Name, s.Version, s.BaseMethod, s.FittedReferenceCount, s.SpeciesShiftCount, s.MethodRuleCount,
                s.StoredAt.ToDateTimeOffset().ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture));
        }

        return table;
    }

    private static Argument<string> SetArgument() => new("set") { Description = "a stored correction set, NAME@VERSION (e.g. demo-fit@1)" };

    /// <summary>NAME@VERSION, the version a whole number from 1; the name is everything before the last '@'.</summary>
    internal static (string Name, long Version) ParseSet(string text)
    {
        int at = text.LastIndexOf('@');
        if (at <= 0 || !long.TryParse(text.AsSpan(at + 1), NumberStyles.None, CultureInfo.InvariantCulture, out long version) || version < 1)
        {
            throw new UsageException($"'{text}' does not name a correction set; write NAME@VERSION, e.g. demo-fit@1");
        }

        return (text[..at], version);
    }
}
