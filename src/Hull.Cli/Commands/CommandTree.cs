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
        foreach (Option versionOption in root.Options.Where(o => o.Name == "--version").ToArray()) root.Options.Remove(versionOption);
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
        root.Subcommands.Add(AnalyzeCommand(wrap));
        root.Subcommands.Add(HealthCommand(wrap));
        root.Subcommands.Add(ServerInfoCommand(wrap));
        root.Subcommands.Add(ServeCommand.Build());
        root.Subcommands.Add(DemoCommand(wrap));
        return root;
    }

    private static Argument<string> DatasetArgument() => new("dataset") { Description = "dataset name" };

    private static Option<long> VersionOption() => new("--version")
    {
        Description = "dataset version to read (default: the latest)",
        DefaultValueFactory = _ => 0,
        Validators =
        {
            result =>
            {
                if (result.GetValueOrDefault<long>() < 0) result.AddError("--version must be 1 or more (versions count from 1)");
            },
        },
    };

    private static Option<int> PageSizeOption() => new("--page-size")
    {
        Description = "items per call while following the server's pages (0 = the server's default, 100; at most 1000)",
        DefaultValueFactory = _ => 0,
    };

    private static string Caption(VersionUsed used) => $"dataset {used.Dataset}, version {used.Version}";

    private static Command DatasetsCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var datasetsPageSize = PageSizeOption();
        var list = new Command("list", "list the datasets") { datasetsPageSize };
        list.SetAction(wrap(async (c, t) =>
        {
            // Follows every page, so the listing is whole; --json prints it as one response.
            var response = new ListDatasetsResponse();
            var request = new ListDatasetsRequest { PageSize = c.Get(datasetsPageSize) };
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
        var description = new Option<string>("--description") { Description = "free-text description", DefaultValueFactory = _ => string.Empty };
        var create = new Command("create", "create an empty dataset") { createName, description };
        create.SetAction(wrap(async (c, t) =>
        {
            DatasetSummary created = await c.Server.Datasets.CreateDatasetAsync(
                new CreateDatasetRequest { Name = c.Get(createName)!, Description = c.Get(description)! }, c.Server.Call(t));
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
            return ExitCodes.Ok;
        }));

        var deleteName = DatasetArgument();
        var delete = new Command("delete", "delete a dataset with all its versions") { deleteName };
        delete.SetAction(wrap(async (c, t) =>
        {
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
        var onDuplicate = new Option<string>("--on-duplicate")
        {
            Description = "what to do with ids the dataset already has: reject (the batch fails) or replace (a new version carries the new rows)",
            DefaultValueFactory = _ => "reject",
        };
        onDuplicate.AcceptOnlyFromAmong("reject", "replace");
        var batchSize = new Option<int>("--batch-size")
        {
            Description = $"entries per batch; each batch is one all-or-nothing version (default {ImportRunner.DefaultBatchSize})",
            DefaultValueFactory = _ => ImportRunner.DefaultBatchSize,
            Validators =
            {
                result =>
                {
                    int size = result.GetValueOrDefault<int>();
                    if (size < 1 || size > ImportRunner.MaxBatchSize) result.AddError($"--batch-size must be 1..{ImportRunner.MaxBatchSize}");
                },
            },
        };
        var note = new Option<string>("--note") { Description = "note recorded with each version", DefaultValueFactory = _ => string.Empty };
        var create = new Option<bool>("--create") { Description = "create the dataset first if it does not exist" };
        var import = new Command("import", "import entries from files, in batches; each batch becomes a new dataset version")
        {
            dataset, files, onDuplicate, batchSize, note, create,
        };
        import.SetAction(wrap(async (c, t) =>
        {
            string name = c.Get(dataset)!;
            // Read every file before sending anything, so that a bad file changes nothing.
            var inputs = c.Get(files)!.Select(path => (Path: path, Records: EntryFileReader.Read(path))).ToArray();
            foreach (var input in inputs)
            {
                if (input.Records.Count == 0) throw new InputFileException(input.Path, null, "no entries");
            }

            if (c.Get(create)) await EnsureDatasetAsync(c, name, t);
            DuplicatePolicy policy = c.Get(onDuplicate) == "replace" ? DuplicatePolicy.Replace : DuplicatePolicy.Reject;
            var runner = new ImportRunner(c.Server, c.Err, showProgress: !c.Quiet);
            var outcomes = new List<ImportRunner.BatchOutcome>();
            foreach (var input in inputs)
            {
                outcomes.AddRange(await runner.ImportAsync(name, input.Path, input.Records, policy, c.Get(batchSize), c.Get(note)!, t));
            }

            if (c.Format == OutputFormat.Json)
            {
                ProtoJson.WriteArray(c.Out, outcomes.Select(o => o.Response));
            }
            else
            {
                var table = new Table("file", "first_entry", "entries", "version", "inserted", "replaced");
                foreach (var o in outcomes)
                {
                    table.Add(Path.GetFileName(o.File), o.FirstRecord + 1, o.Rows, o.Response.DatasetVersion, o.Response.InsertedCount, o.Response.ReplacedCount);
                }

                TableRenderer.Write(c.Out, table, c.Format);
            }

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
        var export = new Command("export", "export a version's entries (with --csv or --json in the import layout)") { dataset, version, output };
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
                    var table = new Table([.. EntryFileLayout.Columns]);
                    foreach (Entry e in entries) table.Add(e.Id, e.Formula, e.EnergyEv, EntryFileLayout.TokenOf(e.Basis), e.Note);
                    if (c.Format == OutputFormat.Table) writer.WriteLine($"dataset {c.Get(dataset)}, version {usedVersion}: {entries.Count} entries");
                    TableRenderer.Write(writer, table, c.Format);
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

    private static Command VersionsCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var listName = DatasetArgument();
        var versionsPageSize = PageSizeOption();
        var list = new Command("list", "list a dataset's versions with their provenance") { listName, versionsPageSize };
        list.SetAction(wrap(async (c, t) =>
        {
            var response = new ListVersionsResponse();
            var request = new ListVersionsRequest { Dataset = c.Get(listName)!, PageSize = c.Get(versionsPageSize) };
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
        var number = new Argument<long>("version") { Description = "version number" };
        var delete = new Command("delete", "delete one version (other versions are unchanged)") { deleteName, number };
        delete.SetAction(wrap(async (c, t) =>
        {
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
        var command = new Command("stability", "energy above hull, decomposition and decomposition energy of stored entries") { dataset, ids, version };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetEntryStabilityRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            request.EntryIds.AddRange(c.Get(ids)!);
            GetEntryStabilityResponse response = await c.Server.Stability.GetEntryStabilityAsync(request, c.Server.Call(t));
            c.Emit(response, () => StabilityTable(response.Results, response.Used), Caption(response.Used));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command AssessCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var formula = new Argument<string?>("formula") { Description = "composition, e.g. LiNi0.8Co0.1Mn0.1O2", Arity = ArgumentArity.ZeroOrOne };
        var energy = new Argument<double?>("energy") { Description = "its energy in eV (per formula unit or per atom, see --basis)", Arity = ArgumentArity.ZeroOrOne };
        var basis = new Option<string>("--basis")
        {
            Description = $"what the energy means: {string.Join(", ", EntryFileLayout.BasisTokens.Keys)} (default formation_per_atom)",
            DefaultValueFactory = _ => "formation_per_atom",
        };
        basis.AcceptOnlyFromAmong([.. EntryFileLayout.BasisTokens.Keys]);
        var file = new Option<string?>("--file") { Description = "assess every entry of this file instead (ids become labels)" };
        var version = VersionOption();
        var command = new Command("assess", "place compositions with an energy against the hull without storing them") { dataset, formula, energy, basis, file, version };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new AssessCandidatesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            if (c.Get(file) is { } path)
            {
                if (c.Get(formula) is not null) throw new UsageException("give either FORMULA ENERGY or --file, not both");
                foreach (EntryRecord r in EntryFileReader.Read(path))
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

            AssessCandidatesResponse response = await c.Server.Stability.AssessCandidatesAsync(request, c.Server.Call(t));
            c.Emit(response, () =>
            {
                var table = new Table("label", "formula", "system", "formation_ev_per_atom", "relative_to_hull_ev_per_atom", "above_hull_ev_per_atom", "on_or_below_hull", "decomposition");
                foreach (CandidateAssessment a in response.Results)
                {
                    table.Add(a.Label, a.Formula, a.ChemicalSystem, a.FormationEnergyEvPerAtom, a.EnergyRelativeToHullEvPerAtom, a.EnergyAboveHullEvPerAtom, a.IsOnOrBelowHull, a.Decomposition.Reaction);
                }

                return table;
            }, Caption(response.Used));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command HullEnergyCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var formulas = new Argument<string[]>("formulas") { Description = "compositions", Arity = ArgumentArity.OneOrMore };
        var version = VersionOption();
        var command = new Command("hull-energy", "hull energy and decomposition at compositions") { dataset, formulas, version };
        command.SetAction(wrap(async (c, t) =>
        {
            var request = new GetHullEnergiesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) };
            request.Formulas.AddRange(c.Get(formulas)!);
            GetHullEnergiesResponse response = await c.Server.Stability.GetHullEnergiesAsync(request, c.Server.Call(t));
            c.Emit(response, () =>
            {
                var table = new Table("formula", "system", "hull_energy_ev_per_atom", "decomposition");
                foreach (HullEnergyResult r in response.Results) table.Add(r.Formula, r.ChemicalSystem, r.HullEnergyEvPerAtom, r.Decomposition.Reaction);
                return table;
            }, Caption(response.Used));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command StableCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var system = new Option<string>("--system") { Description = "chemical system, e.g. Li-Co-O (default: the whole dataset)", DefaultValueFactory = _ => string.Empty };
        var version = VersionOption();
        var command = new Command("stable", "the stable phases (hull vertices)") { dataset, system, version };
        command.SetAction(wrap(async (c, t) =>
        {
            GetStablePhasesResponse response = await c.Server.Stability.GetStablePhasesAsync(
                new GetStablePhasesRequest { Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system)! }, c.Server.Call(t));
            c.Emit(response, () => PhasesTable(response.Phases),
                Caption(response.Used) + (response.ChemicalSystem.Length > 0 ? $", system {response.ChemicalSystem}" : ", all systems"));
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command FacetsCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var system = new Argument<string>("system") { Description = "chemical system, e.g. Li-Co-O" };
        var version = VersionOption();
        var tieLines = new Option<bool>("--tie-lines") { Description = "list the tie-lines instead of the facets" };
        var command = new Command("facets", "hull facets with their chemical potentials, or tie-lines") { dataset, system, version, tieLines };
        command.SetAction(wrap(async (c, t) =>
        {
            GetHullFacetsResponse response = await c.Server.Stability.GetHullFacetsAsync(
                new GetHullFacetsRequest { Dataset = c.Get(dataset)!, Version = c.Get(version), ChemicalSystem = c.Get(system)! }, c.Server.Call(t));
            string caption = Caption(response.Used) + $", system {response.ChemicalSystem}";
            c.Emit(response, () => c.Get(tieLines) ? TieLinesTable(response.TieLines) : FacetsTable(response), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command AnalyzeCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var dataset = DatasetArgument();
        var version = VersionOption();
        var maxAbove = new Option<double?>("--max-above-hull") { Description = "list only entries at most this far above the hull, eV/atom" };
        var command = new Command("analyze", "stability of every entry of a version") { dataset, version, maxAbove };
        command.SetAction(wrap(async (c, t) =>
        {
            var results = new List<Protos.V1.EntryStability>();
            var first = new AnalyzeDatasetResponse();
            using var call = c.Server.Stability.AnalyzeDataset(new AnalyzeDatasetRequest { Dataset = c.Get(dataset)!, Version = c.Get(version) }, c.Server.Call(t));
            await foreach (AnalyzeDatasetResponse page in call.ResponseStream.ReadAllAsync(t))
            {
                if (results.Count == 0 && first.Used is null) first = page.Clone();
                results.AddRange(page.Results);
            }

            double? limit = c.Get(maxAbove);
            var shown = results.Where(r => limit is null || r.EnergyAboveHullEvPerAtom <= limit).ToArray();
            var combined = first.Clone();
            combined.Results.Clear();
            combined.Results.AddRange(shown);
            string caption = first.Used is null ? string.Empty
                : $"{Caption(first.Used)}: {first.EntryCount} entries, hulls of {string.Join(", ", first.HullSystems)}";
            c.Emit(combined, () => StabilityTable(shown, first.Used), caption);
            return ExitCodes.Ok;
        }));
        return command;
    }

    private static Command HealthCommand(Func<Body, Func<ParseResult, CancellationToken, Task<int>>> wrap)
    {
        var command = new Command("health", "ask the server's standard gRPC health check (exit 0 only when SERVING)");
        command.SetAction(wrap(async (c, t) =>
        {
            var response = await c.Server.Health.CheckAsync(new Grpc.Health.V1.HealthCheckRequest(), c.Server.Call(t));
            c.Emit(response, () => new Table("server", "status").Add(c.ServerAddress.ToString(), response.Status.ToString().ToUpperInvariant()));
            return response.Status == Grpc.Health.V1.HealthCheckResponse.Types.ServingStatus.Serving ? ExitCodes.Ok : ExitCodes.ServerError;
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
        var command = new Command("demo", "start a server in this process on a free loopback port with a temporary store, import data-demo/, run every analysis over gRPC and print a report")
        {
            data, keep,
        };
        command.SetAction(wrap((c, t) => new DemoRunner(c.Out, c.Err).RunAsync(c.Get(data), c.Get(keep), t)));
        return command;
    }

    internal static Table VersionsTable(IEnumerable<DatasetVersion> versions)
    {
        var table = new Table("version", "committed_utc", "batch_entries", "inserted", "replaced", "entries", "source", "note");
        foreach (DatasetVersion v in versions)
        {
            table.Add(v.Version, FormatTime(v.CommittedAt), v.BatchEntryCount, v.InsertedCount, v.ReplacedCount, v.EntryCount, v.SourceLabel, v.Note);
        }

        return table;
    }

    internal static Table StabilityTable(IEnumerable<Protos.V1.EntryStability> results, VersionUsed? used)
    {
        var table = new Table("id", "formula", "system", "formation_ev_per_atom", "above_hull_ev_per_atom", "stable", "decomposition_ev_per_atom", "decomposition", "dataset_version");
        foreach (Protos.V1.EntryStability r in results)
        {
            table.Add(r.EntryId, r.Formula, r.ChemicalSystem, r.FormationEnergyEvPerAtom, r.EnergyAboveHullEvPerAtom, r.IsHullVertex,
                r.HasDecompositionEnergyEvPerAtom ? r.DecompositionEnergyEvPerAtom : null, r.Decomposition.Reaction, used?.Version);
        }

        return table;
    }

    internal static Table PhasesTable(IEnumerable<StablePhase> phases)
    {
        var table = new Table("phase", "formula", "formation_ev_per_atom", "elemental_reference");
        foreach (StablePhase p in phases) table.Add(p.PhaseId, p.Formula, p.FormationEnergyEvPerAtom, p.IsElementalReference);
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
