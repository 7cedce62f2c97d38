using System.CommandLine;
using System.Globalization;
using Grpc.Core;
using Hull.Cli.Demo;
using Hull.Cli.Input;
using Hull.Cli.Output;
using Hull.Protos.V1;

namespace Hull.Cli.Commands;

/// <summary>The commands of `hull` and their arguments; each action is a few gRPC calls and a printout.</summary>
public static class CommandTree
{
    public delegate Task<int> Body(CliContext context, CancellationToken cancellation);

    public static RootCommand Build(GlobalOptions options, Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var root = new RootCommand("hull: client of the hull phase-stability service (datasets, convex hulls, energy above hull).");
        // The root keeps the library's --version (the program's own version); on the subcommands --version is a dataset version.
        foreach (Option option in options.All) root.Options.Add(option);

        root.Subcommands.Add(DatasetsCommand(wrap));
        root.Subcommands.Add(ImportCommand(wrap));
        root.Subcommands.Add(ExportCommand(wrap));
        root.Subcommands.Add(VersionsCommand(wrap));
        root.Subcommands.Add(StabilityCommand(wrap));
        root.Subcommands.Add(AssessCommand(wrap));
        root.Subcommands.Add(HullEnergyCommand(wrap));
        root.Subcommands.Add(StableCommand(wrap));
        root.Subcommands.Add(FacetsCommand(wrap));
        foreach (Command windowCommand in WindowCommands.Build(wrap)) root.Subcommands.Add(windowCommand);
        foreach (Command electrochemistryCommand in ElectrochemistryCommands.Build(wrap)) root.Subcommands.Add(electrochemistryCommand);
        root.Subcommands.Add(AnalyzeCommand(wrap));
        root.Subcommands.Add(FigureCommand.Build(wrap));
        root.Subcommands.Add(OddsCommand.Build(wrap));
        root.Subcommands.Add(DefectCommands.Build(wrap));
        root.Subcommands.Add(ThermoCommands.Build(wrap));
        root.Subcommands.Add(CorrectionCommands.Build(wrap));
        root.Subcommands.Add(HealthCommand(wrap));
        root.Subcommands.Add(ServerInfoCommand(wrap));
        root.Subcommands.Add(ServeCommand.Build());
        root.Subcommands.Add(DemoCommand(wrap));
        root.Subcommands.Add(CurateCommand.Build(wrap));
        return root;
    }

    internal static Argument<string> DatasetArgument() => new("dataset") { Description = "dataset name" };

    internal static Option<long> VersionOption() => ValueOptions.WholeNumber(
        "--version", "dataset version to read (default: the latest)", min: 0, max: long.MaxValue, fallback: 0, meaning: "a dataset version");

    private static Option<bool> YesOption() => new(Confirmation.YesOptionName) { Description = "do not ask for confirmation" };

    private static int NotConfirmed(CliContext c)
    {
        c.Err.WriteLine("hull: not confirmed; nothing was deleted");
        return ExitCodes.NotConfirmed;
    }

    private static Option<long> PageSizeOption() => ValueOptions.WholeNumber(
        "--page-size", "items per call while following the server's pages (0 = the server's default, 100; at most 1000)",
        min: 0, max: 1000, fallback: 0, meaning: "a page size");

    private static string Caption(VersionUsed used) => VersionText.Of(used);

    private static Command DatasetsCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var datasetsPageSize = PageSizeOption();
        var list = new Command("list", "list the datasets") { datasetsPageSize };
        list.SetAction(wrap(async (c, t) =>
        {
            // Follows every page, so the listing is whole; --json prints it as one response.
            var response = new ListDatasetsResponse();
            var request = new ListDatasetsRequest { PageSize = (int)c.Get(datasetsPageSize) };
            do
            {
                ListDatasetsResponse page = await c.Server.Datasets.ListDatasetsAsync(request, c.Server.Call(t));
                response.Datasets.AddRange(page.Datasets);
                request.PageToken = page.NextPageToken;
            }
            while (request.PageToken.Length > 0);

            c.Emit(response, () =>
            {
                var table = new Table("name", "latest_version", "entries", "created_utc", "description");
                foreach (DatasetSummary d in response.Datasets)
                {
                    table.Add(d.Name, d.LatestVersion, d.EntryCount, FormatTime(d.CreatedAt), d.Description);
                }

                return table;
            });
            return ExitCodes.Ok;
        }));

        var createName = DatasetArgument();
        var description = new Option<string>("--description") { Description = "free-text description" };
        var create = new Command("create", "create an empty dataset") { createName, description };
        create.SetAction(wrap(async (c, t) =>
        {
            DatasetSummary created = await c.Server.Datasets.CreateDatasetAsync(
                new CreateDatasetRequest { Name = c.Get(createName)!, Description = c.Get(description) ?? string.Empty }, c.Server.Call(t));
            c.Emit(created, () => new Table("name", "created_utc").Add(created.Name, FormatTime(created.CreatedAt)));
            return ExitCodes.Ok;
        }));

        var showName = DatasetArgument();
        var show = new Command("show", "show a dataset and its versions") { showName };
        show.SetAction(wrap(async (c, t) =>
        {
            DescribeDatasetResponse response = await c.Server.Datasets.DescribeDatasetAsync(new DescribeDatasetRequest { Name = c.Get(showName)! }, c.Server.Call(t));
            string caption = $"dataset {response.Dataset.Name}: {response.Dataset.EntryCount} entries at version {response.Dataset.LatestVersion}" +
                             (response.Dataset.Description.Length > 0 ? $" ({response.Dataset.Description})" : string.Empty);
            c.Emit(response, () => VersionsTable(response.Versions), caption);
            if (c.Format == OutputFormat.Table)
            {
                foreach (string line in response.Versions.Where(v => v.Curation is not null).SelectMany(v => CurationText.Lines(v.Curation))) c.Out.WriteLine(line);
            }
            return ExitCodes.Ok;
        }));

        var deleteName = DatasetArgument();
        var deleteYes = YesOption();
        var delete = new Command("delete", "delete a dataset with all its versions (asks first on a terminal)") { deleteName, deleteYes };
        delete.SetAction(wrap(async (c, t) =>
        {
            if (!Confirmation.Confirm(c, c.Get(deleteYes), $"Delete dataset '{c.Get(deleteName)}' with all its versions?")) return NotConfirmed(c);
            var response = await c.Server.Datasets.DeleteDatasetAsync(new DeleteDatasetRequest { Name = c.Get(deleteName)! }, c.Server.Call(t));
            c.Emit(response, () => new Table("deleted").Add(c.Get(deleteName)));
            return ExitCodes.Ok;
        }));

        return new Command("datasets", "create, list, show and delete datasets") { list, create, show, delete };
    }

    private static Command ImportCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var files = new Argument<string[]>("files") { Description = "entry files (.csv or .json; columns id, formula, energy_ev, basis, note)", Arity = ArgumentArity.OneOrMore };
        var onDuplicate = ValueOptions.Choice("--on-duplicate",
            "what to do with ids the dataset already has: reject (nothing is written) or replace (the new version carries the new rows)",
            "reject", "reject", "replace");
        var batchSize = ValueOptions.WholeNumber("--batch-size", "entries per call to the server; the whole import is still one version",
            min: 1, max: ImportRunner.MaxBatchSize, fallback: ImportRunner.DefaultBatchSize, meaning: "a batch size");
        var note = new Option<string>("--note") { Description = "note recorded with the version" };
        var create = new Option<bool>("--create") { Description = "create the dataset first if it does not exist" };
        var tables = new Option<string?>("--free-energy-tables")
        {
            Description = "a CSV of G(T) points for entries of the files (columns entry_id, anchor, temperature_k, free_energy_above_anchor_ev)",
        };
        var import = new Command("import", "import entries from files as one new dataset version: all of them or, on any error or interruption, none")
        {
            dataset, files, onDuplicate, batchSize, note, create, tables,
        };
        import.SetAction(wrap(async (c, t) =>
        {
            string name = c.Get(dataset)!;
            // Read every file before sending anything, so that a bad file changes nothing.
            IReadOnlyList<(string Path, IReadOnlyList<EntryRecord> Records)> inputs =
                [.. c.Get(files)!.Select(path => (Path: path, Records: EntryFileReader.Read(path)))];
            foreach (var input in inputs)
            {
                if (input.Records.Count == 0) throw new InputFileException(input.Path, null, "no entries");
            }

            if (c.Get(tables) is { } tablePath) inputs = FreeEnergyTableFile.Attach(inputs, tablePath, FreeEnergyTableFile.Read(tablePath));
            foreach (var input in inputs) TemperatureModelText.RequireKinds(input.Path, input.Records);

            if (c.Get(create)) await EnsureDatasetAsync(c, name, t);
            DuplicatePolicy policy = c.Get(onDuplicate) == "replace" ? DuplicatePolicy.Replace : DuplicatePolicy.Reject;
            var runner = new ImportRunner(c.Server, c.Err, showProgress: !c.Quiet, progressIsTerminal: c.Terminal.ErrorIsTerminal);
            ImportRunner.ImportOutcome outcome = await runner.ImportAsync(
                name, [.. inputs.Select(i => new ImportRunner.ImportInput(i.Path, i.Records))], policy, (int)c.Get(batchSize), c.Get(note) ?? string.Empty, t);
            c.Emit(outcome.Response, () => new Table("files", "entries", "batches", "version", "inserted", "replaced").Add(
                string.Join(", ", outcome.Inputs.Select(i => Path.GetFileName(i.Path))), outcome.Entries, outcome.Batches,
                outcome.Response.DatasetVersion, outcome.Response.InsertedCount, outcome.Response.ReplacedCount));
            return ExitCodes.Ok;
        }));
        return import;
    }

    private static async Task EnsureDatasetAsync(CliContext c, string name, CancellationToken t)
    {
        try
        {
            await c.Server.Datasets.CreateDatasetAsync(new CreateDatasetRequest { Name = name }, c.Server.Call(t));
        }
        catch (Grpc.Core.RpcException e) when (e.StatusCode == Grpc.Core.StatusCode.AlreadyExists)
        {
            // Already there: import into it.
        }
    }

    private static Command ExportCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var version = VersionOption();
        var output = new Option<string?>("--output", "-o") { Description = "write to this file instead of stdout" };
        var tables = new Option<string?>("--free-energy-tables")
        {
            Description = "with --csv: write the entries' G(T) tables to this file, in the layout `hull import --free-energy-tables` reads",
        };
        var recipe = new Option<string?>("--recipe") { Description = "also write the recipe the version was curated by to this file (`hull curate` runs it)" };
        var export = new Command("export", "export a version's entries (with --csv or --json in the import layout)") { dataset, version, output, tables, recipe };
        export.SetAction(wrap(async (c, t) =>
        {
            var entries = new List<Entry>();
            long usedVersion = 0;
            using var call = c.Server.Datasets.ExportEntries(new ExportEntriesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) }, c.Server.Call(t));
            await foreach (ExportEntriesResponse page in call.ResponseStream.ReadAllAsync(t))
            {
                usedVersion = page.DatasetVersion;
                entries.AddRange(page.Entries);
            }

            // A CSV row has no room for a G(T) table: refuse before writing anything rather than drop it.
            Table freeEnergyTables = FreeEnergyTableFile.ToTable(entries);
            string? tablePath = c.Get(tables);
            if (c.Format == OutputFormat.Csv && freeEnergyTables.Rows.Count > 0 && tablePath is null)
            {
                int count = entries.Count(e => e.TemperatureModel?.FreeEnergyTable is not null);
                throw new UsageException($"version {usedVersion} has G(T) tables on {count} entr{(count == 1 ? "y" : "ies")}; a CSV export writes them to a file of their own: add --free-energy-tables FILE (or export with --json)");
            }

            if (tablePath is not null && c.Format != OutputFormat.Csv) throw new UsageException("--free-energy-tables goes with --csv; a JSON export holds the tables itself");
            if (c.Get(recipe) is { } recipePath) await CurateCommand.SaveAsync(c, recipePath, await CurateCommand.RecordAsync(c, c.Get(dataset)!, usedVersion, t), t);
            string? path = c.Get(output);
            TextWriter writer = path is null ? c.Out : new StreamWriter(path);
            try
            {
                if (c.Format == OutputFormat.Json)
                {
                    // The entry-file layout (basis tokens as in CSV), so that an export can be imported again.
                    writer.WriteLine(EntryFileWriter.ToJson(c.Get(dataset)!, usedVersion, entries));
                }
                else
                {
                    if (c.Format == OutputFormat.Table) writer.WriteLine($"dataset {c.Get(dataset)}, version {usedVersion}: {entries.Count} entries");
                    TableRenderer.Write(writer, ExportTable(entries, c.Format), c.Format);
                    if (tablePath is not null)
                    {
                        await using var tableWriter = new StreamWriter(tablePath);
                        TableRenderer.Write(tableWriter, freeEnergyTables, OutputFormat.Csv);
                    }
                }
            }
            finally
            {
                if (path is not null) await writer.DisposeAsync();
            }

            return ExitCodes.Ok;
        }));
        return export;
    }

    /// <summary>
    /// The entries in the import layout (<see cref="EntryFileLayout.Columns"/>' order); the temperature-model columns only
    /// when some entry has a model, the uncertainty columns only when some entry has a σ or a correlation group and the
    /// method column only when some entry has a tag, so an
    /// export of a dataset without either reads as before. The table view sums up a G(T) table in one cell.
    /// </summary>
    private static Table ExportTable(IReadOnlyList<Entry> entries, OutputFormat format)
    {
        bool models = entries.Any(e => e.TemperatureModel is not null);
        bool uncertainties = entries.Any(e => e.HasEnergySigmaEvPerAtom || e.CorrelationGroup.Length > 0);
        bool methods = entries.Any(e => e.Method.Length > 0);
        bool summary = models && format == OutputFormat.Table && entries.Any(e => e.TemperatureModel?.FreeEnergyTable is not null);
        string[] columns = [.. EntryFileLayout.PlainColumns, .. models ? EntryFileLayout.ModelColumns : [],
            .. uncertainties ? EntryFileLayout.UncertaintyColumns : [], .. methods ? EntryFileLayout.MethodColumns : []];
        var table = new Table(summary ? [.. columns, "g_of_t_table"] : columns);
        foreach (Entry e in entries)
        {
            object?[] cells = [e.Id, e.Formula, e.EnergyEv, EntryFileLayout.TokenOf(e.Basis), e.Note];
            if (models)
            {
                EntryTemperatureModel? model = e.TemperatureModel;
                object? entropy = model?.KindCase == EntryTemperatureModel.KindOneofCase.StandardEntropyJPerMolK ? model.StandardEntropyJPerMolK : null;
                cells = [.. cells, entropy, model?.Formula ?? string.Empty];
            }

            if (uncertainties)
            {
                string sigma = e.HasEnergySigmaEvPerAtom ? e.EnergySigmaEvPerAtom.ToString("R", CultureInfo.InvariantCulture) : string.Empty;
                cells = [.. cells, sigma, e.CorrelationGroup];
            }

            if (methods) cells = [.. cells, e.Method];

            if (summary)
            {
                EntryFreeEnergyTable? points = e.TemperatureModel?.FreeEnergyTable;
                cells = [.. cells, points is null ? string.Empty
                    : string.Create(CultureInfo.InvariantCulture, $"{EntryFileLayout.TokenOf(points.Anchor)}, {points.Rows.Count} points, {points.Rows.Min(p => p.TemperatureK)}-{points.Rows.Max(p => p.TemperatureK)} K")];
            }

            table.Add(cells);
        }

        return table;
    }

    private static Command VersionsCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var listName = DatasetArgument();
        var versionsPageSize = PageSizeOption();
        var list = new Command("list", "list a dataset's versions with their provenance") { listName, versionsPageSize };
        list.SetAction(wrap(async (c, t) =>
        {
            var response = new ListVersionsResponse();
            var request = new ListVersionsRequest { Dataset = c.Get(listName)!, PageSize = (int)c.Get(versionsPageSize) };
            do
            {
                ListVersionsResponse page = await c.Server.Datasets.ListVersionsAsync(request, c.Server.Call(t));
                response.Versions.AddRange(page.Versions);
                request.PageToken = page.NextPageToken;
            }
            while (request.PageToken.Length > 0);

            c.Emit(response, () => VersionsTable(response.Versions));
            return ExitCodes.Ok;
        }));

        var deleteName = DatasetArgument();
        var number = ValueOptions.WholeNumberArgument("version", "version number", min: 1, max: long.MaxValue, meaning: "a version number");
        var versionYes = YesOption();
        var delete = new Command("delete", "delete one version (other versions are unchanged; asks first on a terminal)") { deleteName, number, versionYes };
        delete.SetAction(wrap(async (c, t) =>
        {
            if (!Confirmation.Confirm(c, c.Get(versionYes), $"Delete version {c.Get(number)} of dataset '{c.Get(deleteName)}'?")) return NotConfirmed(c);
            var response = await c.Server.Datasets.DeleteVersionAsync(new DeleteVersionRequest { Dataset = c.Get(deleteName)!, Version = c.Get(number) }, c.Server.Call(t));
            c.Emit(response, () => new Table("dataset", "deleted_version").Add(c.Get(deleteName), c.Get(number)));
            return ExitCodes.Ok;
        }));

        return new Command("versions", "list and delete dataset versions") { list, delete };
    }

    private static Command StabilityCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var ids = new Argument<string[]>("ids") { Description = "entry ids", Arity = ArgumentArity.OneOrMore };
        var version = VersionOption();
        var references = ReferenceOption.Create();
        var endMembers = EndMemberOption.Create();
        var command = new Command("stability", "energy above hull, decomposition and decomposition energy of stored entries") { dataset, ids, version, references, endMembers };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetEntryStabilityRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            request.EntryIds.AddRange(c.Get(ids)!);
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            request.EndMembers.AddRange(EndMemberOption.Parse(c.Get(endMembers)));
            GetEntryStabilityResponse response = await c.Server.Stability.GetEntryStabilityAsync(request, c.Server.Call(t));
            c.Emit(response, () => StabilityTable(response.Results, response.Used), Caption(response.Used));
            if (!c.Quiet) CoverageWarnings.Write(c.Err, response.Coverage, storedEntries: true);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command AssessCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var formula = new Argument<string?>("formula") { Description = "composition, e.g. LiNi0.8Co0.1Mn0.1O2", Arity = ArgumentArity.ZeroOrOne };
        var energy = ValueOptions.OptionalNumberArgument("energy", "its energy in eV (per formula unit or per atom, see --basis)", "an energy in eV");
        var basis = ValueOptions.Choice("--basis", "what the energy means", "formation_per_atom", [.. EntryFileLayout.BasisTokens.Keys]);
        var file = new Option<string?>("--file") { Description = "assess every entry of this file instead (ids become labels)" };
        var version = VersionOption();
        var references = ReferenceOption.Create();
        var command = new Command("assess", "place compositions with an energy against the hull without storing them") { dataset, formula, energy, basis, file, version, references };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new AssessCandidatesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            IReadOnlyList<EntryRecord> records = [];
            if (c.Get(file) is { } path)
            {
                if (c.Get(formula) is not null) throw new UsageException("give either FORMULA ENERGY or --file, not both");
                records = EntryFileReader.Read(path);
                foreach (EntryRecord r in records)
                {
                    request.Candidates.Add(new Candidate { Label = r.Id, Formula = r.Formula, EnergyEv = r.EnergyEv, Basis = r.Basis });
                }
            }
            else
            {
                if (c.Get(formula) is not { } f || c.Get(energy) is not double e) throw new UsageException("give FORMULA and ENERGY, or --file FILE");
                if (!double.IsFinite(e)) throw new UsageException($"energy {e} is not a finite number");
                request.Candidates.Add(new Candidate { Formula = f, EnergyEv = e, Basis = EntryFileLayout.BasisTokens[c.Get(basis)!] });
            }

            AssessCandidatesResponse response;
            try
            {
                response = await c.Server.Stability.AssessCandidatesAsync(request, c.Server.Call(t));
            }
            catch (RpcException e) when (c.Get(file) is { } refusedPath && RequestRefusal.NamesRows(e, "candidates"))
            {
                throw new RequestRefusal.RefusedException(RequestRefusal.Describe(e, "candidates", refusedPath, records), e);
            }

            c.Emit(response, () =>
            {
                var table = new Table("label", "formula", "system", "formation_ev_per_atom", "relative_to_hull_ev_per_atom", "above_hull_ev_per_atom", "on_or_below_hull", "decomposition");
                foreach (CandidateAssessment a in response.Results)
                {
                    table.Add(a.Label, a.Formula, a.ChemicalSystem, a.FormationEnergyEvPerAtom, a.EnergyRelativeToHullEvPerAtom, a.EnergyAboveHullEvPerAtom, a.IsOnOrBelowHull, DecompositionText.Describe(a.Decomposition));
                }

                return table;
            }, Caption(response.Used));
            if (!c.Quiet) CoverageWarnings.Write(c.Err, response.Coverage, storedEntries: false);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command HullEnergyCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var formulas = new Argument<string[]>("formulas") { Description = "compositions", Arity = ArgumentArity.OneOrMore };
        var version = VersionOption();
        var references = ReferenceOption.Create();
        var command = new Command("hull-energy", "hull energy and decomposition at compositions") { dataset, formulas, version, references };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetHullEnergiesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            request.Formulas.AddRange(c.Get(formulas)!);
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            GetHullEnergiesResponse response = await c.Server.Stability.GetHullEnergiesAsync(request, c.Server.Call(t));
            c.Emit(response, () =>
            {
                var table = new Table("formula", "system", "hull_energy_ev_per_atom", "decomposition");
                foreach (HullEnergyResult r in response.Results) table.Add(r.Formula, r.ChemicalSystem, r.HullEnergyEvPerAtom, DecompositionText.Describe(r.Decomposition));
                return table;
            }, Caption(response.Used));
            if (!c.Quiet) CoverageWarnings.Write(c.Err, response.Coverage, storedEntries: false);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command StableCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var system = new Option<string>("--system") { Description = "chemical system, e.g. Li-Co-O (default: the whole dataset)" };
        var version = VersionOption();
        var references = ReferenceOption.Create();
        var endMembers = EndMemberOption.Create();
        var command = new Command("stable", "the stable phases (hull vertices)") { dataset, system, version, references, endMembers };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetStablePhasesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system) ?? string.Empty };
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            request.EndMembers.AddRange(EndMemberOption.Parse(c.Get(endMembers)));
            GetStablePhasesResponse response = await c.Server.Stability.GetStablePhasesAsync(request, c.Server.Call(t));
            c.Emit(response, () => PhasesTable(response.Phases),
                Caption(response.Used) + (response.ChemicalSystem.Length > 0 ? $", system {response.ChemicalSystem}" : ", all systems"));
            if (!c.Quiet)
            {
                CoverageWarnings.Write(c.Err, response.Coverage, storedEntries: true);
                CoverageWarnings.Write(c.Err, response.SystemProblems);
            }
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command FacetsCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var system = new Argument<string>("system") { Description = "chemical system, e.g. Li-Co-O (omit with --end-members)", Arity = ArgumentArity.ZeroOrOne, DefaultValueFactory = _ => string.Empty };
        var version = VersionOption();
        var tieLines = new Option<bool>("--tie-lines") { Description = "list the tie-lines instead of the facets" };
        var references = ReferenceOption.Create();
        var endMembers = EndMemberOption.Create();
        var command = new Command("facets", "hull facets with their chemical potentials, or tie-lines") { dataset, system, version, tieLines, references, endMembers };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetHullFacetsRequest { Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system) ?? string.Empty };
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            request.EndMembers.AddRange(EndMemberOption.Parse(c.Get(endMembers)));
            GetHullFacetsResponse response = await c.Server.Stability.GetHullFacetsAsync(request, c.Server.Call(t));
            string caption = Caption(response.Used) + $", system {response.ChemicalSystem}";
            c.Emit(response, () => c.Get(tieLines) ? TieLinesTable(response.TieLines) : FacetsTable(response), caption);
            if (!c.Quiet) CoverageWarnings.Write(c.Err, response.Coverage, storedEntries: true);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command AnalyzeCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var version = VersionOption();
        var maxAbove = ValueOptions.OptionalNumber("--max-above-hull", "list only entries at most this far above the hull, eV/atom", "an energy in eV/atom");
        var references = ReferenceOption.Create();
        var command = new Command("analyze", "stability of every entry of a version") { dataset, version, maxAbove, references };
        command.SetAction(wrap(async (c, t) =>
        {
            var results = new List<Protos.V1.EntryStability>();
            var coverage = new List<SystemCoverage>();
            var first = new AnalyzeDatasetResponse();
            var request = new AnalyzeDatasetRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            ReferenceOption.AddTo(request.ElementalReferences, c.Get(references));
            using var call = c.Server.Stability.AnalyzeDataset(request, c.Server.Call(t));
            await foreach (AnalyzeDatasetResponse page in call.ResponseStream.ReadAllAsync(t))
            {
                if (results.Count == 0 && first.Used is null) first = page.Clone();
                results.AddRange(page.Results);
                coverage.AddRange(page.Coverage);
            }

            double? limit = c.Get(maxAbove);
            var shown = results.Where(r => limit is null || r.EnergyAboveHullEvPerAtom <= limit).ToArray();
            var combined = first.Clone();
            combined.Results.Clear();
            combined.Results.AddRange(shown);
            combined.Coverage.Clear();
            combined.Coverage.AddRange(coverage);
            string caption = first.Used is null ? string.Empty
                : $"{Caption(first.Used)}: {first.EntryCount} entries, hulls of {string.Join(", ", first.HullSystems)}";
            c.Emit(combined, () => StabilityTable(shown, first.Used), caption);
            if (!c.Quiet)
            {
                CoverageWarnings.Write(c.Err, coverage, storedEntries: true);
                CoverageWarnings.Write(c.Err, first.SystemProblems);
            }

            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command HealthCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var report = new Option<bool>("--report") { Description = "also the store's state and the cluster membership as this server sees them" };
        var command = new Command("health", "ask the server's standard gRPC health check (exit 0 only when SERVING)") { report };
        command.SetAction(wrap(async (c, t) =>
        {
            var response = await c.Server.Health.CheckAsync(new Grpc.Health.V1.HealthCheckRequest(), c.Server.Call(t));
            int exit = response.Status == Grpc.Health.V1.HealthCheckResponse.Types.ServingStatus.Serving ? ExitCodes.Ok : ExitCodes.ServerError;
            if (!c.Get(report))
            {
                c.Emit(response, () => new Table("server", "status").Add(c.ServerAddress.ToString(), response.Status.ToString().ToUpperInvariant()));
                return exit;
            }

            ServerHealth health = await c.Server.Diagnostics.GetServerHealthAsync(new GetServerHealthRequest(), c.Server.Call(t));
            if (c.Format == OutputFormat.Json)
            {
                ProtoJson.WriteArray(c.Out, [response, health]);
                return exit;
            }

            TableRenderer.Write(c.Out, new Table("setting", "value")
                .Add("status", response.Status.ToString().ToUpperInvariant())
                .Add("store", health.StoreLocation)
                .Add("store_usable", health.StoreUsable ? "yes" : "no: " + health.StoreProblem)
                .Add("cluster", health.ClusterName.Length == 0 ? "none (works alone)" : health.ClusterName)
                .Add("active_members", health.ActiveMembers)
                .Add("member_status", health.MemberStatus)
                .Add("grain_hull_builds", health.GrainHullBuilds), c.Format);
            return exit;
        }));
        return command;
    }

    private static Command ServerInfoCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var command = new Command("server-info", "the server's limits and hull-cache counters");
        command.SetAction(wrap(async (c, t) =>
        {
            ServerLimits limits = await c.Server.Diagnostics.GetServerLimitsAsync(new GetServerLimitsRequest(), c.Server.Call(t));
            CacheStatistics stats = await c.Server.Diagnostics.GetCacheStatisticsAsync(new GetCacheStatisticsRequest(), c.Server.Call(t));
            if (c.Format == OutputFormat.Json)
            {
                ProtoJson.WriteArray(c.Out, [limits, stats]);
                return ExitCodes.Ok;
            }

            var table = new Table("setting", "value")
                .Add("max_components_per_system", limits.MaxComponentsPerSystem)
                .Add("max_entries_per_system", limits.MaxEntriesPerSystem)
                .Add("max_compositions_per_request", limits.MaxCompositionsPerRequest)
                .Add("max_receive_message_bytes", limits.MaxReceiveMessageBytes)
                .Add("max_send_message_bytes", limits.MaxSendMessageBytes)
                .Add("hull_builds", stats.HullBuilds)
                .Add("hull_cache_hits", stats.HullCacheHits)
                .Add("version_loads", stats.VersionLoads)
                .Add("dataset_analyses", stats.DatasetAnalyses)
                .Add("cached_hulls", stats.CachedHulls);
            TableRenderer.Write(c.Out, table, c.Format);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command DemoCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var data = new Option<string?>("--data") { Description = "folder of demo entry files (default: the repository's data-demo/)" };
        var keep = new Option<bool>("--keep-store") { Description = "keep the temporary store folder afterwards (its path is printed)" };
        var figures = new Option<string>("--figures") { Description = "folder to write the demo's figures into", DefaultValueFactory = _ => DemoFigures.DefaultFolder };
        var command = new Command("demo", "start a server in this process on a free loopback port with a temporary store, import data-demo/, run every analysis over gRPC and print a report")
        {
            data, keep, figures,
        };
        command.SetAction(wrap((c, t) => new DemoRunner(c.Out, c.Err) { FiguresFolder = c.Get(figures)! }.RunAsync(c.Get(data), c.Get(keep), t)));
        return command;
    }

    internal static Table VersionsTable(IEnumerable<DatasetVersion> versions)
    {
        var table = new Table("version", "committed_utc", "batch_entries", "inserted", "replaced", "entries", "source", "note", "corrected_with");
        foreach (DatasetVersion v in versions)
        {
            table.Add(v.Version, FormatTime(v.CommittedAt), v.BatchEntryCount, v.InsertedCount, v.ReplacedCount, v.EntryCount, v.SourceLabel, v.Note,
                VersionText.CorrectedWith(v.Corrections));
        }

        return table;
    }

    internal static Table StabilityTable(IEnumerable<Protos.V1.EntryStability> results, VersionUsed? used)
    {
        var table = new Table("id", "formula", "system", "formation_ev_per_atom", "above_hull_ev_per_atom", "stable", "decomposition_ev_per_atom", "decomposition", "dataset_version");
        foreach (Protos.V1.EntryStability r in results)
        {
            table.Add(r.EntryId, r.Formula, r.ChemicalSystem, r.FormationEnergyEvPerAtom, r.EnergyAboveHullEvPerAtom, r.IsHullVertex,
                r.HasDecompositionEnergyEvPerAtom ? r.DecompositionEnergyEvPerAtom : null, DecompositionText.Describe(r.Decomposition), used?.Version);
        }

        return table;
    }

    /// <summary>What the origin column says of an element that no entry of the dataset gives.</summary>
    internal const string ElementWithoutEntry = "no entry: element set to 0";

    internal static Table PhasesTable(IEnumerable<StablePhase> phases)
    {
        // "origin" says where the phase comes from: a stored entry, or an element the dataset has no entry for, put at 0 eV/atom by definition.
        var table = new Table("phase", "formula", "formation_ev_per_atom", "origin");
        foreach (StablePhase p in phases) table.Add(p.PhaseId, p.Formula, p.FormationEnergyEvPerAtom, p.IsElementalReference ? ElementWithoutEntry : "entry");
        return table;
    }

    internal static Table FacetsTable(GetHullFacetsResponse response)
    {
        string[] columns = ["facet", "phases", .. response.Components.Select(c => $"mu_{c}_ev_per_atom")];
        var table = new Table(columns);
        int n = 0;
        foreach (PhaseFacet f in response.Facets)
        {
            object?[] row = [++n, string.Join(" + ", f.PhaseIds), .. f.ChemicalPotentials.Select(p => (object?)p.ChemicalPotentialEvPerAtom)];
            table.Add(row);
        }

        return table;
    }

    internal static Table TieLinesTable(IEnumerable<Protos.V1.TieLine> tieLines)
    {
        var table = new Table("first", "second");
        foreach (Protos.V1.TieLine l in tieLines) table.Add(l.FirstPhaseId, l.SecondPhaseId);
        return table;
    }

    private static string FormatTime(Google.Protobuf.WellKnownTypes.Timestamp? time) =>
        time is null ? string.Empty : time.ToDateTimeOffset().ToString("yyyy-MM-dd HH:mm:ss", CultureInfo.InvariantCulture);
}
